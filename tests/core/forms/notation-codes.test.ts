import { readFileSync, writeFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { diagnosticTable } from '../../../src/core/forms/notation-codes.js';
import { DIAGNOSTIC_CODES } from '../../../src/core/model/diagnostics.js';

describe('core/forms/notation-codes', () => {
  it('lists every code once, in table order, with its severity', () => {
    const lines = diagnosticTable().split('\n');
    expect(lines[0]).toBe('| code | severity | cause | fix |');
    const codes = lines.slice(2).map((l) => l.split(' | ')[0].slice(2));
    expect(codes).toEqual(Object.keys(DIAGNOSTIC_CODES));
    expect(lines).toContain(
      '| LW303 | warning | A state cannot be reached from the start state. | Add a transition into it, or remove it; it is dropped from the build. |',
    );
    // A '|' inside a cell is escaped so the table keeps four columns.
    expect(lines.find((l) => l.startsWith('| LW102 '))).toContain('!, &, ^, \\|, parentheses');
  });

  // After adding a code, regenerate the table with:
  //   LW_UPDATE_DOCS=1 npx vitest run tests/core/forms/notation-codes.test.ts
  it('docs/notation.md carries exactly the generated table between its markers', () => {
    const markers = /(<!-- codes:start -->\n)([\s\S]*?)(\n<!-- codes:end -->)/;
    if (process.env.LW_UPDATE_DOCS === '1') {
      const doc = readFileSync('docs/notation.md', 'utf8');
      writeFileSync(
        'docs/notation.md',
        doc.replace(markers, (_all, a: string, _old: string, b: string) => a + diagnosticTable() + b),
      );
    }
    const m = markers.exec(readFileSync('docs/notation.md', 'utf8'));
    expect(m).not.toBeNull();
    expect(m![2], 'regenerate with LW_UPDATE_DOCS=1 (see the comment above)').toBe(diagnosticTable());
  });
});
