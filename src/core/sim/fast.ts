/**
 * The fast lever move: one lever move settled by its program (program.ts) in one ordered pass
 * over typed arrays, with the settling time of every change, instead of the event queue of
 * settle.ts — and, whenever the pass cannot vouch for the result, by settle.ts itself.
 *
 * Contract: `move` gives exactly what `settle` gives (values, alarms, time of the last change).
 * The pass is taken only from a ready state (binary, settled, every latch holding a value) and
 * only when the move's program exists; it then checks at run time that no latch sees S̄ and R̄
 * move in opposite directions or end both pulled. Gates that may glitch (their inputs moved
 * both ways; they reach no latch) are re-timed by glitch.ts. When a check fails the pass is
 * undone and settle.ts settles the move (program.ts gives the argument).
 * Times: a gate whose output rises changes one stage delay after the first of its inputs that
 * fell, a gate whose output falls one stage delay after the last of its inputs that rose (the
 * inertial-delay model of settle.ts, for inputs that move one way only); in a latch the gate
 * whose port was pulled moves first and its partner follows.
 */
import { X, type PartSim } from './compile.js';
import { moveProgram, type SettleProgram } from './program.js';
import { Glitches } from './glitch.js';
import { changeBound, settle, type PartEvent } from './settle.js';

/** True when every value is 0 or 1 and every latch holds a value (Q ≠ Q̄): the fast pass may start here. */
export function isBinary(sim: PartSim, values: ArrayLike<number>): boolean {
  for (let d = 0; d < sim.driverCount; d++) if (values[d] === X) return false;
  for (const l of sim.latches) if (values[l.set] === values[l.reset]) return false;
  return true;
}

/** `isBinary`, and every gate equals the NAND of its inputs (a settled state). */
export function isReady(sim: PartSim, values: ArrayLike<number>): boolean {
  if (!isBinary(sim, values)) return false;
  const { inStart, inputs } = sim;
  for (let g = sim.leverCount; g < sim.driverCount; g++) {
    let out = 0;
    for (let j = inStart[g]; j < inStart[g + 1]; j++)
      if (values[inputs[j]] === 0) {
        out = 1;
        break;
      }
    if (out !== values[g]) return false;
  }
  return true;
}

/** Per compiled netlist: the scratch of the fast pass, and whether the last move left a ready state. */
export class FastMover {
  /** Whether the state the last `move` left is ready for the fast pass (saves a scan on the next move). */
  ready = false;
  private readonly stamp: Int32Array;
  private readonly tChange: Float64Array;
  private readonly changed: Int32Array;
  /** Per gate: the pass (epoch) in which one of its inputs moved. */
  private readonly dirty: Int32Array;
  private epoch = 0;
  private count = 0;
  private readonly glitches: Glitches;
  /** settle.ts's bound on changes before it calls the netlist oscillating. */
  private readonly bound: number;
  /** Programs by lever × 8 + control bits. */
  private readonly programs: (SettleProgram | undefined)[];

  constructor(private readonly sim: PartSim) {
    this.stamp = new Int32Array(sim.driverCount);
    this.tChange = new Float64Array(sim.driverCount);
    this.changed = new Int32Array(sim.driverCount);
    this.dirty = new Int32Array(sim.driverCount);
    this.glitches = new Glitches(sim);
    this.bound = changeBound(sim);
    this.programs = new Array<SettleProgram | undefined>(sim.leverCount * 8).fill(undefined);
  }

  /**
   * Put lever `d` at `v` in `values` and settle, from time `timeUs`; alarms go to `events`.
   * `ready` says the state is ready for the fast pass (isReady), when the caller knows it.
   * Returns the time of the last change (`timeUs` when nothing changed).
   */
  move(values: Uint8Array, timeUs: number, d: number, v: 0 | 1, events: PartEvent[], ready: boolean): number {
    const sim = this.sim;
    values[d] = v;
    if (ready) {
      const prog = this.program(values, d);
      if (prog.fast) {
        const t = this.pass(prog, values, d, timeUs);
        if (t >= 0) {
          this.ready = true;
          return t;
        }
      }
    }
    const t = settle(sim, values, timeUs, [d], events);
    this.ready = isBinary(sim, values);
    return t;
  }

  /** The program of moving lever d from `values` (looked up by lever and control levers, made once). */
  private program(values: Uint8Array, d: number): SettleProgram {
    const { phi1, phi2, reset } = this.sim;
    const ctrl =
      (phi1 >= 0 && values[phi1] === 1 ? 1 : 0) |
      (phi2 >= 0 && values[phi2] === 1 ? 2 : 0) |
      (reset >= 0 && values[reset] === 1 ? 4 : 0);
    const k = d * 8 + ctrl;
    return (this.programs[k] ??= moveProgram(this.sim, d, ctrl));
  }

  /** The ordered pass; the time of the last change, or -1 (values restored) when it cannot vouch for the result. */
  private pass(prog: SettleProgram, values: Uint8Array, lever: number, timeUs: number): number {
    const epoch = ++this.epoch;
    this.stamp[lever] = epoch;
    this.tChange[lever] = timeUs;
    this.count = 0;
    let last = timeUs;
    const steps = prog.steps;
    const { inStart, inputs, latches } = this.sim;
    const dirty = this.dirty;
    this.touch(lever, epoch);
    for (let i = 0; i < steps.length; i++) {
      const step = steps[i];
      if (step >= 0) {
        if (dirty[step] !== epoch) continue; // none of its inputs moved: it keeps its settled value
        // A gate, inline: most do not change, and their NAND is all the work.
        const end = inStart[step + 1];
        let out = 0;
        for (let j = inStart[step]; j < end; j++)
          if (values[inputs[j]] === 0) {
            out = 1;
            break;
          }
        if (out === values[step]) continue;
        const t = this.changed1(values, step, out, epoch);
        if (t > last) last = t;
        continue;
      }
      const l = latches[~step];
      if (dirty[l.set] !== epoch && dirty[l.reset] !== epoch) continue;
      const t = this.latch(values, ~step, epoch);
      if (t < 0) return this.undo(values);
      if (t > last) last = t;
    }
    if (prog.binate.length > 0) {
      const latest = this.glitches.run(prog.binate, values, this.stamp, this.tChange, this.dirty, epoch);
      if (Number.isNaN(latest) || this.count + this.glitches.changes > this.bound) return this.undo(values);
      if (latest !== -Infinity) last = this.lastOutside(timeUs, latest, epoch);
    }
    this.sim.evaluations += steps.length;
    return last;
  }

  /** The time of the last change when some gates were re-timed for glitches: theirs, and every other change. */
  private lastOutside(timeUs: number, latest: number, epoch: number): number {
    let last = Math.max(timeUs, latest);
    for (let i = 0; i < this.count; i++) {
      const g = this.changed[i];
      if (!this.glitches.retimed(g, epoch) && this.tChange[g] > last) last = this.tChange[g];
    }
    return last;
  }

  /** Gate g changes to `out`: when (one stage after its first input that fell, or its last that rose). */
  private changed1(values: Uint8Array, g: number, out: number, epoch: number): number {
    const { inStart, inputs } = this.sim;
    const end = inStart[g + 1];
    const from = inStart[g];
    const at =
      (out === 1 ? this.firstChange(inputs, from, end, epoch) : this.lastChange(inputs, from, end, epoch)) +
      this.sim.delayUs[g];
    this.change(values, g, out, at, epoch);
    return at;
  }

  /** The first time among the inputs ds[from..to) that changed in this pass (a gate rises when its first input falls). */
  private firstChange(ds: Int32Array, from: number, to: number, epoch: number): number {
    const { stamp, tChange } = this;
    let t = Infinity;
    for (let j = from; j < to; j++) {
      const c = ds[j];
      if (stamp[c] === epoch && tChange[c] < t) t = tChange[c];
    }
    return t;
  }

  /** The last time among the inputs ds[from..to) that changed in this pass (a gate falls when its last input rises). */
  private lastChange(ds: Int32Array, from: number, to: number, epoch: number): number {
    const { stamp, tChange } = this;
    let t = -Infinity;
    for (let j = from; j < to; j++) {
      const c = ds[j];
      if (stamp[c] === epoch && tChange[c] > t) t = tChange[c];
    }
    return t;
  }

  private change(values: Uint8Array, g: number, v: number, at: number, epoch: number): void {
    values[g] = v;
    this.stamp[g] = epoch;
    this.tChange[g] = at;
    this.changed[this.count++] = g;
    this.touch(g, epoch);
  }

  /** Mark the gates driver d feeds: only they can change after it (the pass skips the rest). */
  private touch(d: number, epoch: number): void {
    const { fanStart, fanout } = this.sim;
    const dirty = this.dirty;
    for (let e = fanStart[d]; e < fanStart[d + 1]; e++) dirty[fanout[e]] = epoch;
  }

  /** AND of a port's cords now (`before` false) or before this pass (a changed cord had the other value). */
  private port(values: Uint8Array, ds: Int32Array, epoch: number, before: boolean): number {
    const stamp = this.stamp;
    for (let j = 0; j < ds.length; j++) {
      const c = ds[j];
      const v = before && stamp[c] === epoch ? 1 - values[c] : values[c];
      if (v === 0) return 0;
    }
    return 1;
  }

  /** Latch li as one unit: set, reset or hold; the time of its last change, 0 when it held, -1 when the pass cannot vouch. */
  private latch(values: Uint8Array, li: number, epoch: number): number {
    const l = this.sim.latches[li];
    const s = this.port(values, l.sBar, epoch, false);
    const r = this.port(values, l.rBar, epoch, false);
    // Both released: the latch holds (both released before too would need both pulled before, which a ready state never has).
    if (s === 1 && r === 1) return 0;
    if (s === 0 && r === 0) return -1;
    // One port pulled: S̄ and R̄ moved in opposite directions when the other was pulled before and this one was not.
    const other = s === 0 ? l.rBar : l.sBar;
    if (this.port(values, other, epoch, true) === 0 && this.port(values, s === 0 ? l.sBar : l.rBar, epoch, true) === 1)
      return -1; // a transient forbidden input
    const q = values[l.set];
    const next = s === 0 ? 1 : r === 0 ? 0 : q;
    if (next === q) return 0;
    // The gate whose port was pulled rises first; its partner falls after it (and after any cord of its own that rose).
    return next === 1
      ? this.flip(values, l.set, l.reset, l.sBar, l.rBar, epoch)
      : this.flip(values, l.reset, l.set, l.rBar, l.sBar, epoch);
  }

  /** A latch changes: gate `up` (its port `upCords` pulled) rises, then `down` falls; the time of the second change. */
  private flip(
    values: Uint8Array,
    up: number,
    down: number,
    upCords: Int32Array,
    downCords: Int32Array,
    epoch: number,
  ): number {
    const delay = this.sim.delayUs;
    const t1 = this.firstChange(upCords, 0, upCords.length, epoch) + delay[up];
    this.change(values, up, 1, t1, epoch);
    const t2 = Math.max(t1, this.lastChange(downCords, 0, downCords.length, epoch)) + delay[down];
    this.change(values, down, 0, t2, epoch);
    return t2;
  }

  /** Put back every gate the pass changed (the lever stays moved); -1. */
  private undo(values: Uint8Array): number {
    for (let i = 0; i < this.count; i++) values[this.changed[i]] ^= 1;
    this.count = 0;
    return -1;
  }
}

const movers = new WeakMap<PartSim, FastMover>();

/** The fast mover of a compiled netlist (one per netlist and timing). */
export function moverFor(sim: PartSim): FastMover {
  let m = movers.get(sim);
  if (!m) movers.set(sim, (m = new FastMover(sim)));
  return m;
}
