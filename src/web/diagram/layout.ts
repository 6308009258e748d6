/**
 * Layout of the state diagram: the machine as written (every state the user typed, so a click
 * can jump to its line) placed by dagre's layered layout (the method of E. R. Gansner et al.,
 * "A technique for drawing directed graphs", IEEE TSE 19(3), 1993, as implemented by
 * @dagrejs/dagre). Runs in the worker; pure apart from dagre.
 *
 * Node boxes and label boxes are sized from their text in a monospaced face, CHAR_W pixels per
 * character and LINE_H per line, so the drawing (which uses the same face) fits them; widths
 * are rounded up to whole steps of SIZE_STEP characters, so most keystrokes leave every box
 * the same size and the positions come from a small cache instead of a new layout. Several
 * transitions between the same two states share one edge with one line per transition.
 * Transitions with no guard read "always" (first transition) or "otherwise". Larger machines
 * are ranked by dagre's tight-tree ranker, which is several times faster than network simplex
 * at a small cost in edge length.
 *
 * dagre's work grows quickly with long edges (a machine of 218 states and about 1,000 edges
 * takes 25 s, and its recursive cycle removal overflows the stack on a chain of a few
 * thousand states). Past LAYERED_BUDGET (states + edges, chosen from the LGSynth'91 machines:
 * every one within it lays out in well under a second), the sketch is laid out by distance
 * instead: columns by the fewest clocks from the start state (breadth-first), each column
 * ordered by two barycentre sweeps (Sugiyama et al. 1981), edges drawn straight. Linear in
 * the size of the machine and free of recursion, so any machine the tool reads gets a sketch.
 */
import { layOut, layoutGraph } from '../../core/export/index.js';
import type { Machine, OutBit } from '../../core/index.js';

/** Pixel width of one character of the diagram's monospaced 12 px text. */
export const CHAR_W = 7.3;
/** Line height of the diagram's text. */
export const LINE_H = 16;
const PAD_X = 12;
const PAD_Y = 8;
/** Box widths grow in steps of this many characters. */
const SIZE_STEP = 4;
/** Above this many states, rank with tight-tree rather than network simplex. */
const SIMPLEX_STATES = 8;
const CACHE_SIZE = 16;
/** States + edges above which the sketch is laid out by distance rather than by dagre (see the file comment). */
export const LAYERED_BUDGET = 250;
const RANK_SEP = 56;
const NODE_SEP = 28;
const MARGIN = 16;

export interface Point {
  readonly x: number;
  readonly y: number;
}

export interface LaidNode {
  readonly id: string;
  /** Centre and size. */
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
  /** First line: the name; then one line of Moore outputs when any is 1 or '-'. */
  readonly lines: readonly string[];
  readonly start: boolean;
  readonly unreachable: boolean;
  /** The reduced state it was merged into, when that is another state. */
  readonly mergedInto?: string;
  /** 1-based source line of the state, when known. */
  readonly line?: number;
}

export interface LaidEdge {
  readonly from: string;
  readonly to: string;
  readonly points: readonly Point[];
  readonly label: { readonly x: number; readonly y: number; readonly width: number; readonly height: number };
  /** One line per transition: guard, then Mealy outputs. */
  readonly lines: readonly string[];
  /** Source line of each transition. */
  readonly sourceLines: readonly (number | undefined)[];
}

export interface DiagramLayout {
  /** How it was laid out: dagre's layered layout, or columns by distance from the start (large machines). */
  readonly method: 'layered' | 'by-distance';
  readonly width: number;
  readonly height: number;
  readonly nodes: readonly LaidNode[];
  readonly edges: readonly LaidEdge[];
}

/** Outputs as `a=1 b=-` (only the ones that are not 0). */
export function outputWords(outs: Readonly<Record<string, OutBit>>, order: readonly string[]): string {
  return order
    .filter((o) => outs[o] !== undefined && outs[o] !== 0)
    .map((o) => `${o}=${outs[o]}`)
    .join(' ');
}

/** The size of a card (a state) or a label box holding these lines. */
export function box(lines: readonly string[]): { width: number; height: number } {
  const chars = Math.ceil(Math.max(...lines.map((l) => l.length), 1) / SIZE_STEP) * SIZE_STEP;
  return { width: Math.ceil(chars * CHAR_W + 2 * PAD_X), height: lines.length * LINE_H + 2 * PAD_Y };
}

/** An edge's route and the centre and size of its label. */
interface PlacedEdge {
  readonly points: readonly Point[];
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
}

interface Placed {
  readonly width: number;
  readonly height: number;
  readonly nodes: ReadonlyMap<string, Point>;
  readonly edges: ReadonlyMap<string, PlacedEdge>;
}

/** Recent layouts by the sizes and connections they were made for (most recent last). */
const placedCache = new Map<string, Placed>();

type Sized = { readonly id: string; readonly width: number; readonly height: number };
type Linked = { readonly from: string; readonly to: string; readonly width: number; readonly height: number };

/** Columns by the fewest clocks from the first node (breadth-first; nodes it never reaches go after, in order). */
function columnsByDistance(nodes: readonly Sized[], edges: readonly Linked[]): string[][] {
  const out = new Map<string, string[]>(nodes.map((n) => [n.id, []]));
  for (const e of edges) if (e.from !== e.to) out.get(e.from)?.push(e.to);
  const rank = new Map<string, number>();
  const queue: string[] = [];
  const visit = (id: string, r: number): void => {
    rank.set(id, r);
    queue.push(id);
  };
  let last = 0;
  for (const n of nodes) {
    if (rank.has(n.id)) continue;
    visit(n.id, rank.size === 0 ? 0 : last + 1);
    for (let head = queue.length - 1; head < queue.length; head++) {
      const at = queue[head];
      const r = rank.get(at) ?? 0;
      last = Math.max(last, r);
      for (const to of out.get(at) ?? []) if (!rank.has(to)) visit(to, r + 1);
    }
  }
  const columns: string[][] = Array.from({ length: last + 1 }, () => []);
  for (const id of queue) columns[rank.get(id) ?? 0].push(id);
  return columns.filter((c) => c.length > 0);
}

/** Reorder each column by the mean place of its neighbours in the column before (then after): two sweeps. */
function sweep(columns: string[][], edges: readonly Linked[]): void {
  const near = new Map<string, string[]>();
  for (const e of edges) {
    near.set(e.from, [...(near.get(e.from) ?? []), e.to]);
    near.set(e.to, [...(near.get(e.to) ?? []), e.from]);
  }
  const order = (col: string[], ref: string[]): void => {
    const at = new Map(ref.map((id, i) => [id, i]));
    const key = new Map(
      col.map((id, i) => {
        const ns = (near.get(id) ?? []).flatMap((m) => (at.has(m) ? [at.get(m) as number] : []));
        return [id, ns.length > 0 ? ns.reduce((a, b) => a + b, 0) / ns.length : i];
      }),
    );
    col.sort((a, b) => (key.get(a) ?? 0) - (key.get(b) ?? 0));
  };
  for (let i = 1; i < columns.length; i++) order(columns[i], columns[i - 1]);
  for (let i = columns.length - 2; i >= 0; i--) order(columns[i], columns[i + 1]);
}

/** Where the straight line from a box's centre `c` towards `to` leaves the box. */
export function border(c: Point, box: { readonly width: number; readonly height: number }, to: Point): Point {
  const dx = to.x - c.x;
  const dy = to.y - c.y;
  const t = Math.min(
    dx === 0 ? Infinity : box.width / 2 / Math.abs(dx),
    dy === 0 ? Infinity : box.height / 2 / Math.abs(dy),
  );
  return t === Infinity || t >= 1 ? c : { x: c.x + dx * t, y: c.y + dy * t };
}

/** The layout by distance (see the file comment): columns, then straight edges with their labels halfway. */
function placeByDistance(nodes: readonly Sized[], edges: readonly Linked[]): Placed {
  const size = new Map(nodes.map((n) => [n.id, n]));
  const columns = columnsByDistance(nodes, edges);
  sweep(columns, edges);
  const at = new Map<string, Point>();
  // Columns run left to right in bands; a band ends where the drawing would grow much wider
  // than it is tall (a long chain of states wraps instead of making one endless row).
  const area = nodes.reduce((k, n) => k + (n.width + RANK_SEP) * (n.height + NODE_SEP), 0);
  const bandWidth = Math.max(1600, Math.sqrt(area) * 1.6);
  let x = MARGIN;
  let top = MARGIN;
  let bandHeight = 0;
  let width = 0;
  for (const col of columns) {
    const w = Math.max(...col.map((id) => size.get(id)?.width ?? 0));
    if (x > MARGIN && x + w > bandWidth) {
      x = MARGIN;
      top += bandHeight + RANK_SEP;
      bandHeight = 0;
    }
    let y = top;
    for (const id of col) {
      const h = size.get(id)?.height ?? 0;
      at.set(id, { x: x + w / 2, y: y + h / 2 });
      y += h + NODE_SEP;
    }
    bandHeight = Math.max(bandHeight, y - NODE_SEP - top);
    width = Math.max(width, x + w + MARGIN);
    x += w + RANK_SEP;
  }
  const height = top + bandHeight + MARGIN;
  const placedEdges = new Map<string, PlacedEdge>();
  for (const e of edges) {
    const a = at.get(e.from) ?? { x: 0, y: 0 };
    const b = at.get(e.to) ?? { x: 0, y: 0 };
    const sa = size.get(e.from) ?? { width: 0, height: 0 };
    const sb = size.get(e.to) ?? { width: 0, height: 0 };
    const points: Point[] =
      e.from === e.to
        ? [
            { x: a.x, y: a.y - sa.height / 2 },
            { x: a.x + 20, y: a.y - sa.height / 2 - 24 },
            { x: a.x + sa.width / 2, y: a.y },
          ]
        : [border(a, sa, b), border(b, sb, a)];
    const mid = e.from === e.to ? points[1] : { x: (a.x + b.x) / 2, y: (a.y + b.y) / 2 };
    placedEdges.set(`${e.from}\u0000${e.to}`, { points, x: mid.x, y: mid.y, width: e.width, height: e.height });
  }
  return { width, height, nodes: at, edges: placedEdges };
}

/** Positions for boxes of these sizes and edges with labels of these sizes. */
function place(nodes: readonly Sized[], edges: readonly Linked[]): Placed {
  if (nodes.length + edges.length > LAYERED_BUDGET) return placeByDistance(nodes, edges);
  const key = JSON.stringify([
    nodes.map((n) => [n.id, n.width, n.height]),
    edges.map((e) => [e.from, e.to, e.width, e.height]),
  ]);
  const hit = placedCache.get(key);
  if (hit) {
    placedCache.delete(key);
    placedCache.set(key, hit);
    return hit;
  }
  const g = layoutGraph({ multigraph: false });
  g.setGraph({
    rankdir: 'LR',
    nodesep: 28,
    ranksep: 56,
    edgesep: 14,
    marginx: 16,
    marginy: 16,
    ranker: nodes.length > SIMPLEX_STATES ? 'tight-tree' : 'network-simplex',
  });
  g.setDefaultEdgeLabel(() => ({}));
  for (const n of nodes) g.setNode(n.id, { width: n.width, height: n.height });
  for (const e of edges) g.setEdge(e.from, e.to, { width: e.width, height: e.height, labelpos: 'c' });
  const laid = layOut(g);
  const placed: Placed = {
    width: laid.graph().width,
    height: laid.graph().height,
    nodes: new Map(
      nodes.map((n) => {
        const p = laid.node(n.id);
        return [n.id, { x: p.x, y: p.y }];
      }),
    ),
    edges: new Map(
      edges.map((e) => {
        const l = laid.edge(e.from, e.to);
        return [
          `${e.from}\u0000${e.to}`,
          { points: l.points.map((p) => ({ x: p.x, y: p.y })), x: l.x, y: l.y, width: l.width, height: l.height },
        ];
      }),
    ),
  };
  placedCache.set(key, placed);
  if (placedCache.size > CACHE_SIZE) placedCache.delete(placedCache.keys().next().value as string);
  return placed;
}

/** Lay out the machine; `merged` and `unreachable` come from state minimisation. */
export function layoutDiagram(
  m: Machine,
  merged: Readonly<Record<string, string>> = {},
  unreachable: readonly string[] = [],
): DiagramLayout {
  const names = new Set(m.states.map((s) => s.name));
  const infos = m.states.map((s): Omit<LaidNode, 'x' | 'y'> => {
    const outs = outputWords(s.outputs, m.outputs);
    const lines = outs ? [s.name, outs] : [s.name];
    const into = merged[s.name];
    return {
      id: s.name,
      ...box(lines),
      lines,
      start: s.name === m.start,
      unreachable: unreachable.includes(s.name),
      ...(into !== undefined && into !== s.name ? { mergedInto: into } : {}),
      ...(s.loc?.line !== undefined ? { line: s.loc.line } : {}),
    };
  });
  const edgeLines = new Map<
    string,
    { from: string; to: string; lines: string[]; sourceLines: (number | undefined)[] }
  >();
  for (const s of m.states) {
    s.transitions.forEach((t, i) => {
      if (!names.has(t.to)) return;
      const guard = t.when.text === '1' ? (i === 0 ? 'always' : 'otherwise') : t.when.text;
      const outs = outputWords(t.outputs, m.outputs);
      const key = `${s.name}\u0000${t.to}`;
      const e = edgeLines.get(key) ?? { from: s.name, to: t.to, lines: [], sourceLines: [] };
      e.lines.push(outs ? `${guard} / ${outs}` : guard);
      e.sourceLines.push(t.loc?.line);
      edgeLines.set(key, e);
    });
  }
  const linked = [...edgeLines.values()].map((e) => {
    const b = box(e.lines);
    return { from: e.from, to: e.to, width: b.width - PAD_X, height: b.height - PAD_Y };
  });
  const placed = place(infos, linked);
  const nodes: LaidNode[] = infos.map((info) => ({ ...info, ...(placed.nodes.get(info.id) as Point) }));
  const edges: LaidEdge[] = [...edgeLines.entries()].map(([key, e]) => {
    const l = placed.edges.get(key);
    if (!l) throw new Error(`no layout for the edge ${e.from} → ${e.to}`);
    return {
      from: e.from,
      to: e.to,
      points: l.points,
      label: { x: l.x, y: l.y, width: l.width, height: l.height },
      lines: e.lines,
      sourceLines: e.sourceLines,
    };
  });
  const method = infos.length + linked.length > LAYERED_BUDGET ? 'by-distance' : 'layered';
  return { method, width: placed.width, height: placed.height, nodes, edges };
}
