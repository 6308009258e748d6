import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { analyse, buildMachine } from '../../../src/core/pipeline.js';
import { frameSvg } from '../../../src/core/export/frame-svg.js';
import { drawingPieces, type Pieces } from '../../../src/web/frame/pieces.js';

/** `text` put at the end of the root (group -1) or of the root's `group`-th element child, in `doc`. */
function insertAt(doc: string, group: number, text: string): string {
  const tag = /<(\/?)([A-Za-z][\w:.-]*)[^>]*?(\/?)>/g;
  let depth = 0;
  let child = -1;
  for (let m = tag.exec(doc); m !== null; m = tag.exec(doc)) {
    if (m[1] === '/') {
      depth--;
      if ((depth === 1 && child === group) || (depth === 0 && group === -1))
        return doc.slice(0, m.index) + text + doc.slice(m.index);
    } else {
      if (depth === 1) child++;
      if (m[3] !== '/') depth++;
    }
  }
  throw new Error(`no group ${group} in the drawing`);
}

/** The drawing put back together as the page does it: each piece, in order, at the end of the root or its group. */
const reassembled = (p: Pieces): string =>
  p.pieces.reduce((doc, piece) => insertAt(doc, piece.group, piece.text), p.shell);

function example(file: string): string {
  const a = analyse(readFileSync(fileURLToPath(new URL(`../../../examples/${file}`, import.meta.url)), 'utf8'), file);
  if (!a.ok) throw new Error(`${file} must read`);
  const b = buildMachine(a);
  if (!b.ok) throw new Error(`${file} must build`);
  return frameSvg(b.build, b.placement, b.profile, { palette: 'screen' });
}

/** A random drawing: nested groups of leaves (self-closed or with text), as the core writes SVG. */
const leaf = fc.oneof(
  fc.nat(99).map((n) => `<rect x="${n}" />`),
  fc.string({ maxLength: 6 }).map((t) => `<text class="t">${t.replace(/[<>&]/g, '')}</text>`),
);
const group = (depth: number): fc.Arbitrary<string> =>
  depth === 0
    ? leaf
    : fc
        .array(fc.oneof(leaf, group(depth - 1)), { maxLength: 8 })
        .map((items) => `<g class="d${depth}">\n${items.join('\n')}\n</g>`);
const drawing = fc
  .array(fc.oneof(leaf, group(3)), { maxLength: 8 })
  .map((items) => `<svg width="10mm" height="10mm">\n<title>t</title>\n${items.join('\n')}\n</svg>\n`);

describe('src/web/frame/pieces', () => {
  it('leaves a small drawing whole', () => {
    const svg = example('marble-bell.lw');
    expect(drawingPieces(svg, svg.length)).toEqual({ shell: svg, pieces: [] });
  });

  it("cuts an example's frame into pieces that put back give the drawing, character for character", () => {
    const svg = example('crossing.lw');
    const cut = drawingPieces(svg, 4000);
    expect(cut.pieces.length).toBeGreaterThan(2);
    // Whole elements only: each piece starts where a child (or the space before it) does.
    for (const p of cut.pieces) expect(p.text.trimStart().startsWith('<')).toBe(true);
    expect(cut.shell.length).toBeLessThan(3 * 4000);
    expect(cut.pieces.some((p) => p.group >= 0)).toBe(true);
    expect(reassembled(cut)).toBe(svg);
  });

  it('puts back any drawing, whatever the size of the pieces (fast-check, fixed seed)', () => {
    fc.assert(
      fc.property(drawing, fc.integer({ min: 1, max: 200 }), (svg, size) => {
        expect(reassembled(drawingPieces(svg, size))).toBe(svg);
      }),
      { seed: 20261205, numRuns: 300 },
    );
  });
});
