import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { coverContains, type Cube } from '../../../src/core/model/cube.js';
import { parseGuard } from '../../../src/core/forms/expr.js';
import { coverExpr, cubeExpr, num, widen, wrapExpr, wrapJoined } from '../../../src/core/export/readable.js';

const VARS = ['a', 'b', 'c', 'd'];
const cube = fc.array(fc.constantFrom('0', '1', '-'), { minLength: 4, maxLength: 4 }).map((cs) => cs.join(''));

describe('core/export/readable', () => {
  it('writes cubes and covers in the machine notation (`!` over `&` over `|`)', () => {
    expect(cubeExpr('1-0-', VARS)).toBe('a & !c');
    expect(cubeExpr('----', VARS)).toBe('1');
    expect(coverExpr([], VARS)).toBe('0');
    expect(coverExpr(['----'], VARS)).toBe('1');
    expect(coverExpr(['1---', '01--'], VARS, { widen: false })).toBe('a | !a & b');
  });

  // The "expand" step of Espresso-II (Brayton et al. 1984, ch. 4): drop a literal while the cube stays in the cover.
  it('widens cubes inside their cover for display: 1-, 01 reads a | b', () => {
    expect(coverExpr(['1---', '01--'], VARS)).toBe('a | b');
    expect(widen(['11--', '10--'])).toEqual(['1---']);
    // Combinations that never occur may be used: with a & b never, `a & !b` reads `a`.
    expect(coverExpr(['10--'], VARS, { dc: ['11--'] })).toBe('a');
  });

  it('reads back through the notation parser to the same function (property, seeded)', () => {
    fc.assert(
      fc.property(fc.array(cube, { maxLength: 6 }), fc.array(cube, { maxLength: 2 }), (cover, dc) => {
        const text = coverExpr(cover, VARS, { dc });
        const parsed = parseGuard(text, VARS, {});
        expect(parsed.diagnostics).toEqual([]);
        const back = parsed.guard?.cubes as readonly Cube[];
        // Same function, up to the never-occurring combinations.
        expect(coverContains(back, cover)).toBe(true);
        expect(coverContains([...cover, ...dc], back)).toBe(true);
      }),
      { seed: 42, numRuns: 300 },
    );
  });

  it('formats numbers and wraps long expressions', () => {
    expect(num(2.3456)).toBe('2.35');
    expect(num(Infinity)).toBe('∞');
    expect(num(3, 1)).toBe('3');
    expect(wrapExpr('aaaa | bbbb | cccc', 12)).toEqual(['aaaa | bbbb |', 'cccc']);
    expect(wrapJoined(['x=1', 'y=0', 'z=1'], ', ', 8)).toEqual(['x=1, y=0,', 'z=1']);
  });
});
