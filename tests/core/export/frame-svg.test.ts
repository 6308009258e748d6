/**
 * frame.svg: the front elevation to scale. Sizes are read from the SVG itself (SVG 1.1,
 * "Units": width and height in mm on the root element, the viewBox in the same numbers, so
 * one user unit is one millimetre on paper): the drum's drawn length is its length at the
 * stated scale, and so is the scale bar. Every bay is labelled by what it does; every routed
 * branch is drawn.
 */
import { describe, expect, it } from 'vitest';
import { buildDocuments } from '../../../src/core/export/index.js';
import { frameScale, frameSvg, MAX_WIDTH_MM } from '../../../src/core/export/frame-svg.js';
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
      const scale = frameScale(Math.max(...b.placement.drums.map((d) => d.lengthM)));
      expect(svg, name).toContain(`Scale 1:${scale} when printed at 100 %`);
    }
  });

  it('draws each drum at its length to scale, and a scale bar of the length it says', () => {
    const b = example('crossing.lw');
    const svg = frameSvg(b.build, b.placement, b.profile);
    const s = frameScale(Math.max(...b.placement.drums.map((d) => d.lengthM)));
    expect(s).toBe(5); // 1.08 m at 1:5 is 216 mm, within MAX_WIDTH_MM
    expect((1.08 * 1000) / s).toBeLessThanOrEqual(MAX_WIDTH_MM);
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

  it('is the frame.svg of the build documents', () => {
    const b = example('marble-bell.lw');
    expect(buildDocuments(b).get('frame.svg')).toBe(frameSvg(b.build, b.placement, b.profile));
  });
});
