/**
 * Compatible states of an incompletely specified machine (M. C. Paull and S. H. Unger,
 * "Minimizing the number of states in incompletely specified sequential switching functions",
 * IRE Trans. Electronic Computers EC-8, 1959), computed on the rows' cubes.
 *
 * Two states are compatible when no input sequence makes them give different specified
 * outputs. The implication table works pair by pair: a pair is incompatible when some
 * overlapping pair of rows has clashing specified outputs, or when a pair it implies (the
 * two specified next states of an overlapping row pair) is incompatible. We propagate
 * incompatibility backwards from the clashing pairs, which reaches the same fixed point as
 * crossing out the table in rounds. A set of states is compatible iff its members are
 * pairwise compatible (Paull & Unger's theorem).
 *
 * Also here: the input regions of a class of states (the common refinement of its members'
 * rows), which give the class's implied sets and, later, the reduced machine's rows.
 */
import { intersect, overlaps } from '../../model/cube.js';
import { DONT_CARE, type FlatMachine } from '../../model/flat.js';
import type { OutBit } from '../../model/machine.js';
import { add, emptySet, isSubset, setOf, union, wordsFor, type StateSet } from './bitset.js';

/** Pairwise compatibility of the states of a machine. */
export interface Compatibility {
  readonly n: number;
  readonly words: number;
  /** Per state: the states it is compatible with, itself included. */
  readonly compatibleWith: readonly StateSet[];
}

function outputsClash(a: readonly OutBit[], b: readonly OutBit[]): boolean {
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i] && a[i] !== '-' && b[i] !== '-') return true;
  return false;
}

/** The implication table, resolved: which pairs of states are compatible. */
export function compatibility(f: FlatMachine): Compatibility {
  const n = f.states.length;
  const words = wordsFor(n);
  const bad = new Uint8Array(n * n);
  const dependants = new Map<number, number[]>(); // implied pair → pairs that imply it
  const queue: number[] = [];
  for (let s = 0; s < n; s++)
    for (let t = s + 1; t < n; t++) {
      const p = s * n + t;
      const implied = new Set<number>();
      scan: for (const r of f.rows[s])
        for (const q of f.rows[t]) {
          if (!overlaps(r.cube, q.cube)) continue;
          if (outputsClash(r.out, q.out)) {
            bad[p] = 1;
            queue.push(p);
            break scan;
          }
          if (r.next !== DONT_CARE && q.next !== DONT_CARE && r.next !== q.next)
            implied.add(Math.min(r.next, q.next) * n + Math.max(r.next, q.next));
        }
      if (bad[p] === 1) continue;
      for (const i of implied) {
        if (i === p) continue;
        const list = dependants.get(i);
        if (list) list.push(p);
        else dependants.set(i, [p]);
      }
    }
  for (let head = 0; head < queue.length; head++)
    for (const p of dependants.get(queue[head]) ?? [])
      if (bad[p] === 0) {
        bad[p] = 1;
        queue.push(p);
      }
  const compatibleWith = Array.from({ length: n }, (_, s) => {
    const set = emptySet(words);
    for (let t = 0; t < n; t++) if (s === t || bad[Math.min(s, t) * n + Math.max(s, t)] === 0) add(set, t);
    return set;
  });
  return { n, words, compatibleWith };
}

/** True when the states of `set` (given as members) are pairwise compatible. */
export function isCompatibleSet(c: Compatibility, set: StateSet, memberList: readonly number[]): boolean {
  for (const m of memberList) if (!isSubset(set, c.compatibleWith[m])) return false;
  return true;
}

/** One input region of a class: the members' combined outputs and their specified next states. */
export interface ClassRegion {
  readonly cube: string;
  /** Per output: the members' specified value, or '-' where every member leaves it free. */
  readonly out: readonly OutBit[];
  /** The implied set: every specified next state of a member in this region. */
  readonly next: StateSet;
  /** Transition index of the first member row with a specified transition, else -1. */
  readonly transition: number;
}

/** The common refinement of the members' rows (pairwise disjoint, covering the rows' space). */
export function classRegions(f: FlatMachine, memberList: readonly number[]): ClassRegion[] {
  const words = wordsFor(f.states.length);
  let regions: ClassRegion[] = f.rows[memberList[0]].map((r) => ({
    cube: r.cube,
    out: r.out,
    next: r.next === DONT_CARE ? emptySet(words) : setOf(words, [r.next]),
    transition: r.transition,
  }));
  for (let k = 1; k < memberList.length; k++) {
    const next: ClassRegion[] = [];
    for (const g of regions)
      for (const r of f.rows[memberList[k]]) {
        const cube = intersect(g.cube, r.cube);
        if (cube === null) continue;
        next.push({
          cube,
          out: g.out.map((o, i) => (o === '-' ? r.out[i] : o)),
          next: r.next === DONT_CARE ? g.next : union(g.next, setOf(words, [r.next])),
          transition: g.transition >= 0 ? g.transition : r.transition,
        });
      }
    regions = next;
  }
  return regions;
}
