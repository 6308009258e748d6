/**
 * A thin runner over the pure part step: it holds the current state and an undo history and
 * offers the hand procedure as whole steps (`clock`, `reset`). All behaviour is in part.ts.
 */
import type { Build } from '../model/build.js';
import { clockActions, describeAction, resetActions, type HandAction, type InputValues } from './hand.js';
import {
  isAlarm,
  powerUp,
  readPart,
  simFor,
  stepSim,
  type PartEvent,
  type PartReading,
  type PartSim,
  type PartState,
  type PartTiming,
} from './part.js';

/** What one clock did: the outputs shown while its inputs were held (before φ1), and the code before and after. */
export interface ClockRecord {
  readonly inputs: InputValues;
  readonly before: PartReading;
  readonly outputs: Readonly<Record<string, string>>;
  readonly after: PartReading;
  readonly alarms: readonly PartEvent[];
}

export interface PartRunner {
  readonly sim: PartSim;
  /** The current state. */
  readonly state: PartState;
  /** The current reading (state, code, levers, latches, outputs). */
  reading(): PartReading;
  /** Do one hand action; returns its alarms. */
  act(action: HandAction): PartEvent[];
  /** One clock of the hand procedure with these input levers (missing → released). */
  clock(inputs: InputValues): ClockRecord;
  /** Pull the reset lever and release it. */
  reset(): PartEvent[];
  /** Go back to before the last act, clock or reset; false when there is nothing to undo. */
  undo(): boolean;
  /** Labels of the steps that undo would take back, oldest first. */
  readonly history: readonly string[];
}

/** A runner at power-up (latches X until reset). */
export function createRunner(build: Build, timing: PartTiming): PartRunner {
  const sim = simFor(build, timing);
  let state = powerUp(sim)[0];
  const past: { state: PartState; label: string }[] = [];
  const run = (actions: readonly HandAction[]): PartEvent[] => {
    const alarms: PartEvent[] = [];
    for (const a of actions) {
      const [next, events] = stepSim(sim, state, a);
      state = next;
      alarms.push(...events.filter(isAlarm));
    }
    return alarms;
  };
  const remember = (label: string): void => {
    past.push({ state, label });
  };
  return {
    sim,
    get state() {
      return state;
    },
    get history() {
      return past.map((p) => p.label);
    },
    reading: () => readPart(sim, state),
    act(action) {
      remember(describeAction(action));
      return run([action]);
    },
    clock(inputs) {
      remember('clock');
      const m = build.machine;
      const actions = clockActions(m.inputs, inputs);
      const setCount = actions.length - 4;
      const alarms = run(actions.slice(0, setCount));
      const before = readPart(sim, state);
      alarms.push(...run(actions.slice(setCount)));
      return { inputs, before, outputs: before.outputs, after: readPart(sim, state), alarms };
    },
    reset() {
      remember('reset');
      return run(resetActions());
    },
    undo() {
      const last = past.pop();
      if (!last) return false;
      state = last.state;
      return true;
    },
  };
}
