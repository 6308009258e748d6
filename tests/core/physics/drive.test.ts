import { describe, expect, it } from 'vitest';
import { capstanGain } from '../../../src/core/physics/capstan.js';
import { driveBudget } from '../../../src/core/physics/drive.js';
import { DEFAULT_PROFILE, type Profile } from '../../../src/core/physics/profile.js';
import { actuator, cord, fanOut, gate, lever } from './netlists.js';

const P = DEFAULT_PROFILE;
const budgetOf = (n: Parameters<typeof driveBudget>[0], id: string, p: Profile = P) => {
  const b = driveBudget(n, p).find((x) => x.driver === id);
  if (!b) throw new Error(`no budget for ${id}`);
  return b;
};

describe('core/physics/drive', () => {
  it('passes a gate capstan driving ten one-port gates with margin ≥ 2 (design §4: 15 g ports, fan-out ≈ 10, common practice)', () => {
    const b = budgetOf(fanOut(10, 1, 'gate'), 'd');
    expect(b.loadG).toBe(150);
    expect(b.margin).toBeCloseTo((15 * Math.exp(Math.PI)) / 150, 9); // ≈ 2.31
    expect(b.margin).toBeGreaterThanOrEqual(2);
    expect(b.ok).toBe(true);
    expect(b.message).toBeUndefined();
  });

  it('falls below margin 2 exactly at the fan-out the closed form predicts', () => {
    // Largest n with 15·e^(μθ) / (n·15) ≥ 2, from the capstan equation: floor(e^π / 2) = 11.
    const nMax = Math.floor((P.zWeightG * capstanGain(P.mu, P.wraps)) / (P.minMargin * P.zWeightG));
    expect(nMax).toBe(11);
    expect(budgetOf(fanOut(nMax, 1, 'gate'), 'd').ok).toBe(true);
    const over = budgetOf(fanOut(nMax + 1, 1, 'gate'), 'd');
    expect(over.ok).toBe(false);
    expect(over.margin).toBeLessThan(2);
  });

  it('charges a port of a multi-port gate its own weight plus the Z weight it drags down', () => {
    const b = budgetOf(fanOut(3, 2), 'L');
    expect(b.branches.map((x) => x.baseG)).toEqual([30, 30, 30]);
    expect(b.loadG).toBe(90);
  });

  it('sizes each cord on a shared port as if it pulled alone', () => {
    const n = {
      parts: [lever('A'), lever('B'), gate('g', 2, 'term')],
      cords: [cord('cA', 'A', ['g.a']), cord('cB', 'B', ['g.a'])],
    };
    expect(budgetOf(n, 'A').loadG).toBe(30);
    expect(budgetOf(n, 'B').loadG).toBe(30);
  });

  it('holds a lever capstan by the lever pull-up weight', () => {
    const b = budgetOf(fanOut(1), 'L', { ...P, leverWeightG: 30 });
    expect(b.driverKind).toBe('lever');
    expect(b.holdG).toBe(30);
    expect(b.availableG).toBeCloseTo(30 * Math.exp(Math.PI), 9);
  });

  it('adds actuator loads and the routing loss of every branch, with per-cord overrides', () => {
    const n = { parts: [lever('L'), gate('g', 1), actuator('bell', 100)], cords: [cord('c', 'L', ['g.a'], ['bell'])] };
    const p: Profile = { ...P, cordRouting: { c: { pinAngleRad: Math.PI, muPin: 0.2 } } };
    const f = Math.exp(0.2 * Math.PI);
    const b = budgetOf(n, 'L', p);
    expect(b.branches.map((x) => [x.target, x.kind])).toEqual([
      ['g.a', 'port'],
      ['bell', 'actuator'],
    ]);
    expect(b.loadG).toBeCloseTo(115 * f, 9);
    expect(b.loadN).toBeCloseTo((115 * f * 9.80665) / 1000, 9);
  });

  it('sums every cord of a driver and names the heaviest one', () => {
    const n = {
      parts: [lever('L'), gate('g1', 1), gate('g2', 2, 'term'), gate('g3', 2, 'term')],
      cords: [cord('light', 'L', ['g1.a']), cord('heavy', 'L', ['g2.a', 'g3.a'])],
    };
    const b = budgetOf(n, 'L');
    expect(b.cords).toEqual(['light', 'heavy']);
    expect(b.loadG).toBe(75);
    expect(b.weakestCord).toBe('heavy');
  });

  it('names the cord, its loads per port and three working fixes when the margin fails', () => {
    const n = fanOut(14, 1);
    const b = budgetOf(n, 'L');
    expect(b.ok).toBe(false);
    expect(b.message).toContain("cord 'c.L'");
    expect(b.message).toContain('g1.a 15 g');
    expect(b.message).toContain('210 g');
    expect(b.fixes).toHaveLength(3);
    expect(b.fixes?.[0]).toMatch(/fewer branches: this capstan carries about 11 .*buffer tree/);
    // The wraps and weight the fixes name do make the budget pass.
    const turns = Number(/more wraps: ([\d.]+) turns/.exec(b.fixes?.[1] ?? '')?.[1]);
    expect(turns).toBeGreaterThan(2);
    expect(budgetOf(n, 'L', { ...P, wraps: turns }).ok).toBe(true);
    expect(budgetOf(n, 'L', { ...P, wraps: turns - 0.25 }).ok).toBe(false);
    const grams = Number(/lever pull-up weight: (\d+) g/.exec(b.fixes?.[2] ?? '')?.[1]);
    expect(budgetOf(n, 'L', { ...P, leverWeightG: grams }).ok).toBe(true);
    expect(budgetOf(n, 'L', { ...P, leverWeightG: grams - 1 }).ok).toBe(false);
  });

  it('gives no budget to a part without an output cord, and lists drivers in part order', () => {
    const n = fanOut(2, 2);
    expect(driveBudget(n, P).map((b) => b.driver)).toEqual(['L', 'K']);
  });
});
