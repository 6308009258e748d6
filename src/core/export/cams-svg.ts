/**
 * cams.svg: the φ1 and φ2 clock cams as cutting templates at 1:1 (design §11, "Clock cams").
 *
 * The crank turns the cam shaft once per clock. Each cam is a disc with one raised lobe; while
 * the lobe passes its follower, the follower holds that clock lever pulled. The lobe's full
 * rise spans exactly the cam window the timing check reports (checks/timing.ts: φ1 from 0°,
 * φ2 after the first dead band, in degrees of one crank turn). Its two ramps lie outside the
 * window, in the dead bands either side, each at most RAMP_MAX_DEG and a third of that dead
 * band, so that a lever is fully pulled over its whole window and the two cams' ramps never
 * meet. Angles are measured on the template from the 0° mark, against the direction the disc
 * turns, so that the point at angle θ is under a follower at the 0° mark when the crank has
 * turned θ. Sizes from the profile (frame.camBaseRadiusM, frame.camLiftM).
 * The SVG's width and height are in millimetres (one user unit is 1 mm), so a print at 100 %
 * is full size; a 100 mm check bar tells the user whether it was. Where the profile's
 * `documentUnits` is `inch`, the bar is 4 in (101.6 mm exactly) with quarter-inch ticks, and the
 * sizes are written in inches (model/units.ts); the drawing itself is the same.
 */
import type { TimingResult } from '../checks/timing.js';
import type { Profile } from '../physics/profile.js';
import { inMillimetres, METRES_PER_INCH, quantitiesFor, trimmed, type DocumentUnits } from '../model/units.js';
import { round1 as r1, svgDocument, svgText } from './svg.js';

/** Largest ramp, degrees of crank turn. */
export const RAMP_MAX_DEG = 8;
const MARGIN = 8;

/** The point at angle θ (degrees, counter-clockwise on the page from the 0° mark at the top) and radius R. */
function at(cx: number, cy: number, radius: number, deg: number): { x: number; y: number } {
  const t = (deg * Math.PI) / 180;
  return { x: cx - radius * Math.sin(t), y: cy - radius * Math.cos(t) };
}

const p2 = (p: { x: number; y: number }): string =>
  `${(Math.round(p.x * 1000) / 1000).toString()},${(Math.round(p.y * 1000) / 1000).toString()}`;

/** One cam's outline: base circle, ramp up, the lobe over [from, to], ramp down. */
function outline(
  cx: number,
  cy: number,
  r0: number,
  r1: number,
  from: number,
  to: number,
  rampIn: number,
  rampOut: number,
): string {
  const span = to - from;
  const rest = 360 - (span + rampIn + rampOut);
  // Angles grow counter-clockwise on the page: SVG sweep-flag 0.
  return [
    `M${p2(at(cx, cy, r0, from - rampIn))}`,
    `L${p2(at(cx, cy, r1, from))}`,
    `A${r1},${r1} 0 ${span > 180 ? 1 : 0} 0 ${p2(at(cx, cy, r1, to))}`,
    `L${p2(at(cx, cy, r0, to + rampOut))}`,
    `A${r0},${r0} 0 ${rest > 180 ? 1 : 0} 0 ${p2(at(cx, cy, r0, from - rampIn))}`,
    'Z',
  ].join(' ');
}

const STYLE = `
.page { fill: #ffffff; }
.title { font: 600 4.2px system-ui, sans-serif; fill: #1d2327; }
.sub { font: 2.8px system-ui, sans-serif; fill: #3c4240; }
.cam { fill: #f4ecdc; stroke: #1d2327; stroke-width: 0.35; }
.window { fill: none; stroke: #b04a3c; stroke-width: 0.3; stroke-dasharray: 1.2 0.8; }
.tick { stroke: #50575e; stroke-width: 0.2; }
.deg { font: 2.2px system-ui, sans-serif; fill: #50575e; }
.zero { stroke: #1d2327; stroke-width: 0.35; }
.centre { fill: none; stroke: #1d2327; stroke-width: 0.25; }
.camname { font: 600 3.6px system-ui, sans-serif; fill: #1d2327; }
.camnote { font: 2.6px system-ui, sans-serif; fill: #3c4240; }
.turn { fill: none; stroke: #2c4a5a; stroke-width: 0.35; }
.bar { stroke: #1d2327; stroke-width: 0.4; }
.caution { font: 600 2.6px system-ui, sans-serif; fill: #8a5a00; }
`;

interface CamSpec {
  readonly phase: 'phi1' | 'phi2';
  readonly name: string;
  readonly from: number;
  readonly to: number;
  readonly rampIn: number;
  readonly rampOut: number;
}

/** The two cams' windows and ramps from the timing check's cam angles. */
export function camSpecs(cam: TimingResult['cam']): CamSpec[] {
  const [a1s, a1e] = cam.phi1;
  const [a2s, a2e] = cam.phi2;
  const ramp = (gap: number): number => Math.max(0, Math.min(RAMP_MAX_DEG, gap / 3));
  const gap12 = a2s - a1e;
  const gap21 = 360 - a2e + a1s;
  return [
    { phase: 'phi1', name: 'φ1', from: a1s, to: a1e, rampIn: ramp(gap21), rampOut: ramp(gap12) },
    { phase: 'phi2', name: 'φ2', from: a2s, to: a2e, rampIn: ramp(gap12), rampOut: ramp(gap21) },
  ];
}

function camPanel(spec: CamSpec, cx: number, cy: number, r0: number, r1: number): string[] {
  const out: string[] = [`<g class="cam-${spec.phase}">`];
  out.push(
    `<path d="${outline(cx, cy, r0, r1, spec.from, spec.to, spec.rampIn, spec.rampOut)}" class="cam" data-phase="${spec.phase}" data-from-deg="${spec.from}" data-to-deg="${spec.to}" />`,
  );
  // Degree marks every 10° just inside the base circle, numbers every 30°.
  for (let d = 0; d < 360; d += 10) {
    const a = at(cx, cy, r0 - 1, d);
    const b = at(cx, cy, r0 - (d % 30 === 0 ? 4 : 2.5), d);
    out.push(`<line x1="${r1f(a.x)}" y1="${r1f(a.y)}" x2="${r1f(b.x)}" y2="${r1f(b.y)}" class="tick" />`);
    if (d % 30 === 0 && d !== 0) {
      const t = at(cx, cy, r0 - 7, d);
      out.push(svgText(t.x, t.y + 0.8, `${d}°`, 'deg'));
    }
  }
  // The window, on the lobe, as two radial lines.
  for (const d of [spec.from, spec.to]) {
    const a = at(cx, cy, r0 - 1, d);
    const b = at(cx, cy, r1, d);
    out.push(`<line x1="${r1f(a.x)}" y1="${r1f(a.y)}" x2="${r1f(b.x)}" y2="${r1f(b.y)}" class="window" />`);
  }
  const zero = at(cx, cy, r1 + 5, 0);
  out.push(`<line x1="${r1f(cx)}" y1="${r1f(cy)}" x2="${r1f(zero.x)}" y2="${r1f(zero.y)}" class="zero" />`);
  out.push(svgText(zero.x + 1.5, zero.y + 1, '0°: under the follower with the crank at 0°', 'camnote', 'start'));
  out.push(`<circle cx="${r1f(cx)}" cy="${r1f(cy)}" r="1.5" class="centre" />`);
  out.push(
    `<line x1="${r1f(cx - 4)}" y1="${r1f(cy)}" x2="${r1f(cx + 4)}" y2="${r1f(cy)}" class="centre" />`,
    `<line x1="${r1f(cx)}" y1="${r1f(cy - 4)}" x2="${r1f(cx)}" y2="${r1f(cy + 4)}" class="centre" />`,
  );
  // The disc turns clockwise on the page: an arrow outside it, upper right.
  const s = at(cx, cy, r1 + 3, -20);
  const e = at(cx, cy, r1 + 3, -55);
  out.push(`<path d="M${p2(s)} A${r1 + 3},${r1 + 3} 0 0 1 ${p2(e)}" class="turn" marker-end="url(#cam-arrow)" />`);
  out.push(svgText(cx, cy + r1 + 7, `${spec.name} cam: lever pulled ${spec.from}°–${spec.to}°`, 'camname'));
  out.push(
    svgText(
      cx,
      cy + r1 + 11,
      `ramps ${r1f(spec.rampIn)}° before and ${r1f(spec.rampOut)}° after, in the dead bands; turns clockwise on this page`,
      'camnote',
    ),
  );
  out.push('</g>');
  return out;
}

const r1f = (v: number): string => r1(v);

/** The check bar in the chosen units: its length and ticks on paper (mm), their heights, and its words. */
interface CheckBar {
  readonly lengthMm: number;
  /** Where each tick stands, mm from the bar's start, and whether it is a long one. */
  readonly ticks: readonly { readonly at: number; readonly long: boolean }[];
  readonly words: string;
  /** The bar's length as the print check asks for it: `100 mm`, `4 in`. */
  readonly says: string;
}

const INCH_MM = METRES_PER_INCH * 1000;
/** A position on paper to the micrometre (whole millimetres print as before). */
const mm3 = (v: number): number => Math.round(v * 1000) / 1000;

function checkBar(units: DocumentUnits): CheckBar {
  if (units === 'inch') {
    // Quarter-inch ticks, long at each whole inch; the bar is 4 in = 101.6 mm exactly.
    // Positions to the micrometre, so the file prints 19.05 where binary arithmetic gives 19.049999….
    const at = (quarters: number): number => Math.round((quarters * INCH_MM * 1000) / 4) / 1000;
    const ticks = Array.from({ length: 17 }, (_, q) => ({ at: at(q), long: q % 4 === 0 }));
    return { lengthMm: at(16), ticks, words: '4 in check bar', says: '4 in' };
  }
  const ticks = Array.from({ length: 11 }, (_, i) => ({ at: i * 10, long: (i * 10) % 50 === 0 }));
  return { lengthMm: 100, ticks, words: '100 mm check bar', says: '100 mm' };
}

/** What the print check asks the bar to measure: `100 mm`, `4 in`. */
export const checkBarWords = (units: DocumentUnits): string => checkBar(units).says;

/** A cam's size in the chosen units (model/units.ts): `80 mm`, `3.150 in`. */
const sizeWords = (mm: number, units: DocumentUnits): string =>
  quantitiesFor(units).size(mm / 1000, inMillimetres(trimmed(1)));

/**
 * The cam templates of a build: `timing` from the timing check (undefined for a machine
 * without a clock: then the file says so).
 */
export function camsSvg(
  machine: string,
  timing: Pick<TimingResult, 'cam' | 'crankRpm'> | undefined,
  profile: Profile,
): string {
  const units = profile.documentUnits;
  const bar = checkBar(units);
  const r0 = profile.frame.camBaseRadiusM * 1000;
  const r1v = r0 + profile.frame.camLiftM * 1000;
  const panel = 2 * r1v + 14;
  const width = Math.max(2 * MARGIN + 2 * panel + 6, 2 * MARGIN + 150);
  const top = MARGIN + 16;
  const body: string[] = [
    '<defs><marker id="cam-arrow" viewBox="0 0 6 6" refX="5" refY="3" markerWidth="3" markerHeight="3" orient="auto"><path d="M0,0 L6,3 L0,6 z" fill="#2c4a5a" /></marker></defs>',
    svgText(MARGIN, MARGIN + 4, `Clock cams — ${machine}: cutting templates at 1:1`, 'title', 'start'),
    svgText(
      MARGIN,
      MARGIN + 9,
      `Print at 100 % (no “fit to page”) and check the bar below measures ${bar.says} before cutting. One crank turn is one clock.`,
      'sub',
      'start',
    ),
  ];
  let y: number;
  if (!timing || (timing.cam.phi1[1] <= timing.cam.phi1[0] && timing.cam.phi2[1] <= timing.cam.phi2[0])) {
    body.push(svgText(MARGIN, top + 6, 'This machine has no clock (one state): it needs no cams.', 'sub', 'start'));
    y = top + 14;
  } else {
    const specs = camSpecs(timing.cam);
    const cy = top + r1v + 6;
    specs.forEach((spec, i) => body.push(...camPanel(spec, MARGIN + panel / 2 + i * (panel + 6), cy, r0, r1v)));
    y = cy + r1v + 16;
    body.push(
      svgText(
        MARGIN,
        y,
        `Base circle Ø ${sizeWords(2 * r0, units)}, lobe Ø ${sizeWords(2 * r1v, units)} (lift ${sizeWords(r1v - r0, units)}). Crank at ${timing.crankRpm} turns per minute. Drill the centre to suit the cam shaft; key both cams with their 0° marks together.`,
        'sub',
        'start',
      ),
    );
    y += 6;
  }
  body.push(`<line x1="${MARGIN}" y1="${y + 3}" x2="${mm3(MARGIN + bar.lengthMm)}" y2="${y + 3}" class="bar" />`);
  for (const t of bar.ticks)
    body.push(
      `<line x1="${mm3(MARGIN + t.at)}" y1="${y + (t.long ? 0 : 1.5)}" x2="${mm3(MARGIN + t.at)}" y2="${y + 3}" class="bar" />`,
    );
  body.push(svgText(MARGIN + bar.lengthMm + 4, y + 3.5, bar.words, 'sub', 'start'));
  body.push(
    svgText(
      MARGIN,
      y + 10,
      'Caution: the cam shaft turns with the drum — guard the cams and followers, and keep fingers clear of the follower arms.',
      'caution',
      'start',
    ),
  );
  return svgDocument(
    width,
    y + 10 + MARGIN,
    `Clock cams of ${machine}, 1:1`,
    `Cutting templates of the φ1 and φ2 cams at full size, with a ${bar.words}.`,
    STYLE,
    body,
    'mm',
  );
}
