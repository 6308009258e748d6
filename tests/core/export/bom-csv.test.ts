import { describe, expect, it } from 'vitest';
import { csvParse, csvParseRows } from 'd3';
import { bomCsv } from '../../../src/core/export/bom-csv.js';
import { billOfMaterials, type BomRow } from '../../../src/core/physics/bom.js';
import { example } from './support.js';

describe('core/export/bom-csv', () => {
  const b = example('marble-bell.lw');
  const rows = billOfMaterials(b.build.netlist, b.profile);

  it('writes a header and one record per row that parse back to the rows (RFC 4180, read by d3-dsv)', () => {
    const text = bomCsv(rows);
    expect(text.endsWith('\r\n')).toBe(true);
    expect(csvParseRows(text)[0]).toEqual(['item', 'kind', 'count', 'each', 'unit', 'total', 'note']);
    const back = csvParse(text);
    expect(back).toHaveLength(rows.length);
    back.forEach((r, i) => {
      const row: BomRow = rows[i];
      expect(r).toEqual({
        item: row.item,
        kind: row.kind,
        count: String(row.count),
        each: String(row.each),
        unit: row.unit,
        total: String(row.total),
        note: row.note,
      });
    });
  });

  it('escapes a text cell that a spreadsheet would run as a formula (OWASP, "CSV Injection")', () => {
    const evil: BomRow = { item: '=1+1', kind: 'actuator', count: 1, each: 2, unit: 'g', total: 2, note: '@x' };
    expect(csvParseRows(bomCsv([evil]))[1]).toEqual(["'=1+1", 'actuator', '1', '2', 'g', '2', "'@x"]);
  });
});
