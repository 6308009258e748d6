/**
 * The abstract reference simulator: the state table itself, stepped one clock at a time. It
 * is the behaviour every later phase must keep, and the reference the build's simulation is
 * compared against.
 *
 * Rules where the table leaves something open (chosen so that a run never stops):
 * - next state free (DONT_CARE): the machine stays in its state, and the step says so
 *   (`nextFree`), because nothing later in the run is specified by the table;
 * - an input combination excluded by `never` has no row: the machine stays, every output is
 *   '-', and the step is marked `excluded`.
 */
import { DONT_CARE, rowFor, type FlatMachine } from '../model/flat.js';
import type { OutBit } from '../model/machine.js';

/** What one clock does: the next state and the outputs while the transition is taken. */
export interface AbstractStepResult {
  readonly next: number;
  readonly outputs: OutBit[];
}

/** One clock from `state` with `inputs` ('0'/'1' per input, in input order). */
export function stepAbstract(f: FlatMachine, state: number, inputs: string): AbstractStepResult {
  const row = rowFor(f, state, inputs);
  if (row === undefined) return { next: state, outputs: f.outputs.map(() => '-') };
  return { next: row.next === DONT_CARE ? state : row.next, outputs: [...row.out] };
}

/** One clock of a run, as a row of the run's table. */
export interface AbstractClock {
  /** Clock number, from 0. */
  readonly clock: number;
  readonly state: number;
  readonly stateName: string;
  readonly inputs: string;
  readonly outputs: readonly OutBit[];
  readonly next: number;
  readonly nextName: string;
  /** The table leaves the next state free here; the run stayed. */
  readonly nextFree: boolean;
  /** The inputs lie in the machine's `never` set. */
  readonly excluded: boolean;
}

/** Run the machine from `start` (default: its start state) through the input sequence. */
export function runAbstract(f: FlatMachine, inputsSeq: readonly string[], start: number = f.start): AbstractClock[] {
  const out: AbstractClock[] = [];
  let state = start;
  inputsSeq.forEach((inputs, clock) => {
    const row = rowFor(f, state, inputs);
    const { next, outputs } = stepAbstract(f, state, inputs);
    out.push({
      clock,
      state,
      stateName: f.states[state],
      inputs,
      outputs,
      next,
      nextName: f.states[next],
      nextFree: row !== undefined && row.next === DONT_CARE,
      excluded: row === undefined,
    });
    state = next;
  });
  return out;
}
