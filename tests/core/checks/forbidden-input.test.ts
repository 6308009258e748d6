import { describe, expect, it } from 'vitest';
import { checkForbiddenInput } from '../../../src/core/checks/forbidden-input.js';
import type { Build } from '../../../src/core/model/build.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { counterMachine, handBuild, toggleBuild } from '../sim/handmade.js';
import { brokenBuild, exampleBuild, exampleNames } from './builds.js';

/** Remove every cord into gate `id` except the φ1 lever's: its guard literals are gone. */
function stripLiterals(b: Build, id: string): Build {
  const cords = b.netlist.cords
    .map((c) => (c.driver === b.signals.phi1 ? c : { ...c, ports: c.ports.filter((p) => p.part !== id) }))
    .filter((c) => c.ports.length > 0 || c.actuators.length > 0);
  return { ...b, netlist: { ...b.netlist, cords } };
}

describe('core/checks/forbidden-input', () => {
  it('proves the toggle over every code, master code and input', () => {
    const r = checkForbiddenInput(toggleBuild(), DEFAULT_PROFILE);
    expect(r).toMatchObject({
      name: 'forbidden-input',
      level: 'part',
      ok: true,
      states: 8,
      codes: 'all',
      masters: 'free',
      inputs: 'exhaustive',
    });
  });

  it('names, for each operating rule, the shortest violation and the latch it upsets', () => {
    const r = checkForbiddenInput(toggleBuild(), DEFAULT_PROFILE);
    const byRule = Object.fromEntries(r.rules.map((v) => [v.rule, v]));
    expect(byRule['reset-alone'].trace).toEqual(["1. pull input lever 't'", '2. pull φ1', '3. pull reset']);
    expect(byRule['reset-alone'].upsets).toEqual(['M0']);
    expect(byRule['reset-alone'].words).toBe(
      "reset is pulled only with both clock levers released: breaking it (pull input lever 't', pull φ1, pull reset) upsets latch M0: latch M0 sees the forbidden input: S̄ and R̄ are pulled at once",
    );
    // φ1 and φ2 together: the master passes straight through to the slave, whose change turns the
    // reset term on while the set term still holds: M0 sees both.
    expect(byRule['clocks-apart'].trace).toEqual(["1. pull input lever 't'", '2. pull φ1', '3. pull φ2']);
    expect(byRule['clocks-apart'].upsets).toContain('M0');
    // The toggle reads its input with one polarity per term, so no input change under φ1 upsets it.
    expect(byRule['inputs-steady'].upsets).toEqual([]);
    expect(byRule['inputs-steady'].trace).toEqual(['1. pull φ1', "2. pull input lever 't'"]);
    expect(byRule['inputs-steady'].words).toMatch(/no way of breaking it upsets a latch within 8 hand actions/);
  });

  it('catches a removed guard literal with the code, inputs and latch', () => {
    const r = checkForbiddenInput(brokenBuild('counter-unguarded'), DEFAULT_PROFILE);
    expect(r.ok).toBe(false);
    expect(r.counterexample).toMatchObject({ code: '01', masterCode: '01', inputs: '1', latch: 'M0' });
    expect(r.summary).toBe(
      'with the slaves at code 01 and inputs go=1: latch M0 sees the forbidden input: S̄ and R̄ are pulled at once',
    );
    expect(r.counterexample?.trace).toEqual([
      "1. pull input lever 'go'",
      '2. pull φ1',
      '3. release φ1',
      '4. pull φ2',
      '5. release φ2',
    ]);
  });

  it('tries the input combinations the spec declares impossible', () => {
    // The unguarded counter, where go is declared never to be pulled: the overlap lies only there.
    const m = counterMachine();
    const quiet = { ...m, never: ['1'], rows: m.rows.map((rs) => rs.filter((r) => r.cube === '0')) };
    const b = handBuild({
      machine: quiet,
      codes: ['00', '01', '10'],
      equations: brokenBuild('counter-unguarded').equations,
    });
    const r = checkForbiddenInput(b, DEFAULT_PROFILE);
    expect(r.ok).toBe(false);
    expect(r.counterexample?.inputs).toBe('1');
  });

  it('reports the release race of a latch whose set and reset both fire on φ1', () => {
    const r = checkForbiddenInput(brokenBuild('toggle-release-race'), DEFAULT_PROFILE);
    expect(r.ok).toBe(false);
    expect(r.counterexample?.latch).toBe('M0');
  });

  it.each(exampleNames())('proves the example %s', (name) => {
    const r = checkForbiddenInput(exampleBuild(name).build, DEFAULT_PROFILE);
    expect(r.ok).toBe(true);
  });

  it('catches a real build whose reset term lost its guard literals', () => {
    const { build } = exampleBuild('marble-bell');
    const master = build.netlist.parts.find((p) => p.kind === 'latch' && p.role === 'master' && p.bit === 0);
    if (master?.kind !== 'latch') throw new Error('no master latch');
    // The term gates whose cords reach the master's reset side.
    const terms = build.netlist.cords
      .filter((c) => c.ports.some((p) => p.part === master.resetGate) && c.driver !== master.setGate)
      .map((c) => c.driver)
      .filter((d) => build.netlist.parts.some((p) => p.id === d && p.kind === 'gate' && p.role === 'term'));
    expect(terms.length).toBeGreaterThan(0);
    const r = checkForbiddenInput(stripLiterals(build, terms[0]), DEFAULT_PROFILE);
    expect(r.ok).toBe(false);
    expect(r.summary).toMatch(/sees the forbidden input/);
  });

  it('samples codes beyond its bound and says so', () => {
    const { build } = exampleBuild('crossing', { encoding: 'one-hot' });
    const r = checkForbiddenInput(build, DEFAULT_PROFILE, { maxClocks: 64 });
    expect(r).toMatchObject({ ok: true, codes: 'sampled', masters: 'equal to slaves' });
    expect(r.states).toBeLessThanOrEqual(64);
  });
});
