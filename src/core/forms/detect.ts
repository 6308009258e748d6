/**
 * Read a machine from text in any of the accepted forms, told apart by content: a JSON object
 * with `initial` and a `states` object is an xstate configuration; any other JSON object is
 * our JSON form; anything else is our text form.
 */
import type { Diagnostic } from '../model/diagnostics.js';
import type { Machine } from '../model/machine.js';
import { locateJsonPaths, readJsonText, withoutBom } from './json-file.js';
import { machineFromJson, parseJsonMachine } from './json.js';
import { parseTextMachine } from './text.js';
import { importXstate } from './xstate.js';

export type MachineForm = 'text' | 'json' | 'xstate';

export interface ReadResult {
  readonly form: MachineForm;
  readonly machine?: Machine;
  readonly diagnostics: readonly Diagnostic[];
}

/** Which form a source text is written in. */
export function detectForm(text: string): MachineForm {
  const t = text.trimStart();
  if (!t.startsWith('{')) return 'text';
  try {
    const v: unknown = JSON.parse(t);
    if (isXstateShape(v)) return 'xstate';
  } catch {
    // not valid JSON: the JSON parser reports where
  }
  return 'json';
}

function isXstateShape(v: unknown): boolean {
  if (typeof v !== 'object' || v === null || Array.isArray(v)) return false;
  const o = v as Record<string, unknown>;
  return 'initial' in o && typeof o.states === 'object' && o.states !== null && !Array.isArray(o.states);
}

/**
 * Parse a machine from source text in whichever form it is written. A byte order mark is
 * skipped; diagnostics of the JSON forms carry the line and column of the path they name.
 */
export function readMachine(text: string, file?: string): ReadResult {
  const src = withoutBom(text);
  const form = detectForm(src);
  if (form === 'text') return { form, ...parseTextMachine(src, file) };
  if (form === 'json') return { form, ...parseJsonMachine(src, file) };
  const read = readJsonText(src, file);
  if (!read.ok) return { form, diagnostics: read.diagnostics };
  const r = importXstate(read.value, file);
  return { form, ...r, diagnostics: locateJsonPaths(src, r.diagnostics, file) };
}

/** Parse an already decoded JSON value (JSON form or xstate configuration). */
export function readMachineValue(value: unknown, file?: string): ReadResult {
  if (isXstateShape(value)) return { form: 'xstate', ...importXstate(value, file) };
  return { form: 'json', ...machineFromJson(value, file) };
}
