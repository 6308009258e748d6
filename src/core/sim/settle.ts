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
import { X, type PartSim, type Trit } from './compile.js';
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
/** X, held locally so that the hot loops read no imported binding. */
const UNKNOWN = 2;

interface Scratch {
  pendVal: Int8Array;
  pendTime: Float64Array;
  stamp: Int32Array;
  epoch: number;
  heapT: Float64Array;
  heapG: Int32Array;
  size: number;
  /** Gates to evaluate first, and the changes of one instant. */
  first: Int32Array;
  changed: Int32Array;
  newVal: Uint8Array;
  /** Per latch: the settle call that last reported it, and that last saw it race or go X. */
  reportedIn: Int32Array;
  racedIn: Int32Array;
  wentXIn: Int32Array;
  call: number;
}

const scratches = new WeakMap<PartSim, Scratch>();

function scratchOf(sim: PartSim): Scratch {
  let s = scratches.get(sim);
  if (!s) {
    const n = sim.driverCount;
    const l = sim.latches.length;
    s = {
      pendVal: new Int8Array(n).fill(NONE),
      pendTime: new Float64Array(n),
      stamp: new Int32Array(n),
      epoch: 0,
      heapT: new Float64Array(Math.max(16, n * 2)),
      heapG: new Int32Array(Math.max(16, n * 2)),
      size: 0,
      first: new Int32Array(n),
      changed: new Int32Array(n),
      newVal: new Uint8Array(n),
      reportedIn: new Int32Array(l),
      racedIn: new Int32Array(l),
      wentXIn: new Int32Array(l),
      call: 0,
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
  const heapT = s.heapT;
  const heapG = s.heapG;
  let i = s.size++;
  while (i > 0) {
    const p = (i - 1) >> 1;
    if (heapT[p] <= t) break;
    heapT[i] = heapT[p];
    heapG[i] = heapG[p];
    i = p;
  }
  heapT[i] = t;
  heapG[i] = g;
}

function pop(s: Scratch): number {
  const heapT = s.heapT;
  const heapG = s.heapG;
  const g = heapG[0];
  const size = --s.size;
  const lastT = heapT[size];
  const lastG = heapG[size];
  let i = 0;
  for (;;) {
    let c = 2 * i + 1;
    if (c >= size) break;
    if (c + 1 < size && heapT[c + 1] < heapT[c]) c++;
    if (heapT[c] >= lastT) break;
    heapT[i] = heapT[c];
    heapG[i] = heapG[c];
    i = c;
  }
  heapT[i] = lastT;
  heapG[i] = lastG;
  return g;
}

/** NAND over the inputs of driver d in three-valued logic (any 0 → 1; all 1 → 0; else X). */
function nand(inStart: Int32Array, inputs: Int32Array, values: Uint8Array, d: number): number {
  let unknown = false;
  const end = inStart[d + 1];
  for (let k = inStart[d]; k < end; k++) {
    const v = values[inputs[k]];
    if (v === 0) return 1;
    if (v === UNKNOWN) unknown = true;
  }
  return unknown ? UNKNOWN : 0;
}

/** Value of one gate: NAND over its inputs in three-valued logic. */
export function evalGate(sim: PartSim, values: Uint8Array, d: number): Trit {
  sim.evaluations++;
  return nand(sim.inStart, sim.inputs, values, d) as Trit;
}

/** AND of a list of drivers' values in three-valued logic (a latch's S̄ or R̄; empty → 1). */
export function andOf(values: Uint8Array, ds: Int32Array): Trit {
  let unknown = false;
  for (let k = 0; k < ds.length; k++) {
    const v = values[ds[k]];
    if (v === 0) return 0;
    if (v === UNKNOWN) unknown = true;
  }
  return unknown ? X : 1;
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
export function settle(
  sim: PartSim,
  values: Uint8Array,
  timeUs: number,
  moved: readonly number[],
  events: PartEvent[],
  trace = false,
): number {
  const s = scratchOf(sim);
  const { fanStart, fanout, latchOf } = sim;
  const { pendVal, pendTime, stamp, changed, newVal } = s;
  const call = ++s.call;
  let evaluations = 0;
  let t = timeUs;
  let wentX = false;

  evaluations += scheduleMoved(sim, s, values, moved, t);
  checkForbidden(sim, s, values, moved, moved.length, t, events);

  const bound = changeBound(sim);
  let changes = 0;
  while (s.size > 0) {
    t = s.heapT[0];
    let n = 0;
    let latchGates = 0;
    while (s.size > 0 && s.heapT[0] === t) {
      const g = pop(s);
      if (pendVal[g] !== NONE && pendTime[g] === t) {
        changed[n] = g;
        newVal[n++] = pendVal[g];
        pendVal[g] = NONE;
        if (latchOf[g] >= 0) latchGates++;
      }
    }
    if (latchGates >= 2) raceToX(sim, s, n, call);
    for (let i = 0; i < n; i++) {
      const g = changed[i];
      if (newVal[i] === UNKNOWN && latchOf[g] >= 0 && values[g] !== UNKNOWN) {
        s.wentXIn[latchOf[g]] = call;
        wentX = true;
      }
      values[g] = newVal[i];
      if (trace)
        events.push({
          kind: 'change',
          timeS: t / 1e6,
          words: `${sim.names[g]} → ${show(newVal[i])}`,
          parts: [sim.names[g]],
          value: newVal[i] as Trit,
        });
    }
    changes += n;
    const epoch = ++s.epoch;
    for (let i = 0; i < n; i++) {
      const d = changed[i];
      for (let k = fanStart[d]; k < fanStart[d + 1]; k++) {
        const g = fanout[k];
        if (stamp[g] !== epoch) {
          stamp[g] = epoch;
          schedule(sim, s, values, g, t);
          evaluations++;
        }
      }
    }
    checkForbidden(sim, s, values, changed, n, t, events);
    if (changes > bound) {
      oscillate(sim, s, values, t, events);
      wentX = true;
      break;
    }
  }
  sim.evaluations += evaluations;
  if (wentX) reportLatchX(sim, s, values, call, t, events);
  return t;
}

/** Schedule the moved gates and every gate a moved driver feeds, each once; returns how many. */
function scheduleMoved(sim: PartSim, s: Scratch, values: Uint8Array, moved: readonly number[], t: number): number {
  const { fanStart, fanout, leverCount } = sim;
  const stamp = s.stamp;
  const epoch = ++s.epoch;
  let count = 0;
  for (const d of moved) {
    if (d >= leverCount && stamp[d] !== epoch) {
      stamp[d] = epoch;
      s.first[count++] = d;
    }
    for (let k = fanStart[d]; k < fanStart[d + 1]; k++) {
      const g = fanout[k];
      if (stamp[g] !== epoch) {
        stamp[g] = epoch;
        s.first[count++] = g;
      }
    }
  }
  for (let i = 0; i < count; i++) schedule(sim, s, values, s.first[i], t);
  return count;
}

/** A 'latch-x' alarm for every latch that went X in this settle call and is still X. */
function reportLatchX(
  sim: PartSim,
  s: Scratch,
  values: Uint8Array,
  call: number,
  t: number,
  events: PartEvent[],
): void {
  sim.latches.forEach((l, li) => {
    if (s.wentXIn[li] !== call || (values[l.set] !== UNKNOWN && values[l.reset] !== UNKNOWN)) return;
    const why =
      s.racedIn[li] === call
        ? 'both its inputs were released together from the forbidden input'
        : 'it oscillates or reads an undetermined input';
    events.push({
      kind: 'latch-x',
      timeS: t / 1e6,
      latch: l.name,
      words: `${latchLabel(l.name)} is left undetermined (X): ${why}`,
    });
  });
}

/** Inertial scheduling of gate g at time t: a pending change the gate no longer wants is dropped. */
function schedule(sim: PartSim, s: Scratch, values: Uint8Array, g: number, t: number): void {
  const v = nand(sim.inStart, sim.inputs, values, g);
  if (v === values[g]) s.pendVal[g] = NONE;
  else if (s.pendVal[g] !== v) {
    s.pendVal[g] = v;
    s.pendTime[g] = t + sim.delayUs[g];
    push(s, s.pendTime[g], g);
  }
}

/** Both gates of a latch switching together to the same value: the latch's memory is lost (X). */
function raceToX(sim: PartSim, s: Scratch, n: number, call: number): void {
  const { changed, newVal } = s;
  for (let i = 0; i < n; i++) {
    const li = sim.latchOf[changed[i]];
    if (li < 0 || newVal[i] === UNKNOWN) continue;
    const l = sim.latches[li];
    const partner = changed[i] === l.set ? l.reset : l.set;
    for (let j = 0; j < n; j++) {
      if (changed[j] === partner && newVal[j] === newVal[i]) {
        newVal[i] = UNKNOWN;
        newVal[j] = UNKNOWN;
        s.racedIn[li] = call;
      }
    }
  }
}

function checkForbidden(
  sim: PartSim,
  s: Scratch,
  values: Uint8Array,
  changed: ArrayLike<number>,
  n: number,
  t: number,
  events: PartEvent[],
): void {
  const { watchStart, watch } = sim;
  for (let i = 0; i < n; i++) {
    const d = changed[i];
    for (let k = watchStart[d]; k < watchStart[d + 1]; k++) {
      const li = watch[k];
      if (s.reportedIn[li] === s.call) continue;
      const l = sim.latches[li];
      if (andOf(values, l.sBar) === 0 && andOf(values, l.rBar) === 0) {
        s.reportedIn[li] = s.call;
        events.push({
          kind: 'forbidden-input',
          timeS: t / 1e6,
          latch: l.name,
          words: `${latchLabel(l.name)} sees the forbidden input: S̄ and R̄ are pulled at once`,
        });
      }
    }
  }
}

/** Give up on event order: the switching gates go X, then the ternary fixpoint (algorithms A and B). */
function oscillate(sim: PartSim, s: Scratch, values: Uint8Array, t: number, events: PartEvent[]): void {
  const binary = sim.latches.map((l) => values[l.set] !== UNKNOWN && values[l.reset] !== UNKNOWN);
  const switching: number[] = [];
  for (let g = sim.leverCount; g < sim.driverCount; g++) {
    if (s.pendVal[g] !== NONE) {
      switching.push(g);
      values[g] = UNKNOWN;
      s.pendVal[g] = NONE;
    }
  }
  s.size = 0;
  for (let again = true; again;) {
    again = false;
    for (let g = sim.leverCount; g < sim.driverCount; g++) {
      if (values[g] !== UNKNOWN && evalGate(sim, values, g) !== values[g]) {
        values[g] = UNKNOWN;
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
  sim.latches.forEach((l, li) => {
    if (binary[li] && (values[l.set] === UNKNOWN || values[l.reset] === UNKNOWN)) s.wentXIn[li] = s.call;
  });
  const names = switching.map((g) => sim.names[g]);
  const shown = names.slice(0, 6).join(', ') + (names.length > 6 ? ` and ${names.length - 6} more` : '');
  events.push({
    kind: 'oscillation',
    timeS: t / 1e6,
    parts: names,
    words: `the machine does not settle: ${shown} keep switching (left X)`,
  });
}

/** "latch M0" for a bare name; a name that already says latch is kept as it is. */
export function latchLabel(name: string): string {
  return /latch/i.test(name) ? name : `latch ${name}`;
}

/** A value as shown to people: 0, 1 or X. */
export function show(v: number): string {
  return v === UNKNOWN ? 'X' : String(v);
}
