/**
 * Crossing reduction for the stage columns (stage-columns.ts): the layer-by-layer sweep of
 * layered graph drawing. Starting from the placement the columns already have, each column's
 * free boxes are put in the order of a value taken from the boxes they are tied to in the
 * columns already swept — their barycentre (K. Sugiyama, S. Tagawa & M. Toda, "Methods for visual
 * understanding of hierarchical system structures", IEEE Trans. SMC 11(2), 1981) or their median
 * (P. Eades & N. Wormald, "Edge crossings in drawings of bipartite graphs", Algorithmica 11, 1994)
 * — sweeping left to right, then right to left, and again; after every sweep neighbouring boxes
 * that cross less the other way round change places (the adjacent exchange, "transpose", of
 * E. R. Gansner, E. Koutsofios, S. C. North & K.-P. Vo, "A technique for drawing directed
 * graphs", IEEE Trans. Software Eng. 19(3), 1993), the crossings are counted
 * (column-crossings.ts), and the best placement seen is kept, as in that paper.
 *
 * Two departures from the textbook form, both because the columns differ greatly in length and
 * some boxes are pinned (a state bit's band): the value is taken over the neighbours' heights,
 * not their ranks within their column, and a tie that skips columns counts its far end directly
 * (its cord is drawn as one straight line, which is where a chain of virtual points would lie).
 * Each column is then packed by isotonic regression (the pool-adjacent-violators algorithm: M.
 * Ayer, H. D. Brunk, G. M. Ewing, W. T. Reid & E. Silverman, Ann. Math. Statist. 26(4), 1955):
 * in the new order, every box as near its wanted height as the boxes above and below it allow
 * (least squares), none above the column's top.
 *
 * Cost: per sweep one sort per column, at most EXCHANGE_PASSES exchange passes and one crossing
 * count, each O(e log e) for e cords; at most MAX_SWEEPS sweeps.
 *
 * Postconditions: pinned boxes do not move; in each column the free boxes do not overlap and none
 * starts above the column's top; the crossings counted are never more than at the start.
 */
import { countColumnCrossings, type CrossingGeometry } from './column-crossings.js';

/** What the sweep reorders: the counted geometry plus each box's height and which boxes are pinned. */
export interface OrderProblem extends CrossingGeometry {
  readonly height: readonly number[];
  /** Boxes that keep their place (the bands). */
  readonly pinned: readonly boolean[];
  /** Per column, the height where its free boxes may start (below the bands in a band column). */
  readonly top: readonly number[];
  /** Space between two boxes of a column. */
  readonly gap: number;
}

export interface OrderResult {
  /** Centre height of every box in the best placement seen. */
  readonly y: Float64Array;
  /** Crossings counted at the start and in the placement returned. */
  readonly before: number;
  readonly after: number;
}

/** Sweeps at most (left to right and back counts as two). */
export const MAX_SWEEPS = 12;
/** Stop after this many sweeps in a row that found nothing better. */
const PATIENCE = 4;

/**
 * Boxes tied to each box in other columns: those of box i are list[start[i]] … list[start[i + 1] - 1],
 * and shift[t] is how far below the far box's centre its cord ends, less how far below box i's
 * centre it ends (a latch's halves), so box i lies level with the cord's far end at y[far] + shift.
 */
interface Neighbours {
  readonly start: Int32Array;
  readonly list: Int32Array;
  readonly shift: Float64Array;
}

function neighbourLists(p: OrderProblem): Neighbours {
  const n = p.column.length;
  const start = new Int32Array(n + 1);
  const across = p.cords.filter((c) => p.column[c.from] !== p.column[c.to]);
  for (const c of across) {
    start[c.from + 1]++;
    start[c.to + 1]++;
  }
  for (let i = 0; i < n; i++) start[i + 1] += start[i];
  const fill = start.slice(0, n);
  const list = new Int32Array(start[n]);
  const shift = new Float64Array(start[n]);
  for (const { from, to, fromDy = 0, toDy = 0 } of across) {
    shift[fill[from]] = toDy - fromDy;
    list[fill[from]++] = to;
    shift[fill[to]] = fromDy - toDy;
    list[fill[to]++] = from;
  }
  return { start, list, shift };
}

/**
 * Tops of boxes kept in the given order, each as near its wanted top as the order allows (least
 * squares), with `gap` between boxes and none above `top`: isotonic regression by pooling
 * adjacent violators on the wanted tops less each box's offset in a tight stack; clipping the
 * pooled values at `top` keeps them optimal under that bound.
 */
export function packColumn(want: readonly number[], heights: readonly number[], top: number, gap: number): number[] {
  const offset: number[] = [];
  let o = 0;
  for (const h of heights) {
    offset.push(o);
    o += h + gap;
  }
  const mean: number[] = [];
  const count: number[] = [];
  want.forEach((w, i) => {
    let m = w - offset[i];
    let c = 1;
    while (mean.length > 0 && mean[mean.length - 1] > m) {
      const pc = count.pop() ?? 0;
      m = ((mean.pop() ?? 0) * pc + m * c) / (pc + c);
      c += pc;
    }
    mean.push(m);
    count.push(c);
  });
  const tops: number[] = [];
  mean.forEach((m, b) => {
    for (let k = 0; k < count[b]; k++) tops.push(Math.max(m, top) + offset[tops.length]);
  });
  return tops;
}

/** The barycentre or the median of some heights (the mean of the two middle ones for an even count). */
function centreOf(ys: number[], median: boolean): number {
  if (!median) return ys.reduce((s, v) => s + v, 0) / ys.length;
  ys.sort((a, b) => a - b);
  const k = ys.length >> 1;
  return ys.length % 2 === 1 ? ys[k] : (ys[k - 1] + ys[k]) / 2;
}

/**
 * One sweep: each column in turn (left to right when `down`), its free boxes ordered by the
 * barycentre or median of the boxes they are tied to in the columns swept (on both sides when `both`).
 */
function sweep(
  p: OrderProblem,
  free: readonly (readonly number[])[],
  nb: Neighbours,
  y: Float64Array,
  how: { readonly down: boolean; readonly both: boolean; readonly median: boolean },
): void {
  const { down, both, median } = how;
  const cols = free.length;
  for (let k = 0; k < cols; k++) {
    const c = down ? k : cols - 1 - k;
    if (free[c].length === 0) continue;
    const wanted = free[c].map((i) => {
      const ys: number[] = [];
      for (let t = nb.start[i]; t < nb.start[i + 1]; t++) {
        const j = nb.list[t];
        if (both || (down ? p.column[j] < c : p.column[j] > c)) ys.push(y[j] + nb.shift[t]);
      }
      return { i, at: ys.length > 0 ? centreOf(ys, median) : y[i] };
    });
    wanted.sort((a, b) => a.at - b.at || y[a.i] - y[b.i] || a.i - b.i);
    const tops = packColumn(
      wanted.map((w) => w.at - p.height[w.i] / 2),
      wanted.map((w) => p.height[w.i]),
      p.top[c],
      p.gap,
    );
    wanted.forEach((w, k2) => {
      y[w.i] = tops[k2] + p.height[w.i] / 2;
    });
  }
}

/** Passes of the adjacent exchange over one column at most. */
const EXCHANGE_PASSES = 4;

/** Heights of the boxes tied to `i` in columns left of `c` and right of it, each sorted. */
function farEnds(p: OrderProblem, nb: Neighbours, y: Float64Array, i: number, c: number): [number[], number[]] {
  const left: number[] = [];
  const right: number[] = [];
  for (let t = nb.start[i]; t < nb.start[i + 1]; t++) {
    const j = nb.list[t];
    (p.column[j] < c ? left : right).push(y[j] + nb.shift[t]);
  }
  return [left.sort((a, b) => a - b), right.sort((a, b) => a - b)];
}

/** Pairs a of `a`, b of `b` with a > b; both sorted. */
function pairsAbove(a: readonly number[], b: readonly number[]): number {
  let n = 0;
  let k = 0;
  for (const v of a) {
    while (k < b.length && b[k] < v) k++;
    n += k;
  }
  return n;
}

/**
 * The adjacent exchange (Gansner et al. 1993, "transpose"): two neighbouring free boxes of a
 * column change places when the cords of the lower one, drawn above, would cross fewer cords of
 * the upper one on the same side; the pair keeps the span it had. At most EXCHANGE_PASSES
 * passes per column, each O(e log e) over the column's cords.
 */
function exchange(p: OrderProblem, free: readonly (readonly number[])[], nb: Neighbours, y: Float64Array): void {
  free.forEach((members, c) => {
    if (members.length < 2) return;
    const order = [...members].sort((a, b) => y[a] - y[b] || a - b);
    const ends = new Map(order.map((i) => [i, farEnds(p, nb, y, i, c)]));
    const cost = (u: number, v: number): number => {
      const [ul, ur] = ends.get(u) ?? [[], []];
      const [vl, vr] = ends.get(v) ?? [[], []];
      return pairsAbove(ul, vl) + pairsAbove(ur, vr);
    };
    for (let pass = 0; pass < EXCHANGE_PASSES; pass++) {
      let moved = false;
      for (let k = 0; k + 1 < order.length; k++) {
        const u = order[k];
        const v = order[k + 1];
        if (cost(v, u) >= cost(u, v)) continue;
        const top = y[u] - p.height[u] / 2;
        const bottom = y[v] + p.height[v] / 2;
        y[v] = top + p.height[v] / 2;
        y[u] = bottom - p.height[u] / 2;
        order[k] = v;
        order[k + 1] = u;
        moved = true;
      }
      if (!moved) break;
    }
  });
}

/**
 * Reduce the crossings of a placement (see the module comment): `start` is every box's centre
 * height; the result keeps pinned boxes where they are.
 */
export function reduceCrossings(p: OrderProblem, start: ArrayLike<number>): OrderResult {
  const free: number[][] = Array.from({ length: p.left.length }, () => []);
  p.column.forEach((c, i) => {
    if (!p.pinned[i]) free[c].push(i);
  });
  const nb = neighbourLists(p);
  const y = Float64Array.from(start);
  const before = countColumnCrossings(p, y);
  let best = Float64Array.from(y);
  let after = before;
  let idle = 0;
  for (let s = 0; s < MAX_SWEEPS && idle < PATIENCE && after > 0; s++) {
    // Barycentres first, then medians: each finds orders the other misses. Every third sweep
    // weighs the ties on both sides at once, which settles a column pulled both ways; the
    // adjacent exchange then tidies what the sweep left.
    sweep(p, free, nb, y, { down: s % 2 === 0, both: s % 3 === 2, median: s >= MAX_SWEEPS / 2 });
    exchange(p, free, nb, y);
    const n = countColumnCrossings(p, y);
    if (n < after) {
      after = n;
      best = Float64Array.from(y);
      idle = 0;
    } else idle++;
  }
  return { y: best, before, after };
}
