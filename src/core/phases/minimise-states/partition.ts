/**
 * Equivalent states of a completely specified machine by partition refinement: start from one
 * block and split blocks until every two states in a block give the same outputs and go to the
 * same block on every input (E. F. Moore, "Gedanken-experiments on sequential machines",
 * Automata Studies, Princeton, 1956; J. Hopcroft, "An n log n algorithm for minimizing states
 * in a finite automaton", Theory of Machines and Computations, 1971).
 *
 * Inputs are cubes, not symbols, so Hopcroft's per-symbol inverse transitions do not exist.
 * We keep his two ideas that still apply: after a split, only blocks holding a predecessor
 * of a moved state are looked at again (and only those predecessors within them), and the
 * largest part keeps the old block number so the smaller parts are the ones that move.
 *
 * Two states are equivalent under the current blocks iff on every overlapping pair of their
 * rows the outputs agree and the next states lie in the same block. A cheap signature (per
 * label "outputs → next block": its minterm count and, per input, how many of those minterms
 * have that input at 1) is equal for equal functions, so only states with equal signatures
 * are compared row against row.
 *
 * Precondition: `f` is completely specified (no DONT_CARE next state, no '-' output).
 * Postcondition: block numbers 0..k-1, numbered in order of each block's first member; two
 * states share a block iff they are equivalent (the coarsest such partition).
 */
import { overlaps } from '../../model/cube.js';
import type { FlatMachine } from '../../model/flat.js';

/** Block number per state; blocks numbered by their lowest member. */
export function equivalenceBlocks(f: FlatMachine): Int32Array {
  const r = new Refinement(f);
  r.run();
  // Renumber blocks in order of their lowest member.
  const order = r.blocks.map((m, id) => ({ id, low: Math.min(...m) })).sort((a, b) => a.low - b.low);
  const renumber = new Int32Array(r.blocks.length);
  order.forEach((o, i) => (renumber[o.id] = i));
  return r.blockOf.map((id) => renumber[id]);
}

/** The predecessors of each state, each listed once. */
function predecessors(f: FlatMachine): number[][] {
  const n = f.states.length;
  const pred: number[][] = Array.from({ length: n }, () => []);
  const stamp = new Int32Array(n).fill(-1);
  for (let s = 0; s < n; s++)
    for (const r of f.rows[s])
      if (stamp[r.next] !== s) {
        stamp[r.next] = s;
        pred[r.next].push(s);
      }
  return pred;
}

/** The blocks, the work queue of blocks to look at again, and the refinement steps. */
class Refinement {
  readonly blockOf: Int32Array;
  readonly blocks: number[][];
  private readonly width: number;
  private readonly outKey: string[][];
  private readonly pred: number[][];
  // Per block, the members whose successors moved since the block was last looked at.
  private readonly touched: number[][] = [[]];
  private readonly isTouched: Uint8Array;
  private readonly queued: boolean[] = [true];
  private readonly queue: number[] = [0];
  private readonly wholeBlock: boolean[] = [true]; // block 0 starts unchecked as a whole

  constructor(private readonly f: FlatMachine) {
    const n = f.states.length;
    this.width = f.inputs.length;
    this.outKey = f.rows.map((rs) => rs.map((r) => r.out.join('')));
    this.pred = predecessors(f);
    this.blockOf = new Int32Array(n);
    this.blocks = [Array.from({ length: n }, (_, i) => i)];
    this.isTouched = new Uint8Array(n);
  }

  /** Look at queued blocks until none is left to split. */
  run(): void {
    for (let head = 0; head < this.queue.length; head++) {
      const b = this.queue[head];
      this.queued[b] = false;
      const groups = this.groupsOf(b);
      if (groups.length > 1) this.split(b, groups);
    }
  }

  /** Per label "outputs → next block": its minterm count and, per input, how many of those have it at 1. */
  private signature(s: number): string {
    const width = this.width;
    const tally = new Map<string, number[]>();
    this.f.rows[s].forEach((r, i) => {
      const label = `${this.outKey[s][i]}>${this.blockOf[r.next]}`;
      let t = tally.get(label);
      if (t === undefined) {
        t = new Array<number>(width + 1).fill(0);
        tally.set(label, t);
      }
      let free = 0;
      for (let v = 0; v < width; v++) if (r.cube.charCodeAt(v) === 45) free++;
      const size = 2 ** free;
      t[0] += size;
      for (let v = 0; v < width; v++) {
        const c = r.cube.charCodeAt(v);
        if (c === 49) t[v + 1] += size;
        else if (c === 45) t[v + 1] += size / 2;
      }
    });
    return [...tally.entries()]
      .sort((a, b) => (a[0] < b[0] ? -1 : a[0] > b[0] ? 1 : 0))
      .map(([l, t]) => `${l}:${t.join(',')}`)
      .join(';');
  }

  /** Do s and t agree on every overlapping pair of rows, under the current blocks? */
  private sameFunction(s: number, t: number): boolean {
    const rs = this.f.rows[s];
    const rt = this.f.rows[t];
    const { blockOf, outKey } = this;
    for (let i = 0; i < rs.length; i++)
      for (let j = 0; j < rt.length; j++) {
        if (!overlaps(rs[i].cube, rt[j].cube)) continue;
        if (blockOf[rs[i].next] !== blockOf[rt[j].next] || outKey[s][i] !== outKey[t][j]) return false;
      }
    return true;
  }

  /** The members of block b in groups of equivalent states (one group: no split). */
  private groupsOf(b: number): number[][] {
    const all = this.blocks[b];
    // Untouched members kept their labels, so they still agree with one another.
    const check = this.wholeBlock[b] ? all : this.touched[b];
    const settled = this.wholeBlock[b] ? [] : all.filter((s) => this.isTouched[s] === 0);
    for (const s of this.touched[b]) this.isTouched[s] = 0;
    this.wholeBlock[b] = false;
    this.touched[b] = [];

    const groups: number[][] = [];
    const bySig = new Map<string, number[]>();
    if (settled.length > 0) {
      groups.push(settled);
      bySig.set(this.signature(settled[0]), [0]);
    }
    for (const s of check) {
      const sig = this.signature(s);
      const candidates = bySig.get(sig);
      const hit = candidates?.find((g) => this.sameFunction(s, groups[g][0]));
      if (hit !== undefined) groups[hit].push(s);
      else {
        groups.push([s]);
        if (candidates) candidates.push(groups.length - 1);
        else bySig.set(sig, [groups.length - 1]);
      }
    }
    return groups;
  }

  /** Split block b: the largest group keeps its number, the others move; their predecessors are queued. */
  private split(b: number, groups: readonly number[][]): void {
    let keep = 0;
    groups.forEach((g, i) => {
      if (g.length > groups[keep].length) keep = i;
    });
    this.blocks[b] = groups[keep];
    const moved: number[] = [];
    groups.forEach((g, i) => {
      if (i === keep) return;
      const id = this.blocks.length;
      this.blocks.push(g);
      this.touched.push([]);
      this.queued.push(false);
      this.wholeBlock.push(false);
      for (const s of g) {
        this.blockOf[s] = id;
        moved.push(s);
      }
    });
    for (const s of moved)
      for (const p of this.pred[s]) {
        if (this.isTouched[p] === 1) continue;
        const pb = this.blockOf[p];
        this.isTouched[p] = 1;
        this.touched[pb].push(p);
        if (!this.queued[pb]) {
          this.queued[pb] = true;
          this.queue.push(pb);
        }
      }
  }
}
