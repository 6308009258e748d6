/**
 * Brute-force references for the minimiser's tests, written from the definitions only
 * (minterm enumeration, no shared code with the minimiser): truth tables, implicants, prime
 * implicants and minimum-cost covers of small multi-output functions.
 */
import type { MultiFunction, SopCover, CoverCost } from '../../../../src/core/phases/minimise-logic/index.js';
import fc from 'fast-check';
import { seededRandom, type Random } from '../../../../src/core/model/random.js';

/** Minterm index → '0'/'1' string, variable 0 first. */
export function bitsOf(x: number, n: number): string {
  let s = '';
  for (let i = 0; i < n; i++) s += (x >> (n - 1 - i)) & 1 ? '1' : '0';
  return s;
}

/** Minterms of a cube string. */
export function mintermsOf(c: string): number[] {
  let out = [0];
  for (const ch of c) out = out.flatMap((p) => (ch === '-' ? [p * 2, p * 2 + 1] : [p * 2 + (ch === '1' ? 1 : 0)]));
  return out;
}

/** Every cube over n variables. */
export function allCubes(n: number): string[] {
  let out = [''];
  for (let i = 0; i < n; i++) out = out.flatMap((p) => [p + '0', p + '1', p + '-']);
  return out;
}

/** Per function: the on-set and the allowed set (on ∪ dc), as minterm sets. */
export function tables(f: MultiFunction): { on: Set<number>[]; allowed: Set<number>[] } {
  const on = f.on.map((cs) => new Set(cs.flatMap(mintermsOf)));
  const allowed = f.on.map((cs, j) => new Set([...cs, ...f.dc[j]].flatMap(mintermsOf)));
  return { on, allowed };
}

/** Does the cover realise the function (by truth table)? */
export function coverIsCorrect(f: MultiFunction, c: SopCover): boolean {
  const { on, allowed } = tables(f);
  for (let j = 0; j < f.on.length; j++) {
    const got = new Set(c.terms.filter((t) => t.outputs.includes(j)).flatMap((t) => mintermsOf(t.cube)));
    for (const x of on[j]) if (!got.has(x)) return false;
    for (const x of got) if (!allowed[j].has(x)) return false;
  }
  return true;
}

/** An item of a cover: a cube feeding a set of functions. */
interface Item {
  readonly cube: string;
  readonly outs: readonly number[];
  readonly cost: number;
  readonly points: readonly number[];
}

/**
 * Minimum cost of any cover, by exhaustive search over items (cube, set of functions fed).
 * With `allImplicants` every implicant cube is a candidate; otherwise only prime implicants of
 * the products of the functions (a cheapest cover exists among them: widening a term to a
 * prime of the functions it feeds adds no literal and no connection).
 */
export function minimumCost(f: MultiFunction, cost: CoverCost, allImplicants = false): number {
  const n = f.vars;
  const m = f.on.length;
  const { on, allowed } = tables(f);
  const size = 2 ** n;
  const pointId = (j: number, x: number): number => j * size + x;
  const cubes = allCubes(n).map((c) => ({ c, ms: mintermsOf(c), lits: [...c].filter((ch) => ch !== '-').length }));
  // implied[k] = functions cube k lies inside
  const implied = cubes.map(({ ms }) => {
    const t: number[] = [];
    for (let j = 0; j < m; j++) if (ms.every((x) => allowed[j].has(x))) t.push(j);
    return t;
  });
  const contains = (a: string, b: string): boolean => [...a].every((ch, i) => ch === '-' || ch === b[i]);
  const items: Item[] = [];
  cubes.forEach(({ c, ms, lits }, k) => {
    const tag = implied[k].filter((j) => ms.some((x) => on[j].has(x)));
    if (tag.length === 0) return;
    for (let mask = 1; mask < 1 << tag.length; mask++) {
      const outs = tag.filter((_, q) => mask & (1 << q));
      if (!allImplicants) {
        // prime for these functions: no strictly larger cube implies all of them
        const larger = cubes.some(
          (d, k2) => k2 !== k && d.c !== c && contains(d.c, c) && outs.every((j) => implied[k2].includes(j)),
        );
        if (larger) continue;
      }
      const points = outs.flatMap((j) => ms.filter((x) => on[j].has(x)).map((x) => pointId(j, x)));
      items.push({ cube: c, outs, cost: cost.term + cost.literal * lits + cost.connection * outs.length, points });
    }
  });
  const required: number[] = [];
  for (let j = 0; j < m; j++) for (const x of on[j]) required.push(pointId(j, x));
  const byPoint = new Map<number, Item[]>();
  for (const it of items) for (const p of it.points) byPoint.set(p, [...(byPoint.get(p) ?? []), it]);
  for (const l of byPoint.values()) l.sort((a, b) => a.cost / a.points.length - b.cost / b.points.length);
  let best = Infinity;
  const covered = new Map<number, number>();
  const dfs = (cost: number): void => {
    if (cost >= best) return;
    const open = required.find((p) => !covered.get(p));
    if (open === undefined) {
      best = cost;
      return;
    }
    for (const it of byPoint.get(open) ?? []) {
      for (const p of it.points) covered.set(p, (covered.get(p) ?? 0) + 1);
      dfs(cost + it.cost);
      for (const p of it.points) covered.set(p, covered.get(p)! - 1);
    }
  };
  dfs(0);
  return required.length === 0 ? 0 : best;
}

/** A random function given by minterms: each point on, don't-care or off. */
export function randomMintermFunction(rnd: Random, n: number, m: number, pOn: number, pDc: number): MultiFunction {
  const on: string[][] = [];
  const dc: string[][] = [];
  for (let j = 0; j < m; j++) {
    const a: string[] = [];
    const b: string[] = [];
    for (let x = 0; x < 2 ** n; x++) {
      const r = rnd.next();
      if (r < pOn) a.push(bitsOf(x, n));
      else if (r < pOn + pDc) b.push(bitsOf(x, n));
    }
    on.push(a);
    dc.push(b);
  }
  return { vars: n, on, dc };
}

/** A random cube over n variables with exactly `lits` literals. */
export function randomCube(rnd: Random, n: number, lits: number): string {
  const a = new Array<string>(n).fill('-');
  const idx = [...Array(n).keys()];
  for (let i = 0; i < lits; i++) {
    const k = i + rnd.int(n - i);
    [idx[i], idx[k]] = [idx[k], idx[i]];
    a[idx[i]] = rnd.next() < 0.5 ? '0' : '1';
  }
  return a.join('');
}

/** Truth table of a cover: one byte per minterm (variable 0 is the most significant bit). */
export function truth(cubes: readonly string[], n: number): Uint8Array {
  const t = new Uint8Array(2 ** n);
  for (const c of cubes) {
    let care = 0;
    let val = 0;
    for (let i = 0; i < n; i++) {
      const bit = 2 ** (n - 1 - i);
      if (c[i] !== '-') {
        care += bit;
        if (c[i] === '1') val += bit;
      }
    }
    for (let x = 0; x < t.length; x++) if ((x & care) === val) t[x] = 1;
  }
  return t;
}

/** Random covers; up to 17 variables so that the packed cubes span two words. */
export const coverOf = (maxVars: number, maxCubes: number) =>
  fc
    .record({
      n: fc.integer({ min: 1, max: maxVars }),
      k: fc.integer({ min: 0, max: maxCubes }),
      seed: fc.integer({ min: 0, max: 2 ** 31 - 1 }),
    })
    .map(({ n, k, seed }) => {
      const rnd = seededRandom(seed);
      // Few literals make tautologies and overlaps likely.
      return { n, cubes: Array.from({ length: k }, () => randomCube(rnd, n, rnd.int(Math.min(n, 4) + 1))) };
    });
