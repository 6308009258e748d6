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
  const n = f.states.length;
  const width = f.inputs.length;
  const outKey = f.rows.map((rs) => rs.map((r) => r.out.join('')));
  const pred: number[][] = Array.from({ length: n }, () => []);
  const stamp = new Int32Array(n).fill(-1);
  for (let s = 0; s < n; s++)
    for (const r of f.rows[s])
      if (stamp[r.next] !== s) {
        stamp[r.next] = s;
        pred[r.next].push(s);
      }

  const blockOf = new Int32Array(n);
  const blocks: number[][] = [Array.from({ length: n }, (_, i) => i)];
  // Per block, the members whose successors moved since the block was last looked at.
  const touched: number[][] = [[]];
  const isTouched = new Uint8Array(n);
  const queued: boolean[] = [true];
  const queue: number[] = [0];
  const wholeBlock: boolean[] = [true]; // block 0 starts unchecked as a whole

  const signature = (s: number): string => {
    const tally = new Map<string, number[]>();
    f.rows[s].forEach((r, i) => {
      const label = `${outKey[s][i]}>${blockOf[r.next]}`;
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
  };

  const sameFunction = (s: number, t: number): boolean => {
    const rs = f.rows[s];
    const rt = f.rows[t];
    for (let i = 0; i < rs.length; i++)
      for (let j = 0; j < rt.length; j++) {
        if (!overlaps(rs[i].cube, rt[j].cube)) continue;
        if (blockOf[rs[i].next] !== blockOf[rt[j].next] || outKey[s][i] !== outKey[t][j]) return false;
      }
    return true;
  };

  for (let head = 0; head < queue.length; head++) {
    const b = queue[head];
    queued[b] = false;
    const all = blocks[b];
    // Untouched members kept their labels, so they still agree with one another.
    const check = wholeBlock[b] ? all : touched[b];
    const settled = wholeBlock[b] ? [] : all.filter((s) => isTouched[s] === 0);
    for (const s of touched[b]) isTouched[s] = 0;
    wholeBlock[b] = false;
    touched[b] = [];

    const groups: number[][] = [];
    const bySig = new Map<string, number[]>();
    if (settled.length > 0) {
      groups.push(settled);
      bySig.set(signature(settled[0]), [0]);
    }
    for (const s of check) {
      const sig = signature(s);
      const candidates = bySig.get(sig);
      const hit = candidates?.find((g) => sameFunction(s, groups[g][0]));
      if (hit !== undefined) groups[hit].push(s);
      else {
        groups.push([s]);
        if (candidates) candidates.push(groups.length - 1);
        else bySig.set(sig, [groups.length - 1]);
      }
    }
    if (groups.length <= 1) continue;

    let keep = 0;
    groups.forEach((g, i) => {
      if (g.length > groups[keep].length) keep = i;
    });
    blocks[b] = groups[keep];
    const moved: number[] = [];
    groups.forEach((g, i) => {
      if (i === keep) return;
      const id = blocks.length;
      blocks.push(g);
      touched.push([]);
      queued.push(false);
      wholeBlock.push(false);
      for (const s of g) {
        blockOf[s] = id;
        moved.push(s);
      }
    });
    for (const s of moved)
      for (const p of pred[s]) {
        if (isTouched[p] === 1) continue;
        const pb = blockOf[p];
        isTouched[p] = 1;
        touched[pb].push(p);
        if (!queued[pb]) {
          queued[pb] = true;
          queue.push(pb);
        }
      }
  }

  // Renumber blocks in order of their lowest member.
  const order = blocks.map((m, id) => ({ id, low: Math.min(...m) })).sort((a, b) => a.low - b.low);
  const renumber = new Int32Array(blocks.length);
  order.forEach((o, i) => (renumber[o.id] = i));
  return blockOf.map((id) => renumber[id]);
}
