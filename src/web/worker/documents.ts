/**
 * The build documents the page offers, in the order of the export buttons: every file of
 * the core's buildDocuments (src/core/export/index.ts), with a label and a media type.
 */
import type { DocumentFile } from '../../core/export/index.js';

export interface DocumentKind {
  readonly file: DocumentFile;
  /** Button text. */
  readonly label: string;
  readonly mime: string;
}

export const DOCUMENTS: readonly DocumentKind[] = [
  { file: 'build-sheet.html', label: 'Build sheet (HTML, printable)', mime: 'text/html' },
  { file: 'build-sheet.md', label: 'Build sheet (Markdown)', mime: 'text/markdown' },
  { file: 'wiring.csv', label: 'Wiring list (CSV)', mime: 'text/csv' },
  { file: 'bom.csv', label: 'Bill of materials (CSV)', mime: 'text/csv' },
  { file: 'netlist.json', label: 'Netlist (JSON)', mime: 'application/json' },
  { file: 'schematic.svg', label: 'Schematic (SVG)', mime: 'image/svg+xml' },
  { file: 'state-diagram.svg', label: 'State diagram (SVG)', mime: 'image/svg+xml' },
  { file: 'commissioning.html', label: 'Commissioning sheet (HTML)', mime: 'text/html' },
  { file: 'commissioning.csv', label: 'Commissioning sheet (CSV)', mime: 'text/csv' },
  { file: 'machine.v', label: 'Verilog module', mime: 'text/plain' },
  { file: 'machine_tb.v', label: 'Verilog testbench', mime: 'text/plain' },
];

/** A download name: the machine's name made safe for a file system, a dash, and the document's file name. */
export function fileName(machine: string, file: string): string {
  const safe = machine.replace(/[^A-Za-z0-9_.-]+/g, '_').replace(/^[._-]+/, '') || 'machine';
  return `${safe}-${file}`;
}
