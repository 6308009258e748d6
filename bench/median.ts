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
