/**
 * Min-cut bipartition with a balance constraint: the Fiduccia–Mattheyses heuristic (C. M.
 * Fiduccia & R. M. Mattheyses, "A linear-time heuristic for improving network partitions",
 * Proc. 19th Design Automation Conference, 1982), on a graph whose nodes have widths (a
 * unit's length of drum) and whose edges have whole-number weights (cord branches).
 *
 * One pass: every free node starts unlocked in a bucket by its gain (the cut weight saved by
 * moving it to the other side). Repeatedly the unlocked node of highest gain whose move keeps
 * the balance is moved and locked, and its neighbours' gains are updated in their buckets.
 * At the end of the pass the moves are undone back to the prefix with the best cut (ties: the
 * better balance). Passes repeat while a pass improves the cut. A move is allowed when side
 * 0's width ends within [lo, hi], or, from an unbalanced start, when it comes closer to it.
 *
 * Pre: `side` holds 0/1 for every node and respects `fixed`. Post: fixed nodes keep their
 * side; the cut is never larger than the starting cut; the balance is kept if it held at the
 * start. Deterministic (ties go to the lowest node).
 */

export interface PartitionGraph {
  readonly widthM: readonly number[];
  /** Edges with whole-number weights ≥ 1. */
  readonly edges: readonly { readonly a: number; readonly b: number; readonly w: number }[];
  /** −1 free, else the side the node must stay on. */
  readonly fixed: readonly number[];
}

export interface Balance {
  /** Bounds of the total width on side 0. */
  readonly lo: number;
  readonly hi: number;
}

export interface Bipartition {
  readonly side: readonly number[];
  readonly cut: number;
  readonly passes: number;
}

interface Graph {
  readonly to: number[][];
  readonly w: number[][];
  readonly maxGain: number;
}

function adjacency(g: PartitionGraph): Graph {
  const n = g.widthM.length;
  const to = Array.from({ length: n }, () => [] as number[]);
  const w = Array.from({ length: n }, () => [] as number[]);
  for (const e of g.edges) {
    if (e.a === e.b) continue;
    to[e.a].push(e.b);
    w[e.a].push(e.w);
    to[e.b].push(e.a);
    w[e.b].push(e.w);
  }
  const maxGain = Math.max(1, ...w.map((ws) => ws.reduce((s, x) => s + x, 0)));
  return { to, w, maxGain };
}

/** Weight of the edges between the two sides. */
export function cutWeight(g: PartitionGraph, side: readonly number[]): number {
  let c = 0;
  for (const e of g.edges) if (side[e.a] !== side[e.b]) c += e.w;
  return c;
}

/** Buckets of unlocked nodes by gain: doubly linked lists, with a pointer to the highest non-empty bucket. */
class Buckets {
  private readonly head: Int32Array;
  private readonly next: Int32Array;
  private readonly prev: Int32Array;
  readonly gain: Int32Array;
  private top: number;
  constructor(
    n: number,
    private readonly offset: number,
  ) {
    this.head = new Int32Array(2 * offset + 1).fill(-1);
    this.next = new Int32Array(n).fill(-1);
    this.prev = new Int32Array(n).fill(-1);
    this.gain = new Int32Array(n);
    this.top = 0;
  }
  insert(v: number, gain: number): void {
    const k = gain + this.offset;
    this.gain[v] = gain;
    this.prev[v] = -1;
    this.next[v] = this.head[k];
    if (this.head[k] !== -1) this.prev[this.head[k]] = v;
    this.head[k] = v;
    this.top = Math.max(this.top, k);
  }
  remove(v: number): void {
    const k = this.gain[v] + this.offset;
    if (this.prev[v] !== -1) this.next[this.prev[v]] = this.next[v];
    else this.head[k] = this.next[v];
    if (this.next[v] !== -1) this.prev[this.next[v]] = this.prev[v];
  }
  /** The unlocked node of highest gain that `ok` accepts (ties: as listed), or −1. */
  best(ok: (v: number) => boolean): number {
    while (this.top > 0 && this.head[this.top] === -1) this.top--;
    for (let k = this.top; k >= 0; k--) for (let v = this.head[k]; v !== -1; v = this.next[v]) if (ok(v)) return v;
    return -1;
  }
}

function gainOf(gr: Graph, side: readonly number[], v: number): number {
  let g = 0;
  for (let k = 0; k < gr.to[v].length; k++) g += side[gr.to[v][k]] === side[v] ? -gr.w[v][k] : gr.w[v][k];
  return g;
}

/** Distance of side 0's width from [lo, hi] (0 inside). */
const outside = (x: number, b: Balance): number => (x < b.lo ? b.lo - x : x > b.hi ? x - b.hi : 0);

/** One FM pass; returns the cut gained (≥ 0) and leaves `side` at the best prefix. */
function pass(g: PartitionGraph, gr: Graph, side: number[], balance: Balance): number {
  const n = side.length;
  const buckets = new Buckets(n, gr.maxGain);
  for (let v = n - 1; v >= 0; v--) if (g.fixed[v] === -1) buckets.insert(v, gainOf(gr, side, v));
  const locked = new Uint8Array(n);
  let width0 = 0;
  for (let v = 0; v < n; v++) if (side[v] === 0) width0 += g.widthM[v];
  const moves: number[] = [];
  let cum = 0;
  let best = { gain: 0, moves: 0, off: outside(width0, balance) };
  const after = (v: number): number => width0 + (side[v] === 0 ? -g.widthM[v] : g.widthM[v]);
  const ok = (v: number): boolean => {
    const now = outside(width0, balance);
    const then = outside(after(v), balance);
    return then === 0 || then < now;
  };
  for (;;) {
    const v = buckets.best(ok);
    if (v === -1) break;
    buckets.remove(v);
    locked[v] = 1;
    cum += buckets.gain[v];
    width0 = after(v);
    side[v] = 1 - side[v];
    moves.push(v);
    for (const u of gr.to[v])
      if (g.fixed[u] === -1 && !locked[u]) {
        buckets.remove(u);
        buckets.insert(u, gainOf(gr, side, u));
      }
    const off = outside(width0, balance);
    if (off < best.off - 1e-12 || (off <= best.off + 1e-12 && cum > best.gain))
      best = { gain: cum, moves: moves.length, off };
  }
  for (let k = moves.length - 1; k >= best.moves; k--) side[moves[k]] = 1 - side[moves[k]];
  return best.gain;
}

/** Improve a bipartition by Fiduccia–Mattheyses passes until a pass gains nothing. */
export function fmBipartition(g: PartitionGraph, start: readonly number[], balance: Balance): Bipartition {
  const gr = adjacency(g);
  const side = [...start];
  let passes = 0;
  let width0 = 0;
  for (let v = 0; v < side.length; v++) if (side[v] === 0) width0 += g.widthM[v];
  let off = outside(width0, balance);
  for (; passes < 50;) {
    passes++;
    const before = [...side];
    const gained = pass(g, gr, side, balance);
    width0 = 0;
    for (let v = 0; v < side.length; v++) if (side[v] === 0) width0 += g.widthM[v];
    const nowOff = outside(width0, balance);
    if (gained > 0 || nowOff < off - 1e-12) {
      off = nowOff;
      continue;
    }
    side.splice(0, side.length, ...before);
    break;
  }
  return { side, cut: cutWeight(g, side), passes };
}
