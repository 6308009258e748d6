/**
 * `latchwright check FILE [--json]`: the machine block, the merge map and the diagnostics, with
 * the right counts, and the exit status (0 ok — warnings and notes included —, 2 bad input;
 * check runs no build, so it never has a failed check to report with 1).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { EXAMPLES, examplePath, expectNoStack, readText, run, runJson } from './support.js';

interface CheckJson {
  file: string;
  form: string;
  ok: boolean;
  machine: { name: string; states: number; reachable: number; minimized: number; inputs: number; outputs: number };
  merged: Record<string, string>;
  diagnostics: { code: string; severity: string; message: string; location: Record<string, unknown>; hint?: string }[];
}

/** Counts read off the example files by hand (our own invented machines; worked out in the comments). */
const HAND: Record<string, { name: string; states: number; minimized: number; inputs: number; outputs: number }> = {
  // Five steps of a level crossing; warning and barrier_up show the same lights but lead to different outputs next.
  crossing: { name: 'crossing', states: 5, minimized: 5, inputs: 2, outputs: 3 },
  // Lamp pattern 1 0 1 0 0 0 has period 6, so no two of the six states are equivalent.
  lighthouse: { name: 'lighthouse', states: 6, minimized: 6, inputs: 0, outputs: 1 },
  // Counting to three: each state is a different distance from the ring.
  'marble-bell': { name: 'marble_bell', states: 4, minimized: 4, inputs: 1, outputs: 1 },
  'odd-lever': { name: 'odd_lever', states: 1, minimized: 1, inputs: 2, outputs: 1 },
  // Locked and got_green part on red then blue; got_green and got_red part on blue.
  'sequence-lock': { name: 'sequence_lock', states: 4, minimized: 4, inputs: 3, outputs: 1 },
  // A count of passengers: each state is a different number of visitors away from the bar.
  'ferry-gate': { name: 'ferry_gate', states: 4, minimized: 4, inputs: 2, outputs: 2 },
};

/** Names declared on a `inputs`/`outputs` line of the text form, read independently of the parser. */
function declared(text: string, keyword: string): string[] {
  const line = text.split('\n').find((l) => l.startsWith(keyword + ' '));
  return line
    ? line
        .slice(keyword.length)
        .split(/[\s,]+/)
        .filter(Boolean)
    : [];
}

/** TABLE.md of the MCNC / LGSynth'91 FSM benchmarks (tests/fixtures/lgsynth91/PROVENANCE.md), parsed here. */
function lgsynthRow(name: string): {
  inputs: number;
  outputs: number;
  states: number;
  reachable: number;
  minimal: number;
} {
  const line = readFileSync('tests/fixtures/lgsynth91/TABLE.md', 'utf8')
    .split('\n')
    .find((l) => l.startsWith(`| ${name} |`));
  if (!line) throw new Error(`${name} is not in TABLE.md`);
  const [, , inputs, outputs, states, reachable, , minimal] = line.split('|').map((c) => c.trim());
  return {
    inputs: Number(inputs),
    outputs: Number(outputs),
    states: Number(states),
    reachable: Number(reachable),
    minimal: Number(minimal),
  };
}

describe('cli/commands/check', () => {
  for (const name of Object.keys(HAND)) {
    it(`${name}: --json gives the machine block, an identity merge map and exit 0`, async () => {
      const r = await runJson<CheckJson>(['check', examplePath(name), '--json']);
      expect(r.code).toBe(0);
      const h = HAND[name];
      expect(r.json.ok).toBe(true);
      expect(r.json.form).toBe('text');
      expect(r.json.machine).toMatchObject({
        name: h.name,
        states: h.states,
        reachable: h.states,
        minimized: h.minimized,
        inputs: h.inputs,
        outputs: h.outputs,
      });
      expect(Object.keys(r.json.merged)).toHaveLength(h.states);
      for (const [from, to] of Object.entries(r.json.merged)) expect(to).toBe(from);
    });
  }

  it('every example file: the counts agree with what the file declares, every diagnostic is complete', async () => {
    for (const name of EXAMPLES) {
      const text = readText(examplePath(name));
      const r = await runJson<CheckJson>(['check', examplePath(name), '--json']);
      expect(r.code, name).toBe(0);
      expect(r.json.machine.states, name).toBe(text.split('\n').filter((l) => l.startsWith('state ')).length);
      expect(r.json.machine.inputs, name).toBe(declared(text, 'inputs').length);
      expect(r.json.machine.outputs, name).toBe(declared(text, 'outputs').length);
      expect(Object.keys(r.json.merged).sort(), name).toEqual(
        text
          .split('\n')
          .filter((l) => l.startsWith('state '))
          .map((l) => l.split(/\s+/)[1])
          .sort(),
      );
      for (const d of r.json.diagnostics) {
        expect(Object.keys(d), name).toEqual(expect.arrayContaining(['code', 'severity', 'message', 'location']));
        expect(d.code).toMatch(/^LW\d{3}$/);
        expect(['info', 'warning']).toContain(d.severity);
        expect(d.location.file).toBe(examplePath(name));
        expect(d.location.line).toEqual(expect.any(Number));
      }
    }
  });

  it('marble-bell: one LW302 note per state that leaves "no marble" to the hold rule, at its state line', async () => {
    const r = await runJson<CheckJson>(['check', examplePath('marble-bell'), '--json']);
    // States none, one and two are on lines 18, 21 and 24 of examples/marble-bell.lw; rung covers every case.
    expect(r.json.diagnostics.map((d) => [d.code, d.severity, d.location.line, d.location.column])).toEqual([
      ['LW302', 'info', 18, 1],
      ['LW302', 'info', 21, 1],
      ['LW302', 'info', 24, 1],
    ]);
    expect(r.json.diagnostics[0].message).toContain("state 'none'");
  });

  it('prints the counts in words, and counts the notes (on standard error, with the diagnostics) instead of listing them', async () => {
    const r = await run(['check', examplePath('marble-bell')]);
    expect(r.code).toBe(0);
    expect(r.out).toBe(
      'marble_bell: 4 states (4 reachable, 4 after minimisation by partition-refinement, proven minimal), 1 input, 1 output\n',
    );
    expect(r.err).toBe('3 notes (LW302); see them with --json\n');
  });

  // MCNC / LGSynth'91 FSM benchmarks (open dataset), reference figures from TABLE.md: complete
  // machines by partition refinement (exact), ex7 and lion9 by SAT-based exact minimisation of
  // incompletely specified machines (Abel & Reineke, ICCAD 2015).
  for (const name of ['bbara', 'dk512', 's27', 'modulo12', 'ex7', 'lion9']) {
    it(`LGSynth'91 ${name}: inputs, outputs, states, reachable and minimised count as TABLE.md gives them`, async () => {
      const t = lgsynthRow(name);
      const r = await runJson<CheckJson>(['check', `tests/fixtures/lgsynth91/${name}.json`, '--json']);
      expect(r.code).toBe(0);
      expect(r.json.form).toBe('json');
      expect(r.json.machine).toMatchObject({
        name,
        inputs: t.inputs,
        outputs: t.outputs,
        states: t.states,
        reachable: t.reachable,
        minimized: t.minimal,
      });
      // The merge map sends every reachable state to one of `minimal` representatives.
      expect(Object.keys(r.json.merged)).toHaveLength(t.reachable);
      expect(new Set(Object.values(r.json.merged)).size).toBe(t.minimal);
    });
  }

  it("LGSynth'91 bbara (TABLE.md: 10 states, minimal 7): the text form lists which states merge", async () => {
    const r = await run(['check', 'tests/fixtures/lgsynth91/bbara.json']);
    expect(r.code).toBe(0);
    expect(r.out).toContain(
      'bbara: 10 states (10 reachable, 7 after minimisation by partition-refinement, proven minimal), 4 inputs, 2 outputs\n',
    );
    const merges = r.out.split('merged states:\n')[1].trimEnd().split('\n');
    expect(merges).toHaveLength(3);
    for (const m of merges) expect(m).toMatch(/^ {2}st\d+ → st\d+$/);
  });

  it('reads an xstate configuration: each event becomes an input lever, each tag an output', async () => {
    const config = JSON.stringify({
      id: 'turnstile',
      initial: 'locked',
      states: { locked: { on: { coin: 'unlocked' } }, unlocked: { tags: 'free', on: { push: 'locked' } } },
    });
    const r = await runJson<CheckJson>(['check', 'turnstile.json', '--json'], { 'turnstile.json': config });
    expect(r.code).toBe(0);
    expect(r.json.form).toBe('xstate');
    // Two events become the two input levers coin and push; the tag 'free' becomes an output.
    expect(r.json.machine).toMatchObject({ states: 2, reachable: 2, minimized: 2, inputs: 2, outputs: 1 });
  });

  it('exit 0 with a warning, exit 2 with an error; never a stack trace', async () => {
    const warn = await run(['check', 'tests/fixtures/bad/shadowed.lw']);
    expect(warn.code).toBe(0);
    expect(warn.err).toContain('warning LW301');
    const bad = await run(['check', 'tests/fixtures/bad/unknown-state.lw']);
    expect(bad.code).toBe(2);
    expect(bad.err).toContain('error LW200');
    expect(bad.out).toBe('');
    expectNoStack(warn);
    expectNoStack(bad);
  });
});
