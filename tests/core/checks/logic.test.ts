import { describe, expect, it } from 'vitest';
import { coverHolds, intersect, subtract } from '../../../src/core/model/cube.js';
import { DONT_CARE } from '../../../src/core/model/flat.js';
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

  // The check meets each state's cubes only with the terms that agree with its code; the
  // reference below meets them with every term (the cube calculus of the module comment).
  it('next-state-equivalence finds what meeting every term finds, for equations with a term dropped or added', () => {
    const machines = ['lion', 'bbtas', 'dk27', 'mc'].map((n) => {
      const f = fixture(n);
      return synthesise(f, binaryEncoding(f), { profile: DEFAULT_PROFILE });
    });
    for (const b of machines)
      b.equations.forEach((e, k) => {
        const dropped = withEquation(b, e.name, e.terms.slice(1));
        const extra = withEquation(b, e.name, [...e.terms, '-'.repeat(b.vars.length)]);
        const moved = withEquation(
          b,
          e.name,
          e.terms.map((t, i) => (i === 0 ? t.replace('1', '0') : t)),
        );
        for (const x of [dropped, extra, moved])
          expect(checkNextStateEquivalence(x), `${b.machine.name ?? ''} equation ${k}`).toEqual(
            nextStateByEveryTerm(x),
          );
      });
  });
});

/** The next-state check with every term of every equation, as written before terms were picked by code. */
function nextStateByEveryTerm(build: Build): ReturnType<typeof checkNextStateEquivalence> {
  const f = build.machine;
  const { bits, codes } = build.encoding;
  const eq = build.equations;
  const point = (c: string): string => c.replaceAll('-', '0');
  const meet = (x: string, cover: readonly string[]): string | null => {
    for (const c of cover) {
      const y = intersect(x, c);
      if (y !== null) return point(y);
    }
    return null;
  };
  const miss = (x: string, cover: readonly string[]): string | null => {
    const rest = subtract([x], cover);
    return rest.length === 0 ? null : point(rest[0]);
  };
  let cells = 0;
  const fail = (s: number, at: string, what: string, expected: number, got: number | 'forbidden') => ({
    name: 'next-state-equivalence' as const,
    ok: false,
    summary: `in state ${f.states[s]} with inputs ${at.slice(bits) || '(none)'}: ${what} should be ${expected}, the build gives ${got}`,
    cellsChecked: cells,
    counterexample: { state: f.states[s], code: codes[s], inputs: at.slice(bits), what, expected, got },
  });
  for (let s = 0; s < f.states.length; s++)
    for (const row of f.rows[s]) {
      cells++;
      const x = codes[s] + row.cube;
      if (row.next !== DONT_CARE)
        for (let j = 0; j < bits; j++) {
          const set = eq[2 * j].terms;
          const reset = eq[2 * j + 1].terms;
          const want = codes[row.next][j] === '1' ? 1 : 0;
          const bad =
            meet(x, want === 1 ? reset : set) ??
            (codes[s][j] === codes[row.next][j] ? null : miss(x, want === 1 ? set : reset));
          if (bad !== null) {
            const [hs, hr] = [coverHolds(set, bad), coverHolds(reset, bad)];
            return fail(s, bad, `next q${j}`, want, hs && hr ? 'forbidden' : hs ? 1 : hr ? 0 : bad[j] === '1' ? 1 : 0);
          }
        }
      for (let k = 0; k < f.outputs.length; k++) {
        const v = row.out[k];
        if (v === '-') continue;
        const bad = v === 1 ? miss(x, eq[2 * bits + k].terms) : meet(x, eq[2 * bits + k].terms);
        if (bad !== null) return fail(s, bad, `output ${f.outputs[k]}`, v, v === 1 ? 0 : 1);
      }
    }
  return {
    name: 'next-state-equivalence',
    ok: true,
    summary: `next codes and outputs match the specification in all ${f.states.length} states (${cells} input cubes)`,
    cellsChecked: cells,
  };
}
