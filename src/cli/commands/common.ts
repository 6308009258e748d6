/** Pieces the commands share. */
import { type Analysed, diag, type Diagnostic, formatDiagnostic, machineBlock } from '../../core/index.js';
import type { ParsedArgs } from '../args.js';
import type { CliIo } from '../io.js';

/**
 * Report a failure that stops a command: `{ ok: false, diagnostics }` on standard output with
 * --json (so a script always gets JSON), else one line per diagnostic on standard error (notes
 * left out: they are many and mild).
 */
export function reportFailure(ds: readonly Diagnostic[], io: CliIo, json: boolean): void {
  if (json) io.out(JSON.stringify({ ok: false, diagnostics: ds }, null, 2) + '\n');
  else for (const d of ds) if (d.severity !== 'info') io.err(formatDiagnostic(d) + '\n');
}

export type Source =
  | { readonly ok: true; readonly file: string; readonly text: string }
  | { readonly ok: false; readonly diagnostics: readonly Diagnostic[] };

/** The machine file named on the command line, read as text, or the diagnostics of why not. */
export function loadSource(args: ParsedArgs, io: CliIo): Source {
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
  return readFileArg(file, io);
}

/** A file named on the command line, or LW705 saying why it cannot be read. */
export function readFileArg(file: string, io: CliIo): Source {
  const r = io.readText(file);
  if ('error' in r)
    return { ok: false, diagnostics: [diag('LW705', r.error, { file }, 'check the path; name a file, not a folder')] };
  return { ok: true, file, text: r.text };
}

/** The `machine` and `merged` blocks that `check --json` and `build --json` share. */
export function machineSummary(a: Analysed) {
  return { machine: machineBlock(a), merged: a.minimised.merged, method: a.minimised.method, exact: a.minimised.exact };
}
