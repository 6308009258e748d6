/**
 * Every kind of bad input gives a coded diagnostic with a location, and exit status 2 (or 0 for
 * warnings and notes), never a stack trace: the machine files of tests/fixtures/bad/ (text,
 * JSON and xstate forms), machines over the size limits (generated here), and bad command
 * lines, options, profiles, sequence files and output folders.
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { expectNoStack, run, runJson, removeTempDirs, tempDir, writeTemp, type Run } from './support.js';

interface Located {
  file?: string;
  line?: number;
  column?: number;
  path?: string;
}
interface Diag {
  code: string;
  severity: string;
  message: string;
  location: Located;
  hint?: string;
}

const BAD = 'tests/fixtures/bad';

/** `file:line:col`, then the JSON path when there is one, as the one-line form prints a location. */
function where(l: Located): string {
  if (l.line !== undefined) return `${l.file ?? '<input>'}:${l.line}:${l.column ?? 1}${l.path ? ` ${l.path}` : ''}`;
  return `${l.file ? l.file + ' ' : ''}${l.path ?? ''}`;
}

/** The diagnostics a JSON run printed (check's report, or `{ ok: false, diagnostics }`). */
function diagnosticsOf(r: Run): Diag[] {
  return (JSON.parse(r.out) as { diagnostics: Diag[] }).diagnostics;
}

interface FileCase {
  readonly file: string;
  readonly code: string;
  readonly severity: 'error' | 'warning' | 'info';
  readonly location: Omit<Located, 'file'>;
  readonly exit: 0 | 2;
  /** Words the line must carry (a did-you-mean). */
  readonly says?: string;
}

const FILES: readonly FileCase[] = [
  {
    file: 'unknown-state.lw',
    code: 'LW200',
    severity: 'error',
    location: { line: 14, column: 16 },
    exit: 2,
    says: "did you mean 'zero'?",
  },
  {
    file: 'unknown-state.json',
    code: 'LW200',
    severity: 'error',
    location: { path: '$.states[2].transitions[0].to', line: 9, column: 88 },
    exit: 2,
    says: "did you mean 'zero'?",
  },
  {
    file: 'xstate-unknown-target.json',
    code: 'LW200',
    severity: 'error',
    location: { path: '$.states.locked.on.coin', line: 5, column: 33 },
    exit: 2,
    says: "did you mean 'unlocked'?",
  },
  {
    file: 'unknown-input.lw',
    code: 'LW201',
    severity: 'error',
    location: { line: 8, column: 8 },
    exit: 2,
    says: "did you mean 'push'?",
  },
  {
    file: 'unknown-input.json',
    code: 'LW201',
    severity: 'error',
    location: { path: '$.states[0].transitions[0].when', line: 7, column: 49 },
    exit: 2,
    says: "did you mean 'push'?",
  },
  {
    file: 'unknown-output.lw',
    code: 'LW202',
    severity: 'error',
    location: { line: 10, column: 20 },
    exit: 2,
    says: "did you mean 'ding'?",
  },
  {
    file: 'unknown-output.json',
    code: 'LW202',
    severity: 'error',
    location: { path: '$.states[1].outputs.dong', line: 8, column: 47 },
    exit: 2,
    says: "did you mean 'ding'?",
  },
  {
    file: 'duplicate-state.lw',
    code: 'LW203',
    severity: 'error',
    location: { line: 13, column: 7 },
    exit: 2,
    says: "'dark' is declared twice",
  },
  {
    file: 'duplicate-input.json',
    code: 'LW203',
    severity: 'error',
    location: { path: '$.inputs[1]', line: 3, column: 22 },
    exit: 2,
    says: "'pull' is declared twice",
  },
  { file: 'missing-start.lw', code: 'LW204', severity: 'error', location: { line: 1, column: 1 }, exit: 2 },
  {
    file: 'missing-start.json',
    code: 'LW204',
    severity: 'error',
    location: { path: '$.start', line: 1, column: 1 },
    exit: 2,
  },
  {
    file: 'unknown-start.lw',
    code: 'LW204',
    severity: 'error',
    location: { line: 5, column: 7 },
    exit: 2,
    says: "did you mean 'dark'?",
  },
  { file: 'empty.lw', code: 'LW300', severity: 'error', location: { line: 1, column: 1 }, exit: 2 },
  {
    file: 'shadowed.lw',
    code: 'LW301',
    severity: 'warning',
    location: { line: 9, column: 3 },
    exit: 0,
    says: 'can never fire',
  },
  { file: 'bad-expr.lw', code: 'LW102', severity: 'error', location: { line: 8, column: 15 }, exit: 2 },
  {
    file: 'bad-expr.json',
    code: 'LW102',
    severity: 'error',
    location: { path: '$.states[0].transitions[0].when', line: 7, column: 49 },
    exit: 2,
    says: "expected ')'",
  },
  {
    file: 'non-exhaustive.lw',
    code: 'LW302',
    severity: 'info',
    location: { line: 7, column: 1 },
    exit: 0,
    says: "state 'dark'",
  },
  {
    file: 'unreachable.lw',
    code: 'LW303',
    severity: 'warning',
    location: { line: 14, column: 1 },
    exit: 0,
    says: "state 'attic'",
  },
  { file: 'bad-json.json', code: 'LW100', severity: 'error', location: { line: 5, column: 3 }, exit: 2 },
  {
    file: 'xstate-parallel.json',
    code: 'LW500',
    severity: 'error',
    location: { path: '$.states.running.type', line: 7, column: 15 },
    exit: 2,
    says: 'parallel states',
  },
  {
    file: 'xstate-guard.json',
    code: 'LW500',
    severity: 'error',
    location: { path: '$.states.closed.on.ticket.guard', line: 5, column: 64 },
    exit: 2,
    says: 'guards (guard)',
  },
];

afterAll(removeTempDirs);

describe('cli: bad machine files (tests/fixtures/bad)', () => {
  it.each(FILES.map((c) => [c.file, c] as const))('%s', async (_name, c) => {
    const file = `${BAD}/${c.file}`;
    const j = await run(['check', file, '--json']);
    expect(j.code).toBe(c.exit);
    const d = diagnosticsOf(j).find((x) => x.code === c.code);
    expect(d, `no ${c.code} in ${j.out}`).toBeDefined();
    expect(d!.severity).toBe(c.severity);
    expect(d!.location).toEqual({ file, ...c.location });
    // Errors stop the machine; warnings and notes do not.
    expect(diagnosticsOf(j).some((x) => x.severity === 'error')).toBe(c.exit === 2);

    const t = await run(['check', file]);
    expect(t.code).toBe(c.exit);
    const line = (t.out + t.err)
      .split('\n')
      .find((l) => l.startsWith(`${where(d!.location)}: ${c.severity} ${c.code}: `));
    expect(line, t.out + t.err).toBeDefined();
    if (c.says) expect(line).toContain(c.says);
    expectNoStack(j);
    expectNoStack(t);
  });

  it('build stops on the same diagnostic, on standard error, with exit 2', async () => {
    const r = await run(['build', `${BAD}/unknown-state.lw`, '--encoding', 'binary']);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err).toBe(
      `${BAD}/unknown-state.lw:14:16: error LW200: transition 1 of state 'two' goes to the unknown state 'zreo' — did you mean 'zero'?\n`,
    );
  });

  it('build --json stops with { ok: false, diagnostics } on standard output', async () => {
    const r = await runJson<{ ok: boolean; diagnostics: Diag[] }>(['build', `${BAD}/xstate-parallel.json`, '--json']);
    expect(r.code).toBe(2);
    expect(r.json.ok).toBe(false);
    expect(r.json.diagnostics.map((d) => d.code)).toEqual(['LW500']);
  });
});

describe('cli: machines over the limits (generated, never stored)', () => {
  const ring = (n: number): string =>
    [
      'machine huge',
      'inputs tick',
      'outputs mark',
      'start s0',
      ...Array.from({ length: n }, (_, i) => `state s${i}\n  when tick go s${(i + 1) % n}`),
    ].join('\n') + '\n';
  const inputs = Array.from({ length: 33 }, (_, i) => `i${i}`);

  it('4097 states give LW400 with exit 2', async () => {
    const r = await runJson<{ diagnostics: Diag[] }>(['check', 'huge.lw', '--json'], { 'huge.lw': ring(4097) });
    expect(r.code).toBe(2);
    // The location is the first state past the limit, the 4097th declared.
    const line =
      ring(4097)
        .split('\n')
        .findIndex((l) => l === 'state s4096') + 1;
    expect(r.json.diagnostics).toEqual([
      expect.objectContaining({ code: 'LW400', severity: 'error', location: { file: 'huge.lw', line, column: 1 } }),
    ]);
    expect(r.json.diagnostics[0].message).toContain('4097 states');
  });

  it('257 distinct states after minimisation: check takes them, build refuses them at once with LW407', async () => {
    // A ring whose one marked state makes every state distinct, so state minimisation keeps all 257.
    const marked = ring(257).replace('state s0\n', 'state s0 with mark=1\n');
    const c = await runJson<{ diagnostics: Diag[] }>(['check', 'ring.lw', '--json'], { 'ring.lw': marked });
    expect(c.json.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    const b = await runJson<{ diagnostics: Diag[] }>(['build', 'ring.lw', '--json'], { 'ring.lw': marked });
    expect(b.code).toBe(2);
    const errors = b.json.diagnostics.filter((d) => d.severity === 'error');
    expect(errors).toEqual([
      expect.objectContaining({ code: 'LW407', severity: 'error', location: { file: 'ring.lw' } }),
    ]);
    expect(errors[0].message).toContain('257 states after state minimisation');
  });

  it('33 inputs give LW401 with exit 2, in the text form and in the JSON form', async () => {
    const text = `machine wide\ninputs ${inputs.join(', ')}\noutputs o\nstart a\nstate a\n  when i0 go a\n`;
    const json = JSON.stringify({
      name: 'wide',
      inputs,
      outputs: ['o'],
      start: 'a',
      states: [{ name: 'a', transitions: [{ to: 'a' }] }],
    });
    const t = await runJson<{ diagnostics: Diag[] }>(['check', 'wide.lw', '--json'], { 'wide.lw': text });
    expect(t.code).toBe(2);
    // The location is the first input past the limit.
    expect(t.json.diagnostics.find((d) => d.code === 'LW401')?.location).toEqual({
      file: 'wide.lw',
      line: 2,
      column: text.split('\n')[1].indexOf('i32') + 1,
    });
    const j = await runJson<{ diagnostics: Diag[] }>(['check', 'wide.json', '--json'], { 'wide.json': json });
    expect(j.code).toBe(2);
    expect(j.json.diagnostics.find((d) => d.code === 'LW401')?.location).toEqual({
      file: 'wide.json',
      path: '$.inputs[32]',
      line: 1,
      column: json.indexOf('"i32"') + 1,
    });
    const text32 = text.replace(', i32', '');
    expect((await run(['check', 'w32.lw'], { 'w32.lw': text32 })).code).toBe(0);
  });
});

describe('cli: bad command lines, options and other files', () => {
  const MB = 'examples/marble-bell.lw';

  /** Run with --json and return the one error diagnostic (exit 2 asserted). */
  async function oneError(argv: string[], files: Record<string, string> = {}): Promise<Diag> {
    const r = await run([...argv, '--json'], files);
    expect(r.code, r.out + r.err).toBe(2);
    expectNoStack(r);
    const errors = diagnosticsOf(r).filter((d) => d.severity === 'error');
    expect(errors).toHaveLength(1);
    return errors[0];
  }

  it('an unknown encoding name: LW700 at --encoding, with a did-you-mean', async () => {
    const d = await oneError(['build', MB, '--encoding', 'grey']);
    expect(d).toMatchObject({ code: 'LW700', location: { path: '--encoding' } });
    expect(d.message).toContain("did you mean 'gray'?");
    expect(d.hint).toContain('binary, gray, johnson, one-hot, pinned, auto');
  });

  it.each([['-3'], ['abc'], ['1.5'], ['']])(
    'a bad --seed %j: LW700 at --seed, for build and compare alike',
    async (seed) => {
      expect(await oneError(['build', MB, '--seed', seed])).toMatchObject({
        code: 'LW700',
        location: { path: '--seed' },
      });
      expect(await oneError(['compare', MB, '--seed', seed])).toMatchObject({
        code: 'LW700',
        location: { path: '--seed' },
      });
    },
  );

  it('an --unused state that does not exist: LW700 at --unused, with a did-you-mean', async () => {
    const d = await oneError(['build', MB, '--encoding', 'binary', '--unused', 'nnoe']);
    expect(d).toMatchObject({ code: 'LW700', location: { path: '--unused' } });
    expect(d.hint).toContain("did you mean 'none'?");
  });

  it('an --unused state that cannot be reached: LW700 says it is not in the build and names the reachable ones', async () => {
    const d = await oneError(['build', `${BAD}/unreachable.lw`, '--encoding', 'binary', '--unused', 'attic']);
    expect(d).toMatchObject({ code: 'LW700', location: { path: '--unused' } });
    expect(d.message).toContain("'attic', which cannot be reached from the start state");
    // Never a did-you-mean of the very name typed.
    expect(d.hint).toBe("name a reachable state ('dark', 'bright'), or 'dont-care'");
  });

  it('an unknown option: LW700 at the option, a did-you-mean when close; text on standard error', async () => {
    expect(await oneError(['build', MB, '--frobnicate'])).toMatchObject({
      code: 'LW700',
      location: { path: '--frobnicate' },
      message: 'unknown option --frobnicate',
    });
    const t = await run(['build', MB, '--encodng', 'binary']);
    expect(t.code).toBe(2);
    expect(t.out).toBe('');
    expect(t.err).toBe(
      '--encodng: error LW700: unknown option --encodng — did you mean --encoding? Run `latchwright --help` for usage\n',
    );
    // The last word of an option, typed alone.
    expect((await oneError(['build', MB, '--units', 'inch'])).hint).toBe(
      'did you mean --shop-units? Run `latchwright --help` for usage',
    );
  });

  it('an option without its value, an unknown command, no file, two files: LW700', async () => {
    expect(await oneError(['build', MB, '--encoding'])).toMatchObject({
      code: 'LW700',
      location: { path: '--encoding' },
      message: '--encoding needs a value',
    });
    expect(await oneError(['assemble', MB])).toMatchObject({ code: 'LW700', location: { path: 'assemble' } });
    expect(await oneError(['check'])).toMatchObject({ code: 'LW700', location: { path: 'FILE' } });
    expect(await oneError(['check', MB, 'examples/lighthouse.lw'])).toMatchObject({
      code: 'LW700',
      location: { path: 'examples/lighthouse.lw' },
    });
  });

  it('a missing file and a folder instead of a file: LW705 naming the file', async () => {
    expect(await oneError(['check', 'no-such-machine.lw'])).toMatchObject({
      code: 'LW705',
      location: { file: 'no-such-machine.lw' },
      message: 'no such file: no-such-machine.lw',
    });
    expect(await oneError(['build', 'examples'])).toMatchObject({
      code: 'LW705',
      location: { file: 'examples' },
      message: 'examples is a folder, not a file',
    });
    const t = await run(['check', 'no-such-machine.lw']);
    expect(t.err).toBe(
      'no-such-machine.lw: error LW705: no such file: no-such-machine.lw — check the path; name a file, not a folder\n',
    );
    expectNoStack(t);
  });

  it('a profile with μ = 3: LW600 at $.mu of the profile file; a missing profile: LW705', async () => {
    const dir = tempDir();
    const profile = writeTemp(dir, 'slippery.json', JSON.stringify({ mu: 3 }));
    const d = await oneError(['build', MB, '--profile', profile]);
    expect(d).toMatchObject({ code: 'LW600', location: { file: profile, path: '$.mu' } });
    expect(d.message).toContain("'mu'");
    expect((await oneError(['compare', MB, '--profile', profile])).code).toBe('LW600');
    expect(await oneError(['build', MB, '--profile', join(dir, 'none.json')])).toMatchObject({
      code: 'LW705',
      location: { file: join(dir, 'none.json') },
    });
    const notJson = writeTemp(dir, 'broken.json', '{ "mu": ');
    expect(await oneError(['build', MB, '--profile', notJson])).toMatchObject({
      code: 'LW100',
      location: { file: notJson },
    });
  });

  it('--out into a non-empty folder the tool did not make: LW702 at the folder', async () => {
    const dir = tempDir();
    const foreign = join(dir, 'holiday-photos');
    mkdirSync(foreign);
    writeTemp(foreign, 'beach.txt', 'sand');
    expect(await oneError(['build', MB, '--encoding', 'binary', '--out', foreign])).toMatchObject({
      code: 'LW702',
      location: { file: foreign },
    });
  });

  it('step: a sequence file that is missing, not JSON, or names an unknown input', async () => {
    const miss = await run(['step', MB, '--encoding', 'binary', '--inputs', 'clocks.json']);
    expect(miss.code).toBe(2);
    expect(miss.err).toBe(
      'clocks.json: error LW705: no such file: clocks.json — check the path; name a file, not a folder\n',
    );
    const notJson = await run(['step', MB, '--encoding', 'binary', '--inputs', 'clocks.json'], {
      'clocks.json': '[{"marble": 1},',
    });
    expect(notJson.code).toBe(2);
    expect(notJson.err).toMatch(/^clocks\.json:1:16: error LW100: the input sequence is not valid JSON: /);
    const unknown = await run(['step', MB, '--encoding', 'binary', '--inputs', 'clocks.json'], {
      'clocks.json': '[{"marble": 1}, {"marbel": 1}]',
    });
    expect(unknown.code).toBe(2);
    expect(unknown.err).toContain(
      "clocks.json:1:28 $[1].marbel: error LW208: clock 2 sets 'marbel', which is not an input of marble_bell",
    );
    for (const r of [miss, notJson, unknown]) expectNoStack(r);
  });
});
