/**
 * The build documents: everything `latchwright build --out DIR` writes, as file name → text.
 * Pure functions of the build, its checks and the technology profile; the CLI writes the
 * files (src/cli/write-out.ts). docs/build-documents.md describes each one.
 *
 * Preconditions: a Build from the pipeline (netlist invariants of model/netlist.ts hold) and
 * the checks it ran (any missing check is reported as not run, never guessed).
 * Postconditions: the same input gives byte-identical files; every user-given name is
 * escaped for each format (escape.ts, csv.ts, JSON.stringify).
 */
import { billOfMaterials } from '../physics/bom.js';
import { bomCsv } from './bom-csv.js';
import { buildSheetHtml } from './build-sheet-html.js';
import { buildSheetMd } from './build-sheet-md.js';
import type { DocumentsInput } from './build-sheet.js';
import { commissioningCsv, commissioningRows } from './commissioning.js';
import { commissioningHtml } from './commissioning-html.js';
import { diagramSvg } from './diagram-svg.js';
import { netlistJson } from './netlist-json.js';
import { schematicSvg } from './schematic-svg.js';
import { commissioningTour } from './tour.js';
import { verilogFiles } from './verilog.js';
import { wiringCsv, wiringRows } from './wiring.js';

export type { DocumentsInput } from './build-sheet.js';
export { CAUTIONS, buildSheet } from './build-sheet.js';
export { buildSheetHtml, renderDocHtml } from './build-sheet-html.js';
export { buildSheetMd, renderDocMd } from './build-sheet-md.js';
export { commissioningCsv, commissioningRows, type CommissioningRow } from './commissioning.js';
export { commissioningHtml } from './commissioning-html.js';
export { diagramLayout, diagramSvg } from './diagram-svg.js';
export { netlistDocument, netlistJson, NETLIST_FORMAT, NETLIST_VERSION } from './netlist-json.js';
export { schematicLayout, schematicSvg, type SchematicLayout } from './schematic-svg.js';
export { commissioningTour, reachableTransitions, type TourClock, type TourOptions } from './tour.js';
export { verilogFiles, type VerilogFiles } from './verilog.js';
export { wiringCsv, wiringRows, type WiringRow } from './wiring.js';

/** The file names, in the order they are listed. */
export const DOCUMENT_FILES = [
  'build-sheet.html',
  'build-sheet.md',
  'wiring.csv',
  'bom.csv',
  'netlist.json',
  'schematic.svg',
  'state-diagram.svg',
  'commissioning.html',
  'commissioning.csv',
  'machine.v',
  'machine_tb.v',
] as const;

export type DocumentFile = (typeof DOCUMENT_FILES)[number];

/** Every build document: file name → content. */
export function buildDocuments(input: DocumentsInput): Map<DocumentFile, string> {
  const { build, profile } = input;
  const tour = input.tour ?? commissioningTour(build.machine);
  const steps = commissioningRows(build, profile, tour);
  const verilog = verilogFiles(build, profile, tour);
  const files: [DocumentFile, string][] = [
    ['build-sheet.html', buildSheetHtml(input)],
    ['build-sheet.md', buildSheetMd(input)],
    ['wiring.csv', wiringCsv(wiringRows(build.netlist, profile))],
    ['bom.csv', bomCsv(billOfMaterials(build.netlist, profile))],
    ['netlist.json', netlistJson(build)],
    ['schematic.svg', schematicSvg(build)],
    ['state-diagram.svg', diagramSvg(build)],
    ['commissioning.html', commissioningHtml(build, steps, tour)],
    ['commissioning.csv', commissioningCsv(steps)],
    ['machine.v', verilog.module],
    ['machine_tb.v', verilog.testbench],
  ];
  return new Map(files);
}
