/**
 * The runner's memo of clocks (runner.ts): what a clock did, kept by the settled state it
 * started from and the input levers it was given, so that the same clock from the same state
 * costs one look-up instead of settling its lever moves again. A second, smaller table keeps
 * the four clock-lever moves by the state with the inputs held (before φ1): a clock new to the
 * first table then settles only its input levers, as long as that held state has been seen
 * (a machine's held states are about its states × input combinations; its whole clocks, from
 * every earlier setting of the input levers, are that many times the input combinations).
 *
 * Method: memoisation of a deterministic step (tabling; D. Michie, "'Memo' functions and
 * machine learning", Nature 218, 1968 — from memory), keyed by a short name of the state.
 *
 * Why it is exact:
 * - A clock is a deterministic function of the values of every driver before it, the input
 *   levers it sets and the time it starts at (settle.ts and fast.ts read nothing else: no
 *   randomness, no option that changes between clocks; the stage delays belong to the
 *   compiled netlist, and a memo belongs to one runner, which keeps one netlist).
 * - Time only shifts: every settling time is the start time plus whole microseconds of stage
 *   delay (sums and maxima of whole numbers, exact in a double below 2^53), so a clock started
 *   later gives the same changes at the same offsets. The memo keeps offsets and is used only
 *   where the end time stays a safe integer.
 * - A ready state (fast.ts: binary, settled, every latch holding a value) is named by its
 *   levers and the Q of each latch alone: in it Q̄ = NOT Q, and when the gates outside the
 *   latches form no loop (program.ts's `heldProgram` is fast) each of them is the NAND of
 *   drivers that come before it in that program's order, so one value each is possible. A
 *   netlist with such a loop gets no memo.
 * - Only clocks (and four clock-lever moves) that start and end in a ready state and raise no
 *   alarm are kept; every other one is settled as before (alarms carry absolute times).
 * The tests hold the runner with the memo to the runner without it and to the event-driven
 * simulator, clock by clock (tests/core/sim/memo.test.ts).
 * Bound: the states and clocks kept take at most `maxBytes` (estimated); past it the memo is
 * emptied and fills again. A run that seldom comes back to a clock (a wide machine stepped at
 * random) would pay for copying every new state and answer little: when fewer than one clock
 * in REST_BELOW of a window of WINDOW clocks is answered, the memo rests (keeps nothing new,
 * still answers from what it holds) for one window, then two, four … up to MAX_REST, and
 * keeps again after each rest; a window that is answered well enough ends the backing off.
 * What is kept never changes, so resting changes which clocks are answered, never an answer.
 */
import type { PartSim } from './compile.js';
import { heldProgram } from './program.js';

/** Default bound on the memory of one runner's memo (bytes, estimated). */
export const MEMO_BYTES = 16 * 1024 * 1024;

/** Estimated bytes a kept state or clock costs beyond its arrays. */
const OVERHEAD = 128;

/** Clocks per window of the resting rule (module comment). */
const WINDOW = 1024;
/** A window with fewer answered clocks than WINDOW / REST_BELOW sends the memo to rest. */
const REST_BELOW = 8;
/** Most windows of one rest. */
const MAX_REST = 64;

/** Levers plus latches up to which a state's name is a number (a double holds 53 bits exactly). */
const NUMERIC_BITS = 52;

/** A ready state the runner has been in: every driver's value, and the clocks seen from it. */
export class MemoState {
  /** Clocks from this state by their input levers (the runner's packed form: bits, or a '0'/'1' string); made with the first. */
  clocks: Map<number | string, MemoClock> | null = null;
  /** The four clock-lever moves from this state, once seen (a state with the inputs held before φ1). */
  phases: MemoPhases | null = null;
  constructor(
    /** Every driver's value (never changed). */
    readonly values: Uint8Array,
    /** The memo's filling this state belongs to (a state of an emptied memo takes no clocks). */
    readonly filling: number,
  ) {}
}

/** One clock from a MemoState: where it ends and what the runner reports of it. */
export interface MemoClock {
  readonly to: MemoState;
  /** The reading drivers' values while the inputs were held, then after the clock (never changed). */
  readonly kept: Uint8Array;
  /** Microseconds from the clock's start to the inputs held, and to its end. */
  readonly heldDt: number;
  readonly doneDt: number;
}

/** The four clock-lever moves from a MemoState: where they end, the reading drivers' values after them, their time. */
export interface MemoPhases {
  readonly to: MemoState;
  readonly kept: Uint8Array;
  readonly dt: number;
}

/** How the memo has served: clocks answered from it, clocks settled in full, what it holds. */
export interface MemoStats {
  /** Clocks answered whole. */
  readonly hits: number;
  /** Clocks whose input levers were settled and whose four clock-lever moves were answered. */
  readonly heldHits: number;
  /** Clocks settled in full while the memo was on. */
  readonly misses: number;
  readonly states: number;
  readonly clocks: number;
  /** Times it was emptied at its bound. */
  readonly emptied: number;
  /** Windows of clocks in which it rested (kept nothing new, see memo.ts). */
  readonly rested: number;
}

/** What became of a clock from a ready state: answered whole, its clock-lever moves answered, or settled in full. */
export type MemoAnswer = 'hit' | 'held' | 'miss';

/** The memo of one runner (see the module comment). */
export class ClockMemo {
  /** False: the memo keeps nothing (bound 0, or gates outside the latches form a loop). */
  readonly usable: boolean;
  private hits = 0;
  private heldHits = 0;
  private misses = 0;
  /** The resting rule: clocks and answers in this window, windows of rest left, of the next rest, rested in all. */
  private windowClocks = 0;
  private windowAnswers = 0;
  private restLeft = 0;
  private nextRest = 1;
  private rested = 0;
  private states = new Map<number | string, MemoState>();
  private clockCount = 0;
  private bytes = 0;
  private filling = 0;
  private readonly numeric: boolean;

  constructor(
    private readonly sim: PartSim,
    private readonly maxBytes: number = MEMO_BYTES,
  ) {
    this.usable = maxBytes > 0 && heldProgram(sim).fast;
    this.numeric = sim.leverCount + sim.latches.length <= NUMERIC_BITS;
  }

  /** The kept state of ready `values` (kept now when new); null when the memo cannot hold it. */
  stateOf(values: Uint8Array): MemoState | null {
    if (!this.usable) return null;
    const key = this.key(values);
    const known = this.states.get(key);
    if (known) return known;
    if (this.restLeft > 0 || !this.room(values.length)) return null;
    const s = new MemoState(values.slice(), this.filling);
    this.states.set(key, s);
    return s;
  }

  /** Keep a clock from `from` with input levers `inputs` (a copy of `kept` is made). */
  keep(
    from: MemoState,
    inputs: number | string,
    to: MemoState,
    kept: Uint8Array,
    heldDt: number,
    doneDt: number,
  ): void {
    if (this.restLeft > 0 || !this.holds(from) || !this.holds(to) || !this.room(kept.length)) return;
    // room() may have emptied the memo: then `from` is no longer kept and takes nothing.
    if (!this.holds(from)) return;
    (from.clocks ??= new Map<number | string, MemoClock>()).set(inputs, { to, kept: kept.slice(), heldDt, doneDt });
    this.clockCount++;
  }

  /** Keep the four clock-lever moves from `held` (a copy of `kept`, the readings after them, is made). */
  keepPhases(held: MemoState, to: MemoState, kept: Uint8Array, dt: number): void {
    if (this.restLeft > 0 || !this.holds(held) || !this.holds(to) || !this.room(kept.length)) return;
    if (!this.holds(held)) return;
    held.phases = { to, kept: kept.slice(), dt };
  }

  /** Count a clock that consulted the memo, and apply the resting rule at the end of each window. */
  count(answer: MemoAnswer): void {
    if (answer === 'hit') this.hits++;
    else if (answer === 'held') this.heldHits++;
    else this.misses++;
    if (answer !== 'miss') this.windowAnswers++;
    if (++this.windowClocks < WINDOW) return;
    if (this.restLeft > 0) {
      this.restLeft--;
      this.rested++;
    } else if (this.windowAnswers * REST_BELOW < WINDOW) {
      this.restLeft = this.nextRest;
      this.nextRest = Math.min(MAX_REST, 2 * this.nextRest);
    } else this.nextRest = 1;
    this.windowClocks = 0;
    this.windowAnswers = 0;
  }

  /** Whether `s` belongs to the memo's present filling (a state of an emptied one is dropped by its holder). */
  holds(s: MemoState): boolean {
    return s.filling === this.filling;
  }

  stats(): MemoStats {
    return {
      hits: this.hits,
      heldHits: this.heldHits,
      misses: this.misses,
      states: this.states.size,
      clocks: this.clockCount,
      emptied: this.filling,
      rested: this.rested,
    };
  }

  /** Room for an array of n bytes: empties the memo when it would pass its bound; false when n alone would. */
  private room(n: number): boolean {
    const cost = n + OVERHEAD;
    if (cost > this.maxBytes) return false;
    if (this.bytes + cost > this.maxBytes) {
      this.states = new Map<number | string, MemoState>();
      this.clockCount = 0;
      this.bytes = 0;
      this.filling++;
    }
    this.bytes += cost;
    return true;
  }

  /** The name of a ready state: every lever's value, then every latch's Q (see the module comment). */
  private key(values: Uint8Array): number | string {
    const { leverCount, latches } = this.sim;
    if (this.numeric) {
      let k = 0;
      for (let d = 0; d < leverCount; d++) k = k * 2 + values[d];
      for (let li = 0; li < latches.length; li++) k = k * 2 + values[latches[li].set];
      return k;
    }
    let s = '';
    let word = 0;
    let n = 0;
    const bit = (b: number): void => {
      word = (word << 1) | b;
      if (++n === 16) {
        s += String.fromCharCode(word);
        word = 0;
        n = 0;
      }
    };
    for (let d = 0; d < leverCount; d++) bit(values[d]);
    for (let li = 0; li < latches.length; li++) bit(values[latches[li].set]);
    return s + String.fromCharCode(word, n);
  }
}
