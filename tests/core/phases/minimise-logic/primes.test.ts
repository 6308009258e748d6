import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { makeSpace, parseInput, formatInput } from '../../../../src/core/phases/minimise-logic/bitcube.js';
import { primesOf, multiOutputPrimes } from '../../../../src/core/phases/minimise-logic/primes.js';
import { seededRandom } from '../../../../src/core/model/random.js';
import { allCubes, mintermsOf, randomMintermFunction, tables } from './brute.js';

// Reference: the definitions (W. V. Quine, "The problem of simplifying truth functions",
// American Mathematical Monthly 59(8), 1952): an implicant lies inside the function; a prime
// implicant is one no larger implicant contains. Multi-output (McCluskey's tags): a cube with
// the set S of functions it lies inside is prime when no larger cube lies inside all of S.
const contains = (a: string, b: string): boolean => [...a].every((ch, i) => ch === '-' || ch === b[i]);

function brutePrimes(n: number, allowed: Set<number>[]): Map<string, number[]> {
  const cubes = allCubes(n);
  const tag = new Map(
    cubes.map((c) => [c, allowed.map((a, j) => (mintermsOf(c).every((x) => a.has(x)) ? j : -1)).filter((j) => j >= 0)]),
  );
  const out = new Map<string, number[]>();
  for (const c of cubes) {
    const t = tag.get(c)!;
    if (t.length === 0) continue;
    const wider = cubes.some((d) => d !== c && contains(d, c) && t.every((j) => tag.get(d)!.includes(j)));
    if (!wider) out.set(c, t);
  }
  return out;
}

describe('core/phases/minimise-logic/primes', () => {
  it('single-function primes equal the prime implicants by definition', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 6 }), fc.integer({ min: 0, max: 2 ** 31 - 1 }), (n, seed) => {
        const f = randomMintermFunction(seededRandom(seed), n, 1, 0.5, 0.15);
        const sp = makeSpace(n, 1);
        const got = primesOf(
          sp,
          [...f.on[0], ...f.dc[0]].map((c) => parseInput(sp, c)),
        ).map((c) => formatInput(sp, c));
        expect(got.sort()).toEqual([...brutePrimes(n, tables(f).allowed).keys()].sort());
      }),
      { seed: 42, numRuns: 120 },
    );
  });

  it('multi-output primes and their tags equal the definition', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 4 }),
        fc.integer({ min: 2, max: 4 }),
        fc.integer({ min: 0, max: 2 ** 31 - 1 }),
        (n, m, seed) => {
          const f = randomMintermFunction(seededRandom(seed), n, m, 0.5, 0.2);
          const sp = makeSpace(n, m);
          const allowed = f.on.map((cs, j) => [...cs, ...f.dc[j]].map((c) => parseInput(sp, c)));
          const got = new Map(multiOutputPrimes(sp, allowed)!.map((p) => [formatInput(sp, p.cube), [...p.tag]]));
          expect(got).toEqual(brutePrimes(n, tables(f).allowed));
        },
      ),
      { seed: 42, numRuns: 120 },
    );
  });

  it('gives up (null) past the prime limit', () => {
    const f = randomMintermFunction(seededRandom(9), 6, 2, 0.5, 0.1);
    const sp = makeSpace(6, 2);
    const allowed = f.on.map((cs, j) => [...cs, ...f.dc[j]].map((c) => parseInput(sp, c)));
    expect(multiOutputPrimes(sp, allowed, 3)).toBeNull();
  });
});
