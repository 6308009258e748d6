/** `latchwright compare FILE`: every encoding side by side, the cheapest marked. */
import { analyse, compareEncodings } from '../../core/pipeline.js';
import type { ParsedArgs } from '../args.js';
import type { CliIo } from '../io.js';
import { profileFrom, seedFrom } from './build-common.js';
import { EXIT_BAD_INPUT, EXIT_OK, loadSource, reportFailure } from './common.js';

/** The command, promise-returning like every command; its work is synchronous. */
export function runCompare(args: ParsedArgs, io: CliIo): Promise<number> {
  return Promise.resolve(compareCommand(args, io));
}

function compareCommand(args: ParsedArgs, io: CliIo): number {
  const json = args.flags.json === true;
  const src = loadSource(args, io);
  if (!src.ok) {
    reportFailure(src.diagnostics, io, json);
    return EXIT_BAD_INPUT;
  }
  const prof = profileFrom(args, io);
  if ('error' in prof) {
    reportFailure(prof.error, io, json);
    return EXIT_BAD_INPUT;
  }
  const seed = seedFrom(args);
  if (typeof seed === 'object') {
    reportFailure([seed], io, json);
    return EXIT_BAD_INPUT;
  }
  const a = analyse(src.text, src.file);
  if (!a.ok) {
    reportFailure(a.diagnostics, io, json);
    return EXIT_BAD_INPUT;
  }
  const rows = compareEncodings(a, { profile: prof.profile, seed });
  if (json) {
    // Codes by state name, as `build --json` gives them.
    const states = a.minimised.machine.states;
    const named = rows.map((r) =>
      r.encoding
        ? {
            ...r,
            encoding: { ...r.encoding, codes: Object.fromEntries(states.map((s, i) => [s, r.encoding?.codes[i]])) },
          }
        : r,
    );
    io.out(JSON.stringify({ machine: a.machine.name, encodings: named }, null, 2) + '\n');
    return EXIT_OK;
  }
  const head = [
    'encoding',
    'bits',
    'latches',
    'term gates',
    'gates',
    'levers',
    'capstans',
    'weights',
    'cords',
    'cost',
    '',
  ];
  const table = rows.map((r) =>
    r.ok && r.parts && r.encoding
      ? [
          r.strategy,
          String(r.encoding.bits),
          String(r.parts.latches),
          String(r.termGates),
          String(r.parts.gates),
          String(r.parts.levers),
          String(r.parts.capstans),
          String(r.parts.weights),
          String(r.parts.cords),
          String(r.cost),
          r.cheapest ? '← cheapest' : '',
        ]
      : [r.strategy, '—', '', '', '', '', '', '', '', '', r.diagnostics[0]?.message ?? 'does not fit'],
  );
  const widths = head.map((h, i) => Math.max(h.length, ...table.map((row) => row[i].length)));
  const line = (cells: string[]): string =>
    cells
      .map((c, i) => (i === 0 || i === cells.length - 1 ? c.padEnd(widths[i]) : c.padStart(widths[i])))
      .join('  ')
      .trimEnd();
  const n = a.minimised.machine.states.length;
  io.out(`${a.machine.name}: ${n} ${n === 1 ? 'state' : 'states'} after minimisation\n`);
  io.out(line(head) + '\n');
  for (const row of table) io.out(line(row) + '\n');
  return EXIT_OK;
}
