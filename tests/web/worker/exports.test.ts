import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { analyse, buildMachine } from '../../../src/core/pipeline.js';
import { buildDocuments, DOCUMENT_FILES } from '../../../src/core/export/index.js';
import { exportFile } from '../../../src/web/worker/exports.js';
import { DOCUMENTS, fileName } from '../../../src/web/worker/documents.js';

const LOCK = readFileSync(fileURLToPath(new URL('../../../examples/sequence-lock.lw', import.meta.url)), 'utf8');

describe('src/web/worker/exports', () => {
  it('offers every build document, each exactly as the core makes it', () => {
    expect(DOCUMENTS.map((d) => d.file)).toEqual([...DOCUMENT_FILES]);
    const a = analyse(LOCK, 'lock.lw');
    if (!a.ok) throw new Error('must read');
    const b = buildMachine(a, { encoding: 'binary' });
    if (!b.ok) throw new Error('must build');
    const docs = buildDocuments(b);
    for (const d of DOCUMENTS) {
      const f = exportFile(b, d.file);
      expect(f.text).toBe(docs.get(d.file));
      expect(f.name).toBe(`sequence_lock-${d.file}`);
    }
    expect(() => exportFile(b, 'nothing.txt')).toThrow(/no document/);
  });

  it('makes download names safe for any file system', () => {
    expect(fileName('a/b\\c:d', 'bom.csv')).toBe('a_b_c_d-bom.csv');
    expect(fileName('..', 'x.v')).toBe('machine-x.v');
    expect(fileName('Glocke_ä', 'x.v')).toBe('Glocke__-x.v');
  });
});
