/**
 * Seeded local improvement of an arrangement: iterated local search (H. R. Lourenço,
 * O. C. Martin & T. Stützle, "Iterated local search", in Handbook of Metaheuristics, Kluwer
 * 2003) over three moves that keep the end rules and the pins:
 * - insertion: a unit slides left or right past its neighbours (unpinned, same zone) to the
 *   best place in reach — evaluated as a run of adjacent swaps, each of which can change only
 *   the spans of the nets at the two units swapped (their neighbours keep their positions,
 *   since the pair's total width is unchanged); a net is measured again only when one of its
 *   moved points was, or becomes, one of its two ends, so a swap costs O(points at the pair)
 *   plus the points of the nets whose ends moved;
 * - flip: a latch's two gates change sides;
 * - kick: between descents, a run of neighbouring units is reversed, or a short run shuffled,
 *   by the one seeded generator, and the descent repeats from there; the best arrangement
 *   seen is kept.
 * Deterministic for a given generator state and work budget (no clock is read). The result is
 * never worse than the arrangement it starts from.
 */
import type { Random } from '../../model/random.js';
import { arrangementCost, pinnedUnits, type ArrangeProblem, type Arrangement } from './problem.js';

export interface ImproveOptions {
  /** Kicks after the first descent. */
  readonly kicks: number;
  /** Net points evaluated in all (a deterministic bound on the work). */
  readonly work: number;
  /** Furthest a unit slides in one insertion move, in units. */
  readonly reach: number;
}

export const DEFAULT_IMPROVE: ImproveOptions = { kicks: 40, work: 8_000_000, reach: 40 };

/** Improvement smaller than this (metres) is noise, not progress. */
const EPS = 1e-12;

interface Search {
  readonly p: ArrangeProblem;
  readonly order: Int32Array;
  readonly pos: Int32Array;
  readonly flipped: Uint8Array;
  readonly centre: Float64Array;
  readonly movable: Uint8Array;
  /** The points in each bay: their nets and offsets from the bay's centre. */
  readonly pinNet: readonly Int32Array[];
  readonly pinD: readonly Float64Array[];
  /** Every net's points, net i's at [first[i], first[i + 1]): their bays and offsets. */
  readonly first: Int32Array;
  readonly pointBay: Int32Array;
  readonly pointD: Float64Array;
  /** Each net's fixed points' ends (±Infinity when it has none), and its weight. */
  readonly fixedLo: Float64Array;
  readonly fixedHi: Float64Array;
  readonly weight: Float64Array;
  /** Each net's ends and span as the bays now sit (kept current by every move). */
  readonly lo: Float64Array;
  readonly hi: Float64Array;
  readonly span: Float64Array;
  readonly stamp: Int32Array;
  /** Bays of the units a move shifts, and their centres before it. */
  readonly movedBays: Int32Array;
  readonly movedFrom: Float64Array;
  tick: number;
  work: number;
  cost: number;
}

function start(p: ArrangeProblem, a: Arrangement): Search {
  const n = p.units.length;
  const nb = p.bayWidthM.length;
  const pinsAt = Array.from({ length: nb }, () => [] as { net: number; d: number }[]);
  p.nets.forEach((net, i) => {
    for (const pin of net.pins) pinsAt[pin.bay].push({ net: i, d: pin.d });
  });
  const widest = Math.max(1, ...p.units.map((u) => u.bays.length));
  const pinned = pinnedUnits(p);
  const s: Search = {
    p,
    order: Int32Array.from(a.order),
    pos: new Int32Array(n),
    flipped: Uint8Array.from(a.flipped, (f) => (f ? 1 : 0)),
    centre: new Float64Array(nb),
    movable: Uint8Array.from(p.units, (_, u) => (pinned.has(u) ? 0 : 1)),
    first: firstPoints(p),
    pointBay: Int32Array.from(p.nets.flatMap((n) => n.pins.map((pin) => pin.bay))),
    pointD: Float64Array.from(p.nets.flatMap((n) => n.pins.map((pin) => pin.d))),
    fixedLo: Float64Array.from(p.nets, (n) => (n.fixed ? n.fixed.loM : Infinity)),
    fixedHi: Float64Array.from(p.nets, (n) => (n.fixed ? n.fixed.hiM : -Infinity)),
    weight: Float64Array.from(p.nets, (n) => n.w),
    pinNet: pinsAt.map((ps) => Int32Array.from(ps, (x) => x.net)),
    pinD: pinsAt.map((ps) => Float64Array.from(ps, (x) => x.d)),
    lo: new Float64Array(p.nets.length),
    hi: new Float64Array(p.nets.length),
    span: new Float64Array(p.nets.length),
    stamp: new Int32Array(p.nets.length),
    movedBays: new Int32Array(2 * widest),
    movedFrom: new Float64Array(2 * widest),
    tick: 0,
    work: 0,
    cost: 0,
  };
  let x = 0;
  s.order.forEach((u, i) => {
    s.pos[u] = i;
    x = place(s, u, x);
  });
  measureAll(s);
  s.cost = arrangementCost(p, snapshot(s));
  return s;
}

/** Set the centres of unit u's bays from its left edge `x`; returns its right edge. */
function place(s: Search, u: number, x: number): number {
  const bays = s.p.units[u].bays;
  const k = bays.length;
  for (let i = 0; i < k; i++) {
    const b = bays[s.flipped[u] ? k - 1 - i : i];
    const w = s.p.bayWidthM[b];
    s.centre[b] = x + w / 2;
    x += w;
  }
  return x;
}

function leftEdge(s: Search, u: number): number {
  let lo = Infinity;
  for (const b of s.p.units[u].bays) lo = Math.min(lo, s.centre[b] - s.p.bayWidthM[b] / 2);
  return lo;
}

/** Where each net's points start in the flat lists (a running sum of the nets' sizes). */
function firstPoints(p: ArrangeProblem): Int32Array {
  const first = new Int32Array(p.nets.length + 1);
  p.nets.forEach((n, i) => (first[i + 1] = first[i] + n.pins.length));
  return first;
}

/** Net i's ends and span, measured afresh from the bays' centres. */
function measure(s: Search, i: number): void {
  let lo = s.fixedLo[i];
  let hi = s.fixedHi[i];
  const end = s.first[i + 1];
  for (let k = s.first[i]; k < end; k++) {
    const x = s.centre[s.pointBay[k]] + s.pointD[k];
    if (x < lo) lo = x;
    if (x > hi) hi = x;
  }
  s.lo[i] = lo;
  s.hi[i] = hi;
  s.span[i] = hi > lo ? hi - lo : 0;
  s.work += end - s.first[i];
}

function measureAll(s: Search): void {
  for (let i = 0; i < s.p.nets.length; i++) measure(s, i);
}

/** Note the bays of unit u and their centres before a move. */
function noteMoved(s: Search, u: number, k: number): number {
  for (const b of s.p.units[u].bays) {
    s.movedBays[k] = b;
    s.movedFrom[k++] = s.centre[b];
  }
  return k;
}

/**
 * The change in the weighted spans after the `k` noted bays moved. A net whose moved points
 * all lay strictly between its ends, and still do, keeps its ends and its span.
 */
function respan(s: Search, k: number): number {
  s.tick++;
  let delta = 0;
  for (let j = 0; j < k; j++) {
    const b = s.movedBays[j];
    const nets = s.pinNet[b];
    const ds = s.pinD[b];
    for (let q = 0; q < nets.length; q++) {
      const i = nets[q];
      if (s.stamp[i] === s.tick) continue;
      const from = s.movedFrom[j] + ds[q];
      const to = s.centre[b] + ds[q];
      const lo = s.lo[i] + EPS;
      const hi = s.hi[i] - EPS;
      if (from > lo && from < hi && to > lo && to < hi) continue;
      s.stamp[i] = s.tick;
      const old = s.span[i];
      measure(s, i);
      delta += s.weight[i] * (s.span[i] - old);
    }
    s.work += nets.length + 1;
  }
  return delta;
}

const canSwap = (s: Search, i: number): boolean => {
  const a = s.order[i];
  const b = s.order[i + 1];
  return s.movable[a] === 1 && s.movable[b] === 1 && s.p.units[a].zone === s.p.units[b].zone;
};

/** Swap the units at positions i and i+1; returns the change in cost. */
function swap(s: Search, i: number): number {
  const a = s.order[i];
  const b = s.order[i + 1];
  const k = noteMoved(s, b, noteMoved(s, a, 0));
  const x = leftEdge(s, a);
  place(s, a, place(s, b, x));
  s.order[i] = b;
  s.order[i + 1] = a;
  s.pos[a] = i + 1;
  s.pos[b] = i;
  const delta = respan(s, k);
  s.cost += delta;
  return delta;
}

/** Flip unit u's bays; returns the change in cost. */
function flip(s: Search, u: number): number {
  const k = noteMoved(s, u, 0);
  const x = leftEdge(s, u);
  s.flipped[u] ^= 1;
  place(s, u, x);
  const delta = respan(s, k);
  s.cost += delta;
  return delta;
}

/** Slide unit u from its place as far as `reach` in direction dir (±1), recording the best; returns to the start. */
function probe(s: Search, u: number, dir: 1 | -1, reach: number): { gain: number; steps: number } {
  let cum = 0;
  let best = { gain: 0, steps: 0 };
  let steps = 0;
  for (; steps < reach; steps++) {
    const i = s.pos[u];
    const j = dir === 1 ? i : i - 1;
    if (j < 0 || j + 1 >= s.order.length || !canSwap(s, j)) break;
    cum += swap(s, j);
    if (cum < best.gain - EPS) best = { gain: cum, steps: steps + 1 };
  }
  for (; steps > 0; steps--) swap(s, dir === 1 ? s.pos[u] - 1 : s.pos[u]);
  return best;
}

/** The best insertion of unit u (and a flip, for a latch); true when the cost fell. */
function improveUnit(s: Search, u: number, reach: number): boolean {
  let improved = false;
  if (s.p.units[u].flippable && s.movable[u] === 1) {
    if (flip(s, u) < -EPS) improved = true;
    else flip(s, u);
  }
  if (s.movable[u] === 0) return improved;
  const right = probe(s, u, 1, reach);
  const left = probe(s, u, -1, reach);
  const best = right.gain <= left.gain ? { ...right, dir: 1 } : { ...left, dir: -1 };
  if (best.gain >= -EPS) return improved;
  for (let k = 0; k < best.steps; k++) swap(s, best.dir === 1 ? s.pos[u] : s.pos[u] - 1);
  return true;
}

/** Passes over the units in a seeded order until none improves (or the work runs out). */
function descend(s: Search, rng: Random, o: ImproveOptions): void {
  const n = s.order.length;
  for (let pass = 0; pass < 4 * n + 8 && s.work < o.work; pass++) {
    const units = shuffled(n, rng);
    let improved = false;
    for (const u of units) {
      if (s.work >= o.work) break;
      if (improveUnit(s, u, o.reach)) improved = true;
    }
    if (!improved) break;
  }
}

function shuffled(n: number, rng: Random): number[] {
  const a = Array.from({ length: n }, (_, i) => i);
  for (let i = n - 1; i > 0; i--) {
    const j = rng.int(i + 1);
    [a[i], a[j]] = [a[j], a[i]];
  }
  return a;
}

/** Longest run a kick reverses. */
const MAX_REVERSE = 24;

/**
 * A kick: reverse a run of neighbouring swappable units (a mirrored block, which insertion
 * moves alone rarely reach), or shuffle a short run; either by adjacent swaps, so the rules hold.
 */
function kick(s: Search, rng: Random): void {
  const n = s.order.length;
  if (n < 3) return;
  const at = rng.int(n - 1);
  if (rng.next() < 0.5) {
    const span = 2 + rng.int(Math.min(MAX_REVERSE, n) - 1);
    let end = at;
    while (end + 1 < n && end - at + 1 < span && canSwap(s, end)) end++;
    // Bubble the run into reverse order: each pass carries its first unit to the end.
    for (let last = end; last > at; last--) for (let i = at; i < last; i++) swap(s, i);
    for (let i = at; i <= end; i++) {
      const u = s.order[i];
      if (s.p.units[u].flippable && s.movable[u] === 1) flip(s, u);
    }
    return;
  }
  const span = 3 + rng.int(6);
  for (let k = 0; k < span * 2; k++) {
    const i = at + rng.int(span);
    if (i + 1 < n && canSwap(s, i)) swap(s, i);
  }
  for (let k = 0; k < 2; k++) {
    const u = s.order[Math.min(n - 1, at + rng.int(span))];
    if (s.p.units[u].flippable && s.movable[u] === 1 && rng.next() < 0.5) flip(s, u);
  }
}

function snapshot(s: Search): Arrangement {
  return { order: Array.from(s.order), flipped: Array.from(s.flipped, (f) => f === 1) };
}

function restore(s: Search, a: Arrangement, cost: number): void {
  s.order.set(a.order);
  a.flipped.forEach((f, u) => (s.flipped[u] = f ? 1 : 0));
  let x = 0;
  s.order.forEach((u, i) => {
    s.pos[u] = i;
    x = place(s, u, x);
  });
  measureAll(s);
  s.cost = cost;
}

/** Improve `a` (a feasible arrangement of p); the answer is feasible and costs no more than `a`. */
export function improve(
  p: ArrangeProblem,
  a: Arrangement,
  rng: Random,
  o: ImproveOptions = DEFAULT_IMPROVE,
): Arrangement {
  if (p.units.length < 2) return a;
  const s = start(p, a);
  const startCost = s.cost;
  descend(s, rng, o);
  let best = snapshot(s);
  let bestCost = arrangementCost(p, best);
  for (let k = 0; k < o.kicks && s.work < o.work; k++) {
    kick(s, rng);
    descend(s, rng, o);
    const c = arrangementCost(p, snapshot(s));
    if (c < bestCost - EPS) {
      best = snapshot(s);
      bestCost = c;
    } else restore(s, best, bestCost);
  }
  return bestCost <= startCost ? best : a;
}
