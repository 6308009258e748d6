/**
 * Refining a split over drums by what the cords between drums really cost.
 *
 * The bisection (drums.ts) counts cut branches. A cord's real vertical length between drums
 * (design §11, physics/routing.ts) is asymmetric: it drops ONCE from its capstan to the lowest
 * channel it uses, whatever number of branches it has on the drums below (they share the drop
 * and split at knots), while each branch to a drum above its capstan rises on its own. In drum
 * levels (each drumSpacingM apart), a cord with its capstan on drum d and branches on drums
 * t₁…tₖ costs  max(0, d − min tᵢ) + Σ max(0, tᵢ − d).
 *
 * Method: greedy iterative improvement over that cost, k-way, in the manner of the
 * Kernighan–Lin / Fiduccia–Mattheyses family (moves priced by their gain, only improving moves
 * kept): in turn, each free unit is tried on every drum its cords reach; it moves where the
 * gain is largest if that drum has room for it, and otherwise swaps with the unit there that
 * gives the largest joint gain and keeps both drums within the longest allowed. Passes repeat
 * while one gains (at most MAX_PASSES), each after the first trying only the units that share a
 * cord with one that moved. The cost along the channels is left to the arrangement that follows.
 *
 * Pre: every unit has a drum in [0, drums); fixed units (`fixedDrum` ≥ 0) are on theirs.
 * Post: fixed units stay; no drum that was within `longestM` goes over it, nor below the bays
 * its pins need (`baysNeeded`: a pin to bay k needs k bays on its drum) if it had them; the
 * vertical cost never rises. Deterministic (units in index order, drums in increasing order,
 * ties to the move, then to the lower unit).
 */
import type { FrameUnits } from './units.js';

/** Passes over every unit; each pass is linear in the branches, and rarely more than a few gain. */
const MAX_PASSES = 8;

interface CordEnds {
  readonly driver: number;
  /** Target units (repeats kept: each branch rises on its own). */
  readonly targets: readonly number[];
}

/** Levels of cord between drums for one cord: the shared drop below, each rise above. */
function levels(c: CordEnds, drumOf: Int32Array): number {
  const d = drumOf[c.driver];
  let low = d;
  let up = 0;
  for (const t of c.targets) {
    const x = drumOf[t];
    if (x < low) low = x;
    else if (x > d) up += x - d;
  }
  return d - low + up;
}

/** The cords between units, each with its capstan's unit and its targets' units. */
function cordEnds(fu: FrameUnits): CordEnds[] {
  const byCord = new Map<string, { driver: number; targets: number[] }>();
  for (const br of fu.branches) {
    const driver = fu.bays[br.driverBay].unit;
    const target = fu.bays[br.targetBay].unit;
    const c = byCord.get(br.cord) ?? { driver, targets: [] };
    if (target !== driver) c.targets.push(target);
    byCord.set(br.cord, c);
  }
  return [...byCord.values()].filter((c) => c.targets.length > 0);
}

/** Total levels of cord between drums, summed over every cord: what `refineDrums` lowers. */
export function drumLevels(fu: FrameUnits, drumOf: Int32Array): number {
  return cordEnds(fu).reduce((s, c) => s + levels(c, drumOf), 0);
}

/** The split being refined: where every unit is, each drum's width and units, each unit's levels now. */
class Split {
  readonly out: Int32Array;
  readonly cordsOf: number[][];
  readonly members: number[][];
  readonly widthOf: number[];
  readonly width: Float64Array;
  readonly baysOf: number[];
  /** Bays on each drum. */
  readonly bays: Int32Array;
  readonly onDrum: number[][];
  /** Each unit's levels as things stand, kept up to date as units move (what moving it could save at most). */
  readonly own: Float64Array;
  /** Cords of the unit being tried are marked with it, so a swap partner sharing one is priced jointly. */
  readonly mark: Int32Array;
  /** Units whose cords a move touched: tried again in the next pass. */
  next = new Set<number>();

  constructor(
    fu: FrameUnits,
    drumOf: Int32Array,
    drums: number,
    readonly cords: readonly CordEnds[],
    readonly longestM: number,
    readonly baysNeeded: ReadonlyMap<number, number>,
  ) {
    const n = fu.units.length;
    this.out = Int32Array.from(drumOf);
    this.cordsOf = Array.from({ length: n }, () => []);
    this.members = cords.map((c) => [...new Set([c.driver, ...c.targets])]);
    this.members.forEach((m, i) => {
      for (const u of m) this.cordsOf[u].push(i);
    });
    this.widthOf = fu.units.map((u) => u.widthM);
    this.width = new Float64Array(drums);
    this.baysOf = fu.units.map((u) => u.bays.length);
    this.bays = new Int32Array(drums);
    this.onDrum = Array.from({ length: drums }, () => []);
    for (let u = 0; u < n; u++) {
      this.width[this.out[u]] += this.widthOf[u];
      this.bays[this.out[u]] += this.baysOf[u];
      this.onDrum[this.out[u]].push(u);
    }
    this.own = Float64Array.from({ length: n }, (_, u) => this.cost(u));
    this.mark = new Int32Array(cords.length).fill(-1);
  }

  /** Levels of the cords of `u` (and of `v`'s cords that `u` does not share, when given). */
  cost(u: number, v = -1): number {
    let s = 0;
    for (const i of this.cordsOf[u]) s += levels(this.cords[i], this.out);
    if (v >= 0) for (const i of this.cordsOf[v]) if (this.mark[i] !== u) s += levels(this.cords[i], this.out);
    return s;
  }

  /** Levels saved by putting `u` on drum `to`, other units as they are. */
  gain(u: number, to: number): number {
    const from = this.out[u];
    this.out[u] = to;
    const after = this.cost(u);
    this.out[u] = from;
    return this.own[u] - after;
  }

  shares(u: number, v: number): boolean {
    return this.cordsOf[v].some((i) => this.mark[i] === u);
  }

  /** Levels saved by swapping `u` and `v`, which share a cord: both moved at once. */
  jointGain(u: number, v: number): number {
    const before = this.cost(u, v);
    const [a, b] = [this.out[u], this.out[v]];
    this.out[u] = b;
    this.out[v] = a;
    const after = this.cost(u, v);
    this.out[u] = a;
    this.out[v] = b;
    return before - after;
  }

  /** Drum `d` can take `extra` metres and `bays` more bays (fewer when negative) and stay within its limits. */
  fits(d: number, extra: number, bays: number): boolean {
    const keeps = bays >= 0 || this.bays[d] + bays >= (this.baysNeeded.get(d) ?? 0);
    return keeps && (extra <= 0 || this.width[d] + extra <= this.longestM + 1e-9);
  }

  /** Move `u` to drum `to`, adding to `touched` every unit whose levels that changes. */
  place(u: number, to: number, touched: Set<number>): void {
    const from = this.out[u];
    this.width[from] -= this.widthOf[u];
    this.bays[from] -= this.baysOf[u];
    this.onDrum[from].splice(this.onDrum[from].indexOf(u), 1);
    this.out[u] = to;
    this.width[to] += this.widthOf[u];
    this.bays[to] += this.baysOf[u];
    this.onDrum[to].push(u);
    for (const i of this.cordsOf[u])
      for (const x of this.members[i]) {
        this.next.add(x);
        touched.add(x);
      }
  }
}

/** The drums `u`'s cords reach, other than its own, in increasing order (marks `u`'s cords). */
function reachOf(s: Split, u: number, seen: Int32Array): number[] {
  const reach: number[] = [];
  seen[s.out[u]] = u;
  for (const i of s.cordsOf[u]) {
    s.mark[i] = u;
    for (const x of s.members[i]) {
      const d = s.out[x];
      if (seen[d] !== u) {
        seen[d] = u;
        reach.push(d);
      }
    }
  }
  return reach.sort((a, b) => a - b);
}

/** The best move or swap of unit `u`, made if it gains; returns the levels saved. */
function tryUnit(s: Split, u: number, fixedDrum: Int32Array, seen: Int32Array): number {
  const from = s.out[u];
  const w = s.widthOf[u];
  const k = s.baysOf[u];
  let best = { gain: 0, to: -1, swap: -1 };
  for (const to of reachOf(s, u, seen)) {
    const g = s.gain(u, to);
    if (s.fits(to, w, k) && s.fits(from, -w, -k)) {
      if (g > best.gain) best = { gain: g, to, swap: -1 };
      continue;
    }
    // No room there (or u's drum would lose bays its pins need): swap with a unit there that fits
    // where u was, priced by both moves.
    for (const v of s.onDrum[to]) {
      const [wv, kv] = [s.widthOf[v], s.baysOf[v]];
      if (fixedDrum[v] !== -1 || !s.fits(to, w - wv, k - kv) || !s.fits(from, wv - w, kv - k)) continue;
      // A swap saves at most both units' levels now (v's alone beside u's move, when they share no cord).
      const joint = s.shares(u, v);
      const most = joint ? s.own[u] + s.own[v] : g + s.own[v];
      if (most <= 0 || most < best.gain) continue;
      const gs = joint ? s.jointGain(u, v) : g + s.gain(v, from);
      if (gs > best.gain || (gs === best.gain && gs > 0 && best.swap > v)) best = { gain: gs, to, swap: v };
    }
  }
  if (best.to < 0) return 0;
  const touched = new Set<number>();
  if (best.swap >= 0) s.place(best.swap, from, touched);
  s.place(u, best.to, touched);
  for (const x of touched) s.own[x] = s.cost(x);
  return best.gain;
}

/** Lower the cord between drums by moving and swapping units (see the contract above). */
export function refineDrums(
  fu: FrameUnits,
  drumOf: Int32Array,
  drums: number,
  fixedDrum: Int32Array,
  longestM: number,
  baysNeeded: ReadonlyMap<number, number> = new Map(),
): Int32Array {
  if (drums < 2) return Int32Array.from(drumOf);
  const s = new Split(fu, drumOf, drums, cordEnds(fu), longestM, baysNeeded);
  const seen = new Int32Array(drums).fill(-1);
  // The first pass tries every unit; each later pass only those that share a cord with one that moved.
  let todo = Array.from({ length: fu.units.length }, (_, u) => u);
  for (let pass = 0; pass < MAX_PASSES && todo.length > 0; pass++) {
    s.next = new Set();
    let gained = 0;
    for (const u of todo) if (fixedDrum[u] === -1 && s.cordsOf[u].length > 0) gained += tryUnit(s, u, fixedDrum, seen);
    if (gained === 0) break;
    todo = [...s.next].sort((a, b) => a - b);
  }
  return s.out;
}
