/**
 * Pieces the commands share, and the one way diagnostics leave the tool.
 *
 * Where diagnostics go (the same in every command):
 * - without --json, one line each on standard error (notes, the mild remarks such as LW302,
 *   only from `check`: each when few, else counted), and the command's result (report,
 *   table, clocks) on standard output;
 * - with --json, nothing on standard error: one JSON document on standard output, the
 *   command's result with its diagnostics inside, or `{ ok: false, diagnostics }` when it
 *   stops.
 * Before they go, every diagnostic is made whole: it names a file (the machine's, when it came
 * from the build and carries no place of its own), a JSON path is given its line and column
 * in the file it names, and echoed input is made printable.
 */
import {
  type Analysed,
  diag,
  type Diagnostic,
  formatDiagnostic,
  locateJsonPaths,
  machineBlock,
  printableDiagnostic,
  readJsonText,
} from '../../core/index.js';
import type { ParsedArgs } from '../args.js';
import type { CliIo } from '../io.js';

/** One run of a command: how it reports, and the files it has read (for the places of diagnostics). */
export class RunContext {
  /** Texts of the files read, by the path as given. */
  private readonly texts = new Map<string, string>();
  /** The machine file, named by diagnostics of the build that carry no place. */
  machineFile: string | undefined;

  constructor(
    readonly io: CliIo,
    readonly json: boolean,
  ) {}

  /** Remember a file's text, so diagnostics that name its JSON paths get a line and column. */
  remember(file: string, text: string): void {
    this.texts.set(file, text);
  }

  /** Diagnostics as shown: a file for each, line and column for JSON paths, printable text. */
  present(ds: readonly Diagnostic[]): Diagnostic[] {
    let out = ds.map((d) => {
      const l = d.location;
      const placeless = l.file === undefined && l.path === undefined && l.line === undefined;
      return placeless && this.machineFile !== undefined ? { ...d, location: { file: this.machineFile } } : d;
    });
    for (const [file, text] of this.texts) {
      if (out.some((d) => d.location.file === file && d.location.path !== undefined && d.location.line === undefined))
        out = locateJsonPaths(text, out, file);
    }
    return out.map(printableDiagnostic);
  }

  /**
   * Warnings and errors as lines on standard error; nothing with --json (the JSON document
   * carries them). Notes (mild remarks such as LW302) only when `notesShown` is given: each
   * when there are at most that many, else their count.
   */
  show(ds: readonly Diagnostic[], notesShown?: number): void {
    if (this.json) return;
    const shown = this.present(ds);
    for (const d of shown) if (d.severity !== 'info') this.io.err(formatDiagnostic(d) + '\n');
    const notes = shown.filter((d) => d.severity === 'info');
    if (notesShown === undefined || notes.length === 0) return;
    if (notes.length <= notesShown) for (const d of notes) this.io.err(formatDiagnostic(d) + '\n');
    else {
      const codes = [...new Set(notes.map((d) => d.code))].join(', ');
      this.io.err(`${notes.length} ${notes.length === 1 ? 'note' : 'notes'} (${codes}); see them with --json\n`);
    }
  }

  /** Stop with these diagnostics: `{ ok: false, diagnostics }` on standard output with --json, else lines on standard error. */
  fail(ds: readonly Diagnostic[]): void {
    if (this.json) this.io.out(JSON.stringify({ ok: false, diagnostics: this.present(ds) }, null, 2) + '\n');
    else this.show(ds);
  }
}

export type Source =
  | { readonly ok: true; readonly file: string; readonly text: string }
  | { readonly ok: false; readonly diagnostics: readonly Diagnostic[] };

/** The machine file named on the command line, read as text, or the diagnostics of why not. */
export function loadSource(args: ParsedArgs, ctx: RunContext): Source {
  const file = args.positional[0];
  if (file === undefined) {
    return {
      ok: false,
      diagnostics: [
        diag('LW700', 'no machine file given', { path: 'FILE' }, `usage: latchwright ${args.command ?? 'check'} FILE`),
      ],
    };
  }
  if (args.positional.length > 1) {
    return {
      ok: false,
      diagnostics: [
        diag(
          'LW700',
          `one machine file at a time (got ${args.positional.length}: ${args.positional.join(', ')})`,
          { path: args.positional[1] },
          'name a single machine file; options start with --',
        ),
      ],
    };
  }
  const src = readFileArg(file, ctx);
  if (src.ok) ctx.machineFile = file;
  return src;
}

/** A file named on the command line, or LW705 saying why it cannot be read. */
export function readFileArg(file: string, ctx: RunContext): Source {
  const r = ctx.io.readText(file);
  if ('error' in r)
    return { ok: false, diagnostics: [diag('LW705', r.error, { file }, 'check the path; name a file, not a folder')] };
  ctx.remember(file, r.text);
  return { ok: true, file, text: r.text };
}

/** A JSON file named on the command line (`what`: "the profile", "the input sequence"), decoded, or why not. */
export function readJsonArg(
  file: string,
  ctx: RunContext,
  what: string,
):
  { readonly ok: true; readonly value: unknown } | { readonly ok: false; readonly diagnostics: readonly Diagnostic[] } {
  const src = readFileArg(file, ctx);
  if (!src.ok) return src;
  const read = readJsonText(src.text, file, what);
  return read.ok ? { ok: true, value: read.value } : read;
}

/** The `machine` and `merged` blocks that `check --json` and `build --json` share. */
export function machineSummary(a: Analysed) {
  return { machine: machineBlock(a), merged: a.minimised.merged, method: a.minimised.method, exact: a.minimised.exact };
}
