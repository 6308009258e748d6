import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { strFromU8, unzipSync } from 'fflate';
import { analyse, buildMachine } from '../../../src/core/pipeline.js';
import { buildDocuments, DOCUMENT_REGISTRY } from '../../../src/core/export/index.js';
import { documentsZip, exportFile, HAS_DRAWING, printSheet } from '../../../src/web/worker/exports.js';
import { fileName } from '../../../src/web/worker/documents.js';
import { ALL_DOCUMENTS, PRINT_SHEET, type ExportFile } from '../../../src/web/worker/protocol.js';

const LOCK = readFileSync(fileURLToPath(new URL('../../../examples/sequence-lock.lw', import.meta.url)), 'utf8');

function lock() {
  const a = analyse(LOCK, 'lock.lw');
  if (!a.ok) throw new Error('must read');
  const b = buildMachine(a, { encoding: 'binary' });
  if (!b.ok) throw new Error('must build');
  return b;
}

const textOf = (f: ExportFile): string => {
  if (!('text' in f)) throw new Error(`${f.name} is not text`);
  return f.text;
};

describe('src/web/worker/exports', () => {
  it('offers every document of the registry, each exactly as the core makes it, with its media type', () => {
    const b = lock();
    const docs = buildDocuments(b);
    for (const d of DOCUMENT_REGISTRY) {
      const f = exportFile(b, d.file);
      expect(textOf(f)).toBe(docs.get(d.file));
      expect(f.name).toBe(`sequence_lock-${d.file}`);
      expect(f.mime).toBe(d.mime);
    }
    // A second request gives the same text (made once per build and kept).
    expect(textOf(exportFile(b, 'machine.v'))).toBe(docs.get('machine.v'));
    expect(() => exportFile(b, 'nothing.txt')).toThrow(/no document/);
  });

  // The archive is read back with fflate's own unzip (the PKWARE .ZIP format, APPNOTE.TXT).
  it('puts every document of the registry in one zip archive, byte for byte', () => {
    const b = lock();
    const docs = buildDocuments(b);
    const f = exportFile(b, ALL_DOCUMENTS);
    expect(f.name).toBe('sequence_lock-documents.zip');
    expect(f.mime).toBe('application/zip');
    if (!('bytes' in f)) throw new Error('the archive is bytes');
    const files = unzipSync(f.bytes);
    expect(Object.keys(files)).toEqual(DOCUMENT_REGISTRY.map((d) => `sequence_lock-${d.file}`));
    for (const d of DOCUMENT_REGISTRY) expect(strFromU8(files[`sequence_lock-${d.file}`])).toBe(docs.get(d.file));
    expect(unzipSync(documentsZip(b))).toEqual(files);
  });

  it('prints the build sheet with its drawings: the state diagram and the schematic when the sheet has none', () => {
    const b = lock();
    const sheet = buildDocuments(b).get('build-sheet.html') ?? '';
    const printed = textOf(exportFile(b, PRINT_SHEET));
    expect(printed).toBe(printSheet(b));
    const drawings = new RegExp(HAS_DRAWING.source, 'g');
    expect(printed.match(drawings)?.length ?? 0).toBeGreaterThanOrEqual(2);
    if (HAS_DRAWING.test(sheet)) expect(printed).toBe(sheet);
    else {
      expect(printed).toContain('<section id="drawings">');
      expect(printed).not.toContain('<?xml');
      // Everything the sheet says is still there, in order, before the drawings.
      expect(printed.startsWith(sheet.slice(0, sheet.indexOf('</style>')))).toBe(true);
      expect(printed).toContain(sheet.slice(sheet.indexOf('<body>'), sheet.indexOf('</body>')));
    }
  });

  it('makes download names safe for any file system', () => {
    expect(fileName('a/b\\c:d', 'bom.csv')).toBe('a_b_c_d-bom.csv');
    expect(fileName('..', 'x.v')).toBe('machine-x.v');
    expect(fileName('Glocke_ä', 'x.v')).toBe('Glocke__-x.v');
  });
});
