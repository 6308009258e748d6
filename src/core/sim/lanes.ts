/**
 * Bit-parallel settling: 32 start points of one netlist at once, one bit per start point (a
 * lane) in a 32-bit word per driver, moved by the settle programs of program.ts — the
 * exhaustive checks and the drive snapshots run their clocks here.
 *
 * Method: parallel-pattern logic simulation (one machine word carries one signal of many input
 * patterns; e.g. Abramovici, Breuer & Friedman, *Digital Systems Testing and Testable Design*,
 * ch. 3 — from memory): a gate is `~(a & b & …)` over words; a latch is set where S̄ = 0,
 * reset where R̄ = 0 and holds elsewhere. A lane is *suspect* where the programs cannot vouch
 * that the event-driven simulator (settle.ts) would give the same values with no alarm: its
 * latches do not hold a value when it is set up, a latch is not stable in its held state, a
 * latch sees S̄ and R̄ move in opposite directions or end both pulled, or a move has no
 * program (then every lane is). The caller simulates a suspect lane again event-driven; every
 * other lane's values are exactly the event-driven ones (program.ts gives the argument), with
 * no alarm. Glitches on gates that reach no latch change nothing here (no time is kept).
 * All lanes move the same lever the same way; they differ in latch contents and input levers.
 */
import { readOutputs, X, type PartSim, type Trit } from './compile.js';
import { heldProgram, moveProgram, type SettleProgram } from './program.js';

/** Start points per batch. */
export const LANES = 32;

/** Up to 32 states of one netlist, a bit per lane in a word per driver. */
export class LaneBatch {
  /** One word per driver: bit i is the driver's value in lane i. */
  readonly words: Int32Array;
  /** The words before the current move. */
  private readonly before: Int32Array;
  /** Lanes in use (bit i set: lane i holds a start point). */
  used = 0;
  /** Lanes whose values the programs cannot vouch for (see the module comment). */
  suspect = 0;

  constructor(readonly sim: PartSim) {
    this.words = new Int32Array(sim.driverCount);
    this.before = new Int32Array(sim.driverCount);
  }

  /** Empty the batch: every lever released, every latch reset, no lane in use. */
  clear(): void {
    this.words.fill(0);
    this.used = 0;
    this.suspect = 0;
  }

  /** Put latch li of lane `lane` at Q = q, Q̄ = qBar (0, 1 or X); a lane whose latch holds no value is suspect. */
  setLatch(lane: number, li: number, q: number, qBar: number): void {
    const l = this.sim.latches[li];
    const bit = 1 << lane;
    this.used |= bit;
    if (q === X || qBar === X || q === qBar) this.suspect |= bit;
    this.put(l.set, bit, q === 1);
    this.put(l.reset, bit, qBar === 1);
  }

  /** Put the latches of lane `lane` at a slave code and a master code ('0'/'1' per bit). */
  setCodes(lane: number, code: string, masterCode = code): void {
    const sim = this.sim;
    for (let b = 0; b < code.length; b++) {
      const m = masterCode.charCodeAt(b) - 48;
      const s = code.charCodeAt(b) - 48;
      if (b < sim.masters.length) this.setLatch(lane, sim.masters[b], m, 1 - m);
      if (b < sim.slaves.length) this.setLatch(lane, sim.slaves[b], s, 1 - s);
    }
    this.used |= 1 << lane;
  }

  /** Put the latches of lane `lane` at Q and Q̄ per latch (part.ts's latchesOf layout: two values per latch). */
  setLatches(lane: number, latches: ArrayLike<number>): void {
    for (let li = 0; li < this.sim.latches.length; li++) this.setLatch(lane, li, latches[2 * li], latches[2 * li + 1]);
    this.used |= 1 << lane;
  }

  /** Put the input levers of lane `lane` at an assignment ('0'/'1' per input). */
  setInputs(lane: number, assignment: string): void {
    const bit = 1 << lane;
    this.used |= bit;
    const levers = this.sim.inputLevers;
    for (let i = 0; i < levers.length; i++) this.put(levers[i], bit, assignment.charCodeAt(i) === 49);
  }

  private put(d: number, bit: number, one: boolean): void {
    if (one) this.words[d] |= bit;
    else this.words[d] &= ~bit;
  }

  /**
   * Settle every gate outside the latches from the levers and latches set up (control levers
   * released): the state "at this code with these inputs held". Lanes whose latches would not
   * hold there become suspect.
   */
  settleHeld(): void {
    const sim = this.sim;
    for (const d of [sim.phi1, sim.phi2, sim.reset]) if (d >= 0) this.words[d] = 0;
    const prog = heldProgram(sim);
    if (!prog.fast) {
      this.suspect = this.used;
      return;
    }
    this.run(prog);
    const w = this.words;
    let bad = 0;
    for (const l of sim.latches) {
      const s = this.and(l.sBar, w);
      const r = this.and(l.rBar, w);
      const q = w[l.set];
      const qb = w[l.reset];
      // Stable: both ports released, or the pulled port agrees with what the latch holds.
      const stable = (s & r) | (~s & r & q) | (s & ~r & ~q);
      bad |= ~stable | ~(q ^ qb);
    }
    this.suspect |= bad & this.used;
  }

  /** Move lever d to v in every lane. */
  move(d: number, v: 0 | 1): void {
    const sim = this.sim;
    if (d < 0) return;
    const w = this.words;
    const ctrl =
      (sim.phi1 >= 0 && (w[sim.phi1] & 1) === 1 ? 1 : 0) |
      (sim.phi2 >= 0 && (w[sim.phi2] & 1) === 1 ? 2 : 0) |
      (sim.reset >= 0 && (w[sim.reset] & 1) === 1 ? 4 : 0);
    const prog = moveProgram(sim, d, ctrl);
    this.before.set(w);
    w[d] = v === 1 ? -1 : 0;
    if (!prog.fast) {
      this.suspect = this.used;
      return;
    }
    this.run(prog);
  }

  /** The four clock-lever moves of one clock: pull φ1, release, pull φ2, release. */
  clock(): void {
    const { phi1, phi2 } = this.sim;
    this.move(phi1, 1);
    this.move(phi1, 0);
    this.move(phi2, 1);
    this.move(phi2, 0);
  }

  /** The value of driver d in a lane. */
  value(d: number, lane: number): 0 | 1 {
    return ((this.words[d] >>> lane) & 1) as 0 | 1;
  }

  /** Every driver's value in one lane, into `out` (a scalar state's values). */
  laneValues(lane: number, out: Uint8Array): Uint8Array {
    const w = this.words;
    for (let d = 0; d < w.length; d++) out[d] = (w[d] >>> lane) & 1;
    return out;
  }

  /** Q and Q̄ of every latch of a lane (part.ts's latchesOf layout). */
  latchesOf(lane: number): Uint8Array {
    const latches = this.sim.latches;
    const out = new Uint8Array(2 * latches.length);
    for (let li = 0; li < latches.length; li++) {
      out[2 * li] = this.value(latches[li].set, lane);
      out[2 * li + 1] = this.value(latches[li].reset, lane);
    }
    return out;
  }

  /** The slave code of a lane. */
  slaveCode(lane: number): string {
    let s = '';
    for (let b = 0; b < this.sim.slaves.length; b++) s += this.value(this.sim.latches[this.sim.slaves[b]].set, lane);
    return s;
  }

  /** A key of a lane's latch contents, as sim/clocking.ts's latchKey gives it for a scalar state. */
  latchKey(lane: number): string {
    let k = '';
    for (const l of this.sim.latches)
      k += String.fromCharCode(48 + this.value(l.set, lane) * 3 + this.value(l.reset, lane));
    return k;
  }

  /** The outputs of a lane, as part.ts's outputValues reads them. */
  outputs(lane: number): Trit[] {
    return readOutputs(this.sim, (d) => this.value(d, lane));
  }

  /** AND of some drivers' words (a latch port). */
  private and(ds: Int32Array, w: Int32Array): number {
    let a = -1;
    for (let j = 0; j < ds.length; j++) a &= w[ds[j]];
    return a;
  }

  /** Run a program over the words; latches that cannot be vouched for mark their lanes suspect. */
  private run(prog: SettleProgram): void {
    const { inStart, inputs, latches } = this.sim;
    const w = this.words;
    const old = this.before;
    const steps = prog.steps;
    let bad = 0;
    for (let i = 0; i < steps.length; i++) {
      const g = steps[i];
      if (g >= 0) {
        let a = -1;
        for (let j = inStart[g]; j < inStart[g + 1]; j++) a &= w[inputs[j]];
        w[g] = ~a;
        continue;
      }
      const l = latches[~g];
      const s = this.and(l.sBar, w);
      const r = this.and(l.rBar, w);
      const s0 = this.and(l.sBar, old);
      const r0 = this.and(l.rBar, old);
      const q = w[l.set];
      const qb = w[l.reset];
      // Suspect: both ports pulled, the ports moving in opposite directions, the latch holding no value.
      bad |= (~s & ~r) | ((s ^ s0) & (r ^ r0) & (s ^ r)) | ~(q ^ qb);
      w[l.set] = ~s | (r & q);
      w[l.reset] = ~r | (s & qb);
    }
    this.suspect |= bad & this.used;
  }
}
