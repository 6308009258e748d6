import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { verifyCover } from '../../../../src/core/phases/minimise-logic/verify.js';
import type { MultiFunction, SopCover } from '../../../../src/core/phases/minimise-logic/types.js';
import { seededRandom } from '../../../../src/core/model/random.js';
import { coverIsCorrect, randomCube } from './brute.js';

describe('core/phases/minimise-logic/verify', () => {
  const f: MultiFunction = { vars: 3, on: [['11-'], ['0-0']], dc: [['1-1'], []] };

  it("accepts a correct cover, including terms over don't-cares", () => {
    const c: SopCover = {
      vars: 3,
      functions: 2,
      terms: [
        { cube: '1-1', outputs: [0] },
        { cube: '11-', outputs: [0] },
        { cube: '0-0', outputs: [1] },
      ],
    };
    expect(verifyCover(f, c)).toEqual({ ok: true });
  });

  it('names the function and the on-set cube left uncovered', () => {
    const c: SopCover = {
      vars: 3,
      functions: 2,
      terms: [
        { cube: '110', outputs: [0] },
        { cube: '0-0', outputs: [1] },
      ],
    };
    expect(verifyCover(f, c)).toEqual({ ok: false, problem: 'function 0: on-set cube 11- is not covered' });
  });

  it('names the term that reaches the off-set', () => {
    const c: SopCover = {
      vars: 3,
      functions: 2,
      terms: [
        { cube: '1--', outputs: [0] },
        { cube: '0-0', outputs: [1] },
      ],
    };
    expect(verifyCover(f, c)).toEqual({ ok: false, problem: 'function 0: term 1-- reaches the off-set' });
  });

  it('rejects shape errors', () => {
    expect(verifyCover(f, { vars: 4, functions: 2, terms: [] }).ok).toBe(false);
    expect(verifyCover(f, { vars: 3, functions: 1, terms: [] }).ok).toBe(false);
    expect(verifyCover(f, { vars: 3, functions: 2, terms: [{ cube: '1-', outputs: [0] }] }).ok).toBe(false);
    expect(verifyCover(f, { vars: 3, functions: 2, terms: [{ cube: '1-1', outputs: [2] }] }).ok).toBe(false);
  });

  it('agrees with the truth table on random covers (enumeration reference)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 7 }),
        fc.integer({ min: 1, max: 3 }),
        fc.integer({ min: 0, max: 2 ** 31 - 1 }),
        (n, m, seed) => {
          const rnd = seededRandom(seed);
          const list = (k: number): string[] => Array.from({ length: k }, () => randomCube(rnd, n, rnd.int(n + 1)));
          const g: MultiFunction = {
            vars: n,
            on: Array.from({ length: m }, () => list(rnd.int(4))),
            dc: Array.from({ length: m }, () => list(rnd.int(3))),
          };
          const terms = Array.from({ length: rnd.int(6) }, () => ({
            cube: randomCube(rnd, n, rnd.int(n + 1)),
            outputs: [...Array(m).keys()].filter(() => rnd.next() < 0.6),
          }));
          const c: SopCover = { vars: n, functions: m, terms };
          expect(verifyCover(g, c).ok).toBe(coverIsCorrect(g, c));
        },
      ),
      { seed: 42, numRuns: 400 },
    );
  });
});
