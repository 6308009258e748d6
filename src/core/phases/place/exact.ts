/**
 * Exact arrangement of one drum by dynamic programming over subsets of units: the idea of
 * Held & Karp ("A dynamic programming approach to sequencing problems", J. SIAM 10, 1962)
 * applied to the minimum linear arrangement.
 *
 * Why a subset is enough state. With bay centres, an edge (a, b), a before b, is
 * w_a/2 + (widths of every bay strictly between) + w_b/2 long. Summed over edges, each bay k
 * contributes w_k × (weight of the edges that pass over it) plus w_k/2 × (weight of its own
 * edges). The second part is the same in every order. The first depends only on which bays
 * lie before k: the edges passing over k are those between the set S before it and the bays
 * after it, i.e. cut(S) minus the edges from S to k. So the cost of putting unit u (its bays
 * p₁, p₂, … in order) right after the set S is
 *   Σ_i w_{p_i} · (cut(S ∪ {p₁..p_{i−1}}) − e(S ∪ {p₁..p_{i−1}}, p_i))
 *   + Σ over p_i's anchors w·|width(S ∪ {p₁..p_{i−1}}) + w_{p_i}/2 − x|,
 * a function of S and u alone, and the best order of S does not depend on what follows it:
 * f(S ∪ {u}) = min over u, orientation of f(S) + cost(S, u). No "last element" is needed, so
 * the table has one entry per reachable subset and the work is O(reachable subsets · n²).
 * An edge whose ends sit off their bays' centres (a port lever beside its gate's capstan)
 * adds d_later − d_earlier, known as soon as its second end is placed: that term joins the
 * step cost through the same per-unit table as the cut. A latch is one unit tried in both
 * orders; its internal edge is counted by the same formulas.
 * The end rules (front zone, middle, crank zone, for unpinned units) and pins restrict which
 * unit may follow a subset, which also keeps the reachable subsets few: about
 * 2^|front| + 2^|middle| + 2^|crank| rather than 2^n.
 *
 * Pre: at most 30 units (masks are 32-bit integers); callers check `exactStates` first.
 * Post: an arrangement of minimum cost (arrangementCost) among all feasible ones, or
 * undefined when no arrangement meets the pins.
 */
import { baysInOrder, pinnedUnits, type ArrangeProblem, type Arrangement } from './problem.js';

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

interface Tables {
  readonly n: number;
  /** adj[p·n + u]: weight of the edges between bay p and the bays of unit u. */
  readonly adj: Float64Array;
  /** off[p·n + u]: Σ w·(d at p − d at the other end) over those edges, the extra when p comes later. */
  readonly off: Float64Array;
  /** Weight between two bays of one unit (a latch's internal edge), keyed p·nb + q. */
  readonly inner: Map<number, number>;
  /** The offset extra of that edge when p comes after q, keyed p·nb + q. */
  readonly innerOff: Map<number, number>;
  readonly degree: Float64Array;
  readonly anchors: readonly (readonly { xM: number; w: number }[])[];
  readonly unitOfBay: Int32Array;
  /** Bay index → the unit that must cover it (−1 none). */
  readonly coverAt: Int32Array;
  readonly pinned: Set<number>;
}

function tables(p: ArrangeProblem): Tables {
  const n = p.units.length;
  const nb = p.bayWidthM.length;
  const unitOfBay = new Int32Array(nb);
  p.units.forEach((u, i) => u.bays.forEach((b) => (unitOfBay[b] = i)));
  const adj = new Float64Array(nb * n);
  const off = new Float64Array(nb * n);
  const degree = new Float64Array(nb);
  const inner = new Map<number, number>();
  const innerOff = new Map<number, number>();
  const add = (m: Map<number, number>, k: number, v: number): void => void m.set(k, (m.get(k) ?? 0) + v);
  for (const e of p.edges) {
    adj[e.a * n + unitOfBay[e.b]] += e.w;
    adj[e.b * n + unitOfBay[e.a]] += e.w;
    off[e.a * n + unitOfBay[e.b]] += e.w * (e.da - e.db);
    off[e.b * n + unitOfBay[e.a]] += e.w * (e.db - e.da);
    degree[e.a] += e.w;
    degree[e.b] += e.w;
    if (unitOfBay[e.a] === unitOfBay[e.b]) {
      add(inner, e.a * nb + e.b, e.w);
      add(inner, e.b * nb + e.a, e.w);
      add(innerOff, e.a * nb + e.b, e.w * (e.da - e.db));
      add(innerOff, e.b * nb + e.a, e.w * (e.db - e.da));
    }
  }
  const anchors = Array.from({ length: nb }, () => [] as { xM: number; w: number }[]);
  for (const h of p.anchors) anchors[h.bay].push({ xM: h.xM - h.d, w: h.w });
  const coverAt = new Int32Array(nb).fill(-1);
  for (const [bay, k] of p.pins) if (k >= 0 && k < nb) coverAt[k] = unitOfBay[bay];
  return { n, adj, off, inner, innerOff, degree, anchors, unitOfBay, coverAt, pinned: pinnedUnits(p) };
}

/** One reachable subset: its best value and how it was reached. */
interface State {
  readonly mask: number;
  readonly value: number;
  readonly cut: number;
  readonly widthM: number;
  readonly bays: number;
  readonly parent: State | undefined;
  readonly unit: number;
  readonly flipped: boolean;
}

/** Weight of the edges from bay `b` to the units in `mask`, and their offset extra with b placed after them. */
function edgesTo(t: Tables, b: number, mask: number): { w: number; off: number } {
  let w = 0;
  let off = 0;
  let m = mask;
  const row = b * t.n;
  while (m !== 0) {
    const low = m & -m;
    const u = row + 31 - Math.clz32(low);
    w += t.adj[u];
    off += t.off[u];
    m ^= low;
  }
  return { w, off };
}

/** The cost of putting unit u (bays in `order`) right after state s, and the cut after it. */
function step(p: ArrangeProblem, t: Tables, s: State, order: readonly number[]): { inc: number; cut: number } {
  let inc = 0;
  let cut = s.cut;
  let x = s.widthM;
  for (let i = 0; i < order.length; i++) {
    const b = order[i];
    const to = edgesTo(t, b, s.mask);
    let e = to.w;
    inc += to.off;
    for (let j = 0; j < i; j++) {
      const key = b * p.bayWidthM.length + order[j];
      e += t.inner.get(key) ?? 0;
      inc += t.innerOff.get(key) ?? 0;
    }
    const w = p.bayWidthM[b];
    inc += w * (cut - e);
    for (const h of t.anchors[b]) inc += h.w * Math.abs(x + w / 2 - h.xM);
    cut += t.degree[b] - 2 * e;
    x += w;
  }
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
      for (let u = 0; u < t.n; u++) {
        if ((s.mask & (1 << u)) !== 0 || (forced !== -1 && forced !== u)) continue;
        for (const flipped of p.units[u].flippable ? [false, true] : [false]) {
          const order = baysInOrder(p, u, flipped);
          if (!allowed(p, t, s, u, order, zone)) continue;
          const { inc, cut } = step(p, t, s, order);
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
