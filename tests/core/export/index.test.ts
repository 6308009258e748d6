import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { csvParse, csvParseRows } from 'd3';
import { buildDocuments, CAUTIONS, DOCUMENT_FILES } from '../../../src/core/export/index.js';
import { EVIL, evilBuild, example, exampleNames, schemaProblems, xmlProblems, type Schema } from './support.js';

const schema = JSON.parse(
  readFileSync(new URL('../../../schemas/netlist.schema.json', import.meta.url), 'utf8'),
) as Schema;

/** Every document parses in its own format; returns the problems found. */
function parseProblems(files: ReadonlyMap<string, string>): string[] {
  const out: string[] = [];
  for (const [name, text] of files) {
    if (name.endsWith('.html') || name.endsWith('.svg')) out.push(...xmlProblems(text).map((p) => `${name}: ${p}`));
    if (name.endsWith('.csv')) {
      // RFC 4180, read back by d3-dsv: every record as wide as the header.
      const rows = csvParseRows(text);
      if (rows.length < 1 || rows.some((r) => r.length !== rows[0].length)) out.push(`${name}: ragged rows`);
      if (!text.endsWith('\r\n')) out.push(`${name}: no final CRLF`);
    }
    if (name.endsWith('.json')) out.push(...schemaProblems(schema, JSON.parse(text)).map((p) => `${name}: ${p}`));
    if (name.endsWith('.md') && !text.startsWith('# ')) out.push(`${name}: no title`);
    if (name.endsWith('.v') && !/endmodule\n$/.test(text)) out.push(`${name}: no endmodule`);
  }
  return out;
}

describe('core/export/index', () => {
  it('makes every document for every example, built as the CLI builds it, and each one parses', () => {
    for (const name of exampleNames()) {
      const docs = buildDocuments(example(name, 'auto'));
      expect([...docs.keys()], name).toEqual([...DOCUMENT_FILES]);
      for (const [file, text] of docs) expect(text.length, `${name} ${file}`).toBeGreaterThan(0);
      expect(parseProblems(docs), name).toEqual([]);
    }
  });

  it('is deterministic: the same build gives byte-identical documents', () => {
    const b = example('crossing.lw');
    expect([...buildDocuments(b)]).toEqual([...buildDocuments(b)]);
  });

  it('uses a given commissioning sequence in the sheet and the testbench', () => {
    const b = example('marble-bell.lw');
    const f = b.build.machine;
    const tour = [
      {
        reset: false,
        inputs: '1',
        state: f.start,
        row: f.rows[f.start].findIndex((r) => r.cube === '1'),
        next: f.rows[f.start].find((r) => r.cube === '1')?.next ?? 0,
      },
    ];
    const docs = buildDocuments({ ...b, tour });
    // The header, the cautions, the reset and the five hand actions of the one clock.
    expect(docs.get('commissioning.csv')?.trim().split('\r\n')).toHaveLength(1 + CAUTIONS.length + 1 + 5);
    expect(docs.get('machine_tb.v')).toContain('the commissioning sequence, 1 clocks.');
  });

  it('escapes names with quotes, <, & and formula characters in every format', () => {
    const docs = buildDocuments(evilBuild());
    expect(parseProblems(docs)).toEqual([]);
    const raw = [EVIL.machine, EVIL.input, EVIL.output, EVIL.state];
    for (const [file, text] of docs) {
      if (file.endsWith('.html') || file.endsWith('.svg')) {
        // Entity-escaped: the raw markup never appears, the escaped form does.
        for (const r of raw) expect(text, file).not.toContain(r);
        expect(text, file).not.toMatch(/<script|<b>/);
      }
      if (file.endsWith('.md')) {
        // Outside code spans (where `<` is literal, CommonMark §6.1) every `<` and `&` is backslash-escaped (§2.4).
        for (const line of text.split('\n')) expect(line.replace(/`[^`]*`/g, ''), file).not.toMatch(/(?<!\\)[<&]/);
      }
      if (file.endsWith('.json')) {
        const doc = JSON.parse(text) as {
          machine: { name: string; inputs: string[]; outputs: string[]; states: { name: string }[] };
        };
        expect(doc.machine.name).toBe(EVIL.machine);
        expect(doc.machine.inputs).toEqual([EVIL.input]);
        expect(doc.machine.outputs).toEqual([EVIL.output]);
        expect(doc.machine.states.map((s) => s.name)).toContain(EVIL.state);
      }
    }
    expect(docs.get('build-sheet.html')).toContain('&lt;b&gt;&amp;amp;&#39;');
    // CSV (csv.ts, OWASP CSV Injection): a cell starting with = or + gets a leading quote and reads back as text.
    const wiring = csvParse(docs.get('wiring.csv') ?? '');
    const names = wiring.map((r) => r['driver name']);
    expect(names).toContain(`'${EVIL.input}`);
    expect(names.some((n) => n?.startsWith('=') || n?.startsWith('+'))).toBe(false);
    const sheet = csvParse(docs.get('commissioning.csv') ?? '');
    expect(sheet.map((r) => r['state after'])).toContain(`'${EVIL.state}`);
    expect(sheet.columns).toContain(`${EVIL.output} (flag.${EVIL.output})`);
  });
});
