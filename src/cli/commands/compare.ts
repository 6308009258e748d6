/** `latchwright compare FILE`: every encoding side by side, the cheapest marked. */
import { analyse, type Analysed, compareEncodings, type EncodingRow } from '../../core/index.js';
import type { ParsedArgs } from '../args.js';
import { profileFrom, seedFrom } from './build-common.js';
import { EXIT } from '../exit.js';
import { loadSource, type RunContext } from './common.js';

export function runCompare(args: ParsedArgs, ctx: RunContext): number {
  const src = loadSource(args, ctx);
  if (!src.ok) {
    ctx.fail(src.diagnostics);
    return EXIT.badInput;
  }
  const prof = profileFrom(args, ctx);
  if ('error' in prof) {
    ctx.fail(prof.error);
    return EXIT.badInput;
  }
  const seed = seedFrom(args);
  if (typeof seed === 'object') {
    ctx.fail([seed]);
    return EXIT.badInput;
  }
  const a = analyse(src.text, src.file);
  if (!a.ok) {
    ctx.fail(a.diagnostics);
    return EXIT.badInput;
  }
  const rows = compareEncodings(a, { profile: prof.profile, seed });
  if (ctx.json) printJson(ctx, a, rows);
  else {
    ctx.show([...prof.diagnostics, ...a.diagnostics]);
    printTable(ctx, a, rows);
  }
  return EXIT.ok;
}

/** The comparison as JSON, codes by state name as `build --json` gives them. */
function printJson(ctx: RunContext, a: Analysed, rows: readonly EncodingRow[]): void {
  const states = a.minimised.machine.states;
  const named = rows.map((r) =>
    r.encoding
      ? {
          ...r,
          encoding: { ...r.encoding, codes: Object.fromEntries(states.map((s, i) => [s, r.encoding?.codes[i]])) },
          diagnostics: ctx.present(r.diagnostics),
        }
      : { ...r, diagnostics: ctx.present(r.diagnostics) },
  );
  const doc = { machine: a.machine.name, encodings: named, diagnostics: ctx.present(a.diagnostics) };
  ctx.io.out(JSON.stringify(doc, null, 2) + '\n');
}

const HEAD = [
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

/** The comparison as a table, one line per encoding, the cheapest marked. */
function printTable(ctx: RunContext, a: Analysed, rows: readonly EncodingRow[]): void {
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
  const widths = HEAD.map((h, i) => table.reduce((w, row) => Math.max(w, row[i].length), h.length));
  const line = (cells: string[]): string =>
    cells
      .map((c, i) => (i === 0 || i === cells.length - 1 ? c.padEnd(widths[i]) : c.padStart(widths[i])))
      .join('  ')
      .trimEnd();
  const n = a.minimised.machine.states.length;
  ctx.io.out(`${a.machine.name}: ${n} ${n === 1 ? 'state' : 'states'} after minimisation\n`);
  ctx.io.out(line(HEAD) + '\n');
  for (const row of table) ctx.io.out(line(row) + '\n');
}
