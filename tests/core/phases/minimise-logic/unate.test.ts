import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { makeSpace, parseInput, formatInput } from '../../../../src/core/phases/minimise-logic/bitcube.js';
import {
  tautology, complement, cubeCovered, supercubeOfComplement, compact, subtractCover,
} from '../../../../src/core/phases/minimise-logic/unate.js';
import { seededRandom } from '../../../../src/core/model/random.js';
import { mintermsOf, randomCube } from './brute.js';

// Every check compares with minterm enumeration (the definitions), not with another routine.

/** Truth table of a cover: one byte per minterm (variable 0 is the most significant bit). */
function truth(cubes: readonly string[], n: number): Uint8Array {
  const t = new Uint8Array(2 ** n);
  for (const c of cubes) {
    let care = 0;
    let val = 0;
    for (let i = 0; i < n; i++) {
      const bit = 2 ** (n - 1 - i);
      if (c[i] !== '-') { care += bit; if (c[i] === '1') val += bit; }
    }
    for (let x = 0; x < t.length; x++) if ((x & care) === val) t[x] = 1;
  }
  return t;
}

/** Random covers; up to 17 variables so that the packed cubes span two words. */
const coverOf = (maxVars: number, maxCubes: number) =>
  fc
    .record({ n: fc.integer({ min: 1, max: maxVars }), k: fc.integer({ min: 0, max: maxCubes }), seed: fc.integer({ min: 0, max: 2 ** 31 - 1 }) })
    .map(({ n, k, seed }) => {
      const rnd = seededRandom(seed);
      // Few literals make tautologies and overlaps likely.
      return { n, cubes: Array.from({ length: k }, () => randomCube(rnd, n, rnd.int(Math.min(n, 4) + 1))) };
    });
const coverArb = coverOf(17, 9);
const smallCoverArb = coverOf(12, 7);

describe('core/phases/minimise-logic/unate', () => {
  it('tautology agrees with enumeration', () => {
    fc.assert(
      fc.property(coverArb, ({ n, cubes }) => {
        const sp = makeSpace(n, 1);
        expect(tautology(sp, cubes.map((c) => parseInput(sp, c)))).toBe(truth(cubes, n).every((b) => b === 1));
      }),
      { seed: 42, numRuns: 200 },
    );
  });

  it('complement is exactly the missing points', () => {
    fc.assert(
      fc.property(smallCoverArb, ({ n, cubes }) => {
        const sp = makeSpace(n, 1);
        const comp = complement(sp, cubes.map((c) => parseInput(sp, c)))!.map((c) => formatInput(sp, c));
        const on = truth(cubes, n);
        const off = truth(comp, n);
        for (let x = 0; x < 2 ** n; x++) expect(off[x]).toBe(1 - on[x]);
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
        const t = truth(cubes, n);
        const inside = mintermsOf(c).every((x) => t[x] === 1);
        expect(cubeCovered(sp, cubes.map((d) => parseInput(sp, d)), parseInput(sp, c))).toBe(inside);
      }),
      { seed: 42, numRuns: 200 },
    );
  });

  it('supercubeOfComplement is the smallest cube holding the missing points', () => {
    fc.assert(
      fc.property(smallCoverArb, ({ n, cubes }) => {
        const sp = makeSpace(n, 1);
        const s = supercubeOfComplement(sp, cubes.map((c) => parseInput(sp, c)));
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

  it('compact keeps the points and never adds cubes', () => {
    fc.assert(
      fc.property(coverArb, ({ n, cubes }) => {
        const sp = makeSpace(n, 1);
        const out = compact(sp, cubes.map((c) => parseInput(sp, c))).map((c) => formatInput(sp, c));
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
        const out = subtractCover(sp, cubes.map((c) => parseInput(sp, c)), minus.map((c) => parseInput(sp, c)))!;
        const a = truth(cubes, n);
        const b = truth(minus, n);
        expect(truth(out.map((c) => formatInput(sp, c)), n)).toEqual(a.map((x, i) => x & (1 - b[i])));
      }),
      { seed: 42, numRuns: 150 },
    );
    const sp = makeSpace(6, 1);
    expect(subtractCover(sp, [parseInput(sp, '------')], [parseInput(sp, '111111')], 3)).toBeNull();
  });
});
