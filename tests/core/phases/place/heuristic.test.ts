/**
 * The heuristic path of the place phase (spectral start, seeded local search) against the
 * exact optimum on random builds too small to need it.
 */
import { describe, expect, it } from 'vitest';
import { place } from '../../../../src/core/phases/place/index.js';
import { improve } from '../../../../src/core/phases/place/improve.js';
import { fillOrder } from '../../../../src/core/phases/place/order.js';
import {
  arrangementCost,
  isFeasible,
  type ArrangeProblem,
  type ArrangeUnit,
} from '../../../../src/core/phases/place/problem.js';
import { seededRandom } from '../../../../src/core/model/random.js';
import { DEFAULT_PROFILE, type Profile } from '../../../../src/core/physics/profile.js';
import { netlistOrderChannel, randomNetlist } from './support.js';

const ONE_DRUM: Profile = { ...DEFAULT_PROFILE, frame: { ...DEFAULT_PROFILE.frame, longestDrumM: 100 } };

describe('core/phases/place heuristic', () => {
  // The exact optimum comes from the subset dynamic programme, itself checked against brute force (exact.test.ts).
  it('is within 10 % of the exact optimum on random builds of 10–14 bays, and never worse than the netlist order', () => {
    const ratios: number[] = [];
    for (let k = 0; k < 40; k++) {
      const n = randomNetlist(9001 + 37 * k, 10 + (k % 5));
      const exact = place(n, ONE_DRUM, { seed: 5, exactLimit: 2 ** 20 });
      const heuristic = place(n, ONE_DRUM, { seed: 5, exactLimit: 0 });
      expect(exact.exact).toBe(true);
      expect(heuristic.exact).toBe(false);
      expect(heuristic.channelM).toBeGreaterThanOrEqual(exact.channelM - 1e-9);
      expect(heuristic.channelM).toBeLessThanOrEqual(1.1 * exact.channelM + 1e-9);
      // The netlist's own order measured by the test's own brute-force helper, not by the module.
      expect(heuristic.channelM).toBeLessThanOrEqual(netlistOrderChannel(n, ONE_DRUM) + 1e-9);
      expect(heuristic.baselineChannelM).toBeCloseTo(netlistOrderChannel(n, ONE_DRUM), 9);
      if (exact.channelM > 0) ratios.push(heuristic.channelM / exact.channelM);
    }
    expect(ratios.length).toBeGreaterThan(30);
  });

  it('gives the same placement for the same seed', () => {
    const n = randomNetlist(77, 14);
    const a = place(n, ONE_DRUM, { seed: 9, exactLimit: 0 });
    const b = place(n, ONE_DRUM, { seed: 9, exactLimit: 0 });
    expect(b.bays).toEqual(a.bays);
    expect(b.totalCordM).toBe(a.totalCordM);
  });
});

describe('core/phases/place/improve', () => {
  const problem = (seed: number): ArrangeProblem => {
    const rng = seededRandom(seed);
    const n = 30;
    const units = Array.from({ length: n }, (_, i): ArrangeUnit => ({
      bays: i % 5 === 0 ? [2 * i, 2 * i + 1] : [2 * i],
      flippable: i % 5 === 0,
      zone: i < 3 ? 0 : i > n - 3 ? 2 : 1,
    }));
    const bays = units.flatMap((u) => u.bays);
    const widthOf = new Map(bays.map((b) => [b, 0.03 + 0.06 * rng.next()]));
    const local = new Map(bays.map((b, i) => [b, i]));
    const re = units.map((u): ArrangeUnit => ({ ...u, bays: u.bays.map((b) => local.get(b) as number) }));
    const nb = bays.length;
    // Cords of one to three branches: a capstan (d = 0) and levers beside their gates' centres.
    const nets = Array.from({ length: 60 }, () => {
      const a = rng.int(nb);
      const targets = Array.from({ length: 1 + rng.int(3) }, () => ({ bay: (a + 1 + rng.int(nb - 1)) % nb, d: 0.01 }));
      return { pins: [{ bay: a, d: 0 }, ...targets], w: 1 };
    });
    return {
      units: re,
      bayWidthM: bays.map((b) => widthOf.get(b) as number),
      nets,
      pins: new Map([[5, 7]]),
    };
  };

  it('keeps the end rules and the pins, and never ends worse than it starts', () => {
    for (let s = 1; s <= 5; s++) {
      const p = problem(s);
      const start = fillOrder(
        p,
        p.units.map((_, i) => i),
      );
      expect(start && isFeasible(p, start)).toBe(true);
      if (!start) continue;
      const out = improve(p, start, seededRandom(s));
      expect(isFeasible(p, out)).toBe(true);
      expect(arrangementCost(p, out)).toBeLessThanOrEqual(arrangementCost(p, start) + 1e-12);
      expect(arrangementCost(p, out)).toBeLessThan(arrangementCost(p, start));
    }
  });

  it('is deterministic for a given generator seed', () => {
    const p = problem(3);
    const start = fillOrder(
      p,
      p.units.map((_, i) => i),
    );
    if (!start) throw new Error('no start');
    expect(improve(p, start, seededRandom(11))).toEqual(improve(p, start, seededRandom(11)));
  });
});
