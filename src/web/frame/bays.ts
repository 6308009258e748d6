/**
 * Which bay a point of the frame drawing is over, for a part dragged onto a bay (<lw-frame>,
 * src/web/elements/frame-view.ts). Pure: the boxes are the screen boxes of each bay's lever ends
 * (frame/drawn.ts measures them), and the point the pointer's. The drum is the one whose row of
 * lever ends is nearest the point up and down; the bay, on that drum, the one nearest along it,
 * so a part let go between two bays, or above the levers, still lands on the bay under it.
 */
import type { BaySpot } from '../controllers/pins.js';

/** The screen box of one bay's lever ends. */
export interface BayBox extends BaySpot {
  readonly left: number;
  readonly right: number;
  readonly top: number;
  readonly bottom: number;
}

/** How far v lies outside [lo, hi] (0 inside). */
const outside = (v: number, lo: number, hi: number): number => (v < lo ? lo - v : v > hi ? v - hi : 0);

/** The bay under (x, y), or the nearest one; undefined when there are no bays. */
export function bayNearest(boxes: readonly BayBox[], x: number, y: number): BaySpot | undefined {
  let drum: number | undefined;
  let best = Infinity;
  for (const b of boxes) {
    const d = outside(y, b.top, b.bottom);
    if (d < best) [best, drum] = [d, b.drum];
  }
  let spot: BaySpot | undefined;
  best = Infinity;
  for (const b of boxes) {
    if (b.drum !== drum) continue;
    const d = outside(x, b.left, b.right);
    if (d < best) [best, spot] = [d, { drum: b.drum, bay: b.bay }];
  }
  return spot;
}

/** One box per bay from the boxes of its lever ends (a gate has one per port and its Z lever). */
export function bayBoxes(ends: readonly BayBox[]): BayBox[] {
  const by = new Map<string, BayBox>();
  for (const e of ends) {
    const k = `${e.drum}:${e.bay}`;
    const b = by.get(k);
    by.set(
      k,
      b
        ? {
            drum: e.drum,
            bay: e.bay,
            left: Math.min(b.left, e.left),
            right: Math.max(b.right, e.right),
            top: Math.min(b.top, e.top),
            bottom: Math.max(b.bottom, e.bottom),
          }
        : e,
    );
  }
  return [...by.values()];
}
