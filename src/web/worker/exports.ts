/**
 * Build documents for download, made in the worker from the checked build by the core's
 * buildDocuments; made once per build, on the first request.
 */
import type { Built } from '../../core/pipeline.js';
import { buildDocuments, type DocumentFile } from '../../core/export/index.js';
import { DOCUMENTS, fileName } from './documents.js';
import type { ExportFile } from './protocol.js';

const made = new WeakMap<Built, Map<DocumentFile, string>>();

/** One document of a checked build. */
export function exportFile(b: Built, file: string): ExportFile {
  const doc = DOCUMENTS.find((d) => d.file === file);
  if (!doc) throw new Error(`no document called '${file}'`);
  let docs = made.get(b);
  if (!docs) made.set(b, (docs = buildDocuments(b)));
  const text = docs.get(doc.file);
  if (text === undefined) throw new Error(`the build documents have no '${file}'`);
  return { name: fileName(b.build.machine.name, doc.file), mime: doc.mime, text };
}
