/**
 * Glitches in the fast pass (fast.ts): the exact timing of the gates whose inputs moved both
 * ways, which settle.ts's event queue would show as short pulses.
 *
 * Only gates whose changes reach no latch can be here (program.ts gives such a move no
 * program otherwise), so a glitch changes no settled value and raises no alarm; it changes
 * the time of the last change, which the fast pass reports. Method: waveform simulation in
 * topological order (each gate's input changes, in time order, through the inertial delay
 * model of settle.ts: at each instant the due output change and every input change of that
 * instant are applied together, then the gate is evaluated and a change scheduled one stage
 * delay later, or the pending one dropped when the gate no longer wants it). settle.ts takes
 * its time from the last entry it pops, dropped ones included, so the latest scheduled change
 * is what counts.
 */
import type { PartSim } from './compile.js';

export class Glitches {
  /** Per driver: the pass (epoch) in which its changes were simulated here, its value before, and its changes in the pool. */
  private readonly wfEpoch: Int32Array;
  private readonly wfInit: Uint8Array;
  private readonly wfStart: Int32Array;
  private readonly wfLen: Int32Array;
  private poolT = new Float64Array(256);
  private poolV = new Uint8Array(256);
  private used = 0;
  private evT = new Float64Array(64);
  private evV = new Uint8Array(64);
  /** Changes counted in the last run (for settle.ts's oscillation bound). */
  changes = 0;

  constructor(private readonly sim: PartSim) {
    const n = sim.driverCount;
    this.wfEpoch = new Int32Array(n);
    this.wfInit = new Uint8Array(n);
    this.wfStart = new Int32Array(n);
    this.wfLen = new Int32Array(n);
  }

  /** Whether gate g's times came from the last run with this epoch. */
  retimed(g: number, epoch: number): boolean {
    return this.wfEpoch[g] === epoch;
  }

  /**
   * Re-time the binate gates (in order) that saw their inputs move both ways, or read one that
   * did (`dirty`: the gates one of whose inputs moved in this pass). Returns the latest time a change of theirs was scheduled for (−∞ when none needed
   * it), or NaN when a waveform does not end at the pass's value (the pass cannot vouch).
   */
  run(
    binate: Int32Array,
    values: Uint8Array,
    stamp: Int32Array,
    tChange: Float64Array,
    dirty: Int32Array,
    epoch: number,
  ): number {
    const { inStart, inputs } = this.sim;
    this.used = 0;
    this.changes = 0;
    let latest = -Infinity;
    for (let b = 0; b < binate.length; b++) {
      const g = binate[b];
      if (dirty[g] !== epoch) continue; // no input moved: no glitch
      let wavy = false;
      let rose = false;
      let fell = false;
      for (let j = inStart[g]; j < inStart[g + 1]; j++) {
        const c = inputs[j];
        if (this.wfEpoch[c] === epoch) wavy = true;
        else if (stamp[c] === epoch) {
          if (values[c] === 1) rose = true;
          else fell = true;
        }
      }
      if (!wavy && !(rose && fell)) continue;
      const t = this.waveform(g, values, stamp, tChange, epoch);
      if (Number.isNaN(t)) return NaN;
      if (t > latest) latest = t;
      // A pulse moves the gates it feeds even when the gate ends where it began.
      if (this.wfLen[g] > 0)
        for (let e = this.sim.fanStart[g]; e < this.sim.fanStart[g + 1]; e++) dirty[this.sim.fanout[e]] = epoch;
    }
    return latest;
  }

  /** One gate's waveform from its inputs'; the latest change scheduled, or NaN. */
  private waveform(g: number, values: Uint8Array, stamp: Int32Array, tChange: Float64Array, epoch: number): number {
    const { inStart, inputs, delayUs } = this.sim;
    let zeros = 0;
    let n = 0;
    for (let j = inStart[g]; j < inStart[g + 1]; j++) {
      const c = inputs[j];
      if (this.wfEpoch[c] === epoch) {
        if (this.wfInit[c] === 0) zeros++;
        for (let k = 0; k < this.wfLen[c]; k++)
          n = this.event(n, this.poolT[this.wfStart[c] + k], this.poolV[this.wfStart[c] + k]);
      } else if (stamp[c] === epoch) {
        if (values[c] === 1) zeros++;
        n = this.event(n, tChange[c], values[c]);
      } else if (values[c] === 0) zeros++;
    }
    const d = delayUs[g];
    const init = stamp[g] === epoch ? 1 - values[g] : values[g];
    let out = init;
    let pend = -1;
    let pendT = 0;
    let latest = -Infinity;
    this.wfEpoch[g] = epoch;
    this.wfInit[g] = init;
    this.wfStart[g] = this.used;
    let i = 0;
    while (i < n || pend >= 0) {
      const next = i < n ? this.evT[i] : Infinity;
      if (pend >= 0 && pendT < next) {
        out = pend;
        pend = -1;
        this.record(pendT, out);
        continue;
      }
      const at = next;
      if (pend >= 0 && pendT === at) {
        out = pend;
        pend = -1;
        this.record(at, out);
      }
      for (; i < n && this.evT[i] === at; i++) zeros += this.evV[i] === 0 ? 1 : -1;
      const v = zeros > 0 ? 1 : 0;
      if (v === out) pend = -1;
      else if (pend < 0) {
        pend = v;
        pendT = at + d;
        if (pendT > latest) latest = pendT;
      }
    }
    this.wfLen[g] = this.used - this.wfStart[g];
    this.changes += this.wfLen[g];
    return out === values[g] ? latest : NaN;
  }

  /** Insert an input change into the time-ordered events (stable: equal times keep their order). */
  private event(n: number, t: number, v: number): number {
    if (n === this.evT.length) {
      const t2 = new Float64Array(2 * n);
      t2.set(this.evT);
      const v2 = new Uint8Array(2 * n);
      v2.set(this.evV);
      this.evT = t2;
      this.evV = v2;
    }
    let k = n;
    while (k > 0 && this.evT[k - 1] > t) {
      this.evT[k] = this.evT[k - 1];
      this.evV[k] = this.evV[k - 1];
      k--;
    }
    this.evT[k] = t;
    this.evV[k] = v;
    return n + 1;
  }

  private record(t: number, v: number): void {
    if (this.used === this.poolT.length) {
      const t2 = new Float64Array(2 * this.used);
      t2.set(this.poolT);
      const v2 = new Uint8Array(2 * this.used);
      v2.set(this.poolV);
      this.poolT = t2;
      this.poolV = v2;
    }
    this.poolT[this.used] = t;
    this.poolV[this.used++] = v;
  }
}
