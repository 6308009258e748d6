import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkEquivalence } from '../../../src/core/checks/equivalence.js';
import type { FlatMachine } from '../../../src/core/model/flat.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { randomFlatMachine } from '../../../src/core/sim/random-machine.js';
import { synthesise } from '../../../src/core/synthesise.js';
import { counterBuild, toggleBuild, toggleMachine } from '../sim/handmade.js';
import { brokenBuild, exampleBuild, exampleNames } from './builds.js';

/** The toggle as a person might first write it, with each state twice (off → on → off2 → on2 → off). */
function toggleAsWritten(): FlatMachine {
  const r = (cube: string, next: number, lit: 0 | 1, transition = 0) => ({ cube, next, out: [lit], transition });
  return {
    ...toggleMachine(),
    states: ['off', 'on', 'off2', 'on2'],
    rows: [
      [r('1', 1, 0), r('0', 0, 0, -1)],
      [r('1', 2, 1), r('0', 1, 1, -1)],
      [r('1', 3, 0), r('0', 2, 0, -1)],
      [r('1', 0, 1), r('0', 3, 1, -1)],
    ],
  };
}

describe('core/checks/equivalence', () => {
  it('proves the hand-made toggle over every reachable product state and input', () => {
    const r = checkEquivalence(toggleBuild(), {}, DEFAULT_PROFILE);
    expect(r).toMatchObject({
      name: 'equivalence',
      ok: true,
      pairs: 4,
      states: 2,
      inputs: 'exhaustive',
      complete: true,
    });
    expect(r.counterexample).toBeUndefined();
  });

  it('explores pairs of a written state and a build code, not a map from written states to minimised ones', () => {
    const merged = { off: 'off', on: 'on', off2: 'off', on2: 'on' };
    const ok = checkEquivalence(toggleBuild(), { original: toggleAsWritten(), merged }, DEFAULT_PROFILE);
    expect(ok).toMatchObject({ ok: true, states: 4, pairs: 8 });
    // A wrong map changes nothing: the check does not read it.
    const wrongMap = checkEquivalence(
      toggleBuild(),
      { original: toggleAsWritten(), merged: { ...merged, off2: 'on' } },
      DEFAULT_PROFILE,
    );
    expect(wrongMap).toMatchObject({ ok: true, states: 4 });
    // A machine as written that the build does not implement: 'on2' goes back to 'on2' instead of 'off'.
    const other = toggleAsWritten();
    const changed = { ...other, rows: other.rows.map((rs, s) => (s === 3 ? [{ ...rs[0], next: 3 }, rs[1]] : rs)) };
    const wrong = checkEquivalence(toggleBuild(), { original: changed }, DEFAULT_PROFILE);
    expect(wrong.ok).toBe(false);
    // The build's start state cannot stand for the written start (they part after five clocks of t=1): caught at reset.
    expect(wrong.summary).toBe(
      "reset leaves 'off' (code 0), which cannot stand for the start state 'off' of the machine as written: from there, t=1, then t=1, then t=1, then t=1, then t=1 make the machine as written show lit=1 where 'off' shows 0",
    );
    expect(wrong.counterexample?.trace).toEqual(['1. pull reset', '2. release reset']);
  });

  it('catches a missing term cord with a hand-action trace', () => {
    const r = checkEquivalence(brokenBuild('toggle-missing-term-cord'), {}, DEFAULT_PROFILE);
    expect(r.ok).toBe(false);
    expect(r.counterexample?.words).toBe(
      "after reset and 0 clocks, in state 'off' (code 0) with t=0: the build goes to 'on' (code 1), the minimised machine goes to 'off' (code 0)",
    );
    expect(r.counterexample?.trace).toEqual([
      '1. pull reset',
      '2. release reset',
      '3. pull φ1',
      '4. release φ1',
      '5. pull φ2',
      '6. release φ2',
    ]);
  });

  it('fails on an alarm: the forbidden input of an unguarded latch', () => {
    const r = checkEquivalence(brokenBuild('counter-unguarded'), {}, DEFAULT_PROFILE);
    expect(r.ok).toBe(false);
    expect(r.summary).toMatch(
      /^after reset and 1 clock, in state 'b' \(code 01\) with go=1: latch M0 sees the forbidden input/,
    );
    expect(r.counterexample?.trace).toEqual([
      '1. pull reset',
      '2. release reset',
      "3. pull input lever 'go'",
      '4. pull φ1',
      '5. release φ1',
      '6. pull φ2',
      '7. release φ2',
      '8. pull φ1',
      '9. release φ1',
      '10. pull φ2',
      '11. release φ2',
    ]);
  });

  it('stops a trace before φ1 when an output is wrong', () => {
    const b = counterBuild(true);
    const wrongOutput = {
      ...b,
      machine: {
        ...b.machine,
        rows: b.machine.rows.map((rs, s) => (s === 2 ? rs.map((r) => ({ ...r, out: [0 as const] })) : rs)),
      },
    };
    const r = checkEquivalence(wrongOutput, {}, DEFAULT_PROFILE);
    expect(r.summary).toBe(
      "after reset and 2 clocks, in state 'c' (code 10) with go=0: output 'top' shows 1, the minimised machine says 0",
    );
    expect(r.counterexample?.trace.slice(-2)).toEqual(['11. release φ2', "12. release input lever 'go'"]);
  });

  it.each(exampleNames())('proves the example %s built with binary codes', (name) => {
    const { build, spec } = exampleBuild(name);
    const r = checkEquivalence(build, spec, DEFAULT_PROFILE);
    expect(r.summary).toMatch(/^the build behaves as/);
    expect(r.ok).toBe(true);
  });

  it('proves an example built with one-hot codes, and says when it only samples inputs', () => {
    const { build, spec } = exampleBuild('sequence-lock', { encoding: 'one-hot' });
    expect(checkEquivalence(build, spec, DEFAULT_PROFILE).ok).toBe(true);
    const sampled = checkEquivalence(build, spec, DEFAULT_PROFILE, { maxExhaustiveInputs: 2, samples: 4 });
    expect(sampled).toMatchObject({ ok: true, inputs: 'sampled' });
    expect(sampled.summary).toContain('a test, not a proof');
  });

  it('reads outputs shown by actuators', () => {
    const { build, spec } = exampleBuild('marble-bell', { actuators: { bell: 200 } });
    expect(build.netlist.parts.some((p) => p.kind === 'actuator')).toBe(true);
    expect(checkEquivalence(build, spec, DEFAULT_PROFILE).ok).toBe(true);
  });

  // Invariant: every synthesised build of a random machine behaves as the machine.
  it('holds for synthesised builds of random machines', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 2, max: 5 }),
        fc.integer({ min: 0, max: 2 }),
        fc.integer({ min: 1, max: 1000 }),
        (states, inputs, seed) => {
          const f = randomFlatMachine(states, inputs, 2, seed);
          const bits = Math.ceil(Math.log2(states));
          const codes = f.states.map((_, i) => i.toString(2).padStart(bits, '0'));
          const b = synthesise(f, { strategy: 'binary', bits, codes }, { profile: DEFAULT_PROFILE });
          const r = checkEquivalence(b, {}, DEFAULT_PROFILE);
          return r.ok;
        },
      ),
      { seed: 42, numRuns: 12 },
    );
  });
});
