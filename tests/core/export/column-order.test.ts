import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { countColumnCrossings } from '../../../src/core/export/column-crossings.js';
import { packColumn, reduceCrossings, type OrderProblem } from '../../../src/core/export/column-order.js';

/** A problem of boxes 20 high in columns 100 wide, 120 apart, free boxes from height 0, none pinned unless told. */
function problem(
  column: number[],
  cords: [number, number][],
  pinned: boolean[] = column.map(() => false),
): OrderProblem {
  const cols = Math.max(...column) + 1;
  const left = Array.from({ length: cols }, (_, c) => c * 220);
  return {
    left,
    right: left.map((x) => x + 100),
    column,
    cords: cords.map(([from, to]) => ({ from, to })),
    lead: 16,
    height: column.map(() => 20),
    pinned,
    top: left.map(() => 0),
    gap: 10,
  };
}

/** Order of some boxes by height. */
const orderOf = (ids: number[], y: ArrayLike<number>): number[] => [...ids].sort((a, b) => y[a] - y[b]);

describe('core/export/column-order', () => {
  // Isotonic regression by pooling adjacent violators (Ayer, Brunk, Ewing, Reid & Silverman 1955):
  // with no heights or gaps, [1, 3, 2, 4] pools the violating pair 3, 2 into its mean, 2.5 (worked by hand).
  it('packs a column by isotonic regression: violators pooled to their mean, clipped at the top', () => {
    expect(packColumn([1, 3, 2, 4], [0, 0, 0, 0], -Infinity, 0)).toEqual([1, 2.5, 2.5, 4]);
    expect(packColumn([1, 3, 2, 4], [0, 0, 0, 0], 2, 0)).toEqual([2, 2.5, 2.5, 4]);
    // Two boxes 10 high that want one place straddle it, 2 apart.
    expect(packColumn([0, 0], [10, 10], -Infinity, 2)).toEqual([-6, 6]);
    // Boxes that fit where they want stay there.
    expect(packColumn([0, 50, 100], [20, 20, 20], 0, 10)).toEqual([0, 50, 100]);
  });

  it('untangles a matching between two columns to no crossings', () => {
    // Boxes 0–5 in column 0 at heights 0, 30, …; boxes 6–11 in column 1 likewise; box i tied to 6 + π(i).
    const pi = [3, 0, 5, 1, 4, 2];
    const p = problem(
      [...pi.map(() => 0), ...pi.map(() => 1)],
      pi.map((t, i) => [i, 6 + t]),
    );
    const start = [...pi, ...pi].map((_, i) => (i % 6) * 30 + 10);
    const r = reduceCrossings(p, start);
    // Inversions of π: 3>0,1,2; 5>1,4,2; 4>2 → 7 (counted by hand).
    expect(r.before).toBe(7);
    expect(r.after).toBe(0);
    expect(countColumnCrossings(p, r.y)).toBe(0);
  });

  it('draws a tree laid out by depth without crossings (a tree always has such a drawing)', () => {
    // A complete binary tree of depth 3, children listed in a scrambled order down each column.
    const parent = [-1, 0, 0, 1, 1, 2, 2, 3, 3, 4, 4, 5, 5, 6, 6];
    const depth = parent.map((_, i) => {
      let d = 0;
      for (let k = i; parent[k] >= 0; k = parent[k]) d++;
      return d;
    });
    const p = problem(
      depth,
      parent.flatMap((q, i): [number, number][] => (q < 0 ? [] : [[q, i]])),
    );
    const scrambled = [0, 1, 0, 3, 0, 2, 1, 5, 1, 7, 3, 0, 6, 2, 4];
    const start = scrambled.map((k) => k * 30 + 10);
    const r = reduceCrossings(p, start);
    expect(r.before).toBeGreaterThan(0);
    expect(r.after).toBe(0);
  });

  it('cannot go below the two-layer count of K(3,4), C(3,2)·C(4,2) = 18 (from memory), and keeps it', () => {
    const column = [0, 0, 0, 1, 1, 1, 1];
    const p = problem(
      column,
      [0, 1, 2].flatMap((a) => [3, 4, 5, 6].map((b): [number, number] => [a, b])),
    );
    const r = reduceCrossings(p, [0, 30, 60, 0, 30, 60, 90]);
    expect(r.before).toBe(18);
    expect(r.after).toBe(18);
  });

  it('never counts more crossings than at the start, keeps pinned boxes and packs the rest apart (property, fixed seed)', () => {
    const arb = fc
      .array(fc.record({ column: fc.integer({ min: 0, max: 5 }), pinned: fc.boolean() }), {
        minLength: 2,
        maxLength: 40,
      })
      .chain((boxes) =>
        fc.tuple(
          fc.constant(boxes),
          fc.array(fc.tuple(fc.nat(boxes.length - 1), fc.nat(boxes.length - 1)), { maxLength: 80 }),
        ),
      );
    fc.assert(
      fc.property(arb, ([boxes, pairs]) => {
        const column = boxes.map((b) => b.column);
        // Pinned boxes stand at the top of their column, the others below them (as the bands do).
        const p = problem(
          column,
          pairs.filter(([a, b]) => a !== b),
          boxes.map((b) => b.pinned),
        );
        const start = new Array<number>(boxes.length);
        const cursor = new Map<number, number>();
        for (const pinnedFirst of [true, false])
          boxes.forEach((b, i) => {
            if (b.pinned !== pinnedFirst) return;
            const at = cursor.get(b.column) ?? 0;
            start[i] = at + 10;
            cursor.set(b.column, at + 30);
          });
        const top = p.left.map((_, c) =>
          boxes.reduce((t, b, i) => (b.column === c && b.pinned ? Math.max(t, start[i] + 20) : t), 0),
        );
        const q = { ...p, top };
        const r = reduceCrossings(q, start);
        expect(r.before).toBe(countColumnCrossings(q, start));
        expect(r.after).toBeLessThanOrEqual(r.before);
        expect(countColumnCrossings(q, r.y)).toBe(r.after);
        boxes.forEach((b, i) => {
          if (b.pinned) expect(r.y[i]).toBe(start[i]);
          else expect(r.y[i] - 10).toBeGreaterThanOrEqual(top[b.column] - 1e-9);
        });
        for (let c = 0; c < p.left.length; c++) {
          const ys = orderOf(
            boxes.flatMap((b, i) => (b.column === c ? [i] : [])),
            r.y,
          ).map((i) => r.y[i]);
          for (let k = 1; k < ys.length; k++) expect(ys[k] - ys[k - 1]).toBeGreaterThanOrEqual(20 + 10 - 1e-9);
        }
      }),
      { seed: 42, numRuns: 200 },
    );
  });
});
