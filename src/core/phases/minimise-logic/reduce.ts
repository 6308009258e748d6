/**
 * REDUCE of Espresso-II (Brayton et al., "Logic Minimization Algorithms for VLSI Synthesis",
 * Kluwer 1984, ch. 4): shrink each cube, in turn, to the smallest cube that still holds the
 * points only it covers, so that the next EXPAND can grow it in a new direction. For a
 * multi-output cube this is done per function fed: a function whose points are all covered
 * elsewhere is dropped from the cube's output part.
 *
 * Also the output-part lowering of MAKE_SPARSE (Brayton et al. ch. 4): drop each cord branch
 * whose points are covered by other terms, which our cost counts as a connection saved.
 *
 * Precondition: the don't-cares do not meet the on-set. Postcondition: the union, restricted
 * to the on-set, is unchanged.
 */
import {
  type BCube,
  type Space,
  cofactor,
  cubeWeights,
  inAnd,
  inDisjoint,
  inDistance,
  inOr,
  literals,
  outCount,
  outputsOf,
  hasOutput,
  outputBit,
  withOutputs,
} from './bitcube.js';
import { cubeCovered, supercubeOfComplement } from './unate.js';

/**
 * The maximally reduced form of c against the other cubes (`others`, skipping c itself by
 * reference) and the don't-cares per function, or null when nothing of c is needed.
 */
export function reduceCube(sp: Space, c: BCube, others: readonly BCube[], dc: readonly BCube[][]): BCube | null {
  let sup: BCube | null = null;
  const outs: number[] = [];
  for (const j of outputsOf(sp, c)) {
    const t: BCube[] = [];
    for (const d of others) if (d !== c && hasOutput(sp, d, j) && !inDisjoint(sp, d, c)) t.push(cofactor(sp, d, c));
    for (const d of dc[j]) if (!inDisjoint(sp, d, c)) t.push(cofactor(sp, d, c));
    const s = supercubeOfComplement(sp, t);
    if (s === null) continue;
    const region = inAnd(sp, c, s);
    sup = sup === null ? region : inOr(sp, sup, region);
    outs.push(j);
  }
  return sup === null ? null : withOutputs(sp, sup, outs);
}

/**
 * Sequential REDUCE in one of Espresso's two orders, which its main loop alternates so that
 * successive passes move different cubes: the largest cube first and the others by decreasing
 * distance from it; or heaviest cube first (weights as in cubeWeights).
 */
export function reduceCover(sp: Space, F: readonly BCube[], dc: readonly BCube[][], byWeight = false): BCube[] {
  if (F.length === 0) return [];
  let order: number[];
  if (byWeight) {
    const w = cubeWeights(sp, F);
    order = F.map((_, i) => i).sort((a, b) => w[b] - w[a] || a - b);
  } else {
    const size = (c: BCube): number => outCount(sp, c) - literals(sp, c);
    let top = 0;
    for (let i = 1; i < F.length; i++) if (size(F[i]) > size(F[top])) top = i;
    order = F.map((_, i) => i).sort((a, b) => {
      if (a === top || b === top) return a === top ? -1 : 1;
      return inDistance(sp, F[b], F[top]) - inDistance(sp, F[a], F[top]) || a - b;
    });
  }
  const cur: BCube[] = F.slice();
  const gone: BCube = [];
  for (const i of order) {
    const r = reduceCube(sp, cur[i], cur, dc);
    cur[i] = r ?? gone;
  }
  return cur.filter((c) => c !== gone);
}

/** Drop every output connection covered by the other terms and the don't-cares (in order). */
export function lowerOutputs(sp: Space, F: readonly BCube[], dc: readonly BCube[][]): BCube[] {
  const cur: BCube[] = F.map((c) => c.slice());
  const lists = Array.from({ length: sp.m }, (_, j) => cur.filter((c) => hasOutput(sp, c, j)));
  for (const c of cur) {
    for (const j of outputsOf(sp, c)) {
      if (cubeCovered(sp, lists[j], c, c, dc[j])) {
        const [k, bit] = outputBit(sp, j);
        c[k] &= ~bit;
        lists[j] = lists[j].filter((d) => d !== c);
      }
    }
  }
  return cur.filter((c) => outCount(sp, c) > 0);
}
