/**
 * frame.svg: the front elevation of the frame, to scale — drums, bays (numbered and labelled
 * with what each does), lever ends on the pivot rail, capstan wraps, every cord as its tree
 * (physics/routing.ts: one drop, a run each way along each channel, a rise from a knot to each
 * lever — each stretch drawn once, with the branch whose piece it is) and a pulley or pin at
 * each corner and rise, drum lengths and heights, a scale bar, and a key of every bay.
 *
 * Geometry: every position and length comes from the placement and its routing (phases/place,
 * physics/routing.ts) and the profile's frame fields; one scale (1:s, the smallest of the usual
 * drawing scales that fits the longest drum into MAX_WIDTH_MM and the stack of drums, channel
 * to lever ends, into MAX_HEIGHT_MM) maps metres to millimetres on paper, and the SVG's width
 * and height are in millimetres, so a print at 100 % is to scale; the title names the smallest
 * ISO 216 sheet that holds the whole drawing at that size.
 * Drawing conventions, said on the drawing: runs along a cord channel, which all lie at
 * the channel's level, are drawn apart in lanes below it so each can be followed (lanes by the
 * left-edge algorithm: A. Hashimoto & J. Stevens, "Wire routing by optimizing channel
 * assignment within large apertures", 8th Design Automation Workshop, 1971 — from memory);
 * a lever is shown as the end of its blank, LEVER_END_M tall, and the cords tied to one lever rise
 * side by side across it (riseShifts), each on its own line. Cords are coloured from the
 * palette of M. Okabe & K. Ito, "Color Universal Design" (2008), which colour-blind readers
 * can tell apart. Labels too long for the space between two drums are cut short; the key
 * under the drawing has every bay's words in full.
 * Every lever end carries its part, lever, drum and bay (data-part, data-lever, data-drum,
 * data-bay) and every branch its cord, target, driver and lever, so a page can light a cord's
 * run and both its ends; the screen palette adds each branch's whole path (class `route`,
 * data-route-cord, data-route-target), unseen until the page lights it. Two palettes: `paper` (the default, the document) and `screen` (the
 * designer's theme variables, light or dark, its rules scoped to the drawing's own class).
 * Units: the profile's `documentUnits` chooses what the words on the drawing say — metres and
 * millimetres, or feet and inches (model/units.ts: dimensions to the nearest sixteenth, cut lengths
 * as the cut list rounds them up, sizes in inches) with a scale bar of whole inches or feet. The
 * geometry is the same either way: the SVG is sized in millimetres, so a print at 100 % is to scale.
 * Pure; every user-given name is escaped (svg.ts, escape.ts).
 */
import type { Build } from '../model/build.js';
import type { Part } from '../model/netlist.js';
import { wrapsOf } from '../physics/capstan.js';
import type { Placement, PlacedBayInfo, PlacedDrum } from '../phases/place/index.js';
import type { Profile } from '../physics/profile.js';
import type { BranchRoute, CordRun, RoutePoint } from '../physics/routing.js';
import {
  fixed,
  inchesOf,
  inMetres,
  inMillimetres,
  METRES_PER_INCH,
  quantitiesFor,
  trimmed,
  type DocumentUnits,
  type Quantities,
} from '../model/units.js';
import { escapeXml as x } from './escape.js';
import { partWords } from './part-words.js';
import { clip, round1 as r1, svgDocument, svgText, wrapWords } from './svg.js';

/** Usual drawing scales, 1:s. */
const SCALES = [1, 2, 5, 10, 20, 25, 50, 100, 200, 500, 1000];
/** Widest elevation on paper, mm (an A4 sheet in landscape holds 269 mm inside 14 mm margins). */
export const MAX_WIDTH_MM = 250;
/** Tallest elevation on paper, mm, from the lowest cord channel to the highest lever end (labels and key apart). */
export const MAX_HEIGHT_MM = 200;
/** ISO 216 A-series sheets, portrait width × height in mm. */
const SHEETS: readonly (readonly [string, number, number])[] = [
  ['A4', 210, 297],
  ['A3', 297, 420],
  ['A2', 420, 594],
  ['A1', 594, 841],
  ['A0', 841, 1189],
];
const MARGIN = 10;
const FONT = 2.2;
/** Font sizes of the title block's `sub` and `note` lines, mm (as in STYLE). */
const SUB_FONT = 2.6;
const NOTE_FONT = 2.3;
const GLYPH = 0.56;
/** Height of a lever's end shown above the rail (a drawing convention, not a dimension). */
const LEVER_END_M = 0.05;
/** Okabe–Ito colours without the yellow, too pale on white. */
const PALETTE = ['#0072B2', '#D55E00', '#009E73', '#CC79A7', '#E69F00', '#56B4E9', '#000000'];

/** The drawing scale 1:s for a frame `lengthM` long and `heightM` high (lowest channel to highest lever end). */
export function frameScale(lengthM: number, heightM = 0): number {
  const fits = (s: number): boolean => (lengthM * 1000) / s <= MAX_WIDTH_MM && (heightM * 1000) / s <= MAX_HEIGHT_MM;
  return (
    SCALES.find(fits) ??
    Math.max(Math.ceil((lengthM * 1000) / MAX_WIDTH_MM), Math.ceil((heightM * 1000) / MAX_HEIGHT_MM))
  );
}

/** An ISO 216 A sheet as it must lie to hold a drawing: its name, which way up, and its size in mm. */
export interface IsoSheet {
  readonly name: string;
  readonly orientation: 'portrait' | 'landscape';
  readonly widthMm: number;
  readonly heightMm: number;
}

/** The smallest ISO 216 A sheet, upright first, then turned, that holds a drawing `w` × `h` mm at 100 % (undefined past A0). */
export function isoSheetFor(w: number, h: number): IsoSheet | undefined {
  for (const [name, a, b] of SHEETS) {
    if (w <= a && h <= b) return { name, orientation: 'portrait', widthMm: a, heightMm: b };
    if (w <= b && h <= a) return { name, orientation: 'landscape', widthMm: b, heightMm: a };
  }
  return undefined;
}

/** The sheet of `isoSheetFor` in the drawing's words ('' past A0): 'A3 sheet, portrait,'. */
export function paperFor(w: number, h: number): string {
  const s = isoSheetFor(w, h);
  return s ? `${s.name} sheet, ${s.orientation},` : '';
}

/** A channel run of one branch and its lane. */
interface Lane {
  readonly branch: BranchRoute;
  /** The drum whose channel the run lies in, as the routing recorded it. */
  readonly channelDrum: number;
  readonly lane: number;
}

/** Which side of its capstan a run along the channel goes (0 left, 1 right), as routing.ts serves them. */
const sideOf = (run: CordRun): number => (run.to.xM < run.from.xM ? 0 : 1);
/** The key of one side of one cord's tree in one channel (the channel by its drum, as routed). */
const sideKey = (cord: string, run: CordRun): string => `${cord}|${run.drum}|${sideOf(run)}`;

/**
 * Lanes per channel by the left-edge algorithm: the channel runs of every cord's tree (each drawn
 * once, by the branch that owns it), sorted by their left end, each in the first lane free there.
 * Channels are keyed by the drum each run records; `count` gives each drum's channel its lanes.
 */
function assignLanes(branches: readonly BranchRoute[]): { lanes: Map<BranchRoute, Lane>; count: Map<number, number> } {
  const byChannel = new Map<number, { b: BranchRoute; lo: number; hi: number }[]>();
  for (const b of branches) {
    const run = b.own.find((r) => r.kind === 'channel');
    if (!run) continue;
    const list = byChannel.get(run.drum) ?? [];
    list.push({ b, lo: Math.min(run.from.xM, run.to.xM), hi: Math.max(run.from.xM, run.to.xM) });
    byChannel.set(run.drum, list);
  }
  const lanes = new Map<BranchRoute, Lane>();
  const count = new Map<number, number>();
  for (const [drum, list] of byChannel) {
    list.sort((a, b) => a.lo - b.lo || a.hi - b.hi);
    const ends: number[] = [];
    for (const it of list) {
      let k = ends.findIndex((e) => e < it.lo - 1e-9);
      if (k === -1) k = ends.push(it.hi) - 1;
      else ends[k] = it.hi;
      lanes.set(it.b, { branch: it.b, channelDrum: drum, lane: k });
    }
    count.set(drum, ends.length);
  }
  return { lanes, count };
}

interface Sheet {
  readonly k: number;
  readonly scale: number;
  readonly originY: number;
  readonly laneMm: number;
  /** Depth below a channel's level of its first lane, mm (clear of the pulleys drawn there). */
  readonly laneStart: number;
  X(m: number): number;
  Y(m: number): number;
}

const STYLE = `
.page { fill: #ffffff; }
text { stroke: none; }
.title { font: 600 4px system-ui, sans-serif; fill: #1d2327; }
.sub { font: 2.6px system-ui, sans-serif; fill: #3c4240; }
.drum { fill: #e9dcc4; stroke: #6b5a3c; stroke-width: 0.3; }
.wraps { fill: url(#wrap-hatch); stroke: #6b5a3c; stroke-width: 0.2; }
.rail { stroke: #4a4f4c; stroke-width: 0.6; }
.bay { stroke: #9aa19d; stroke-width: 0.15; stroke-dasharray: 0.8 0.8; }
.lever { fill: #cfd8d3; stroke: #2f3532; stroke-width: 0.15; }
.lever.z { fill: #7d8a84; }
.lever.hand { fill: #f2c14e; }
.pivot { fill: #1d2327; }
.cord { fill: none; stroke-width: 0.3; stroke-linejoin: round; }
.pulley { fill: #ffffff; stroke: #2f3532; stroke-width: 0.2; }
.pin { fill: #2f3532; }
.label { font: ${FONT}px system-ui, sans-serif; fill: #1d2327; }
.bayno { font: 600 ${FONT}px system-ui, sans-serif; fill: #2c4a5a; }
.dim { stroke: #2c4a5a; stroke-width: 0.2; fill: none; }
.dimtext { font: 2.4px system-ui, sans-serif; fill: #2c4a5a; }
.key { font: 2.2px system-ui, sans-serif; fill: #1d2327; }
.keyid { font: 2.1px ui-monospace, Menlo, Consolas, monospace; fill: #3c4240; }
.bar-a { fill: #1d2327; }
.bar-b { fill: #ffffff; stroke: #1d2327; stroke-width: 0.2; }
.note { font: 2.3px system-ui, sans-serif; fill: #3c4240; }
.caution { font: 600 2.4px system-ui, sans-serif; fill: #8a5a00; }
`;

/** The class the screen drawing's root carries: every rule of its style sheet is scoped to it. */
export const FRAME_SCREEN_CLASS = 'lw-frame';

/** The designer's theme variables (src/web/styles/theme.css) for each colour of the paper drawing. */
const tint = (accent: string, pct: number): string => `color-mix(in srgb, var(${accent}) ${pct}%, var(--lw-panel))`;
const SCREEN_COLOURS: readonly (readonly [string, string])[] = [
  ['url(#wrap-hatch)', tint('--lw-brass', 45)],
  ['#ffffff', 'var(--lw-panel)'],
  ['#1d2327', 'var(--lw-ink)'],
  ['#3c4240', 'var(--lw-ink-soft)'],
  ['#e9dcc4', tint('--lw-brass', 18)],
  ['#6b5a3c', 'var(--lw-brass)'],
  ['#4a4f4c', 'var(--lw-ink-soft)'],
  ['#9aa19d', 'var(--lw-line)'],
  ['#cfd8d3', 'var(--lw-sunk)'],
  ['#2f3532', 'var(--lw-ink)'],
  ['#7d8a84', tint('--lw-ink-soft', 60)],
  ['#f2c14e', tint('--lw-info', 45)],
  ['#2c4a5a', 'var(--lw-info)'],
  ['#8a5a00', 'var(--lw-warn)'],
];

/**
 * The paper style sheet in the page's theme colours, every rule scoped to the drawing's own
 * class so it touches nothing else on the page; the black cords and the arrow heads take the ink.
 */
function screenStyle(): string {
  const scope = `.${FRAME_SCREEN_CLASS}`;
  const rules = STYLE.trim()
    .split('\n')
    .map((rule) => {
      const open = rule.indexOf('{');
      const sel = rule
        .slice(0, open)
        .split(',')
        .map((x) => `${scope} ${x.trim()}`)
        .join(', ');
      const body = SCREEN_COLOURS.reduce((b, [paper, screen]) => b.split(paper).join(screen), rule.slice(open));
      return `${sel} ${body}`;
    });
  rules.push(
    `${scope} .cord-run[stroke='#000000'] { stroke: var(--lw-ink); }`,
    `${scope} marker path { fill: var(--lw-info); }`,
    `${scope} path.route { fill: none; stroke-width: 0.3; stroke-linejoin: round; visibility: hidden; pointer-events: none; }`,
  );
  return `\n${rules.join('\n')}\n`;
}

/** How the drawing is coloured: `paper` (the document, on white) or `screen` (the designer's theme, light or dark). */
export interface FrameOptions {
  readonly palette?: 'paper' | 'screen';
}

const DEFS =
  '<defs><pattern id="wrap-hatch" width="1.2" height="1.2" patternUnits="userSpaceOnUse" patternTransform="rotate(60)">' +
  '<rect width="1.2" height="1.2" fill="#c9b48f" /><line x1="0" y1="0" x2="0" y2="1.2" stroke="#6b5a3c" stroke-width="0.35" /></pattern>' +
  '<marker id="arrow" viewBox="0 0 6 6" refX="5" refY="3" markerWidth="3" markerHeight="3" orient="auto"><path d="M0,0 L6,3 L0,6 z" fill="#2c4a5a" /></marker></defs>';

/** How the drawing writes its figures: the workshop's Quantities (model/units.ts), and the key's bay centres. */
interface Measures {
  readonly q: Quantities;
  /** A dimension: `1.25 m`, `4 ft 1 3/16 in`. */
  len(v: number): string;
  /** A length to cut (metres): metric as a dimension, as it always was; inch as the cut list rounds it up. */
  cut(v: number): string;
  /** A size given in metres: `80 mm`, `3.150 in`. */
  size(m: number): string;
  /** A bay's centre for the key, and what the key says it is in. */
  centre(v: number): string;
  readonly centreWords: string;
}

const measuresFor = (p: Profile): Measures => {
  const q = quantitiesFor(p.documentUnits);
  const inch = q.units === 'inch';
  return {
    q,
    len: (v) => q.length(v),
    cut: (v) => q.cut(v, inMetres(fixed(2))),
    size: (m) => q.size(m, inMillimetres(trimmed(1))),
    centre: (v) => (inch ? inchesOf(v).toFixed(1) : v.toFixed(2)),
    centreWords: inch ? 'centre in inches' : 'centre in metres',
  };
};
const line = (x1: number, y1: number, x2: number, y2: number, cls: string, extra = ''): string =>
  `<line x1="${r1(x1)}" y1="${r1(y1)}" x2="${r1(x2)}" y2="${r1(y2)}" class="${cls}"${extra} />`;
const rect = (x0: number, y0: number, w: number, h: number, cls: string, extra = ''): string =>
  `<rect x="${r1(x0)}" y="${r1(y0)}" width="${r1(w)}" height="${r1(h)}" class="${cls}"${extra} />`;
/** Coordinates to 0.01 mm: the geometry of the drawing, read back by tests. */
const r2 = (v: number): string => String(Math.round(v * 100) / 100);

/** Text reading upwards from (px, py). */
function upText(px: number, py: number, text: string, cls: string): string {
  return `<text x="${r1(px)}" y="${r1(py)}" class="${cls}" transform="rotate(-90 ${r1(px)} ${r1(py)})">${x(text)}</text>`;
}

/** The frame drawing of a placed build. */
export function frameSvg(build: Build, placement: Placement, profile: Profile, options: FrameOptions = {}): string {
  const f = profile.frame;
  const words = partWords(build, profile.documentUnits);
  const lengthM = Math.max(0.05, ...placement.drums.map((d) => d.lengthM));
  const top = placement.drums.length === 0 ? 0 : placement.drums[placement.drums.length - 1].levelM;
  const worldTop = top + f.railAboveDrumM + LEVER_END_M;
  const scale = frameScale(lengthM, worldTop + f.channelBelowDrumM);
  const k = 1000 / scale;
  const { lanes, count } = assignLanes(placement.routing.branches);
  const laneMm = Math.min(1.1, 22 / Math.max(1, ...count.values()));
  const label = (b: PlacedBayInfo): string => `${b.bay} · ${words.get(b.part) ?? b.part}`;
  const topBays = placement.bays.filter((b) => b.drum === placement.drums.length);
  const topLabelMm = Math.min(80, Math.max(10, ...topBays.map((b) => label(b).length * FONT * GLYPH))) + 2;
  const width = Math.max(230, 2 * MARGIN + lengthM * k + 16);
  const heightM = worldTop + f.channelBelowDrumM;
  // The sheet is known only once the drawing's height is; its words are reserved at their widest.
  const reserved = titleLines(build, placement, profile, { scale, lengthM, heightM, paper: WIDEST_PAPER, width });
  const titleMm = 10 + 4 * reserved.length;
  const originY = MARGIN + titleMm + topLabelMm + worldTop * k;
  const sheet: Sheet = {
    k,
    scale,
    originY,
    laneMm,
    laneStart: Math.max(0.5, (f.pulleyDiameterM / 2) * k) + 0.6,
    X: (v) => MARGIN + v * k,
    Y: (v) => originY - v * k,
  };
  const body: string[] = [DEFS];
  /** The row of bay numbers under drum d's channel and its lanes. */
  const bayRowY = (d: number): number => {
    const cy = (placement.drums.find((x) => x.drum === d)?.levelM ?? (d - 1) * f.drumSpacingM) - f.channelBelowDrumM;
    return sheet.Y(cy) + sheet.laneStart + (count.get(d) ?? 0) * laneMm + FONT + 0.8;
  };
  for (const d of placement.drums) {
    const spaceMm =
      d.drum === placement.drums.length
        ? topLabelMm
        : sheet.Y(d.levelM + f.railAboveDrumM + LEVER_END_M) - 1 - (bayRowY(d.drum + 1) + 1.5);
    body.push(
      ...drumBody(sheet, d, placement, profile, {
        label,
        spaceMm,
        bayRowY: bayRowY(d.drum),
        parts: build.netlist.parts,
      }),
    );
  }
  body.push(...cordRuns(sheet, placement, profile, { lanes, rowUnder: bayRowY, screen: options.palette === 'screen' }));
  const exits = placement.routing.branches.some((b) => b.kind === 'actuator');
  let y = bayRowY(1) + (exits ? 7.5 : 4);
  body.push(...endWords(sheet, placement, y));
  y += 3;
  const dims = dimensions(sheet, placement, profile, y);
  body.push(...dims.items);
  y = dims.bottom + 4;
  const foot = footer(sheet, placement, profile, width, y);
  body.push(...foot.items);
  const key = keyLines(build, placement, { words, measures: measuresFor(profile) }, width, foot.bottom + 4);
  body.push(...key.items);
  const height = key.bottom + MARGIN;
  const head = titleBlock(
    build,
    titleLines(build, placement, profile, { scale, lengthM, heightM, paper: paperFor(width, height), width }),
  );
  const screen = options.palette === 'screen';
  return svgDocument(
    width,
    height,
    `Frame of ${build.machine.name}, scale 1:${scale}`,
    `Front elevation of the frame to scale 1:${scale}: ${placement.bays.length} bays on ${placement.drums.length} drum(s), every cord run, pulleys, dimensions and a key of the bays.`,
    screen ? screenStyle() : STYLE,
    [...head, ...body],
    'mm',
    screen ? FRAME_SCREEN_CLASS : undefined,
  );
}

/** The widest sheet phrase the title can name, to reserve the title's lines before the sheet is known. */
const WIDEST_PAPER = 'A0 sheet, landscape,';

/**
 * The title, what the drawing shows and at what scale, the overall figures and the drawing
 * conventions: each sentence wrapped to the drawing's width (`width`, mm) in lines of its class.
 */
function titleLines(
  build: Build,
  placement: Placement,
  profile: Profile,
  size: { scale: number; lengthM: number; heightM: number; paper: string; width: number },
): { text: string; cls: 'sub' | 'note' }[] {
  const f = profile.frame;
  const r = profile.drumRadiusM;
  const u = measuresFor(profile);
  const { scale, lengthM } = size;
  const frameHeightM = size.heightM;
  const sentences: { text: string; cls: 'sub' | 'note' }[] = [
    {
      text: `Front elevation: visitor end on the left, crank end (crank and cam shaft) on the right. Scale 1:${scale} when printed at 100 %${size.paper === '' ? '' : ` on an ${size.paper} or larger`}.`,
      cls: 'sub',
    },
    {
      text: `${placement.drums.length === 1 ? '1 drum' : `${placement.drums.length} drums`} of Ø ${u.size(2 * r)}, ${placement.drums.map((d) => u.len(d.lengthM)).join(' and ')} long; overall ${u.len(lengthM)} × ${u.len(frameHeightM)}; ${placement.bays.length} bays; ${u.len(placement.totalCordM)} of cord in ${placement.routing.cords.length} cords; ${f.turn === 'pin' ? `${placement.routing.pins} pins` : `${placement.pulleys} pulleys (Ø ${u.size(f.pulleyDiameterM)})`}, one at each corner of a cord's tree and where each branch rises.`,
      cls: 'sub',
    },
    {
      text: 'A cord drops once and splits at knots in the channel; runs along a channel all lie at its level and are drawn apart below it so each can be followed. Levers are shown end on.',
      cls: 'note',
    },
    {
      text: 'Cords tied to one lever rise side by side across it, each on a line of its own, one pulley each where it turns up.',
      cls: 'note',
    },
  ];
  const chars = (cls: 'sub' | 'note'): number =>
    Math.floor((size.width - 2 * MARGIN) / ((cls === 'sub' ? SUB_FONT : NOTE_FONT) * GLYPH));
  return sentences.flatMap(({ text, cls }) =>
    wrapWords(text, chars(cls), Number.MAX_SAFE_INTEGER).map((line) => ({ text: line, cls })),
  );
}

/** The title block's items: the title, then its lines (titleLines) 4 mm apart. */
function titleBlock(build: Build, lines: readonly { text: string; cls: string }[]): string[] {
  return [
    svgText(MARGIN, MARGIN + 4, `Frame — ${build.machine.name}`, 'title', 'start'),
    ...lines.map((l, i) => svgText(MARGIN, MARGIN + 9 + 4 * i, l.text, l.cls, 'start')),
  ];
}

/** One drum: body, capstan wraps, bay lines, rail, lever ends, labels and bay numbers. */
function drumBody(
  s: Sheet,
  d: PlacedDrum,
  placement: Placement,
  profile: Profile,
  text: { label: (b: PlacedBayInfo) => string; spaceMm: number; bayRowY: number; parts: readonly Part[] },
): string[] {
  const { drum, levelM: level, lengthM } = d;
  const { label, spaceMm } = text;
  const f = profile.frame;
  const r = profile.drumRadiusM;
  const out: string[] = [`<g class="drum-${drum}">`];
  const bays = placement.bays.filter((b) => b.drum === drum);
  const drivers = new Set(placement.routing.cords.map((c) => c.driver));
  const parts = new Map(text.parts.map((p) => [p.id, p]));
  const channelY = level - f.channelBelowDrumM;
  const railY = level + f.railAboveDrumM;
  out.push(rect(s.X(0), s.Y(level + r), lengthM * s.k, 2 * r * s.k, 'drum'));
  for (const b of bays) {
    if (drivers.has(b.part)) {
      const w = wrapsOf(parts.get(b.part), profile) * profile.wrapPitchM * s.k;
      out.push(rect(s.X(b.xM) - w / 2, s.Y(level + r), w, 2 * r * s.k, 'wraps', ` data-part="${x(b.part)}"`));
    }
    out.push(line(s.X(b.leftM), s.Y(channelY), s.X(b.leftM), s.Y(railY + LEVER_END_M), 'bay'));
  }
  out.push(line(s.X(lengthM), s.Y(channelY), s.X(lengthM), s.Y(railY + LEVER_END_M), 'bay'));
  out.push(line(s.X(0), s.Y(railY), s.X(lengthM), s.Y(railY), 'rail'));
  const leverW = leverMm(s, f);
  for (const b of bays) {
    for (const lv of b.levers) {
      if (lv.name === 'exit') continue;
      const cls = b.kind === 'lever' ? 'lever hand' : lv.name === 'Z' || b.levers.length === 1 ? 'lever z' : 'lever';
      const ids = ` data-part="${x(b.part)}" data-lever="${x(lv.name)}" data-drum="${drum}" data-bay="${b.bay}"`;
      out.push(rect(s.X(lv.xM) - leverW / 2, s.Y(railY + LEVER_END_M), leverW, LEVER_END_M * s.k, cls, ids));
      out.push(`<circle cx="${r1(s.X(lv.xM))}" cy="${r1(s.Y(railY))}" r="0.35" class="pivot" />`);
    }
    const chars = Math.max(3, Math.floor(spaceMm / (FONT * GLYPH)));
    out.push(
      `<g data-part="${x(b.part)}"><title>${x(`drum ${drum}, bay ${b.bay}: ${label(b)} (${b.part})`)}</title>${upText(s.X(b.xM) + FONT * 0.35, s.Y(railY + LEVER_END_M) - 1, clip(label(b), chars), 'label')}</g>`,
    );
    out.push(svgText(s.X(b.xM), text.bayRowY, String(b.bay), 'bayno'));
  }
  out.push('</g>');
  return out;
}

/** The lever a branch is tied to: its port (the target is `gate.port`), or 'exit' for an actuator. */
const leverOf = (b: BranchRoute): string => (b.kind === 'port' ? b.target.slice(b.part.length + 1) : 'exit');

/** Smallest step between two cords rising side by side across one lever, mm on paper: the cord's stroke and a gap. */
const RISE_STEP_MM = 0.6;

/** A lever end's drawn width, mm on paper: the blank's thickness to scale, never thinner than can be seen. */
const leverMm = (s: Sheet, f: Profile['frame']): number => Math.max(0.4, f.leverThicknessM * s.k);

/**
 * Where each branch rises across the lever it is tied to, mm on paper from the lever's centre.
 * Cords tied to one lever rise side by side, each on its own line all the way up: ordered by
 * where their capstans sit (visitor end first), then by cord; the lever's drawn width shared
 * out, at least RISE_STEP_MM apart, and never past the lever's share of its bay, so the drawing
 * stays to scale. A cord alone on its lever rises at its centre (no entry).
 */
function riseShifts(s: Sheet, placement: Placement, f: Profile['frame']): Map<BranchRoute, number> {
  const byLever = new Map<string, BranchRoute[]>();
  for (const b of placement.routing.branches) {
    const key = `${b.part}\u0000${leverOf(b)}`;
    const list = byLever.get(key);
    if (list) list.push(b);
    else byLever.set(key, [b]);
  }
  const bays = new Map(placement.bays.map((b) => [b.part, b]));
  const out = new Map<BranchRoute, number>();
  for (const list of byLever.values()) {
    if (list.length < 2) continue;
    const bay = bays.get(list[0].part);
    const shareMm = bay ? (bay.widthM / Math.max(1, bay.levers.length)) * s.k : leverMm(s, f);
    const step = Math.min(Math.max(leverMm(s, f) / list.length, RISE_STEP_MM), shareMm / list.length);
    const capstan = (b: BranchRoute): number => b.runs[0]?.from.xM ?? 0;
    const sorted = [...list].sort(
      (a, b) => capstan(a) - capstan(b) || (a.cord < b.cord ? -1 : a.cord > b.cord ? 1 : 0),
    );
    sorted.forEach((b, j) => out.set(b, (j - (list.length - 1) / 2) * step));
  }
  return out;
}

/**
 * Where a branch's runs are drawn: channel runs in the lane of the tree's run on that side of the
 * channel; its end at its lever (the end of its run along the channel, its rise or exit) moved
 * `shift` mm across the lever, so that cords tied to one lever rise on lines of their own.
 */
interface Pen {
  readonly s: Sheet;
  readonly hostLane: ReadonlyMap<string, number>;
  readonly cord: string;
  readonly shift: number;
}

/**
 * A point of a run on paper; `inChannel`, at the lane of the channel run that carries it there;
 * `atLever`, moved across the lever by the branch's shift.
 */
function penAt(pen: Pen, p: RoutePoint, inChannel: CordRun | undefined, atLever = false): { x: number; y: number } {
  const { s } = pen;
  const lane = inChannel ? pen.hostLane.get(sideKey(pen.cord, inChannel)) : undefined;
  return {
    x: s.X(p.xM) + (atLever ? pen.shift : 0),
    y: lane === undefined ? s.Y(p.yM) : s.Y(p.yM) + s.laneStart + lane * s.laneMm,
  };
}

/** The polyline of some runs of a branch whose whole path is `path` (its own runs, or the path itself). */
function polyline(pen: Pen, runs: readonly CordRun[], path: readonly CordRun[]): { x: number; y: number }[] {
  const channel = path.find((r) => r.kind === 'channel');
  const pts: { x: number; y: number }[] = [];
  const start = (p: { x: number; y: number }): void => {
    if (pts.length === 0) pts.push(p);
  };
  // A branch's run along the channel always ends under its own lever: there it moves across to its rise.
  for (const run of runs) {
    if (run.kind === 'direct') pts.push(penAt(pen, run.from, undefined), penAt(pen, run.to, undefined, true));
    else if (run.kind === 'drop') {
      start(penAt(pen, run.from, undefined));
      pts.push(penAt(pen, run.to, channel));
    } else if (run.kind === 'channel') {
      // A run that does not follow its own drop leaves the foot of the drop for its lane.
      start(penAt(pen, run.from, undefined));
      pts.push(penAt(pen, run.from, run), penAt(pen, run.to, run, true));
    } else if (run.kind === 'rise') {
      start(penAt(pen, run.from, channel, true));
      pts.push(penAt(pen, run.to, undefined, true));
    } else start(penAt(pen, run.from, channel, true));
  }
  return pts;
}

const pathData = (pts: readonly { x: number; y: number }[]): string =>
  pts.map((p, j) => `${j === 0 ? 'M' : 'L'}${r2(p.x)},${r2(p.y)}`).join(' ');

/**
 * Every cord as its tree: each segment once, drawn with the branch that owns it (the piece it is
 * cut in), a cord's branches in one colour, channel runs in their lanes; a pulley or pin at each
 * corner (shared by the branches turning there) and where each branch rises or leaves. On screen,
 * each branch's whole path too, unseen until the page lights it.
 */
function cordRuns(
  s: Sheet,
  placement: Placement,
  profile: Profile,
  how: {
    lanes: ReadonlyMap<BranchRoute, Lane>;
    /** The row under a drum's channel and its lanes (where cords leaving the frame are named). */
    rowUnder: (channelDrum: number) => number;
    screen: boolean;
  },
): string[] {
  const out: string[] = ['<g class="cords">'];
  const u = measuresFor(profile);
  /** Pulleys or pins on paper, each drawn once: a shared corner once, each rise's own beside the others at its lever. */
  const turns = new Map<string, { x: number; y: number }>();
  const turn = (p: RoutePoint, shift = 0): void => {
    const at = { x: s.X(p.xM) + shift, y: s.Y(p.yM) };
    turns.set(`${r2(at.x)}:${r2(at.y)}`, at);
  };
  const shifts = riseShifts(s, placement, profile.frame);
  /** Cords that leave the frame, by the row under which they are named. */
  const exits = new Map<number, { x: number; words: string }[]>();
  const bayOf = new Map(placement.bays.map((b) => [b.part, b.bay]));
  placement.routing.cords.forEach((c, i) => {
    const colour = PALETTE[i % PALETTE.length];
    out.push(`<g class="cord-run" stroke="${colour}"><title>${x(`cord ${c.cord}: cut ${u.cut(c.cutM)}`)}</title>`);
    const hostLane = new Map<string, number>();
    for (const b of c.branches) {
      const run = b.own.find((r) => r.kind === 'channel');
      const lane = how.lanes.get(b);
      if (run && lane) hostLane.set(sideKey(c.cord, run), lane.lane);
    }
    for (const b of c.branches) {
      const pen: Pen = { s, hostLane, cord: c.cord, shift: shifts.get(b) ?? 0 };
      const d = pathData(polyline(pen, b.own, b.runs));
      out.push(
        `<path d="${d}" class="cord" data-cord="${x(b.cord)}" data-target="${x(b.target)}" data-driver="${x(b.driver)}" data-part="${x(b.part)}" data-lever="${x(leverOf(b))}"><title>${x(`${b.cord} → ${b.target}: ${u.cut(b.lengthM)} to cut, over ${b.pulleys} pulleys${b.pins.length > 0 ? `, ${b.pins.length} pins` : ''} on its way`)}</title></path>`,
      );
      if (how.screen)
        out.push(
          `<path d="${pathData(polyline(pen, b.runs, b.runs))}" class="route" data-route-cord="${x(b.cord)}" data-route-target="${x(b.target)}" />`,
        );
      for (const run of b.own) {
        if (run.kind === 'drop' && !b.own.some((r) => r.kind === 'channel')) turn(run.to);
        if (run.kind === 'channel') turn(run.from);
        if (run.kind === 'rise' || run.kind === 'exit') turn(run.from, pen.shift);
      }
      const last = b.own[b.own.length - 1];
      if (last.kind === 'exit') {
        // Out of the frame: an arrow down to the bay numbers; under them, one line names where each goes.
        const at = penAt(
          pen,
          last.from,
          b.runs.find((r) => r.kind === 'channel'),
          true,
        );
        const row = how.rowUnder(last.drum);
        out.push(
          `<path d="M${r2(at.x)},${r2(at.y)} L${r2(at.x)},${r2(row - FONT - 0.4)}" class="cord" marker-end="url(#arrow)" />`,
        );
        const list = exits.get(row) ?? [];
        list.push({ x: at.x, words: `bay ${bayOf.get(b.part) ?? '?'} to ${b.target}` });
        exits.set(row, list);
      }
    }
    out.push('</g>');
  });
  out.push(...exitWordsAndTurns(s, profile, exits, turns.values()), '</g>');
  return out;
}

/** Under each channel, where the cords that leave the frame go; then a pulley or pin at every turn. */
function exitWordsAndTurns(
  s: Sheet,
  profile: Profile,
  exits: ReadonlyMap<number, readonly { x: number; words: string }[]>,
  turns: Iterable<{ x: number; y: number }>,
): string[] {
  const out: string[] = [];
  for (const [row, list] of exits) {
    const words = list.map((e) => e.words).join(', ');
    const first = Math.min(...list.map((e) => e.x));
    out.push(
      svgText(
        first - 1,
        row + 3.4,
        `↓ out of the frame, ${measuresFor(profile).len(profile.frame.actuatorRunM)} each: ${words}`,
        'note',
        'start',
      ),
    );
  }
  const radius = profile.frame.turn === 'pulley' ? (profile.frame.pulleyDiameterM / 2) * s.k : 0.5;
  for (const p of turns)
    out.push(
      `<circle cx="${r1(p.x)}" cy="${r1(p.y)}" r="${r1(Math.max(0.4, radius))}" class="${profile.frame.turn === 'pulley' ? 'pulley' : 'pin'}" />`,
    );
  return out;
}

function endWords(s: Sheet, placement: Placement, y: number): string[] {
  const len = placement.drums[0]?.lengthM ?? 0;
  return [
    svgText(s.X(0), y, '◀ visitor end (operator levers)', 'note', 'start'),
    svgText(s.X(len), y, 'crank end (clock and reset levers, cam shaft) ▶', 'note', 'end'),
  ];
}

/** Drum lengths under the drawing; heights at its right. */
function dimensions(s: Sheet, placement: Placement, profile: Profile, y0: number): { items: string[]; bottom: number } {
  const f = profile.frame;
  const u = measuresFor(profile);
  const out: string[] = [];
  let y = y0;
  for (const d of placement.drums) {
    y += 5;
    const a = s.X(0);
    const b = s.X(d.lengthM);
    out.push(line(a, y, b, y, 'dim', ' marker-start="url(#arrow)" marker-end="url(#arrow)"'));
    out.push(line(a, y - 2, a, y + 1, 'dim'), line(b, y - 2, b, y + 1, 'dim'));
    out.push(svgText((a + b) / 2, y - 0.8, `drum ${d.drum}: ${u.len(d.lengthM)}, ${d.bays.length} bays`, 'dimtext'));
  }
  const right = s.X(Math.max(...placement.drums.map((d) => d.lengthM))) + 8;
  const lowest = s.Y(-f.channelBelowDrumM);
  const rail1 = s.Y(f.railAboveDrumM);
  out.push(line(right, lowest, right, rail1, 'dim', ' marker-start="url(#arrow)" marker-end="url(#arrow)"'));
  out.push(
    upText(
      right - 0.8,
      (lowest + rail1) / 2 + 12,
      `channel to rail ${u.len(f.channelBelowDrumM + f.railAboveDrumM)}`,
      'dimtext',
    ),
  );
  if (placement.drums.length > 1) {
    const a1 = s.Y(0);
    const a2 = s.Y(f.drumSpacingM);
    out.push(line(right + 4, a1, right + 4, a2, 'dim', ' marker-start="url(#arrow)" marker-end="url(#arrow)"'));
    out.push(upText(right + 3.2, (a1 + a2) / 2 + 14, `drum axes ${u.len(f.drumSpacingM)} apart`, 'dimtext'));
  }
  return { items: out, bottom: y + 2 };
}

/** Lengths a metric scale bar may have, metres (cut in fifths). */
const METRIC_BARS = [0.05, 0.1, 0.2, 0.25, 0.5, 1, 2, 5, 10, 20, 50, 100];
/** Lengths an inch scale bar may have, whole inches, each with the parts it is cut in (quarters of a foot, feet …). */
const INCH_BARS: readonly (readonly [number, number])[] = [
  [1, 4],
  [2, 4],
  [3, 3],
  [6, 6],
  [12, 4],
  [24, 4],
  [36, 3],
  [60, 5],
  [120, 5],
  [240, 4],
  [600, 5],
  [1200, 4],
  [2400, 4],
];

/** The scale bar: the longest usual length that is at most 80 mm on paper, its parts and its label. */
export function scaleBar(s: { readonly k: number }, units: DocumentUnits): { m: number; parts: number; words: string } {
  if (units === 'inch') {
    const [inches, parts] = [...INCH_BARS].reverse().find(([v]) => v * METRES_PER_INCH * s.k <= 80) ?? INCH_BARS[0];
    const words = inches >= 12 ? `${inches / 12} ft` : `${inches} in`;
    return { m: inches * METRES_PER_INCH, parts, words };
  }
  const barM = [...METRIC_BARS].reverse().find((v) => v * s.k <= 80) ?? METRIC_BARS[0];
  return { m: barM, parts: 5, words: `${barM} m` };
}

/** Scale bar, legend and caution. */
function footer(
  s: Sheet,
  placement: Placement,
  profile: Profile,
  width: number,
  y0: number,
): { items: string[]; bottom: number } {
  const u = measuresFor(profile);
  const out: string[] = [];
  const bar = scaleBar(s, u.q.units);
  const step = (bar.m * s.k) / bar.parts;
  for (let i = 0; i < bar.parts; i++) out.push(rect(MARGIN + i * step, y0, step, 1.6, i % 2 === 0 ? 'bar-a' : 'bar-b'));
  out.push(svgText(MARGIN, y0 + 4.6, '0', 'dimtext', 'middle'));
  out.push(svgText(MARGIN + bar.m * s.k, y0 + 4.6, bar.words, 'dimtext', 'middle'));
  out.push(
    svgText(
      MARGIN + bar.m * s.k + 8,
      y0 + 1.6,
      `scale 1:${s.scale} — check the bar with a rule after printing`,
      'note',
      'start',
    ),
  );
  const f = profile.frame;
  const ly = y0 + 9;
  const legend: string[] = [
    rect(MARGIN, ly - 2, 6, 2.4, 'drum'),
    svgText(MARGIN + 8, ly, `drum, Ø ${u.size(profile.drumRadiusM * 2)}`, 'note', 'start'),
    rect(MARGIN + 42, ly - 2, 3, 2.4, 'wraps'),
    svgText(MARGIN + 47, ly, `capstan: ${profile.wraps} turns`, 'note', 'start'),
    rect(MARGIN + 76, ly - 2.4, 1, 2.4, 'lever hand'),
    svgText(MARGIN + 78.5, ly, 'hand lever', 'note', 'start'),
    rect(MARGIN + 96, ly - 2.4, 1, 2.4, 'lever z'),
    svgText(MARGIN + 98.5, ly, 'Z lever', 'note', 'start'),
    rect(MARGIN + 112, ly - 2.4, 1, 2.4, 'lever'),
    svgText(MARGIN + 114.5, ly, 'port lever', 'note', 'start'),
    `<circle cx="${MARGIN + 133}" cy="${ly - 0.8}" r="1.2" class="${f.turn === 'pulley' ? 'pulley' : 'pin'}" />`,
    svgText(MARGIN + 135.5, ly, f.turn === 'pulley' ? 'pulley' : 'pin', 'note', 'start'),
  ];
  out.push(...legend);
  out.push(
    svgText(
      MARGIN,
      ly + 4.5,
      `Cut lengths of every cord: cut-list.csv (${u.len(placement.totalCordM)} in all; ${u.len(placement.baselineCordM)} with the bays in netlist order). Cam templates at 1:1: cams.svg.`,
      'note',
      'start',
    ),
  );
  const caution = [
    'Caution: a turning drum catches hair, cords, sleeves and fingers — guard it and fit a stop within reach.',
    'Hanging weights fall when a cord breaks: keep them low, enclosed or caught. Levers make pinch points. See the build sheet.',
  ];
  caution.forEach((c, i) =>
    out.push(
      svgText(
        MARGIN,
        ly + 8.5 + 3.4 * i,
        clip(c, Math.floor((width - 2 * MARGIN) / (2.4 * GLYPH))),
        'caution',
        'start',
      ),
    ),
  );
  return { items: out, bottom: ly + 8.5 + 3.4 * caution.length };
}

/** Every bay in words, drum by drum, in columns. */
function keyLines(
  build: Build,
  placement: Placement,
  said: { readonly words: ReadonlyMap<string, string>; readonly measures: Measures },
  width: number,
  y0: number,
): { items: string[]; bottom: number } {
  const { words, measures } = said;
  const out: string[] = [svgText(MARGIN, y0 + 3, 'Key: every bay, from the visitor end', 'sub', 'start')];
  const colW = 104;
  const cols = Math.max(1, Math.floor((width - 2 * MARGIN) / colW));
  const rows = Math.ceil(placement.bays.length / cols);
  const names = new Map(build.netlist.parts.map((p) => [p.id, p.id]));
  placement.bays.forEach((b, i) => {
    const c = Math.floor(i / Math.max(1, rows));
    const row = i % Math.max(1, rows);
    const px = MARGIN + c * colW;
    const py = y0 + 7 + row * 3.2;
    out.push(svgText(px, py, `${b.drum}·${b.bay}`, 'bayno', 'start'));
    out.push(svgText(px + 9, py, measures.centre(b.xM), 'keyid', 'start'));
    out.push(svgText(px + 18, py, clip(names.get(b.part) ?? b.part, 14), 'keyid', 'start'));
    out.push(svgText(px + 40, py, clip(words.get(b.part) ?? '', 50), 'key', 'start'));
  });
  out.push(
    svgText(
      MARGIN,
      y0 + 7 + rows * 3.2 + 1.5,
      `drum·bay, ${measures.centreWords} from the visitor end, part, what it does`,
      'note',
      'start',
    ),
  );
  return { items: out, bottom: y0 + 7 + rows * 3.2 + 3 };
}
