/**
 * `latchwright write BEHAVIOUR --FIELD VALUE …`: the machine of a behaviour ("every third
 * marble rings the bell") in the text form on standard output, or its JSON form with --json,
 * ready for `check`, `build` or `step`. The behaviours and their fields are the core's
 * behaviours registry; each field is an option of the same name.
 */
import {
  BEHAVIOURS,
  behaviourNamed,
  diag,
  didYouMean,
  machineToJson,
  parseTextMachine,
  writeBehaviour,
  type Diagnostic,
  type Field,
} from '../../core/index.js';
import type { FlagSpec, ParsedArgs } from '../args.js';
import { EXIT } from '../exit.js';
import type { RunContext } from './common.js';

/** Every field of every behaviour is an option of `write` (a behaviour rejects the ones it does not take). */
export const WRITE_SPEC: FlagSpec = {
  values: [...new Set(BEHAVIOURS.flatMap((b) => b.fields.map((f) => f.key)))],
  switches: ['json', 'help'],
};

/** The usage of `write`: each behaviour, its summary and its options, from the registry. */
export function writeUsage(): string {
  const lines = [
    'latchwright write BEHAVIOUR [--OPTION VALUE …] [--json]',
    '  Write the machine of a behaviour in the text form (the JSON form with --json).',
    '',
  ];
  const valueOf = (f: Field): string =>
    f.choices
      ? f.choices.map((c) => c.value).join('|')
      : f.kind === 'count'
        ? 'N'
        : f.kind === 'names'
          ? 'A,B,…'
          : f.kind === 'steps'
            ? 'A+B,C,0,…'
            : 'NAME';
  for (const b of BEHAVIOURS) {
    lines.push(`  ${b.name}: ${b.summary}`);
    const opts = b.fields.map((f) => `--${f.key} ${valueOf(f)}`);
    const width = Math.max(...opts.map((o) => o.length));
    b.fields.forEach((f, i) => lines.push(`      ${opts[i].padEnd(width)}  ${f.help}`));
  }
  lines.push(
    '',
    'Example:',
    '  latchwright write sequence --inputs red,green,blue --order red,green,red --output flap > lock.lw',
  );
  return lines.join('\n');
}

export function runWrite(args: ParsedArgs, ctx: RunContext): number {
  if (args.flags.help) {
    ctx.io.out(writeUsage() + '\n');
    return EXIT.ok;
  }
  const problem = commandLineProblem(args);
  if (problem) {
    ctx.fail([problem]);
    return EXIT.badInput;
  }
  const name = args.positional[0];
  const values = Object.fromEntries(
    Object.entries(args.flags).flatMap(([k, v]) => (typeof v === 'string' ? [[k, v] as const] : [])),
  );
  const written = writeBehaviour(name, values);
  if (!written.ok) {
    ctx.fail(written.diagnostics);
    return EXIT.badInput;
  }
  if (!ctx.json) {
    ctx.io.out(written.text);
    return EXIT.ok;
  }
  const read = parseTextMachine(written.text);
  if (!read.machine)
    throw new Error(
      `the written ${name} machine does not read back: ${read.diagnostics.map((d) => d.message).join('; ')}`,
    );
  ctx.io.out(JSON.stringify(machineToJson(read.machine), null, 2) + '\n');
  return EXIT.ok;
}

/** A command line `write` cannot use: no behaviour, more than one, or an option the behaviour does not take. */
function commandLineProblem(args: ParsedArgs): Diagnostic | undefined {
  const names = BEHAVIOURS.map((b) => b.name).join(', ');
  if (args.positional.length === 0)
    return diag(
      'LW700',
      'no behaviour given',
      { path: 'BEHAVIOUR' },
      `usage: latchwright write BEHAVIOUR …; behaviours: ${names}`,
    );
  if (args.positional.length > 1)
    return diag(
      'LW700',
      `one behaviour at a time (got ${args.positional.join(', ')})`,
      { path: args.positional[1] },
      'give lists with commas and no spaces (--order red,green,red), or in quotes',
    );
  const entry = behaviourNamed(args.positional[0]);
  if (!entry) return undefined; // writeBehaviour reports it (LW804)
  const takes = entry.fields.map((f) => f.key);
  const stray = Object.keys(args.flags).find((k) => k !== 'json' && !takes.includes(k));
  if (stray === undefined) return undefined;
  const guess = didYouMean(stray, takes);
  return diag(
    'LW700',
    `the behaviour ${entry.name} takes no --${stray}`,
    { path: `--${stray}` },
    `${guess ? `did you mean --${guess}? ` : ''}${entry.name} takes ${takes.map((k) => `--${k}`).join(', ')}`,
  );
}
