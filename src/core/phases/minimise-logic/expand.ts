/**
 * EXPAND of Espresso-II (Brayton et al., "Logic Minimization Algorithms for VLSI Synthesis",
 * Kluwer 1984, ch. 4; R. Rudell, "Multiple-valued logic minimization for PLA synthesis",
 * UCB/ERL M86/65, 1986): grow each cube of the cover into a prime that stays off the
 * off-set R, choosing the raised parts so as to swallow as many other cubes as possible.
 *
 * Every R cube feeds exactly one function. Against the cube c being grown, an off cube r is
 * kept away by its "blocking" bits: the lowered bits of c that, once raised, would let c meet
 * r (one bit per conflicting input variable, plus r's function bit when c does not feed it).
 * c stays off r while at least one of those bits stays lowered, so the choice of bits to keep
 * is a covering problem (the blocking matrix of EXPAND).
 *
 * Precondition: every cube of F misses R. Postcondition: every returned cube is prime (no
 * allowed bit can be raised without meeting R), and every cube of F lies in one of them.
 */
import { type BCube, type Space, SLOT, contains, cubeWeights, popcount, scratch } from './bitcube.js';
import { solveCover } from './cover-exact.js';
import { expandWithin } from './expand-within.js';

/**
 * What a cube may not grow into: the off-set R (single-function cubes), or — when the off-set
 * would be too large to build — the allowed sets on_j ∪ dc_j, tested by tautology.
 */
export type Boundary = { readonly off: readonly BCube[] } | { readonly allowed: readonly (readonly BCube[])[] };

/** Expand every cube of F within the boundary; `inputOnly` leaves output parts alone. */
export function expandCover(sp: Space, F: readonly BCube[], bound: Boundary, inputOnly = false): BCube[] {
  const allow = allowMask(sp, inputOnly);
  // Espresso's ordering: light cubes (whose parts few other cubes share) first, since they
  // are the least likely to be covered by others.
  const weight = cubeWeights(sp, F);
  const order = F.map((_, i) => i).sort((a, b) => weight[a] - weight[b] || a - b);
  const covered = new Uint8Array(F.length);
  const out: BCube[] = [];
  for (const i of order) {
    if (covered[i]) continue;
    covered[i] = 1;
    const cands: BCube[] = [];
    for (const j of order) if (!covered[j]) cands.push(F[j]);
    const e = expandCube(sp, F[i], bound, cands, allow);
    for (let j = 0; j < F.length; j++) if (!covered[j] && contains(sp, e, F[j])) covered[j] = 1;
    out.push(e);
  }
  return out;
}

/** Bits EXPAND may raise: all input bits, and output bits unless `inputOnly`. */
export function allowMask(sp: Space, inputOnly: boolean): number[] {
  const a: number[] = [];
  for (let k = 0; k < sp.wi; k++) a.push(sp.full[k]);
  for (let k = 0; k < sp.wo; k++) a.push(inputOnly ? 0 : sp.outFull[k]);
  return a;
}

/** Grow one cube into a prime within the boundary, trying to cover the candidate cubes. */
export function expandCube(
  sp: Space,
  c0: BCube,
  bound: Boundary,
  cands: readonly BCube[],
  allow: readonly number[],
): BCube {
  return 'off' in bound
    ? expandAgainst(sp, c0, bound.off, cands, allow)
    : expandWithin(sp, c0, bound.allowed, cands, allow);
}

/** EXPAND against an explicit off-set: the blocking-matrix method. */
function expandAgainst(
  sp: Space,
  c0: BCube,
  R: readonly BCube[],
  cands: readonly BCube[],
  allow: readonly number[],
): BCube {
  const W = sp.w;
  const c = c0.slice();
  const free: number[] = new Array<number>(W);
  const keep: number[] = new Array<number>(W).fill(0);
  for (let k = 0; k < W; k++) free[k] = allow[k] & ~c[k];
  // Blocking rows, flat: row i occupies rows[i*W .. i*W+W-1]; `act` lists the live ones.
  const rows = scratch(SLOT.rows, R.length * W);
  const act = scratch(SLOT.act, R.length);
  let na = blockingRows(sp, c, R, free, rows, act);
  na = raiseTowards(W, c, cands, rows, act, na, free, keep);
  lowestLowering(W, rows, act, na, free, keep);
  for (let k = 0; k < W; k++) c[k] |= free[k] & ~keep[k];
  return c;
}

/**
 * The blocking matrix of c against R: per off cube, the lowered bits of c that would let c
 * meet it once raised. Rows that a bit c may not raise already blocks are left out. Returns
 * the number of live rows (their offsets at the front of `act`).
 */
function blockingRows(
  sp: Space,
  c: BCube,
  R: readonly BCube[],
  free: readonly number[],
  rows: Int32Array,
  act: Int32Array,
): number {
  const W = sp.w;
  const wi = sp.wi;
  let na = 0;
  for (let i = 0; i < R.length; i++) {
    const r = R[i];
    let any = 0;
    let fixed = 0;
    const base = na * W;
    for (let k = 0; k < W; k++) {
      let x: number;
      if (k < wi) {
        const y = c[k] & r[k];
        const z = sp.low[k] & ~(y | (y >>> 1));
        x = (z | (z << 1)) & r[k] & ~c[k];
      } else x = r[k] & ~c[k];
      rows[base + k] = x;
      any |= x;
      fixed |= x & ~free[k];
    }
    if (any === 0) throw new Error('expand: a cube of the cover meets the off-set');
    if (fixed === 0) {
      act[na] = base;
      na++;
    } // else a bit we may not raise keeps c off r
  }
  return na;
}

/**
 * Grow c (in place) towards the candidate cubes it can still swallow without meeting R: after
 * the essential lowerings and the free raises, take the candidate whose raise leaves most of
 * the others feasible, until none is. Returns the number of live rows left.
 */
function raiseTowards(
  W: number,
  c: BCube,
  cands: readonly BCube[],
  rows: Int32Array,
  act: Int32Array,
  na: number,
  free: number[],
  keep: number[],
): number {
  const nc = cands.length;
  const need = scratch(SLOT.need, nc * W);
  const pend = scratch(SLOT.pend, nc);
  let np = 0;
  for (let i = 0; i < nc; i++) pend[np++] = i;
  const feas = scratch(SLOT.feas, nc);
  for (;;) {
    na = essentialLowering(W, rows, act, na, free, keep);
    // Raise, for free, every bit no remaining off cube depends on.
    for (let k = 0; k < W; k++) {
      let used = 0;
      for (let a = 0; a < na; a++) used |= rows[act[a] + k];
      const up = free[k] & ~used;
      c[k] |= up;
      free[k] &= ~up;
    }
    // Cubes still coverable by raising only free bits without meeting R.
    let nf = 0;
    let kept = 0;
    for (let p = 0; p < np; p++) {
      const i = pend[p];
      const d = cands[i];
      const nb = i * W;
      let some = 0;
      let blocked = 0;
      for (let k = 0; k < W; k++) {
        const x = d[k] & ~c[k];
        need[nb + k] = x;
        some |= x;
        blocked |= x & ~free[k];
      }
      if (some === 0 || blocked !== 0) continue; // already covered, or never coverable
      pend[kept++] = i;
      if (rowsSurvive(W, rows, act, na, free, need, nb, -1)) feas[nf++] = i;
    }
    np = kept;
    if (nf === 0) return na;
    const best = selectFeasible(W, rows, act, na, free, need, feas, nf);
    for (let k = 0; k < W; k++) {
      const x = need[best * W + k];
      c[k] |= x;
      free[k] &= ~x;
    }
  }
}

/**
 * Espresso's select_feasible: the candidate whose raise leaves most of the other feasible
 * candidates still feasible; ties go to the smaller raise, then to the earlier candidate.
 */
function selectFeasible(
  W: number,
  rows: Int32Array,
  act: Int32Array,
  na: number,
  free: readonly number[],
  need: Int32Array,
  feas: Int32Array,
  nf: number,
): number {
  let best = feas[0];
  let bestScore = -1;
  let bestBits = Infinity;
  for (let a = 0; a < nf; a++) {
    const ia = feas[a] * W;
    let score = 0;
    for (let b = 0; b < nf; b++) if (a !== b && rowsSurvive(W, rows, act, na, free, need, ia, feas[b] * W)) score++;
    let bits = 0;
    for (let k = 0; k < W; k++) bits += popcount(need[ia + k]);
    if (score > bestScore || (score === bestScore && bits < bestBits)) {
      best = feas[a];
      bestScore = score;
      bestBits = bits;
    }
  }
  return best;
}

/** Does every live row keep a free bit outside the raise need[a] (∪ need[b] when b ≥ 0)? */
function rowsSurvive(
  W: number,
  rows: Int32Array,
  act: Int32Array,
  na: number,
  free: readonly number[],
  need: Int32Array,
  a: number,
  b: number,
): boolean {
  for (let i = 0; i < na; i++) {
    const base = act[i];
    let left = 0;
    for (let k = 0; k < W; k++) left |= rows[base + k] & free[k] & ~need[a + k] & ~(b >= 0 ? need[b + k] : 0);
    if (left === 0) return false;
  }
  return true;
}

/**
 * Rows left with a single free bit force that bit to stay lowered; repeat to a fixed point.
 * Returns the number of rows (compacted at the front of `act`) not yet kept off.
 */
function essentialLowering(
  W: number,
  rows: Int32Array,
  act: Int32Array,
  na: number,
  free: number[],
  keep: number[],
): number {
  for (let changed = true; changed;) {
    changed = false;
    let out = 0;
    for (let i = 0; i < na; i++) {
      const base = act[i];
      let blocked = 0;
      let cnt = 0;
      let only = -1;
      for (let k = 0; k < W; k++) {
        const x = rows[base + k];
        blocked |= x & keep[k];
        const f = x & free[k];
        if (f !== 0) {
          cnt += popcount(f);
          only = k;
        }
      }
      if (blocked !== 0) continue;
      if (cnt === 0) throw new Error('expand: a raise made the cube meet the off-set');
      if (cnt === 1) {
        const b = rows[base + only] & free[only];
        keep[only] |= b;
        free[only] &= ~b;
        changed = true;
        continue;
      }
      act[out++] = base;
    }
    na = out;
  }
  return na;
}

/** Node limit of the exact choice of bits to keep lowered (then the greedy one stands). */
const LOWERING_NODES = 300;

/**
 * The rest of the blocking matrix: the fewest free bits to keep lowered so that every live row
 * keeps one (a unate covering problem, Brayton et al. ch. 4, the minimum lowering set; solved by
 * cover-exact.ts within a node limit, starting from the greedy choice). Every other free bit
 * is raised by the caller, so the cube comes out prime with as few literals as found.
 */
function lowestLowering(
  W: number,
  rows: Int32Array,
  act: Int32Array,
  na: number,
  free: number[],
  keep: number[],
): void {
  if (na === 0) return;
  const bitIndex = new Map<number, number>();
  const bits: number[] = [];
  const columns: { group: number; cost: number; rows: number[] }[] = [];
  for (let i = 0; i < na; i++)
    for (let k = 0; k < W; k++) {
      let x = rows[act[i] + k] & free[k];
      while (x !== 0) {
        const b = k * 32 + 31 - Math.clz32(x & -x);
        x &= x - 1;
        let ci = bitIndex.get(b);
        if (ci === undefined) {
          ci = bits.length;
          bitIndex.set(b, ci);
          bits.push(b);
          columns.push({ group: ci, cost: 0, rows: [] });
        }
        columns[ci].rows.push(i);
      }
    }
  // Greedy first: one or two bits are a minimum already (a single bit covering every row
  // is what greedy takes first), so the exact search only runs for three or more.
  const chosen: number[] = [];
  const covered = new Uint8Array(na);
  for (let left = na; left > 0;) {
    let best = 0;
    let bestN = -1;
    for (let ci = 0; ci < columns.length; ci++) {
      let n = 0;
      for (const r of columns[ci].rows) if (covered[r] === 0) n++;
      if (n > bestN) {
        bestN = n;
        best = ci;
      }
    }
    chosen.push(best);
    for (const r of columns[best].rows)
      if (covered[r] === 0) {
        covered[r] = 1;
        left--;
      }
  }
  const pick =
    chosen.length <= 2
      ? chosen
      : solveCover({ rowCount: na, columns, groupCost: columns.map(() => 1) }, LOWERING_NODES).columns;
  for (const ci of pick) {
    const b = bits[ci];
    keep[b >>> 5] |= 1 << (b & 31);
    free[b >>> 5] &= ~(1 << (b & 31));
  }
}
