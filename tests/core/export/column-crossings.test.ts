import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { countColumnCrossings, type CrossingGeometry } from '../../../src/core/export/column-crossings.js';
import type { Point } from '../../../src/core/export/svg.js';
import { countCrossings } from './stage-crossings.js';

const LEAD = 16;

/** Columns 100 wide with 120 between them. */
function geometry(column: number[], cords: CrossingGeometry['cords']): CrossingGeometry {
  const cols = Math.max(...column) + 1;
  const left = Array.from({ length: cols }, (_, c) => c * 220);
  return { left, right: left.map((x) => x + 100), column, cords, lead: LEAD };
}

/**
 * The lines the counter means (its module comment), for the brute-force counter: each cord
 * between columns straight from the left column's edge plus the lead to the right column's edge
 * less the lead; a cord within a column up or down the lane beside it; each box with cords level
 * across its column and its leads.
 */
function modelLines(g: CrossingGeometry, y: readonly number[]): Point[][] {
  const lines: Point[][] = [];
  const tied = new Set<number>();
  for (const { from, to } of g.cords) {
    tied.add(from);
    tied.add(to);
    const [a, b] = g.column[from] <= g.column[to] ? [from, to] : [to, from];
    if (g.column[a] === g.column[b]) {
      const lane = g.right[g.column[a]] + g.lead;
      lines.push([
        { x: lane, y: y[a] },
        { x: lane, y: y[b] },
      ]);
    } else
      lines.push([
        { x: g.right[g.column[a]] + g.lead, y: y[a] },
        { x: g.left[g.column[b]] - g.lead, y: y[b] },
      ]);
  }
  for (const i of tied)
    lines.push([
      { x: g.left[g.column[i]] - g.lead, y: y[i] },
      { x: g.right[g.column[i]] + g.lead, y: y[i] },
    ]);
  return lines;
}

describe('core/export/column-crossings', () => {
  it('counts one crossing for two cords that swap order between two columns, none for parallel or shared ends', () => {
    const g = (cords: { from: number; to: number }[]): CrossingGeometry => geometry([0, 0, 1, 1], cords);
    const y = [0, 50, 0, 50];
    expect(
      countColumnCrossings(
        g([
          { from: 0, to: 3 },
          { from: 1, to: 2 },
        ]),
        y,
      ),
    ).toBe(1);
    expect(
      countColumnCrossings(
        g([
          { from: 0, to: 2 },
          { from: 1, to: 3 },
        ]),
        y,
      ),
    ).toBe(0);
    expect(
      countColumnCrossings(
        g([
          { from: 0, to: 2 },
          { from: 0, to: 3 },
        ]),
        y,
      ),
    ).toBe(0);
  });

  // In a drawing on two layers, K(m,n) has exactly C(m,2)·C(n,2) crossings whatever the orders:
  // each pair of left boxes and pair of right boxes gives two cords of which exactly one pair
  // crosses (the two-layer crossing number of the complete bipartite graph, from memory).
  it('counts C(3,2)·C(4,2) = 18 crossings for K(3,4) between two columns, in any order', () => {
    const column = [0, 0, 0, 1, 1, 1, 1];
    const cords = [0, 1, 2].flatMap((a) => [3, 4, 5, 6].map((b) => ({ from: a, to: b })));
    for (const y of [
      [0, 60, 120, 0, 60, 120, 180],
      [120, 0, 60, 180, 0, 120, 60],
    ])
      expect(countColumnCrossings(geometry(column, cords), y)).toBe(18);
  });

  it('counts a cord in the lane beside a column against the cords passing that column', () => {
    // Boxes 0 (column 0) → 3 (column 2) pass column 1 at height 50; boxes 1 and 2 of column 1 are tied by a cord.
    const g = geometry(
      [0, 1, 1, 2],
      [
        { from: 0, to: 3 },
        { from: 1, to: 2 },
      ],
    );
    expect(countColumnCrossings(g, [50, 0, 100, 50])).toBe(1);
    // Passing above both boxes, the cord misses the lane.
    expect(countColumnCrossings(g, [-50, 0, 100, -50])).toBe(0);
  });

  it("counts a latch's cords from its set and reset halves, not from its centre", () => {
    // Box 0 is a latch: its set half (10 above its centre) drives box 2 below, its reset half (10 below) box 1 above.
    const cords = [
      { from: 0, to: 2, fromDy: -10 },
      { from: 0, to: 1, fromDy: 10 },
    ];
    expect(countColumnCrossings(geometry([0, 1, 1], cords), [0, -50, 50])).toBe(1);
    expect(
      countColumnCrossings(
        geometry(
          [0, 1, 1],
          cords.map(({ from, to }) => ({ from, to })),
        ),
        [0, -50, 50],
      ),
    ).toBe(0);
  });

  it('agrees with brute-force segment intersection on random drawings (property, fixed seed)', () => {
    const arb = fc.array(fc.integer({ min: 0, max: 4 }), { minLength: 2, maxLength: 24 }).chain((column) =>
      fc.tuple(
        fc.constant(column),
        fc.uniqueArray(fc.tuple(fc.nat(column.length - 1), fc.nat(column.length - 1)), {
          maxLength: 40,
          selector: ([a, b]) => (a < b ? `${a} ${b}` : `${b} ${a}`),
        }),
        fc.shuffledSubarray(
          Array.from({ length: column.length }, (_, i) => i),
          { minLength: column.length, maxLength: column.length },
        ),
      ),
    );
    fc.assert(
      fc.property(arb, ([column, pairs, rank]) => {
        // Heights in general position: distinct, and no three cords through one point (almost surely).
        const y = rank.map((r, i) => r * 37 + Math.sqrt(i + 2));
        const g = geometry(
          column,
          pairs.filter(([a, b]) => a !== b).map(([from, to]) => ({ from, to })),
        );
        expect(countColumnCrossings(g, y)).toBe(countCrossings(modelLines(g, y)));
      }),
      { seed: 42, numRuns: 300 },
    );
  });
});
