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
import { intersect } from '../../model/cube.js';
import { DONT_CARE, type FlatMachine } from '../../model/flat.js';
import type { OutBit } from '../../model/machine.js';
import { add, emptySet, setOf, union, wordsFor, type StateSet } from './bitset.js';

/** Pairwise compatibility of the states of a machine. */
export interface Compatibility {
  readonly n: number;
  readonly words: number;
  /** Per state: the states it is compatible with, itself included. */
  readonly compatibleWith: readonly StateSet[];
}

/**
 * Rows packed into 32-bit words for the pair loop (it runs n²/2 times): per row, a care mask
 * and a value mask of its cube and of its outputs, so "do the cubes overlap" and "do the
 * specified outputs clash" are a few word operations each.
 */
interface PackedRows {
  readonly start: Int32Array; // rows of state s are start[s] .. start[s+1]-1
  readonly inWords: number;
  readonly outWords: number;
  readonly inCare: Int32Array;
  readonly inVal: Int32Array;
  readonly outCare: Int32Array;
  readonly outVal: Int32Array;
  readonly next: Int32Array;
}

function pack(f: FlatMachine): PackedRows {
  const inWords = Math.max(1, Math.ceil(f.inputs.length / 32));
  const outWords = Math.max(1, Math.ceil(f.outputs.length / 32));
  const total = f.rows.reduce((n, rs) => n + rs.length, 0);
  const start = new Int32Array(f.states.length + 1);
  const inCare = new Int32Array(total * inWords);
  const inVal = new Int32Array(total * inWords);
  const outCare = new Int32Array(total * outWords);
  const outVal = new Int32Array(total * outWords);
  const next = new Int32Array(total);
  let k = 0;
  f.rows.forEach((rs, s) => {
    start[s] = k;
    for (const r of rs) {
      for (let i = 0; i < r.cube.length; i++) {
        const c = r.cube[i];
        if (c === '-') continue;
        inCare[k * inWords + (i >>> 5)] |= 1 << (i & 31);
        if (c === '1') inVal[k * inWords + (i >>> 5)] |= 1 << (i & 31);
      }
      r.out.forEach((o, i) => {
        if (o === '-') return;
        outCare[k * outWords + (i >>> 5)] |= 1 << (i & 31);
        if (o === 1) outVal[k * outWords + (i >>> 5)] |= 1 << (i & 31);
      });
      next[k] = r.next;
      k++;
    }
  });
  start[f.states.length] = k;
  return { start, inWords, outWords, inCare, inVal, outCare, outVal, next };
}

/** A growable list of 32-bit integers. */
class IntList {
  data = new Int32Array(1024);
  length = 0;
  push(v: number): void {
    if (this.length === this.data.length) {
      const grown = new Int32Array(this.data.length * 2);
      grown.set(this.data);
      this.data = grown;
    }
    this.data[this.length++] = v;
  }
}

/** Index of the unordered pair {s, t}, s ≠ t, in a triangular table. */
function pairIndex(s: number, t: number): number {
  return s < t ? (t * (t - 1)) / 2 + s : (s * (s - 1)) / 2 + t;
}

/** Do two packed rows (word offsets a and b) differ on a position both care about? */
function differ(val: Int32Array, care: Int32Array, a: number, b: number, words: number): boolean {
  for (let w = 0; w < words; w++, a++, b++) if (((val[a] ^ val[b]) & care[a] & care[b]) !== 0) return true;
  return false;
}

/**
 * The pairs that pair {s, t} (index p) implies, each once and never p itself, into `implied`
 * (its length is their count); false when an overlapping pair of rows clashes on an output.
 */
function impliedPairs(pk: PackedRows, s: number, t: number, p: number, implied: IntList): boolean {
  const { start, inWords, outWords, next } = pk;
  implied.length = 0;
  for (let i = start[s]; i < start[s + 1]; i++)
    for (let j = start[t]; j < start[t + 1]; j++) {
      if (differ(pk.inVal, pk.inCare, i * inWords, j * inWords, inWords)) continue;
      if (differ(pk.outVal, pk.outCare, i * outWords, j * outWords, outWords)) return false;
      const x = next[i];
      const y = next[j];
      if (x === DONT_CARE || y === DONT_CARE || x === y) continue;
      const q = pairIndex(x, y);
      let known = q === p;
      for (let k = 0; k < implied.length && !known; k++) known = implied.data[k] === q;
      if (!known) implied.push(q);
    }
  return true;
}

/** The implication table, resolved: which pairs of states are compatible. */
export function compatibility(f: FlatMachine): Compatibility {
  const n = f.states.length;
  const words = wordsFor(n);
  const packed = pack(f);
  const pairs = (n * (n - 1)) / 2;
  const bad = new Uint8Array(pairs);
  const queue = new IntList();
  // Pairs implying a pair, as linked lists: head[q] → edge → nextEdge[edge] → …; edgePair[edge] = p.
  const head = new Int32Array(pairs).fill(-1);
  const nextEdge = new IntList();
  const edgePair = new IntList();
  const implied = new IntList(); // implied pairs of the current pair
  for (let t = 1; t < n; t++)
    for (let s = 0; s < t; s++) {
      const p = pairIndex(s, t);
      if (!impliedPairs(packed, s, t, p, implied)) {
        bad[p] = 1;
        queue.push(p);
        continue;
      }
      for (let k = 0; k < implied.length; k++) {
        const q = implied.data[k];
        nextEdge.push(head[q]);
        head[q] = edgePair.length;
        edgePair.push(p);
      }
    }
  for (let k = 0; k < queue.length; k++)
    for (let e = head[queue.data[k]]; e >= 0; e = nextEdge.data[e]) {
      const p = edgePair.data[e];
      if (bad[p] === 0) {
        bad[p] = 1;
        queue.push(p);
      }
    }
  const compatibleWith = Array.from({ length: n }, (_, s) => {
    const set = emptySet(words);
    for (let t = 0; t < n; t++) if (s === t || bad[pairIndex(s, t)] === 0) add(set, t);
    return set;
  });
  return { n, words, compatibleWith };
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
