/**
 * IRREDUNDANT of Espresso-II (Brayton et al., "Logic Minimization Algorithms for VLSI
 * Synthesis", Kluwer 1984, ch. 4): split the cover into relatively essential cubes E (not
 * covered by the rest and the don't-cares D), totally redundant ones (covered by E ∪ D) and
 * partially redundant ones Rp; then keep a cheapest subset of Rp that, with E, still covers.
 *
 * Which subsets of Rp cover is found without minterms: for each p in Rp and each function p
 * feeds, the cofactor of the other cubes against p is split (unate recursive paradigm) until
 * every leaf is either covered by E ∪ D, or needs one of the Rp cubes that are the whole leaf
 * (a row "p or one of these"). The rows form a unate covering problem solved by
 * cover-exact.ts under the caller's cost.
 *
 * Precondition: D does not meet the on-set points the cover must keep (the caller removes
 * the on-set from the don't-cares). Postcondition: the result covers what F ∪ D covered of
 * the on-set, and no cube can be dropped.
 */
import { type BCube, type Space, cofactor, inDisjoint, isUniverse, outputsOf, hasOutput } from './bitcube.js';
import { cubeCovered, splitVar, tautology } from './unate.js';
import { solveCover } from './cover-exact.js';

/** Node limit of the covering search inside IRREDUNDANT (then the best cover found so far). */
const IRREDUNDANT_NODES = 300;

/** The cubes feeding each function, as lists (by reference). */
export function byOutput(sp: Space, cubes: readonly BCube[]): BCube[][] {
  const out: BCube[][] = Array.from({ length: sp.m }, () => []);
  for (const c of cubes) for (const j of outputsOf(sp, c)) out[j].push(c);
  return out;
}

/** Is every function of c covered by the other cubes of `lists` (per function) and `dc`? */
function coveredBy(sp: Space, c: BCube, lists: readonly BCube[][], dc: readonly BCube[][]): boolean {
  for (const j of outputsOf(sp, c)) if (!cubeCovered(sp, lists[j], c, c, dc[j])) return false;
  return true;
}

/**
 * A minimal-cost irredundant subcover of F, given the don't-cares per function `dc`
 * (input cubes); `costOf` prices a cube.
 */
export function irredundantCover(
  sp: Space,
  F: readonly BCube[],
  dc: readonly BCube[][],
  costOf: (c: BCube) => number,
): BCube[] {
  const fj = byOutput(sp, F);
  const relEssential: number[] = [];
  const redundant: number[] = [];
  F.forEach((c, i) => (coveredBy(sp, c, fj, dc) ? redundant : relEssential).push(i));
  if (redundant.length === 0) return F.slice();
  const ej = byOutput(
    sp,
    relEssential.map((i) => F[i]),
  );
  const partial = redundant.filter((i) => !coveredBy(sp, F[i], ej, dc));
  if (partial.length === 0) return relEssential.map((i) => F[i]);
  const rp = partial.map((i) => F[i]);
  const rows: number[][] = [];
  rp.forEach((p, pi) => {
    for (const j of outputsOf(sp, p)) {
      const t: Labelled[] = [];
      for (const list of [ej[j], dc[j]])
        for (const d of list) if (!inDisjoint(sp, d, p)) t.push({ c: cofactor(sp, d, p), label: -1 });
      rp.forEach((q, qi) => {
        if (qi !== pi && hasOutput(sp, q, j) && !inDisjoint(sp, q, p)) t.push({ c: cofactor(sp, q, p), label: qi });
      });
      const found: number[][] = [];
      derive(sp, t, [], found);
      for (const r of found) rows.push(r.includes(pi) ? r : [...r, pi]);
    }
  });
  const columns = rp.map((_, qi) => ({ group: qi, cost: 0, rows: [] as number[] }));
  rows.forEach((r, ri) => {
    for (const qi of r) columns[qi].rows.push(ri);
  });
  const sol = solveCover({ rowCount: rows.length, columns, groupCost: rp.map(costOf) }, IRREDUNDANT_NODES);
  const keep = new Set<number>(relEssential);
  for (const qi of sol.columns) keep.add(partial[qi]);
  return F.filter((_, i) => keep.has(i));
}

interface Labelled {
  readonly c: BCube;
  /** -1 for a cube of E ∪ D, else the index of the partially redundant cube. */
  readonly label: number;
}

/** Split until each leaf is settled; emit "one of these Rp cubes" rows. */
function derive(sp: Space, t: readonly Labelled[], whole: readonly number[], rows: number[][]): void {
  let u = whole;
  const rest: Labelled[] = [];
  for (const x of t) {
    if (isUniverse(sp, x.c)) {
      if (x.label < 0) return;
      if (!u.includes(x.label)) u = [...u, x.label];
    } else rest.push(x);
  }
  const cubes = rest.map((x) => x.c);
  if (!tautology(sp, cubes)) {
    rows.push(u.slice());
    return;
  }
  const v = splitVar(sp, cubes, false);
  for (const value of [1, 0] as const) {
    const [k, s] = [(v / 15) | 0, 2 * (v % 15)];
    const bit = (value === 1 ? 2 : 1) << s;
    const both = 3 << s;
    const next: Labelled[] = [];
    for (const x of rest) {
      const f = x.c[k] & both;
      if ((f & bit) === 0) continue;
      if (f === both) next.push(x);
      else {
        const r = x.c.slice(0, sp.wi);
        r[k] |= both;
        next.push({ c: r, label: x.label });
      }
    }
    derive(sp, next, u, rows);
  }
}
