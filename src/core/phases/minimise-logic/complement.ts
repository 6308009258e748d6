/**
 * The complement of a cover, by COMPLEMENT of Espresso-II (R. K. Brayton, G. D. Hachtel,
 * C. T. McMullen, A. L. Sangiovanni-Vincentelli, "Logic Minimization Algorithms for VLSI
 * Synthesis", Kluwer 1984, ch. 3: the unate recursive paradigm, with the merge step):
 *
 *   comp(T) = comp(ceiling) ∪ comp(T freed of the ceiling's literals)   when every cube of T
 *             shares the literals of a common cube (the ceiling: the supercube of T);
 *   comp(T) for a unate T: split on the most frequent variable x, whose literal x^p every
 *             cube of T has or lacks; comp(T) = comp(T_x^p) ∪ x^¬p·comp(T_x^¬p), and since
 *             comp(T_x^p) ⊆ comp(T_x^¬p) its cubes need no literal of x (dropping those of the
 *             second part a first-part cube contains: single-cube containment);
 *   comp(T) otherwise: split on the most binate variable x, complement both cofactors, and
 *             merge: a cube found on both sides ("merge with identity") and a cube whose other
 *             half lies in the complement too ("lifting") lose their literal of x, every other
 *             cube takes the literal of its side.
 *
 * Lifting tests a cube either against the other side's cubes (single-cube containment) or
 * against the cover T itself (the cube's other half must miss T: exact); per merge the one
 * with fewer cube tests in the worst case is taken, as the Berkeley Espresso program does
 * (R. Rudell, UCB/ERL M86/65, 1986). A merge of c1 and c0 thus costs at most
 * (|c1| + |c0|)·|T| cube tests, and no step enumerates minterms: the complement of a dense
 * 14-variable function (some 4 000 cubes) takes well under a second.
 *
 * The complement of k cubes on disjoint variables with l literals each has l^k cubes, so the
 * caller may pass a limit: the answer is null as soon as a partial complement holds more
 * cubes than that (every cube of a binate merge survives into the result, so partial sizes
 * grow towards the final one).
 *
 * Reads only the input part (words 0..wi-1) of the cubes; returns fresh input-only cubes.
 * Deterministic: splitting variables break ties by index, and merges keep list order.
 */
import { type BCube, type Space, SLOT, isUniverse, universe, varPos, inDisjoint, inEqual, scratch } from './bitcube.js';
import { cofactorVar, complementCube } from './unate.js';

/** Complement of the cover t over the input space, or null past `limit` cubes. */
export function complement(sp: Space, t: readonly BCube[], limit = Infinity): BCube[] | null {
  const out = complementOf(sp, t, limit);
  return out === null || out.length > limit ? null : out;
}

function complementOf(sp: Space, t: readonly BCube[], limit: number): BCube[] | null {
  if (t.length === 0) return [universe(sp)];
  for (const c of t) if (isUniverse(sp, c)) return [];
  if (t.length === 1) return complementCube(sp, t[0]);
  const ceil = ceiling(sp, t);
  if (ceil !== null) {
    const rest = complementOf(sp, freed(sp, t, ceil), limit);
    if (rest === null) return null;
    const out = complementCube(sp, ceil);
    for (const c of rest) out.push(c);
    return out.length > limit ? null : out;
  }
  const pick = pickVariable(sp, t);
  const v = pick >> 1;
  if ((pick & 1) === 0) return unateSplit(sp, t, v, limit);
  const c1 = complementOf(sp, cofactorVar(sp, t, v, 1), limit);
  if (c1 === null) return null;
  const c0 = complementOf(sp, cofactorVar(sp, t, v, 0), limit);
  if (c0 === null) return null;
  const out = mergeHalves(sp, t, v, c1, c0);
  return out.length > limit ? null : out;
}

/** The supercube of t when it is not the universe (some literal common to every cube). */
function ceiling(sp: Space, t: readonly BCube[]): BCube | null {
  const s = new Array<number>(sp.wi).fill(0);
  for (const c of t) for (let k = 0; k < sp.wi; k++) s[k] |= c[k];
  return isUniverse(sp, s) ? null : s;
}

/** The cubes of t with the literals of `ceil` freed. */
function freed(sp: Space, t: readonly BCube[], ceil: BCube): BCube[] {
  const out: BCube[] = [];
  for (const c of t) {
    const r = new Array<number>(sp.wi);
    for (let k = 0; k < sp.wi; k++) r[k] = c[k] | (~ceil[k] & sp.full[k]);
    out.push(r);
  }
  return out;
}

/**
 * The splitting variable, as 2·v + 1 when v is binate: the binate variable with most literals
 * in t or, when t is unate, the variable with most literals. Ties go to the lowest index.
 * Precondition: some cube of t is not the universe.
 */
function pickVariable(sp: Space, t: readonly BCube[]): number {
  const zeros = scratch(SLOT.compZeros, sp.n).fill(0, 0, sp.n);
  const ones = scratch(SLOT.compOnes, sp.n).fill(0, 0, sp.n);
  for (const c of t)
    for (let k = 0; k < sp.wi; k++) {
      const x = c[k];
      let lits = sp.low[k] & ~(x & (x >>> 1));
      while (lits !== 0) {
        const b = 31 - Math.clz32(lits & -lits);
        lits &= lits - 1;
        if ((x >>> b) & 1) zeros[k * 15 + (b >>> 1)]++;
        else ones[k * 15 + (b >>> 1)]++;
      }
    }
  let best = -1;
  let bestCount = -1;
  let bestBinate = false;
  for (let i = 0; i < sp.n; i++) {
    const count = zeros[i] + ones[i];
    const binate = zeros[i] > 0 && ones[i] > 0;
    if ((binate && !bestBinate) || (binate === bestBinate && count > bestCount)) {
      best = i;
      bestCount = count;
      bestBinate = binate;
    }
  }
  return 2 * best + (bestBinate ? 1 : 0);
}

/**
 * Unate in x (every literal of x is x^p): comp(T) = comp(T_x^p) ∪ x^¬p·comp(T_x^¬p) where
 * T_x^¬p is the cubes free of x. The first part is inside the second, so it needs no literal
 * of x. A second-part cube inside a first-part cube is dropped (single-cube containment); when
 * that test is the longer work, the exact one replaces it: a cube whose x^p half misses T
 * needs no literal either.
 */
function unateSplit(sp: Space, t: readonly BCube[], v: number, limit: number): BCube[] | null {
  const [k, s] = varPos(v);
  const both = 3 << s;
  const free: BCube[] = [];
  let positive = false;
  for (const c of t) {
    const f = c[k] & both;
    if (f === both) free.push(c);
    else positive = f === 2 << s;
  }
  const inner = cofactorVar(sp, t, v, positive ? 1 : 0);
  const inside = complementOf(sp, inner, limit);
  if (inside === null) return null;
  const outside = complementOf(sp, free, limit);
  if (outside === null) return null;
  const lit = (positive ? 1 : 2) << s;
  const out = inside.slice();
  const onset = inside.length * outside.length > (inside.length + outside.length) * inner.length;
  for (const b of outside) {
    if (onset) {
      if (meetsAny(sp, b, inner, k, both)) b[k] = (b[k] & ~both) | lit;
    } else if (containedIn(sp, b, inside) >= 0) continue;
    else b[k] = (b[k] & ~both) | lit;
    out.push(b);
  }
  return out.length > limit ? null : out;
}

/**
 * Merge the complements of the two cofactors on x: c1 = comp(T_x), c0 = comp(T_x'). Equal
 * cubes become one cube free of x; a cube whose other half lies in the complement is lifted
 * (freed of x); the rest take the literal of their side. Every lift is decided before any
 * literal is set, since the containment test reads the cubes free of x.
 */
function mergeHalves(sp: Space, t: readonly BCube[], v: number, c1: BCube[], c0: BCube[]): BCube[] {
  const [k, s] = varPos(v);
  const both = 3 << s;
  const n1 = c1.length;
  const n0 = c0.length;
  // 0: takes its literal; 1: lifted; 2: the twin of a cube of c1 (dropped).
  const state1 = scratch(SLOT.compLift1, n1).fill(0, 0, n1);
  const state0 = scratch(SLOT.compLift0, n0).fill(0, 0, n0);
  // Espresso's choice: against the other side while that is the shorter work, else against T.
  if (n1 * n0 <= (n1 + n0) * t.length) {
    for (let i = 0; i < n1; i++) {
      const j = containedIn(sp, c1[i], c0);
      if (j < 0) continue;
      state1[i] = 1;
      if (state0[j] === 0 && inEqual(sp, c0[j], c1[i])) state0[j] = 2;
    }
    for (let j = 0; j < n0; j++) if (state0[j] === 0 && containedIn(sp, c0[j], c1) >= 0) state0[j] = 1;
  } else {
    markTwins(sp, c1, c0, state1, state0);
    for (let i = 0; i < n1; i++) if (state1[i] === 0 && !meetsAny(sp, c1[i], t, k, 1 << s)) state1[i] = 1;
    for (let j = 0; j < n0; j++) if (state0[j] === 0 && !meetsAny(sp, c0[j], t, k, 2 << s)) state0[j] = 1;
  }
  const out: BCube[] = [];
  for (let i = 0; i < n1; i++) {
    const a = c1[i];
    if (state1[i] === 0) a[k] = (a[k] & ~both) | (2 << s);
    out.push(a);
  }
  for (let j = 0; j < n0; j++) {
    const b = c0[j];
    if (state0[j] === 2) continue;
    if (state0[j] === 0) b[k] = (b[k] & ~both) | (1 << s);
    out.push(b);
  }
  return out;
}

/** Mark equal cubes of the two lists (merge with identity), by hashing the input parts. */
function markTwins(
  sp: Space,
  c1: readonly BCube[],
  c0: readonly BCube[],
  state1: Int32Array,
  state0: Int32Array,
): void {
  const byKey = new Map<string | number, number>();
  for (let j = c0.length - 1; j >= 0; j--) byKey.set(cubeKey(sp, c0[j]), j);
  for (let i = 0; i < c1.length; i++) {
    const j = byKey.get(cubeKey(sp, c1[i]));
    if (j !== undefined && state0[j] === 0) {
      state0[j] = 2;
      state1[i] = 1;
    }
  }
}

/** Index of the first cube of `list` containing c (input parts), or -1. */
function containedIn(sp: Space, c: BCube, list: readonly BCube[]): number {
  const wi = sp.wi;
  outer: for (let j = 0; j < list.length; j++) {
    const d = list[j];
    for (let k = 0; k < wi; k++) if ((c[k] & ~d[k]) !== 0) continue outer;
    return j;
  }
  return -1;
}

/** Does c meet a cube of t that allows the value of x whose field bit is `bit` (in word k)? */
function meetsAny(sp: Space, c: BCube, t: readonly BCube[], k: number, bit: number): boolean {
  for (const u of t) if ((u[k] & bit) !== 0 && !inDisjoint(sp, c, u)) return true;
  return false;
}

/** A hashable key of the input part. */
function cubeKey(sp: Space, c: BCube): string | number {
  if (sp.wi === 1) return c[0];
  let id = '';
  for (let k = 0; k < sp.wi; k++) id += c[k] + ',';
  return id;
}
