/**
 * Shared machinery of the part-level checks: the spec they compare against, the input
 * combinations they try (exhaustive up to a bound, else one per row cube plus seeded random
 * samples), and one clock of the hand procedure run from a held state of the compiled netlist.
 */
import { mintermString } from '../model/cube.js';
import type { FlatMachine } from '../model/flat.js';
import type { Random } from '../model/random.js';
import { phaseActions, type HandAction } from '../sim/hand.js';
import {
  applyInPlace,
  isAlarm,
  outputValues,
  setLeversInPlace,
  slaveCode,
  type PartEvent,
  type PartSim,
  type Trit,
} from '../sim/part.js';

/** What the build is checked against besides its own (minimised) machine. */
export interface SpecInfo {
  /** The machine as written (flattened), whose minimised form the build was made from. */
  readonly original?: FlatMachine;
  /** Original state name → name of the minimised state that stands for it (StateMinimisation.merged). */
  readonly merged?: Readonly<Record<string, string>>;
}

/** Default bound: up to this many inputs every combination is tried. */
export const EXHAUSTIVE_INPUTS = 16;

/** Every assignment of n inputs in reflected Gray-code order (one lever moves between neighbours). */
export function grayAssignments(n: number): string[] {
  const out: string[] = [];
  const total = 2 ** n;
  for (let k = 0; k < total; k++) out.push(mintermString(k ^ (k >>> 1), n));
  return out;
}

/** One assignment inside each cube (free inputs released) plus `samples` seeded random ones, duplicates dropped. */
export function sampledAssignments(cubes: readonly string[], n: number, samples: number, rnd: Random): string[] {
  const out = new Set<string>();
  for (const c of cubes) out.add(c.replace(/-/g, '0'));
  for (let i = 0; i < samples; i++) {
    let s = '';
    for (let k = 0; k < n; k++) s += rnd.next() < 0.5 ? '0' : '1';
    out.add(s);
  }
  return [...out];
}

/** What one clock did, from a state with its inputs already held. */
export interface ClockOutcome {
  /** Outputs shown while the inputs were held, before φ1. */
  readonly outputs: Trit[];
  /** State after releasing φ2. */
  readonly values: Uint8Array;
  readonly code: string;
  readonly alarms: PartEvent[];
}

/** Run the four phase actions from `held` (not modified). */
export function clockFrom(sim: PartSim, held: Uint8Array): ClockOutcome {
  const values = held.slice();
  const outputs = outputValues(sim, values);
  const events: PartEvent[] = [];
  let t = 0;
  for (const a of PHASES) t = applyInPlace(sim, values, t, a, events);
  return { outputs, values, code: slaveCode(sim, values), alarms: events.filter(isAlarm) };
}

const PHASES: readonly HandAction[] = phaseActions();

/**
 * Visit each assignment with the input levers held at it, starting from `base` (not
 * modified): the levers move from one assignment to the next, so Gray order costs one lever
 * per step. Alarms raised while moving input levers go to `onAlarm`.
 */
export function forEachHeld(
  sim: PartSim,
  base: Uint8Array,
  assignments: readonly string[],
  visit: (held: Uint8Array, assignment: string) => boolean | void,
  onAlarm?: (assignment: string, alarms: PartEvent[]) => void,
): void {
  const held = base.slice();
  const to: (0 | 1)[] = new Array(sim.inputLevers.length);
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

/** Every code of `bits` bits, in counting order. */
export function allCodes(bits: number): string[] {
  const out: string[] = [];
  for (let m = 0; m < 2 ** bits; m++) out.push(mintermString(m, bits));
  return out;
}

/** Up to `count` distinct seeded random codes of `bits` bits, none of them in `skip`. */
export function randomCodes(bits: number, count: number, rnd: Random, skip: ReadonlySet<string> = new Set()): string[] {
  const out = new Set<string>();
  for (let tries = 0; out.size < count && tries < count * 4; tries++) {
    let s = '';
    for (let b = 0; b < bits; b++) s += rnd.next() < 0.5 ? '0' : '1';
    if (!skip.has(s)) out.add(s);
  }
  return [...out];
}

/** `a=1 b=0` for an assignment. */
export function describeInputs(inputs: readonly string[], assignment: string): string {
  return inputs.length === 0 ? '(no inputs)' : inputs.map((n, i) => `${n}=${assignment[i]}`).join(' ');
}
