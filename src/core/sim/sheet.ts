/**
 * The hand actions of the commissioning sheet, row by row: what a person does between two
 * looks at the machine. The sheet (export/commissioning.ts), the fault simulation of the sheet
 * and the search for clocks that show a fault (sim/fault-run.ts) all take their actions from
 * here, so they step one and the same sequence.
 *
 * From power-up: reset (a machine with a clock); then per clock, an optional reset, the input
 * levers that move (one row, even when none moves), pull φ1, release φ1, pull φ2, release φ2.
 * A machine without inputs has no input row; a one-state machine (no clock) has one row per
 * input setting ("look at the flags" when it has no inputs).
 */
import { clockActions, resetActions, valuesOf, type HandAction } from './hand.js';

/** One clock of a sequence: a reset before it, and the input levers ('0'/'1' per input, 1 = pulled). */
export interface SheetClock {
  readonly reset: boolean;
  readonly inputs: string;
}

export type SheetStepKind = 'reset' | 'inputs' | 'look' | 'pull-phi1' | 'release-phi1' | 'pull-phi2' | 'release-phi2';

/** One row of the sheet: its clock (0 for the first reset), its kind, the clock it belongs to in the sequence (-1 for the first reset), and the actions. */
export interface SheetStep {
  readonly clock: number;
  readonly kind: SheetStepKind;
  readonly at: number;
  readonly actions: readonly HandAction[];
}

const PHASES: readonly [SheetStepKind, HandAction][] = [
  ['pull-phi1', { kind: 'pull', lever: 'phi1' }],
  ['release-phi1', { kind: 'release', lever: 'phi1' }],
  ['pull-phi2', { kind: 'pull', lever: 'phi2' }],
  ['release-phi2', { kind: 'release', lever: 'phi2' }],
];

/** The rows of one clock, with the input levers at `current` before it; `at` is its place in the sequence. */
export function clockSteps(
  inputs: readonly string[],
  seq: boolean,
  c: SheetClock,
  at: number,
  current: string,
): SheetStep[] {
  const clock = at + 1;
  const out: SheetStep[] = [];
  if (c.reset && seq) out.push({ clock, kind: 'reset', at, actions: resetActions() });
  const moves = clockActions(inputs, valuesOf(inputs, c.inputs), valuesOf(inputs, current)).slice(0, -4);
  if (inputs.length > 0) out.push({ clock, kind: 'inputs', at, actions: moves });
  else if (!seq) out.push({ clock, kind: 'look', at, actions: [] });
  if (seq) for (const [kind, a] of PHASES) out.push({ clock, kind, at, actions: [a] });
  return out;
}

/** Every row of the sheet for a sequence, from power-up. */
export function sheetSteps(inputs: readonly string[], seq: boolean, tour: readonly SheetClock[]): SheetStep[] {
  const out: SheetStep[] = seq ? [{ clock: 0, kind: 'reset', at: -1, actions: resetActions() }] : [];
  let current = '0'.repeat(inputs.length);
  tour.forEach((c, i) => {
    out.push(...clockSteps(inputs, seq, c, i, current));
    current = c.inputs;
  });
  return out;
}
