import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  assignmentClasses,
  canonicalKey,
  cubeSymmetries,
  fixing,
  publishedClassCount,
} from '../../../../src/core/phases/encode/symmetry.js';

const popcount = (x: number): number => x.toString(2).replace(/0/g, '').length;
const range = (k: number): number[] => Array.from({ length: k }, (_, i) => i);

function countClasses(n: number, bits: number): number {
  let c = 0;
  for (const _ of assignmentClasses(n, range(2 ** bits), cubeSymmetries(bits))) c++;
  return c;
}

/** Orbits counted the slow way: every injective assignment, keyed by its smallest image. */
function bruteOrbits(n: number, bits: number, g = cubeSymmetries(bits), codes = range(2 ** bits)): number {
  const keys = new Set<string>();
  const cur: number[] = [];
  const go = (): void => {
    if (cur.length === n) {
      let best = '';
      for (const m of g) {
        const img = cur.map((x) => m.table[x].toString(36)).join(',');
        if (best === '' || img < best) best = img;
      }
      keys.add(best);
      return;
    }
    for (const x of codes)
      if (!cur.includes(x)) {
        cur.push(x);
        go();
        cur.pop();
      }
  };
  go();
  return keys.size;
}

describe('core/phases/encode/symmetry', () => {
  it('builds the 2^b·b! symmetries of the b-cube, each a Hamming-distance-preserving bijection', () => {
    for (let b = 0; b <= 4; b++) {
      const g = cubeSymmetries(b);
      expect(g).toHaveLength(2 ** b * [1, 1, 2, 6, 24][b]);
      expect(new Set(g.map((m) => m.table.join())).size).toBe(g.length);
      let broken = 0;
      for (const m of g)
        for (let x = 0; x < 2 ** b; x++)
          for (let y = 0; y < 2 ** b; y++) if (popcount(m.table[x] ^ m.table[y]) !== popcount(x ^ y)) broken++;
      expect(broken).toBe(0);
    }
  });

  // McCluskey & Unger, "A note on the number of internal variable assignments for sequential
  // switching circuits", IRE Trans. Electronic Computers EC-8 (1959): (2^b − 1)! / ((2^b − n)! · b!)
  // distinct assignments at the minimum b; 4 states in 2 bits → 3, 5 states in 3 bits → 140
  // (also tabulated in De Micheli, Synthesis and Optimization of Digital Circuits, 1994).
  it('enumerates as many classes as McCluskey & Unger count (4/2 → 3, 5/3 → 140)', () => {
    expect(publishedClassCount(4, 2)).toBe(3);
    expect(publishedClassCount(5, 3)).toBe(140);
    expect(countClasses(4, 2)).toBe(3);
    expect(countClasses(5, 3)).toBe(140);
  });

  it('matches the formula for every n at the minimum b up to 9 states', () => {
    for (let n = 2; n <= 9; n++) {
      const b = Math.ceil(Math.log2(n));
      if (n === 9) {
        // 9 states in 4 bits: 10,810,800 classes by the formula; too many to list in a test.
        expect(publishedClassCount(n, b)).toBe(10_810_800);
        continue;
      }
      expect(countClasses(n, b), `${n} states`).toBe(publishedClassCount(n, b));
    }
  });

  it('gives one assignment per orbit with spare codes too (brute force over all assignments)', () => {
    // Off the minimum the formula no longer applies; compare with the orbits themselves.
    for (const [n, b] of [
      [2, 2],
      [2, 3],
      [3, 3],
      [4, 3],
      [3, 4],
    ])
      expect(countClasses(n, b), `${n}/${b}`).toBe(bruteOrbits(n, b));
    expect(countClasses(2, 2)).toBe(2); // adjacent or diagonal
  });

  it("respects pins: classes under the pins' stabiliser match brute force", () => {
    // 3 bits, code 0 pinned: the stabiliser is the 3! bit permutations.
    const g = fixing(cubeSymmetries(3), [0]);
    expect(g).toHaveLength(6);
    const nonzero = range(8).filter((x) => x !== 0);
    let c = 0;
    for (const _ of assignmentClasses(2, nonzero, g)) c++;
    expect(c).toBe(bruteOrbits(2, 3, g, nonzero));
    // By hand: an ordered pair of distinct nonzero codes up to bit permutation is fixed by
    // (bits in x only, in y only, in both) = (p, q, r) with p + q + r ≤ 3, x, y ≠ 0, x ≠ y:
    // r = 0: (1,1) (1,2) (2,1); r = 1: (1,0) (0,1) (1,1) (2,0) (0,2); r = 2: (1,0) (0,1).
    expect(c).toBe(10);
    let d = 0;
    for (const _ of assignmentClasses(3, nonzero, g)) d++;
    expect(d).toBe(bruteOrbits(3, 3, g, nonzero));
  });

  it('canonical keys are equal exactly for assignments in one orbit (fast-check, seed 42)', () => {
    const g = cubeSymmetries(3);
    fc.assert(
      fc.property(
        fc.uniqueArray(fc.integer({ min: 0, max: 7 }), { minLength: 1, maxLength: 8 }),
        fc.integer({ min: 0, max: g.length - 1 }),
        (a, k) => {
          const img = a.map((x) => g[k].table[x]);
          expect(canonicalKey(img, g)).toBe(canonicalKey(a, g));
        },
      ),
      { seed: 42, numRuns: 300 },
    );
    expect(canonicalKey([0, 1], g)).not.toBe(canonicalKey([0, 3], g));
  });

  it('lists an assignment of 4096 states without a deep call stack (12 bits: identity alone)', () => {
    // A recursive enumeration overflowed the stack at this depth; the explicit stack does not.
    const first = assignmentClasses(4096, range(4096), cubeSymmetries(12)).next();
    expect(first.done).toBe(false);
    expect(first.value).toEqual(range(4096));
  });
});
