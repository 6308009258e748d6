/**
 * The user's arrangement of the sketch: states moved by hand, laid over the automatic layout
 * (layout.ts). An arrangement is a view matter only — a place (the centre of a state's card,
 * in the layout's own coordinates) per moved state — and never reaches the machine's text or
 * its JSON form. Pure.
 *
 * A moved state's transitions are routed anew: a straight line between the two card outlines,
 * bent gently to one side when the two states have transitions both ways (so the pair stays
 * two readable lines), the label halfway along; a loop on a moved state moves with it. The
 * other transitions keep the layout's routes.
 *
 * After an edit of the text the layout is made again and usually moves every state alike (a
 * rank added on the left); the places move by the same mean shift (the one view.ts takes back
 * from the view), so a moved state stays where the user put it on screen. A state renamed (one
 * state gone and one new) takes the place of its old name; a state deleted drops its place.
 */
import { border, type DiagramLayout, type LaidEdge, type LaidNode, type Point } from './layout.js';

/** Where each moved state is (the centre of its card, in layout coordinates), by state name. */
export type Places = ReadonlyMap<string, Point>;

/** How far the middle of a transition is bent aside when the two states have transitions both ways. */
export const BEND = 24;
/** The margin kept around the drawing when its extent is worked out from a moved state. */
const MARGIN = 16;

/** The part of `places` that names states of `l`. */
function placed(l: DiagramLayout, places: Places): Map<string, Point> {
  return new Map(l.nodes.filter((n) => places.has(n.id)).map((n) => [n.id, places.get(n.id) as Point]));
}

/**
 * A transition between two different states: from outline to outline, its middle bent `bend`
 * pixels to the left of its direction (0: straight); the label's centre is on the bend.
 */
export function route(a: LaidNode, b: LaidNode, bend: number): { points: Point[]; label: Point } {
  const dx = b.x - a.x;
  const dy = b.y - a.y;
  const len = Math.hypot(dx, dy) || 1;
  const mid = { x: (a.x + b.x) / 2 + (dy / len) * bend, y: (a.y + b.y) / 2 - (dx / len) * bend };
  // A control point inside a card (cards close together) gives no direction: aim at the other centre then.
  const from = border(a, a, mid);
  const to = border(b, b, mid);
  const p0 = from.x === a.x && from.y === a.y ? border(a, a, b) : from;
  const p1 = to.x === b.x && to.y === b.y ? border(b, b, a) : to;
  // curveBasis passes two thirds of the way from the chord's middle to the control point.
  const label = {
    x: (p0.x + p1.x) / 6 + (2 * mid.x) / 3,
    y: (p0.y + p1.y) / 6 + (2 * mid.y) / 3,
  };
  return { points: [p0, mid, p1], label };
}

function moveEdge(e: LaidEdge, a: LaidNode, b: LaidNode, was: LaidNode, twoWay: boolean): LaidEdge {
  if (e.from === e.to) {
    const dx = a.x - was.x;
    const dy = a.y - was.y;
    return {
      ...e,
      points: e.points.map((p) => ({ x: p.x + dx, y: p.y + dy })),
      label: { ...e.label, x: e.label.x + dx, y: e.label.y + dy },
    };
  }
  const r = route(a, b, twoWay ? BEND : 0);
  return { ...e, points: r.points, label: { ...e.label, x: r.label.x, y: r.label.y } };
}

/**
 * The layout with the moved states where the user put them and their transitions routed anew;
 * `l` itself when no state of it was moved (so an unarranged sketch is drawn exactly as laid out).
 */
export function arranged(l: DiagramLayout, places: Places): DiagramLayout {
  const at = placed(l, places);
  if (at.size === 0) return l;
  const nodes = l.nodes.map((n) => (at.has(n.id) ? { ...n, ...(at.get(n.id) as Point) } : n));
  const byId = new Map(nodes.map((n) => [n.id, n]));
  const laid = new Map(l.nodes.map((n) => [n.id, n]));
  const pairs = new Set(l.edges.map((e) => `${e.from}\u0000${e.to}`));
  const edges = l.edges.map((e) => {
    if (!at.has(e.from) && !at.has(e.to)) return e;
    const a = byId.get(e.from) as LaidNode;
    const b = byId.get(e.to) as LaidNode;
    return moveEdge(e, a, b, laid.get(e.from) as LaidNode, pairs.has(`${e.to}\u0000${e.from}`));
  });
  return { ...l, nodes, edges };
}

/** A rectangle of the layout's coordinates. */
export interface Extent {
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
}

/**
 * What Fit shows: the layout's own box while nothing was moved; otherwise the box around every
 * card, route and label of the arranged layout `shown`, with a margin.
 */
export function extent(l: DiagramLayout, shown: DiagramLayout): Extent {
  if (shown === l) return { x: 0, y: 0, width: l.width, height: l.height };
  let x0 = Infinity;
  let y0 = Infinity;
  let x1 = -Infinity;
  let y1 = -Infinity;
  const take = (x: number, y: number, w: number, h: number): void => {
    x0 = Math.min(x0, x - w / 2);
    y0 = Math.min(y0, y - h / 2);
    x1 = Math.max(x1, x + w / 2);
    y1 = Math.max(y1, y + h / 2);
  };
  for (const n of shown.nodes) take(n.x, n.y, n.width, n.height);
  for (const e of shown.edges) {
    take(e.label.x, e.label.y, e.label.width, e.label.height);
    for (const p of e.points) take(p.x, p.y, 0, 0);
  }
  if (x0 === Infinity) return { x: 0, y: 0, width: l.width, height: l.height };
  return { x: x0 - MARGIN, y: y0 - MARGIN, width: x1 - x0 + 2 * MARGIN, height: y1 - y0 + 2 * MARGIN };
}

/** The mean shift the layout gave the states both layouts have (0, 0 when none). */
export function meanShift(before: DiagramLayout, after: DiagramLayout): Point {
  const was = new Map(before.nodes.map((n) => [n.id, n]));
  const common = after.nodes.filter((n) => was.has(n.id));
  if (common.length === 0) return { x: 0, y: 0 };
  const sum = (axis: 'x' | 'y'): number =>
    common.reduce((k, n) => k + n[axis] - (was.get(n.id)?.[axis] ?? n[axis]), 0) / common.length;
  return { x: sum('x'), y: sum('y') };
}

/**
 * The places after the layout went from `before` to `after` (an edit of the text): moved with
 * the layout's mean shift; a renamed state's place (one state gone, one new) under its new name;
 * a deleted state's place dropped.
 */
export function follow(places: Places, before: DiagramLayout, after: DiagramLayout): Map<string, Point> {
  const now = new Set(after.nodes.map((n) => n.id));
  const was = new Set(before.nodes.map((n) => n.id));
  const gone = before.nodes.filter((n) => !now.has(n.id));
  const fresh = after.nodes.filter((n) => !was.has(n.id));
  const s = meanShift(before, after);
  const out = new Map<string, Point>();
  for (const [id, p] of places) {
    const name = now.has(id) ? id : gone.length === 1 && fresh.length === 1 && gone[0].id === id ? fresh[0].id : '';
    if (name !== '') out.set(name, { x: p.x + s.x, y: p.y + s.y });
  }
  return out;
}
