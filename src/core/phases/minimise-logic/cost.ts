/**
 * Pricing a sum-of-products cover in parts: one term gate per term, one cord per input literal,
 * one cord branch per function a term feeds.
 */
import { literalCount } from '../../model/cube.js';
import type { CoverCost, SopCover } from './types.js';

/** The default price: a term gate counts as four cords; a literal or a branch as one. */
export const DEFAULT_COST: CoverCost = { term: 4, literal: 1, connection: 1 };

/** Totals of a cover. */
export interface CoverStats {
  readonly terms: number;
  readonly literals: number;
  readonly connections: number;
}

/** Term, literal and connection counts of a cover. */
export function coverStats(c: SopCover): CoverStats {
  let literals = 0;
  let connections = 0;
  for (const t of c.terms) {
    literals += literalCount(t.cube);
    connections += t.outputs.length;
  }
  return { terms: c.terms.length, literals, connections };
}

/** Price of a cover under `cost` (default DEFAULT_COST). */
export function coverCost(c: SopCover, cost: CoverCost = DEFAULT_COST): number {
  const s = coverStats(c);
  return cost.term * s.terms + cost.literal * s.literals + cost.connection * s.connections;
}
