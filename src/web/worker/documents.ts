/**
 * The build documents the page offers, in the order of the export buttons. The worker makes
 * them (exports.ts); the page only needs their names.
 */

export interface DocumentKind {
  readonly id: string;
  /** Button text. */
  readonly label: string;
  /** What it is for, for the button's description. */
  readonly about: string;
  readonly suffix: string;
  readonly mime: string;
}

export const DOCUMENTS: readonly DocumentKind[] = [
  { id: 'sheet-html', label: 'Build sheet (HTML)', about: 'printable build sheet with every figure and the cautions', suffix: '-build-sheet.html', mime: 'text/html' },
  { id: 'sheet-md', label: 'Build sheet (Markdown)', about: 'the build sheet as Markdown', suffix: '-build-sheet.md', mime: 'text/markdown' },
  { id: 'wiring-csv', label: 'Wiring list (CSV)', about: 'every cord branch, from driver to port', suffix: '-wiring.csv', mime: 'text/csv' },
  { id: 'bom-csv', label: 'Bill of materials (CSV)', about: 'parts, weights, capstans and cord', suffix: '-bom.csv', mime: 'text/csv' },
  { id: 'netlist-json', label: 'Netlist (JSON)', about: 'the part-level netlist, described by its JSON Schema', suffix: '-netlist.json', mime: 'application/json' },
];

/** A download name: the machine's name made safe for a file system, plus the document's suffix. */
export function fileName(machine: string, doc: Pick<DocumentKind, 'suffix'>): string {
  const safe = machine.replace(/[^A-Za-z0-9_.-]+/g, '_').replace(/^[._]+/, '') || 'machine';
  return safe + doc.suffix;
}
