/**
 * Machines for the benchmarks: a reading that must succeed. (A flat table written back into the
 * JSON form, so that a benchmark includes parsing, is the core's `flatToJsonText`.)
 */
import { analyse, type Analysed } from '../src/core/index.js';

/** The analysed machine of `text`, or a thrown error naming the file and its problems. */
export function mustAnalyse(text: string, file: string): Analysed {
  const a = analyse(text, file);
  if (!a.ok) throw new Error(`${file}: ${a.diagnostics.map((d) => d.message).join('; ')}`);
  return a;
}
