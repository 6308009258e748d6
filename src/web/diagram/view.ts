/**
 * Where the sketch is looked at after an edit: when the machine keeps most of its states, the
 * layout (dagre's, see layout.ts) usually moves them all alike (a rank added on the left, a
 * column grown), so taking that shift back keeps every state that stays where it was on
 * screen. Pure; d3's zoom transform is only computed with.
 */
import type { ZoomTransform } from 'd3';
import type { DiagramLayout } from './layout.js';
import { meanShift } from './arrange.js';

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
