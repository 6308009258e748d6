/**
 * Exact arrangement of one drum by dynamic programming over subsets of units: the idea of
 * Held & Karp ("A dynamic programming approach to sequencing problems", J. SIAM 10, 1962)
 * applied to the minimum linear arrangement of nets.
 *
 * Why a subset is enough state. The cost is the total span of the nets (problem.ts). Read it
 * bay by bay from the visitor end: each bay adds the length of itself that each net covers.
 * With the set S of units already placed (so the bay's left edge x = width(S) is known), a
 * net covers all of the next bay when it has points both in S and still to come, and
 * otherwise the part of the bay between the points it has there and its fixed points
 * (points on another drum) — each a function of S, the unit u being placed and u's bays
 * before this one, never of the order inside S. So the cost of putting unit u (its bays
 * p₁, p₂, … in order) right after S is a function of S and u alone, the best order of S does
 * not depend on what follows it, and
 *   f(S ∪ {u}) = min over u, orientation of f(S) + cost(S, u).
 * No "last element" is needed: one table entry per reachable subset. The nets without fixed
 * points that do not touch u cover u wholly or not at all: together, u's width × the weight
 * of such nets with points on both sides of S, carried in each state (its cut). The nets with
 * fixed points are sorted once per state into those that cover u wholly (points on both
 * sides of S), those that may cover part of it, and those that cannot reach it; so a step
 * looks only at u's own nets and the partly covering ones: O(reachable subsets · (fixed
 * nets + n · (nets at u + partly covering nets))). Coverage past the drum's ends (fixed points beyond them) is the
 * same in every order and left out. A latch is one unit tried in both orders.
 * The end rules (front zone, middle, crank zone, for unpinned units) and pins restrict which
 * unit may follow a subset, which also keeps the reachable subsets few: about
 * 2^|front| + 2^|middle| + 2^|crank| rather than 2^n.
 *
 * Pre: at most 30 units (masks are 32-bit integers); callers check `exactStates` first.
 * Post: an arrangement of minimum cost (arrangementCost) among all feasible ones, or
 * undefined when no arrangement meets the pins.
 */
import { baysInOrder, pinnedUnits, type ArrangeProblem, type Arrangement, type NetPin } from './problem.js';

/** Most units the subset table can hold (bit masks are 32-bit integers). */
export const EXACT_MAX_UNITS = 30;

/** How many subsets the exact method would visit at most (the end rules split the units into three runs). */
export function exactStates(p: ArrangeProblem): number {
  const pinned = pinnedUnits(p);
  const perZone = [0, 0, 0];
  p.units.forEach((u, i) => {
    if (!pinned.has(i)) perZone[u.zone]++;
  });
  return perZone.reduce((s, k) => s + 2 ** k, 0);
}

/** A net at a unit: which net, the unit's bays it has points in, and the extreme offsets there. */
interface Touch {
  readonly net: number;
  readonly bays: readonly number[];
  readonly minD: readonly number[];
  readonly maxD: readonly number[];
}

function touchOf(net: number, pins: readonly NetPin[]): Touch {
  const bays = [...new Set(pins.map((p) => p.bay))];
  const ds = bays.map((b) => pins.filter((p) => p.bay === b).map((p) => p.d));
  return { net, bays, minD: ds.map((d) => Math.min(...d)), maxD: ds.map((d) => Math.max(...d)) };
}

interface Tables {
  readonly n: number;
  /** Units each net has points in, as a bit mask. */
  readonly mask: Int32Array;
  readonly w: Float64Array;
  /** Nets without fixed points (they count in a state's cut). */
  readonly plain: Uint8Array;
  /** Each net's fixed points' ends (±Infinity when it has none). */
  readonly fixedLo: Float64Array;
  readonly fixedHi: Float64Array;
  /** Each unit's nets with their points there. */
  readonly touch: readonly (readonly Touch[])[];
  /** Nets with fixed points elsewhere. */
  readonly fixedNets: readonly number[];
  /** The units' distinct widths, and each unit's index among them. */
  readonly widths: Float64Array;
  readonly widthOf: Int32Array;
  /** Bay index → the unit that must cover it (−1 none). */
  readonly coverAt: Int32Array;
  readonly pinned: Set<number>;
}

function tables(p: ArrangeProblem): Tables {
  const n = p.units.length;
  const nb = p.bayWidthM.length;
  const unitOfBay = new Int32Array(nb);
  p.units.forEach((u, i) => u.bays.forEach((b) => (unitOfBay[b] = i)));
  const mask = new Int32Array(p.nets.length);
  const w = new Float64Array(p.nets.length);
  const plain = new Uint8Array(p.nets.length);
  const touch = Array.from({ length: n }, () => new Map<number, NetPin[]>());
  p.nets.forEach((net, i) => {
    w[i] = net.w;
    plain[i] = net.fixed ? 0 : 1;
    for (const pin of net.pins) {
      const u = unitOfBay[pin.bay];
      mask[i] |= 1 << u;
      const at = touch[u].get(i) ?? [];
      at.push(pin);
      touch[u].set(i, at);
    }
  });
  const coverAt = new Int32Array(nb).fill(-1);
  for (const [bay, k] of p.pins) if (k >= 0 && k < nb) coverAt[k] = unitOfBay[bay];
  const unitWidth = p.units.map((u) => u.bays.reduce((sum, b) => sum + p.bayWidthM[b], 0));
  const widths = [...new Set(unitWidth)];
  return {
    widths: Float64Array.from(widths),
    widthOf: Int32Array.from(unitWidth, (w) => widths.indexOf(w)),
    n,
    mask,
    w,
    plain,
    fixedLo: Float64Array.from(p.nets, (net) => (net.fixed ? net.fixed.loM : Infinity)),
    fixedHi: Float64Array.from(p.nets, (net) => (net.fixed ? net.fixed.hiM : -Infinity)),
    touch: touch.map((m) => [...m].map(([net, pins]) => touchOf(net, pins))),
    fixedNets: p.nets.flatMap((net, i) => (net.fixed ? [i] : [])),
    coverAt,
    pinned: pinnedUnits(p),
  };
}

/** One reachable subset: its best value and how it was reached. */
interface State {
  readonly mask: number;
  readonly value: number;
  /** Weight of the nets without fixed points that have points both in the subset and outside it. */
  readonly cut: number;
  readonly widthM: number;
  readonly bays: number;
  readonly parent: State | undefined;
  readonly unit: number;
  readonly flipped: boolean;
}

const crosses = (m: number, s: number): boolean => (m & s) !== 0 && (m & ~s) !== 0;

/**
 * Length of [x, x + w] a net covers: `left` when it has points already placed (left of x),
 * `right` when it has points still to come (right of x + w), `lo`/`hi` its points in the
 * interval and its fixed points.
 */
function covered(x: number, w: number, left: boolean, right: boolean, lo: number, hi: number): number {
  const from = left ? x : Math.max(x, right ? Math.min(lo, x + w) : lo);
  const to = right ? x + w : Math.min(x + w, left ? Math.max(hi, x) : hi);
  return to > from ? to - from : 0;
}

/**
 * The nets with fixed points as they stand after a state, for every unit that may follow it:
 * the weight of those that cover whatever comes next wholly (points both placed and to come),
 * and those that may cover part of it; nets that can cover none of it are left out.
 */
interface FixedAfter {
  readonly full: number;
  /** The nets that may cover part of it, with whether each has points placed (left) and to come (right). */
  readonly partial: Int32Array;
  readonly left: Uint8Array;
  readonly right: Uint8Array;
  readonly count: number;
  /** Their cover of a unit of each width (units share a few widths), NaN until needed. */
  readonly byWidth: Float64Array;
}

/** Whether a net with fixed points that does not cover what comes next wholly may cover part of it. */
function partly(t: Tables, net: number, right: boolean, s: State): boolean {
  return t.plain[net] === 0 && (right || t.fixedHi[net] > s.widthM);
}

function fixedAfter(t: Tables, s: State): FixedAfter {
  let full = 0;
  const partial = new Int32Array(t.fixedNets.length);
  const left = new Uint8Array(t.fixedNets.length);
  const right = new Uint8Array(t.fixedNets.length);
  let count = 0;
  for (const net of t.fixedNets) {
    const m = t.mask[net];
    const l = (m & s.mask) !== 0;
    const r = (m & ~s.mask) !== 0;
    if (l && r) full += t.w[net];
    else if (partly(t, net, r, s)) {
      partial[count] = net;
      left[count] = l ? 1 : 0;
      right[count++] = r ? 1 : 0;
    }
  }
  return { full, partial, left, right, count, byWidth: new Float64Array(t.widths.length).fill(NaN) };
}

/** A net's weighted cover of [x, x + w] (see `covered`), by its fixed points and which sides it has points on. */
function cover(t: Tables, net: number, x: number, w: number, left: boolean, right: boolean): number {
  return t.w[net] * covered(x, w, left, right, t.fixedLo[net], t.fixedHi[net]);
}

/** Cover by every partly covering net of unit u (of width index k) placed next, but the nets u itself touches. */
function partlyCovered(t: Tables, s: State, fx: FixedAfter, u: number, k: number): number {
  const w = t.widths[k];
  let all = fx.byWidth[k];
  if (Number.isNaN(all)) {
    all = 0;
    for (let i = 0; i < fx.count; i++) all += cover(t, fx.partial[i], s.widthM, w, fx.left[i] === 1, fx.right[i] === 1);
    fx.byWidth[k] = all;
  }
  // The nets u touches were counted above as if it did not: take them out (step covers them itself).
  for (const { net } of t.touch[u]) {
    const m = t.mask[net];
    const left = (m & s.mask) !== 0;
    const right = (m & ~s.mask) !== 0;
    if (!(left && right) && partly(t, net, right, s)) all -= cover(t, net, s.widthM, w, left, right);
  }
  return all;
}

/** The cost of putting unit u (bays in `order`) right after state s, and the cut after it. */
function step(
  p: ArrangeProblem,
  t: Tables,
  s: State,
  fx: FixedAfter,
  u: number,
  order: readonly number[],
): { inc: number; cut: number } {
  const bit = 1 << u;
  const after = s.mask | bit;
  let cut = s.cut;
  let through = s.cut + fx.full;
  let inc = 0;
  const widthM = t.widths[t.widthOf[u]];
  for (const tc of t.touch[u]) {
    const net = tc.net;
    const m = t.mask[net];
    if (crosses(m, s.mask)) through -= t.w[net];
    if (t.plain[net] === 1) cut += t.w[net] * (Number(crosses(m, after)) - Number(crosses(m, s.mask)));
    const leftOf = (m & s.mask) !== 0;
    const rightOf = (m & ~after) !== 0;
    let x = s.widthM;
    for (let i = 0; i < order.length; i++) {
      const b = order[i];
      const wb = p.bayWidthM[b];
      let lo = t.fixedLo[net];
      let hi = t.fixedHi[net];
      let left = leftOf;
      let right = rightOf;
      for (let j = 0; j < tc.bays.length; j++) {
        const pb = tc.bays[j];
        if (pb === b) {
          lo = Math.min(lo, x + wb / 2 + tc.minD[j]);
          hi = Math.max(hi, x + wb / 2 + tc.maxD[j]);
        } else if (order.indexOf(pb) < i) left = true;
        else right = true;
      }
      inc += t.w[net] * covered(x, wb, left, right, lo, hi);
      x += wb;
    }
  }
  inc += widthM * through;
  inc += partlyCovered(t, s, fx, u, t.widthOf[u]);
  return { inc, cut };
}

/** Whether unit u may follow state s in this orientation (end rules and pins). */
function allowed(p: ArrangeProblem, t: Tables, s: State, u: number, order: readonly number[], zone: number): boolean {
  if (!t.pinned.has(u) && p.units[u].zone !== zone) return false;
  for (let i = 0; i < order.length; i++) {
    const k = s.bays + i;
    if (k >= t.coverAt.length) return false;
    const pin = p.pins.get(order[i]);
    if (pin !== undefined && pin !== k) return false;
    if (t.coverAt[k] !== -1 && t.coverAt[k] !== u) return false;
  }
  return true;
}

/** The zone the next unpinned unit must come from, after `mask`. */
function nextZone(p: ArrangeProblem, t: Tables, mask: number): number {
  let zone = 3;
  for (let u = 0; u < t.n; u++)
    if (!t.pinned.has(u) && (mask & (1 << u)) === 0 && p.units[u].zone < zone) zone = p.units[u].zone;
  return zone;
}

/** A minimum-cost arrangement, or undefined when the pins cannot all be met. */
export function arrangeExact(p: ArrangeProblem): Arrangement | undefined {
  const t = tables(p);
  if (t.n > EXACT_MAX_UNITS) throw new RangeError(`exact arrangement takes at most ${EXACT_MAX_UNITS} units`);
  let layer = new Map<number, State>([
    [0, { mask: 0, value: 0, cut: 0, widthM: 0, bays: 0, parent: undefined, unit: -1, flipped: false }],
  ]);
  for (let placed = 0; placed < t.n; placed++) {
    const next = new Map<number, State>();
    for (const s of layer.values()) {
      const zone = nextZone(p, t, s.mask);
      const forced = s.bays < t.coverAt.length ? t.coverAt[s.bays] : -1;
      const fx = fixedAfter(t, s);
      for (let u = 0; u < t.n; u++) {
        if ((s.mask & (1 << u)) !== 0 || (forced !== -1 && forced !== u)) continue;
        for (const flipped of p.units[u].flippable ? [false, true] : [false]) {
          const order = baysInOrder(p, u, flipped);
          if (!allowed(p, t, s, u, order, zone)) continue;
          const { inc, cut } = step(p, t, s, fx, u, order);
          const mask = s.mask | (1 << u);
          const value = s.value + inc;
          const old = next.get(mask);
          if (old && old.value <= value) continue;
          let widthM = s.widthM;
          for (const b of order) widthM += p.bayWidthM[b];
          next.set(mask, { mask, value, cut, widthM, bays: s.bays + order.length, parent: s, unit: u, flipped });
        }
      }
    }
    layer = next;
  }
  const last = layer.values().next();
  if (last.done) return undefined;
  const order: number[] = [];
  const flipped: boolean[] = new Array<boolean>(t.n).fill(false);
  for (let s: State | undefined = last.value; s && s.unit >= 0; s = s.parent) {
    order.push(s.unit);
    flipped[s.unit] = s.flipped;
  }
  return { order: order.reverse(), flipped };
}
