/**
 * The diagnostic-code table of the notation reference, generated from DIAGNOSTIC_CODES so the
 * documentation cannot drift from the codes the tool reports (a test compares it with
 * docs/notation.md).
 */
import { DIAGNOSTIC_CODES, type DiagnosticCode } from '../model/diagnostics.js';

/** Markdown table: code | severity | cause | fix, one row per code in table order. */
export function diagnosticTable(): string {
  const cell = (s: string): string => s.replace(/\|/g, '\\|');
  const rows = (Object.keys(DIAGNOSTIC_CODES) as DiagnosticCode[]).map((code) => {
    const c = DIAGNOSTIC_CODES[code];
    return `| ${code} | ${c.severity} | ${cell(c.cause)} | ${cell(c.fix)} |`;
  });
  return ['| code | severity | cause | fix |', '| --- | --- | --- | --- |', ...rows].join('\n');
}
