import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import {
  minimiseCover,
  minimiseSop,
  verifyCover,
  coverCost,
  coverStats,
  DEFAULT_COST,
  type MultiFunction,
  type SopCover,
} from '../../../../src/core/phases/minimise-logic/index.js';
import { seededRandom } from '../../../../src/core/model/random.js';
import { coverIsCorrect, minimumCost, randomMintermFunction, randomCube } from './brute.js';

const single = (on: string[], dc: string[], vars: number): MultiFunction => ({ vars, on: [on], dc: [dc] });
const sorted = (xs: readonly string[]): string[] => [...xs].sort();

describe('core/phases/minimise-logic/index — textbook examples', () => {
  // M. Morris Mano & M. Ciletti, Digital Design (tabulation method section): F(w,x,y,z) =
  // Σ(0,1,2,8,10,11,14,15) has the minimal sum F = w'x'y' + x'z' + wy (from memory).
  it("Mano & Ciletti tabulation example: F = Σ(0,1,2,8,10,11,14,15) → w'x'y' + x'z' + wy", () => {
    const on = [0, 1, 2, 8, 10, 11, 14, 15].map((x) => x.toString(2).padStart(4, '0'));
    for (const method of ['exact', 'heuristic', 'auto'] as const)
      expect(sorted(minimiseSop(on, [], 4, { method }))).toEqual(sorted(['000-', '-0-0', '1-1-']));
  });

  // The cyclic prime implicant chart of the worked example of Petrick's method (Wikipedia,
  // "Petrick's method"; the same chart appears in many switching-theory texts):
  // f(A,B,C) = Σ(0,1,2,5,6,7) has exactly two minimum sums, A'B' + BC' + AC and
  // A'C' + B'C + AB (from memory).
  it('Petrick cyclic chart: f = Σ(0,1,2,5,6,7) → one of its two published minimum sums', () => {
    const on = [0, 1, 2, 5, 6, 7].map((x) => x.toString(2).padStart(3, '0'));
    const answers = [sorted(['00-', '-10', '1-1']), sorted(['0-0', '-01', '11-'])];
    for (const method of ['exact', 'heuristic', 'auto'] as const)
      expect(answers).toContainEqual(sorted(minimiseSop(on, [], 3, { method })));
  });

  // Don't-cares: the Quine–McCluskey example f(A,B,C,D) = Σm(4,8,10,11,12,15) + d(9,14),
  // minimum sums of three terms and seven literals, e.g. BC'D' + AB' + AC (from memory; the
  // worked example of the Quine–McCluskey algorithm in its Wikipedia article).
  it("QM example with don't-cares: Σm(4,8,10,11,12,15) + d(9,14) → 3 terms, 7 literals", () => {
    const b = (xs: number[]): string[] => xs.map((x) => x.toString(2).padStart(4, '0'));
    const f = single(b([4, 8, 10, 11, 12, 15]), b([9, 14]), 4);
    for (const method of ['exact', 'auto'] as const) {
      const c = minimiseCover(f, { method });
      expect(coverStats(c)).toMatchObject({ terms: 3, literals: 7 });
      expect(verifyCover(f, c).ok).toBe(true);
    }
  });
});

describe('core/phases/minimise-logic/index — exact mode against brute force', () => {
  // Brute force (tests/.../brute.ts) enumerates minterms and every implicant cube; it shares
  // no code with the minimiser.
  const rnd = seededRandom(2024);
  const cases: MultiFunction[] = [];
  for (let i = 0; i < 24; i++) cases.push(randomMintermFunction(rnd, 2 + rnd.int(3), 1, 0.45, 0.15));
  for (let i = 0; i < 12; i++) cases.push(randomMintermFunction(rnd, 5, 1, 0.3, 0.1));
  for (let i = 0; i < 16; i++) cases.push(randomMintermFunction(rnd, 2 + rnd.int(2), 2 + rnd.int(2), 0.4, 0.15));
  for (let i = 0; i < 6; i++) cases.push(randomMintermFunction(rnd, 4, 2 + rnd.int(2), 0.25, 0.1));
  for (let i = 0; i < 3; i++) cases.push(randomMintermFunction(rnd, 5, 2, 0.15, 0.1));

  it('single- and multi-output functions of ≤ 5 variables: exact gives the true minimum cost', () => {
    for (const f of cases) {
      const c = minimiseCover(f, { method: 'exact' });
      expect(coverIsCorrect(f, c)).toBe(true);
      expect(coverCost(c)).toBe(minimumCost(f, DEFAULT_COST, f.vars <= 3));
    }
  });

  it('under another price (terms dear, connections free) exact still matches brute force', () => {
    const cost = { term: 10, literal: 1, connection: 0 };
    for (const f of cases.filter((g) => g.vars <= 4))
      expect(coverCost(minimiseCover(f, { method: 'exact', cost }), cost)).toBe(minimumCost(f, cost));
  });

  it('share: false gives the sum of the per-function minima', () => {
    for (const f of cases.filter((g) => g.on.length > 1)) {
      const per = f.on.reduce(
        (s, _, j) => s + minimumCost({ vars: f.vars, on: [f.on[j]], dc: [f.dc[j]] }, DEFAULT_COST),
        0,
      );
      expect(coverCost(minimiseCover(f, { method: 'exact', share: false }))).toBe(per);
    }
  });
});

/** A random multi-output function given by cubes (as the excitation phase produces). */
const cubeFunction = (maxVars: number, maxOuts: number): fc.Arbitrary<MultiFunction> =>
  fc
    .record({
      n: fc.integer({ min: 1, max: maxVars }),
      m: fc.integer({ min: 1, max: maxOuts }),
      seed: fc.integer({ min: 0, max: 2 ** 31 - 1 }),
    })
    .map(({ n, m, seed }) => {
      const rnd = seededRandom(seed);
      const list = (k: number): string[] => Array.from({ length: k }, () => randomCube(rnd, n, rnd.int(n + 1)));
      return {
        vars: n,
        on: Array.from({ length: m }, () => list(rnd.int(7))),
        dc: Array.from({ length: m }, () => list(rnd.int(3))),
      };
    });

describe('core/phases/minimise-logic/index — properties', () => {
  it('every method gives a correct cover (verifyCover and truth table agree)', () => {
    fc.assert(
      fc.property(
        cubeFunction(6, 4),
        fc.constantFrom('auto', 'heuristic', 'exact'),
        fc.boolean(),
        (f, method, share) => {
          const c = minimiseCover(f, { method, share });
          expect(verifyCover(f, c)).toEqual({ ok: true });
          expect(coverIsCorrect(f, c)).toBe(true);
        },
      ),
      { seed: 42, numRuns: 150 },
    );
  });

  it('shared covers never cost more than per-function covers, under the cost used', () => {
    const costs = [DEFAULT_COST, { term: 1, literal: 1, connection: 3 }, { term: 20, literal: 1, connection: 0 }];
    fc.assert(
      fc.property(
        cubeFunction(7, 4),
        fc.constantFrom(...costs),
        fc.constantFrom('auto', 'heuristic', 'exact'),
        (f, cost, method) => {
          const shared = coverCost(minimiseCover(f, { method, cost }), cost);
          const alone = coverCost(minimiseCover(f, { method, cost, share: false }), cost);
          expect(shared).toBeLessThanOrEqual(alone);
        },
      ),
      { seed: 42, numRuns: 80 },
    );
  });

  it('auto and exact are never worse than the heuristic', () => {
    fc.assert(
      fc.property(cubeFunction(6, 3), (f) => {
        const h = coverCost(minimiseCover(f, { method: 'heuristic' }));
        expect(coverCost(minimiseCover(f))).toBeLessThanOrEqual(h);
        expect(coverCost(minimiseCover(f, { method: 'exact' }))).toBeLessThanOrEqual(h);
      }),
      { seed: 42, numRuns: 60 },
    );
  });

  it('30–48 variable sparse functions finish and verify (no minterm enumeration)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 30, max: 48 }),
        fc.integer({ min: 1, max: 3 }),
        fc.integer({ min: 0, max: 2 ** 31 - 1 }),
        (n, m, seed) => {
          const rnd = seededRandom(seed);
          const list = (k: number, lo: number): string[] =>
            Array.from({ length: k }, () => randomCube(rnd, n, lo + rnd.int(5)));
          const f: MultiFunction = {
            vars: n,
            on: Array.from({ length: m }, () => list(2 + rnd.int(8), 2)),
            dc: Array.from({ length: m }, () => list(rnd.int(4), 3)),
          };
          const c = minimiseCover(f);
          expect(verifyCover(f, c)).toEqual({ ok: true });
          expect(c.terms.length).toBeLessThanOrEqual(f.on.reduce((s, l) => s + l.length, 0));
        },
      ),
      { seed: 42, numRuns: 25 },
    );
  });

  it('is deterministic: the same input gives the same cover', () => {
    fc.assert(
      fc.property(cubeFunction(7, 3), (f) => {
        expect(minimiseCover(f)).toEqual(minimiseCover(f));
      }),
      { seed: 42, numRuns: 30 },
    );
  });
});

describe('core/phases/minimise-logic/index — interface', () => {
  it("an on-set point that is also listed as don't-care must still be covered", () => {
    const f = single(['11'], ['1-'], 2);
    const c = minimiseCover(f);
    expect(verifyCover(f, c).ok).toBe(true);
    expect(c.terms.map((t) => t.cube)).toEqual(['1-']);
  });

  it('empty on-set gives no terms; a full on-set gives the universe', () => {
    expect(minimiseCover({ vars: 3, on: [[], ['---']], dc: [['1--'], []] }).terms).toEqual([
      { cube: '---', outputs: [1] },
    ]);
    expect(minimiseSop([], [], 0)).toEqual([]);
    expect(minimiseSop([''], [], 0)).toEqual(['']);
  });

  it('shares a term between two functions when that is cheaper', () => {
    // f0 = ab + c, f1 = ab + d: the term ab feeds both.
    const f: MultiFunction = {
      vars: 4,
      on: [
        ['11--', '--1-'],
        ['11--', '---1'],
      ],
      dc: [[], []],
    };
    const c = minimiseCover(f);
    expect(c.terms).toContainEqual({ cube: '11--', outputs: [0, 1] });
    expect(coverCost(c)).toBe(4 + 2 + 2 + (4 + 1 + 1) * 2);
    expect(minimiseCover(f, { share: false }).terms.filter((t) => t.cube === '11--')).toHaveLength(2);
  });

  it('coverCost and coverStats count terms, literals and connections', () => {
    const c: SopCover = {
      vars: 3,
      functions: 2,
      terms: [
        { cube: '1-0', outputs: [0, 1] },
        { cube: '--1', outputs: [1] },
      ],
    };
    expect(coverStats(c)).toEqual({ terms: 2, literals: 3, connections: 3 });
    expect(coverCost(c)).toBe(2 * 4 + 3 + 3);
    expect(coverCost(c, { term: 1, literal: 0, connection: 0 })).toBe(2);
  });

  it('rejects malformed functions with a RangeError', () => {
    expect(() => minimiseCover({ vars: 3, on: [['10']], dc: [[]] })).toThrow(RangeError);
    expect(() => minimiseCover({ vars: 2, on: [['1x']], dc: [[]] })).toThrow(RangeError);
    expect(() => minimiseCover({ vars: 2, on: [['1-']], dc: [] })).toThrow(RangeError);
  });
});
