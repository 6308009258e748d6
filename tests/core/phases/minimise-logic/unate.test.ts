import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { makeSpace, parseInput, formatInput } from '../../../../src/core/phases/minimise-logic/bitcube.js';
import {
  tautology, complement, cubeCovered, supercubeOfComplement, compact, subtractCover,
} from '../../../../src/core/phases/minimise-logic/unate.js';
import { seededRandom } from '../../../../src/core/model/random.js';
import { mintermsOf, randomCube } from './brute.js';

// Every check compares with minterm enumeration (the definitions), not with another routine.
const pointsOf = (cubes: readonly string[]): Set<number> => new Set(cubes.flatMap(mintermsOf));

const coverArb = fc
  .record({ n: fc.integer({ min: 1, max: 18 }), k: fc.integer({ min: 0, max: 9 }), seed: fc.integer({ min: 0, max: 2 ** 31 - 1 }) })
  .map(({ n, k, seed }) => {
    const rnd = seededRandom(seed);
    // Few literals make tautologies and overlaps likely; 18 variables span two packed words.
    return { n, cubes: Array.from({ length: k }, () => randomCube(rnd, n, rnd.int(Math.min(n, 4) + 1))) };
  });

describe('core/phases/minimise-logic/unate', () => {
  it('tautology agrees with enumeration', () => {
    fc.assert(
      fc.property(coverArb, ({ n, cubes }) => {
        const sp = makeSpace(n, 1);
        expect(tautology(sp, cubes.map((c) => parseInput(sp, c)))).toBe(pointsOf(cubes).size === 2 ** n);
      }),
      { seed: 42, numRuns: 300 },
    );
  });

  it('complement is exactly the missing points', () => {
    fc.assert(
      fc.property(coverArb, ({ n, cubes }) => {
        const sp = makeSpace(n, 1);
        const comp = complement(sp, cubes.map((c) => parseInput(sp, c)))!.map((c) => formatInput(sp, c));
        const on = pointsOf(cubes);
        const off = pointsOf(comp);
        for (let x = 0; x < 2 ** n; x++) expect(off.has(x)).toBe(!on.has(x));
      }),
      { seed: 42, numRuns: 200 },
    );
  });

  it('complement gives up (null) past its budget', () => {
    // Ten cubes on disjoint variables: the complement has 2^10 cubes.
    const n = 20;
    const cubes = Array.from({ length: 10 }, (_, i) => '-'.repeat(2 * i) + '11' + '-'.repeat(n - 2 * i - 2));
    const sp = makeSpace(n, 1);
    expect(complement(sp, cubes.map((c) => parseInput(sp, c)), { left: 100 })).toBeNull();
    expect(complement(sp, cubes.map((c) => parseInput(sp, c)))!.length).toBeGreaterThanOrEqual(1024);
  });

  it('cubeCovered agrees with enumeration', () => {
    fc.assert(
      fc.property(coverArb, fc.integer({ min: 0, max: 2 ** 31 - 1 }), ({ n, cubes }, seed) => {
        const sp = makeSpace(n, 1);
        const c = randomCube(seededRandom(seed), n, seededRandom(seed + 1).int(n + 1));
        const inside = mintermsOf(c).every((x) => pointsOf(cubes).has(x));
        expect(cubeCovered(sp, cubes.map((d) => parseInput(sp, d)), parseInput(sp, c))).toBe(inside);
      }),
      { seed: 42, numRuns: 200 },
    );
  });

  it('supercubeOfComplement is the smallest cube holding the missing points', () => {
    fc.assert(
      fc.property(coverArb.filter(({ n }) => n <= 12), ({ n, cubes }) => {
        const sp = makeSpace(n, 1);
        const s = supercubeOfComplement(sp, cubes.map((c) => parseInput(sp, c)));
        const on = pointsOf(cubes);
        const missing = [...Array(2 ** n).keys()].filter((x) => !on.has(x));
        if (missing.length === 0) return expect(s).toBeNull();
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

  it('compact keeps the points and never adds cubes', () => {
    fc.assert(
      fc.property(coverArb, ({ n, cubes }) => {
        const sp = makeSpace(n, 1);
        const out = compact(sp, cubes.map((c) => parseInput(sp, c))).map((c) => formatInput(sp, c));
        expect(pointsOf(out)).toEqual(pointsOf(cubes));
        expect(out.length).toBeLessThanOrEqual(cubes.length);
      }),
      { seed: 42, numRuns: 200 },
    );
  });

  it('compact merges minterms: Σ(0..7) over 3 variables is one cube', () => {
    const sp = makeSpace(3, 1);
    const all = ['000', '001', '010', '011', '100', '101', '110', '111'].map((c) => parseInput(sp, c));
    expect(compact(sp, all).map((c) => formatInput(sp, c))).toEqual(['---']);
  });

  it('subtractCover leaves exactly the difference, or null past its limit', () => {
    fc.assert(
      fc.property(coverArb, coverArb, ({ n, cubes }, other) => {
        const sp = makeSpace(n, 1);
        const minus = other.cubes.map((c) => (c + '-'.repeat(n)).slice(0, n));
        const out = subtractCover(sp, cubes.map((c) => parseInput(sp, c)), minus.map((c) => parseInput(sp, c)))!;
        const want = new Set([...pointsOf(cubes)].filter((x) => !pointsOf(minus).has(x)));
        expect(pointsOf(out.map((c) => formatInput(sp, c)))).toEqual(want);
      }),
      { seed: 42, numRuns: 150 },
    );
    const sp = makeSpace(6, 1);
    expect(subtractCover(sp, [parseInput(sp, '------')], [parseInput(sp, '111111')], 3)).toBeNull();
  });
});
