/**
 * frame.svg: the front elevation to scale. Sizes are read from the SVG itself (SVG 1.1,
 * "Units": width and height in mm on the root element, the viewBox in the same numbers, so
 * one user unit is one millimetre on paper): the drum's drawn length is its length at the
 * stated scale, and so is the scale bar. Every bay is labelled by what it does; every routed
 * branch is drawn.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyse, buildMachine } from '../../../src/core/pipeline.js';
import { DEFAULT_PROFILE, type Profile } from '../../../src/core/physics/profile.js';
import { buildDocuments } from '../../../src/core/export/index.js';
import { frameScale, frameSvg, MAX_HEIGHT_MM, MAX_WIDTH_MM, paperFor } from '../../../src/core/export/frame-svg.js';
import { partWords } from '../../../src/core/export/part-words.js';
import { escapeXml } from '../../../src/core/export/escape.js';
import { example, exampleNames, xmlProblems } from './support.js';

describe('core/export/frame-svg', () => {
  it('draws every example well-formed, sized in millimetres, at a stated scale', () => {
    for (const name of exampleNames()) {
      const b = example(name);
      const svg = frameSvg(b.build, b.placement, b.profile);
      expect(xmlProblems(svg), name).toEqual([]);
      const root = /<svg [^>]*width="(\d+)mm" height="(\d+)mm" viewBox="0 0 (\d+) (\d+)"/.exec(svg);
      expect(root?.[1], name).toBe(root?.[3]);
      expect(root?.[2], name).toBe(root?.[4]);
      const f = b.profile.frame;
      const top = b.placement.drums[b.placement.drums.length - 1].levelM;
      const heightM = top + f.railAboveDrumM + 0.05 + f.channelBelowDrumM;
      const scale = frameScale(Math.max(...b.placement.drums.map((d) => d.lengthM)), heightM);
      expect((heightM * 1000) / scale, name).toBeLessThanOrEqual(MAX_HEIGHT_MM);
      // The title block's lines, wrapped to the sheet, read as one text.
      const title = [...svg.matchAll(/<text [^>]*class="(?:sub|note)"[^>]*>([^<]*)<\/text>/g)]
        .map((t) => t[1])
        .join(' ');
      expect(title, name).toContain(
        `Scale 1:${scale} when printed at 100 % on an ${paperFor(+root![1], +root![2])} or larger`,
      );
    }
  });

  it('wraps the title block to the drawing: no line runs past the right margin', () => {
    for (const name of exampleNames()) {
      const b = example(name);
      const svg = frameSvg(b.build, b.placement, b.profile);
      const width = Number(/<svg [^>]*width="(\d+)mm"/.exec(svg)?.[1]);
      const lines = [...svg.matchAll(/<text x="10" y="([\d.]+)" class="(sub|note)"[^>]*>([^<]*)<\/text>/g)].filter(
        (t) => Number(t[1]) < 40,
      );
      expect(lines.length, name).toBeGreaterThanOrEqual(4);
      for (const [, , cls, text] of lines) {
        // Font sizes as the drawing's style sets them; 0.56 em, the average advance of a sans glyph (an estimate).
        const size = cls === 'sub' ? 2.6 : 2.3;
        const chars = [...text.replace(/&#?\w+;/g, '_')].length;
        expect(10 + chars * size * 0.56, `${name}: ${text}`).toBeLessThanOrEqual(width - 10);
      }
    }
  });

  it('draws each drum at its length to scale, and a scale bar of the length it says', () => {
    const b = example('crossing.lw');
    const svg = frameSvg(b.build, b.placement, b.profile);
    // Two drums 0.6 m apart: channel 0.12 m below drum 1, rail 0.2 m above drum 2, lever ends 0.05 m.
    const longest = Math.max(...b.placement.drums.map((d) => d.lengthM));
    const s = frameScale(longest, 0.97);
    // The longer drum, 1.30 m: 260 mm at 1:5 is past MAX_WIDTH_MM, so 1:10 (130 mm).
    expect(longest).toBeCloseTo(1.302, 3);
    expect(s).toBe(10);
    expect((longest * 1000) / 5).toBeGreaterThan(MAX_WIDTH_MM);
    expect((longest * 1000) / s).toBeLessThanOrEqual(MAX_WIDTH_MM);
    for (const d of b.placement.drums) {
      const g = new RegExp(`<g class="drum-${d.drum}">\\s*<rect x="[\\d.]+" y="[\\d.]+" width="([\\d.]+)"`).exec(svg);
      expect(Number(g?.[1]), `drum ${d.drum}`).toBeCloseTo((d.lengthM * 1000) / s, 0);
    }
    const blocks = [
      ...svg.matchAll(/<rect x="([\d.]+)" y="([\d.]+)" width="([\d.]+)" height="1.6" class="bar-[ab]" \/>/g),
    ];
    expect(blocks).toHaveLength(5);
    const drawn = blocks.reduce((sum, m) => sum + Number(m[3]), 0);
    const said = /<text [^>]*>([\d.]+) m<\/text>/.exec(svg.slice(svg.indexOf('class="bar-a"')));
    expect(drawn).toBeCloseTo((Number(said?.[1]) * 1000) / s, 0);
  });

  it('labels every bay with what it does, and draws every routed branch once', () => {
    for (const name of ['marble-bell.lw', 'lighthouse.lw']) {
      const b = example(name);
      const svg = frameSvg(b.build, b.placement, b.profile);
      const words = partWords(b.build);
      for (const bay of b.placement.bays) {
        expect(svg, `${name} ${bay.part}`).toContain(
          escapeXml(`drum ${bay.drum}, bay ${bay.bay}: ${bay.bay} · ${words.get(bay.part)}`),
        );
      }
      const drawn = [...svg.matchAll(/data-cord="([^"]+)" data-target="([^"]+)"/g)].map((m) => `${m[1]}→${m[2]}`);
      const routed = b.placement.routing.branches.map((x) => `${escapeXml(x.cord)}→${escapeXml(x.target)}`);
      expect(drawn.sort(), name).toEqual(routed.sort());
      expect(svg).toMatch(/class="pulley"/);
      expect(svg).toMatch(/visitor end/);
      expect(svg).toMatch(/crank end/);
      expect(svg).toMatch(/Caution/);
    }
  });

  it('draws every run along a channel under the drum the routing recorded for it, with a channel deeper than half the drum spacing', () => {
    // 0.45 m of channel under drums 0.6 m apart (inside the plausible ranges of docs/profile.md): drum 2's channel runs
    // between drum 1's axis and its rail. Each drum's channel line on paper is taken from the drawing itself (the
    // drum's body, its axis at the rect's middle, the channel the profile's depth at the stated scale below it).
    const deep: Profile = {
      ...DEFAULT_PROFILE,
      frame: { ...DEFAULT_PROFILE.frame, channelBelowDrumM: 0.45, longestDrumM: 0.5, drumsPerFrame: 6 },
    };
    const a = analyse(readFileSync('examples/marble-bell.lw', 'utf8'), 'marble-bell.lw');
    if (!a.ok) throw new Error('marble bell must read');
    const b = buildMachine(a, { encoding: 'binary', profile: deep, checks: false });
    if (!b.ok) throw new Error('marble bell must build');
    expect(b.placement.drums.length).toBeGreaterThanOrEqual(3);
    const svg = frameSvg(b.build, b.placement, b.profile);
    const scale = Number(/Scale 1:(\d+) when printed/.exec(svg)?.[1]);
    const channelOnPaper = new Map(
      b.placement.drums.map((d) => {
        const body = new RegExp(
          `<g class="drum-${d.drum}">\\s*<rect x="[\\d.]+" y="([\\d.]+)" width="[\\d.]+" height="([\\d.]+)"`,
        ).exec(svg);
        return [d.drum, Number(body?.[1]) + Number(body?.[2]) / 2 + (0.45 * 1000) / scale];
      }),
    );
    const drumOf = new Map(b.placement.bays.map((x) => [x.part, x.drum]));
    let checked = 0;
    for (const br of b.placement.routing.branches) {
      const run = br.own.find((r) => r.kind === 'channel');
      // A run of a few millimetres (a lever almost above its capstan) can vanish on paper into the cord's rise.
      if (!run || (run.lengthM * 1000) / scale < 1) continue;
      const tag = `${br.cord} → ${br.target}`;
      // Design §11: the lower of the two drums' channel, as the run records.
      expect(run.drum, tag).toBe(Math.min(drumOf.get(br.driver) ?? NaN, drumOf.get(br.part) ?? NaN));
      const path = new RegExp(
        `<path d="([^"]+)" class="cord" data-cord="${escapeXml(br.cord)}" data-target="${escapeXml(br.target)}"`,
      ).exec(svg);
      const pts = [...(path?.[1] ?? '').matchAll(/[ML]([\d.]+),([\d.]+)/g)].map((m) => [Number(m[1]), Number(m[2])]);
      const along = pts.findIndex((p, i) => i > 0 && p[1] === pts[i - 1][1] && p[0] !== pts[i - 1][0]);
      expect(along, tag).toBeGreaterThan(0);
      const y = pts[along][1];
      // Its lane lies under its own drum's channel: the nearest channel line above it is that drum's.
      const above = [...channelOnPaper].filter(([, cy]) => cy <= y + 1e-6).sort((p, q) => q[1] - p[1]);
      expect(above[0]?.[0], tag).toBe(run.drum);
      checked++;
    }
    expect(checked).toBeGreaterThan(10);
    expect(
      new Set(b.placement.routing.branches.flatMap((x) => x.own.filter((r) => r.kind === 'channel').map((r) => r.drum)))
        .size,
    ).toBeGreaterThan(1);
  });

  it('draws each cord tied to one lever on a rise line of its own, straight up and inside the lever’s share of its bay', () => {
    // A port is the wired-AND of its cords, and a one-port gate's Z lever carries every input (design §3), so a
    // lever with two or more cords is common: every example has them. Each must be seen as a cord of its own.
    let levers = 0;
    for (const name of exampleNames()) {
      const b = example(name);
      const svg = frameSvg(b.build, b.placement, b.profile, { palette: 'screen' });
      const scale = Number(/Scale 1:(\d+) when printed/.exec(svg)?.[1]);
      const points = (d: string): number[][] => [...d.matchAll(/[ML]([\d.]+),([\d.]+)/g)].map((m) => [+m[1], +m[2]]);
      const drawn = new Map(
        [...svg.matchAll(/<path d="([^"]+)" class="cord" data-cord="([^"]+)" data-target="([^"]+)"/g)].map((m) => [
          `${m[2]}→${m[3]}`,
          points(m[1]),
        ]),
      );
      const lit = new Map(
        [...svg.matchAll(/<path d="([^"]+)" class="route" data-route-cord="([^"]+)" data-route-target="([^"]+)"/g)].map(
          (m) => [`${m[2]}→${m[3]}`, points(m[1])],
        ),
      );
      const byLever = new Map<string, typeof b.placement.routing.branches>();
      for (const br of b.placement.routing.branches)
        if (br.kind === 'port' && br.own[br.own.length - 1].kind === 'rise')
          byLever.set(br.target, [...(byLever.get(br.target) ?? []), br]);
      for (const [target, list] of byLever) {
        if (list.length < 2) continue;
        levers++;
        const part = list[0].part;
        const bay = b.placement.bays.find((x) => x.part === part);
        const lever = escapeXml(target.slice(part.length + 1));
        const end = new RegExp(
          `<rect x="([\\d.]+)" y="[\\d.]+" width="([\\d.]+)" height="[\\d.]+" class="lever[^"]*" data-part="${escapeXml(part)}" data-lever="${lever}"`,
        ).exec(svg);
        const centre = Number(end?.[1]) + Number(end?.[2]) / 2;
        const share = ((bay?.widthM ?? 0) / (bay?.levers.length ?? 1)) * (1000 / scale);
        const xs = list.map((br) => {
          const key = `${escapeXml(br.cord)}→${escapeXml(br.target)}`;
          const pts = drawn.get(key) ?? [];
          const [foot, top] = pts.slice(-2);
          const tag = `${name} ${key}`;
          // Straight up: the same offset from the channel to the rail; and the lit whole path rises on the same line.
          expect(foot[0], tag).toBe(top[0]);
          expect(top[1], tag).toBeLessThan(foot[1]);
          expect((lit.get(key) ?? []).at(-1)?.[0], tag).toBe(top[0]);
          expect(Math.abs(top[0] - centre), tag).toBeLessThan(share / 2);
          return top[0];
        });
        // Distinct lines at least a cord's stroke (0.3 mm) apart.
        const sorted = [...xs].sort((p, q) => p - q);
        for (let i = 1; i < sorted.length; i++)
          expect(sorted[i] - sorted[i - 1], `${name} ${target}`).toBeGreaterThanOrEqual(0.3 - 0.011);
      }
    }
    expect(levers).toBeGreaterThan(50);
  });

  it('picks a scale that keeps the stack of drums within MAX_HEIGHT_MM as well as the drum within MAX_WIDTH_MM', () => {
    expect(frameScale(0.25, 0.37)).toBe(2); // 1:1 would be 370 mm tall
    expect(frameScale(0.25, 0)).toBe(1);
    expect(frameScale(1.2, 1.57)).toBe(10); // three drums
    expect(frameScale(30, 0.37)).toBe(200); // a 30 m drum: its length alone asks for 1:200
  });

  it('names the smallest ISO 216 sheet that holds the drawing (A4 210 × 297 mm, A3 297 × 420, A2 420 × 594)', () => {
    expect(paperFor(200, 290)).toBe('A4 sheet, portrait,');
    expect(paperFor(280, 200)).toBe('A4 sheet, landscape,');
    expect(paperFor(280, 299)).toBe('A3 sheet, portrait,');
    expect(paperFor(253, 438)).toBe('A2 sheet, portrait,');
    expect(paperFor(2000, 2000)).toBe('');
  });

  it('is the frame.svg of the build documents', () => {
    const b = example('marble-bell.lw');
    expect(buildDocuments(b).get('frame.svg')).toBe(frameSvg(b.build, b.placement, b.profile));
  });
});

describe('core/export/frame-svg (ids for a page, and the screen palette)', () => {
  const attr = (tag: string, name: string): string | undefined => new RegExp(`\\s${name}="([^"]*)"`).exec(tag)?.[1];

  it('marks every lever end with its part, lever, drum and bay, as placed', () => {
    for (const name of ['marble-bell.lw', 'crossing.lw']) {
      const b = example(name);
      const svg = frameSvg(b.build, b.placement, b.profile);
      const ends = [...svg.matchAll(/<rect [^>]*class="lever[^"]*"[^>]*data-part[^>]*\/>/g)].map((m) =>
        [attr(m[0], 'data-part'), attr(m[0], 'data-lever'), attr(m[0], 'data-drum'), attr(m[0], 'data-bay')].join(' '),
      );
      const placed = b.placement.bays.flatMap((bay) =>
        bay.levers
          .filter((l) => l.name !== 'exit')
          .map((l) => [escapeXml(bay.part), escapeXml(l.name), bay.drum, bay.bay].join(' ')),
      );
      expect(ends.sort(), name).toEqual(placed.sort());
    }
  });

  it("names each branch's driver and the lever it is tied to, and that lever is drawn", () => {
    const b = example('marble-bell.lw');
    const svg = frameSvg(b.build, b.placement, b.profile);
    const paths = [...svg.matchAll(/<path [^>]*data-cord="[^"]*"[^>]*>/g)].map((m) => m[0]);
    expect(paths).toHaveLength(b.placement.routing.branches.length);
    for (const br of b.placement.routing.branches) {
      const p = paths.find(
        (t) => attr(t, 'data-cord') === escapeXml(br.cord) && attr(t, 'data-target') === escapeXml(br.target),
      );
      expect(p, br.target).toBeDefined();
      expect(attr(p ?? '', 'data-driver')).toBe(escapeXml(br.driver));
      expect(`${br.part}.${attr(p ?? '', 'data-lever')}`).toBe(br.kind === 'port' ? br.target : `${br.part}.exit`);
      if (br.kind === 'port')
        expect(svg).toContain(`data-part="${escapeXml(br.part)}" data-lever="${attr(p ?? '', 'data-lever')}"`);
      expect(svg).toContain(`data-part="${escapeXml(br.driver)}"`);
    }
  });

  it('draws the same picture in the screen palette, in theme colours scoped to its own class', () => {
    for (const name of exampleNames()) {
      const b = example(name);
      const paper = frameSvg(b.build, b.placement, b.profile);
      const screen = frameSvg(b.build, b.placement, b.profile, { palette: 'screen' });
      expect(xmlProblems(screen), name).toEqual([]);
      const style = /<style>([\s\S]*?)<\/style>/;
      // The screen drawing adds, unseen until the page lights one, each branch's whole path from the drum.
      const route = /\s*<path d="[^"]*" class="route" [^>]*\/>/g;
      expect(screen.match(route)?.length ?? 0, name).toBe(b.placement.routing.branches.length);
      expect(paper).not.toMatch(route);
      const body = (svg: string): string => svg.replace(style, '').replace(' class="lw-frame"', '').replace(route, '');
      expect(body(screen), name).toBe(body(paper));
      expect(screen).toMatch(/^<\?xml[^>]*>\s*<svg [^>]*class="lw-frame"/);
      const rules = (style.exec(screen)?.[1] ?? '').trim().split('\n');
      for (const r of rules) expect(r, name).toMatch(/^\.lw-frame /);
      // No paper colour is left but the one black cords are picked out by.
      expect(rules.join('\n').replace("[stroke='#000000']", ''), name).not.toMatch(/#[0-9a-f]{6}|url\(/i);
      expect(rules.join('\n')).toContain('var(--lw-ink)');
    }
  });
});

describe('core/export/frame-svg', () => {
  it('draws a scale bar of whole inches or feet where the profile asks for inches, as long as its label says at the scale', () => {
    // 1 in = 25.4 mm and 1 ft = 304.8 mm exactly (NIST SP 811 B.8).
    for (const name of ['crossing.lw', 'marble-bell.lw', 'odd-lever.lw']) {
      const b = example(name);
      const inch: Profile = { ...b.profile, documentUnits: 'inch' };
      const svg = frameSvg(b.build, b.placement, inch);
      const f = b.profile.frame;
      const top = b.placement.drums[b.placement.drums.length - 1].levelM;
      const heightM = top + f.railAboveDrumM + 0.05 + f.channelBelowDrumM;
      const scale = frameScale(Math.max(...b.placement.drums.map((d) => d.lengthM)), heightM);
      // The same scale as the metric drawing: only the words change.
      expect(svg, name).toContain(`scale 1:${scale} — check the bar`);
      const blocks = [
        ...svg.matchAll(/<rect x="([\d.]+)" y="([\d.]+)" width="([\d.]+)" height="1.6" class="bar-[ab]" \/>/g),
      ];
      const first = Number(blocks[0][1]);
      const last = blocks[blocks.length - 1];
      const drawnMm = Number(last[1]) + Number(last[3]) - first;
      const label = /<text [^>]*>(\d+) (in|ft)<\/text>/.exec(svg.slice(svg.indexOf('class="bar-a"')));
      expect(label, name).not.toBeNull();
      const saidMm = Number(label?.[1]) * (label?.[2] === 'ft' ? 304.8 : 25.4);
      // Positions are written to 0.1 mm: the bar measures its label to within that, at the drawing's scale.
      expect(Math.abs(drawnMm * scale - saidMm), name).toBeLessThanOrEqual(0.15 * scale);
      expect(drawnMm, name).toBeLessThanOrEqual(80.1);
      expect(svg, name).not.toMatch(/<text [^>]*>[\d.]+ m<\/text>/);
      expect(svg, name).toContain('centre in inches from the visitor end');
    }
  });

  it('writes the drum lengths in feet and inches to the nearest sixteenth where the profile asks for inches', () => {
    const b = example('crossing.lw');
    const svg = frameSvg(b.build, b.placement, { ...b.profile, documentUnits: 'inch' });
    for (const d of b.placement.drums) {
      const words = new RegExp(`drum ${d.drum}: ([^,<]+), ${d.bays.length} bays`).exec(svg)?.[1] ?? '';
      const m = /^(?:(\d+) ft)? ?(?:(\d+))? ?(?:(\d+)\/(\d+))? in$|^(\d+) ft$/.exec(words);
      expect(m, words).not.toBeNull();
      const inches =
        Number(m?.[1] ?? m?.[5] ?? 0) * 12 + Number(m?.[2] ?? 0) + (m?.[3] ? Number(m[3]) / Number(m[4]) : 0);
      expect(Math.abs(inches * 0.0254 - d.lengthM), words).toBeLessThanOrEqual(0.0254 / 32 + 1e-12);
    }
  });
});
