/**
 * The state diagram of the built (minimised) machine: one box per state with its name, code
 * and Moore outputs; one arrow per pair of states that has transitions, labelled with each
 * guard (a readable expression over the inputs, widened as in readable.ts) and the Mealy
 * outputs taken with it; the start state marked by a heavier outline, a "start" tag and an
 * entry arrow. Rows whose next state is free are listed in the state's box.
 *
 * Method: layered graph drawing (Sugiyama, Tagawa & Toda 1981) by @dagrejs/dagre, rankdir
 * LR; edge labels are laid out as dagre label nodes, so they do not overlap boxes; dagre
 * places self-loops beside their state.
 *
 * Size bound: dagre's time grows about with the square of the arrows (measured on LGSynth'91
 * builds: scf, 94 states and 217 arrows, 0.5 s; s298, 135 states and 627 arrows, 6 s; a
 * 256-state machine, which a build accepts, may have thousands). Past LAYERED_MAX_ITEMS states
 * plus arrows the states are laid out in columns by the fewest clocks from the start state
 * (breadth-first), each column ordered by the barycentre of its neighbours and the crossings then
 * reduced, with the stage-column placement of the schematic (stage-columns.ts, column-order.ts):
 * near-linear, but arrows are smooth lines drawn
 * behind the boxes and a label sits at its arrow's middle, where labels may overlap. A line
 * under such a drawing says so. Every drawing up to the bound is made exactly as before.
 * "Moore output" here means: the same value on every row of the state (mooreOutputs); the
 * rest are shown on the arrows.
 */
import type { Build } from '../model/build.js';
import { layOut, layoutGraph, type LaidEdge, type LaidGraph, type LaidNode } from './dagre.js';
import { stageColumns } from './stage-columns.js';
import { DONT_CARE } from '../model/flat.js';
import { escapeXml } from './escape.js';
import { coverExpr, wrapExpr, wrapJoined } from './readable.js';
import { mooreOutputs, outputsText, rowGroups } from './sheet-logic.js';
import { extentOf, pathThrough, round1, svgBox, svgDocument, svgText, textWidth, type Point } from './svg.js';

const LINE = 13;
const MARGIN = 12;
const WRAP = 34;
/** States plus arrows past which the diagram is laid out in columns by distance (see the module comment). */
export const LAYERED_MAX_ITEMS = 400;
/** The line under a diagram laid out in columns. */
const NOTE_H = 18;

/** A state box; `loop` is its self-loop label (drawn above the box, inside the space dagre reserved). */
export interface DiagramState {
  readonly index: number;
  readonly lines: readonly string[];
  /** Box centre and size. */
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
  readonly start: boolean;
  readonly loop: readonly string[];
  /** The self-loop's guards, one per group of rows (unwrapped). */
  readonly loopGuards: readonly string[];
  /** The whole space reserved for the state: box, self-loop and its label. */
  readonly outer: { readonly x: number; readonly y: number; readonly width: number; readonly height: number };
}

export interface DiagramLayout {
  /** How the states were placed: dagre's layered layout, or columns by distance past the size bound. */
  readonly method: 'layered' | 'columns';
  readonly width: number;
  readonly height: number;
  readonly states: readonly DiagramState[];
  readonly arrows: readonly DiagramArrow[];
}

/** An arrow between two states: its label lines, its guards (one per group of rows, unwrapped), label centre and path. */
export interface DiagramArrow {
  readonly from: number;
  readonly to: number;
  readonly label: readonly string[];
  readonly guards: readonly string[];
  readonly x: number;
  readonly y: number;
  readonly points: readonly Point[];
}

/** Height above a box taken by its self-loop: the arc plus its label. */
const loopSpace = (lines: number): number => (lines === 0 ? 0 : 26 + lines * LINE + 4);

/** A state's box content before layout: its lines, its self-loop label and the box size. */
interface BoxDraft {
  readonly lines: string[];
  readonly loop: string[];
  readonly loopGuards: string[];
  readonly width: number;
  readonly height: number;
}

/** The content of the diagram: a box per state, and per arrow (key `from>to`) its label lines and guards. */
interface DiagramDraft {
  readonly boxes: BoxDraft[];
  readonly labels: Map<string, string[]>;
  readonly guardsOf: Map<string, string[]>;
}

/** What goes into each state's box and onto each arrow, before anything is placed. */
function diagramDraft(build: Build): DiagramDraft {
  const f = build.machine;
  const groups = rowGroups(f);
  const draft: DiagramDraft = { boxes: [], labels: new Map(), guardsOf: new Map() };
  f.states.forEach((name, s) => {
    const moore = mooreOutputs(f, s);
    const lines = [name, build.encoding.bits > 0 ? `code ${build.encoding.codes[s]}` : 'one state'];
    if (moore.size > 0)
      lines.push(
        ...wrapJoined(
          [...moore].map(([k, v]) => `${f.outputs[k]}=${v}`),
          ', ',
          WRAP,
        ),
      );
    const mealy = new Set(f.outputs.map((_, k) => k).filter((k) => !moore.has(k)));
    const loop: string[] = [];
    const loopGuards: string[] = [];
    for (const gr of groups[s]) {
      const raw = f.inputs.length === 0 ? '1' : coverExpr(gr.cubes, f.inputs, { dc: f.never });
      const guard = raw === '1' ? 'always' : raw;
      const outs = mealy.size > 0 ? ` / ${outputsText(f.outputs, gr.out, mealy)}` : '';
      const text = wrapExpr(`${guard}${outs}`, WRAP);
      if (gr.next === DONT_CARE) lines.push(...wrapExpr(`free: ${text.join(' ')}`, WRAP));
      else if (gr.next === s) {
        loop.push(...text);
        loopGuards.push(guard);
      } else {
        const key = `${s}>${gr.next}`;
        draft.labels.set(key, [...(draft.labels.get(key) ?? []), ...text]);
        draft.guardsOf.set(key, [...(draft.guardsOf.get(key) ?? []), guard]);
      }
    }
    const width = Math.max(90, ...lines.map((l, i) => textWidth(l, i === 0 ? 12 : 10, i > 0))) + 22;
    const height = 14 + lines.length * LINE + (s === f.start ? 4 : 0);
    draft.boxes.push({ lines, loop, loopGuards, width, height });
  });
  return draft;
}

/** The space a state takes: its box with its self-loop and label above it. */
function spaceOf(b: BoxDraft): { width: number; height: number } {
  const loopW = b.loop.length > 0 ? Math.max(...b.loop.map((l) => textWidth(l, 10, true))) + 10 : 0;
  return { width: Math.max(b.width, loopW), height: b.height + loopSpace(b.loop.length) };
}

/** Size of an arrow's label. */
const labelSize = (lines: readonly string[]): { width: number; height: number } => ({
  width: Math.max(...lines.map((l) => textWidth(l, 10, true))) + 8,
  height: lines.length * LINE + 4,
});

/** Run dagre: one node per state (tall enough for its self-loop), one labelled edge per arrow. */
function placeDraft(draft: DiagramDraft): LaidGraph {
  const g = layoutGraph({ multigraph: true });
  g.setGraph({ rankdir: 'LR', nodesep: 30, ranksep: 60, edgesep: 14, marginx: 30, marginy: 24 });
  draft.boxes.forEach((b, s) => {
    g.setNode(String(s), spaceOf(b));
  });
  for (const [key, lines] of draft.labels) {
    const [a, b] = key.split('>');
    g.setEdge(a, b, { ...labelSize(lines), labelpos: 'c' }, key);
  }
  return layOut(g);
}

/** Fewest clocks from the start state to each state (breadth-first; a state never reached goes after the rest). */
function distances(states: number, start: number, arrows: readonly (readonly [number, number])[]): number[] {
  const next = Array.from({ length: states }, (): number[] => []);
  for (const [a, b] of arrows) next[a].push(b);
  const dist = new Array<number>(states).fill(-1);
  dist[start] = 0;
  const queue = [start];
  for (let i = 0; i < queue.length; i++)
    for (const t of next[queue[i]])
      if (dist[t] < 0) {
        dist[t] = dist[queue[i]] + 1;
        queue.push(t);
      }
  const far = Math.max(...dist) + 1;
  return dist.map((d) => (d < 0 ? far : d));
}

/** Past the size bound: columns by distance from the start (stage-columns.ts), read as dagre's layout is read. */
function placeInColumns(draft: DiagramDraft, start: number): LaidGraph {
  const arrows = [...draft.labels.keys()].map((k) => k.split('>').map(Number) as [number, number]);
  const rank = distances(draft.boxes.length, start, arrows);
  const laid = stageColumns(
    draft.boxes.map((b, s) => ({ id: String(s), ...spaceOf(b), rank: rank[s], position: s })),
    arrows.map(([a, b]) => ({ from: String(a), to: String(b) })),
  );
  const node = (name: string): LaidNode => {
    const c = laid.centre.get(name) ?? { x: 0, y: 0 };
    return { ...c, ...spaceOf(draft.boxes[Number(name)]) };
  };
  const edge = (from: string, to: string, key?: string): LaidEdge => {
    const points = laid.route(from, to, node(from).y, node(to).y);
    const a = points[1] ?? points[0];
    const b = points[points.length - 2] ?? a;
    return { points, x: (a.x + b.x) / 2, y: (a.y + b.y) / 2, ...labelSize(draft.labels.get(key ?? '') ?? ['']) };
  };
  return { graph: () => ({ width: 0, height: 0 }), node, edge };
}

/** The states as placed: the box sits at the bottom of the space dagre reserved, the loop above it. */
function placedStates(build: Build, draft: DiagramDraft, laid: LaidGraph): DiagramState[] {
  return build.machine.states.map((_, s): DiagramState => {
    const n = laid.node(String(s));
    const b = draft.boxes[s];
    const top = n.y - n.height / 2;
    const outer = { x: n.x - n.width / 2, y: top, width: n.width, height: n.height };
    return {
      index: s,
      lines: b.lines,
      loop: b.loop,
      loopGuards: b.loopGuards,
      x: n.x,
      y: top + n.height - b.height / 2,
      width: b.width,
      height: b.height,
      start: s === build.machine.start,
      outer,
    };
  });
}

/** The arrows as routed, their ends moved from the reserved spaces onto the boxes. */
function placedArrows(draft: DiagramDraft, laid: LaidGraph, states: readonly DiagramState[]): DiagramArrow[] {
  return [...draft.labels].map(([key, label]): DiagramArrow => {
    const [a, b] = key.split('>');
    const e = laid.edge(a, b, key);
    const points = e.points.map((q) => ({ x: q.x, y: q.y }));
    // dagre aims at the centre of the reserved space; end on the box itself.
    const to = states[Number(b)];
    const from = states[Number(a)];
    if (points.length >= 2) {
      points[0] = clampTo(from, points[0]);
      points[points.length - 1] = clampTo(to, points[points.length - 1]);
    }
    return { from: Number(a), to: Number(b), label, guards: draft.guardsOf.get(key) ?? [], x: e.x, y: e.y, points };
  });
}

/** Fit the drawing to everything drawn (dagre may route an arrow outside its own bounds). */
function fitted(
  method: DiagramLayout['method'],
  states: readonly DiagramState[],
  arrows: readonly DiagramArrow[],
): DiagramLayout {
  const ext = extentOf(
    [
      ...states.map((st) => ({
        x: st.outer.x + st.outer.width / 2,
        y: st.outer.y + st.outer.height / 2,
        width: st.outer.width + 44,
        height: st.outer.height + 16,
      })),
      ...arrows.map((a) => ({
        x: a.x,
        y: a.y,
        width: Math.max(...a.label.map((t) => textWidth(t, 10, true))) + 8,
        height: a.label.length * LINE + 4,
      })),
    ],
    arrows.flatMap((a) => a.points),
  );
  const dx = MARGIN - ext.minX;
  const dy = MARGIN - ext.minY;
  const move = (q: Point): Point => ({ x: q.x + dx, y: q.y + dy });
  return {
    method,
    width: Math.max(ext.maxX - ext.minX + 2 * MARGIN, 240),
    height: ext.maxY - ext.minY + 2 * MARGIN + (method === 'layered' ? 0 : NOTE_H),
    states: states.map((st) => ({ ...st, ...move(st), outer: { ...st.outer, ...move(st.outer) } })),
    arrows: arrows.map((a) => ({ ...a, ...move(a), points: a.points.map(move) })),
  };
}

/** Lay out the state diagram. Self-loops are not given to dagre: each state's node is made tall enough for its loop and label. */
export function diagramLayout(build: Build): DiagramLayout {
  const draft = diagramDraft(build);
  const method = draft.boxes.length + draft.labels.size > LAYERED_MAX_ITEMS ? 'columns' : 'layered';
  const laid = method === 'layered' ? placeDraft(draft) : placeInColumns(draft, build.machine.start);
  const states = placedStates(build, draft, laid);
  return fitted(method, states, placedArrows(draft, laid, states));
}

/** Move an end point that dagre put on the reserved space's edge onto the box's edge, keeping its side. */
function clampTo(s: DiagramState, q: Point): Point {
  const top = s.y - s.height / 2;
  const y = Math.min(Math.max(q.y, top + 6), s.y + s.height / 2 - 6);
  const left = s.x - s.width / 2;
  const right = s.x + s.width / 2;
  const x = q.x < s.x ? left : right;
  return { x, y };
}

const STYLE = `
.page { fill: #ffffff; }
.state { fill: #f3f5f2; stroke: #3c4240; stroke-width: 1.2; }
.state-start { stroke-width: 2.6; fill: #eef2ec; }
.sname { font: 600 12px system-ui, sans-serif; fill: #1d2327; }
.sline { font: 10px ui-monospace, Menlo, Consolas, monospace; fill: #3c4240; }
.tag { font: 600 9px system-ui, sans-serif; fill: #3c4240; letter-spacing: 0.6px; }
.arrow { fill: none; stroke: #4a4f4c; stroke-width: 1.1; }
.tip { fill: #4a4f4c; }
.lbg { fill: #ffffff; fill-opacity: 0.92; }
.label { font: 10px ui-monospace, Menlo, Consolas, monospace; fill: #1d2327; }
`;

function tip(points: readonly Point[]): string {
  const a = points[points.length - 2];
  const b = points[points.length - 1];
  const ang = Math.atan2(b.y - a.y, b.x - a.x);
  const t = (r: number, da: number): string =>
    `${round1(b.x - r * Math.cos(ang + da))},${round1(b.y - r * Math.sin(ang + da))}`;
  return `<path d="M${t(8, 0.42)} L${round1(b.x)},${round1(b.y)} L${t(8, -0.42)} L${t(5, 0)} Z" class="tip" />`;
}

/** The state diagram of a build as a self-contained SVG. */
export function diagramSvg(build: Build): string {
  const l = diagramLayout(build);
  const body: string[] = [];
  for (const a of l.arrows) {
    if (a.points.length >= 2) body.push(`<path d="${pathThrough(a.points)}" class="arrow" />`, tip(a.points));
  }
  for (const a of l.arrows) {
    const w = Math.max(...a.label.map((t) => textWidth(t, 10, true))) + 6;
    const h = a.label.length * LINE + 2;
    body.push(
      `<rect x="${round1(a.x - w / 2)}" y="${round1(a.y - h / 2)}" width="${round1(w)}" height="${round1(h)}" rx="3" class="lbg" />`,
    );
    a.label.forEach((t, i) => body.push(svgText(a.x, a.y - h / 2 + 11 + i * LINE, t, 'label')));
  }
  for (const s of l.states) {
    const top = s.y - s.height / 2;
    if (s.loop.length > 0) {
      const x0 = s.x + s.width / 2 - 26;
      const x1 = s.x + s.width / 2 - 10;
      body.push(
        `<path d="M${round1(x0)},${round1(top)} C${round1(x0 - 6)},${round1(top - 26)} ${round1(x1 + 10)},${round1(top - 26)} ${round1(x1)},${round1(top)}" class="arrow" />`,
      );
      body.push(
        tip([
          { x: x1 + 3, y: top - 8 },
          { x: x1, y: top },
        ]),
      );
      const ly = top - 26 - s.loop.length * LINE;
      s.loop.forEach((t, i) => body.push(svgText(s.x, ly + 10 + i * LINE, t, 'label', 'middle')));
    }
    body.push(
      `<g><title>${escapeXml(s.lines[0])}</title>`,
      svgBox(s.x, s.y, s.width, s.height, s.start ? 'state state-start' : 'state', 12),
    );
    s.lines.forEach((t, i) => body.push(svgText(s.x, top + 18 + i * LINE, t, i === 0 ? 'sname' : 'sline')));
    if (s.start) {
      const left = s.x - s.width / 2;
      body.push(svgText(left + 4, top - 5, 'START', 'tag', 'start'));
      body.push(
        `<path d="M${round1(left - 22)},${round1(s.y)} L${round1(left)},${round1(s.y)}" class="arrow" />`,
        tip([
          { x: left - 22, y: s.y },
          { x: left, y: s.y },
        ]),
      );
    }
    body.push('</g>');
  }
  if (l.method === 'columns')
    body.push(
      svgText(
        MARGIN,
        l.height - 8,
        `Laid out in columns by the fewest clocks from the start state (more than ${LAYERED_MAX_ITEMS} states and arrows): arrows run behind the boxes and labels may overlap; the state table has every transition.`,
        'label',
        'start',
      ),
    );
  const f = build.machine;
  return svgDocument(
    l.width,
    l.height,
    `State diagram — ${f.name}`,
    `${f.states.length} states of ${f.name}; arrows labelled guard / Mealy outputs; the start state has a heavier outline${l.method === 'columns' ? '; laid out in columns by distance from the start state' : ''}.`,
    STYLE,
    body,
  );
}
