/**
 * CSV writer for the wiring list and the bill of materials.
 *
 * Format: RFC 4180 (Y. Shafranovich, "Common Format and MIME Type for Comma-Separated Values
 * (CSV) Files", IETF, 2005): records end in CRLF; a field holding a comma, a double quote, CR
 * or LF is enclosed in double quotes, and a double quote inside it is doubled.
 * Formula injection (OWASP, "CSV Injection" community page): a spreadsheet runs a cell that
 * starts with `=`, `+`, `-` or `@` (and some treat a leading tab or CR the same way) as a
 * formula, so such a text cell gets a leading single quote, which the spreadsheet shows as
 * text. Our choice for numbers: a cell given as a JavaScript number is data we computed, never
 * user text, and is written as the plain number — a negative number stays `-3`, so the
 * spreadsheet can still sum it. Text that merely looks like a number ("-3") is escaped, since
 * its content came from someone's input. A non-finite number is written as text.
 */

/** A value of one cell: text, a number, a boolean, or empty (null/undefined). */
export type CsvCell = string | number | boolean | null | undefined;

const FORMULA_START = /^[=+\-@\t\r]/;
const NEEDS_QUOTES = /[",\r\n]/;

/** One cell as it appears in the file. */
export function csvField(value: CsvCell): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number' && Number.isFinite(value)) return String(value);
  let text = String(value);
  if (FORMULA_START.test(text)) text = `'${text}`;
  return NEEDS_QUOTES.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** Rows of cells to CSV text, each record ending in CRLF (RFC 4180 §2.1). */
export function toCsv(rows: Iterable<readonly CsvCell[]>): string {
  let out = '';
  for (const row of rows) out += row.map(csvField).join(',') + '\r\n';
  return out;
}

/** Records to CSV with a header line: `columns` gives the order and the header names. */
export function recordsToCsv<T>(columns: readonly (keyof T & string)[], records: Iterable<T>): string {
  const rows: CsvCell[][] = [columns.slice()];
  for (const r of records) rows.push(columns.map((c) => r[c] as CsvCell));
  return toCsv(rows);
}
