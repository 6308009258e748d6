/**
 * Crossings of a stage-column drawing, counted the way the drawing draws its cords, for the
 * crossing reduction (column-order.ts) to keep the best order it has seen.
 *
 * Geometry counted: a cord between two columns is a straight line from the right edge of the
 * left column (plus a short lead) to the left edge of the right column (less a lead), whichever
 * way it points (stage-columns.ts draws it so; a box narrower than its column adds a level lead
 * that is not counted). The x of every column edge ± lead cuts the drawing into strips; inside a
 * strip every cord present is one straight piece, so two cords cross in it exactly when their
 * order at the strip's left edge differs from their order at its right edge. The count per strip
 * is thus the number of inversions between the two orders (merge sort, O(k log k) for k cords),
 * the bilayer crossing count of the layered-drawing literature (e.g. W. Barth, P. Mutzel &
 * M. Jünger, "Simple and efficient bilayer cross counting", JGAA 8(2), 2004, whose accumulator
 * tree does the same count), applied per strip, so a cord that skips columns is counted in every
 * strip it passes, as a chain of virtual points at the strip edges would be. A cord within one
 * column runs up or down the lane beside it: it crosses the cords that pass through that column
 * at a height between its ends. Shared ends (cords from one driver) are not crossings.
 *
 * Cost: O(s · e log e) for s strips (two per column) and e cords.
 */

/** A cord between two boxes, by box index. */
export interface ColumnCord {
  readonly from: number;
  readonly to: number;
  readonly fromDy?: number;
  readonly toDy?: number;
}

/** The drawing as the counter sees it: per box its column and centre height; cords as box pairs. */
export interface CrossingGeometry {
  /** x of each column's left and right edge, by column index, left to right. */
  readonly left: readonly number[];
  readonly right: readonly number[];
  /** Column index of each box. */
  readonly column: readonly number[];
  /**
   * Cords between two boxes (by box index); a cord leaves `fromDy` below its driver's centre and
   * arrives `toDy` below its target's (a latch's set or reset half; 0 when not given).
   */
  readonly cords: readonly ColumnCord[];
  /** The lead length beyond a column edge. */
  readonly lead: number;
}

/** Pairs i < j with a[i] > a[j] (strictly), by merge sort; sorts `a`, using `buf` (as long) as scratch. */
function inversions(a: Float64Array, buf: Float64Array): number {
  let n = 0;
  for (let width = 1; width < a.length; width *= 2) {
    for (let lo = 0; lo < a.length - width; lo += 2 * width) {
      const mid = lo + width;
      const hi = Math.min(lo + 2 * width, a.length);
      let i = lo;
      let j = mid;
      let k = lo;
      while (i < mid && j < hi) {
        if (a[i] <= a[j]) buf[k++] = a[i++];
        else {
          n += mid - i;
          buf[k++] = a[j++];
        }
      }
      while (i < mid) buf[k++] = a[i++];
      while (j < hi) buf[k++] = a[j++];
      a.set(buf.subarray(lo, hi), lo);
    }
  }
  return n;
}

/** The pieces of all strips, strip by strip: piece k runs from height `left[k]` to `right[k]`. */
interface Pieces {
  /** Pieces of strip s: start[s] … start[s + 1] - 1. */
  readonly start: Int32Array;
  readonly left: Float64Array;
  readonly right: Float64Array;
}

/** Crossings within each strip: the inversions between the pieces' order at its left edge and at its right edge. */
function stripCrossings({ start, left, right }: Pieces): number {
  const order = new Int32Array(left.length).map((_, k) => k);
  const seq = new Float64Array(left.length);
  const buf = new Float64Array(left.length);
  let n = 0;
  for (let s = 0; s + 1 < start.length; s++) {
    const lo = start[s];
    const hi = start[s + 1];
    if (hi - lo < 2) continue;
    const strip = order.subarray(lo, hi).sort((p, q) => left[p] - left[q] || right[p] - right[q]);
    for (let k = 0; k < strip.length; k++) seq[k] = right[strip[k]];
    n += inversions(seq.subarray(0, hi - lo), buf.subarray(0, hi - lo));
  }
  return n;
}

/**
 * Every strip's pieces (see the module comment), and the heights where cords pass each column
 * (at the lane beside it). Strip edges: 2c is column c's left edge less the lead, 2c + 1 its
 * right edge plus the lead; strip s lies between edges s and s + 1.
 */
function piecesOf(g: CrossingGeometry, y: ArrayLike<number>): { pieces: Pieces; passing: number[][] } {
  const cols = g.left.length;
  const edge = new Float64Array(2 * cols);
  for (let c = 0; c < cols; c++) {
    edge[2 * c] = g.left[c] - g.lead;
    edge[2 * c + 1] = g.right[c] + g.lead;
  }
  const strips = Math.max(0, 2 * cols - 1);
  const tied = new Uint8Array(g.column.length);
  const start = new Int32Array(strips + 1);
  for (const { from, to } of g.cords) {
    tied[from] = tied[to] = 1;
    const [a, b] = [g.column[from], g.column[to]].sort((p, q) => p - q);
    for (let s = 2 * a + 1; s < 2 * b; s++) start[s + 1]++;
  }
  // A box with cords stands across its column's strip (its leads and itself): a cord passing the column crosses it.
  tied.forEach((t, i) => {
    if (t) start[2 * g.column[i] + 1]++;
  });
  for (let s = 0; s < strips; s++) start[s + 1] += start[s];
  const fill = start.slice(0, strips);
  const left = new Float64Array(start[strips]);
  const right = new Float64Array(start[strips]);
  const passing: number[][] = Array.from({ length: cols }, () => []);
  for (const { from, to, fromDy = 0, toDy = 0 } of g.cords) {
    const cf = g.column[from];
    const ct = g.column[to];
    if (cf === ct) continue;
    const yf = y[from] + fromDy;
    const yt = y[to] + toDy;
    const [ca, ya, cb, yb] = cf < ct ? [cf, yf, ct, yt] : [ct, yt, cf, yf];
    const x0 = edge[2 * ca + 1];
    const x1 = edge[2 * cb];
    // The ends exactly (cords sharing an end must not seem to cross by rounding), the rest interpolated.
    const at = (e: number): number =>
      e === 2 * cb ? yb : e === 2 * ca + 1 ? ya : ya + ((yb - ya) * (edge[e] - x0)) / (x1 - x0);
    for (let s = 2 * ca + 1; s < 2 * cb; s++) {
      left[fill[s]] = at(s);
      right[fill[s]++] = at(s + 1);
    }
    for (let c = ca + 1; c < cb; c++) passing[c].push(at(2 * c + 1));
  }
  tied.forEach((t, i) => {
    if (!t) return;
    const s = 2 * g.column[i];
    left[fill[s]] = right[fill[s]++] = y[i];
  });
  return { pieces: { start, left, right }, passing };
}

/** Crossings of the drawn cords with the boxes' centres at `y` (see the module comment). */
export function countColumnCrossings(g: CrossingGeometry, y: ArrayLike<number>): number {
  const { pieces, passing } = piecesOf(g, y);
  let n = stripCrossings(pieces);
  for (const p of passing) p.sort((a, b) => a - b);
  for (const { from, to, fromDy = 0, toDy = 0 } of g.cords) {
    const c = g.column[from];
    if (c !== g.column[to]) continue;
    const yf = y[from] + fromDy;
    const yt = y[to] + toDy;
    const [lo, hi] = yf < yt ? [yf, yt] : [yt, yf];
    n += Math.max(0, countLess(passing[c], hi) - countAtMost(passing[c], lo));
  }
  return n;
}

/** How many of the sorted `a` are < v. */
function countLess(a: readonly number[], v: number): number {
  let lo = 0;
  let hi = a.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (a[mid] < v) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** How many of the sorted `a` are <= v. */
function countAtMost(a: readonly number[], v: number): number {
  let lo = 0;
  let hi = a.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (a[mid] <= v) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
