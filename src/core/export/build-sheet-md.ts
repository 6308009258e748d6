/**
 * Markdown rendering of a Doc (the build sheet): CommonMark with GitHub-style pipe tables.
 * Text goes through escapeMd (markup characters backslash-escaped, `|` included, one line per
 * cell); fixed-width cells become code spans, where only `|` needs escaping inside a table
 * (GFM 0.29, "Tables" extension) and a text holding a backtick falls back to plain escaping.
 */
import type { Block, Doc, TableBlock } from './doc.js';
import { escapeMd, spellControls } from './escape.js';
import { buildSheet, type DocumentsInput, type Drawings } from './build-sheet.js';

/** A fixed-width cell: a code span when it can be one. */
function monoCell(text: string): string {
  const line = spellControls(text).replace(/\r\n|\r|\n|\u2028|\u2029/g, ' ');
  if (line === '' || line.includes('`')) return escapeMd(line);
  return `\`${line.replace(/\|/g, '\\|')}\``;
}

function tableMd(t: TableBlock): string {
  const mono = new Set(t.mono ?? []);
  const cell = (c: string, i: number): string => (mono.has(i) ? monoCell(c) : escapeMd(c));
  const head = [...(t.tick ? ['✓'] : []), ...t.headers.map(escapeMd)];
  const lines = [`| ${head.join(' | ')} |`, `|${head.map(() => ' --- ').join('|')}|`];
  for (const r of t.rows) lines.push(`| ${[...(t.tick ? ['☐'] : []), ...r.map(cell)].join(' | ')} |`);
  return (t.caption ? `${escapeMd(t.caption)}\n\n` : '') + lines.join('\n');
}

function blockMd(b: Block): string {
  switch (b.kind) {
    case 'p':
      return escapeMd(b.text);
    case 'list':
      return b.items.map((i, k) => `${b.ordered ? `${k + 1}.` : '-'} ${escapeMd(i)}`).join('\n');
    case 'pre': {
      // A fence longer than any run of backticks in the text, so nothing can close it early.
      const longest = Math.max(0, ...b.lines.map((l) => Math.max(0, ...(l.match(/`+/g) ?? []).map((m) => m.length))));
      const fence = '`'.repeat(Math.max(3, longest + 1));
      return `${fence}text\n${b.lines.join('\n')}\n${fence}`;
    }
    case 'note':
      return [
        `> **${escapeMd(b.title)}**`,
        ...(b.items.length > 0 ? ['>', ...b.items.map((i) => `> - ${escapeMd(i)}`)] : []),
      ].join('\n');
    case 'table':
      return tableMd(b);
    case 'figure':
      // The drawing is a file of its own beside the sheet in the build folder.
      return `![${escapeMd(b.caption)}](${encodeURI(b.file)})\n\n${escapeMd(b.caption)} (${escapeMd(b.file)})`;
  }
}

/** A Doc as Markdown. */
export function renderDocMd(doc: Doc): string {
  const out = [`# ${escapeMd(doc.title)}`];
  if (doc.subtitle) out.push('', escapeMd(doc.subtitle));
  for (const s of doc.sections) {
    out.push('', `## ${escapeMd(s.title)}`);
    for (const b of s.blocks) out.push('', blockMd(b));
  }
  return out.join('\n') + '\n';
}

/** The build sheet as Markdown; the drawings, when given, are linked to their files beside it. */
export function buildSheetMd(input: DocumentsInput, drawings?: Drawings): string {
  return renderDocMd(buildSheet(input, drawings));
}
