import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { arrangeExact, exactStates } from '../../../../src/core/phases/place/exact.js';
import { place } from '../../../../src/core/phases/place/index.js';
import {
  arrangementCost,
  isFeasible,
  type ArrangeProblem,
  type Arrangement,
  type Net,
  type Zone,
} from '../../../../src/core/phases/place/problem.js';
import { seededRandom } from '../../../../src/core/model/random.js';
import { DEFAULT_PROFILE, type Profile } from '../../../../src/core/physics/profile.js';
import { bruteForceChannel, placedChannel, randomNetlist } from './support.js';

/** One drum long enough for anything: the arrangement alone is under test. */
const ONE_DRUM: Profile = { ...DEFAULT_PROFILE, frame: { ...DEFAULT_PROFILE.frame, longestDrumM: 100 } };

/** A random problem: units of one or two bays, zones, nets of two to four points with offsets, fixed points elsewhere, and (sometimes) pins. */
function randomProblem(seed: number, units: number): ArrangeProblem {
  const rng = seededRandom(seed);
  const us: { bays: number[]; flippable: boolean; zone: Zone }[] = [];
  const widths: number[] = [];
  for (let u = 0; u < units; u++) {
    const k = rng.next() < 0.3 ? 2 : 1;
    const bays = Array.from({ length: k }, () => widths.push(0.03 + 0.09 * rng.next()) - 1);
    us.push({ bays, flippable: k === 2, zone: (rng.next() < 0.7 ? 1 : rng.int(3)) as Zone });
  }
  const nb = widths.length;
  const off = (b: number): number => (rng.next() - 0.5) * 0.9 * widths[b];
  const nets: Net[] = Array.from({ length: rng.int(2 * nb + 1) }, () => {
    const pins = Array.from({ length: 1 + rng.int(4) }, () => {
      const bay = rng.int(nb);
      return { bay, d: off(bay) };
    });
    const fixed = rng.next() < 0.25 ? [rng.next() * 0.6, rng.next() * 0.6].sort((a, b) => a - b) : undefined;
    return { pins, ...(fixed ? { fixed: { loM: fixed[0], hiM: fixed[1] } } : {}), w: 1 + rng.int(3) };
  });
  const pins = new Map<number, number>();
  if (rng.next() < 0.4) pins.set(rng.int(nb), rng.int(nb));
  return { units: us, bayWidthM: widths, nets, pins };
}

/** Every order of the units, each latch both ways round: the least feasible cost (Infinity if none). */
function bruteForce(p: ArrangeProblem): number {
  const n = p.units.length;
  let best = Infinity;
  const order: number[] = [];
  const used = new Array<boolean>(n).fill(false);
  const flippable = p.units.map((u, i) => (u.flippable ? i : -1)).filter((i) => i >= 0);
  const visit = (): void => {
    for (let m = 0; m < 1 << flippable.length; m++) {
      const flipped = new Array<boolean>(n).fill(false);
      flippable.forEach((u, j) => (flipped[u] = (m & (1 << j)) !== 0));
      const a: Arrangement = { order: [...order], flipped };
      if (isFeasible(p, a)) best = Math.min(best, arrangementCost(p, a));
    }
  };
  const rec = (): void => {
    if (order.length === n) return visit();
    for (let u = 0; u < n; u++)
      if (!used[u]) {
        used[u] = true;
        order.push(u);
        rec();
        order.pop();
        used[u] = false;
      }
  };
  rec();
  return best;
}

describe('core/phases/place/exact', () => {
  // Subset dynamic programming (Held & Karp 1962) against enumeration of every order.
  it('finds the least cost of every feasible order, with widths, offsets, nets of several points, fixed points, zones and pins (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1e9 }), fc.integer({ min: 1, max: 6 }), (seed, units) => {
        const p = randomProblem(seed, units);
        const want = bruteForce(p);
        const got = arrangeExact(p);
        if (want === Infinity) return got === undefined;
        return got !== undefined && isFeasible(p, got) && Math.abs(arrangementCost(p, got) - want) < 1e-9;
      }),
      { seed: 1414, numRuns: 150 },
    );
  });

  // Brute force over every permutation of the bays (tests/core/phases/place/support.ts), lengths measured there.
  it('places every random build of at most 8 bays with the least cord along the channel (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1e9 }), fc.integer({ min: 2, max: 8 }), (seed, bays) => {
        const n = randomNetlist(seed, bays);
        const placed = place(n, ONE_DRUM, { seed: 3 });
        expect(placed.exact).toBe(true);
        const least = bruteForceChannel(n, ONE_DRUM);
        expect(placedChannel(n, placed.bays)).toBeCloseTo(least, 9);
        // The routing measures the same trees (physics/routing.ts).
        expect(placed.channelM).toBeCloseTo(least, 9);
      }),
      { seed: 808, numRuns: 60 },
    );
  });

  it('visits about 2^front + 2^middle + 2^crank subsets, not 2^n', () => {
    const unit = (zone: Zone, b: number) => ({ bays: [b], flippable: false, zone });
    const p: ArrangeProblem = {
      units: [unit(0, 0), unit(0, 1), unit(1, 2), unit(1, 3), unit(1, 4), unit(2, 5)],
      bayWidthM: [1, 1, 1, 1, 1, 1],
      nets: [],
      pins: new Map(),
    };
    expect(exactStates(p)).toBe(4 + 8 + 2);
  });

  it('returns nothing when the pins cannot all be met', () => {
    const p: ArrangeProblem = {
      units: [
        { bays: [0, 1], flippable: true, zone: 1 },
        { bays: [2], flippable: false, zone: 1 },
      ],
      bayWidthM: [1, 1, 1],
      nets: [],
      // The single bay in the middle splits the latch.
      pins: new Map([[2, 1]]),
    };
    expect(arrangeExact(p)).toBeUndefined();
  });

  it('puts a chain in chain order (a path is its own minimum linear arrangement)', () => {
    const n = 7;
    const p: ArrangeProblem = {
      units: Array.from({ length: n }, (_, i) => ({ bays: [i], flippable: false, zone: 1 })),
      bayWidthM: new Array<number>(n).fill(0.05),
      nets: [3, 0, 5, 1, 6, 2].map((b, i, xs) => ({
        pins: [
          { bay: i === 0 ? 4 : xs[i - 1], d: 0 },
          { bay: b, d: 0 },
        ],
        w: 1,
      })),
      pins: new Map(),
    };
    const a = arrangeExact(p);
    expect(a && arrangementCost(p, a)).toBeCloseTo(6 * 0.05, 12);
    const order = a?.order ?? [];
    const chain = [4, 3, 0, 5, 1, 6, 2];
    expect([chain, [...chain].reverse()]).toContainEqual(order);
  });
});
