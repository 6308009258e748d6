import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { analyse, buildMachine } from '../../../src/core/pipeline.js';
import { buildDocuments, DOCUMENT_REGISTRY } from '../../../src/core/export/index.js';
import { exportFile } from '../../../src/web/worker/exports.js';
import { fileName } from '../../../src/web/worker/documents.js';

const LOCK = readFileSync(fileURLToPath(new URL('../../../examples/sequence-lock.lw', import.meta.url)), 'utf8');

describe('src/web/worker/exports', () => {
  it('offers every document of the registry, each exactly as the core makes it, with its media type', () => {
    const a = analyse(LOCK, 'lock.lw');
    if (!a.ok) throw new Error('must read');
    const b = buildMachine(a, { encoding: 'binary' });
    if (!b.ok) throw new Error('must build');
    const docs = buildDocuments(b);
    for (const d of DOCUMENT_REGISTRY) {
      const f = exportFile(b, d.file);
      expect(f.text).toBe(docs.get(d.file));
      expect(f.name).toBe(`sequence_lock-${d.file}`);
      expect(f.mime).toBe(d.mime);
    }
    // A second request gives the same text (made once per build and kept).
    expect(exportFile(b, 'machine.v').text).toBe(docs.get('machine.v'));
    expect(() => exportFile(b, 'nothing.txt')).toThrow(/no document/);
  });

  it('makes download names safe for any file system', () => {
    expect(fileName('a/b\\c:d', 'bom.csv')).toBe('a_b_c_d-bom.csv');
    expect(fileName('..', 'x.v')).toBe('machine-x.v');
    expect(fileName('Glocke_ä', 'x.v')).toBe('Glocke__-x.v');
  });
});
