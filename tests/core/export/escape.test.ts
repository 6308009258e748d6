import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { escapeMd, escapeXml, verilogComment, VerilogNames, verilogString } from '../../../src/core/export/escape.js';
import { xmlProblems } from './support.js';

describe('core/export/escape', () => {
  // W3C XML 1.0 (5th ed.) §4.6: the five predefined entities.
  it('escapes the five XML special characters (XML 1.0 §4.6)', () => {
    expect(escapeXml(`a<b>&"c"'d'`)).toBe('a&lt;b&gt;&amp;&quot;c&quot;&#39;d&#39;');
    expect(escapeXml('&amp;')).toBe('&amp;amp;');
  });

  it('drops control characters XML 1.0 §2.2 does not allow, keeping tab and line feed', () => {
    expect(escapeXml('a\u0000b\u0007c\td\ne')).toBe('abc\td\ne');
  });

  it('makes any text safe as element content and as an attribute value', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'binary' }), (s) => {
        const e = escapeXml(s);
        expect(xmlProblems(`<r a="${e}">${e}</r>`)).toEqual([]);
      }),
      { seed: 42, numRuns: 300 },
    );
  });

  // CommonMark 0.31 §2.4 (backslash escapes) and §6.2 (intraword underscores are not emphasis).
  it('escapes Markdown markup and the table pipe, keeps a cell on one line (CommonMark §2.4)', () => {
    expect(escapeMd('a|b')).toBe('a\\|b');
    expect(escapeMd('*x* [y](z) <b> & `c` #h ~s')).toBe('\\*x\\* \\[y\\](z) \\<b\\> \\& \\`c\\` \\#h \\~s');
    expect(escapeMd('line\nbreak\r\nagain')).toBe('line break again');
    expect(escapeMd('back\\slash')).toBe('back\\\\slash');
    expect(escapeMd('got_green')).toBe('got_green');
    expect(escapeMd('_lead and trail_')).toBe('\\_lead and trail\\_');
  });

  // ECMA-48 §5.3 (ESC, CSI as C1) and Unicode Standard Annex #9 (bidirectional formatting): a
  // terminal showing the file must never receive them raw.
  it('spells out control and bidirectional characters in Markdown (the backslash itself escaped), keeping tab', () => {
    expect(escapeMd('bell\u0007 nul\u0000 esc\u001b[2J')).toBe('bell\\\\u{7} nul\\\\u{0} esc\\\\u{1b}\\[2J');
    expect(escapeMd('csi\u009b31m rlo\u202e')).toBe('csi\\\\u{9b}31m rlo\\\\u{202e}');
    expect(escapeMd('tab\tstays')).toBe('tab\tstays');
    fc.assert(
      fc.property(fc.string({ unit: 'binary' }), (s) => {
        // eslint-disable-next-line no-control-regex -- looking for control characters is the point
        expect(escapeMd(s)).not.toMatch(/[\u0000-\u0008\u000a-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/);
      }),
      { seed: 42, numRuns: 300 },
    );
  });

  it('never leaves an unescaped pipe in a cell', () => {
    fc.assert(
      fc.property(fc.string(), (s) => {
        const e = escapeMd(s);
        expect(/(^|[^\\])(\\\\)*\|/.test(e)).toBe(false);
        expect(e).not.toMatch(/[\r\n]/);
      }),
      { seed: 42, numRuns: 300 },
    );
  });

  // IEEE 1364-2005 §3.7.1: simple identifiers are letters, digits, _ and $, not starting with a digit or $.
  it('mangles names into unique, stable simple Verilog identifiers (IEEE 1364-2005 §3.7.1)', () => {
    const n = new VerilogNames();
    expect(n.get('g_', 't.S0.1')).toBe('g_t_S0_1');
    expect(n.get('g_', 't.S0.1')).toBe('g_t_S0_1');
    expect(n.get('g_', 't_S0_1')).toBe('g_t_S0_1_2');
    expect(n.get('', 'module')).toBe('module_2');
    expect(n.get('', '9lives')).toBe('n_9lives');
    expect(n.get('in_', '=cmd|"x"')).toBe('in_cmd_x');
    expect(n.get('', '"<&>"')).toBe('n_');
    expect(n.entries()).toContainEqual(['g_', 't.S0.1', 'g_t_S0_1']);
  });

  it('gives every name an identifier that is simple, not a keyword, and distinct', () => {
    fc.assert(
      fc.property(fc.uniqueArray(fc.string(), { maxLength: 30 }), (names) => {
        const n = new VerilogNames();
        const ids = names.map((s) => n.get('x_', s));
        expect(new Set(ids).size).toBe(names.length);
        for (const id of ids) expect(id).toMatch(/^[A-Za-z_][A-Za-z0-9_]*$/);
      }),
      { seed: 42, numRuns: 200 },
    );
  });

  it('keeps Verilog comments and strings on one printable ASCII line, spelling our signs out', () => {
    expect(verilogComment('term φ1 !q0 → S0\nnext')).toBe('term phi1 !q0 -> S0 next');
    expect(verilogComment('Q̄ side')).toBe('Qbar side');
    expect(verilogString('say "hi" \\ 100%')).toBe('say \\"hi\\" \\\\ 100%%');
  });
});
