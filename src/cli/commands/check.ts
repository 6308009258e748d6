/** `latchwright check FILE`: diagnostics, state counts and the merge map. */
import { analyse, counted } from '../../core/index.js';
import type { ParsedArgs } from '../args.js';
import { EXIT } from '../exit.js';
import { loadSource, machineSummary, type RunContext } from './common.js';

export function runCheck(args: ParsedArgs, ctx: RunContext): number {
  const src = loadSource(args, ctx);
  if (!src.ok) {
    ctx.fail(src.diagnostics);
    return EXIT.badInput;
  }
  const a = analyse(src.text, src.file);
  const summary = a.ok ? machineSummary(a) : undefined;
  if (ctx.json) {
    const diagnostics = ctx.present(a.diagnostics);
    ctx.io.out(
      JSON.stringify({ file: src.file, form: a.form, ok: a.ok, ...(summary ?? {}), diagnostics }, null, 2) + '\n',
    );
    return a.ok ? EXIT.ok : EXIT.badInput;
  }
  // Notes are many and mild (e.g. LW302 per state): one line each when few, else counted.
  ctx.show(a.diagnostics, 2);
  if (summary) {
    const m = summary.machine;
    ctx.io.out(
      `${m.name}: ${counted(m.states, 'state')} (${m.reachable} reachable, ${m.minimized} after minimisation by ${summary.method}${summary.exact ? ', proven minimal' : ''}), ${counted(m.inputs, 'input')}, ${counted(m.outputs, 'output')}\n`,
    );
    const merges = Object.entries(summary.merged).filter(([k, v]) => k !== v);
    if (merges.length > 0) {
      ctx.io.out('merged states:\n');
      for (const [k, v] of merges) ctx.io.out(`  ${k} → ${v}\n`);
    }
  }
  return a.ok ? EXIT.ok : EXIT.badInput;
}
