/**
 * Cover operations by the unate recursive paradigm (Brayton et al., "Logic Minimization
 * Algorithms for VLSI Synthesis", Kluwer 1984, ch. 3): split on the most binate variable
 * until the cover is unate, where the answer is immediate. All work is on cubes; no minterm
 * is ever enumerated, so 48-variable covers are fine as long as they stay sparse.
 *
 * Every routine here reads only the input part (words 0..wi-1) of its cubes.
 */
import { type BCube, type Space, popcount, isUniverse, universe, varPos } from './bitcube.js';

/** Per-variable literal summary of a cover: which variables appear as 0 and as 1. */
interface Columns {
  zeros: number[];
  ones: number[];
}

function columns(sp: Space, t: readonly BCube[]): Columns {
  const zeros = new Array<number>(sp.wi).fill(0);
  const ones = new Array<number>(sp.wi).fill(0);
  for (const c of t)
    for (let k = 0; k < sp.wi; k++) {
      const x = c[k];
      const l = sp.low[k];
      zeros[k] |= x & ~(x >>> 1) & l; // field 01
      ones[k] |= (x >>> 1) & ~x & l; // field 10
    }
  return { zeros, ones };
}

/**
 * The variable to split on: among binate variables (or, if none, among all that carry a
 * literal) the one with most literals in the cover; ties go to the lowest index, so the
 * recursion is deterministic. Returns -1 when no variable carries a literal.
 */
export function splitVar(sp: Space, t: readonly BCube[], binateOnly: boolean): number {
  const { zeros, ones } = columns(sp, t);
  let anyBinate = false;
  const cand = new Array<number>(sp.wi);
  for (let k = 0; k < sp.wi; k++) {
    cand[k] = zeros[k] & ones[k];
    if (cand[k] !== 0) anyBinate = true;
  }
  if (!anyBinate) {
    if (binateOnly) return -1;
    for (let k = 0; k < sp.wi; k++) cand[k] = zeros[k] | ones[k];
  }
  let best = -1;
  let bestCount = -1;
  for (let k = 0; k < sp.wi; k++) {
    let mask = cand[k];
    while (mask !== 0) {
      const bit = mask & -mask;
      mask &= mask - 1;
      const both = bit | (bit << 1);
      let count = 0;
      for (const c of t) if ((c[k] & both) !== both) count++;
      if (count > bestCount) {
        bestCount = count;
        best = k * 15 + ((31 - Math.clz32(bit)) >>> 1);
      }
    }
  }
  return best;
}

/** Cubes of t meeting literal (variable i = value), with variable i freed. */
export function cofactorVar(sp: Space, t: readonly BCube[], i: number, value: 0 | 1): BCube[] {
  const [k, s] = varPos(i);
  const bit = (value === 1 ? 2 : 1) << s;
  const both = 3 << s;
  const out: BCube[] = [];
  for (const c of t) {
    const f = c[k] & both;
    if ((f & bit) === 0) continue;
    if (f === both) out.push(c);
    else {
      const r = c.slice(0, sp.wi);
      r[k] |= both;
      out.push(r);
    }
  }
  return out;
}

/** True when the cover is the constant 1 over the input space. */
export function tautology(sp: Space, t: readonly BCube[]): boolean {
  let cur = t;
  for (;;) {
    if (cur.length === 0) return false;
    for (const c of cur) if (isUniverse(sp, c)) return true;
    const { zeros, ones } = columns(sp, cur);
    // A variable that is unate in the cover can be set against its literal: the cover is a
    // tautology iff the cubes free of every unate variable are (Brayton et al. ch. 3).
    let unate = false;
    let binate = false;
    const unateMask = new Array<number>(sp.wi);
    for (let k = 0; k < sp.wi; k++) {
      const z = zeros[k];
      const o = ones[k];
      const u = (z ^ o) & (z | o);
      unateMask[k] = u | (u << 1);
      if (u !== 0) unate = true;
      if ((z & o) !== 0) binate = true;
    }
    if (!binate) return false; // unate without the universe cube
    if (unate) {
      const next: BCube[] = [];
      for (const c of cur) {
        let free = true;
        for (let k = 0; k < sp.wi; k++)
          if ((c[k] & unateMask[k]) !== unateMask[k]) {
            free = false;
            break;
          }
        if (free) next.push(c);
      }
      cur = next;
      continue;
    }
    const v = splitVar(sp, cur, true);
    return tautology(sp, cofactorVar(sp, cur, v, 1)) && tautology(sp, cofactorVar(sp, cur, v, 0));
  }
}

/**
 * True when the input cube c lies inside the union of the covers (cubes identical by
 * reference to `skip` are left out). Answered by the tautology of the cofactor.
 */
export function cubeCovered(sp: Space, t: readonly BCube[], c: BCube, skip?: BCube, t2?: readonly BCube[]): boolean {
  const cof: BCube[] = [];
  const wi = sp.wi;
  for (let pass = 0; pass < 2; pass++) {
    const list = pass === 0 ? t : t2;
    if (list === undefined) break;
    for (const d of list) {
      if (d === skip) continue;
      let meets = true;
      let whole = true;
      for (let k = 0; k < wi; k++) {
        const x = c[k] & d[k];
        const l = sp.low[k];
        if (((x | (x >>> 1)) & l) !== l) {
          meets = false;
          break;
        }
        if ((c[k] & ~d[k]) !== 0) whole = false;
      }
      if (!meets) continue;
      if (whole) return true; // d contains c
      const r = new Array<number>(wi);
      for (let k = 0; k < wi; k++) r[k] = d[k] | (~c[k] & sp.full[k]);
      cof.push(r);
    }
  }
  return tautology(sp, cof);
}

/** Complement of a cube by De Morgan: one cube per literal (fresh cubes). */
export function complementCube(sp: Space, c: BCube): BCube[] {
  const out: BCube[] = [];
  for (let k = 0; k < sp.wi; k++) {
    let lits = sp.low[k] & ~(c[k] & (c[k] >>> 1));
    while (lits !== 0) {
      const bit = lits & -lits;
      lits &= lits - 1;
      const both = bit | (bit << 1);
      const r = universe(sp);
      r[k] = (r[k] & ~both) | (both & ~c[k]);
      out.push(r);
    }
  }
  return out;
}

/** A work allowance shared by a recursion; `left` counts down. */
export interface Budget {
  left: number;
}

/**
 * Smallest cube containing the complement of the cover, or null when the cover is a
 * tautology (Brayton et al. ch. 4, the core of REDUCE). Past the budget of recursion nodes the
 * answer is the universe: a safe over-estimate (the caller then does not reduce).
 */
export function supercubeOfComplement(sp: Space, t: readonly BCube[], budget: Budget = { left: 4096 }): BCube | null {
  if (t.length === 0) return universe(sp);
  for (const c of t) if (isUniverse(sp, c)) return null;
  if (t.length === 1) {
    const c = t[0];
    let lits = 0;
    for (let k = 0; k < sp.wi; k++) lits += popcount(sp.low[k] & ~(c[k] & (c[k] >>> 1)));
    if (lits > 1) return universe(sp);
    return complementCube(sp, c)[0];
  }
  if (--budget.left < 0) return tautology(sp, t) ? null : universe(sp);
  const v = splitVar(sp, t, false);
  const s1 = supercubeOfComplement(sp, cofactorVar(sp, t, v, 1), budget);
  const s0 = supercubeOfComplement(sp, cofactorVar(sp, t, v, 0), budget);
  const [k, s] = varPos(v);
  const both = 3 << s;
  if (s1 === null && s0 === null) return null;
  if (s1 === null) {
    const r = s0!.slice(0, sp.wi);
    r[k] = (r[k] & ~both) | (1 << s);
    return r;
  }
  if (s0 === null) {
    const r = s1.slice(0, sp.wi);
    r[k] = (r[k] & ~both) | (2 << s);
    return r;
  }
  const r = new Array<number>(sp.wi);
  for (let j = 0; j < sp.wi; j++) r[j] = s1[j] | s0[j];
  return r;
}
