/**
 * Layout of the state diagram: the machine as written (every state the user typed, so a click
 * can jump to its line) placed by dagre's layered layout (the method of E. R. Gansner et al.,
 * "A technique for drawing directed graphs", IEEE TSE 19(3), 1993, as implemented by
 * @dagrejs/dagre). Runs in the worker; pure apart from dagre.
 *
 * Node boxes and label boxes are sized from their text in a monospaced face, CHAR_W pixels per
 * character and LINE_H per line, so the drawing (which uses the same face) fits them. Several
 * transitions between the same two states share one edge with one line per transition.
 * Transitions with no guard read "always" (first transition) or "otherwise".
 */
import dagre from '@dagrejs/dagre';
import type { Machine, OutBit } from '../../core/model/machine.js';

/** Pixel width of one character of the diagram's monospaced 12 px text. */
export const CHAR_W = 7.3;
/** Line height of the diagram's text. */
export const LINE_H = 16;
const PAD_X = 12;
const PAD_Y = 8;

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
  const chars = Math.max(...lines.map((l) => l.length), 1);
  return { width: Math.ceil(chars * CHAR_W + 2 * PAD_X), height: lines.length * LINE_H + 2 * PAD_Y };
}

/** Lay out the machine; `merged` and `unreachable` come from state minimisation. */
export function layoutDiagram(m: Machine, merged: Readonly<Record<string, string>> = {}, unreachable: readonly string[] = []): DiagramLayout {
  const g = new dagre.graphlib.Graph({ multigraph: false });
  g.setGraph({ rankdir: 'LR', nodesep: 28, ranksep: 56, edgesep: 14, marginx: 16, marginy: 16 });
  g.setDefaultEdgeLabel(() => ({}));
  const names = new Set(m.states.map((s) => s.name));
  const nodeInfo = new Map<string, Omit<LaidNode, 'x' | 'y'>>();
  for (const s of m.states) {
    const outs = outputWords(s.outputs, m.outputs);
    const lines = outs ? [s.name, outs] : [s.name];
    const into = merged[s.name];
    const info = {
      id: s.name,
      ...box(lines),
      lines,
      start: s.name === m.start,
      unreachable: unreachable.includes(s.name),
      ...(into !== undefined && into !== s.name ? { mergedInto: into } : {}),
      ...(s.loc?.line !== undefined ? { line: s.loc.line } : {}),
    };
    nodeInfo.set(s.name, info);
    g.setNode(s.name, { width: info.width, height: info.height });
  }
  const edgeLines = new Map<string, { from: string; to: string; lines: string[]; sourceLines: (number | undefined)[] }>();
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
  for (const e of edgeLines.values()) {
    const b = box(e.lines);
    g.setEdge(e.from, e.to, { width: b.width - PAD_X, height: b.height - PAD_Y, labelpos: 'c' });
  }
  dagre.layout(g);
  const nodes: LaidNode[] = m.states.map((s) => {
    const n = g.node(s.name) as { x: number; y: number };
    const info = nodeInfo.get(s.name) as Omit<LaidNode, 'x' | 'y'>;
    return { ...info, x: n.x, y: n.y };
  });
  const edges: LaidEdge[] = [...edgeLines.values()].map((e) => {
    const l = g.edge(e.from, e.to) as { points: Point[]; x: number; y: number; width: number; height: number };
    return {
      from: e.from,
      to: e.to,
      points: l.points.map((p) => ({ x: p.x, y: p.y })),
      label: { x: l.x, y: l.y, width: l.width, height: l.height },
      lines: e.lines,
      sourceLines: e.sourceLines,
    };
  });
  const graph = g.graph() as { width?: number; height?: number };
  return { width: graph.width ?? 0, height: graph.height ?? 0, nodes, edges };
}
