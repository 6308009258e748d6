import { describe, expect, it } from 'vitest';
import { BEHAVIOURS } from '../../src/core/index.js';
import { expectNoStack, run, runJson } from './support.js';

describe('cli/commands/write', () => {
  it('writes a sequence lock in the text form that `build` then builds with every check passing', async () => {
    const w = await run([
      'write',
      'sequence',
      '--inputs',
      'red,green,blue',
      '--order',
      'red,green,red',
      '--output',
      'flap',
    ]);
    expect(w).toMatchObject({ code: 0, err: '' });
    expect(w.out).toMatch(/^# Pressing red, green, red in that order opens flap for one clock\.\n/);
    expect(w.out).toContain('\nmachine sequence_lock\ninputs red, green, blue\noutputs flap\nstart ready\n');
    const b = await runJson(['build', 'lock.lw', '--json', '--encoding', 'binary'], { 'lock.lw': w.out });
    expect(b.code).toBe(0);
    expect((b.json.checks as { ok: boolean }[]).every((c) => c.ok)).toBe(true);
  });

  it('writes the JSON form with --json, which reads as the same machine', async () => {
    const j = await runJson<{ name: string; states: { name: string }[]; inputs: string[] }>([
      'write',
      'counting',
      '--input=marble',
      '--every',
      '3',
      '--output',
      'bell',
      '--json',
    ]);
    expect(j.code).toBe(0);
    expect(j.json.name).toBe('counter');
    expect(j.json.inputs).toEqual(['marble']);
    expect(j.json.states.map((s) => s.name)).toEqual(['count_0', 'count_1', 'count_2']);
    const c = await runJson(['check', 'bell.json', '--json'], { 'bell.json': j.out });
    expect(c.code).toBe(0);
  });

  it('--help lists every behaviour of the registry and each of its options', async () => {
    const r = await run(['write', '--help']);
    expect(r.code).toBe(0);
    for (const b of BEHAVIOURS) {
      expect(r.out).toContain(`  ${b.name}: ${b.summary}\n`);
      for (const f of b.fields) expect(r.out).toContain(`--${f.key} `);
    }
    expect((await run(['--help'])).out).toContain('latchwright write BEHAVIOUR');
  });

  it('bad parameters give their codes on standard error, naming the parameter, with exit 2', async () => {
    const cases: [string[], string][] = [
      [['counting', '--input', 'marble', '--every', '1', '--output', 'bell'], 'counting.every: error LW800:'],
      [['toggle', '--input', 'big button', '--output', 'lamp'], 'toggle.input: error LW801:'],
      [['sequence', '--order', '', '--output', 'flap'], 'sequence.order: error LW802:'],
      [['hold', '--input', 'sensor', '--clocks', '2', '--output', 'sensor'], 'hold.output: error LW803:'],
      [['sequence', '--order', 'a', '--output', 'flap', '--open', 'ajar'], 'sequence.open: error LW804:'],
      [['sequence', '--inputs', 'a,b', '--order', 'a,c', '--output', 'flap'], 'sequence.order: error LW805:'],
      [['toggel'], 'behaviour: error LW804:'],
      [[], 'BEHAVIOUR: error LW700: no behaviour given'],
      [
        ['toggle', '--input', 'b', '--output', 'l', '--every', '3'],
        '--every: error LW700: the behaviour toggle takes no --every',
      ],
      [['sequence', '--order', 'a', 'b', '--output', 'f'], 'b: error LW700: one behaviour at a time'],
      [['counting', '--evry', '3'], '--evry: error LW700: unknown option --evry — did you mean --every?'],
    ];
    for (const [argv, line] of cases) {
      const r = await run(['write', ...argv]);
      expect({ argv, code: r.code, out: r.out }).toEqual({ argv, code: 2, out: '' });
      expect(r.err.split('\n')[0]).toContain(line);
      expectNoStack(r);
    }
  });

  it('with --json a refusal is one JSON document with the diagnostics', async () => {
    const r = await runJson<{ ok: boolean; diagnostics: { code: string; location: { path: string } }[] }>([
      'write',
      'hold',
      '--input',
      'sensor',
      '--clocks',
      '99',
      '--output',
      'unlock',
      '--json',
    ]);
    expect(r.code).toBe(2);
    expect(r.json.ok).toBe(false);
    expect(r.json.diagnostics.map((d) => [d.code, d.location.path])).toEqual([['LW800', 'hold.clocks']]);
    expect(r.err).toBe('');
  });
});
