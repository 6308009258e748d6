/**
 * Escaping for every export format. Names come from the user (machine, state, input and
 * output names, the description), so anything may be in them: quotes, `<`, `&`, formula
 * characters, line breaks. Every document builds its text through these functions.
 *
 * - HTML and SVG text and attributes: the five predefined XML entities (W3C, *Extensible
 *   Markup Language (XML) 1.0*, 5th ed., §4.6), which HTML also knows; control characters
 *   other than tab and line feed are dropped (XML 1.0 §2.2 does not allow them).
 * - Markdown table cells: backslash escapes of ASCII punctuation (CommonMark 0.31, §2.4),
 *   applied to the characters that would start markup or end a cell (`|`), and line breaks
 *   turned into spaces (a table row is one line). Control characters (C0 but tab, DEL, C1:
 *   ESC and CSI would drive a terminal showing the file) and bidirectional formatting
 *   characters are spelt out as `\u{1b}`, as in diagnostics (model/printable.ts); CommonMark
 *   itself passes them through (§2.3 only replaces NUL).
 * - Verilog identifiers: a safe mangling to simple identifiers (IEEE 1364-2005 §3.7.1:
 *   letters, digits, `_` and `$`, not starting with a digit or `$`), made unique per module
 *   and kept off the keyword list; comments and strings are sanitised the same way.
 * - CSV: see csv.ts. JSON: JSON.stringify.
 */

const XML_ENTITIES: Readonly<Record<string, string>> = {
  '&': '&amp;',
  '<': '&lt;',
  '>': '&gt;',
  '"': '&quot;',
  "'": '&#39;',
};

/** Text or attribute value for HTML, SVG or XML. */
export function escapeXml(text: string): string {
  return (
    text
      // Characters XML 1.0 does not allow (C0 controls other than tab and line ends, U+FFFE, U+FFFF).
      // eslint-disable-next-line no-control-regex -- matching control characters is the point
      .replace(/[\u0000-\u0008\u000b\u000c\u000e-\u001f\ufffe\uffff]/g, '')
      .replace(/[&<>"']/g, (c) => XML_ENTITIES[c])
  );
}

/** The same escaping, under the name HTML readers look for. */
export const escapeHtml = escapeXml;

const MD_CONTROLS =
  // eslint-disable-next-line no-control-regex -- matching control characters is the point
  /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069]/g;

/** Control and bidirectional formatting characters spelt out (`\u{1b}`); line breaks and tabs stay. */
export function spellControls(text: string): string {
  return text.replace(MD_CONTROLS, (c) => `\\u{${c.charCodeAt(0).toString(16)}}`);
}

/** One Markdown table cell (or inline text): markup characters escaped, on one line. */
export function escapeMd(text: string): string {
  return (
    spellControls(text)
      .replace(/\r\n|\r|\n|\u2028|\u2029/g, ' ')
      .replace(/[\\`*[\]<>|&#~]/g, (c) => `\\${c}`)
      // An underscore inside a word never starts emphasis (CommonMark §6.2), so `got_green` stays as it is.
      .replace(/(?<![A-Za-z0-9])_|_(?![A-Za-z0-9])/g, '\\_')
  );
}

/** Keywords of IEEE 1364-2005 (Annex B) an identifier must not collide with. */
const VERILOG_KEYWORDS = new Set(
  (
    'always and assign automatic begin buf bufif0 bufif1 case casex casez cell cmos config deassign default defparam design ' +
    'disable edge else end endcase endconfig endfunction endgenerate endmodule endprimitive endspecify endtable endtask event ' +
    'for force forever fork function generate genvar highz0 highz1 if ifnone incdir include initial inout input instance ' +
    'integer join large liblist library localparam macromodule medium module nand negedge nmos nor noshowcancelled not ' +
    'notif0 notif1 or output parameter pmos posedge primitive pull0 pull1 pulldown pullup pulsestyle_onevent ' +
    'pulsestyle_ondetect rcmos real realtime reg release repeat rnmos rpmos rtran rtranif0 rtranif1 scalared showcancelled ' +
    'signed small specify specparam strong0 strong1 supply0 supply1 table task time tran tranif0 tranif1 tri tri0 tri1 ' +
    'triand trior trireg unsigned use uwire vectored wait wand weak0 weak1 while wire wor xnor xor'
  ).split(' '),
);

/**
 * Mangles names into unique Verilog identifiers: every character outside [A-Za-z0-9_] becomes
 * `_` (runs collapse), a leading digit or an empty result gets the prefix, and a collision
 * (or a keyword) gets `_2`, `_3`, … The same name always maps to the same identifier.
 */
export class VerilogNames {
  private readonly byName = new Map<string, string>();
  private readonly taken = new Set<string>();

  /** The identifier for `name` in namespace `prefix` (e.g. 'in_', 'g_'). */
  get(prefix: string, name: string): string {
    const key = `${prefix}\u0000${name}`;
    const known = this.byName.get(key);
    if (known !== undefined) return known;
    const base = prefix + name.replace(/[^A-Za-z0-9_]+/g, '_').replace(/^_+|_+$/g, '');
    let id = /^[A-Za-z_]/.test(base) && base !== prefix ? base : `n_${base}`;
    if (VERILOG_KEYWORDS.has(id) || this.taken.has(id)) {
      let k = 2;
      while (this.taken.has(`${id}_${k}`)) k++;
      id = `${id}_${k}`;
    }
    this.taken.add(id);
    this.byName.set(key, id);
    return id;
  }

  /** Every mapping made so far, in the order made: [prefix, name, identifier]. */
  entries(): [string, string, string][] {
    return [...this.byName].map(([k, v]) => {
      const [prefix, name] = k.split('\u0000');
      return [prefix, name, v];
    });
  }
}

/** Spellings of the non-ASCII signs our part names use, for ASCII-only targets. */
const ASCII_SPELLING: Readonly<Record<string, string>> = {
  φ: 'phi',
  '→': '->',
  '\u0304': 'bar',
  '·': '*',
  '≥': '>=',
  '≤': '<=',
  '×': 'x',
  '…': '...',
  '—': '-',
  '–': '-',
};

/** Text safe inside a Verilog `//` comment: printable ASCII on one line. */
export function verilogComment(text: string): string {
  return (
    text
      .replace(/[\r\n]+/g, ' ')
      // The combining macron (the bar of Q̄) is matched on its own, so that it never reads as part of
      // a combined character with the class member before it.
      .replace(/\u0304|[φ→·≥≤×…—–]/g, (c) => ASCII_SPELLING[c])
      .replace(/[^\x20-\x7e]/g, '?')
  );
}

/** Text safe inside a Verilog string literal: printable ASCII, `"` and `\` escaped, `%` doubled. */
export function verilogString(text: string): string {
  return verilogComment(text)
    .replace(/[\\"]/g, (c) => `\\${c}`)
    .replace(/%/g, '%%');
}
