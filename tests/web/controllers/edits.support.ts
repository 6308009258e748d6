/**
 * What the tests of the text edits share (the ledger's, table-edit.ts, and the sketch's,
 * sketch-edit.ts): the machine a text reads as, through the core's own parser, and an edit
 * applied, failing the test where there is none.
 */
import { parseTextMachine } from '../../../src/core/forms/text.js';
import type { Machine } from '../../../src/core/model/machine.js';
import { applyEdit, type TextEdit } from '../../../src/web/controllers/table-edit.js';

/** The machine `text` reads as; a text that does not read fails the test with its problems. */
export function read(text: string): Machine {
  const r = parseTextMachine(text);
  if (!r.machine) throw new Error(r.diagnostics.map((d) => d.message).join('; '));
  return r.machine;
}

/** `text` with the edit made; no edit fails the test. */
export function apply(text: string, e: TextEdit | undefined): string {
  if (!e) throw new Error('no edit');
  return applyEdit(text, e);
}
