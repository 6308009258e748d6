/**
 * A crossing counter for the stage-column drawings' tests, independent of the layout's own
 * count: every pair of drawn polylines is tested segment against segment, brute force (with the
 * segments sorted by their left end so pairs far apart in x are skipped). Two segments cross
 * when each one's ends lie strictly on opposite sides of the other's line (the orientation
 * test of computational geometry, e.g. T. H. Cormen, C. E. Leiserson, R. L. Rivest & C. Stein,
 * *Introduction to Algorithms*, 3rd ed., §33.1 — from memory); segments that only touch (cords
 * leaving one driver, arriving at one port) or run along each other are not crossings, and a
 * segment drawn twice (the lead that two branches of one cord share) is counted once.
 */
import type { Point } from '../../../src/core/export/svg.js';

interface Segment {
  readonly line: number;
  readonly a: Point;
  readonly b: Point;
  readonly minX: number;
  readonly maxX: number;
  readonly minY: number;
  readonly maxY: number;
}

const orient = (p: Point, q: Point, r: Point): number => {
  const v = (q.x - p.x) * (r.y - p.y) - (q.y - p.y) * (r.x - p.x);
  return Math.abs(v) < 1e-9 ? 0 : Math.sign(v);
};

/** Whether two segments cross at a point inside both. */
export function segmentsCross(a: Point, b: Point, c: Point, d: Point): boolean {
  const o1 = orient(a, b, c);
  const o2 = orient(a, b, d);
  const o3 = orient(c, d, a);
  const o4 = orient(c, d, b);
  return o1 * o2 < 0 && o3 * o4 < 0;
}

/** Crossings between different polylines (a pair of polylines may cross more than once; each crossing counts). */
export function countCrossings(lines: readonly (readonly Point[])[]): number {
  const segs: Segment[] = [];
  const seen = new Set<string>();
  lines.forEach((pts, line) => {
    for (let i = 1; i < pts.length; i++) {
      const a = pts[i - 1];
      const b = pts[i];
      if (a.x === b.x && a.y === b.y) continue;
      // A segment drawn twice (the lead two branches of one cord share) is one line on paper.
      const key = [a.x, a.y, b.x, b.y].map((v) => v.toFixed(1)).join(' ');
      if (seen.has(key)) continue;
      seen.add(key);
      segs.push({
        line,
        a,
        b,
        minX: Math.min(a.x, b.x),
        maxX: Math.max(a.x, b.x),
        minY: Math.min(a.y, b.y),
        maxY: Math.max(a.y, b.y),
      });
    }
  });
  segs.sort((s, t) => s.minX - t.minX);
  let n = 0;
  for (let i = 0; i < segs.length; i++) {
    const s = segs[i];
    for (let j = i + 1; j < segs.length && segs[j].minX <= s.maxX; j++) {
      const t = segs[j];
      if (t.line === s.line || t.minY > s.maxY || t.maxY < s.minY) continue;
      if (segmentsCross(s.a, s.b, t.a, t.b)) n++;
    }
  }
  return n;
}
