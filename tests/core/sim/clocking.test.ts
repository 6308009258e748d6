import { describe, expect, it } from 'vitest';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { CLOCK_PHASES, clockFrom, forEachHeld, PHASE_WORDS } from '../../../src/core/sim/clocking.js';
import { phaseActions } from '../../../src/core/sim/hand.js';
import { simFor, stateAtCode, timingOf } from '../../../src/core/sim/part.js';
import { toggleBuild } from './handmade.js';

describe('core/sim/clocking', () => {
  it("names the moments of one clock in the hand procedure's order (DESIGN §5: inputs, φ1, release, φ2, release)", () => {
    expect(CLOCK_PHASES.map((p) => p.phase)).toEqual([
      'inputs-held',
      'phi1-pulled',
      'phi1-released',
      'phi2-pulled',
      'phi2-released',
    ]);
    expect(CLOCK_PHASES[0].action).toBeUndefined();
    expect(CLOCK_PHASES.slice(1).map((p) => p.action)).toEqual(phaseActions());
    expect(Object.keys(PHASE_WORDS).sort()).toEqual(CLOCK_PHASES.map((p) => p.phase).sort());
  });

  it('runs one clock of the toggle as a T flip-flop does: Q⁺ = T ⊕ Q (Mano & Ciletti, Digital Design, T flip-flop table)', () => {
    const b = toggleBuild();
    const sim = simFor(b, timingOf(DEFAULT_PROFILE));
    for (const q of ['0', '1'])
      for (const t of ['0', '1']) {
        const held = stateAtCode(sim, q, t).values;
        const before = held.slice();
        const c = clockFrom(sim, held);
        expect(c.code, `Q=${q} T=${t}`).toBe(String(Number(q) ^ Number(t)));
        expect(c.outputs).toEqual([Number(q)]); // Moore output `lit` shows the state before the clock
        expect(c.alarms).toEqual([]);
        expect(held).toEqual(before); // the held state is not modified
      }
  });

  it('holds each combination in turn from a base it leaves alone, and stops when told', () => {
    const b = toggleBuild();
    const sim = simFor(b, timingOf(DEFAULT_PROFILE));
    const base = stateAtCode(sim, '0').values;
    const copy = base.slice();
    const seen: string[] = [];
    forEachHeld(sim, base, ['1', '0', '1'], (held, a) => {
      seen.push(a);
      expect(held[sim.inputLevers[0]]).toBe(a === '1' ? 1 : 0);
      return seen.length < 2;
    });
    expect(seen).toEqual(['1', '0']);
    expect(base).toEqual(copy);
  });
});
