/**
 * Build documents for download, made in the worker from the checked build by the core's
 * documents registry; each document is made on its first request, and the pieces several
 * documents share (the commissioning run, the Verilog pair) once per build.
 */
import {
  DOCUMENT_MAKERS,
  documentByFile,
  documentSources,
  type Built,
  type DocumentSources,
} from '../../core/index.js';
import { fileName } from './documents.js';
import type { ExportFile } from './protocol.js';

const sources = new WeakMap<Built, DocumentSources>();
const made = new WeakMap<Built, Map<string, string>>();

/** One document of a checked build. */
export function exportFile(b: Built, file: string): ExportFile {
  const doc = documentByFile(file);
  if (!doc) throw new Error(`no document called '${file}'`);
  let docs = made.get(b);
  if (!docs) made.set(b, (docs = new Map<string, string>()));
  let text = docs.get(doc.file);
  if (text === undefined) {
    let s = sources.get(b);
    if (!s) sources.set(b, (s = documentSources(b)));
    docs.set(doc.file, (text = DOCUMENT_MAKERS[doc.name](s)));
  }
  return { name: fileName(b.build.machine.name, doc.file), mime: doc.mime, text };
}
