import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { makeSpace, parseInput, formatInput } from '../../../../src/core/phases/minimise-logic/bitcube.js';
import { compact, subtractCover } from '../../../../src/core/phases/minimise-logic/tidy.js';
import { coverOf, truth } from './brute.js';

// Every check compares truth tables (minterm enumeration, the definitions).
const coverArb = coverOf(17, 9);
const smallCoverArb = coverOf(12, 7);

describe('core/phases/minimise-logic/tidy', () => {
  it('compact keeps the points and never adds cubes', () => {
    fc.assert(
      fc.property(coverArb, ({ n, cubes }) => {
        const sp = makeSpace(n, 1);
        const out = compact(
          sp,
          cubes.map((c) => parseInput(sp, c)),
        ).map((c) => formatInput(sp, c));
        expect(truth(out, n)).toEqual(truth(cubes, n));
        expect(out.length).toBeLessThanOrEqual(cubes.length);
      }),
      { seed: 42, numRuns: 60 },
    );
  });

  it('compact merges minterms: Σ(0..7) over 3 variables is one cube', () => {
    const sp = makeSpace(3, 1);
    const all = ['000', '001', '010', '011', '100', '101', '110', '111'].map((c) => parseInput(sp, c));
    expect(compact(sp, all).map((c) => formatInput(sp, c))).toEqual(['---']);
  });

  it('subtractCover leaves exactly the difference, or null past its limit', () => {
    fc.assert(
      fc.property(smallCoverArb, smallCoverArb, ({ n, cubes }, other) => {
        const sp = makeSpace(n, 1);
        const minus = other.cubes.map((c) => (c + '-'.repeat(n)).slice(0, n));
        const out = subtractCover(
          sp,
          cubes.map((c) => parseInput(sp, c)),
          minus.map((c) => parseInput(sp, c)),
        )!;
        const a = truth(cubes, n);
        const b = truth(minus, n);
        expect(
          truth(
            out.map((c) => formatInput(sp, c)),
            n,
          ),
        ).toEqual(a.map((x, i) => x & (1 - b[i])));
      }),
      { seed: 42, numRuns: 150 },
    );
    const sp = makeSpace(6, 1);
    expect(subtractCover(sp, [parseInput(sp, '------')], [parseInput(sp, '111111')], 3)).toBeNull();
  });
});
