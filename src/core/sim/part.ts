/**
 * The part-level simulator: a pure step `stepPart(build, state, action) → [next, events]`
 * over the lever netlist, in three-valued logic with per-part stage delays (settle.ts holds
 * the event-driven method and its reference).
 *
 * Contract: the state holds every lever position (1 = pulled), every gate output (0/1/X) and
 * the time; a step moves one lever at the current time, reports any operating rule the move
 * breaks, and propagates until the netlist settles, reporting forbidden latch inputs, latches
 * left X and oscillation. Preconditions: a build whose netlist keeps the invariants of
 * model/netlist.ts. Postconditions: the input state is never modified.
 */
import type { Build } from '../model/build.js';
import { nameRecord } from '../model/records.js';
import { DEFAULT_PROFILE, type Profile } from '../physics/profile.js';
import { compilePart, readOutputs, X, type PartSim, type PartTiming, type Trit } from './compile.js';
import {
  describeAction,
  ruleBroken,
  RULE_WORDS,
  type HandAction,
  type InputValues,
  type OperatingRule,
} from './hand.js';
import { isReady, moverFor } from './fast.js';
import { evalGate, settle, show, type PartEvent, type PartEventKind } from './settle.js';

export { X, compilePart, type PartSim, type PartTiming, type Trit } from './compile.js';
export { evalGate, latchLabel, show, type PartEvent, type PartEventKind } from './settle.js';

/** Lever positions, gate outputs and time of a netlist. Treat as immutable. */
export interface PartState {
  /** One value per driver (levers, then gates, in netlist order): 0, 1 or X (2). */
  readonly values: Uint8Array;
  /** Time in microseconds since power-up (whole numbers keep equal delays exactly equal). */
  readonly timeUs: number;
}

/** Options of one step. */
export interface StepOptions {
  /** Stage delays; default: the shipped profile's `stageDelayS` for every gate. */
  readonly timing?: PartTiming;
  /** Also report every part change as a 'change' event. */
  readonly trace?: boolean;
}

const compiled = new WeakMap<Build, Map<string, PartSim>>();

/** The compiled netlist of a build for these delays (cached per build and timing). */
export function simFor(build: Build, timing: PartTiming): PartSim {
  let byTiming = compiled.get(build);
  if (!byTiming) compiled.set(build, (byTiming = new Map<string, PartSim>()));
  const key = JSON.stringify([timing.stageDelayS, timing.delays ?? {}]);
  let sim = byTiming.get(key);
  if (!sim) byTiming.set(key, (sim = compilePart(build, timing)));
  return sim;
}

/** Nominal timing from a profile: every gate takes `stageDelayS`. */
export function timingOf(profile: Pick<Profile, 'stageDelayS'>, delays?: Readonly<Record<string, number>>): PartTiming {
  return delays ? { stageDelayS: profile.stageDelayS, delays } : { stageDelayS: profile.stageDelayS };
}

/** One hand action on the machine: the pure step. */
export function stepPart(
  build: Build,
  state: PartState,
  action: HandAction,
  opts: StepOptions = {},
): [PartState, PartEvent[]] {
  return stepSim(simFor(build, opts.timing ?? timingOf(DEFAULT_PROFILE)), state, action, opts.trace ?? false);
}

/**
 * The pure step on an already compiled netlist. Without `trace` the move is settled by the
 * fast pass where it can vouch for the result (fast.ts), which gives what the event-driven
 * settling gives; with `trace` always event-driven (it reports every part change).
 */
export function stepSim(sim: PartSim, state: PartState, action: HandAction, trace = false): [PartState, PartEvent[]] {
  const values = state.values.slice();
  const events: PartEvent[] = [];
  const timeUs = trace
    ? applyInPlace(sim, values, state.timeUs, action, events, true)
    : applyFastInPlace(sim, values, state.timeUs, action, events, isReady(sim, state.values));
  return [{ values, timeUs }, events];
}

/** The lever an action moves and the value it puts there. */
export function leverOf(sim: PartSim, a: HandAction): [number, 0 | 1] {
  if (a.kind === 'input') {
    const i = sim.build.machine.inputs.indexOf(a.input);
    if (i < 0) throw new Error(`no input lever named '${a.input}'`);
    return [sim.inputLevers[i], a.value];
  }
  const d = a.lever === 'phi1' ? sim.phi1 : a.lever === 'phi2' ? sim.phi2 : sim.reset;
  return [d, a.kind === 'pull' ? 1 : 0];
}

const RULE_KIND: Readonly<Record<OperatingRule, PartEventKind>> = {
  'clocks-apart': 'clocks-together',
  'inputs-steady': 'input-during-phi1',
  'reset-alone': 'reset-during-clock',
};

/** Apply an action to `values` in place; returns the settled time. Alarms go to `events`. */
export function applyInPlace(
  sim: PartSim,
  values: Uint8Array,
  timeUs: number,
  a: HandAction,
  events: PartEvent[],
  trace = false,
): number {
  const [d, v] = leverOf(sim, a);
  if (d < 0 || values[d] === v) return timeUs;
  ruleAlarm(sim, values, timeUs, a, d, events);
  values[d] = v;
  return settle(sim, values, timeUs, [d], events, trace);
}

/** The alarm of an action that breaks an operating rule with the levers where they are (before the move). */
function ruleAlarm(
  sim: PartSim,
  values: Uint8Array,
  timeUs: number,
  a: HandAction,
  d: number,
  events: PartEvent[],
): void {
  const rule = ruleBroken(a, {
    phi1: values[sim.phi1] === 1,
    phi2: values[sim.phi2] === 1,
    reset: values[sim.reset] === 1,
  });
  if (rule)
    events.push({
      kind: RULE_KIND[rule],
      timeS: timeUs / 1e6,
      rule,
      parts: [sim.names[d]],
      words: `operating rule broken (${RULE_WORDS[rule]}): ${describeAction(a)}`,
    });
}

/**
 * `applyInPlace` without tracing, settled by the fast pass where it can vouch for the result
 * (fast.ts): the same values, alarms and time. `ready` says `values` is ready for the pass
 * (isReady); afterwards `moverFor(sim).ready` says whether the result is.
 */
export function applyFastInPlace(
  sim: PartSim,
  values: Uint8Array,
  timeUs: number,
  a: HandAction,
  events: PartEvent[],
  ready: boolean,
): number {
  const mover = moverFor(sim);
  const [d, v] = leverOf(sim, a);
  if (d < 0 || values[d] === v) {
    mover.ready = ready;
    return timeUs;
  }
  ruleAlarm(sim, values, timeUs, a, d, events);
  return mover.move(values, timeUs, d, v, events, ready);
}

/** Set several levers at once (used by the exhaustive checks; the hand sets them one by one). */
export function setLeversInPlace(
  sim: PartSim,
  values: Uint8Array,
  timeUs: number,
  levers: readonly number[],
  to: readonly (0 | 1)[],
  events: PartEvent[],
): number {
  const moved: number[] = [];
  levers.forEach((d, i) => {
    if (values[d] !== to[i]) {
      values[d] = to[i];
      moved.push(d);
    }
  });
  return moved.length === 0 ? timeUs : settle(sim, values, timeUs, moved, events);
}

/** The machine at power-up: every lever released, every gate X, then settled (latches stay X). */
export function powerUp(sim: PartSim): [PartState, PartEvent[]] {
  const values = new Uint8Array(sim.driverCount).fill(X);
  values.fill(0, 0, sim.leverCount);
  const events: PartEvent[] = [];
  const gates: number[] = [];
  for (let g = sim.leverCount; g < sim.driverCount; g++) gates.push(g);
  const timeUs = settle(sim, values, 0, gates, events);
  return [{ values, timeUs }, events.filter((e) => e.kind !== 'latch-x')];
}

/**
 * The machine with every slave latch holding `code` and every master `masterCode` (by
 * default the same, as after a clock or a reset; unused codes included), control levers
 * released, input levers at `assignment`.
 */
export function stateAtCode(sim: PartSim, code: string, assignment = '', masterCode = code): PartState {
  return stateAtLatches(sim, latchesAtCode(sim, code, masterCode), assignment);
}

/** Q and Q̄ of every latch (in latch order, two values each) for a slave code and a master code. */
export function latchesAtCode(sim: PartSim, code: string, masterCode = code): Uint8Array {
  const latches = new Uint8Array(2 * sim.latches.length).fill(X);
  const put = (li: number, bit: string): void => {
    latches[2 * li] = bit === '1' ? 1 : 0;
    latches[2 * li + 1] = bit === '1' ? 0 : 1;
  };
  for (let b = 0; b < code.length; b++) {
    if (b < sim.masters.length) put(sim.masters[b], masterCode[b]);
    if (b < sim.slaves.length) put(sim.slaves[b], code[b]);
  }
  return latches;
}

/** Q and Q̄ of every latch (in latch order, two values each) in a state's values. */
export function latchesOf(sim: PartSim, values: ArrayLike<number>): Uint8Array {
  const latches = new Uint8Array(2 * sim.latches.length);
  sim.latches.forEach((l, li) => {
    latches[2 * li] = values[l.set];
    latches[2 * li + 1] = values[l.reset];
  });
  return latches;
}

/**
 * The machine with its latches at `latches` (Q and Q̄ per latch, latchesAtCode's layout; X for
 * a latch not set up), control levers released, input levers at `assignment`, then settled.
 */
export function stateAtLatches(sim: PartSim, latches: ArrayLike<number>, assignment = ''): PartState {
  const values = new Uint8Array(sim.driverCount).fill(X);
  values.fill(0, 0, sim.leverCount);
  sim.inputLevers.forEach((d, i) => (values[d] = assignment[i] === '1' ? 1 : 0));
  sim.latches.forEach((l, li) => {
    values[l.set] = latches[2 * li];
    values[l.reset] = latches[2 * li + 1];
  });
  const gates: number[] = [];
  for (let g = sim.leverCount; g < sim.driverCount; g++) if (sim.latchOf[g] < 0) gates.push(g);
  // Combinational gates first, without delay, so the latches see settled inputs.
  for (let pass = 0, again = true; again && pass <= sim.driverCount; pass++) {
    again = false;
    for (const g of gates) {
      const v = evalGate(sim, values, g);
      if (v !== values[g]) {
        values[g] = v;
        again = true;
      }
    }
  }
  settle(sim, values, 0, gates, []);
  return { values, timeUs: 0 };
}

/** A latch's Q as a code character: '0', '1' or 'X'. */
function latchBit(sim: PartSim, values: Uint8Array, li: number): string {
  const l = sim.latches[li];
  const q = values[l.set];
  const qb = values[l.reset];
  return q === X || qb === X || q === qb ? 'X' : String(q);
}

/** The state code held by the slave latches ('X' where a latch is undetermined or forbidden). */
export function slaveCode(sim: PartSim, values: Uint8Array): string {
  let s = '';
  for (let b = 0; b < sim.slaves.length; b++) s += latchBit(sim, values, sim.slaves[b]);
  return s;
}

/** The code held by the master latches. */
export function masterCode(sim: PartSim, values: Uint8Array): string {
  let s = '';
  for (let b = 0; b < sim.masters.length; b++) s += latchBit(sim, values, sim.masters[b]);
  return s;
}

/** Output values in the machine's output order: flags read Z = NOT(gate output); actuators show 1 while their cord pulls; pinned parts their constant. */
export function outputValues(sim: PartSim, values: Uint8Array): Trit[] {
  return readOutputs(sim, (d) => values[d] as Trit);
}

/** Everything a person can see on the machine, in words and values. */
export interface PartReading {
  /** Slave code, and the minimised machine's state holding it (null for an unused or undetermined code). */
  readonly code: string;
  readonly state: string | null;
  readonly masterCode: string;
  readonly inputs: InputValues;
  readonly phi1: boolean;
  readonly phi2: boolean;
  readonly reset: boolean;
  readonly outputs: Readonly<Record<string, string>>;
  readonly latches: readonly {
    readonly name: string;
    readonly role: 'master' | 'slave';
    readonly bit: number;
    readonly q: string;
    readonly qBar: string;
  }[];
  readonly timeS: number;
}

/** Read the machine as a person at the levers sees it. */
export function readPart(sim: PartSim, state: PartState): PartReading {
  const v = state.values;
  const m = sim.build.machine;
  const code = slaveCode(sim, v);
  const si = sim.build.encoding.codes.indexOf(code);
  const inputs = nameRecord<0 | 1>();
  m.inputs.forEach((name, i) => (inputs[name] = v[sim.inputLevers[i]] === 1 ? 1 : 0));
  const outs = outputValues(sim, v);
  const outputs = nameRecord<string>();
  m.outputs.forEach((o, i) => (outputs[o] = show(outs[i])));
  return {
    code,
    state: si >= 0 ? m.states[si] : null,
    masterCode: masterCode(sim, v),
    inputs,
    phi1: v[sim.phi1] === 1,
    phi2: v[sim.phi2] === 1,
    reset: v[sim.reset] === 1,
    outputs,
    latches: sim.latches.map((l) => ({
      name: l.name,
      role: l.role,
      bit: l.bit,
      q: show(v[l.set]),
      qBar: show(v[l.reset]),
    })),
    timeS: state.timeUs / 1e6,
  };
}

/** True for every event but a plain part change. */
export function isAlarm(e: PartEvent): boolean {
  return e.kind !== 'change';
}
