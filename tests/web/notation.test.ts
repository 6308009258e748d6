/**
 * The notation card says what the reference says: it is read from docs/notation.md, and it
 * must name every statement keyword the text-form parser itself lists when it meets a line it
 * does not know (its LW101 hint), carry the guard operators of the reference, and show an
 * example that reads without a problem. The New template reads cleanly too.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { analyse } from '../../src/core/pipeline.js';
import { notationCard, inline } from '../../src/web/notation.js';
import { NEW_MACHINE } from '../../src/web/examples.js';

const REFERENCE = readFileSync(fileURLToPath(new URL('../../docs/notation.md', import.meta.url)), 'utf8');
const codeOf = (runs: readonly { code: boolean; text: string }[]): string =>
  runs
    .filter((r) => r.code)
    .map((r) => r.text)
    .join(' ');

describe('src/web/notation', () => {
  const card = notationCard(REFERENCE);

  it('lists every statement keyword the parser knows, from the parser’s own words', () => {
    const a = analyse('machine m\nbogus line\n', 'k.lw');
    const hint = a.diagnostics.find((d) => d.code === 'LW101')?.hint ?? '';
    const keywords = (/one of: ([a-z, -]+)/.exec(hint)?.[1].split(',') ?? []).map((k) => k.trim()).filter(Boolean);
    expect(keywords.length).toBeGreaterThanOrEqual(8);
    const written = card.statements.map((r) => codeOf(r.write)).join(' ');
    for (const k of [...keywords, 'with', 'code']) expect(written.split(/[\s/[\]]+/), k).toContain(k);
    expect(codeOf(card.intro)).toContain('#');
  });

  it('carries the guard operators, the naming rules and an example that reads cleanly', () => {
    const ops = card.guards.map((r) => codeOf(r.write));
    for (const op of ['!marble', 'a & b', 'a ^ b', 'a | b']) expect(ops).toContain(op);
    expect(codeOf(card.guardNote)).toContain('a | b & !c ^ d');
    expect(card.names.length).toBeGreaterThanOrEqual(3);
    const a = analyse(card.example, 'example.lw');
    expect(a.diagnostics.filter((d) => d.severity !== 'info')).toEqual([]);
    expect(a.ok).toBe(true);
  });

  it('reads inline code and escapes as the reference writes them', () => {
    expect(inline('`a \\| b` or **not** \\*')).toEqual([
      { code: true, text: 'a | b' },
      { code: false, text: ' or not *' },
    ]);
  });

  it('gives New a template that reads cleanly and explains itself in comments', () => {
    const a = analyse(NEW_MACHINE, 'new.lw');
    expect(a.diagnostics.filter((d) => d.severity !== 'info')).toEqual([]);
    expect(a.ok).toBe(true);
    expect(NEW_MACHINE.split('\n').filter((l) => l.includes('#')).length).toBeGreaterThanOrEqual(5);
  });
});
