/**
 * Event-driven settling of a compiled netlist after a lever moves, in three-valued logic.
 *
 * Method: discrete-event simulation with per-gate inertial delay (a lever that starts to
 * swing and is held back returns, so a pulse shorter than the stage delay does not pass);
 * all changes due at one instant are applied together, then every gate they feed is
 * re-evaluated. Two rules give X its meaning (after the ternary simulation of J. A.
 * Brzozowski & C.-J. H. Seger, *Asynchronous Circuits*, Springer 1995, ch. 7 — from memory):
 * - when both gates of a latch change at the same instant to the same value (both inputs
 *   released together from the forbidden input S̄ = R̄ = 0, with equal delays), the latch
 *   is left X; unequal delays resolve the race in favour of the faster gate falling first;
 * - when the netlist does not settle within a bound of changes it oscillates: the switching
 *   gates are set to X and the ternary fixpoint is taken (their "algorithm A" — values only
 *   move towards X — then "algorithm B" — X resolves where the inputs decide it).
 * Preconditions: `values` holds a value per driver; levers are binary. Postconditions:
 * `values` is settled (no gate's value differs from its evaluation, except X left by a race).
 */
import { andOf, evalGate, X, type PartSim, type Trit } from './compile.js';
import type { OperatingRule } from './hand.js';

export type PartEventKind =
  | 'forbidden-input'
  | 'latch-x'
  | 'oscillation'
  | 'input-during-phi1'
  | 'clocks-together'
  | 'reset-during-clock'
  | 'change';

/** Something the simulator saw; everything but 'change' is an alarm. */
export interface PartEvent {
  readonly kind: PartEventKind;
  readonly timeS: number;
  /** One sentence in words, naming the latch or parts. */
  readonly words: string;
  readonly latch?: string;
  readonly parts?: readonly string[];
  /** New value of the part (kind 'change'). */
  readonly value?: Trit;
  /** The operating rule broken (rule alarms). */
  readonly rule?: OperatingRule;
}

const NONE = -1;

interface Scratch {
  pendVal: Int8Array;
  pendTime: Float64Array;
  stamp: Int32Array;
  epoch: number;
  heapT: Float64Array;
  heapG: Int32Array;
  size: number;
}

const scratches = new WeakMap<PartSim, Scratch>();

function scratchOf(sim: PartSim): Scratch {
  let s = scratches.get(sim);
  if (!s) {
    const n = sim.driverCount;
    s = {
      pendVal: new Int8Array(n).fill(NONE),
      pendTime: new Float64Array(n),
      stamp: new Int32Array(n),
      epoch: 0,
      heapT: new Float64Array(Math.max(16, n * 2)),
      heapG: new Int32Array(Math.max(16, n * 2)),
      size: 0,
    };
    scratches.set(sim, s);
  }
  return s;
}

function push(s: Scratch, t: number, g: number): void {
  if (s.size === s.heapT.length) {
    const t2 = new Float64Array(s.size * 2);
    t2.set(s.heapT);
    const g2 = new Int32Array(s.size * 2);
    g2.set(s.heapG);
    s.heapT = t2;
    s.heapG = g2;
  }
  let i = s.size++;
  while (i > 0) {
    const p = (i - 1) >> 1;
    if (s.heapT[p] <= t) break;
    s.heapT[i] = s.heapT[p];
    s.heapG[i] = s.heapG[p];
    i = p;
  }
  s.heapT[i] = t;
  s.heapG[i] = g;
}

function pop(s: Scratch): number {
  const g = s.heapG[0];
  const lastT = s.heapT[--s.size];
  const lastG = s.heapG[s.size];
  let i = 0;
  for (;;) {
    let c = 2 * i + 1;
    if (c >= s.size) break;
    if (c + 1 < s.size && s.heapT[c + 1] < s.heapT[c]) c++;
    if (s.heapT[c] >= lastT) break;
    s.heapT[i] = s.heapT[c];
    s.heapG[i] = s.heapG[c];
    i = c;
  }
  s.heapT[i] = lastT;
  s.heapG[i] = lastG;
  return g;
}

/** Bound on part changes in one settle before it counts as an oscillation. */
export function changeBound(sim: PartSim): number {
  return 1000 + 64 * (sim.driverCount - sim.leverCount);
}

/**
 * Settle `values` in place from time `timeUs` after the drivers in `moved` changed
 * (levers, or any gate for a fresh start). Alarms (and, with `trace`, every change) are
 * appended to `events`. Returns the time of the last change in microseconds.
 */
export function settle(sim: PartSim, values: Uint8Array, timeUs: number, moved: readonly number[], events: PartEvent[], trace = false): number {
  const s = scratchOf(sim);
  const wasX = sim.latches.map((l) => values[l.set] === X || values[l.reset] === X);
  const reported = new Set<number>();
  const raced = new Set<number>();
  let t = timeUs;
  s.epoch++;
  const first: number[] = [];
  for (const d of moved) {
    if (d >= sim.leverCount && s.stamp[d] !== s.epoch) {
      s.stamp[d] = s.epoch;
      first.push(d);
    }
    for (let k = sim.fanStart[d]; k < sim.fanStart[d + 1]; k++) {
      const g = sim.fanout[k];
      if (s.stamp[g] !== s.epoch) {
        s.stamp[g] = s.epoch;
        first.push(g);
      }
    }
  }
  for (const g of first) schedule(sim, s, values, g, t);
  checkForbidden(sim, values, moved, t, reported, events);

  const bound = changeBound(sim);
  let changes = 0;
  const changed: number[] = [];
  const newVal: number[] = [];
  while (s.size > 0) {
    t = s.heapT[0];
    changed.length = 0;
    newVal.length = 0;
    while (s.size > 0 && s.heapT[0] === t) {
      const g = pop(s);
      if (s.pendVal[g] !== NONE && s.pendTime[g] === t) {
        changed.push(g);
        newVal.push(s.pendVal[g]);
        s.pendVal[g] = NONE;
      }
    }
    raceToX(sim, changed, newVal, raced);
    for (let i = 0; i < changed.length; i++) {
      values[changed[i]] = newVal[i];
      if (trace) events.push({ kind: 'change', timeS: t / 1e6, words: `${sim.names[changed[i]]} → ${show(newVal[i])}`, parts: [sim.names[changed[i]]], value: newVal[i] as Trit });
    }
    changes += changed.length;
    s.epoch++;
    for (const d of changed) {
      for (let k = sim.fanStart[d]; k < sim.fanStart[d + 1]; k++) {
        const g = sim.fanout[k];
        if (s.stamp[g] !== s.epoch) {
          s.stamp[g] = s.epoch;
          schedule(sim, s, values, g, t);
        }
      }
    }
    checkForbidden(sim, values, changed, t, reported, events);
    if (changes > bound) {
      oscillate(sim, s, values, t, events);
      break;
    }
  }
  sim.latches.forEach((l, li) => {
    if (wasX[li] || (values[l.set] !== X && values[l.reset] !== X)) return;
    const why = raced.has(li)
      ? 'both its inputs were released together from the forbidden input'
      : 'an input it reads is undetermined';
    events.push({ kind: 'latch-x', timeS: t / 1e6, latch: l.name, words: `latch ${l.name} is left undetermined (X): ${why}` });
  });
  return t;
}

/** Inertial scheduling of gate g's new value at time t. */
function schedule(sim: PartSim, s: Scratch, values: Uint8Array, g: number, t: number): void {
  const v = evalGate(sim, values, g);
  if (v === values[g]) s.pendVal[g] = NONE;
  else if (s.pendVal[g] !== v) {
    s.pendVal[g] = v;
    s.pendTime[g] = t + sim.delayUs[g];
    push(s, s.pendTime[g], g);
  }
}

/** Both gates of a latch switching together to the same value: the latch's memory is lost (X). */
function raceToX(sim: PartSim, changed: number[], newVal: number[], raced: Set<number>): void {
  if (changed.length < 2) return;
  for (let i = 0; i < changed.length; i++) {
    const li = sim.latchOf[changed[i]];
    if (li < 0 || newVal[i] === X) continue;
    const l = sim.latches[li];
    const partner = changed[i] === l.set ? l.reset : l.set;
    const j = changed.indexOf(partner);
    if (j >= 0 && newVal[j] === newVal[i]) {
      newVal[i] = X;
      newVal[j] = X;
      raced.add(li);
    }
  }
}

function checkForbidden(sim: PartSim, values: Uint8Array, changed: readonly number[], t: number, reported: Set<number>, events: PartEvent[]): void {
  for (const d of changed) {
    for (let k = sim.watchStart[d]; k < sim.watchStart[d + 1]; k++) {
      const li = sim.watch[k];
      if (reported.has(li)) continue;
      const l = sim.latches[li];
      if (andOf(values, l.sBar) === 0 && andOf(values, l.rBar) === 0) {
        reported.add(li);
        events.push({ kind: 'forbidden-input', timeS: t / 1e6, latch: l.name, words: `latch ${l.name} sees the forbidden input: S̄ and R̄ are pulled at once` });
      }
    }
  }
}

/** Give up on event order: the switching gates go X, then the ternary fixpoint (algorithms A and B). */
function oscillate(sim: PartSim, s: Scratch, values: Uint8Array, t: number, events: PartEvent[]): void {
  const switching: number[] = [];
  for (let g = sim.leverCount; g < sim.driverCount; g++) {
    if (s.pendVal[g] !== NONE) {
      switching.push(g);
      values[g] = X;
      s.pendVal[g] = NONE;
    }
  }
  s.size = 0;
  for (let again = true; again; ) {
    again = false;
    for (let g = sim.leverCount; g < sim.driverCount; g++) {
      if (values[g] !== X && evalGate(sim, values, g) !== values[g]) {
        values[g] = X;
        again = true;
      }
    }
  }
  for (let pass = 0, again = true; again && pass <= sim.driverCount; pass++) {
    again = false;
    for (let g = sim.leverCount; g < sim.driverCount; g++) {
      const v = evalGate(sim, values, g);
      if (v !== values[g]) {
        values[g] = v;
        again = true;
      }
    }
  }
  const names = switching.map((g) => sim.names[g]);
  const shown = names.slice(0, 6).join(', ') + (names.length > 6 ? ` and ${names.length - 6} more` : '');
  events.push({ kind: 'oscillation', timeS: t / 1e6, parts: names, words: `the machine does not settle: ${shown} keep switching (left X)` });
}

/** A value as shown to people: 0, 1 or X. */
export function show(v: number): string {
  return v === X ? 'X' : String(v);
}
