/**
 * The schematic: every part as a box, every cord branch as a line, flowing left to right
 * through one clock — levers, input inverters and reset driver, φ1 term gates, master
 * latches, φ2 transfer gates, slave latches, output gates, flags and actuators.
 *
 * Method: layered graph drawing (K. Sugiyama, S. Tagawa & M. Toda, "Methods for visual
 * understanding of hierarchical system structures", IEEE Trans. SMC 11(2), 1981) as
 * implemented by @dagrejs/dagre, rankdir LR, with compound nodes: the master latch, the two
 * transfer gates and the slave latch of one state bit sit in one cluster. A latch is drawn as
 * one box with its set side (Q) in the top half and its reset side (Q̄) in the bottom half;
 * its feedback cords are inside the box. Cords that run against the flow of a clock (slave
 * outputs back to the term gates, found by stage order) are laid out reversed so the flow
 * stays left to right, and drawn with their arrow at the true target.
 *
 * Size bound: dagre's ranking (network simplex) and crossing reduction on this compound graph
 * grow much faster than the number of parts — measured on the development machine on LGSynth'91
 * machines: 189 parts 0.6 s, 311 parts 1.3 s, 415 parts 2.1 s, 513 parts 3.1 s, 746 parts 18 s,
 * 931 parts 41 s, 2 152 parts over 13 minutes — so past LAYERED_MAX_PARTS (300) parts, where
 * the layered layout still takes about a second, the schematic is laid out in stage columns instead
 * (stage-columns.ts: near-linear, a few seconds at most for any build within LW407's bound of
 * 256 states), and the drawing says so under its legend. Every part and every cord is drawn
 * either way; the examples and every machine up to the bound are drawn exactly as before.
 *
 * Visual language (our own): plain rounded boxes, each with a small kind label, what the part
 * does in words (roles.ts: "resets M1 when q0 · marble") and, smallest, the part id the wiring
 * list uses; a lever glyph on levers; fills told apart by lightness and outlines by dash
 * pattern so the drawing prints in greyscale; cords solid, clock cords dashed, reset cords
 * dotted, a flag's link to the Z lever it reads thin and dashed without an arrow; a legend of
 * every fill and line along the bottom.
 *
 * Two palettes: `paper` (the default, the document: black on white, readable printed in
 * greyscale) and `screen` (for drawing inline in the designer's page: the colours are the
 * page's theme variables, so the drawing follows light and dark; its rules are scoped to the
 * drawing's own class so they touch nothing else on the page).
 */
import type { Build } from '../model/build.js';
import type { Netlist, Part } from '../model/netlist.js';
import { layOut, layoutGraph, type LaidGraph, type LayoutGraph } from './dagre.js';
import { partRoles } from './roles.js';
import { escapeXml } from './escape.js';
import { extentOf, pathThrough, svgBox, svgDocument, svgText, textWidth, wrapWords, type Point } from './svg.js';
import { stageColumns, type StageColumnOptions } from './stage-columns.js';
import { STAGE_RANK, stagesOf, type StageInfo } from './stages.js';
import type { DocumentUnits } from '../model/units.js';

export type NodeKind =
  'operator' | 'clock' | 'reset' | 'term' | 'helper' | 'master' | 'transfer' | 'slave' | 'output' | 'indicator';

const KIND_LABEL: Readonly<Record<NodeKind, string>> = {
  operator: 'operator lever',
  clock: 'clock lever',
  reset: 'reset lever',
  term: 'φ1 term',
  helper: 'helper gate',
  master: 'master latch',
  transfer: 'φ2 transfer',
  slave: 'slave latch',
  output: 'output gate',
  indicator: 'indicator',
};

const HELPER_LABEL: Readonly<Record<string, string>> = {
  inverter: 'inverter',
  buffer: 'buffer',
  'reset-driver': 'reset driver',
};

export interface SchematicNode {
  readonly id: string;
  readonly kind: NodeKind;
  /** The kind in words ("φ1 term"). */
  readonly label: string;
  /** What the part does, in words (roles.ts). */
  readonly detail: string;
  /** `detail` broken into the lines drawn in the box. */
  readonly lines: readonly string[];
  /** Full name and id, shown as a tooltip. */
  readonly title: string;
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
}

export interface SchematicEdge {
  readonly cord: string;
  readonly from: string;
  readonly to: string;
  readonly style: 'cord' | 'clock' | 'reset' | 'reads';
  readonly points: readonly Point[];
}

export interface SchematicLayout {
  /** How the parts were placed: dagre's layered layout, or stage columns past the size bound. */
  readonly method: 'layered' | 'stage-columns';
  readonly width: number;
  readonly height: number;
  readonly nodes: readonly SchematicNode[];
  readonly clusters: readonly {
    readonly id: string;
    readonly label: string;
    readonly x: number;
    readonly y: number;
    readonly width: number;
    readonly height: number;
  }[];
  readonly edges: readonly SchematicEdge[];
}

function kindOf(p: Part, latchRole: ReadonlyMap<string, 'master' | 'slave'>): NodeKind {
  switch (p.kind) {
    case 'lever':
      return p.role === 'input' ? 'operator' : p.role === 'reset' ? 'reset' : 'clock';
    case 'latch':
      return p.role;
    case 'flag':
    case 'actuator':
      return 'indicator';
    case 'gate':
      if (p.role === 'term' || p.role === 'transfer' || p.role === 'output') return p.role;
      if (p.role === 'latch-set' || p.role === 'latch-reset') return latchRole.get(p.latch ?? '') ?? 'master';
      return 'helper';
  }
}

const MARGIN = 16;
const LEGEND_H = 50;
/** The line under the legend that says a drawing is laid out in stage columns. */
const NOTE_H = 14;
/** Parts past which the schematic is laid out in stage columns (see the module comment). */
export const LAYERED_MAX_PARTS = 300;
/** The legend's width, so a small machine's drawing still shows all of it. */
const LEGEND_W = 1060;
/** Characters per line of a box's role words, and lines at most. */
const ROLE_CHARS = 30;
const ROLE_LINES = 2;
/** Line height of the role words (10 px text). */
const ROLE_LINE_H = 12;

type NodeInfo = {
  kind: NodeKind;
  label: string;
  detail: string;
  lines: string[];
  title: string;
  width: number;
  height: number;
};

/** A cord branch (or a flag's link to its Z lever) before layout. */
interface EdgeDraft {
  readonly cord: string;
  readonly from: string;
  readonly to: string;
  readonly style: SchematicEdge['style'];
  /** Laid out against the flow (from a later stage back to an earlier one). */
  readonly reversed: boolean;
  readonly name: string;
  /** Latch side of each end: -1 set (Q, top half), 1 reset (Q̄, bottom half), 0 neither. */
  readonly fromSide: number;
  readonly toSide: number;
}

/** Which parts are drawn, and the drawn node of every part (a latch's two gates are drawn as the latch). */
function drawnParts(net: Netlist): { shown: Part[]; nodeOf: Map<string, string> } {
  const isLatchGate = (p: Part): boolean =>
    p.kind === 'gate' && p.latch !== undefined && (p.role === 'latch-set' || p.role === 'latch-reset');
  const shown = net.parts.filter((p) => !isLatchGate(p));
  const nodeOf = new Map<string, string>();
  for (const p of net.parts) nodeOf.set(p.id, isLatchGate(p) && p.kind === 'gate' ? (p.latch ?? p.id) : p.id);
  return { shown, nodeOf };
}

/** Height of a box: kind label, its role lines and its id (a latch also has its two side labels). */
function boxHeight(kind: NodeKind, lines: number): number {
  return (kind === 'master' || kind === 'slave' ? 52 : 34) + lines * ROLE_LINE_H;
}

/** One node per drawn part, sized for its kind label, role words and id. */
function addPartNodes(
  g: LayoutGraph,
  net: Netlist,
  shown: readonly Part[],
  units: DocumentUnits,
): Map<string, NodeInfo> {
  const latchRole = new Map<string, 'master' | 'slave'>();
  for (const p of net.parts) if (p.kind === 'latch') latchRole.set(p.id, p.role);
  const roles = partRoles(net, units);
  const info = new Map<string, NodeInfo>();
  for (const p of shown) {
    const kind = kindOf(p, latchRole);
    const label =
      kind === 'helper' && p.kind === 'gate'
        ? (HELPER_LABEL[p.role] ?? KIND_LABEL.helper)
        : kind === 'indicator'
          ? p.kind
          : KIND_LABEL[kind];
    const detail = roles.get(p.id)?.does ?? p.name;
    const lines = wrapWords(detail, ROLE_CHARS, ROLE_LINES);
    const width =
      Math.max(textWidth(label, 9), textWidth(p.id, 9, true), ...lines.map((l) => textWidth(l, 10))) +
      (kind === 'operator' || kind === 'clock' || kind === 'reset' ? 34 : 18);
    const height = boxHeight(kind, lines.length);
    g.setNode(p.id, { width, height });
    info.set(p.id, { kind, label, detail, lines, title: `${p.name} (${p.id})`, width, height });
  }
  return info;
}

/** The state bit of a latch or a transfer gate (`tr<bit>.…`); undefined for any other part. */
function bitOf(p: Part): number | undefined {
  if (p.kind === 'latch') return p.bit;
  const m = p.kind === 'gate' && p.role === 'transfer' ? /^tr(\d+)\./.exec(p.id) : null;
  return m ? Number(m[1]) : undefined;
}

/** One cluster per state bit around its latches and transfer gates; returns the cluster of each bit. */
function addBitClusters(g: LayoutGraph, shown: readonly Part[]): Map<number, string> {
  const clusters = new Map<number, string>();
  for (const p of shown) {
    const bit = bitOf(p);
    if (bit === undefined) continue;
    let c = clusters.get(bit);
    if (!c) {
      c = `bit ${bit}`;
      clusters.set(bit, c);
      g.setNode(c, { label: `state bit q${bit}`, paddingTop: 18 });
    }
    g.setParent(p.id, c);
  }
  return clusters;
}

/** How a cord driven by `d` is drawn. */
function cordStyle(d: Part | undefined): SchematicEdge['style'] {
  if (d?.kind === 'lever' && (d.role === 'phi1' || d.role === 'phi2')) return 'clock';
  if (d?.kind === 'lever' && d.role === 'reset') return 'reset';
  if (d?.kind === 'gate' && d.role === 'reset-driver') return 'reset';
  return 'cord';
}

/** Every cord branch between two different drawn nodes, then every flag's link to the Z lever it reads. */
function edgeDrafts(g: LayoutGraph, net: Netlist, nodeOf: ReadonlyMap<string, string>, stages: StageInfo): EdgeDraft[] {
  const drafts: EdgeDraft[] = [];
  const byId = new Map(net.parts.map((p) => [p.id, p]));
  const side = (id: string): number => {
    const p = byId.get(id);
    if (p?.kind !== 'gate' || p.latch === undefined) return 0;
    return p.role === 'latch-set' ? -1 : p.role === 'latch-reset' ? 1 : 0;
  };
  for (const c of net.cords) {
    const from = nodeOf.get(c.driver) ?? c.driver;
    const style = cordStyle(byId.get(c.driver));
    const targets = [...c.ports.map((r) => r.part), ...c.actuators];
    targets.forEach((t, i) => {
      const to = nodeOf.get(t) ?? t;
      if (to === from || !g.hasNode(to) || !g.hasNode(from)) return;
      const reversed = stages.compare(from, to) > 0;
      drafts.push({
        cord: c.id,
        from,
        to,
        style,
        reversed,
        name: `${c.id}#${i}`,
        fromSide: side(c.driver),
        toSide: side(t),
      });
    });
  }
  for (const p of net.parts) {
    if (p.kind === 'flag' && p.fixed === undefined && g.hasNode(nodeOf.get(p.gate) ?? p.gate)) {
      const from = nodeOf.get(p.gate) ?? p.gate;
      drafts.push({
        cord: '',
        from,
        to: p.id,
        style: 'reads',
        reversed: false,
        name: `${p.id}#z`,
        fromSide: 0,
        toSide: 0,
      });
    }
  }
  return drafts;
}

/** The route of each edge in drawing order, its ends moved to a latch's set or reset half. */
function placedEdges(laid: LaidGraph, drafts: readonly EdgeDraft[], nodes: readonly SchematicNode[]): SchematicEdge[] {
  const byId = new Map(nodes.map((n) => [n.id, n]));
  return drafts.map((e) => {
    const raw = (e.reversed ? laid.edge(e.to, e.from, e.name) : laid.edge(e.from, e.to, e.name)).points;
    const pts: Point[] = (e.reversed ? [...raw].reverse() : [...raw]).map((q) => ({ x: q.x, y: q.y }));
    // Latch sides: Q leaves from the top half, Q̄ from the bottom; set ports in the top half, reset ports in the bottom.
    const a = byId.get(e.from);
    const b = byId.get(e.to);
    if (pts.length > 0 && a && e.fromSide !== 0) pts[0] = { x: pts[0].x, y: a.y + (e.fromSide * a.height) / 4 };
    if (pts.length > 0 && b && e.toSide !== 0)
      pts[pts.length - 1] = { x: pts[pts.length - 1].x, y: b.y + (e.toSide * b.height) / 4 };
    return { cord: e.cord, from: e.from, to: e.to, style: e.style, points: pts };
  });
}

/** dagre may route a reversed cord outside its own bounds: fit the drawing to everything drawn. */
function fitted(
  method: SchematicLayout['method'],
  nodes: readonly SchematicNode[],
  clusters: SchematicLayout['clusters'],
  edges: readonly SchematicEdge[],
): SchematicLayout {
  const ext = extentOf(
    [
      ...nodes,
      ...clusters.map((c) => ({ x: c.x + c.width / 2, y: c.y + c.height / 2, width: c.width, height: c.height })),
    ],
    edges.flatMap((e) => e.points),
  );
  const dx = MARGIN - ext.minX;
  const dy = MARGIN - ext.minY;
  const move = (q: Point): Point => ({ x: q.x + dx, y: q.y + dy });
  return {
    method,
    width: Math.max(ext.maxX - ext.minX + 2 * MARGIN, LEGEND_W),
    height: ext.maxY - ext.minY + 2 * MARGIN + legendHeight(method),
    nodes: nodes.map((n) => ({ ...n, ...move(n) })),
    clusters: clusters.map((c) => ({ ...c, ...move(c) })),
    edges: edges.map((e) => ({ ...e, points: e.points.map(move) })),
  };
}

const legendHeight = (method: SchematicLayout['method']): number =>
  method === 'layered' ? LEGEND_H : LEGEND_H + NOTE_H;

/** The parts, their words and sizes, and every cord branch, before layout. */
interface Drafted {
  readonly g: LayoutGraph;
  readonly shown: readonly Part[];
  readonly info: ReadonlyMap<string, NodeInfo>;
}

/** Place every part with dagre (see the module comment). */
function layeredLayout(
  net: Netlist,
  { g, shown, info }: Drafted,
  nodeOf: ReadonlyMap<string, string>,
): SchematicLayout {
  const clusters = addBitClusters(g, shown);
  const drafts = edgeDrafts(g, net, nodeOf, stagesOf(net));
  for (const e of drafts) {
    if (e.reversed) g.setEdge(e.to, e.from, { weight: 1, minlen: 1 }, e.name);
    else g.setEdge(e.from, e.to, { weight: e.style === 'reads' ? 4 : 2, minlen: 1 }, e.name);
  }
  const laid = layOut(g);

  const nodes: SchematicNode[] = shown.map((p) => {
    const n = laid.node(p.id);
    const i = info.get(p.id) as NodeInfo;
    return { id: p.id, ...i, x: n.x, y: n.y, width: n.width, height: n.height };
  });
  const cl = [...clusters.values()].map((id) => {
    const n = laid.node(id);
    return { id, label: n.label ?? id, x: n.x - n.width / 2, y: n.y - n.height / 2, width: n.width, height: n.height };
  });
  return fitted('layered', nodes, cl, placedEdges(laid, drafts, nodes));
}

/** Place every part in stage columns (stage-columns.ts), past the layered layout's size bound. */
function columnLayout(
  net: Netlist,
  { g, shown, info }: Drafted,
  nodeOf: ReadonlyMap<string, string>,
  options: StageColumnOptions,
): SchematicLayout {
  const stages = stagesOf(net);
  const drafts = edgeDrafts(g, net, nodeOf, stages);
  const laid = stageColumns(
    shown.map((p) => {
      const i = info.get(p.id) as NodeInfo;
      const rank = STAGE_RANK[stages.stage.get(p.id) ?? 'indicator'];
      return {
        id: p.id,
        width: i.width,
        height: i.height,
        rank,
        position: stages.position.get(p.id) ?? 0,
        bit: bitOf(p),
      };
    }),
    drafts,
    options,
  );
  const nodes: SchematicNode[] = shown.map((p) => {
    const c = laid.centre.get(p.id) ?? { x: 0, y: 0 };
    return { id: p.id, ...(info.get(p.id) as NodeInfo), x: c.x, y: c.y };
  });
  const byId = new Map(nodes.map((n) => [n.id, n]));
  // Latch sides as in the layered drawing: Q and set ports in the top half, Q̄ and reset ports in the bottom.
  const endY = (id: string, side: number): number => {
    const n = byId.get(id);
    return (n?.y ?? 0) + (side * (n?.height ?? 0)) / 4;
  };
  const edges = drafts.map((e) => ({
    cord: e.cord,
    from: e.from,
    to: e.to,
    style: e.style,
    points: laid.route(e.from, e.to, endY(e.from, e.fromSide), endY(e.to, e.toSide)),
  }));
  const clusters = laid.bands.map((b) => ({
    id: `bit ${b.bit}`,
    label: `state bit q${b.bit}`,
    x: b.x,
    y: b.y,
    width: b.width,
    height: b.height,
  }));
  return fitted('stage-columns', nodes, clusters, edges);
}

/**
 * Place every part: with dagre's layered layout up to LAYERED_MAX_PARTS parts, in stage columns
 * past it (see the module comment; `options` apply to the stage columns only); an actuator's
 * load in `units`.
 */
export function schematicLayout(
  build: Build,
  options: StageColumnOptions = {},
  units: DocumentUnits = 'metric',
): SchematicLayout {
  const net = build.netlist;
  const { shown, nodeOf } = drawnParts(net);
  const g = layoutGraph({ compound: true, multigraph: true });
  g.setGraph({ rankdir: 'LR', nodesep: 14, ranksep: 46, edgesep: 8, marginx: MARGIN, marginy: MARGIN });
  g.setDefaultEdgeLabel(() => ({}));
  const drafted = { g, shown, info: addPartNodes(g, net, shown, units) };
  return net.parts.length > LAYERED_MAX_PARTS
    ? columnLayout(net, drafted, nodeOf, options)
    : layeredLayout(net, drafted, nodeOf);
}

/** The palettes: the paper one for documents, the screen one taking the page's theme variables. */
export interface SchematicOptions {
  readonly palette?: 'paper' | 'screen';
  /** The workshop's units of an actuator's load (model/units.ts); metric unless told. */
  readonly units?: DocumentUnits;
}

const PAPER = {
  page: '#ffffff',
  clusterFill: '#f7f7f4',
  clusterLine: '#b9bdb8',
  clusterText: '#4a4f4c',
  line: '#3c4240',
  ink: '#1d2327',
  soft: '#5a605d',
  edge: '#4a4f4c',
  edgeSoft: '#6b716e',
  edgeFaint: '#8a908d',
  fill: {
    lever: '#ffffff',
    term: '#e6ebf0',
    helper: '#f1f1f1',
    master: '#efe7d6',
    transfer: '#e9e4ef',
    slave: '#dfe9e1',
    output: '#f2e3de',
    indicator: '#ffffff',
  },
};

/** The designer's theme variables (src/web/styles/theme.css); a fill is a tint of an accent over the panel. */
const tint = (accent: string, pct: number): string => `color-mix(in srgb, var(${accent}) ${pct}%, var(--lw-panel))`;
const SCREEN: typeof PAPER = {
  page: 'var(--lw-panel)',
  clusterFill: 'var(--lw-sunk)',
  clusterLine: 'var(--lw-line)',
  clusterText: 'var(--lw-ink-soft)',
  line: 'var(--lw-ink-soft)',
  ink: 'var(--lw-ink)',
  soft: 'var(--lw-ink-soft)',
  edge: 'var(--lw-ink-soft)',
  edgeSoft: 'var(--lw-ink-soft)',
  edgeFaint: 'var(--lw-line)',
  fill: {
    lever: 'var(--lw-panel)',
    term: tint('--lw-info', 18),
    helper: 'var(--lw-sunk)',
    master: tint('--lw-brass', 22),
    transfer: tint('--lw-x', 18),
    slave: tint('--lw-ok', 18),
    output: tint('--lw-cord', 18),
    indicator: 'var(--lw-panel)',
  },
};

/** The style sheet of one palette; `scope` prefixes every rule (the screen drawing's own class). */
function styleOf(c: typeof PAPER, scope: string): string {
  const rules: [string, string][] = [
    ['.page', `fill: ${c.page};`],
    ['.cluster', `fill: ${c.clusterFill}; stroke: ${c.clusterLine}; stroke-width: 1; stroke-dasharray: 6 3;`],
    ['.cluster-label', `font: 600 10px system-ui, sans-serif; fill: ${c.clusterText};`],
    ['.box', `stroke: ${c.line}; stroke-width: 1.2;`],
    ['.k-operator, .k-clock, .k-reset', `fill: ${c.fill.lever}; stroke-width: 1.8;`],
    ['.k-term', `fill: ${c.fill.term};`],
    ['.k-helper', `fill: ${c.fill.helper}; stroke-dasharray: 3 2;`],
    ['.k-master', `fill: ${c.fill.master};`],
    ['.k-transfer', `fill: ${c.fill.transfer};`],
    ['.k-slave', `fill: ${c.fill.slave};`],
    ['.k-output', `fill: ${c.fill.output};`],
    ['.k-indicator', `fill: ${c.fill.indicator}; stroke-dasharray: 1.5 2;`],
    ['.kind', `font: 9px system-ui, sans-serif; fill: ${c.soft}; letter-spacing: 0.4px;`],
    ['.role', `font: 10px system-ui, sans-serif; fill: ${c.ink};`],
    ['.pid', `font: 9px ui-monospace, Menlo, Consolas, monospace; fill: ${c.soft};`],
    ['.half', `stroke: ${c.line}; stroke-width: 0.8; stroke-dasharray: 2 2;`],
    ['.side', `font: 8px system-ui, sans-serif; fill: ${c.soft};`],
    ['.glyph', `stroke: ${c.ink}; stroke-width: 1.6; fill: none; stroke-linecap: round;`],
    ['.pivot', `fill: ${c.ink};`],
    ['.e', `fill: none; stroke: ${c.edge}; stroke-width: 1;`],
    ['.e-clock', `stroke-dasharray: 6 3; stroke: ${c.edgeSoft};`],
    ['.e-reset', `stroke-dasharray: 1.5 2.5; stroke: ${c.edgeSoft};`],
    ['.e-reads', `stroke-dasharray: 3 3; stroke: ${c.edgeFaint}; stroke-width: 0.8;`],
    ['.tip', `fill: ${c.edge};`],
    ['.legend', `font: 9px system-ui, sans-serif; fill: ${c.ink};`],
  ];
  const scoped = (sel: string): string =>
    scope
      ? sel
          .split(', ')
          .map((x) => `${scope} ${x}`)
          .join(', ')
      : sel;
  return ['', ...rules.map(([sel, body]) => `${scoped(sel)} { ${body} }`), ''].join('\n');
}

/** The class the screen drawing carries, scoping its style sheet. */
const SCREEN_SCOPE = 'lw-schematic';

function nodeSvg(n: SchematicNode): string {
  const top = n.y - n.height / 2;
  const parts = [`<g><title>${escapeXml(n.title)}</title>`];
  parts.push(svgBox(n.x, n.y, n.width, n.height, `box k-${n.kind}`));
  const lever = n.kind === 'operator' || n.kind === 'clock' || n.kind === 'reset';
  const cx = lever ? n.x - 8 : n.x;
  const roleLines = (y0: number): string[] => n.lines.map((l, i) => svgText(cx, y0 + i * ROLE_LINE_H, l, 'role'));
  if (n.kind === 'master' || n.kind === 'slave') {
    // The set side (Q) is the top half of the box, the reset side (Q̄) the bottom half.
    parts.push(`<line x1="${n.x - n.width / 2}" y1="${n.y}" x2="${n.x + n.width / 2}" y2="${n.y}" class="half" />`);
    parts.push(
      svgText(n.x - n.width / 2 + 4, top + 10, 'Q · set', 'side', 'start'),
      svgText(n.x - n.width / 2 + 4, n.y + n.height / 2 - 4, 'Q̄ · reset', 'side', 'start'),
      svgText(n.x + n.width / 2 - 4, n.y + n.height / 2 - 4, n.id, 'pid', 'end'),
      svgText(cx, n.y - 6, n.label, 'kind'),
      ...roleLines(n.y + 12),
    );
  } else {
    parts.push(
      svgText(cx, top + 12, n.label, 'kind'),
      ...roleLines(top + 25),
      svgText(cx, top + 25 + n.lines.length * ROLE_LINE_H, n.id, 'pid'),
    );
  }
  if (lever) {
    // Lever glyph: a bar on a pivot, tipped down at the handle end.
    const gx = n.x + n.width / 2 - 14;
    const gy = n.y;
    parts.push(
      `<line x1="${gx - 7}" y1="${gy - 5}" x2="${gx + 7}" y2="${gy + 5}" class="glyph" />`,
      `<circle cx="${gx}" cy="${gy}" r="2" class="pivot" />`,
    );
  }
  parts.push('</g>');
  return parts.join('');
}

function edgeSvg(e: SchematicEdge): string {
  if (e.points.length < 2) return '';
  const d = pathThrough(e.points);
  const cls = e.style === 'cord' ? 'e' : `e e-${e.style}`;
  const line = `<path d="${d}" class="${cls}" />`;
  if (e.style === 'reads') return line;
  const a = e.points[e.points.length - 2];
  const b = e.points[e.points.length - 1];
  const ang = Math.atan2(b.y - a.y, b.x - a.x);
  const t = (r: number, da: number): string =>
    `${(b.x - r * Math.cos(ang + da)).toFixed(1)},${(b.y - r * Math.sin(ang + da)).toFixed(1)}`;
  return `${line}<path d="M${t(7, 0.45)} L${b.x.toFixed(1)},${b.y.toFixed(1)} L${t(7, -0.45)} L${t(4.5, 0)} Z" class="tip" />`;
}

function legendSvg(y: number, l: SchematicLayout): string {
  const kinds: [NodeKind, string][] = [
    ['operator', 'lever'],
    ['term', 'φ1 term'],
    ['master', 'master latch'],
    ['transfer', 'φ2 transfer'],
    ['slave', 'slave latch'],
    ['output', 'output gate'],
    ['helper', 'inverter, buffer, reset driver'],
    ['indicator', 'flag or actuator'],
  ];
  let x = MARGIN;
  const out: string[] = [];
  for (const [k, words] of kinds) {
    out.push(
      `<rect x="${x}" y="${y}" width="14" height="10" rx="2" class="box k-${k}" />`,
      svgText(x + 18, y + 9, words, 'legend', 'start'),
    );
    x += 30 + textWidth(words, 9);
  }
  const lines: [string, string][] = [
    ['e', 'cord'],
    ['e e-clock', 'clock cord'],
    ['e e-reset', 'reset cord'],
    ['e e-reads', 'flag reads Z'],
  ];
  for (const [cls, words] of lines) {
    out.push(
      `<path d="M${x},${y + 5} L${x + 22},${y + 5}" class="${cls}" />`,
      svgText(x + 26, y + 9, words, 'legend', 'start'),
    );
    x += 38 + textWidth(words, 9);
  }
  out.push(
    svgText(
      MARGIN,
      y + 25,
      'Each box: its kind, what it does (q0 is state bit 0, M0 its next value; a · b both, !a not), and its id in the wiring list.',
      'legend',
      'start',
    ),
  );
  if (l.method === 'stage-columns')
    out.push(
      svgText(
        MARGIN,
        y + 39,
        `Laid out in stage columns (more than ${LAYERED_MAX_PARTS} parts): each box stands in the column of its stage, near the boxes it is tied to; cords run behind the boxes, and the wiring list gives each cord's ends.`,
        'legend',
        'start',
      ),
    );
  return out.join('');
}

/**
 * The schematic of a build as a self-contained SVG (from its layout, when already made), in the
 * paper palette unless told otherwise.
 */
export function schematicSvg(build: Build, layout?: SchematicLayout, options: SchematicOptions = {}): string {
  const l = layout ?? schematicLayout(build, {}, options.units);
  const screen = options.palette === 'screen';
  const body: string[] = [];
  for (const c of l.clusters)
    body.push(
      `<rect x="${c.x.toFixed(1)}" y="${c.y.toFixed(1)}" width="${c.width.toFixed(1)}" height="${c.height.toFixed(1)}" rx="10" class="cluster" />`,
      svgText(c.x + 8, c.y + 12, c.label, 'cluster-label', 'start'),
    );
  for (const e of l.edges) body.push(edgeSvg(e));
  for (const n of l.nodes) body.push(nodeSvg(n));
  body.push(legendSvg(l.height - legendHeight(l.method) + 12, l));
  const f = build.machine;
  return svgDocument(
    l.width,
    l.height,
    `Schematic — ${f.name}`,
    `${l.nodes.length} parts and ${l.edges.length} cord branches of the lever machine ${f.name}, flowing left to right through one clock${l.method === 'stage-columns' ? ', laid out in stage columns' : ''}.`,
    screen ? styleOf(SCREEN, `.${SCREEN_SCOPE}`) : styleOf(PAPER, ''),
    body,
    '',
    screen ? SCREEN_SCOPE : undefined,
  );
}
