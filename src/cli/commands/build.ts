/** `latchwright build FILE`: synthesise, check, and report (or write the build documents). */
import {
  buildReport,
  type Built,
  counted,
  coverageBlock,
  coverageLine,
  type Diagnostic,
  equationTexts,
  summaryIn,
  withoutCapstanWords,
} from '../../core/index.js';
import type { ParsedArgs } from '../args.js';
import { buildFromArgs } from './build-common.js';
import { EXIT } from '../exit.js';
import type { RunContext } from './common.js';
import { sawAnswer, sawText } from './build-saw.js';
import { sourcesOf, writeDocuments } from './out.js';

export async function runBuild(args: ParsedArgs, ctx: RunContext): Promise<number> {
  const r = await buildFromArgs(args, ctx);
  if (!r.ok) {
    ctx.fail(r.diagnostics);
    return EXIT.badInput;
  }
  const b = r.built;
  const ok = b.checks.every((c) => c.ok);
  const notes: Diagnostic[] = [];
  const sources = sourcesOf(b);
  if (typeof args.flags.out === 'string') {
    const w = writeDocuments(sources, args.flags.out, args.flags.force === true);
    if (!w.ok) {
      ctx.fail([...r.diagnostics, w.diagnostic]);
      return EXIT.badInput;
    }
    notes.push(...w.notes);
    if (!ctx.json) ctx.io.out(`wrote ${w.files.length} files to ${args.flags.out}: ${w.files.join(', ')}\n`);
  }
  const sights = args.lists.saw ?? [];
  const saw = sights.length > 0 ? sawAnswer(sights, sources) : undefined;
  if (saw && 'code' in saw) {
    ctx.fail([...r.diagnostics, saw]);
    return EXIT.badInput;
  }
  ctx.show([...r.diagnostics, ...notes]);
  if (ctx.json) {
    const report = buildReport(b, coverageBlock(sources.faults()));
    const doc = { ...report, ...(saw ? { saw } : {}), diagnostics: ctx.present([...r.diagnostics, ...notes]) };
    ctx.io.out(JSON.stringify(doc, null, 2) + '\n');
  } else {
    ctx.io.out(textReport(b, coverageLine(sources.faults())));
    if (saw) ctx.io.out(sawText(saw));
  }
  return ok ? EXIT.ok : EXIT.checkFailed;
}

/** The terminal report: short, in the workshop's words; `coverage` is the commissioning sheet's line. */
export function textReport(b: Built, coverage?: string): string {
  const f = b.build.machine;
  const m = b.analysed.machine;
  const p = b.build.parts;
  const lines: string[] = [];
  lines.push(
    `${m.name}: ${counted(m.states.length, 'state')} → ${f.states.length} after minimisation; ${counted(m.inputs.length, 'input')}, ${counted(m.outputs.length, 'output')}`,
  );
  lines.push(
    `encoding ${b.build.encoding.strategy}, ${b.build.encoding.bits} state bits: ${f.states.map((s, i) => `${s}=${b.build.encoding.codes[i] || '—'}`).join(' ')}`,
  );
  const idle = withoutCapstanWords(b.build.netlist);
  lines.push(
    `parts: ${counted(p.latches, 'latch', 'latches')}, ${counted(p.gates, 'gate')}, ${counted(p.levers, 'lever')}, ${counted(p.capstans, 'capstan')}, ${counted(p.weights, 'weight')}, ${counted(p.cords, 'cord')}${idle ? ` (${idle})` : ''}`,
  );
  const g = b.build.guard;
  lines.push(
    p.latches === 0
      ? 'forbidden-input guard: none needed (no latches)'
      : `forbidden-input guard (${g.method}): ${g.ok ? 'S·R = 0 proven for every latch' : 'NOT proven'}; cost ${counted(g.extraGates, 'gate')}, ${counted(g.extraCords, 'cord')} over an unguarded build`,
  );
  lines.push('equations:');
  for (const e of equationTexts(b)) lines.push(`  ${e.name} = ${e.expr}`);
  lines.push('checks:');
  for (const c of b.checks)
    lines.push(`  ${c.ok ? 'ok  ' : 'FAIL'} ${c.name}: ${summaryIn(c, b.profile.documentUnits)}`);
  if (coverage !== undefined) lines.push(coverage);
  lines.push(
    'Safety: turning drums, hanging weights and levers can hurt people; see the build sheet (--out) for the cautions.',
  );
  return lines.join('\n') + '\n';
}
