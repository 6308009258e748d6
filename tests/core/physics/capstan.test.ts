import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  availableTension,
  capstanGain,
  gramsToNewtons,
  routingFactor,
  routingFor,
  STANDARD_GRAVITY,
} from '../../../src/core/physics/capstan.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';

describe('core/physics/capstan', () => {
  // Capstan (belt-friction) equation T_load = T_hold·e^(μθ): J. L. Meriam & L. G. Kraige,
  // Engineering Mechanics: Statics, section on flexible belts (from memory).
  it('gives e^π ≈ 23.14 for μ = 0.25 and two wraps (closed form, θ = 4π)', () => {
    expect(capstanGain(0.25, 2)).toBeCloseTo(Math.exp(Math.PI), 12);
    expect(capstanGain(0.25, 2)).toBeCloseTo(23.1407, 4);
  });

  it('gives a gain between 20 and 30 for μ between 0.24 and 0.27 with two wraps (common practice)', () => {
    for (const mu of [0.24, 0.25, 0.26, 0.27]) {
      const g = capstanGain(mu, 2);
      expect(g).toBeGreaterThan(20);
      expect(g).toBeLessThan(30);
    }
  });

  it('multiplies over wraps: wrapping a + b turns equals a turns then b turns (property of e^(μθ))', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.01, max: 1.5, noNaN: true }),
        fc.double({ min: 0.1, max: 4, noNaN: true }),
        fc.double({ min: 0.1, max: 4, noNaN: true }),
        (mu, a, b) => {
          const lhs = capstanGain(mu, a + b);
          const rhs = capstanGain(mu, a) * capstanGain(mu, b);
          return Math.abs(lhs - rhs) <= 1e-9 * rhs;
        },
      ),
      { seed: 42, numRuns: 200 },
    );
  });

  it('gives 15 g × e^π ≈ 347 g available with the default profile (design §4: "15 g × 23 ≈ 350 g", common practice)', () => {
    const t = availableTension(DEFAULT_PROFILE);
    expect(t.holdG).toBe(15);
    expect(t.availableG).toBeCloseTo(15 * Math.exp(Math.PI), 9);
    expect(t.availableG).toBeGreaterThan(340);
    expect(t.availableG).toBeLessThan(360);
    // Standard gravity 9.80665 m/s² (3rd CGPM, 1901): 347.11 g ≈ 3.404 N.
    expect(t.availableN).toBeCloseTo(3.404, 3);
    expect(t.holdN).toBeCloseTo(0.015 * 9.80665, 12);
  });

  it('scales the hold weight by the lever ratio', () => {
    const t = availableTension({ ...DEFAULT_PROFILE, leverRatio: 2 }, 10);
    expect(t.holdG).toBe(20);
    expect(t.availableG).toBeCloseTo(20 * Math.exp(Math.PI), 9);
  });

  it('converts grams-force to newtons with standard gravity', () => {
    expect(STANDARD_GRAVITY).toBe(9.80665);
    expect(gramsToNewtons(1000)).toBeCloseTo(9.80665, 12);
  });

  it('charges e^(μ_pin·α) per pin redirection and 1/η per pulley', () => {
    const r = { pinAngleRad: Math.PI / 2, muPin: 0.2, pulleys: 2, pulleyEfficiency: 0.9 };
    // e^(0.2·π/2) = e^(0.1π) ≈ 1.3691; (1/0.9)² ≈ 1.2346.
    expect(routingFactor(r)).toBeCloseTo(1.369108 * (1 / 0.81), 5);
    expect(routingFactor(DEFAULT_PROFILE.routing)).toBe(1);
  });

  it('merges a per-cord override over the default routing', () => {
    const p = { ...DEFAULT_PROFILE, cordRouting: { c7: { pulleys: 1 } } };
    expect(routingFor(p, 'c7')).toEqual({ ...DEFAULT_PROFILE.routing, pulleys: 1 });
    expect(routingFor(p, 'c8')).toEqual(DEFAULT_PROFILE.routing);
  });
});
