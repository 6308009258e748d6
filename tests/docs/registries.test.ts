/**
 * The docs that list the entries of a registry are generated from it, between markers, the
 * way docs/notation.md's table of codes is: the encodings table of docs/methods/encode.md
 * from the encodings registry (src/core/phases/encode/registry.ts) and the documents table of
 * docs/build-documents.md from the documents registry (src/core/export/documents.ts).
 *
 * After adding or changing an entry, regenerate the tables with:
 *   LW_UPDATE_DOCS=1 npx vitest run tests/docs/registries.test.ts
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { DOCUMENT_REGISTRY, ENCODING_REGISTRY } from '../../src/core/index.js';

/** A Markdown table cell: a `|` inside it escaped, so the row keeps its columns. */
const cell = (s: string): string => s.replace(/\|/g, '\\|');

function encodingTable(): string {
  const rows = ENCODING_REGISTRY.map(
    (e) => `| \`${e.name}\` | ${cell(e.label)} | ${cell(e.bits)} | ${cell(e.codes)} |`,
  );
  return ['| Name | Shown as | Bits for n states | Codes |', '|---|---|---|---|', ...rows].join('\n');
}

function documentTable(): string {
  const rows = DOCUMENT_REGISTRY.map((d) => `| \`${d.file}\` | ${cell(d.summary)} | ${cell(d.format)} |`);
  return ['| file | what it is | format |', '| --- | --- | --- |', ...rows].join('\n');
}

const TABLES = [
  { doc: 'docs/methods/encode.md', marker: 'encodings', table: encodingTable },
  { doc: 'docs/build-documents.md', marker: 'documents', table: documentTable },
] as const;

describe('docs/registries', () => {
  for (const { doc, marker, table } of TABLES) {
    it(`${doc} carries exactly the ${marker} table generated from its registry`, () => {
      const markers = new RegExp(`(<!-- ${marker}:start -->\\n)([\\s\\S]*?)(\\n<!-- ${marker}:end -->)`);
      if (process.env.LW_UPDATE_DOCS === '1') {
        const text = readFileSync(doc, 'utf8');
        writeFileSync(doc, text.replace(markers, (_all, a: string, _old: string, b: string) => a + table() + b));
      }
      const m = markers.exec(readFileSync(doc, 'utf8'));
      expect(m, `${doc} has no <!-- ${marker}:start --> … <!-- ${marker}:end --> markers`).not.toBeNull();
      expect(m![2], 'regenerate with LW_UPDATE_DOCS=1 (see the comment at the top)').toBe(table());
    });
  }

  it('the tables list every entry once, in registry order', () => {
    expect(encodingTable().split('\n').slice(2)).toHaveLength(ENCODING_REGISTRY.length);
    expect(encodingTable()).toContain('| `one-hot` | one latch per state | n | a single 1; the start state has it in bit 0 |');
    expect(documentTable().split('\n').slice(2)).toHaveLength(DOCUMENT_REGISTRY.length);
    expect(documentTable()).toContain('| `bom.csv` | bill of materials | CSV (RFC 4180) |');
  });

  it('the guide names every document of the registry in its table of the build folder', () => {
    const guide = readFileSync('docs/guide.md', 'utf8');
    const section = guide.slice(guide.indexOf('## 8. Print the workshop documents'));
    const table = section.slice(section.indexOf('| file |'), section.indexOf('\n\n', section.indexOf('| file |')));
    for (const d of DOCUMENT_REGISTRY) expect(table, d.file).toContain(`\`${d.file}\``);
  });
});
