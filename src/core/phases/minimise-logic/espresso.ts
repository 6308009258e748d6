/**
 * The Espresso-II loop (R. K. Brayton, G. D. Hachtel, C. T. McMullen,
 * A. L. Sangiovanni-Vincentelli, "Logic Minimization Algorithms for VLSI Synthesis", Kluwer
 * 1984, ch. 4), on multi-output cubes:
 *
 *   F ← EXPAND(F, R); F ← IRREDUNDANT(F, D); E ← ESSENTIAL(F, D); F ← F − E; D ← D ∪ E
 *   repeat  F ← REDUCE, EXPAND, IRREDUNDANT  while the cost falls;
 *           LAST_GASP (reduce every cube on its own, expand the reduced cubes towards each
 *           other, IRREDUNDANT) and go round again if it helped
 *   F ← MAKE_SPARSE(F ∪ E): drop needless output connections, then re-expand inputs only.
 *
 * Cost is the caller's: term + literal·(input literals) + connection·(functions fed).
 * Deterministic: every ordering is fixed (no random choices).
 *
 * R is the boundary of EXPAND: the off-set as single-function cubes, or, when that would be
 * too large, the on ∪ dc sets themselves (expansion by tautology checks).
 *
 * Preconditions: F misses the off-set; D does not meet the on-set.
 * Postcondition: the result covers the on-set F0 covered and misses R.
 */
import {
  type BCube,
  type Space,
  contains,
  inDistance,
  outMeet,
  outCount,
  literals,
  outputsOf,
  hasOutput,
} from './bitcube.js';
import { cubeCovered } from './unate.js';
import { expandCover, expandCube, allowMask, type Boundary } from './expand.js';
import { irredundantCover, byOutput } from './irredundant.js';
import { reduceCover, reduceCube, lowerOutputs } from './reduce.js';
import type { CoverCost } from './types.js';

/**
 * Passes at equal cost the loop still takes before LAST_GASP (Espresso stops at the first;
 * one more, from the moved cover, finds a cheaper one now and then at little cost).
 */
const STALL = 1;

/** Price of one multi-output cube. */
function cubeCost(sp: Space, c: BCube, cost: CoverCost): number {
  return cost.term + cost.literal * literals(sp, c) + cost.connection * outCount(sp, c);
}

function total(sp: Space, F: readonly BCube[], cost: CoverCost): number {
  let s = 0;
  for (const c of F) s += cubeCost(sp, c, cost);
  return s;
}

/**
 * Minimise the cover F0 (the on-set, or any cover of it) with don't-cares D within R. When
 * `isCover` says F0 is already a correct cover, the result never costs more than F0.
 */
export function espresso(
  sp: Space,
  F0: readonly BCube[],
  D: readonly BCube[],
  R: Boundary,
  cost: CoverCost,
  isCover = false,
): BCube[] {
  if (F0.length === 0) return [];
  if (isCover) {
    const out = espresso(sp, F0, D, R, cost);
    return total(sp, out, cost) <= total(sp, F0, cost) ? out : F0.slice();
  }
  const price = (c: BCube): number => cubeCost(sp, c, cost);
  const dc = byOutput(sp, D);
  let F = irredundantCover(sp, expandCover(sp, F0, R), dc, price);
  const ess = essentials(sp, F, D);
  const E = F.filter((_, i) => ess[i]);
  F = F.filter((_, i) => !ess[i]);
  const dc2 = byOutput(sp, [...D, ...E]);
  let best = F;
  let bestCost = total(sp, F, cost);
  // Espresso alternates the REDUCE order between passes.
  let stall = 0;
  for (let pass = 0; F.length > 0; pass++) {
    F = irredundantCover(sp, expandCover(sp, reduceCover(sp, F, dc2, pass % 2 === 1), R), dc2, price);
    const c = total(sp, F, cost);
    if (c < bestCost) {
      best = F;
      bestCost = c;
      stall = 0;
      continue;
    }
    if (c === bestCost && ++stall <= STALL) continue;
    const g = lastGasp(sp, best, dc2, R, price);
    const cg = total(sp, g, cost);
    if (cg < bestCost) {
      best = g;
      bestCost = cg;
      F = g;
      continue;
    }
    break;
  }
  return makeSparse(sp, [...E, ...best], dc, R, cost);
}

/**
 * Which cubes are essential primes: c is not essential exactly when the consensus of c with
 * the other cubes and D covers it (Brayton et al. ch. 4). For a conflict in the output part
 * the consensus feeds the union of the two output parts over the shared inputs.
 */
function essentials(sp: Space, F: readonly BCube[], D: readonly BCube[]): boolean[] {
  const all = [...F, ...D];
  return F.map((c, i) => {
    const h: BCube[] = [];
    for (let q = 0; q < all.length; q++) {
      if (q === i) continue;
      const d = all[q];
      const din = inDistance(sp, c, d);
      const meet = outMeet(sp, c, d);
      if (din + (meet ? 0 : 1) > 1) continue;
      if (din === 0 && meet) {
        h.push(d);
        continue;
      }
      const x = new Array<number>(sp.w);
      for (let k = 0; k < sp.wi; k++) {
        const y = c[k] & d[k];
        const z = sp.low[k] & ~(y | (y >>> 1));
        x[k] = y | z | (z << 1);
      }
      for (let k = sp.wi; k < sp.w; k++) x[k] = meet ? c[k] & d[k] : c[k] | d[k];
      h.push(x);
    }
    for (const j of outputsOf(sp, c)) {
      const t = h.filter((x) => hasOutput(sp, x, j));
      if (!cubeCovered(sp, t, c)) return true;
    }
    return false;
  });
}

/**
 * LAST_GASP (Brayton et al. ch. 4): reduce each cube against the unchanged rest, expand each
 * reduced cube aiming at the other reduced cubes, and keep the new cubes that swallow at
 * least one other; IRREDUNDANT decides whether they pay.
 */
function lastGasp(
  sp: Space,
  F: readonly BCube[],
  dc: readonly BCube[][],
  R: Boundary,
  price: (c: BCube) => number,
): BCube[] {
  const reduced: BCube[] = [];
  F.forEach((c) => {
    const r = reduceCube(sp, c, F, dc);
    if (r !== null && !contains(sp, r, c)) reduced.push(r); // only cubes that shrank
  });
  if (reduced.length < 2) return F.slice();
  const allow = allowMask(sp, false);
  const fresh: BCube[] = [];
  reduced.forEach((g, i) => {
    const others = reduced.filter((_, q) => q !== i);
    const e = expandCube(sp, g, R, others, allow);
    if (others.some((o) => contains(sp, e, o))) fresh.push(e);
  });
  if (fresh.length === 0) return F.slice();
  return irredundantCover(sp, [...F, ...fresh], dc, price);
}

/** MAKE_SPARSE (Brayton et al. ch. 4): fewer output connections, then larger input parts. */
function makeSparse(sp: Space, F: readonly BCube[], dc: readonly BCube[][], R: Boundary, cost: CoverCost): BCube[] {
  let cur = F.slice();
  let curCost = total(sp, cur, cost);
  for (;;) {
    const next = expandCover(sp, lowerOutputs(sp, cur, dc), R, true);
    const c = total(sp, next, cost);
    if (c >= curCost) return c === curCost ? next : cur;
    cur = next;
    curCost = c;
  }
}
