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

describe('core/export/bom-csv', () => {
  it('writes weights in ounces, cord in feet rounded up and drums in inches rounded up where inches are chosen (NIST SP 811 B.8 factors)', () => {
    const b = example('crossing.lw');
    const rows = billOfMaterials(b.build.netlist, b.profile, b.placement);
    const back = csvParse(bomCsv(rows, 'inch'));
    expect(back).toHaveLength(rows.length);
    back.forEach((r, i) => {
      const row = rows[i];
      if (row.unit === 'g') {
        expect(r.unit).toBe('oz');
        // 1 oz = 28.349523125 g exactly (Handbook 44 appendix C), to 0.1 oz.
        expect(Math.abs(Number(r.each) - row.each / 28.349523125)).toBeLessThanOrEqual(0.05 + 1e-9);
      } else if (row.unit === 'm') {
        expect(r.unit).toBe('ft');
        // 1 ft = 0.3048 m exactly; bought by the tenth of a foot, never short.
        expect(Number(r.total) * 0.3048).toBeGreaterThanOrEqual(row.total - 1e-9);
        expect(Number(r.total) * 0.3048).toBeLessThan(row.total + 0.03048);
      } else if (row.unit === 'm length') {
        expect(r.unit).toBe('in length');
        expect(Number(r.each) * 0.0254).toBeGreaterThanOrEqual(row.each - 1e-9);
        expect(Number(r.each) * 0.0254).toBeLessThan(row.each + 0.0254 / 16);
      } else expect(r).toMatchObject({ unit: row.unit, each: String(row.each), total: String(row.total) });
    });
    expect(back.some((r) => r.unit === 'oz')).toBe(true);
    expect(back.some((r) => r.unit === 'ft')).toBe(true);
    // Metric is the rows as they are.
    expect(bomCsv(rows, 'metric')).toBe(bomCsv(rows));
  });
});
