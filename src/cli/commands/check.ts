/** `latchwright check FILE`: diagnostics, state counts and the merge map. */
import { analyse } from '../../core/pipeline.js';
import { formatDiagnostic } from '../../core/model/diagnostics.js';
import type { ParsedArgs } from '../args.js';
import type { CliIo } from '../io.js';
import { EXIT_BAD_INPUT, EXIT_OK, loadSource, machineSummary, reportFailure } from './common.js';

/** The command, promise-returning like every command; its work is synchronous. */
export function runCheck(args: ParsedArgs, io: CliIo): Promise<number> {
  return Promise.resolve(checkCommand(args, io));
}

function checkCommand(args: ParsedArgs, io: CliIo): number {
  const src = loadSource(args, io);
  if (!src.ok) {
    reportFailure(src.diagnostics, io, args.flags.json === true);
    return EXIT_BAD_INPUT;
  }
  const a = analyse(src.text, src.file);
  const summary = a.ok ? machineSummary(a) : undefined;
  if (args.flags.json) {
    io.out(
      JSON.stringify(
        { file: src.file, form: a.form, ok: a.ok, ...(summary ?? {}), diagnostics: a.diagnostics },
        null,
        2,
      ) + '\n',
    );
  } else {
    const notes = a.diagnostics.filter((d) => d.severity === 'info');
    for (const d of a.diagnostics) if (d.severity !== 'info') io.out(formatDiagnostic(d) + '\n');
    // Notes are many and mild (e.g. LW302 per state): one line each when few, else counted.
    if (notes.length <= 2) for (const d of notes) io.out(formatDiagnostic(d) + '\n');
    else io.out(`${notes.length} notes (${[...new Set(notes.map((d) => d.code))].join(', ')}); see them with --json\n`);
    if (summary) {
      const m = summary.machine;
      const n = (k: number, what: string): string => `${k} ${what}${k === 1 ? '' : 's'}`;
      io.out(
        `${m.name}: ${n(m.states, 'state')} (${m.reachable} reachable, ${m.minimized} after minimisation by ${summary.method}${summary.exact ? ', proven minimal' : ''}), ${n(m.inputs, 'input')}, ${n(m.outputs, 'output')}\n`,
      );
      const merges = Object.entries(summary.merged).filter(([k, v]) => k !== v);
      if (merges.length > 0) {
        io.out('merged states:\n');
        for (const [k, v] of merges) io.out(`  ${k} → ${v}\n`);
      }
    }
  }
  return a.ok ? EXIT_OK : EXIT_BAD_INPUT;
}
