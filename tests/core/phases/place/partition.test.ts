import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { cutWeight, fmBipartition, type PartitionGraph } from '../../../../src/core/phases/place/partition.js';
import { seededRandom } from '../../../../src/core/model/random.js';

function randomGraph(seed: number, n: number): PartitionGraph {
  const rng = seededRandom(seed);
  const edges = Array.from({ length: 2 * n }, () => {
    const a = rng.int(n);
    return { a, b: (a + 1 + rng.int(n - 1)) % n, w: 1 + rng.int(3) };
  });
  return {
    widthM: Array.from({ length: n }, () => 0.03 + 0.06 * rng.next()),
    edges,
    fixed: Array.from({ length: n }, () => (rng.next() < 0.1 ? rng.int(2) : -1)),
  };
}

const width0 = (g: PartitionGraph, side: readonly number[]) =>
  side.reduce((s, x, v) => s + (x === 0 ? g.widthM[v] : 0), 0);

describe('core/phases/place/partition', () => {
  // Fiduccia & Mattheyses (DAC 1982): moves keep the balance; undoing back to the best prefix never loses cut.
  it('never ends with a larger cut than it starts with, keeps the balance and the fixed nodes (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1e9 }), fc.integer({ min: 4, max: 60 }), (seed, n) => {
        const g = randomGraph(seed, n);
        const total = g.widthM.reduce((s, w) => s + w, 0);
        const wide = Math.max(...g.widthM);
        const balance = { lo: total / 2 - wide, hi: total / 2 + wide };
        // A balanced start: fixed nodes on their sides, free ones to side 0 while it stays under half.
        const start = g.fixed.map((f) => (f === -1 ? 1 : f));
        let w0 = width0(g, start);
        for (let v = 0; v < n; v++)
          if (g.fixed[v] === -1 && w0 + g.widthM[v] <= total / 2) {
            start[v] = 0;
            w0 += g.widthM[v];
          }
        const startOff = w0 < balance.lo || w0 > balance.hi;
        const out = fmBipartition(g, start, balance);
        expect(out.cut).toBe(cutWeight(g, out.side));
        g.fixed.forEach((f, v) => f !== -1 && expect(out.side[v]).toBe(f));
        if (!startOff) {
          expect(out.cut).toBeLessThanOrEqual(cutWeight(g, start));
          const w = width0(g, out.side);
          expect(w).toBeGreaterThanOrEqual(balance.lo - 1e-12);
          expect(w).toBeLessThanOrEqual(balance.hi + 1e-12);
        }
      }),
      { seed: 1982, numRuns: 200 },
    );
  });

  it('separates two cliques joined by one edge, from the worst start', () => {
    const n = 12;
    const edges: { a: number; b: number; w: number }[] = [];
    for (let a = 0; a < n; a++) for (let b = a + 1; b < n; b++) if (a < 6 === b < 6) edges.push({ a, b, w: 1 });
    edges.push({ a: 5, b: 6, w: 1 });
    const g: PartitionGraph = { widthM: new Array<number>(n).fill(1), edges, fixed: new Array<number>(n).fill(-1) };
    const start = Array.from({ length: n }, (_, v) => v % 2);
    const out = fmBipartition(g, start, { lo: 6, hi: 6 + 1 });
    expect(cutWeight(g, start)).toBeGreaterThan(10);
    expect(out.cut).toBe(1);
  });
});
