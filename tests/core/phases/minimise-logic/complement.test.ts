import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { makeSpace, parseInput, formatInput } from '../../../../src/core/phases/minimise-logic/bitcube.js';
import { complement } from '../../../../src/core/phases/minimise-logic/complement.js';
import { seededRandom } from '../../../../src/core/model/random.js';
import { bitsOf, coverOf, randomCube, truth } from './brute.js';

// Every check compares with minterm enumeration (the definition of the complement: exactly the
// points no cube covers), not with another routine of the minimiser.

/** The complement as text cubes; fails the test on null. */
function textComplement(n: number, cubes: readonly string[], limit?: number): string[] {
  const sp = makeSpace(n, 1);
  const out = complement(
    sp,
    cubes.map((c) => parseInput(sp, c)),
    limit,
  );
  expect(out).not.toBeNull();
  return out!.map((c) => formatInput(sp, c));
}

/** Exactly the missing points, and no empty cube. */
function expectExact(n: number, cubes: readonly string[], comp: readonly string[]): void {
  for (const c of comp) expect(c).not.toContain('∅');
  const on = truth(cubes, n);
  const off = truth(comp, n);
  for (let x = 0; x < 2 ** n; x++) if (off[x] !== 1 - on[x]) expect(`${bitsOf(x, n)}: ${off[x]}`).toBe(1 - on[x]);
}

/** Random covers of a given style, up to 10 variables. */
const styled = fc
  .record({
    n: fc.integer({ min: 1, max: 10 }),
    style: fc.constantFrom('few literals', 'many literals', 'minterms', 'positive unate', 'shared literal'),
    density: fc.double({ min: 0.05, max: 0.7, noNaN: true }),
    seed: fc.integer({ min: 0, max: 2 ** 31 - 1 }),
  })
  .map(({ n, style, density, seed }) => {
    const rnd = seededRandom(seed);
    let cubes: string[] = [];
    if (style === 'minterms') {
      for (let x = 0; x < 2 ** n; x++) if (rnd.next() < density) cubes.push(bitsOf(x, n));
    } else if (style === 'many literals') {
      // A few long cubes: the complement is far longer than the cover.
      const k = 2 + rnd.int(5);
      cubes = Array.from({ length: k }, () => randomCube(rnd, n, Math.ceil(n / 2) + rnd.int(Math.floor(n / 2) + 1)));
    } else {
      const k = 1 + rnd.int(4 * n);
      cubes = Array.from({ length: k }, () => randomCube(rnd, n, 1 + rnd.int(Math.min(n, 5))));
      if (style === 'positive unate') cubes = cubes.map((c) => c.replaceAll('0', '1'));
      if (style === 'shared literal') {
        // Every cube keeps the literal x0 = 1: the cover factors through a common cube.
        cubes = cubes.map((c) => '1' + c.slice(1));
      }
    }
    return { n, style, cubes };
  });

describe('core/phases/minimise-logic/complement', () => {
  it('is exactly the missing points, on covers with few literals (n ≤ 10)', () => {
    fc.assert(
      fc.property(coverOf(10, 9), ({ n, cubes }) => expectExact(n, cubes, textComplement(n, cubes))),
      { seed: 42, numRuns: 250 },
    );
  });

  it('is exactly the missing points on minterm, unate and common-literal covers (n ≤ 10)', () => {
    fc.assert(
      fc.property(styled, ({ n, cubes }) => expectExact(n, cubes, textComplement(n, cubes))),
      { seed: 1984, numRuns: 250 },
    );
  });

  it('of nothing is the universe; of the universe is nothing; of one cube is De Morgan', () => {
    expect(textComplement(3, [])).toEqual(['---']);
    expect(textComplement(3, ['---', '1-0'])).toEqual([]);
    expect(textComplement(3, ['1-0']).sort()).toEqual(['--1', '0--']);
    expect(textComplement(0, [])).toEqual(['']);
    expect(textComplement(0, [''])).toEqual([]);
  });

  it('a unate cover gets its prime complement: x·y + z → (x′ + y′)·z′', () => {
    // The complement of a unate function is unate, and its primes are found by the unate
    // recursion (Brayton et al. 1984, ch. 3): here x′z′ and y′z′ (worked by hand).
    expect(textComplement(3, ['11-', '--1']).sort()).toEqual(['-00', '0-0']);
  });

  it('stays exact on 17 variables (two words) and on a dense 12-variable cover', () => {
    const rnd = seededRandom(7);
    const wide = Array.from({ length: 6 }, () => randomCube(rnd, 17, 3));
    expectExact(17, wide, textComplement(17, wide));
    const dense: string[] = [];
    for (let x = 0; x < 2 ** 12; x++) if (rnd.next() < 0.4) dense.push(bitsOf(x, 12));
    expectExact(12, dense, textComplement(12, dense));
  });

  it('stays exact where the complement is far longer than the cover (lifting tested against the cover)', () => {
    // Five 2-literal cubes on disjoint variables (unate: 2^5 cubes in the complement), and
    // the same with x0·x1 + x0′·x1′ in front (binate in x0 and x1).
    const unate = ['11--------', '--11------', '----11----', '------11--', '--------11'];
    const binate = ['00--------', ...unate];
    expect(textComplement(10, unate)).toHaveLength(32);
    for (const cubes of [unate, binate]) expectExact(10, cubes, textComplement(10, cubes));
  });

  it('gives up (null) past its limit, and not before', () => {
    // Ten cubes on disjoint variables: the complement has 2^10 cubes.
    const n = 20;
    const cubes = Array.from({ length: 10 }, (_, i) => '-'.repeat(2 * i) + '11' + '-'.repeat(n - 2 * i - 2));
    const sp = makeSpace(n, 1);
    const packed = (): number[][] => cubes.map((c) => parseInput(sp, c));
    expect(complement(sp, packed(), 100)).toBeNull();
    expect(complement(sp, packed(), 1023)).toBeNull();
    expect(complement(sp, packed(), 1024)!.length).toBe(1024);
    expect(complement(sp, packed())!.length).toBe(1024);
  });

  it('is deterministic', () => {
    fc.assert(
      fc.property(styled, ({ n, cubes }) => {
        expect(textComplement(n, cubes)).toEqual(textComplement(n, cubes));
      }),
      { seed: 7, numRuns: 50 },
    );
  });
});
