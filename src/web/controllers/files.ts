/**
 * Files in and out of the bench: reading a machine file in any accepted form (JSON and
 * xstate configurations become the text form, which the bench edits), writing the machine
 * in each form, and handing a text to the browser as a download.
 */
import {
  exportXstate,
  formatDiagnostic,
  hasErrors,
  machineToJson,
  printTextMachine,
  readMachine,
} from '../../core/index.js';

/** What opening a file gives: text for the bench, or the reasons it could not be read. */
export type Opened =
  | { readonly ok: true; readonly text: string; readonly file: string; readonly note?: string }
  | { readonly ok: false; readonly problems: readonly string[] };

const FORM_WORDS = { json: 'the JSON form', xstate: 'an xstate configuration' } as const;

/** Read a file's text: the text form as it is, JSON and xstate converted to the text form. */
export function openedText(text: string, file: string): Opened {
  const r = readMachine(text, file);
  if (r.form === 'text') return { ok: true, text, file };
  if (!r.machine || hasErrors(r.diagnostics))
    return { ok: false, problems: r.diagnostics.filter((d) => d.severity === 'error').map(formatDiagnostic) };
  const lw = file.replace(/\.[A-Za-z0-9]+$/, '') + '.lw';
  return {
    ok: true,
    text: printTextMachine(r.machine),
    file: lw,
    note: `Read ${file} (${FORM_WORDS[r.form]}); the bench holds it in the text form.`,
  };
}

export type SaveForm = 'text' | 'json' | 'xstate';

/** The machine in a form for saving, or the problems that stop it (JSON and xstate need a machine that reads). */
export function savedText(
  text: string,
  file: string,
  form: SaveForm,
): { name: string; mime: string; text: string } | { problems: string[] } {
  const base = file.replace(/\.[A-Za-z0-9]+$/, '') || 'machine';
  if (form === 'text') return { name: `${base}.lw`, mime: 'text/plain', text };
  const r = readMachine(text, file);
  if (!r.machine || hasErrors(r.diagnostics))
    return { problems: ['The machine has problems; fix them on the bench before saving in another form.'] };
  const machine = r.machine;
  if (form === 'json')
    return {
      name: `${base}.json`,
      mime: 'application/json',
      text: JSON.stringify(machineToJson(machine), null, 2) + '\n',
    };
  const x = exportXstate(machine);
  return { name: `${base}.xstate.json`, mime: 'application/json', text: JSON.stringify(x.config, null, 2) + '\n' };
}

/** Hand a text (or bytes) to the browser as a file download. */
export function download(name: string, mime: string, content: string | Uint8Array): void {
  const blob =
    typeof content === 'string'
      ? new Blob([content], { type: `${mime};charset=utf-8` })
      : new Blob([content as Uint8Array<ArrayBuffer>], { type: mime });
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  a.rel = 'noopener';
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}
