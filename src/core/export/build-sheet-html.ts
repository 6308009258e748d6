/**
 * HTML rendering of a Doc (the build sheet and the commissioning sheet): one self-contained
 * file — no scripts, fonts, or links to anything outside it — in light colours, with a
 * print stylesheet that starts every section on a new page, repeats table headers on each
 * page, keeps table rows whole and fits each drawing on one page. Every piece of text goes
 * through escapeXml; the markup is well-formed XML as well as HTML (every element closed), so
 * it parses either way. A drawing is embedded as an image whose source is the SVG itself, as
 * a data URL (RFC 2397, base64 of its UTF-8): its style sheet stays its own, and it scales to
 * the page like a picture. Its colours keep text at 4.5:1 or more against its background, and
 * every link of the contents is at least 24 px high (WCAG 2.2, 1.4.3 and 2.5.8; held by an
 * accessibility checker in tests/web/accessibility.test.ts).
 */
import type { Block, Doc, FigureBlock, TableBlock } from './doc.js';
import { escapeXml as x } from './escape.js';
import { buildSheet, type DocumentsInput, type Drawings } from './build-sheet.js';

const CSS = `
:root { color-scheme: light; }
body { font: 11pt/1.45 system-ui, -apple-system, "Segoe UI", Roboto, sans-serif; color: #1d2327; background: #fdfdfb; margin: 2rem auto; max-width: 64rem; padding: 0 1.5rem; }
h1 { font-size: 1.7rem; margin: 0 0 .2rem; }
.subtitle { color: #50575e; margin: 0 0 1.5rem; }
h2 { font-size: 1.25rem; border-bottom: 2px solid #c9d3cf; padding-bottom: .2rem; margin-top: 2.2rem; }
nav ol { columns: 2; color: #50575e; }
nav a { color: #2c4a5a; display: inline-block; min-height: 24px; padding: 2px 0; }
table { border-collapse: collapse; margin: .6rem 0 1rem; font-size: .92rem; }
caption { text-align: left; color: #50575e; font-size: .88rem; padding-bottom: .2rem; }
th, td { border: 1px solid #d4dad7; padding: .22rem .5rem; text-align: left; vertical-align: top; }
th { background: #eef2f0; font-weight: 600; }
tbody tr:nth-child(even) td { background: #f7f9f8; }
td.mono, pre, code { font-family: ui-monospace, "Cascadia Mono", Menlo, Consolas, monospace; font-size: .88rem; }
td.tick { width: 1.4rem; text-align: center; color: #50575e; }
pre { background: #f3f5f4; border: 1px solid #d4dad7; padding: .6rem .8rem; white-space: pre-wrap; }
.note { border: 1px solid #c9d3cf; border-left: 5px solid #8a9a93; background: #f6f8f7; padding: .5rem .9rem; margin: .8rem 0; }
.note.caution { border-left-color: #b58a2c; background: #fdf8ec; }
.note.fail { border-left-color: #b04a3c; background: #fbf0ee; }
.note.ok { border-left-color: #5a8a6a; background: #f1f7f2; }
.note p.title { font-weight: 600; margin: .1rem 0 .3rem; }
.note ul { margin: .2rem 0; padding-left: 1.2rem; }
figure.drawing { margin: .8rem 0 1.2rem; }
figure.drawing img { display: block; max-width: 100%; height: auto; border: 1px solid #d4dad7; background: #fff; }
figure.drawing figcaption { color: #50575e; font-size: .88rem; margin-top: .3rem; }
@page { margin: 14mm; }
@media print {
  body { background: #fff; margin: 0; max-width: none; padding: 0; font-size: 10pt; }
  nav { display: none; }
  section { break-before: page; }
  section:first-of-type { break-before: auto; }
  h2 { break-after: avoid; margin-top: 0; }
  table { font-size: 8.5pt; }
  thead { display: table-header-group; }
  tr, .note, pre, figure.drawing { break-inside: avoid; }
  figure.drawing img { max-height: 235mm; width: auto; border: none; }
  tbody tr:nth-child(even) td { background: #fff; }
}
`;

function tableHtml(t: TableBlock): string {
  const mono = new Set(t.mono ?? []);
  const head = `${t.tick ? '<th>✓</th>' : ''}${t.headers.map((h) => `<th scope="col">${x(h)}</th>`).join('')}`;
  const rows = t.rows.map(
    (r) =>
      `<tr>${t.tick ? '<td class="tick">☐</td>' : ''}${r.map((c, i) => `<td${mono.has(i) ? ' class="mono"' : ''}>${x(c)}</td>`).join('')}</tr>`,
  );
  // A table of name/value pairs has no header words: leave the header row out.
  const thead = t.headers.every((h) => h === '') ? '' : `<thead><tr>${head}</tr></thead>`;
  return `<table>${t.caption ? `<caption>${x(t.caption)}</caption>` : ''}${thead}<tbody>\n${rows.join('\n')}\n</tbody></table>`;
}

/** Base64 of a text's UTF-8 bytes (RFC 4648), with the platform's btoa. */
function base64(text: string): string {
  const bytes = new TextEncoder().encode(text);
  let binary = '';
  for (let i = 0; i < bytes.length; i += 0x8000) binary += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  return btoa(binary);
}

function figureHtml(f: FigureBlock): string {
  const src = `data:image/svg+xml;base64,${base64(f.svg)}`;
  return `<figure class="drawing"><img src="${src}" alt="${x(f.caption)}" /><figcaption>${x(f.caption)} (also in ${x(f.file)})</figcaption></figure>`;
}

function blockHtml(b: Block): string {
  switch (b.kind) {
    case 'p':
      return `<p>${x(b.text)}</p>`;
    case 'list': {
      const tag = b.ordered ? 'ol' : 'ul';
      return `<${tag}>${b.items.map((i) => `<li>${x(i)}</li>`).join('')}</${tag}>`;
    }
    case 'pre':
      return `<pre>${b.lines.map(x).join('\n')}</pre>`;
    case 'note':
      return `<div class="note ${b.tone}"><p class="title">${x(b.title)}</p>${b.items.length > 0 ? `<ul>${b.items.map((i) => `<li>${x(i)}</li>`).join('')}</ul>` : ''}</div>`;
    case 'table':
      return tableHtml(b);
    case 'figure':
      return figureHtml(b);
  }
}

/** A Doc as one self-contained HTML page. */
export function renderDocHtml(doc: Doc): string {
  const nav =
    doc.sections.length > 2
      ? `<nav><ol>${doc.sections.map((s) => `<li><a href="#${x(s.id)}">${x(s.title)}</a></li>`).join('')}</ol></nav>\n`
      : '';
  const sections = doc.sections.map(
    (s) => `<section id="${x(s.id)}">\n<h2>${x(s.title)}</h2>\n${s.blocks.map(blockHtml).join('\n')}\n</section>`,
  );
  const page = doc.landscape
    ? '\n@page { size: landscape; }\nbody { max-width: 96rem; }\n@media print { figure.drawing img { max-height: 150mm; } }'
    : '';
  return [
    '<!DOCTYPE html>',
    '<html lang="en">',
    '<head>',
    '<meta charset="utf-8" />',
    '<meta name="viewport" content="width=device-width, initial-scale=1" />',
    `<title>${x(doc.title)}</title>`,
    `<style>${CSS}${page}</style>`,
    '</head>',
    '<body>',
    `<header><h1>${x(doc.title)}</h1>${doc.subtitle ? `<p class="subtitle">${x(doc.subtitle)}</p>` : ''}</header>`,
    `${nav}${sections.join('\n')}`,
    '</body>',
    '</html>',
    '',
  ].join('\n');
}

/** The build sheet as a printable, self-contained HTML page, with the drawings when given. */
export function buildSheetHtml(input: DocumentsInput, drawings?: Drawings): string {
  return renderDocHtml(buildSheet(input, drawings));
}
