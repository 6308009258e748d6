/**
 * The boundary EXPAND grows cubes against: the off-set of each function, as single-function
 * cubes, built by COMPLEMENT (complement.ts; Brayton et al., "Logic Minimization Algorithms
 * for VLSI Synthesis", Kluwer 1984, ch. 3) — or, when the off-set would be out of proportion
 * to the function, the allowed sets on_j ∪ dc_j themselves, which EXPAND then tests by
 * tautology (expand-within.ts).
 *
 * The proportion: a dense function's off-set is about as long as its on ∪ dc (1.0–1.3 times
 * on random functions of 10–14 variables with 40 % of the points on or don't-care), so the
 * off-set is always built for those, however many variables. Only sparse functions of many
 * variables reach the limit: the complement of k cubes on disjoint variables with l literals
 * each has l^k cubes.
 *
 * Precondition: `allowed` has one input-cube list per function of the space.
 * Postcondition: every off cube feeds one function and misses that function's allowed set.
 */
import { type BCube, type Space, withOutputs } from './bitcube.js';
import { complement } from './complement.js';
import type { Boundary } from './expand.js';

/**
 * Most cubes the off-set may hold: `ratio` times the cubes of the allowed sets, and never
 * fewer than `floor` (below which EXPAND against an explicit off-set is always the faster).
 */
export const OFFSET_LIMIT: { readonly ratio: number; readonly floor: number } = { ratio: 8, floor: 20_000 };

/** The off-set per function, or the allowed sets when the off-set would pass OFFSET_LIMIT. */
export function boundary(sp: Space, allowed: readonly (readonly BCube[])[]): Boundary {
  let cubes = 0;
  for (const a of allowed) cubes += a.length;
  const room = Math.max(OFFSET_LIMIT.floor, OFFSET_LIMIT.ratio * cubes);
  const R: BCube[] = [];
  for (let j = 0; j < allowed.length; j++) {
    const off = complement(sp, allowed[j], room - R.length);
    if (off === null) return { allowed };
    for (const r of off) R.push(withOutputs(sp, r, [j]));
  }
  return { off: R };
}
