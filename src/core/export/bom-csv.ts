/**
 * The bill of materials as CSV (`bom.csv`). The rows come from physics/bom.ts; this module
 * only writes them, through csv.ts (RFC 4180 with formula-injection escaping), so the physics
 * layer never depends on a file format.
 *
 * Units: the rows are SI (grams, metres). Where the profile's `documentUnits` is `inch`, the
 * amounts a workshop buys or weighs are written in its units (model/units.ts): masses in ounces
 * to 0.1 oz, cord in feet rounded up to 0.1 ft (bought, never short), a drum's length in inches
 * rounded up to the sixteenth (cut, never short). Counts, turns and pieces are the same in both;
 * the notes keep the words physics/bom.ts gives them (their sizes already in the profile's units).
 */
import type { BomRow } from '../physics/bom.js';
import { INCHES_PER_FOOT, inchesOf, ouncesTenth, sixteenthsUp, type DocumentUnits } from '../model/units.js';
import { recordsToCsv } from './csv.js';

const COLUMNS = ['item', 'kind', 'count', 'each', 'unit', 'total', 'note'] as const satisfies readonly (keyof BomRow)[];

/** Feet in `m` metres, rounded up to 0.1 ft. */
const feetUp = (m: number): number => Math.ceil((inchesOf(m) / INCHES_PER_FOOT) * 10 - 1e-6) / 10;
/** Inches in `m` metres, rounded up to the sixteenth. */
const inchesUp = (m: number): number => sixteenthsUp(m) / 16;

/** How an SI unit of the rows is written in inch units: the unit's new name and the conversion. */
const INCH_UNITS: Readonly<Record<string, { readonly unit: string; readonly of: (x: number) => number }>> = {
  g: { unit: 'oz', of: ouncesTenth },
  'g load': { unit: 'oz load', of: ouncesTenth },
  m: { unit: 'ft', of: feetUp },
  'm length': { unit: 'in length', of: inchesUp },
};

/** A row in the chosen units (the row itself in metric, or where its unit is a count). */
export function bomRowIn(row: BomRow, units: DocumentUnits): BomRow {
  const to = units === 'inch' && Object.hasOwn(INCH_UNITS, row.unit) ? INCH_UNITS[row.unit] : undefined;
  return to ? { ...row, unit: to.unit, each: to.of(row.each), total: to.of(row.total) } : row;
}

/** The bill of materials as CSV with a header line, one record per row, in the rows' order. */
export function bomCsv(rows: readonly BomRow[], units: DocumentUnits = 'metric'): string {
  return recordsToCsv<BomRow>(
    [...COLUMNS],
    rows.map((r) => bomRowIn(r, units)),
  );
}
