import { describe, expect, it } from 'vitest';
import { coverHolds } from '../../../src/core/model/cube.js';
import type { Build, Equation } from '../../../src/core/model/build.js';
import type { Netlist } from '../../../src/core/model/netlist.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { synthesise } from '../../../src/core/synthesise.js';
import { checkForbiddenInput, checkNextStateEquivalence } from '../../../src/core/checks/logic.js';
import { binaryEncoding, fixture } from '../support/synthesis.js';

const lion = fixture('lion');
const good = synthesise(lion, binaryEncoding(lion), { profile: DEFAULT_PROFILE });

function withEquation(b: Build, name: string, terms: string[]): Build {
  const equations: Equation[] = b.equations.map((e) => (e.name === name ? { name, terms } : e));
  return { ...b, equations };
}

function withNetlist(b: Build, edit: (n: Netlist) => Netlist): Build {
  return { ...b, netlist: edit(b.netlist) };
}

describe('core/checks/logic', () => {
  it('passes a sound build', () => {
    const f = checkForbiddenInput(good);
    expect(f).toMatchObject({ name: 'forbidden-input', ok: true, latchesChecked: 4 });
    expect(checkNextStateEquivalence(good)).toMatchObject({ name: 'next-state-equivalence', ok: true });
  });

  it('looks through buffer trees when it confirms the slave wiring', () => {
    const dk27 = fixture('dk27');
    const n = dk27.states.length;
    const oneHot = {
      strategy: 'one-hot',
      bits: n,
      codes: dk27.states.map((_, i) => '0'.repeat(i) + '1' + '0'.repeat(n - i - 1)),
    };
    const b = synthesise(dk27, oneHot, { profile: DEFAULT_PROFILE });
    // 7 bits: φ2 feeds 14 transfer gates, past the fan-out of 10, so it is buffered.
    expect(b.netlist.parts.some((p) => p.id.startsWith('clk.phi2.buf'))).toBe(true);
    expect(checkForbiddenInput(b)).toMatchObject({ ok: true, latchesChecked: 14 });
    expect(checkNextStateEquivalence(b).ok).toBe(true);
  });

  it('forbidden-input finds a point where S and R are both 1', () => {
    const s0 = good.equations[0].terms,
      r0 = good.equations[1].terms;
    const bad = withEquation(good, 'S0', [...s0, ...r0]);
    const r = checkForbiddenInput(bad);
    expect(r.ok).toBe(false);
    const cx = r.counterexample as { latch: string; code: string; inputs: string };
    expect(cx.latch).toBe('m0');
    const point = cx.code + cx.inputs;
    expect(coverHolds(bad.equations[0].terms, point) && coverHolds(bad.equations[1].terms, point)).toBe(true);
  });

  it('forbidden-input notices a slave wired without its transfer gate or with reset on both sides', () => {
    const noPhi2 = withNetlist(good, (n) => ({
      ...n,
      cords: n.cords.map((c) =>
        c.driver === 'clk.phi2' ? { ...c, ports: c.ports.filter((p) => p.part !== 'tr1.set') } : c,
      ),
    }));
    expect(checkForbiddenInput(noPhi2)).toMatchObject({ ok: false, counterexample: { latch: 's1' } });
    const bothSides = withNetlist(good, (n) => ({
      ...n,
      parts: n.parts.map((p) =>
        p.id === 'm0.set' && p.kind === 'gate'
          ? { ...p, ports: [...p.ports, { name: 'x1' }] }
          : p.id === 'm0.reset' && p.kind === 'gate'
            ? { ...p, ports: [...p.ports, { name: 'x1' }] }
            : p,
      ),
      cords: n.cords.map((c) =>
        c.driver === 'rst.drv'
          ? { ...c, ports: [...c.ports, { part: 'm0.set', port: 'x1' }, { part: 'm0.reset', port: 'x1' }] }
          : c,
      ),
    }));
    expect(checkForbiddenInput(bothSides).ok).toBe(false);
  });

  it('next-state-equivalence gives a real counterexample for a missing set term', () => {
    const bad = withEquation(good, 'S1', []);
    const r = checkNextStateEquivalence(bad);
    expect(r.ok).toBe(false);
    const cx = r.counterexample as {
      state: string;
      code: string;
      inputs: string;
      what: string;
      expected: number;
      got: number;
    };
    expect(cx.what).toBe('next q1');
    expect(cx.expected).toBe(1);
    expect(cx.got).toBe(0);
    // The spec really goes to a code with bit 1 set from there.
    const s = lion.states.indexOf(cx.state);
    const row = lion.rows[s].find((rw) => coverHolds([rw.cube], cx.inputs));
    expect(good.encoding.codes[row?.next ?? 0][1]).toBe('1');
  });

  it('next-state-equivalence catches a wrong output and names it', () => {
    const bad = withEquation(good, 'z1', []);
    const r = checkNextStateEquivalence(bad);
    expect(r).toMatchObject({ ok: false, counterexample: { what: 'output z1', expected: 1, got: 0 } });
  });
});
