/**
 * Build documents for download, made in the worker from the checked build.
 */
import type { Built } from '../../core/pipeline.js';
import { buildSheetHtml } from '../../core/export/build-sheet-html.js';
import { buildSheetMd } from '../../core/export/build-sheet-md.js';
import { netlistJson } from '../../core/export/netlist-json.js';
import { wiringCsv, wiringRows } from '../../core/export/wiring.js';
import { billOfMaterials, bomCsv } from '../../core/physics/bom.js';
import { DOCUMENTS, fileName } from './documents.js';
import type { ExportFile } from './protocol.js';

const MAKERS: Readonly<Record<string, (b: Built) => string>> = {
  'sheet-html': (b) => buildSheetHtml(b),
  'sheet-md': (b) => buildSheetMd(b),
  'wiring-csv': (b) => wiringCsv(wiringRows(b.build.netlist, b.profile)),
  'bom-csv': (b) => bomCsv(billOfMaterials(b.build.netlist, b.profile)),
  'netlist-json': (b) => netlistJson(b.build),
};

/** One document of a checked build. */
export function exportFile(b: Built, id: string): ExportFile {
  const doc = DOCUMENTS.find((d) => d.id === id);
  const make = MAKERS[id];
  if (!doc || !make) throw new Error(`no document called '${id}'`);
  return { name: fileName(b.build.machine.name, doc), mime: doc.mime, text: make(b) };
}
