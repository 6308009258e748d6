import { describe, it, expect } from 'vitest';
import { espresso as referenceEspresso } from 'espresso-iisojs';
import { minimiseSop, verifyCover } from '../../../../src/core/phases/minimise-logic/index.js';
import { seededRandom, type Random } from '../../../../src/core/model/random.js';
import { literalCount, subtract } from '../../../../src/core/model/cube.js';
import { randomCube, bitsOf, truth } from './brute.js';

// Reference: the npm package espresso-iisojs 1.0.8, an independent Espresso-II implementation
// (single-output). Its README: a literal is (variable << 1) | 1 when positive and
// (variable << 1) when negative; a cube is an array of literals.
const toLiterals = (c: string): number[] => {
  const out: number[] = [];
  for (let i = 0; i < c.length; i++) if (c[i] !== '-') out.push((i << 1) | (c[i] === '1' ? 1 : 0));
  return out;
};
const fromLiterals = (lits: readonly number[], n: number): string => {
  const a = new Array<string>(n).fill('-');
  for (const l of lits) a[l >> 1] = l & 1 ? '1' : '0';
  return a.join('');
};

interface Case {
  readonly n: number;
  readonly on: string[];
  readonly dc: string[];
}

/** On-set as a few random cubes (as excitation rows come), don't-cares as cubes off it. */
function cubeCase(rnd: Random): Case {
  const n = 3 + rnd.int(8);
  const on = Array.from({ length: 2 + rnd.int(12) }, () => randomCube(rnd, n, 1 + rnd.int(n)));
  const dc = subtract(
    Array.from({ length: rnd.int(5) }, () => randomCube(rnd, n, 1 + rnd.int(n))),
    on,
  );
  return { n, on, dc };
}

/** On-set and don't-cares as random minterms (harder: many primes). */
function mintermCase(rnd: Random): Case {
  const n = 4 + rnd.int(5);
  const pOn = 0.15 + 0.4 * rnd.next();
  const on: string[] = [];
  const dc: string[] = [];
  for (let x = 0; x < 2 ** n; x++) {
    const r = rnd.next();
    if (r < pOn) on.push(bitsOf(x, n));
    else if (r < pOn + 0.1) dc.push(bitsOf(x, n));
  }
  return { n, on, dc };
}

describe('core/phases/minimise-logic/espresso — against espresso-iisojs (Espresso-II reference)', () => {
  const rnd = seededRandom(20240917);
  const cases = [
    ...Array.from({ length: 170 }, () => cubeCase(rnd)),
    ...Array.from({ length: 50 }, () => mintermCase(rnd)),
  ];
  // The reference minimises terms first, then literals; price ours the same way.
  const lexicographic = { term: 1000, literal: 1, connection: 0 };

  it(`${cases.length} random single-output functions of 3–10 variables: never more terms, never more literals at equal terms`, () => {
    let ourTerms = 0;
    let theirTerms = 0;
    for (const { n, on, dc } of cases) {
      const ours = minimiseSop(on, dc, n, { cost: lexicographic });
      const theirs = referenceEspresso(on.map(toLiterals), dc.map(toLiterals)).map((l) => fromLiterals(l, n));
      const f = { vars: n, on: [on], dc: [dc] };
      const asCover = (cs: string[]) => ({ vars: n, functions: 1, terms: cs.map((cube) => ({ cube, outputs: [0] })) });
      expect(verifyCover(f, asCover(ours))).toEqual({ ok: true });
      expect(verifyCover(f, asCover(theirs))).toEqual({ ok: true });
      expect(ours.length).toBeLessThanOrEqual(theirs.length);
      if (ours.length === theirs.length) {
        const lits = (cs: string[]): number => cs.reduce((s, c) => s + literalCount(c), 0);
        expect(lits(ours)).toBeLessThanOrEqual(lits(theirs));
      }
      ourTerms += ours.length;
      theirTerms += theirs.length;
    }
    expect(ourTerms).toBeLessThanOrEqual(theirTerms);
  });

  it('the heuristic alone: fewer terms in total, and within two terms on every case', () => {
    let ourTerms = 0;
    let theirTerms = 0;
    for (const { n, on, dc } of cases) {
      const ours = minimiseSop(on, dc, n, { method: 'heuristic', cost: lexicographic });
      const theirs = referenceEspresso(on.map(toLiterals), dc.map(toLiterals));
      expect(ours.length).toBeLessThanOrEqual(theirs.length + 2);
      ourTerms += ours.length;
      theirTerms += theirs.length;
    }
    expect(ourTerms).toBeLessThan(theirTerms);
  });
});

/** Many long cubes (a sparse on-set of 11–14 variables), don't-care cubes off it. */
function longCubeCase(rnd: Random, n: number): Case {
  const long = (): string => randomCube(rnd, n, n - 4 + rnd.int(4));
  const on = Array.from({ length: 150 + rnd.int(100) }, long);
  const dc = subtract(Array.from({ length: 30 + rnd.int(30) }, long), on);
  return { n, on, dc };
}

/** Each point on with probability 0.3, don't-care with 0.1 (the workload of the benchmark). */
function denseCase(rnd: Random, n: number): Case {
  const on: string[] = [];
  const dc: string[] = [];
  for (let x = 0; x < 2 ** n; x++) {
    const r = rnd.next();
    if (r < 0.3) on.push(bitsOf(x, n));
    else if (r < 0.4) dc.push(bitsOf(x, n));
  }
  return { n, on, dc };
}

describe('core/phases/minimise-logic/espresso — against espresso-iisojs by truth table, up to 14 variables', () => {
  // Reference: espresso-iisojs 1.0.8 (an independent Espresso-II). Both covers are expanded
  // into truth tables and compared point by point with the function and with each other.
  const rnd = seededRandom(1401);
  const cases = [...[6, 7, 8].map((n) => denseCase(rnd, n)), ...[11, 12, 13, 14].map((n) => longCubeCase(rnd, n))];
  const lexicographic = { term: 1000, literal: 1, connection: 0 };

  it.each(cases.map((c) => [c.n, c] as const))(
    '%i variables: the same function on every care point, never more terms',
    (n, { on, dc }) => {
      const ours = minimiseSop(on, dc, n, { cost: lexicographic });
      const theirs = referenceEspresso(on.map(toLiterals), dc.map(toLiterals)).map((l) => fromLiterals(l, n));
      const f = truth(on, n);
      const care = truth(dc, n);
      const a = truth(ours, n);
      const b = truth(theirs, n);
      let differ = 0;
      for (let x = 0; x < 2 ** n; x++) {
        const want = f[x] === 1 ? 1 : care[x] === 1 ? -1 : 0; // -1: either
        if (want >= 0 && (a[x] !== want || b[x] !== want)) differ++;
      }
      expect(differ).toBe(0);
      expect(ours.length).toBeLessThanOrEqual(theirs.length);
    },
  );
});
