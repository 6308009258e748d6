/**
 * Where the sketch is looked at: fitted to the view, and after an edit: when the machine keeps most of its states, the
 * layout (dagre's, see layout.ts) usually moves them all alike (a rank added on the left, a
 * column grown), so taking that shift back keeps every state that stays where it was on
 * screen. Pure; d3's zoom transform is only computed with.
 */
import { zoomIdentity, type ZoomTransform } from 'd3';
import type { DiagramLayout, LaidNode, Point } from './layout.js';
import { extent, meanShift } from './arrange.js';

/**
 * The view that shows the whole drawing (`shown`, the layout `l` as arranged) in `w` × `h`
 * pixels, scaled at most 2 — but never below `least`: then `partial`, and the view shows the
 * sketch from its start state at that scale (the rest is panned to).
 */
export function fitted(
  l: DiagramLayout,
  shown: DiagramLayout,
  w: number,
  h: number,
  least: number,
): { t: ZoomTransform; k: number; partial: boolean } {
  // The moved states count: the box is the drawing's own once any state was moved (arrange.ts).
  const e = extent(l, shown);
  const whole = Math.min(2, 0.92 * Math.min(w / Math.max(e.width, 1), h / Math.max(e.height, 1)));
  const k = Math.max(whole, least);
  const partial = whole < least;
  if (!partial)
    return {
      t: zoomIdentity.translate((w - e.width * k) / 2 - e.x * k, (h - e.height * k) / 2 - e.y * k).scale(k),
      k,
      partial,
    };
  // Start state at the left, a little in; centred vertically on it when the sketch is taller than the view.
  const start = shown.nodes.find((n) => n.start) ?? shown.nodes[0];
  const tx =
    e.width * k <= w ? (w - e.width * k) / 2 - e.x * k : 24 - (start ? (start.x - start.width / 2) * k : 0) + 22;
  const ty =
    e.height * k <= h
      ? (h - e.height * k) / 2 - e.y * k
      : Math.min(-e.y * k, Math.max(h - (e.y + e.height) * k, h / 2 - (start?.y ?? 0) * k));
  return { t: zoomIdentity.translate(tx, ty).scale(k), k, partial };
}

/** The nearest centre for the card `n` that keeps it (and 4 screen pixels around it) inside the view `t` of `w` × `h`. */
export function insideView(n: LaidNode, t: ZoomTransform, w: number, h: number): Point {
  const clamp = (v: number, lo: number, hi: number): number =>
    lo > hi ? (lo + hi) / 2 : Math.min(hi, Math.max(lo, v));
  const pad = 4 / t.k;
  return {
    x: clamp(n.x, t.invertX(0) + n.width / 2 + pad, t.invertX(w) - n.width / 2 - pad),
    y: clamp(n.y, t.invertY(0) + n.height / 2 + pad, t.invertY(h) - n.height / 2 - pad),
  };
}

/**
 * The view `t` moved by the mean shift of the states both layouts have, or undefined when
 * there is nothing to keep (no state in common, a layout by distance) or when a state of
 * `after` would then be outside the view of `width` × `height` pixels (the caller fits instead).
 * `shown` is `after` as drawn: with the states the user moved where they are (arrange.ts).
 */
export function keptView(
  before: DiagramLayout,
  after: DiagramLayout,
  t: ZoomTransform,
  width: number,
  height: number,
  shown: DiagramLayout = after,
): ZoomTransform | undefined {
  if (after.method !== 'layered' || before.method !== 'layered') return undefined;
  const was = new Set(before.nodes.map((n) => n.id));
  if (!after.nodes.some((n) => was.has(n.id))) return undefined;
  const shift = meanShift(before, after);
  const kept = t.translate(-shift.x, -shift.y);
  const inView = shown.nodes.every(
    (n) =>
      kept.applyX(n.x - n.width / 2) >= 0 &&
      kept.applyX(n.x + n.width / 2) <= width &&
      kept.applyY(n.y - n.height / 2) >= 0 &&
      kept.applyY(n.y + n.height / 2) <= height,
  );
  return inView ? kept : undefined;
}
