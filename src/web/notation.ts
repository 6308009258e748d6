/**
 * The notation card's content, read from docs/notation.md itself — the statements of the text
 * form, the guard operators, the naming rules and the worked example — so the card and the
 * reference can never disagree: a statement added to the reference appears on the card. Pure:
 * a small reader of the Markdown the reference uses (headings, pipe tables with `\|` escapes,
 * inline code, fenced code blocks).
 */

/** A run of text, in code face or not. */
export interface Inline {
  readonly code: boolean;
  readonly text: string;
}

/** A table row of the card: what to write, and what it means. */
export interface CardRow {
  readonly write: readonly Inline[];
  readonly means: readonly Inline[];
}

export interface NotationCard {
  /** The rules of the text form in a few sentences (its section's first paragraph). */
  readonly intro: readonly Inline[];
  readonly statements: readonly CardRow[];
  readonly guards: readonly CardRow[];
  readonly guardNote: readonly Inline[];
  readonly names: readonly CardRow[];
  /** The worked example in the text form. */
  readonly example: string;
}

/** Inline Markdown: code spans in backticks; `**` and `\` escapes dropped. */
export function inline(md: string): Inline[] {
  const out: Inline[] = [];
  const parts = md.split('`');
  parts.forEach((p, i) => {
    const text = i % 2 === 1 ? p : p.replace(/\*\*/g, '').replace(/\\(.)/g, '$1');
    if (text !== '') out.push({ code: i % 2 === 1, text: i % 2 === 1 ? text.replace(/\\\|/g, '|') : text });
  });
  return out;
}

/**
 * The lines of a section: from its heading to the next heading of the same or a higher level
 * (a `#` line inside a fenced block is a comment of the example, not a heading).
 */
function section(lines: readonly string[], heading: string): string[] {
  const level = /^#+/.exec(heading)?.[0].length ?? 2;
  const start = lines.findIndex((l) => l.trim() === heading);
  if (start < 0) return [];
  const rest = lines.slice(start + 1);
  let fenced = false;
  const end = rest.findIndex((l) => {
    if (l.trim().startsWith('```')) fenced = !fenced;
    const m = fenced ? null : /^(#+)\s/.exec(l);
    return m !== null && m[1].length <= level;
  });
  return end < 0 ? rest : rest.slice(0, end);
}

/** The cells of a pipe-table row (`\|` is a bar inside a cell). */
function cells(row: string): string[] {
  return row
    .trim()
    .replace(/^\||\|$/g, '')
    .split(/(?<!\\)\|/)
    .map((c) => c.trim());
}

/** The first pipe table of some lines, as rows of cells (header and rule left out). */
function firstTable(lines: readonly string[]): string[][] {
  const start = lines.findIndex((l) => l.trim().startsWith('|'));
  if (start < 0) return [];
  const rows: string[][] = [];
  for (let i = start; i < lines.length && lines[i].trim().startsWith('|'); i++) rows.push(cells(lines[i]));
  return rows.slice(2);
}

/** The first paragraph of some lines (joined), skipping blank lines before it. */
function firstParagraph(lines: readonly string[]): string {
  const start = lines.findIndex((l) => l.trim() !== '');
  if (start < 0) return '';
  const end = lines.findIndex((l, i) => i > start && l.trim() === '');
  return lines
    .slice(start, end < 0 ? undefined : end)
    .map((l) => l.trim())
    .join(' ');
}

/** The first fenced block with no language (the text form) in some lines. */
function firstTextBlock(lines: readonly string[]): string {
  const start = lines.findIndex((l) => l.trim() === '```');
  if (start < 0) return '';
  const end = lines.findIndex((l, i) => i > start && l.trim() === '```');
  return lines.slice(start + 1, end < 0 ? undefined : end).join('\n') + '\n';
}

const rows = (table: readonly string[][]): CardRow[] =>
  table.map((r) => ({ write: inline(r[0] ?? ''), means: inline(r[1] ?? '') }));

/** The card, read from the text of docs/notation.md. */
export function notationCard(md: string): NotationCard {
  const lines = md.split(/\r?\n/);
  const text = section(lines, '## Text form');
  const guards = section(lines, '### Guard expressions');
  const afterTable = guards.slice(
    guards.findIndex((l, i) => i > 0 && l.trim() === '' && guards[i - 1].startsWith('|')),
  );
  return {
    intro: inline(firstParagraph(text)),
    statements: rows(firstTable(text)),
    guards: rows(firstTable(guards)),
    guardNote: inline(firstParagraph(afterTable)),
    names: rows(firstTable(section(lines, '### Names'))),
    example: firstTextBlock(section(lines, '## Worked example')),
  };
}
