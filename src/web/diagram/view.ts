/**
 * Where the sketch is looked at after an edit: when the machine keeps most of its states, the
 * layout (dagre's, see layout.ts) usually moves them all alike (a rank added on the left, a
 * column grown), so taking that shift back keeps every state that stays where it was on
 * screen. Pure; d3's zoom transform is only computed with.
 */
import type { ZoomTransform } from 'd3';
import type { DiagramLayout } from './layout.js';

/**
 * The view `t` moved by the mean shift of the states both layouts have, or undefined when
 * there is nothing to keep (no state in common, a layout by distance) or when a state of
 * `after` would then be outside the view of `width` × `height` pixels (the caller fits instead).
 */
export function keptView(
  before: DiagramLayout,
  after: DiagramLayout,
  t: ZoomTransform,
  width: number,
  height: number,
): ZoomTransform | undefined {
  if (after.method !== 'layered' || before.method !== 'layered') return undefined;
  const was = new Map(before.nodes.map((n) => [n.id, n]));
  const common = after.nodes.filter((n) => was.has(n.id));
  if (common.length === 0) return undefined;
  const shift = (axis: 'x' | 'y'): number =>
    common.reduce((k, n) => k + n[axis] - (was.get(n.id)?.[axis] ?? n[axis]), 0) / common.length;
  const kept = t.translate(-shift('x'), -shift('y'));
  const inView = after.nodes.every(
    (n) =>
      kept.applyX(n.x - n.width / 2) >= 0 &&
      kept.applyX(n.x + n.width / 2) <= width &&
      kept.applyY(n.y - n.height / 2) >= 0 &&
      kept.applyY(n.y + n.height / 2) <= height,
  );
  return inView ? kept : undefined;
}
