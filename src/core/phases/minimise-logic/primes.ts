/**
 * Prime implicants, on cubes.
 *
 * Single function: the recursive Shannon method (Brayton et al., "Logic Minimization
 * Algorithms for VLSI Synthesis", Kluwer 1984, ch. 3): the primes of a unate cover are its
 * cubes after single-cube containment; otherwise split on a binate variable x and keep the
 * maximal cubes among x·P(f_x), x'·P(f_x') and the pairwise intersections P(f_x) ∩ P(f_x').
 *
 * Several functions: the multi-output primes of the tagged form of the Quine–McCluskey method
 * (for one function: E. J. McCluskey, "Minimization of Boolean functions", Bell System
 * Technical Journal 35(6), 1956): a cube c with tag S (every function c implies) is prime when
 * no larger cube implies all of S. Every prime of f_S = ∏_{j∈S} f_j is the intersection of a prime of
 * f_{S∖k} with a prime of f_k, so we close the single-function primes under that step,
 * keeping only primes as generators.
 *
 * Postcondition: every returned cube is prime; `tag` lists every function it implies.
 */
import { type BCube, type Space, inAnd, inContains, inDisjoint, isUniverse, key, varPos } from './bitcube.js';
import { cofactorVar, splitVar } from './unate.js';
import { absorbCubes } from './tidy.js';

/** Input-part single-cube containment (maximal cubes, deterministic order), input words only. */
function absorbInputs(sp: Space, t: readonly BCube[]): BCube[] {
  return absorbCubes(sp, t).map((c) => (c.length === sp.wi ? c : c.slice(0, sp.wi)));
}

/** All prime implicants of the function whose on ∪ dc set is the cover t. */
export function primesOf(sp: Space, t: readonly BCube[]): BCube[] {
  if (t.length === 0) return [];
  for (const c of t) if (isUniverse(sp, c)) return [c.slice(0, sp.wi)];
  const v = splitVar(sp, t, true);
  if (v < 0) return absorbInputs(sp, t);
  const p1 = primesOf(sp, cofactorVar(sp, t, v, 1));
  const p0 = primesOf(sp, cofactorVar(sp, t, v, 0));
  const [k, s] = varPos(v);
  const both = 3 << s;
  const cand: BCube[] = [];
  for (const a of p1) for (const b of p0) if (!inDisjoint(sp, a, b)) cand.push(inAnd(sp, a, b));
  for (const a of p1) {
    const r = a.slice(0, sp.wi);
    r[k] = (r[k] & ~both) | (2 << s);
    cand.push(r);
  }
  for (const b of p0) {
    const r = b.slice(0, sp.wi);
    r[k] = (r[k] & ~both) | (1 << s);
    cand.push(r);
  }
  return absorbInputs(sp, cand);
}

/** A multi-output prime: input cube and the functions it implies (bit j = function j). */
export interface TaggedPrime {
  readonly cube: BCube;
  readonly tag: readonly number[];
}

/**
 * Multi-output primes of the functions whose on ∪ dc covers are `allowed[j]`, or null when
 * there are more than `limit` of them (the caller then falls back to the heuristic).
 */
export function multiOutputPrimes(
  sp: Space,
  allowed: readonly (readonly BCube[])[],
  limit = Infinity,
): TaggedPrime[] | null {
  const m = allowed.length;
  const single = allowed.map((t) => primesOf(sp, t));
  if (m === 1) return single[0].length > limit ? null : single[0].map((c) => ({ cube: c, tag: [0] }));
  const implies = (c: BCube, j: number): boolean => {
    for (const p of single[j]) if (inContains(sp, p, c)) return true;
    return false;
  };
  const tagOf = (c: BCube): number[] => {
    const t: number[] = [];
    for (let j = 0; j < m; j++) if (implies(c, j)) t.push(j);
    return t;
  };
  // c is prime for its tag when freeing any one literal leaves some tagged function.
  const isPrime = (c: BCube, tag: readonly number[]): boolean => {
    for (let k = 0; k < sp.wi; k++) {
      let litBits = sp.low[k] & ~(c[k] & (c[k] >>> 1));
      while (litBits !== 0) {
        const bit = litBits & -litBits;
        litBits &= litBits - 1;
        const wider = c.slice(0, sp.wi);
        wider[k] |= bit | (bit << 1);
        if (tag.every((j) => implies(wider, j))) return false;
      }
    }
    return true;
  };
  const seen = new Map<string | number, TaggedPrime>();
  const rejected = new Set<string | number>();
  const queue: TaggedPrime[] = [];
  const add = (c: BCube): boolean => {
    const id = sp.wi === 1 ? c[0] : key(c);
    if (seen.has(id) || rejected.has(id)) return true;
    const tag = tagOf(c);
    if (!isPrime(c, tag)) {
      rejected.add(id);
      return true;
    }
    const p = { cube: c, tag };
    seen.set(id, p);
    queue.push(p);
    return seen.size <= limit;
  };
  for (let j = 0; j < m; j++) for (const p of single[j]) if (!add(p)) return null;
  for (let qi = 0; qi < queue.length; qi++) {
    const { cube, tag } = queue[qi];
    for (let k = 0; k < m; k++) {
      if (tag.includes(k)) continue;
      for (const q of single[k]) {
        if (inDisjoint(sp, cube, q) || inContains(sp, q, cube)) continue;
        if (!add(inAnd(sp, cube, q))) return null;
      }
    }
  }
  return queue;
}
