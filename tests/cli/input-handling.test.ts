/**
 * Input handling in every command: a UTF-8 byte order mark is accepted in every kind of file;
 * every JSON-based file gets line and column (and keeps its JSON path); every diagnostic names
 * a file; --json makes every failure JSON; diagnostics go to standard error in every command;
 * numbers too large to hold are coded errors; echoed input never carries control characters
 * to the terminal and never runs to megabytes.
 */
import { describe, expect, it } from 'vitest';
import { expectNoStack, readText, run, runJson, type Run } from './support.js';

const MB = 'examples/marble-bell.lw';
const BOM = '\ufeff';

interface Diag {
  code: string;
  severity: string;
  message: string;
  location: { file?: string; line?: number; column?: number; path?: string };
  hint?: string;
}

/** The marble bell as a JSON machine and as an xstate configuration (written here, our own scenario). */
const MB_JSON = JSON.stringify(
  {
    name: 'marble_bell',
    inputs: ['marble'],
    outputs: ['bell'],
    start: 'none',
    states: [
      { name: 'none', transitions: [{ when: 'marble', to: 'one' }] },
      { name: 'one', transitions: [{ when: 'marble', to: 'two' }] },
      { name: 'two', transitions: [{ when: 'marble', to: 'rung' }] },
      { name: 'rung', outputs: { bell: 1 }, transitions: [{ when: 'marble', to: 'one' }, { to: 'none' }] },
    ],
  },
  null,
  2,
);
const MB_XSTATE = JSON.stringify(
  {
    id: 'marble_bell',
    initial: 'none',
    states: { none: { on: { marble: 'one' } }, one: { on: { marble: 'two' } }, two: { tags: ['bell'] } },
  },
  null,
  2,
);

// eslint-disable-next-line no-control-regex -- looking for control characters is the point
const CONTROL = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f]/;

describe('cli: input handling', () => {
  it('accepts a byte order mark in machines of all three forms, profiles and step files', async () => {
    const files = {
      'mb.lw': BOM + readText(MB),
      'mb.json': BOM + MB_JSON,
      'mb.xstate.json': BOM + MB_XSTATE,
      'profile.json': BOM + '{ "mu": 0.25 }',
      'clocks.json': BOM + '[{"marble": 1}, {}]',
    };
    for (const m of ['mb.lw', 'mb.json', 'mb.xstate.json']) {
      const r = await runJson<{ ok: boolean; form: string }>(['check', m, '--json'], files);
      expect(r.code, m + r.out).toBe(0);
      expect(r.json.ok).toBe(true);
    }
    const step = await runJson<unknown[]>(
      ['step', 'mb.json', '--inputs', 'clocks.json', '--profile', 'profile.json', '--json', '--encoding', 'binary'],
      files,
    );
    expect(step.code).toBe(0);
    expect(step.json).toHaveLength(2);
  });

  it('gives line and column, and keeps the JSON path, in profiles, step files and xstate configs', async () => {
    const profile = '{\n  "mu": 0.25,\n  "wraps": -2\n}\n';
    const p = await runJson<{ diagnostics: Diag[] }>(['build', MB, '--profile', 'p.json', '--json'], {
      'p.json': profile,
    });
    expect(p.code).toBe(2);
    expect(p.json.diagnostics[0]).toMatchObject({
      code: 'LW600',
      location: { file: 'p.json', path: '$.wraps', line: 3, column: 12 },
    });
    const seq = '[\n  {"marble": 1},\n  {"marble": 7}\n]';
    const s = await run(['step', MB, '--inputs', 's.json', '--encoding', 'binary'], { 's.json': seq });
    expect(s.code).toBe(2);
    expect(s.err).toMatch(/^s\.json:3:14 \$\[1\]\.marble: error LW103: clock 2 sets 'marble' to 7/);
    const xs = MB_XSTATE.replace('"marble": "two"', '"marble": "tow"');
    const x = await run(['check', 'x.json'], { 'x.json': xs });
    expect(x.code).toBe(2);
    const line = xs.split('\n').findIndex((l) => l.includes('"tow"'));
    const column = xs.split('\n')[line].indexOf('"tow"') + 1;
    expect(x.err).toContain(`x.json:${line + 1}:${column} $.states.one.on.marble: error LW200`);
    // The profile's own syntax errors have their place too.
    const broken = await run(['build', MB, '--profile', 'b.json'], { 'b.json': '{\n  "mu": 0.25,,\n}' });
    expect(broken.err).toMatch(/^b\.json:2:14: error LW100: the profile is not valid JSON/);
  });

  it('names a file in every diagnostic: a build problem with no place of its own names the machine', async () => {
    const r = await runJson<{ diagnostics: Diag[] }>([
      'build',
      'examples/odd-lever.lw',
      '--encoding',
      'johnson',
      '--json',
    ]);
    expect(r.code).toBe(2);
    const d = r.json.diagnostics.find((x) => x.code === 'LW701');
    expect(d?.location).toEqual({ file: 'examples/odd-lever.lw' });
    const t = await run(['build', 'examples/odd-lever.lw', '--encoding', 'johnson']);
    expect(t.err).toMatch(/^examples\/odd-lever\.lw: error LW701: /);
    expect(t.err).not.toContain('<input>');
  });

  it('refuses a number too large to hold (1e309) as LW108 in machines, xstate configs, profiles and step files', async () => {
    const cases: [string[], Record<string, string>, string][] = [
      [['check', 'm.json'], { 'm.json': MB_JSON.replace('"name": "marble_bell"', '"name": 1e309') }, 'm.json'],
      [['check', 'x.json'], { 'x.json': MB_XSTATE.replace('"initial"', '"version": 2e400, "initial"') }, 'x.json'],
      [['build', MB, '--profile', 'p.json'], { 'p.json': '{"mu": 1e309}' }, 'p.json'],
      [['step', MB, '--inputs', 's.json'], { 's.json': '[{"marble": -1e999}]' }, 's.json'],
    ];
    for (const [argv, files, file] of cases) {
      const r = await runJson<{ ok: boolean; diagnostics: Diag[] }>([...argv, '--json'], files);
      expect(r.code, file).toBe(2);
      const d = r.json.diagnostics.find((x) => x.code === 'LW108');
      expect(d, r.out).toBeDefined();
      expect(d!.location).toMatchObject({ file });
      expect(d!.location.line).toBeGreaterThan(0);
      expect(d!.message).not.toContain('null');
      expectNoStack(r);
    }
  });

  it('refuses JSON nested past 64 levels as LW406 at the bracket, whatever the file (a deep value once exhausted the stack)', async () => {
    const deep = '['.repeat(100_000) + ']'.repeat(100_000);
    const cases: [string[], Record<string, string>, string, number][] = [
      [['check', 'm.json'], { 'm.json': `{"name": ${deep}}` }, 'm.json', 73],
      [['build', MB, '--profile', 'p.json'], { 'p.json': `{"mu": ${deep}}` }, 'p.json', 71],
      [['step', MB, '--inputs', 's.json'], { 's.json': `[{"marble": ${deep}}]` }, 's.json', 75],
    ];
    for (const [argv, files, file, column] of cases) {
      const r = await runJson<{ diagnostics: Diag[] }>([...argv, '--json'], files);
      expectNoStack(r);
      expect(r.code).toBe(2);
      expect(r.json.diagnostics).toEqual([
        expect.objectContaining({ code: 'LW406', location: { file, line: 1, column } }),
      ]);
    }
  });

  it('--json makes every failure JSON on standard output, with nothing on standard error', async () => {
    const failures: [string[], Record<string, string>][] = [
      [['check', 'missing.lw'], {}],
      [['check', 'tests/fixtures/bad/unknown-state.lw'], {}],
      [['build', 'tests/fixtures/bad/bad-json.json'], {}],
      [['compare', MB, '--seed', 'x'], {}],
      [['step', MB, '--inputs', 'nope.json'], {}],
      [['step', MB, '--inputs', 's.json'], { 's.json': '[{"marbel": 1}]' }],
      [['step', MB, '--inputs', 's.json'], { 's.json': '[{"marble": 1},' }],
      [['step', MB], {}],
      [['build', MB, '--encoding', 'gray-ish'], {}],
      [['frobnicate', MB], {}],
    ];
    for (const [argv, files] of failures) {
      const r = await runJson<{ ok: boolean; diagnostics: Diag[] }>([...argv, '--json'], files);
      expect(r.code, argv.join(' ')).toBe(2);
      expect(r.err, argv.join(' ')).toBe('');
      expect(r.json.ok).toBe(false);
      expect(r.json.diagnostics.length).toBeGreaterThan(0);
      for (const d of r.json.diagnostics) expect(d.code).toMatch(/^LW\d{3}$/);
    }
  });

  it('every command prints its diagnostics on standard error and its result on standard output', async () => {
    const shadowed = 'tests/fixtures/bad/shadowed.lw';
    const runs: Run[] = [
      await run(['check', shadowed]),
      await run(['build', shadowed, '--encoding', 'binary']),
      await run(['compare', shadowed]),
      await run(['step', shadowed, '--inputs', 's.json', '--encoding', 'binary'], { 's.json': '[{}]' }),
    ];
    for (const r of runs) {
      expect(r.code).toBe(0);
      expect(r.err).toMatch(/^tests\/fixtures\/bad\/shadowed\.lw:\d+:\d+: warning LW301: /);
      expect(r.out).not.toContain('LW301');
      expect(r.out.length).toBeGreaterThan(0);
    }
    for (const argv of [['check'], ['build', '--encoding', 'binary'], ['compare']]) {
      const j = await run([argv[0], shadowed, ...argv.slice(1), '--json']);
      expect(j.err).toBe('');
      expect((JSON.parse(j.out) as { diagnostics: Diag[] }).diagnostics.map((d) => d.code)).toContain('LW301');
    }
  });

  it('echoes no control character and no megabyte word: terminal escapes are spelt out, long words shortened', async () => {
    const hostile = [
      'machine m\ninputs a\nstart s\nstate s\n  \u001b]0;owned\u0007 go s\n',
      'machine m\ninputs a\nstart s\nstate s\n  go s\n\u001b[2J\u0000\u009b31m\n',
      'machine m\ninputs a\nstart s\nstate s\n  when a & \u001b[2J go s\n',
      `machine m\ninputs a\nstart s\nstate s\n  ${'w'.repeat(10_000_000)} go s\n`,
      `machine m\ninputs a\nstart s\nstate s\n  go ${'s'.repeat(200_000)}\n`,
      JSON.stringify({
        name: 'm',
        inputs: [],
        outputs: [],
        start: 's',
        states: [],
        ['\u001b[2J' + 'k'.repeat(5_000_000)]: 1,
      }),
    ];
    for (const text of hostile) {
      for (const json of [false, true]) {
        const r = await run(['check', 'h.lw', ...(json ? ['--json'] : [])], { 'h.lw': text });
        expectNoStack(r);
        expect(r.out + r.err).not.toMatch(CONTROL);
        expect((r.out + r.err).length).toBeLessThan(4000);
        if (json) {
          const ds = (JSON.parse(r.out) as { diagnostics: Diag[] }).diagnostics;
          for (const d of ds)
            for (const text of [d.message, d.hint ?? '', d.location.file ?? '', d.location.path ?? '']) {
              expect(text).not.toMatch(CONTROL);
              expect(text.length).toBeLessThan(1000);
            }
        }
      }
    }
    // A file name given on the command line is shown printable too.
    const named = await run(['check', 'x\u001b[2J.lw']);
    expect(named.err).toContain('x\\u{1b}[2J.lw');
    expect(named.err).not.toMatch(CONTROL);
  });

  it('refuses a name longer than 128 characters as LW405, naming it shortly', async () => {
    const long = 'n'.repeat(100_000);
    const r = await runJson<{ diagnostics: Diag[] }>(['check', 'l.lw', '--json'], {
      'l.lw': `machine m\nstart ${long}\nstate ${long}\n  go ${long}\n`,
    });
    expect(r.code).toBe(2);
    const d = r.json.diagnostics.find((x) => x.code === 'LW405');
    expect(d?.location).toEqual({ file: 'l.lw', line: 3, column: 7 });
    expect(d?.message.length).toBeLessThan(200);
  });

  it('prints a table of 130,000 clocks (a spread of that many rows once exhausted the stack)', async () => {
    const clocks = JSON.stringify(Array.from({ length: 130_000 }, (_, i) => ({ marble: i % 2 })));
    const r = await run(['step', MB, '--inputs', 'c.json', '--abstract', '--encoding', 'binary'], { 'c.json': clocks });
    expectNoStack(r);
    expect(r.code).toBe(0);
    const lines = r.out.trimEnd().split('\n');
    expect(lines).toHaveLength(130_001);
    expect(lines[130_000]).toMatch(/^130000 +\S+ +\d+ +marble=1 +bell=[01] /);
  });
});
