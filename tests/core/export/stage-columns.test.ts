import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { stageColumns, type ColumnBox } from '../../../src/core/export/stage-columns.js';

const box = (id: string, rank: number, position: number, bit?: number, height = 40): ColumnBox => ({
  id,
  width: 100,
  height,
  rank,
  position,
  bit,
});

const overlap = (
  a: { x: number; y: number; width: number; height: number },
  b: { x: number; y: number; width: number; height: number },
): boolean => Math.abs(a.x - b.x) * 2 < a.width + b.width && Math.abs(a.y - b.y) * 2 < a.height + b.height;

describe('core/export/stage-columns', () => {
  it('puts one column per rank, left to right, and a bit band round its latches and transfer', () => {
    const boxes = [
      box('lever', 0, 0),
      box('term', 2, 1),
      box('m0', 3, 2, 0),
      box('tr0', 4, 3, 0),
      box('s0', 5, 4, 0),
      box('m1', 3, 5, 1),
      box('s1', 5, 6, 1),
    ];
    const l = stageColumns(boxes, [
      { from: 'lever', to: 'term' },
      { from: 'term', to: 'm1' },
    ]);
    const x = (id: string): number => l.centre.get(id)?.x ?? NaN;
    const y = (id: string): number => l.centre.get(id)?.y ?? NaN;
    expect(x('lever')).toBeLessThan(x('term'));
    expect(x('term')).toBeLessThan(x('m0'));
    expect(x('m0')).toBe(x('m1'));
    expect(x('tr0')).toBeLessThan(x('s0'));
    // Bands in bit order; the term gate sits level with the latch it drives, the lever with the term.
    expect(l.bands.map((b) => b.bit)).toEqual([0, 1]);
    expect(y('m0')).toBeLessThan(y('m1'));
    expect(y('term')).toBe(y('m1'));
    expect(y('lever')).toBe(y('term'));
    for (const b of l.bands)
      for (const id of b.bit === 0 ? ['m0', 'tr0', 's0'] : ['m1', 's1']) {
        expect(x(id) - 50).toBeGreaterThanOrEqual(b.x);
        expect(x(id) + 50).toBeLessThanOrEqual(b.x + b.width);
        expect(y(id) - 20).toBeGreaterThanOrEqual(b.y);
        expect(y(id) + 20).toBeLessThanOrEqual(b.y + b.height);
      }
  });

  it("routes a cord from its driver's right side to its target's left side, or beside the column when both share it", () => {
    const l = stageColumns([box('a', 0, 0), box('b', 1, 1), box('c', 1, 2)], [{ from: 'a', to: 'b' }]);
    const a = l.centre.get('a') ?? { x: 0, y: 0 };
    const b = l.centre.get('b') ?? { x: 0, y: 0 };
    const c = l.centre.get('c') ?? { x: 0, y: 0 };
    const fwd = l.route('a', 'b', a.y, b.y);
    expect(fwd[0]).toEqual({ x: a.x + 50, y: a.y });
    expect(fwd[fwd.length - 1]).toEqual({ x: b.x - 50, y: b.y });
    const same = l.route('b', 'c', b.y, c.y);
    expect(same[0]).toEqual({ x: b.x + 50, y: b.y });
    expect(same[same.length - 1]).toEqual({ x: c.x + 50, y: c.y });
    expect(Math.min(...same.map((p) => p.x))).toBeGreaterThanOrEqual(b.x + 50);
  });

  it('places every box, keeps boxes apart and ranks left to right (property, fixed seed)', () => {
    const arb = fc
      .array(
        fc.record({
          rank: fc.integer({ min: 0, max: 7 }),
          bit: fc.option(fc.integer({ min: 0, max: 3 }), { nil: undefined }),
          height: fc.integer({ min: 20, max: 80 }),
        }),
        { minLength: 1, maxLength: 60 },
      )
      .chain((specs) =>
        fc.tuple(
          fc.constant(specs),
          fc.array(fc.tuple(fc.nat(specs.length - 1), fc.nat(specs.length - 1)), { maxLength: 120 }),
        ),
      );
    fc.assert(
      fc.property(arb, ([specs, pairs]) => {
        const boxes = specs.map((s, i) => box(`p${i}`, s.rank, i, s.bit, s.height));
        const l = stageColumns(
          boxes,
          pairs.map(([f, t]) => ({ from: `p${f}`, to: `p${t}` })),
        );
        const placed = boxes.map((b) => ({ ...b, ...(l.centre.get(b.id) ?? { x: NaN, y: NaN }) }));
        for (const p of placed) {
          expect(Number.isFinite(p.x) && Number.isFinite(p.y)).toBe(true);
        }
        for (let i = 0; i < placed.length; i++)
          for (let j = i + 1; j < placed.length; j++) {
            expect(overlap(placed[i], placed[j]), `${placed[i].id} × ${placed[j].id}`).toBe(false);
            if (placed[i].rank < placed[j].rank) expect(placed[i].x).toBeLessThan(placed[j].x);
          }
        for (const [f, t] of pairs) {
          const r = l.route(`p${f}`, `p${t}`, 0, 0);
          expect(r.length).toBeGreaterThanOrEqual(2);
        }
      }),
      { seed: 42, numRuns: 200 },
    );
  });
});
