/**
 * One clock of the hand procedure, as the simulation-based checks and the drive snapshots run
 * it on the compiled netlist: the named moments of a clock (inputs held, φ1 pulled, φ1
 * released, φ2 pulled, φ2 released — the lever actions are hand.ts's `phaseActions`), one
 * clock run from a held state, and the input levers moved from one combination to the next.
 */
import { phaseActions, type HandAction } from './hand.js';
import {
  applyInPlace,
  isAlarm,
  outputValues,
  setLeversInPlace,
  slaveCode,
  type PartEvent,
  type PartSim,
  type Trit,
} from './part.js';

/** A moment of one clock: the inputs held before φ1, then after each of the four clock-lever actions. */
export type ClockPhase = 'inputs-held' | 'phi1-pulled' | 'phi1-released' | 'phi2-pulled' | 'phi2-released';

/** One moment of a clock and the action that leads to it (none for the first). */
export interface ClockStep {
  readonly phase: ClockPhase;
  readonly action?: HandAction;
}

/** Each moment in words, for reports. */
export const PHASE_WORDS: Readonly<Record<ClockPhase, string>> = {
  'inputs-held': 'inputs held',
  'phi1-pulled': 'φ1 pulled',
  'phi1-released': 'φ1 released',
  'phi2-pulled': 'φ2 pulled',
  'phi2-released': 'φ2 released',
};

const AFTER_ACTIONS: readonly ClockPhase[] = ['phi1-pulled', 'phi1-released', 'phi2-pulled', 'phi2-released'];

/** The moments of one clock in order: inputs held, then one per action of hand.ts's `phaseActions`. */
export const CLOCK_PHASES: readonly ClockStep[] = [
  { phase: 'inputs-held' },
  ...phaseActions().map((action, i) => ({ phase: AFTER_ACTIONS[i], action })),
];

const ACTIONS: readonly HandAction[] = CLOCK_PHASES.flatMap((p) => (p.action ? [p.action] : []));

/** What one clock did, from a state with its inputs already held. */
export interface ClockOutcome {
  /** Outputs shown while the inputs were held, before φ1. */
  readonly outputs: Trit[];
  /** State after releasing φ2. */
  readonly values: Uint8Array;
  readonly code: string;
  readonly alarms: PartEvent[];
}

/** Run the four clock-lever actions from `held` (not modified). */
export function clockFrom(sim: PartSim, held: Uint8Array): ClockOutcome {
  const values = held.slice();
  const outputs = outputValues(sim, values);
  const events: PartEvent[] = [];
  let t = 0;
  for (const a of ACTIONS) t = applyInPlace(sim, values, t, a, events);
  return { outputs, values, code: slaveCode(sim, values), alarms: events.filter(isAlarm) };
}

/**
 * Visit each assignment with the input levers held at it, starting from `base` (not
 * modified): the levers move from one assignment to the next, so Gray order costs one lever
 * per step. Alarms raised while moving input levers go to `onAlarm`. `visit` returning false stops.
 */
export function forEachHeld(
  sim: PartSim,
  base: Uint8Array,
  assignments: readonly string[],
  visit: (held: Uint8Array, assignment: string) => boolean | void,
  onAlarm?: (assignment: string, alarms: PartEvent[]) => void,
): void {
  const held = base.slice();
  const to: (0 | 1)[] = [];
  const levers = Array.from(sim.inputLevers);
  for (const a of assignments) {
    for (let i = 0; i < levers.length; i++) to[i] = a[i] === '1' ? 1 : 0;
    const events: PartEvent[] = [];
    setLeversInPlace(sim, held, 0, levers, to, events);
    const alarms = events.filter(isAlarm);
    if (alarms.length > 0 && onAlarm) onAlarm(a, alarms);
    if (visit(held, a) === false) return;
  }
}

/** A key for the memory of the netlist: every latch's two outputs. */
export function latchKey(sim: PartSim, values: Uint8Array): string {
  let k = '';
  for (const l of sim.latches) k += String.fromCharCode(48 + values[l.set] * 3 + values[l.reset]);
  return k;
}
