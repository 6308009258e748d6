import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { makeSpace, parseInput, formatInput } from '../../../../src/core/phases/minimise-logic/bitcube.js';
import { tautology, cubeCovered, supercubeOfComplement } from '../../../../src/core/phases/minimise-logic/unate.js';
import { seededRandom } from '../../../../src/core/model/random.js';
import { mintermsOf, randomCube, truth, coverOf } from './brute.js';

// Every check compares with minterm enumeration (the definitions), not with another routine.

const coverArb = coverOf(17, 9);
const smallCoverArb = coverOf(12, 7);

describe('core/phases/minimise-logic/unate', () => {
  it('tautology agrees with enumeration', () => {
    fc.assert(
      fc.property(coverArb, ({ n, cubes }) => {
        const sp = makeSpace(n, 1);
        expect(
          tautology(
            sp,
            cubes.map((c) => parseInput(sp, c)),
          ),
        ).toBe(truth(cubes, n).every((b) => b === 1));
      }),
      { seed: 42, numRuns: 200 },
    );
  });

  it('cubeCovered agrees with enumeration', () => {
    fc.assert(
      fc.property(coverArb, fc.integer({ min: 0, max: 2 ** 31 - 1 }), ({ n, cubes }, seed) => {
        const sp = makeSpace(n, 1);
        const c = randomCube(seededRandom(seed), n, seededRandom(seed + 1).int(n + 1));
        const t = truth(cubes, n);
        const inside = mintermsOf(c).every((x) => t[x] === 1);
        expect(
          cubeCovered(
            sp,
            cubes.map((d) => parseInput(sp, d)),
            parseInput(sp, c),
          ),
        ).toBe(inside);
      }),
      { seed: 42, numRuns: 200 },
    );
  });

  it('supercubeOfComplement is the smallest cube holding the missing points', () => {
    fc.assert(
      fc.property(smallCoverArb, ({ n, cubes }) => {
        const sp = makeSpace(n, 1);
        const s = supercubeOfComplement(
          sp,
          cubes.map((c) => parseInput(sp, c)),
        );
        const on = truth(cubes, n);
        const missing = [...Array(2 ** n).keys()].filter((x) => on[x] === 0);
        if (missing.length === 0) {
          expect(s).toBeNull();
          return;
        }
        // smallest cube containing the missing minterms: per variable, fixed iff constant
        let want = '';
        for (let i = 0; i < n; i++) {
          const vals = new Set(missing.map((x) => (x >> (n - 1 - i)) & 1));
          want += vals.size === 2 ? '-' : vals.has(1) ? '1' : '0';
        }
        expect(formatInput(sp, s!)).toBe(want);
      }),
      { seed: 42, numRuns: 200 },
    );
  });
});
