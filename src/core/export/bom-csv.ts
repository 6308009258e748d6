/**
 * The bill of materials as CSV (`bom.csv`). The rows come from physics/bom.ts; this module
 * only writes them, through csv.ts (RFC 4180 with formula-injection escaping), so the physics
 * layer never depends on a file format.
 */
import type { BomRow } from '../physics/bom.js';
import { recordsToCsv } from './csv.js';

/** The bill of materials as CSV with a header line, one record per row, in the rows' order. */
export function bomCsv(rows: readonly BomRow[]): string {
  return recordsToCsv<BomRow>(['item', 'kind', 'count', 'each', 'unit', 'total', 'note'], rows);
}
