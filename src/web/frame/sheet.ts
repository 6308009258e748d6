/**
 * The frame drawing made ready to print at its scale: frame.svg (the same document
 * `latchwright build --out` writes) alone on a page of the smallest ISO 216 sheet that holds
 * it whole (the sheet its title names), with the drawing at its own size in millimetres —
 * never shrunk to fit — so a print at 100 % measures true against its scale bar. Pure.
 */

import { isoSheetFor } from '../../core/index.js';

export interface Paper {
  /** 'A4 landscape', or 'custom' when no A sheet holds the drawing. */
  readonly name: string;
  readonly widthMm: number;
  readonly heightMm: number;
}

/**
 * The smallest A sheet, upright first, then turned, that holds a drawing `w` × `h` mm at 100 %:
 * the sheet frame.svg names in its own title (the drawing carries its own white border, so the
 * page adds no margin).
 */
export function paperFor(w: number, h: number): Paper {
  const s = isoSheetFor(w, h);
  return s
    ? { name: `${s.name} ${s.orientation}`, widthMm: s.widthMm, heightMm: s.heightMm }
    : { name: 'custom', widthMm: Math.ceil(w), heightMm: Math.ceil(h) };
}

/** Width and height of an SVG document whose size is given in millimetres, or undefined. */
export function svgSizeMm(svg: string): { readonly w: number; readonly h: number } | undefined {
  const root = /<svg\b[^>]*>/.exec(svg)?.[0] ?? '';
  const w = /\swidth="([\d.]+)mm"/.exec(root)?.[1];
  const h = /\sheight="([\d.]+)mm"/.exec(root)?.[1];
  return w !== undefined && h !== undefined ? { w: Number(w), h: Number(h) } : undefined;
}

const escapeHtml = (s: string): string =>
  s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

/** A self-contained HTML page printing `svg` (a drawing sized in millimetres) at 100 % on the paper that holds it. */
export function drawingPage(svg: string, title: string): string {
  const size = svgSizeMm(svg);
  if (!size) throw new Error('the drawing has no size in millimetres, so it cannot be printed to scale');
  const paper = paperFor(size.w, size.h);
  const inline = svg.replace(/^<\?xml[^>]*\?>\s*/, '');
  return [
    '<!doctype html>',
    '<html lang="en">',
    '<head>',
    '<meta charset="utf-8" />',
    `<title>${escapeHtml(title)}</title>`,
    '<style>',
    `@page { size: ${paper.widthMm}mm ${paper.heightMm}mm; margin: 0; }`,
    'html, body { margin: 0; padding: 0; background: #ffffff; }',
    // The drawing keeps its own size in millimetres: nothing may scale it to the page.
    `svg { display: block; width: ${size.w}mm; height: ${size.h}mm; max-width: none; }`,
    '</style>',
    '</head>',
    `<body data-paper="${escapeHtml(paper.name)}">`,
    inline,
    '</body>',
    '</html>',
  ].join('\n');
}

/** CSS pixels per millimetre (CSS Values and Units Level 3: 1in = 96px = 25.4mm). */
export const PX_PER_MM = 96 / 25.4;

/**
 * The size on screen, in whole CSS pixels, of a drawing sized in millimetres at `zoom` × its
 * paper size (1: a millimetre on paper is a CSS millimetre); undefined when it has no size in millimetres.
 */
export function screenSize(svg: string, zoom: number): { readonly width: string; readonly height: string } | undefined {
  const size = svgSizeMm(svg);
  const px = (mm: number): string => String(Math.round(mm * PX_PER_MM * zoom));
  return size ? { width: px(size.w), height: px(size.h) } : undefined;
}

/**
 * A drawing sized in millimetres, sized for the screen at `zoom` (screenSize), in CSS pixels;
 * its viewBox, and so its picture, kept.
 */
export function screenSized(svg: string, zoom: number): string {
  const size = screenSize(svg, zoom);
  const inline = svg.replace(/^<\?xml[^>]*\?>\s*/, '');
  if (!size) return inline;
  return inline.replace(
    /^(<svg\b[^>]*?) width="[\d.]+mm" height="[\d.]+mm"/,
    `$1 width="${size.width}" height="${size.height}"`,
  );
}
