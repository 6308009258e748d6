import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { csvParseRows } from 'd3';
import { csvField, recordsToCsv, toCsv } from '../../../src/core/export/csv.js';

describe('core/export/csv', () => {
  // RFC 4180 (Y. Shafranovich, IETF, 2005), section 2 examples.
  it('ends every record in CRLF (RFC 4180 §2.1–2.2)', () => {
    expect(
      toCsv([
        ['aaa', 'bbb', 'ccc'],
        ['zzz', 'yyy', 'xxx'],
      ]),
    ).toBe('aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n');
  });

  it('quotes fields holding CRLF, comma or quote and doubles the quote (RFC 4180 §2.6–2.7)', () => {
    expect(
      toCsv([
        ['aaa', 'b\r\nbb', 'ccc'],
        ['zzz', 'yyy', 'xxx'],
      ]),
    ).toBe('aaa,"b\r\nbb",ccc\r\nzzz,yyy,xxx\r\n');
    expect(toCsv([['aaa', 'b"bb', 'ccc']])).toBe('aaa,"b""bb",ccc\r\n');
    expect(csvField('a,b')).toBe('"a,b"');
    expect(csvField('line\nbreak')).toBe('"line\nbreak"');
    expect(csvField('plain text')).toBe('plain text');
  });

  // OWASP "CSV Injection" page: prefix cells starting with = + - @ tab or CR with a single quote.
  it('escapes text cells that a spreadsheet would run as a formula (OWASP CSV Injection)', () => {
    expect(csvField('=SUM(A1:A9)')).toBe("'=SUM(A1:A9)");
    expect(csvField('+1')).toBe("'+1");
    expect(csvField('-1')).toBe("'-1");
    expect(csvField('@cmd')).toBe("'@cmd");
    expect(csvField('\tx')).toBe("'\tx");
    expect(csvField('\rx')).toBe(`"'\rx"`);
    expect(csvField('=HYPERLINK("x","y")')).toBe(`"'=HYPERLINK(""x"",""y"")"`);
    expect(csvField('a=b')).toBe('a=b');
  });

  it('writes numbers given as numbers unescaped, negative ones included, and other values as text', () => {
    expect(csvField(-3)).toBe('-3');
    expect(csvField(0.5)).toBe('0.5');
    expect(csvField(Number.NaN)).toBe('NaN');
    expect(csvField(Number.NEGATIVE_INFINITY)).toBe("'-Infinity");
    expect(csvField(true)).toBe('true');
    expect(csvField(null)).toBe('');
    expect(csvField(undefined)).toBe('');
  });

  it('writes records under a header in column order', () => {
    const csv = recordsToCsv<{ a: string; b: number }>(
      ['b', 'a'],
      [
        { a: 'x', b: 1 },
        { a: '=y', b: -2 },
      ],
    );
    expect(csv).toBe("b,a\r\n1,x\r\n-2,'=y\r\n");
  });

  it('parses back to the same cells with d3-dsv, the escape quote aside (property)', () => {
    const cell = fc.string({
      unit: fc.constantFrom('a', 'Z', '1', ' ', ',', '"', '\r', '\n', '=', '+', '-', '@', '\t', "'", 'é'),
      maxLength: 8,
    });
    fc.assert(
      fc.property(fc.array(fc.array(cell, { minLength: 2, maxLength: 5 }), { minLength: 1, maxLength: 6 }), (rows) => {
        const back = csvParseRows(toCsv(rows));
        const expected = rows.map((r) => r.map((c) => (/^[=+\-@\t\r]/.test(c) ? `'${c}` : c)));
        return JSON.stringify(back) === JSON.stringify(expected);
      }),
      { seed: 42, numRuns: 300 },
    );
  });
});
