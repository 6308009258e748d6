/** What every benchmark table of docs/benchmarks.md is made of. */

/** One line: the figure beside its reference measured in the same run, their ratio, and the goal. */
export interface BenchRow {
  readonly name: string;
  readonly figure: string;
  readonly reference: string;
  readonly ratio: string;
  readonly goal: string;
}

/** Milliseconds as the tables print them: in seconds from one second up. */
export const ms = (x: number): string => (x >= 1000 ? `${(x / 1000).toFixed(2)} s` : `${x.toFixed(1)} ms`);
