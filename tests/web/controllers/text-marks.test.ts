import { describe, expect, it } from 'vitest';
import { lineStarts, markSpan, offsetOf } from '../../../src/web/controllers/text-marks.js';

describe('src/web/controllers/text-marks', () => {
  it('finds line starts under LF, CRLF and CR line breaks', () => {
    expect(lineStarts('ab\ncd\r\nef\rg')).toEqual([0, 3, 7, 10]);
    expect(lineStarts('')).toEqual([0]);
    expect(lineStarts('a\n')).toEqual([0, 2]);
  });

  it('turns a 1-based line and column into an offset, clamped to the line and the text', () => {
    const t = 'state one\r\n  go two\n';
    expect(t.slice(offsetOf(t, 2, 6))).toBe('two\n');
    expect(offsetOf(t, 2, 99)).toBe(t.indexOf('two') + 3);
    expect(offsetOf(t, 9, 1)).toBe(t.length);
    expect(offsetOf(t, 0, 0)).toBe(0);
  });

  it('marks the name at a column, or one character', () => {
    expect(markSpan('  when marble go tow', 18)).toEqual({ from: 17, to: 20 });
    expect(markSpan('never a & ', 11)).toEqual({ from: 10, to: 10 });
    expect(markSpan('x = (', 5)).toEqual({ from: 4, to: 5 });
  });
});
