/**
 * Echoed input made printable: the controls of ECMA-48 (C0, DEL, C1) and the bidirectional
 * formatting characters of Unicode Standard Annex #9 are spelt out; long pieces are shortened.
 */
import { describe, expect, it } from 'vitest';
import { printable, shorten } from '../../../src/core/model/printable.js';
import { diag, formatDiagnostic, formatLocation } from '../../../src/core/model/diagnostics.js';

describe('core/model/printable', () => {
  it('spells out C0, DEL, C1 and bidirectional controls, and keeps everything else', () => {
    expect(printable('a\u0000b')).toBe('a\\u{0}b');
    expect(printable('\u001b[2J\u001b]0;owned\u0007')).toBe('\\u{1b}[2J\\u{1b}]0;owned\\u{7}');
    expect(printable('tab\there\nnext\r')).toBe('tab\\there\\nnext\\r');
    expect(printable('\u007f\u009b31m')).toBe('\\u{7f}\\u{9b}31m');
    expect(printable('abc\u202edcba\u2066x\u2069')).toBe('abc\\u{202e}dcba\\u{2066}x\\u{2069}');
    expect(printable('état ⊕ φ1 — 😀')).toBe('état ⊕ φ1 — 😀');
  });

  it('shortens a long piece to its head and tail with the count left out', () => {
    const s = printable('x'.repeat(10_000_000) + 'END');
    expect(s.length).toBeLessThan(140);
    expect(s).toMatch(/^x+…\[\d+ characters\]…x*END$/);
    expect(shorten('short', 80)).toBe('short');
    // A character outside the BMP is never cut in two.
    const emoji = shorten('😀'.repeat(100), 41);
    expect(emoji).not.toMatch(/[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/);
  });

  it('makes every diagnostic printable: message, hint, file and path', () => {
    const d = diag('LW200', `unknown state '${'\u001b[2J'}x'`, { file: 'a\u001b.lw', path: '$.x' }, 'hint\u0007');
    expect(d.message).toBe("unknown state '\\u{1b}[2Jx'");
    expect(d.hint).toBe('hint\\u{7}');
    expect(d.location).toEqual({ file: 'a\\u{1b}.lw', path: '$.x' });
    expect(diag('LW200', 'y'.repeat(1_000_000), {}).message.length).toBeLessThan(700);
    // A diagnostic made elsewhere (a plain object) is made printable when formatted.
    const line = formatDiagnostic({ code: 'LW100', severity: 'error', message: 'bad\u001b[2J', location: {} });
    // eslint-disable-next-line no-control-regex -- looking for control characters is the point
    expect(line).not.toMatch(/[\u0000-\u001f]/);
  });

  it('formats a location as file:line:column, then the JSON path when there is one', () => {
    expect(formatLocation({ file: 'm.json', line: 3, column: 7, path: '$.states[0].to' })).toBe(
      'm.json:3:7 $.states[0].to',
    );
    expect(formatLocation({ file: 'm.lw', line: 3, column: 7 })).toBe('m.lw:3:7');
    expect(formatLocation({ file: 'm.json', path: '$.name' })).toBe('m.json $.name');
    expect(formatLocation({})).toBe('<input>');
  });
});
