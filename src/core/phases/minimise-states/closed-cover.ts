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
 * class (classes only grow, so such a requirement needs a new class); and globally, a set of
 * pairwise incompatible states (each needs its own class). Families already explored are
 * remembered. Before the search, one greedy descent (merge into the class with the largest
 * overlap, open a class only when none fits, never backtrack) gives a first cover. The search
 * is capped by a work budget, counted in elementary set operations so that the result does not
 * depend on the computer's speed; when it runs out, the best cover found so far — for large
 * machines the greedy one — is returned and marked inexact, unless it meets the lower bound.
 *
 * Preconditions: every state of `f` is reachable. Postconditions: the classes are
 * compatibles, the family is closed and holds the start state; never more classes than states.
 */
import type { FlatMachine } from '../../model/flat.js';
import {
  compareSets,
  difference,
  has,
  intersection,
  isEmptySet,
  isSubset,
  key,
  members,
  overlapSize,
  setOf,
  size,
  union,
  type StateSet,
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

/**
 * Each step picks its requirement fail-first among the open requirements, but examines only
 * as many as keep (requirements examined × classes) near this figure, so that one step of a
 * large search stays cheap; small searches examine them all.
 */
const SCAN_WORK = 4096;
/** Families remembered as explored, at most. */
const EXPLORED_LIMIT = 100_000;

/** Search for a smallest closed cover of compatibles holding the start state. */
export function closedCover(f: FlatMachine, compat: Compatibility, budget = DEFAULT_COVER_BUDGET): CoverSearch {
  return new CoverSearcher(f, compat, budget).run();
}

/** The branch and bound of closedCover, with its caches and its work count (see the module comment). */
class CoverSearcher {
  private readonly n: number;
  private readonly words: number;
  private readonly lowerBound: number;
  private best: StateSet[];
  private work = 0;
  private aborted = false;
  private readonly impliedCache = new Map<string, StateSet[]>();
  private readonly commonCache = new WeakMap<StateSet, StateSet>();
  private readonly explored = new Set<string>();
  private readonly memberCache = new WeakMap<StateSet, number[]>();

  constructor(
    private readonly f: FlatMachine,
    private readonly compat: Compatibility,
    private readonly budget: number,
  ) {
    this.n = f.states.length;
    this.words = compat.words;
    this.best = Array.from({ length: this.n }, (_, s) => setOf(this.words, [s]));
    this.lowerBound = incompatibleClique(compat, Math.min(budget, 2_000_000));
  }

  run(): CoverSearch {
    const { n, lowerBound } = this;
    if (n > 1 && lowerBound < n) {
      const first = this.greedy();
      if (first !== null && first.length < this.best.length) this.best = first;
      this.work = 0;
      this.search([], [setOf(this.words, [this.f.start])]);
    }
    const classes = [...this.best].sort(compareSets);
    return { classes, exact: !this.aborted || classes.length <= lowerBound, lowerBound };
  }

  /** Members of a set, cached: sets are never changed once made. */
  private listOf(set: StateSet): number[] {
    let l = this.memberCache.get(set);
    if (l === undefined) {
      l = members(set);
      this.memberCache.set(set, l);
    }
    return l;
  }

  /** a ⊆ b, testing a's members (classes and requirements are mostly small against the word count). */
  private inside(a: StateSet, b: StateSet): boolean {
    const l = this.listOf(a);
    this.work += 1 + l.length;
    for (const m of l) if (!has(b, m)) return false;
    return true;
  }

  /** Maximal implied sets of a class that the class itself does not hold. */
  private impliedOf(cls: StateSet): StateSet[] {
    const k = key(cls);
    const hit = this.impliedCache.get(k);
    if (hit) return hit;
    const list = members(cls);
    const regions = classRegions(this.f, list);
    this.work += regions.length * (list.length + this.words);
    const sets = maximal(regions.map((r) => r.next).filter((d) => !isEmptySet(d) && !isSubset(d, cls)));
    this.impliedCache.set(k, sets);
    return sets;
  }

  /** The states compatible with every member of the class. */
  private common(cls: StateSet): StateSet {
    let c = this.commonCache.get(cls);
    if (c === undefined) {
      const list = this.listOf(cls);
      const compatibleWith = this.compat.compatibleWith;
      this.work += list.length * this.words;
      c = compatibleWith[list[0]];
      for (const m of list) c = intersection(c, compatibleWith[m]);
      this.commonCache.set(cls, c);
    }
    return c;
  }

  /** Can requirement d join class c? (d is compatible on its own: it is an implied set of a compatible.) */
  private fits(c: StateSet, d: StateSet): boolean {
    return this.inside(d, this.common(c));
  }

  /** The open requirements once class `changed` has joined the family. */
  private openAfter(classes: StateSet[], changed: StateSet, open: StateSet[]): StateSet[] {
    const kept = open.filter((d) => !this.inside(d, changed));
    const added = maximal(this.impliedOf(changed).filter((d) => !classes.some((c) => this.inside(d, c))));
    if (added.length === 0) return kept;
    // Both lists are free of inner duplicates. Old requirements inside a new one go (meeting the
    // new one meets them); then a new one inside a remaining old one goes.
    const out = kept.filter((d) => !added.some((a) => this.inside(d, a)));
    const survivors = out.length;
    for (const a of added) if (!out.slice(0, survivors).some((d) => this.inside(a, d))) out.push(a);
    return out.sort((a, b) => this.listOf(b).length - this.listOf(a).length);
  }

  /**
   * The requirement to branch on: fail-first (fewest classes it can join, then largest) among
   * the first `scan` open requirements (they come largest first), with the classes it can join
   * (best overlap first) and the requirements that can join none.
   */
  private choose(
    classes: StateSet[],
    open: StateSet[],
    scan: number,
  ): { need: StateSet; options: number[]; forced: StateSet[] } {
    let pick = 0;
    let options: number[] | null = null;
    const forced: StateSet[] = [];
    for (let i = 0; i < Math.min(scan, open.length); i++) {
      const d = open[i];
      const fitting = classes.flatMap((c, j) => (this.fits(c, d) ? [j] : []));
      if (fitting.length === 0) forced.push(d);
      if (options === null || fitting.length < options.length) {
        pick = i;
        options = fitting;
      }
    }
    const need = open[pick];
    const ordered = (options ?? []).sort(
      (a, b) => overlapSize(classes[b], need) - overlapSize(classes[a], need) || a - b,
    );
    return { need, options: ordered, forced };
  }

  /** The family with `need` merged into class j (classes the grown one now holds are dropped). */
  private grow(classes: StateSet[], j: number, need: StateSet): StateSet[] {
    const grown = union(classes[j], need);
    const next = classes.filter((c, i) => i !== j && !this.inside(c, grown));
    next.push(grown);
    return next;
  }

  /** The family with `need` as a class of its own. */
  private open1(classes: StateSet[], need: StateSet): StateSet[] {
    const next = classes.filter((c) => !this.inside(c, need));
    next.push(need);
    return next;
  }

  /**
   * The greedy closed cover: one descent, never backtracking. Every step puts a requirement
   * into the family that no class held, and nothing it held is lost, so the descent ends; the
   * step cap only bounds pathological cases (then no greedy cover is offered).
   */
  private greedy(): StateSet[] | null {
    const n = this.n;
    let classes: StateSet[] = [];
    let open = [setOf(this.words, [this.f.start])];
    for (let step = 0; open.length > 0; step++) {
      if (step > 4 * n * n) return null;
      const { need, options } = this.choose(classes, open, scanFor(classes));
      classes = options.length > 0 ? this.grow(classes, options[0], need) : this.open1(classes, need);
      if (classes.length >= n) return null;
      open = this.openAfter(classes, classes[classes.length - 1], open);
    }
    return classes;
  }

  private search(classes: StateSet[], open: StateSet[]): void {
    if (this.aborted) return;
    if (this.work > this.budget) {
      this.aborted = true;
      return;
    }
    if (open.length === 0) {
      if (classes.length < this.best.length) this.best = classes;
      return;
    }
    if (this.explored.size < EXPLORED_LIMIT) {
      this.work += classes.length * this.words;
      const family = classes.map(key).sort().join('|');
      if (this.explored.has(family)) return;
      this.explored.add(family);
    }
    const { need, options, forced } = this.choose(classes, open, scanFor(classes));
    const bound = Math.max(this.lowerBound, classes.length + clashing(forced, (c, d) => this.fits(c, d)));
    if (bound >= this.best.length) return;
    for (const j of options) {
      const next = this.grow(classes, j, need);
      this.search(next, this.openAfter(next, next[next.length - 1], open));
      if (this.best.length <= this.lowerBound || this.aborted) return;
    }
    if (classes.length + 1 < this.best.length) {
      const next = this.open1(classes, need);
      this.search(next, this.openAfter(next, need, open));
    }
  }
}

function scanFor(classes: readonly StateSet[]): number {
  return Math.max(1, Math.floor(SCAN_WORK / (classes.length + 1)));
}

/** Drop duplicates and sets inside another set of the list (largest first). */
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
 * lower bound on the states of any reduced machine. Branch and bound over bit sets; exact
 * when it finishes within `budget` word operations, else the largest clique found (its first
 * descent is a greedy clique), which is still a valid bound.
 */
export function incompatibleClique(compat: Compatibility, budget: number): number {
  const n = compat.n;
  const words = compat.words;
  const all = setOf(
    words,
    Array.from({ length: n }, (_, i) => i),
  );
  const clash = compat.compatibleWith.map((c) => difference(all, c));
  let best = n > 0 ? 1 : 0;
  let work = 0;
  const grow = (depth: number, candidates: StateSet): void => {
    if (depth > best) best = depth;
    let left = size(candidates);
    const rest = candidates.slice();
    for (const v of members(candidates)) {
      if (depth + left <= best || work > budget) return;
      rest[v >>> 5] &= ~(1 << (v & 31));
      left--;
      work += words;
      grow(depth + 1, intersection(rest, clash[v]));
    }
  };
  grow(0, all);
  return best;
}
