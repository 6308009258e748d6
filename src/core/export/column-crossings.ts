/**
 * Crossings of a stage-column drawing, counted the way the drawing draws its cords, for the
 * crossing reduction (column-order.ts) to keep the best order it has seen.
 *
 * Geometry counted: a cord between two columns is a straight line from the right edge of the
 * left column (plus a short stub) to the left edge of the right column (less a stub), whichever
 * way it points (stage-columns.ts draws it so; a box narrower than its column adds a level stub
 * that is not counted). The x of every column edge ± stub cuts the drawing into strips; inside a
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

/** The drawing as the counter sees it: per box its column and centre height; cords as box pairs. */
export interface CrossingGeometry {
  /** x of each column's left and right edge, by column index, left to right. */
  readonly left: readonly number[];
  readonly right: readonly number[];
  /** Column index of each box. */
  readonly column: readonly number[];
  /** Cords between two boxes (by box index), at the heights where they leave and arrive. */
  readonly cords: readonly { readonly from: number; readonly to: number }[];
  /** The stub length beyond a column edge. */
  readonly stub: number;
}

/** Pairs i < j with a[i] > a[j] (strictly), by merge sort; sorts `a`. */
function inversions(a: number[]): number {
  const buf = new Array<number>(a.length);
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
      for (let t = lo; t < hi; t++) a[t] = buf[t];
    }
  }
  return n;
}

/** Crossings within one strip: `ends` holds, per cord in it, its height at the strip's left and right edge. */
function stripCrossings(ends: [number, number][]): number {
  ends.sort((p, q) => p[0] - q[0] || p[1] - q[1]);
  return inversions(ends.map((e) => e[1]));
}

/** Crossings of the drawn cords with the boxes' centres at `y` (see the module comment). */
export function countColumnCrossings(g: CrossingGeometry, y: ArrayLike<number>): number {
  const cols = g.left.length;
  // Strip edges: 2c is column c's left edge less the stub, 2c + 1 its right edge plus the stub.
  const edge = (i: number): number => (i % 2 === 0 ? g.left[i / 2] - g.stub : g.right[(i - 1) / 2] + g.stub);
  const strips: [number, number][][] = Array.from({ length: Math.max(0, 2 * cols - 1) }, () => []);
  const passing: number[][] = Array.from({ length: cols }, () => []);
  const lanes: [number, number, number][] = [];
  const tied = new Array<boolean>(g.column.length).fill(false);
  for (const { from, to } of g.cords) {
    const cf = g.column[from];
    const ct = g.column[to];
    tied[from] = tied[to] = true;
    if (cf === ct) {
      lanes.push([cf, Math.min(y[from], y[to]), Math.max(y[from], y[to])]);
      continue;
    }
    const [ca, ya, cb, yb] = cf < ct ? [cf, y[from], ct, y[to]] : [ct, y[to], cf, y[from]];
    const x0 = edge(2 * ca + 1);
    const x1 = edge(2 * cb);
    // The ends exactly (cords sharing an end must not seem to cross by rounding), the rest interpolated.
    const at = (x: number): number => (x === x1 ? yb : x === x0 ? ya : ya + ((yb - ya) * (x - x0)) / (x1 - x0));
    for (let s = 2 * ca + 1; s < 2 * cb; s++) strips[s].push([at(edge(s)), at(edge(s + 1))]);
    for (let c = ca + 1; c < cb; c++) passing[c].push(at(edge(2 * c + 1)));
  }
  // A box with cords stands across its column's strip (its stubs and itself): a cord passing the column crosses it.
  tied.forEach((t, i) => {
    if (t) strips[2 * g.column[i]]?.push([y[i], y[i]]);
  });
  let n = 0;
  for (const s of strips) if (s.length > 1) n += stripCrossings(s);
  for (const p of passing) p.sort((a, b) => a - b);
  for (const [c, lo, hi] of lanes) n += Math.max(0, countLess(passing[c], hi) - countAtMost(passing[c], lo));
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
