/**
 * cams.svg: the cam discs as cutting templates at 1:1. The lobes are read back from the drawn
 * outline — the angle of each end of the full-lift arc about the disc's centre, measured with
 * atan2 — and compared with the cam windows the timing check reports (within 0.5°). The sizes
 * are read from the SVG's own width, height and viewBox (SVG 1.1, "Units": a length in mm on
 * the root element, one user unit per mm).
 */
import { describe, expect, it } from 'vitest';
import { findCheck } from '../../../src/core/checks/results.js';
import { buildDocuments } from '../../../src/core/export/index.js';
import { camsSvg, camSpecs, RAMP_MAX_DEG } from '../../../src/core/export/cams-svg.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { example, exampleNames, xmlProblems } from './support.js';

interface Lobe {
  readonly phase: string;
  readonly fromDeg: number;
  readonly toDeg: number;
  readonly liftRadius: number;
  readonly baseRadius: number;
}

/** Angle of (x, y) about (cx, cy), counter-clockwise on the page from straight up, in [0, 360). */
function angleOf(x: number, y: number, cx: number, cy: number): number {
  const deg = (Math.atan2(-(x - cx), -(y - cy)) * 180) / Math.PI;
  return (deg + 360) % 360;
}

/** Each cam's lobe, measured on the outline path: M base, L lobe start, A … lobe end, L base, A … Z. */
function lobesOf(svg: string): Lobe[] {
  const out: Lobe[] = [];
  for (const g of svg.matchAll(/<g class="cam-(\w+)">([\s\S]*?)<\/g>/g)) {
    const body = g[2];
    const centre = /<circle cx="([\d.]+)" cy="([\d.]+)" r="1.5" class="centre"/.exec(body);
    const path = /<path d="([^"]+)" class="cam"/.exec(body);
    if (!centre || !path) throw new Error(`cam ${g[1]} has no centre or outline`);
    const [cx, cy] = [Number(centre[1]), Number(centre[2])];
    const nums = (s: string): number[] =>
      s
        .split(/[ ,]+/)
        .filter((t) => t !== '')
        .map(Number);
    const parts = path[1].split(/(?=[MLAZ])/).map((s) => ({ cmd: s[0], n: nums(s.slice(1)) }));
    const start = parts[1].n; // L to the start of the full lift
    const arc = parts[2].n; // A r r rot large sweep x y
    const base = parts[3].n;
    out.push({
      phase: g[1],
      fromDeg: angleOf(start[0], start[1], cx, cy),
      toDeg: angleOf(arc[5], arc[6], cx, cy),
      liftRadius: Math.hypot(start[0] - cx, start[1] - cy),
      baseRadius: Math.hypot(base[0] - cx, base[1] - cy),
    });
  }
  return out;
}

const close = (a: number, b: number): number => Math.abs(((a - b + 540) % 360) - 180);

describe('core/export/cams-svg', () => {
  it('draws each lobe over the window the timing check reports, within 0.5°, for every clocked example', () => {
    let checked = 0;
    for (const name of exampleNames()) {
      const b = example(name, 'auto');
      const t = findCheck(b.checks, 'timing');
      if (!t || b.build.encoding.bits === 0) continue;
      const svg = buildDocuments(b).get('cams.svg') ?? '';
      expect(xmlProblems(svg), name).toEqual([]);
      const lobes = lobesOf(svg);
      expect(
        lobes.map((l) => l.phase),
        name,
      ).toEqual(['phi1', 'phi2']);
      for (const l of lobes) {
        const [from, to] = l.phase === 'phi1' ? t.cam.phi1 : t.cam.phi2;
        expect(close(l.fromDeg, from), `${name} ${l.phase} start`).toBeLessThanOrEqual(0.5);
        expect(close(l.toDeg, to), `${name} ${l.phase} end`).toBeLessThanOrEqual(0.5);
        // Full size: the radii are the profile's, in millimetres.
        const f = b.profile.frame;
        expect(l.baseRadius).toBeCloseTo(f.camBaseRadiusM * 1000, 2);
        expect(l.liftRadius).toBeCloseTo((f.camBaseRadiusM + f.camLiftM) * 1000, 2);
      }
      checked++;
    }
    expect(checked).toBeGreaterThanOrEqual(4);
  });

  it('is sized in millimetres, one user unit per mm, with a 100 mm check bar', () => {
    const svg = camsSvg('bell', { cam: { phi1: [0, 98.2], phi2: [130.9, 294.5] }, crankRpm: 16.7 }, DEFAULT_PROFILE);
    const root = /<svg [^>]*width="([\d.]+)mm" height="([\d.]+)mm" viewBox="0 0 ([\d.]+) ([\d.]+)"/.exec(svg);
    expect(root).not.toBeNull();
    expect(Number(root?.[1])).toBe(Number(root?.[3]));
    expect(Number(root?.[2])).toBe(Number(root?.[4]));
    const bar = /<line x1="([\d.]+)" y1="([\d.]+)" x2="([\d.]+)" y2="\2" class="bar" \/>/.exec(svg);
    expect(Number(bar?.[3]) - Number(bar?.[1])).toBe(100);
    expect(svg).toContain('100 mm check bar');
    expect(svg).toMatch(/Print at 100 %/);
    expect(svg).toMatch(/Caution/);
  });

  it('keeps the ramps in the dead bands: never more than RAMP_MAX_DEG, never a third of a gap or more', () => {
    const [p1, p2] = camSpecs({ phi1: [0, 120], phi2: [126, 330] });
    expect(p1.rampOut).toBeCloseTo(2, 9); // a 6° gap: a third of it
    expect(p2.rampIn).toBeCloseTo(2, 9);
    expect(p2.rampOut).toBe(RAMP_MAX_DEG); // the 30° gap after φ2 allows the full ramp
    expect(p1.rampIn).toBe(RAMP_MAX_DEG);
    // The two cams' ramps in one gap never meet.
    expect(p1.to + p1.rampOut).toBeLessThan(p2.from - p2.rampIn);
  });

  it('says so when the machine has no clock (one state, our odd-lever example): no cams to cut', () => {
    const b = example('odd-lever.lw', 'auto');
    expect(b.build.encoding.bits).toBe(0);
    const svg = buildDocuments(b).get('cams.svg') ?? '';
    expect(svg).toContain('it needs no cams');
    expect(lobesOf(svg)).toEqual([]);
    expect(svg).toContain('100 mm check bar');
  });
});

describe('core/export/cams-svg', () => {
  it('draws a 4 in check bar with quarter-inch ticks where the profile asks for inches (1 in = 25.4 mm exactly, NIST SP 811 B.8)', () => {
    const inch = { ...DEFAULT_PROFILE, documentUnits: 'inch' as const };
    const svg = camsSvg('bell', { cam: { phi1: [0, 98.2], phi2: [130.9, 294.5] }, crankRpm: 16.7 }, inch);
    // The long line of the bar, read from the drawing's own geometry (one user unit per mm).
    const bar = /<line x1="([\d.]+)" y1="([\d.]+)" x2="([\d.]+)" y2="\2" class="bar" \/>/.exec(svg);
    const widthMm = Number(bar?.[3]) - Number(bar?.[1]);
    expect(widthMm / 25.4).toBeCloseTo(4, 9);
    expect(svg).toContain('4 in check bar');
    expect(svg).toContain('measures 4 in before cutting');
    expect(svg).not.toContain('100 mm');
    // Ticks every quarter inch (6.35 mm), 17 of them from 0 to 4 in.
    const ticks = [...svg.matchAll(/<line x1="([\d.]+)" y1="[\d.]+" x2="\1" y2="[\d.]+" class="bar" \/>/g)].map(
      (m) => Number(m[1]) - Number(bar?.[1]),
    );
    expect(ticks).toHaveLength(17);
    ticks.forEach((t, q) => expect(t).toBeCloseTo(q * 6.35, 6));
    // The sizes in inches: the 80 mm base circle is 3.150 in, the 15 mm lift 0.591 in (decimal: no true fraction).
    expect(svg).toContain('Base circle Ø 3.150 in');
    expect(svg).toContain('lift 0.591 in');
  });
});
