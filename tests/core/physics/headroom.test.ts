import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { muNeeded, wrapsNeeded } from '../../../src/core/physics/capstan.js';
import { driveBudget } from '../../../src/core/physics/drive.js';
import { frictionHeadroom, headroomWords } from '../../../src/core/physics/headroom.js';
import { checkDrive } from '../../../src/core/physics/check-drive.js';
import { DEFAULT_PROFILE, type Profile } from '../../../src/core/physics/profile.js';
import type { Netlist } from '../../../src/core/model/netlist.js';
import { actuator, cord, fanOut, gate, lever } from './netlists.js';

const P = DEFAULT_PROFILE;

/** One gate capstan `d` (one-port, held by Z) wrapped `wraps` turns, pulling an actuator of `loadG`. */
function single(loadG: number, wraps?: number): Netlist {
  const d = { ...gate('d', 1, 'output'), ...(wraps !== undefined ? { wraps } : {}) };
  return {
    parts: [lever('L'), d, actuator('act.bell', loadG)],
    cords: [cord('c.L', 'L', ['d.a']), cord('c.d', 'd', [], ['act.bell'])],
  };
}

const headroomOf = (n: Netlist, p: Profile = P) => frictionHeadroom(n, driveBudget(n, p), p);

describe('core/physics/headroom', () => {
  // The capstan equation (Euler–Eytelwein), T_load = T_hold·e^(μθ), solved for μ: a capstan
  // holds load L with margin m while μ ≥ ln(m·L / T_hold) / θ (J. L. Meriam & L. G. Kraige,
  // Engineering Mechanics: Statics, flexible belts — from memory; the closed form is arithmetic).
  it.each([
    [120, 2],
    [300, 2.5],
    [450, 2.75],
    [1000, 3.5],
    [40, 1],
  ])('gives μ_min = ln(L / T_hold) / θ for one capstan: %d g on %d turns', (loadG, wraps) => {
    const n = single(loadG, wraps);
    const h = headroomOf(n);
    const theta = 2 * Math.PI * wraps;
    // The lever's capstan carries one port (15 g) and is never the first to slip here.
    expect(h.muMin).toBeCloseTo(Math.log(loadG / 15) / theta, 12);
    expect(h.muAtMinMargin).toBeCloseTo(Math.log((2 * loadG) / 15) / theta, 12);
    expect(h.firstToSlip).toBe('c.d');
    // At μ = μ_min the budget's own margin is exactly 1; at μ_atMinMargin exactly 2.
    const at = (mu: number) => driveBudget(n, { ...P, mu }).find((b) => b.driver === 'd')?.margin;
    expect(at(h.muMin ?? 0)).toBeCloseTo(1, 9);
    expect(at(h.muAtMinMargin ?? 0)).toBeCloseTo(2, 9);
  });

  it('takes the largest μ over every capstan, with routing losses charged as they are', () => {
    // A lever pulling 14 one-port gates (210 g) and, beside it, the one-capstan case above.
    const n = fanOut(14, 1);
    const h = headroomOf(n);
    expect(h.muMin).toBeCloseTo(Math.log(210 / 15) / (4 * Math.PI), 12);
    const routed: Profile = { ...P, cordRouting: { 'c.L': { pulleys: 2, pulleyEfficiency: 0.9 } } };
    expect(headroomOf(n, routed).muMin).toBeCloseTo(Math.log(210 / 0.81 / 15) / (4 * Math.PI), 12);
  });

  it('is 0 when the hold tension alone carries every load, and null with no load at all', () => {
    expect(headroomOf(single(10)).muMin).toBe(0);
    const idle: Netlist = { parts: [lever('L')], cords: [] };
    expect(headroomOf(idle)).toMatchObject({ muMin: null, muAtMinMargin: null, outputs: {} });
    expect(headroomWords(headroomOf(idle), P)).toBe('no capstan carries a load');
  });

  it('gives each actuator the most it could lift at the design margin: T_hold·e^(μθ) / m, less the other branches', () => {
    const h = headroomOf(single(300, 2.5));
    // 15 g · e^(0.25·2π·2.5) = 761.3 g; at margin 2: 380.6 g.
    expect(h.outputs['act.bell'].maxLoadG).toBe(Math.floor(((15 * Math.exp(0.25 * 2 * Math.PI * 2.5)) / 2) * 10) / 10);
    expect(h.outputs['act.bell'].maxLoadG).toBe(380.6);
    expect(h.outputs['act.bell'].loadG).toBe(300);
    expect(h.outputs['act.bell'].margin).toBeCloseTo((15 * Math.exp(0.25 * 2 * Math.PI * 2.5)) / 300, 9);
    // Sharing the capstan with a one-port gate leaves 15 g less for the load.
    const shared: Netlist = {
      parts: [lever('L'), gate('d', 1, 'output'), gate('g', 1), actuator('act.bell', 100)],
      cords: [cord('c.L', 'L', ['d.a']), cord('c.d', 'd', ['g.a'], ['act.bell'])],
    };
    expect(headroomOf(shared).outputs['act.bell'].maxLoadG).toBe(
      Math.floor(((15 * Math.exp(Math.PI)) / 2 - 15) * 10) / 10,
    );
  });

  it('orders μ_min ≤ μ_atMinMargin ≤ μ for a capstan given the turns its load needs (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 3000, noNaN: true }), (load) => {
        const n = single(load, wrapsNeeded(load, 15, 0.25, 2, 2));
        const h = headroomOf(n);
        if (h.muMin === null || h.muAtMinMargin === null) return false;
        return checkDrive(n, P, []).ok && h.muMin <= h.muAtMinMargin && h.muAtMinMargin <= P.mu + 1e-12;
      }),
      { seed: 7, numRuns: 200 },
    );
  });

  it('carries the figures in the drive check, and its summary says them', () => {
    const c = checkDrive(single(300, 2.5), P, []);
    expect(c.muMin).toBeCloseTo(Math.log(20) / (5 * Math.PI), 12);
    expect(c.muAtMinMargin).toBeCloseTo(Math.log(40) / (5 * Math.PI), 12);
    expect(c.outputs).toEqual({ 'act.bell': { loadG: 300, maxLoadG: 380.6, margin: c.drivers[1].margin } });
    expect(c.summary).toContain(`every capstan holds down to μ = ${(Math.log(20) / (5 * Math.PI)).toFixed(3)}`);
    expect(c.summary).toContain("output 'act.bell' lifts 300 g, at most 380 g at margin 2");
  });

  it('agrees with muNeeded and wrapsNeeded, the two closed forms in capstan.ts', () => {
    // ln(2·450/15) / (2π·0.25) = 2.607 turns → 2.75 in quarter turns; μ for those at margin 1.
    expect(wrapsNeeded(450, 15, 0.25, 2, 2)).toBe(2.75);
    expect(wrapsNeeded(100, 15, 0.25, 2, 2)).toBe(2);
    expect(muNeeded(450, 15, 2.75)).toBeCloseTo(Math.log(30) / (5.5 * Math.PI), 12);
  });
});
