import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { solveCover, type CoverProblem } from '../../../../src/core/phases/minimise-logic/cover-exact.js';
import { seededRandom } from '../../../../src/core/model/random.js';

/** Cheapest cover by trying every subset of columns (the definition of the problem). */
function bruteForce(p: CoverProblem): number {
  let best = Infinity;
  for (let mask = 0; mask < 1 << p.columns.length; mask++) {
    const rows = new Set<number>();
    const groups = new Set<number>();
    let cost = 0;
    p.columns.forEach((c, i) => {
      if (!(mask & (1 << i))) return;
      c.rows.forEach((r) => rows.add(r));
      cost += c.cost;
      if (!groups.has(c.group)) cost += p.groupCost[c.group];
      groups.add(c.group);
    });
    if (rows.size === p.rowCount) best = Math.min(best, cost);
  }
  return best;
}

/** Random coverable problems with up to 13 columns, one or two columns per group. */
const problemArb = fc.integer({ min: 0, max: 2 ** 31 - 1 }).map((seed): CoverProblem => {
  const rnd = seededRandom(seed);
  const rowCount = 1 + rnd.int(10);
  const columns: { group: number; cost: number; rows: number[] }[] = [];
  const groupCost: number[] = [];
  for (let g = 0; columns.length < 13 && g < 8; g++) {
    groupCost.push(1 + rnd.int(5));
    for (let q = 1 + rnd.int(2); q > 0; q--) {
      const rows = [...Array(rowCount).keys()].filter(() => rnd.next() < 0.35);
      if (rows.length > 0) columns.push({ group: g, cost: rnd.int(2), rows });
    }
  }
  // make every row coverable
  for (let r = 0; r < rowCount; r++)
    if (!columns.some((c) => c.rows.includes(r))) columns.push({ group: 0, cost: 1, rows: [r] });
  return { rowCount, columns, groupCost };
});

const costOf = (p: CoverProblem, cols: readonly number[]): number => {
  const groups = new Set(cols.map((c) => p.columns[c].group));
  return cols.reduce((s, c) => s + p.columns[c].cost, 0) + [...groups].reduce((s, g) => s + p.groupCost[g], 0);
};
const coversAll = (p: CoverProblem, cols: readonly number[]): boolean =>
  new Set(cols.flatMap((c) => p.columns[c].rows)).size === p.rowCount;

describe('core/phases/minimise-logic/cover-exact', () => {
  it('finds the minimum cost, with fixed charges, and its columns cover every row', () => {
    fc.assert(
      fc.property(problemArb, (p) => {
        const s = solveCover(p);
        expect(s.optimal).toBe(true);
        expect(coversAll(p, s.columns)).toBe(true);
        expect(costOf(p, s.columns)).toBe(s.cost);
        expect(s.cost).toBe(bruteForce(p));
      }),
      { seed: 42, numRuns: 400 },
    );
  });

  it('with a tiny node limit still returns a valid cover', () => {
    fc.assert(
      fc.property(problemArb, (p) => {
        const s = solveCover(p, 2);
        expect(coversAll(p, s.columns)).toBe(true);
        expect(s.cost).toBeGreaterThanOrEqual(bruteForce(p));
      }),
      { seed: 42, numRuns: 200 },
    );
  });

  it('with an upper bound returns only cheaper covers, else null', () => {
    fc.assert(
      fc.property(problemArb, (p) => {
        const min = bruteForce(p);
        expect(solveCover(p, Infinity, min)).toBeNull();
        const s = solveCover(p, Infinity, min + 1);
        expect(s?.cost).toBe(min);
      }),
      { seed: 42, numRuns: 200 },
    );
  });
});
