/**
 * EXPAND without an off-set, for functions whose complement would be too large to build
 * (sparse functions of many variables: the complement of k independent cubes of l literals
 * has l^k cubes). A raise is accepted when the grown cube still lies in on_j ∪ dc_j for every
 * function j it feeds, a cube-in-cover test answered by tautology (Brayton et al., "Logic
 * Minimization Algorithms for VLSI Synthesis", Kluwer 1984, ch. 3).
 *
 * Order: first grow towards the other cubes of the cover, nearest first (so that they become
 * covered), then free the remaining literals one by one in variable order, then add the
 * functions the input part already implies. Since a larger cube is never easier to contain,
 * one pass leaves a prime.
 *
 * Precondition: c lies in on_j ∪ dc_j for each j it feeds. Postcondition: the result too, and
 * no single allowed bit can be raised.
 */
import { type BCube, type Space, outputsOf, popcount } from './bitcube.js';
import { cubeCovered } from './unate.js';

/** Grow c inside the allowed sets, covering candidates where possible. */
export function expandWithin(
  sp: Space,
  c0: BCube,
  allowed: readonly (readonly BCube[])[],
  cands: readonly BCube[],
  allow: readonly number[],
): BCube {
  const W = sp.w;
  let c = c0.slice();
  const inside = (x: BCube): boolean => {
    for (const j of outputsOf(sp, x)) if (!cubeCovered(sp, allowed[j], x)) return false;
    return true;
  };
  // Towards the candidates, fewest raised bits first.
  const order = cands
    .map((d, i) => {
      let bits = 0;
      let ok = true;
      for (let k = 0; k < W; k++) {
        const need = d[k] & ~c[k];
        if ((need & ~allow[k]) !== 0) ok = false;
        bits += popcount(need);
      }
      return { i, bits, ok };
    })
    .filter((x) => x.ok && x.bits > 0)
    .sort((a, b) => a.bits - b.bits || a.i - b.i);
  for (const { i } of order) {
    const d = cands[i];
    let grows = false;
    const s = new Array<number>(W);
    for (let k = 0; k < W; k++) {
      s[k] = c[k] | d[k];
      if (s[k] !== c[k]) grows = true;
    }
    if (grows && inside(s)) c = s;
  }
  // Then every literal that can go, in variable order.
  for (let k = 0; k < sp.wi; k++) {
    let lits = sp.low[k] & ~(c[k] & (c[k] >>> 1)) & allow[k];
    while (lits !== 0) {
      const bit = lits & -lits;
      lits &= lits - 1;
      const both = (bit | (bit << 1)) & allow[k];
      if ((c[k] & both) === both) continue;
      const s = c.slice();
      s[k] |= both;
      if (inside(s)) c = s;
    }
  }
  // Then every function the input part implies.
  for (let k = sp.wi; k < W; k++) {
    let outs = allow[k] & ~c[k];
    while (outs !== 0) {
      const bit = outs & -outs;
      outs &= outs - 1;
      const j = (k - sp.wi) * 30 + (31 - Math.clz32(bit));
      if (j < sp.m && cubeCovered(sp, allowed[j], c)) c[k] |= bit;
    }
  }
  return c;
}
