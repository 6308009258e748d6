/**
 * A thin runner over the part step: it holds the current state and offers the hand procedure
 * as whole steps (`clock`, `reset`), with undo. All behaviour is in part.ts and fast.ts.
 *
 * What is not asked for costs (almost) nothing: the state is moved in place, lever by lever,
 * by the fast pass where it can vouch for the result (fast.ts), else event-driven; a clock's
 * readings are kept as a few bytes (the levers, latches and output drivers) and put in words
 * only when read; undo keeps a log of the steps and a copy of the state every
 * `CHECKPOINT_EVERY` steps, and goes back by replaying from the nearest copy (the step is
 * deterministic, so the replay gives the same state).
 *
 * A clock seen before costs one look-up: the memo (memo.ts) keeps, per ready state and input
 * levers, where the clock ends, its two readings and its times as offsets. The step is
 * deterministic and only shifts in time, so the memo's answer is the one settling would give
 * (memo.ts gives the argument); clocks with alarms, or from a state that is not ready, are
 * always settled.
 */
import type { Build } from '../model/build.js';
import { isBinary, moverFor, type FastMover } from './fast.js';
import { ClockMemo, MEMO_BYTES, type MemoClock, type MemoState, type MemoStats } from './memo.js';
import { describeAction, RULE_WORDS, type HandAction, type InputValues, type OperatingRule } from './hand.js';
import { ACT, CLOCK, LazyClockRecord, readingDrivers, RESET, StepLog, type ClockRecord } from './runner-log.js';
import {
  applyFastInPlace,
  powerUp,
  readPart,
  simFor,
  type PartEvent,
  type PartEventKind,
  type PartReading,
  type PartSim,
  type PartState,
  type PartTiming,
} from './part.js';

export type { ClockRecord } from './runner-log.js';

export interface PartRunner {
  readonly sim: PartSim;
  /** The current state (a copy). */
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
  /** How the memo of clocks has served so far (memo.ts). */
  memoStats(): MemoStats;
}

/** Options of a runner. */
export interface RunnerOptions {
  /** Bound on the memory of the memo of clocks, in bytes (default MEMO_BYTES, 16 MiB); 0: no memo. */
  readonly memoBytes?: number;
}

/** Bytes per block of kept readings. */
const KEPT_BLOCK = 1 << 14;

/** Steps between two kept copies of the state (undo replays at most this many steps). */
export const CHECKPOINT_EVERY = 64;

const NO_ALARMS: readonly PartEvent[] = Object.freeze([]);

interface Checkpoint {
  /** The state before step `at`. */
  readonly at: number;
  readonly values: Uint8Array;
  readonly timeUs: number;
  readonly ready: boolean;
}

const RULE_KIND: Readonly<Record<OperatingRule, PartEventKind>> = {
  'clocks-apart': 'clocks-together',
  'inputs-steady': 'input-during-phi1',
  'reset-alone': 'reset-during-clock',
};

class Runner implements PartRunner {
  private values: Uint8Array;
  private timeUs: number;
  private ready = false;
  private readonly mover: FastMover;
  private readonly drivers: Int32Array;
  /** The steps done, to replay them: a kind and a payload each (see StepLog). */
  private readonly log = new StepLog();
  private readonly checkpoints: Checkpoint[] = [];
  private alarms: PartEvent[] | null = null;
  /** Kept readings of the clocks, packed into shared blocks (no allocation per clock). */
  private block = new Uint8Array(0);
  private blockUsed = 0;
  /** Events of one move (reused: most moves raise none). */
  private readonly events: PartEvent[] = [];
  /** Readings nobody keeps (a replayed clock's). */
  private readonly scratch: Uint8Array;
  private readonly memo: ClockMemo;
  /** The memo's state for the current values, when known (any lever move forgets it). */
  private at: MemoState | null = null;

  constructor(
    readonly sim: PartSim,
    memoBytes: number,
  ) {
    const [s] = powerUp(sim);
    this.values = s.values.slice();
    this.timeUs = s.timeUs;
    this.ready = isBinary(sim, this.values);
    this.mover = moverFor(sim);
    this.drivers = readingDrivers(sim);
    this.scratch = new Uint8Array(this.drivers.length);
    this.memo = new ClockMemo(sim, memoBytes);
  }

  memoStats(): MemoStats {
    return this.memo.stats();
  }

  get state(): PartState {
    return { values: this.values.slice(), timeUs: this.timeUs };
  }

  get history(): readonly string[] {
    return this.log.labels();
  }

  reading(): PartReading {
    return readPart(this.sim, { values: this.values, timeUs: this.timeUs });
  }

  act(action: HandAction): PartEvent[] {
    this.remember(ACT, action);
    return this.doAct(action);
  }

  clock(inputs: InputValues): ClockRecord {
    const names = this.sim.build.machine.inputs;
    let packed: number | string = 0;
    if (names.length <= 30) for (let i = 0; i < names.length; i++) packed |= (inputs[names[i]] === 1 ? 1 : 0) << i;
    else packed = names.map((n) => (inputs[n] === 1 ? '1' : '0')).join('');
    this.remember(CLOCK, packed);
    const t0 = this.timeUs;
    const seen = this.recall(packed);
    if (seen)
      return new LazyClockRecord(
        inputs,
        this.sim,
        this.drivers,
        seen.kept,
        0,
        t0 + seen.heldDt,
        this.timeUs,
        NO_ALARMS,
      );
    const from = this.ready ? this.at : null;
    this.alarms = null;
    this.setInputs(packed);
    const ds = this.drivers;
    const at = this.room(2 * ds.length);
    const kept = this.block;
    for (let i = 0; i < ds.length; i++) kept[at + i] = this.values[ds[i]];
    const heldUs = this.timeUs;
    this.clockPhases(kept, at + ds.length);
    const alarms = this.alarms ?? NO_ALARMS;
    this.alarms = null;
    if (from && alarms.length === 0)
      this.memorise(from, packed, kept.subarray(at, at + 2 * ds.length), heldUs - t0, t0);
    return new LazyClockRecord(inputs, this.sim, ds, kept, at, heldUs, this.timeUs, alarms);
  }

  reset(): PartEvent[] {
    this.remember(RESET, null);
    return this.doReset();
  }

  undo(): boolean {
    const k = this.log.length - 1;
    if (k < 0) return false;
    this.log.pop();
    while (this.checkpoints.length > 0 && this.checkpoints[this.checkpoints.length - 1].at > k) this.checkpoints.pop();
    const cp = this.checkpoints[this.checkpoints.length - 1];
    this.values = cp.values.slice();
    this.timeUs = cp.timeUs;
    this.ready = cp.ready;
    this.at = null;
    for (let i = cp.at; i < k; i++) this.replay(this.log.kind(i), this.log.payload(i));
    return true;
  }

  /** Room for n kept values in `block` (a new block when it is full): their offset. */
  private room(n: number): number {
    if (this.blockUsed + n > this.block.length) {
      this.block = new Uint8Array(Math.max(KEPT_BLOCK, n));
      this.blockUsed = 0;
    }
    const at = this.blockUsed;
    this.blockUsed += n;
    return at;
  }

  private remember(kind: number, payload: HandAction | number | string | null): void {
    const n = this.log.length;
    const last = this.checkpoints[this.checkpoints.length - 1] as Checkpoint | undefined;
    if (n % CHECKPOINT_EVERY === 0 && last?.at !== n)
      this.checkpoints.push({ at: n, values: this.values.slice(), timeUs: this.timeUs, ready: this.ready });
    this.log.push(kind, payload);
  }

  private replay(kind: number, payload: HandAction | number | string | null): void {
    if (kind === ACT) this.doAct(payload as HandAction);
    else if (kind === RESET) this.doReset();
    else if (!this.recall(payload as number | string)) {
      this.setInputs(payload as number | string);
      this.clockPhases(this.scratch, 0);
    }
    this.alarms = null;
  }

  /**
   * The four clock-lever moves from the inputs held, the reading drivers' values after them put
   * at kept[to …]: from the memo when it has seen them from this held state, else settled (and
   * kept when they raise no alarm and end ready).
   */
  private clockPhases(kept: Uint8Array, to: number): void {
    const memo = this.memo;
    const ds = this.drivers;
    const held = this.ready && memo.usable ? memo.stateOf(this.values) : null;
    const seen = held?.phases;
    if (seen && this.timeUs <= Number.MAX_SAFE_INTEGER - seen.dt) {
      memo.count('held');
      this.values.set(seen.to.values);
      this.timeUs += seen.dt;
      this.at = seen.to;
      kept.set(seen.kept, to);
      return;
    }
    if (memo.usable) memo.count('miss');
    const t0 = this.timeUs;
    const alarmsBefore = this.alarms?.length ?? 0;
    this.clockLevers();
    for (let i = 0; i < ds.length; i++) kept[to + i] = this.values[ds[i]];
    if (!held || (this.alarms?.length ?? 0) > alarmsBefore || !this.ready || !Number.isSafeInteger(this.timeUs)) return;
    const end = memo.stateOf(this.values);
    if (end === null) return;
    memo.keepPhases(held, end, kept.subarray(to, to + ds.length), this.timeUs - t0);
    this.at = end;
  }

  /**
   * The clock with these input levers from the memo, when it holds it: the state is moved to
   * the clock's end (values, time, memo state) and the kept clock returned; else null, with
   * `this.at` the memo's state for the current values when they are ready and the memo has room.
   */
  private recall(packed: number | string): MemoClock | null {
    const memo = this.memo;
    if (!this.ready || !memo.usable) return null;
    let from = this.at;
    if (from === null || !memo.holds(from)) from = this.at = memo.stateOf(this.values);
    const seen = from?.clocks?.get(packed);
    // Offsets are exact only while the end time stays a safe integer (memo.ts).
    if (seen === undefined || this.timeUs > Number.MAX_SAFE_INTEGER - seen.doneDt) return null;
    memo.count('hit');
    this.values.set(seen.to.values);
    this.timeUs += seen.doneDt;
    this.at = seen.to;
    return seen;
  }

  /** Keep a clock that ran from memo state `from` at time t0 and raised no alarm, when it ended ready. */
  private memorise(from: MemoState, packed: number | string, kept: Uint8Array, heldDt: number, t0: number): void {
    if (!this.ready || !Number.isSafeInteger(this.timeUs)) return;
    const to = this.at ?? this.memo.stateOf(this.values);
    if (to === null) return;
    this.memo.keep(from, packed, to, kept, heldDt, this.timeUs - t0);
    this.at = to;
  }

  private doAct(action: HandAction): PartEvent[] {
    this.at = null;
    const events: PartEvent[] = [];
    this.timeUs = applyFastInPlace(this.sim, this.values, this.timeUs, action, events, this.ready);
    this.ready = this.mover.ready;
    return events.filter((e) => e.kind !== 'change');
  }

  private doReset(): PartEvent[] {
    this.alarms = null;
    this.move(this.sim.reset, 1);
    this.move(this.sim.reset, 0);
    const alarms = this.alarms ?? [];
    this.alarms = null;
    return alarms;
  }

  /** Move the input levers to a clock's payload, in input order. */
  private setInputs(packed: number | string): void {
    const levers = this.sim.inputLevers;
    for (let i = 0; i < levers.length; i++) {
      const v = typeof packed === 'number' ? (packed >>> i) & 1 : packed.charCodeAt(i) - 48;
      if (this.values[levers[i]] !== v) this.move(levers[i], v as 0 | 1);
    }
  }

  private clockLevers(): void {
    const { phi1, phi2 } = this.sim;
    this.move(phi1, 1);
    this.move(phi1, 0);
    this.move(phi2, 1);
    this.move(phi2, 0);
  }

  /** Move lever d to v (the hand procedure's own moves), collecting alarms in `this.alarms`. */
  private move(d: number, v: 0 | 1): void {
    const values = this.values;
    if (d < 0 || values[d] === v) return;
    this.at = null;
    const events = this.events;
    if (events.length !== 0) events.length = 0;
    const rule = this.ruleBroken(d, v);
    if (rule) events.push(this.ruleAlarm(rule, d, v));
    this.timeUs = this.mover.move(values, this.timeUs, d, v, events, this.ready);
    this.ready = this.mover.ready;
    if (events.length > 0) (this.alarms ??= []).push(...events);
  }

  /** The operating rule moving lever d to v breaks (hand.ts's ruleBroken, on lever indices). */
  private ruleBroken(d: number, v: 0 | 1): OperatingRule | null {
    const { phi1, phi2, reset } = this.sim;
    const values = this.values;
    const p1 = phi1 >= 0 && values[phi1] === 1;
    const p2 = phi2 >= 0 && values[phi2] === 1;
    if (d !== phi1 && d !== phi2 && d !== reset) return p1 ? 'inputs-steady' : null;
    if (v === 0) return null;
    if (d === reset) return p1 || p2 ? 'reset-alone' : null;
    if (d === phi1 ? p2 : p1) return 'clocks-apart';
    return reset >= 0 && values[reset] === 1 ? 'reset-alone' : null;
  }

  private ruleAlarm(rule: OperatingRule, d: number, v: 0 | 1): PartEvent {
    const { phi1, phi2, reset } = this.sim;
    const names = this.sim.build.machine.inputs;
    const action: HandAction =
      d === phi1 || d === phi2 || d === reset
        ? { kind: v === 1 ? 'pull' : 'release', lever: d === phi1 ? 'phi1' : d === phi2 ? 'phi2' : 'reset' }
        : { kind: 'input', input: names[this.sim.inputLevers.indexOf(d)], value: v };
    return {
      kind: RULE_KIND[rule],
      timeS: this.timeUs / 1e6,
      rule,
      parts: [this.sim.names[d]],
      words: `operating rule broken (${RULE_WORDS[rule]}): ${describeAction(action)}`,
    };
  }
}

/** A runner at power-up (latches X until reset). */
export function createRunner(build: Build, timing: PartTiming, opts: RunnerOptions = {}): PartRunner {
  return new Runner(simFor(build, timing), opts.memoBytes ?? MEMO_BYTES);
}
