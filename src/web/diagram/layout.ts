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

function box(lines: readonly string[]): { width: number; height: number } {
  const chars = Math.ceil(Math.max(...lines.map((l) => l.length), 1) / SIZE_STEP) * SIZE_STEP;
  return { width: Math.ceil(chars * CHAR_W + 2 * PAD_X), height: lines.length * LINE_H + 2 * PAD_Y };
}

interface Placed {
  readonly width: number;
  readonly height: number;
  readonly nodes: ReadonlyMap<string, Point>;
  readonly edges: ReadonlyMap<
    string,
    {
      readonly points: readonly Point[];
      readonly x: number;
      readonly y: number;
      readonly width: number;
      readonly height: number;
    }
  >;
}

/** Recent layouts by the sizes and connections they were made for (most recent last). */
const placedCache = new Map<string, Placed>();

type Sized = { readonly id: string; readonly width: number; readonly height: number };
type Linked = { readonly from: string; readonly to: string; readonly width: number; readonly height: number };

/** Positions for boxes of these sizes and edges with labels of these sizes. */
function place(nodes: readonly Sized[], edges: readonly Linked[]): Placed {
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
  return { width: placed.width, height: placed.height, nodes, edges };
}
