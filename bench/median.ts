/** Timing for the benchmarks: the median wall time of several calls. */
import { performance } from 'node:perf_hooks';

/** Median wall time of `runs` calls, in milliseconds. */
export function median(runs: number, fn: () => void): number {
  const t: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    fn();
    t.push(performance.now() - t0);
  }
  t.sort((a, b) => a - b);
  return t[Math.floor(t.length / 2)];
}

/** The middle value of some figures (the mean of the two middle ones for an even count); refuses anything that is not a number. */
export function middle(xs: readonly number[]): number {
  if (xs.some((x) => !Number.isFinite(x))) throw new Error('a figure to take the median of is not a number');
  const s = [...xs].sort((a, b) => a - b);
  const k = Math.floor(s.length / 2);
  return s.length === 0 ? NaN : s.length % 2 === 1 ? s[k] : (s[k - 1] + s[k]) / 2;
}
