/**
 * Machines for the benchmarks: a flat table written back into the JSON form (so a benchmark
 * includes parsing), and a reading that must succeed.
 */
import { analyse, printCubes, type Analysed, type FlatMachine } from '../src/core/index.js';

/** A flat table in the JSON form, one transition per row. */
export function flatToJsonText(f: FlatMachine): string {
  return JSON.stringify({
    name: f.name,
    inputs: f.inputs,
    outputs: f.outputs,
    start: f.states[f.start],
    states: f.states.map((name, s) => ({
      name,
      transitions: f.rows[s].map((r) => ({
        when: printCubes([r.cube], f.inputs),
        to: f.states[r.next],
        outputs: Object.fromEntries(f.outputs.map((o, k) => [o, r.out[k]])),
      })),
    })),
  });
}

/** The analysed machine of `text`, or a thrown error naming the file and its problems. */
export function mustAnalyse(text: string, file: string): Analysed {
  const a = analyse(text, file);
  if (!a.ok) throw new Error(`${file}: ${a.diagnostics.map((d) => d.message).join('; ')}`);
  return a;
}
