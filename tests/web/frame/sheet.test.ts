import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { analyse, buildMachine } from '../../../src/core/pipeline.js';
import { frameSvg } from '../../../src/core/export/frame-svg.js';
import { drawingPage, paperFor, PX_PER_MM, screenSized, svgSizeMm } from '../../../src/web/frame/sheet.js';

describe('src/web/frame/sheet', () => {
  it('picks the smallest ISO 216 A sheet that holds the drawing, upright first', () => {
    // ISO 216: A4 is 210 × 297 mm, A3 297 × 420 mm, A0 841 × 1189 mm.
    expect(paperFor(250, 150)).toEqual({ name: 'A4 landscape', widthMm: 297, heightMm: 210 });
    expect(paperFor(150, 250)).toEqual({ name: 'A4 portrait', widthMm: 210, heightMm: 297 });
    expect(paperFor(200, 200).name).toBe('A4 portrait');
    expect(paperFor(297, 210).name).toBe('A4 landscape');
    expect(paperFor(298, 100).name).toBe('A3 landscape');
    expect(paperFor(250, 300)).toEqual({ name: 'A3 portrait', widthMm: 297, heightMm: 420 });
    expect(paperFor(300, 290)).toEqual({ name: 'A3 landscape', widthMm: 420, heightMm: 297 });
    expect(paperFor(2000, 100.2)).toEqual({ name: 'custom', widthMm: 2000, heightMm: 101 });
  });

  it('reads the size of a drawing given in millimetres, and nothing else', () => {
    expect(svgSizeMm('<svg xmlns="http://www.w3.org/2000/svg" width="231mm" height="140mm">')).toEqual({
      w: 231,
      h: 140,
    });
    expect(svgSizeMm('<svg width="231" height="140">')).toBeUndefined();
    expect(() => drawingPage('<svg width="231" height="140"></svg>', 'x')).toThrow(/millimetres/);
  });

  it('prints the frame drawing of an example at its own size on the sheet that holds it, never scaled', () => {
    const text = readFileSync(fileURLToPath(new URL('../../../examples/marble-bell.lw', import.meta.url)), 'utf8');
    const a = analyse(text, 'marble-bell.lw');
    if (!a.ok) throw new Error('the example must read');
    const b = buildMachine(a);
    if (!b.ok) throw new Error('the example must build');
    const svg = frameSvg(b.build, b.placement, b.profile);
    const size = svgSizeMm(svg);
    if (!size) throw new Error('frame.svg is sized in millimetres');
    const page = drawingPage(svg, 'Frame <marble_bell>');
    const paper = paperFor(size.w, size.h);
    expect(page).toContain(`@page { size: ${paper.widthMm}mm ${paper.heightMm}mm; margin: 0; }`);
    // The sheet the drawing names in its own title.
    const [sheet, way] = paper.name.split(' ');
    expect(svg).toContain(`on an ${sheet} sheet, ${way}, or larger`);
    expect(page).toContain(`svg { display: block; width: ${size.w}mm; height: ${size.h}mm; max-width: none; }`);
    expect(page).toContain('<title>Frame &lt;marble_bell&gt;</title>');
    expect(page).not.toContain('<?xml');
    expect(page).toContain(svg.replace(/^<\?xml[^>]*\?>\s*/, ''));
  });
});

describe('src/web/frame/sheet (on screen)', () => {
  it('sizes a millimetre drawing in CSS pixels at a zoom, keeping its viewBox (CSS Values 3: 96 px = 25.4 mm)', () => {
    const svg =
      '<?xml version="1.0"?>\n<svg class="lw-frame" width="254mm" height="127mm" viewBox="0 0 254 127"></svg>';
    expect(screenSized(svg, 1)).toBe('<svg class="lw-frame" width="960" height="480" viewBox="0 0 254 127"></svg>');
    expect(screenSized(svg, 1.5)).toBe('<svg class="lw-frame" width="1440" height="720" viewBox="0 0 254 127"></svg>');
    expect(PX_PER_MM * 25.4).toBeCloseTo(96, 10);
  });
});
