/**
 * Small helpers shared by the two SVG drawings (schematic and state diagram): the document
 * shell (one self-contained SVG 1.1 file with its own style sheet, no external references),
 * text width estimates for sizing boxes before layout, and edge paths. Text is escaped here
 * or by the callers through escapeXml; attribute values are numbers or our own class names.
 */
import { escapeXml as x } from './escape.js';

export interface Point {
  readonly x: number;
  readonly y: number;
}

/** Rough advance width of text in pixels (average glyph widths of common sans and mono fonts — an estimate). */
export function textWidth(text: string, size: number, mono = false): number {
  return [...text].length * size * (mono ? 0.62 : 0.56);
}

/** Cut text to at most `max` characters, with an ellipsis. */
export function clip(text: string, max: number): string {
  const chars = [...text];
  return chars.length <= max ? text : `${chars.slice(0, max - 1).join('')}…`;
}

const r1 = (v: number): string => String(Math.round(v * 10) / 10);

/** A path through the points, corners rounded with quadratic curves. */
export function pathThrough(points: readonly Point[]): string {
  if (points.length === 0) return '';
  let d = `M${r1(points[0].x)},${r1(points[0].y)}`;
  for (let i = 1; i < points.length - 1; i++) {
    const a = points[i];
    const b = points[i + 1];
    const mx = (a.x + b.x) / 2;
    const my = (a.y + b.y) / 2;
    d += ` Q${r1(a.x)},${r1(a.y)} ${r1(mx)},${r1(my)}`;
  }
  const last = points[points.length - 1];
  return `${d} L${r1(last.x)},${r1(last.y)}`;
}

/** A text element; `cls` is one of our class names. */
export function svgText(
  px: number,
  py: number,
  text: string,
  cls: string,
  anchor: 'start' | 'middle' | 'end' = 'middle',
): string {
  return `<text x="${r1(px)}" y="${r1(py)}" class="${cls}" text-anchor="${anchor}">${x(text)}</text>`;
}

/** A rounded rectangle centred at (cx, cy). */
export function svgBox(cx: number, cy: number, w: number, h: number, cls: string, radius = 6): string {
  return `<rect x="${r1(cx - w / 2)}" y="${r1(cy - h / 2)}" width="${r1(w)}" height="${r1(h)}" rx="${radius}" class="${cls}" />`;
}

/**
 * The whole SVG document. `unit` is the unit of its width and height ('' for pixels, 'mm' for a
 * drawing to print at a stated scale: one user unit is then one millimetre on paper).
 * `rootClass` (one of our class names) goes on the root element.
 */
export function svgDocument(
  width: number,
  height: number,
  title: string,
  description: string,
  style: string,
  body: readonly string[],
  unit: '' | 'mm' = '',
  rootClass?: string,
): string {
  const w = Math.ceil(width);
  const h = Math.ceil(height);
  const cls = rootClass ? ` class="${rootClass}"` : '';
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg"${cls} version="1.1" width="${w}${unit}" height="${h}${unit}" viewBox="0 0 ${w} ${h}">`,
    `<title>${x(title)}</title>`,
    `<desc>${x(description)}</desc>`,
    `<style>${style}</style>`,
    `<rect x="0" y="0" width="${w}" height="${h}" class="page" />`,
    ...body,
    '</svg>',
    '',
  ].join('\n');
}

export { r1 as round1 };

/** The smallest rectangle holding every box (given by centre and size) and every point. */
export function extentOf(
  boxes: readonly { readonly x: number; readonly y: number; readonly width: number; readonly height: number }[],
  points: readonly Point[],
): { minX: number; minY: number; maxX: number; maxY: number } {
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (const b of boxes) {
    minX = Math.min(minX, b.x - b.width / 2);
    maxX = Math.max(maxX, b.x + b.width / 2);
    minY = Math.min(minY, b.y - b.height / 2);
    maxY = Math.max(maxY, b.y + b.height / 2);
  }
  for (const q of points) {
    minX = Math.min(minX, q.x);
    maxX = Math.max(maxX, q.x);
    minY = Math.min(minY, q.y);
    maxY = Math.max(maxY, q.y);
  }
  return minX === Infinity ? { minX: 0, minY: 0, maxX: 0, maxY: 0 } : { minX, minY, maxX, maxY };
}

/** Break words into lines of at most `width` characters (at most `most` lines, the last cut with an ellipsis). */
export function wrapWords(text: string, width: number, most: number): string[] {
  const lines: string[] = [];
  let line = '';
  // A product's dot stays with the literal after it ("a · b" breaks as "a" / "· b").
  const words = text.split(' ').reduce<string[]>((ws, w) => {
    const last = ws[ws.length - 1];
    if (last === '·') ws[ws.length - 1] = `· ${w}`;
    else ws.push(w);
    return ws;
  }, []);
  for (const word of words) {
    if (line === '') line = word;
    else if ([...line].length + 1 + [...word].length <= width) line += ` ${word}`;
    else {
      lines.push(line);
      line = word;
    }
  }
  if (line !== '') lines.push(line);
  const kept = lines.slice(0, most).map((l) => clip(l, width));
  if (lines.length > most) kept[most - 1] = clip(`${kept[most - 1]} …`, width);
  return kept;
}
