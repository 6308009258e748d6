/**
 * The command line as a user types it: a command, a machine file of the campaign, and options
 * drawn from those `latchwright --help` lists with good and bad values (unknown encodings,
 * seeds that are not whole numbers, pins past the end of the drum, unknown options, edited
 * profiles and input sequences). Files live in memory (the CLI's io is injectable); `--out`
 * is never given, so nothing is written. A fault of the tool (LW900), an exit status other
 * than 0, 1 or 2, or an exception out of `main` is a finding.
 */
import { main } from '../../src/cli/main.js';
import { editJson } from './fuzz.js';
import { textForm } from './generate.js';
import type { Rng } from './random.js';
import type { SpecJson } from './reference.js';

const COMMANDS = ['check', 'build', 'compare', 'step', 'step'];

function option(r: Rng, m: SpecJson): string[] {
  const state = r.pick(m.states).name;
  const choices: (() => string[])[] = [
    () => ['--encoding', r.pick(['binary', 'gray', 'johnson', 'one-hot', 'pinned', 'auto', 'AUTO', 'bin', ''])],
    () => ['--seed', r.pick(['1', '7', '0', '-1', '1.5', 'abc', '99999999999999999999', '4294967296', ''])],
    () => ['--unused', r.pick(['dont-care', state, `${state}x`, 'start', '', '__proto__', 'constructor'])],
    () => [
      '--pin',
      r.pick([
        'rst=2',
        'm0=5@2',
        'q0=1',
        'm0=',
        '=3',
        'm0=1@0',
        'm0=1,q0=1',
        'q1=999',
        'm0=0',
        'm0=2@1',
        'x=1.5',
        'm0=1,m0=2',
      ]),
    ],
    () => ['--json'],
    () => ['--abstract'],
    () => ['--inputs', r.pick(['seq.json', 'bad-seq.json', 'none.json'])],
    () => ['--profile', r.pick(['profile.json', 'bad-profile.json', 'none.json', 'm.lw'])],
    () => [r.pick(['--frobnicate', '-x', '--', '--force', '--json=1', '--seed=3'])],
  ];
  return r.pick(choices)();
}

export interface CliOutcome {
  readonly argv: readonly string[];
  readonly status?: number;
  readonly problem?: string;
}

function sequence(r: Rng, m: SpecJson): unknown[] {
  return Array.from({ length: r.int(0, 6) }, () =>
    Object.fromEntries(m.inputs.filter(() => r.chance(0.5)).map((n) => [n, r.pick([0, 1, 1])])),
  );
}

/** Run one random command line on machine m; what went wrong, if anything. */
export async function cliRun(r: Rng, m: SpecJson): Promise<CliOutcome> {
  const files: Record<string, string> = {
    'm.lw': textForm(r, m),
    'm.json': JSON.stringify(m),
    'seq.json': JSON.stringify(sequence(r, m)),
    'bad-seq.json': JSON.stringify(editJson(r, [...sequence(r, m), { [m.inputs[0]]: 1 }])),
    'profile.json': JSON.stringify({ mu: r.pick([0.2, 0.25, 0.3]), wraps: r.pick([1, 2, 3]) }),
    'bad-profile.json': JSON.stringify(
      editJson(r, { mu: 0.25, wraps: 2, portWeightG: 15, frame: { drumsPerFrame: 2 } }),
    ),
  };
  const argv = [r.pick(COMMANDS), r.pick(['m.lw', 'm.json', 'm.lw', 'none.lw'])];
  for (let k = r.int(0, 4); k > 0; k--) argv.push(...option(r, m));
  let text = '';
  const io = {
    out: (s: string) => void (text += s),
    err: (s: string) => void (text += s),
    readText: (path: string) =>
      Object.prototype.hasOwnProperty.call(files, path) ? { text: files[path] } : { error: `no such file: ${path}` },
    interactive: false,
  };
  try {
    const status = await main(argv, io);
    if (/LW900/.test(text)) return { argv, status, problem: text.slice(0, 1500) };
    if (status !== 0 && status !== 1 && status !== 2) return { argv, status, problem: `exit status ${status}` };
    if (status === 2 && !/LW\d{3}/.test(text))
      return { argv, status, problem: `status 2 without a code: ${text.slice(0, 400)}` };
    return { argv, status };
  } catch (e) {
    return { argv, problem: e instanceof Error ? (e.stack ?? e.message) : String(e) };
  }
}
