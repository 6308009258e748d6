/**
 * A smallest closed cover of compatibles, by branch and bound (A. Grasselli and F. Luccio,
 * "A method for minimizing the number of internal states in incompletely specified sequential
 * networks", IEEE Trans. Electronic Computers EC-14, 1965: the reduced machine's states are a
 * closed family of compatibles; closure means every implied set of a chosen class lies
 * inside some chosen class).
 *
 * Instead of listing prime compatibles first (their number can explode), the search grows the
 * classes on demand. A requirement is a set of states that must lie inside one class: the
 * start state, and every implied set of a chosen class that no chosen class holds yet. The
 * search takes the requirement with the fewest ways to meet it and branches: merge it into an
 * existing class (when the union stays compatible), or open a new class for it. This is
 * complete: if a closed cover of m classes exists, some branch maps each search class into a
 * distinct class of it and so ends with at most m classes. Covering the start state is enough:
 * closure then covers every reachable state (each original run stays inside the classes the
 * reduced machine visits).
 *
 * Bound: classes so far plus the number of pairwise clashing requirements that fit no existing
 * class; and globally, a set of pairwise incompatible states (each needs its own class).
 * Families already explored are remembered. The effort is capped by a work budget (counted in
 * elementary set operations, so the result does not depend on the computer's speed); when the
 * budget runs out the best cover found so far is returned and marked inexact, unless it
 * already meets the lower bound. The first descent, merges before new classes, is the greedy
 * closed cover that large machines get.
 *
 * Preconditions: every state of `f` is reachable. Postconditions: the classes are
 * compatibles, the family is closed and holds the start state; never more classes than states.
 */
import type { FlatMachine } from '../../model/flat.js';
import {
  compareSets, isEmptySet, isSubset, key, members, overlapSize, setOf, size, union, type StateSet,
} from './bitset.js';
import { classRegions, type Compatibility } from './compatible.js';

export interface CoverSearch {
  /** The chosen classes, in a fixed order (lowest member first). */
  readonly classes: readonly StateSet[];
  /** True when the search finished or met the lower bound: the cover is a smallest one. */
  readonly exact: boolean;
  /** A proven lower bound on the number of classes. */
  readonly lowerBound: number;
}

/** Default work budget: enough to finish every small benchmark machine, a second or so at most. */
export const DEFAULT_COVER_BUDGET = 4_000_000;

/** Search for a smallest closed cover of compatibles holding the start state. */
export function closedCover(f: FlatMachine, compat: Compatibility, budget = DEFAULT_COVER_BUDGET): CoverSearch {
  const n = f.states.length;
  const words = compat.words;
  const lowerBound = incompatibleClique(compat, Math.min(budget, 200_000));
  let best: StateSet[] = Array.from({ length: n }, (_, s) => setOf(words, [s]));
  let work = 0;
  let aborted = false;
  const impliedCache = new Map<string, StateSet[]>();
  const explored = new Set<string>();

  /** Maximal implied sets of a class that the class itself does not hold. */
  const impliedOf = (cls: StateSet): StateSet[] => {
    const k = key(cls);
    const hit = impliedCache.get(k);
    if (hit) return hit;
    const list = members(cls);
    const regions = classRegions(f, list);
    work += regions.length * list.length;
    const sets = maximal(regions.map((r) => r.next).filter((d) => !isEmptySet(d) && !isSubset(d, cls)));
    impliedCache.set(k, sets);
    return sets;
  };

  /** Can a and b share a class? (Each is compatible on its own.) */
  const fits = (a: StateSet, b: StateSet): boolean => {
    work++;
    for (const m of members(b)) if (!isSubset(a, compat.compatibleWith[m])) return false;
    return true;
  };

  const openAfter = (classes: StateSet[], changed: StateSet, open: StateSet[]): StateSet[] => {
    const out = open.filter((d) => !isSubset(d, changed));
    for (const d of impliedOf(changed)) {
      work += classes.length;
      if (!classes.some((c) => isSubset(d, c))) out.push(d);
    }
    return maximal(out);
  };

  const search = (classes: StateSet[], open: StateSet[]): void => {
    if (aborted) return;
    if (work > budget) {
      aborted = true;
      return;
    }
    if (open.length === 0) {
      if (classes.length < best.length) best = classes;
      return;
    }
    const family = classes.map(key).sort().join('|');
    if (explored.has(family)) return;
    explored.add(family);

    let pick = -1;
    let pickOptions: number[] = [];
    const forced: StateSet[] = [];
    open.forEach((d, i) => {
      const options: number[] = [];
      classes.forEach((c, j) => {
        if (fits(c, d)) options.push(j);
      });
      if (options.length === 0) forced.push(d);
      if (pick < 0 || options.length < pickOptions.length || (options.length === pickOptions.length && size(d) > size(open[pick]))) {
        pick = i;
        pickOptions = options;
      }
    });
    if (Math.max(lowerBound, classes.length + clashing(forced, fits)) >= best.length) return;

    const need = open[pick];
    pickOptions.sort((a, b) => overlapSize(classes[b], need) - overlapSize(classes[a], need) || a - b);
    for (const j of pickOptions) {
      const grown = union(classes[j], need);
      const next = classes.filter((c, i) => i !== j && !isSubset(c, grown));
      next.push(grown);
      search(next, openAfter(next, grown, open));
      if (best.length <= lowerBound) return;
    }
    if (classes.length + 1 < best.length) {
      const next = classes.filter((c) => !isSubset(c, need));
      next.push(need);
      search(next, openAfter(next, need, open));
    }
  };

  if (n > 1 && lowerBound < n) search([], [setOf(words, [f.start])]);
  const classes = [...best].sort(compareSets);
  return { classes, exact: !aborted || classes.length <= lowerBound, lowerBound };
}

/** Drop duplicates and sets inside another set of the list. */
function maximal(sets: StateSet[]): StateSet[] {
  const sorted = [...sets].sort((a, b) => size(b) - size(a));
  const out: StateSet[] = [];
  for (const s of sorted) if (!out.some((o) => isSubset(s, o))) out.push(s);
  return out;
}

/** Greedy count of requirements that pairwise cannot share a class. */
function clashing(sets: StateSet[], fits: (a: StateSet, b: StateSet) => boolean): number {
  const kept: StateSet[] = [];
  for (const s of sets) if (kept.every((k) => !fits(k, s))) kept.push(s);
  return kept.length;
}

/**
 * Size of a set of pairwise incompatible states (a clique of the incompatibility graph): a
 * lower bound on the states of any reduced machine. Exact for small machines; when the step
 * budget runs out, the largest clique found so far (still a valid bound).
 */
export function incompatibleClique(compat: Compatibility, budget: number): number {
  const n = compat.n;
  const clash = (a: number, b: number): boolean => !isSubset(setOf(compat.words, [b]), compat.compatibleWith[a]);
  const adj: number[][] = Array.from({ length: n }, (_, a) => {
    const out: number[] = [];
    for (let b = 0; b < n; b++) if (a !== b && clash(a, b)) out.push(b);
    return out;
  });
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => adj[b].length - adj[a].length || a - b);
  let bestSize = n > 0 ? 1 : 0;
  let steps = 0;
  const adjSet = adj.map((l) => new Set(l));
  const grow = (size: number, candidates: number[]): void => {
    if (size > bestSize) bestSize = size;
    for (let i = 0; i < candidates.length; i++) {
      if (size + candidates.length - i <= bestSize || ++steps > budget) return;
      const v = candidates[i];
      grow(size + 1, candidates.slice(i + 1).filter((w) => adjSet[v].has(w)));
    }
  };
  grow(0, order);
  return bestSize;
}
