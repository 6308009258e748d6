/**
 * Packed positional cubes for the minimiser: the internal form of the string cubes of
 * model/cube.ts. Positional notation as in Brayton et al., "Logic Minimization Algorithms
 * for VLSI Synthesis" (Kluwer 1984), ch. 2: each binary variable takes two bits (01 = '0',
 * 10 = '1', 11 = '-', 00 = empty), so intersection is AND and containment is a mask test.
 *
 * A multi-output cube ("characteristic-function" cube) appends the output part, one bit per
 * function: the term feeds function j when bit j is set.
 *
 * Layout: a cube is a plain number[] of `W = Wi + Wo` words, 30 bits per word so every word
 * is a small integer (V8 keeps values below 2^30 unboxed in plain arrays; measured faster to
 * allocate than typed arrays and than bigint bitsets for the short cubes we need). Words
 * 0..Wi-1 hold the inputs, 15 variables per word (variable i in word ⌊i/15⌋ at bit 2(i mod 15));
 * words Wi.. hold the output part, 30 functions per word. Input-only cubes may stop after
 * word Wi-1: every input routine reads only the first Wi words.
 */
import type { Cube as TextCube } from '../../model/cube.js';

/** A packed cube (input words, then optionally output words). */
export type BCube = number[];

const VARS_PER_WORD = 15;
const OUTS_PER_WORD = 30;
const LOW_ALL = 0x15555555; // low bit of each of 15 two-bit fields

/** The word layout for n variables and m functions. */
export interface Space {
  readonly n: number;
  readonly m: number;
  /** Input words. */
  readonly wi: number;
  /** Output words. */
  readonly wo: number;
  /** All words. */
  readonly w: number;
  /** Per input word: the low bit of every field in use. */
  readonly low: readonly number[];
  /** Per input word: both bits of every field in use (the universe). */
  readonly full: readonly number[];
  /** Per output word: bits of functions in use. */
  readonly outFull: readonly number[];
}

/** Layout for n variables and m functions. */
export function makeSpace(n: number, m: number): Space {
  const wi = Math.max(1, Math.ceil(n / VARS_PER_WORD));
  const wo = Math.max(1, Math.ceil(m / OUTS_PER_WORD));
  const low: number[] = [];
  const full: number[] = [];
  for (let k = 0; k < wi; k++) {
    const vars = Math.max(0, Math.min(VARS_PER_WORD, n - k * VARS_PER_WORD));
    const l = vars === VARS_PER_WORD ? LOW_ALL : LOW_ALL & ((1 << (2 * vars)) - 1);
    low.push(l);
    full.push(l | (l << 1));
  }
  const outFull: number[] = [];
  for (let k = 0; k < wo; k++) {
    const outs = Math.max(0, Math.min(OUTS_PER_WORD, m - k * OUTS_PER_WORD));
    outFull.push(outs === OUTS_PER_WORD ? 0x3fffffff : (1 << outs) - 1);
  }
  return { n, m, wi, wo, w: wi + wo, low, full, outFull };
}

/** Bits set in a 30-bit word. */
export function popcount(x: number): number {
  x = x - ((x >>> 1) & 0x55555555);
  x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
  return (((x + (x >>> 4)) & 0x0f0f0f0f) * 0x01010101) >>> 24;
}

// ---- conversion at the boundary ----

/** Packed input part of a text cube ('0' | '1' | '-' per variable). */
export function parseInput(sp: Space, s: TextCube, into?: BCube): BCube {
  const c = into ?? new Array<number>(sp.wi).fill(0);
  for (let k = 0; k < sp.wi; k++) c[k] = 0;
  for (let i = 0; i < sp.n; i++) {
    const ch = s.charCodeAt(i);
    const f = ch === 45 ? 3 : ch === 48 ? 1 : ch === 49 ? 2 : -1;
    if (f < 0) throw new RangeError(`cube '${s}': position ${i + 1} is not 0, 1 or -`);
    c[(i / VARS_PER_WORD) | 0] |= f << (2 * (i % VARS_PER_WORD));
  }
  return c;
}

/** Text form of the input part of a packed cube. */
export function formatInput(sp: Space, c: BCube): TextCube {
  let s = '';
  for (let i = 0; i < sp.n; i++) {
    const f = (c[(i / VARS_PER_WORD) | 0] >>> (2 * (i % VARS_PER_WORD))) & 3;
    s += f === 3 ? '-' : f === 2 ? '1' : f === 1 ? '0' : '∅';
  }
  return s;
}

/** A full cube: the given input part with the listed functions in its output part. */
export function withOutputs(sp: Space, input: BCube, outs: readonly number[]): BCube {
  const c = new Array<number>(sp.w).fill(0);
  for (let k = 0; k < sp.wi; k++) c[k] = input[k];
  for (const j of outs) c[sp.wi + ((j / OUTS_PER_WORD) | 0)] |= 1 << (j % OUTS_PER_WORD);
  return c;
}

/** Function indices in the output part of a cube, ascending. */
export function outputsOf(sp: Space, c: BCube): number[] {
  const out: number[] = [];
  for (let k = 0; k < sp.wo; k++) {
    let x = c[sp.wi + k];
    while (x !== 0) {
      const b = 31 - Math.clz32(x & -x);
      out.push(k * OUTS_PER_WORD + b);
      x &= x - 1;
    }
  }
  return out;
}

/** Does the cube feed function j? */
export function hasOutput(sp: Space, c: BCube, j: number): boolean {
  return ((c[sp.wi + ((j / OUTS_PER_WORD) | 0)] >>> (j % OUTS_PER_WORD)) & 1) === 1;
}

/** Word index and bit mask of function j in a full cube. */
export function outputBit(sp: Space, j: number): [word: number, mask: number] {
  return [sp.wi + ((j / OUTS_PER_WORD) | 0), 1 << (j % OUTS_PER_WORD)];
}

// ---- input-part operations (read words 0..wi-1 only) ----

/** The input universe (every variable free). */
export function universe(sp: Space): BCube {
  return sp.full.slice();
}

/** True when every input variable is free. */
export function isUniverse(sp: Space, c: BCube): boolean {
  for (let k = 0; k < sp.wi; k++) if (c[k] !== sp.full[k]) return false;
  return true;
}

/** True when the input parts share no minterm. */
export function inDisjoint(sp: Space, a: BCube, b: BCube): boolean {
  for (let k = 0; k < sp.wi; k++) {
    const x = a[k] & b[k];
    const l = sp.low[k];
    if (((x | (x >>> 1)) & l) !== l) return true;
  }
  return false;
}

/** Number of input variables in which the cubes conflict. */
export function inDistance(sp: Space, a: BCube, b: BCube): number {
  let d = 0;
  for (let k = 0; k < sp.wi; k++) {
    const x = a[k] & b[k];
    d += popcount(sp.low[k] & ~(x | (x >>> 1)));
  }
  return d;
}

/** True when the input part of a contains that of b. */
export function inContains(sp: Space, a: BCube, b: BCube): boolean {
  for (let k = 0; k < sp.wi; k++) if ((b[k] & ~a[k]) !== 0) return false;
  return true;
}

/** Input intersection (caller checks disjointness first when it matters). */
export function inAnd(sp: Space, a: BCube, b: BCube): BCube {
  const c = new Array<number>(sp.wi);
  for (let k = 0; k < sp.wi; k++) c[k] = a[k] & b[k];
  return c;
}

/** Smallest input cube containing both. */
export function inOr(sp: Space, a: BCube, b: BCube): BCube {
  const c = new Array<number>(sp.wi);
  for (let k = 0; k < sp.wi; k++) c[k] = a[k] | b[k];
  return c;
}

/** Same input part? */
export function inEqual(sp: Space, a: BCube, b: BCube): boolean {
  for (let k = 0; k < sp.wi; k++) if (a[k] !== b[k]) return false;
  return true;
}

/** Number of input literals (fixed variables). */
export function literals(sp: Space, c: BCube): number {
  let n = 0;
  for (let k = 0; k < sp.wi; k++) n += popcount(sp.low[k] & ~(c[k] & (c[k] >>> 1)));
  return n;
}

/** Cofactor of cube c with respect to cube p (c must meet p): c with p's literals freed. */
export function cofactor(sp: Space, c: BCube, p: BCube): BCube {
  const r = new Array<number>(sp.wi);
  for (let k = 0; k < sp.wi; k++) r[k] = c[k] | (~p[k] & sp.full[k]);
  return r;
}

/** Word and shift of input variable i. */
export function varPos(i: number): [word: number, shift: number] {
  return [(i / VARS_PER_WORD) | 0, 2 * (i % VARS_PER_WORD)];
}

// ---- full-cube operations ----

/** True when full cube a contains full cube b (inputs and outputs). */
export function contains(sp: Space, a: BCube, b: BCube): boolean {
  for (let k = 0; k < sp.w; k++) if ((b[k] & ~a[k]) !== 0) return false;
  return true;
}

/** Do the output parts meet? */
export function outMeet(sp: Space, a: BCube, b: BCube): boolean {
  for (let k = sp.wi; k < sp.w; k++) if ((a[k] & b[k]) !== 0) return true;
  return false;
}

/** Number of functions fed. */
export function outCount(sp: Space, c: BCube): number {
  let n = 0;
  for (let k = sp.wi; k < sp.w; k++) n += popcount(c[k]);
  return n;
}

/** A string key of all words, for de-duplication. */
export function key(c: BCube): string {
  return c.join(',');
}

/** Drop full cubes contained in another (single-cube containment); keeps first of equals. */
export function absorbFull(sp: Space, cubes: readonly BCube[]): BCube[] {
  const out: BCube[] = [];
  const order = cubes.map((c, i) => ({ c, i, s: literals(sp, c) - outCount(sp, c) }));
  order.sort((x, y) => x.s - y.s || x.i - y.i);
  for (const { c } of order) {
    let inside = false;
    for (const o of out)
      if (contains(sp, o, c)) {
        inside = true;
        break;
      }
    if (!inside) out.push(c);
  }
  return out;
}

/**
 * Espresso's cube weights ("mini_sort"): for each cube, the sum over its set bits of how many
 * cubes of the list share that bit. Light cubes are small and isolated; heavy ones are large
 * and crowded.
 */
export function cubeWeights(sp: Space, F: readonly BCube[]): number[] {
  const W = sp.w;
  const colCount = scratch(SLOT.weights, W * 32).fill(0, 0, W * 32);
  for (const c of F)
    for (let k = 0; k < W; k++) {
      let x = c[k];
      while (x !== 0) {
        colCount[k * 32 + 31 - Math.clz32(x & -x)]++;
        x &= x - 1;
      }
    }
  return F.map((c) => {
    let s = 0;
    for (let k = 0; k < W; k++) {
      let x = c[k];
      while (x !== 0) {
        s += colCount[k * 32 + 31 - Math.clz32(x & -x)];
        x &= x - 1;
      }
    }
    return s;
  });
}

// Scratch buffers: allocating a typed array costs far more than the short loops that use it,
// and EXPAND and friends run thousands of times per search. Each slot belongs to one routine
// that never calls itself (directly or through another user of the same slot); contents are
// not cleared between uses.
const scratchPool: Int32Array[] = [];

/** Scratch slots, one per user. */
export const SLOT = {
  rows: 0,
  act: 1,
  need: 2,
  pend: 3,
  feas: 4,
  weights: 5,
  stamp: 6,
  value: 7,
  rowStamp: 8,
  rowValue: 9,
  compZeros: 10,
  compOnes: 11,
  compLift1: 12,
  compLift0: 13,
} as const;

/** A shared Int32Array of at least `size` entries for the given slot (contents undefined). */
export function scratch(slot: number, size: number): Int32Array {
  let a = scratchPool[slot];
  if (a === undefined || a.length < size) {
    a = new Int32Array(Math.max(size, 2 * (a?.length ?? 32)));
    scratchPool[slot] = a;
  }
  return a;
}
