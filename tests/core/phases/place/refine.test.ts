/**
 * The refinement of a split over drums (src/core/phases/place/refine.ts).
 * - Its cost in drum levels is checked against the vertical cord the routing (physics/routing.ts,
 *   design §11) actually lays, measured here from the routed runs of placed builds: one shared drop
 *   to the lowest channel a cord uses, each branch to a drum above its capstan rising on its own.
 * - Its contract (fixed units stay, no drum goes over the longest allowed or below the bays its pins
 *   need, the levels never rise)
 *   as a property over random builds and random splits (fast-check, fixed seed).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { place } from '../../../../src/core/phases/place/index.js';
import { drumLevels, refineDrums } from '../../../../src/core/phases/place/refine.js';
import { frameUnits } from '../../../../src/core/phases/place/units.js';
import type { Netlist } from '../../../../src/core/model/netlist.js';
import { seededRandom } from '../../../../src/core/model/random.js';
import { DEFAULT_PROFILE, type Profile } from '../../../../src/core/physics/profile.js';
import { randomNetlist } from './support.js';

const F = DEFAULT_PROFILE.frame;
/** A short drum, so random builds of 14–24 bays need two to five drums. */
const SHORT: Profile = { ...DEFAULT_PROFILE, frame: { ...F, longestDrumM: 0.45, drumsPerFrame: 8 } };

/** Each unit's drum (0-based) as a placement put it. */
function unitDrums(n: Netlist, p: ReturnType<typeof place>, profile: Profile): Int32Array {
  const fu = frameUnits(n, profile);
  const out = new Int32Array(fu.units.length);
  for (const b of p.bays) out[fu.bays[fu.bayOf.get(b.part) as number].unit] = b.drum - 1;
  return out;
}

describe('cord between drums, in drum levels', () => {
  it('is what the routing lays between drums: the vertical runs less their in-drum parts, over the drum spacing', () => {
    const r = DEFAULT_PROFILE.drumRadiusM;
    let multi = 0;
    for (let seed = 1; seed <= 12; seed++) {
      const n = randomNetlist(seed, 14 + seed);
      const p = place(n, SHORT);
      if (p.drums.length > 1) multi++;
      // Measured from the routed runs: every drop and rise, less the drop from the drum to its own
      // channel once per cord that leaves its bay and the rail-to-channel rise of each port branch.
      let extra = 0;
      for (const c of p.routing.cords) {
        const leaves = c.branches.some((b) => b.runs.some((run) => run.kind !== 'direct'));
        if (!leaves) continue;
        extra -= F.channelBelowDrumM - r;
        for (const b of c.branches) {
          if (b.kind === 'port') extra -= F.railAboveDrumM + F.channelBelowDrumM;
          for (const run of b.own) if (run.kind === 'drop' || run.kind === 'rise') extra += run.lengthM;
        }
      }
      const fu = frameUnits(n, SHORT);
      expect(extra / F.drumSpacingM).toBeCloseTo(drumLevels(fu, unitDrums(n, p, SHORT)), 9);
    }
    expect(multi).toBeGreaterThan(8);
  });

  it('counts a drop shared by branches below once, and each branch above on its own', () => {
    // One capstan with three branches: two to gate p (ports a and b), one to gate q. Capstan on
    // drum 2 (0-based), p on drum 0, q on drum 1: one drop to drum 0's channel, 2 levels, shared
    // by all three. Capstan on drum 0, p on 1, q on 2: each branch rises on its own, 1 + 1 + 2.
    const n: Netlist = {
      parts: [
        { kind: 'gate', id: 'd', name: 'd', role: 'term', ports: [{ name: 'a' }] },
        { kind: 'gate', id: 'p', name: 'p', role: 'term', ports: [{ name: 'a' }, { name: 'b' }] },
        { kind: 'gate', id: 'q', name: 'q', role: 'term', ports: [{ name: 'a' }] },
      ],
      cords: [
        {
          id: 'c',
          driver: 'd',
          ports: [
            { part: 'p', port: 'a' },
            { part: 'p', port: 'b' },
            { part: 'q', port: 'a' },
          ],
          actuators: [],
        },
      ],
    };
    const fu = frameUnits(n, DEFAULT_PROFILE);
    const [d, p, q] = ['d', 'p', 'q'].map((id) => fu.unitOf.get(id) as number);
    const at = (dd: number, pd: number, qd: number): Int32Array => {
      const x = new Int32Array(3);
      x[d] = dd;
      x[p] = pd;
      x[q] = qd;
      return x;
    };
    expect(drumLevels(fu, at(2, 0, 1))).toBe(2);
    expect(drumLevels(fu, at(0, 1, 2))).toBe(1 + 1 + 2);
    expect(drumLevels(fu, at(1, 1, 1))).toBe(0);
  });
});

describe('refineDrums', () => {
  it('keeps fixed units and the bays pins need, overfills no drum and never raises the levels (property, seed 5150)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 10_000 }), fc.integer({ min: 2, max: 4 }), (seed, drums) => {
        const n = randomNetlist(seed, 10 + (seed % 15));
        const fu = frameUnits(n, DEFAULT_PROFILE);
        const rng = seededRandom(seed);
        const total = fu.units.reduce((s, u) => s + u.widthM, 0);
        const longestM = (1.3 * total) / drums;
        // A random split within the drum's length, some units fixed where they fall.
        const width = new Array<number>(drums).fill(0);
        const start = new Int32Array(fu.units.length);
        const fixed = new Int32Array(fu.units.length).fill(-1);
        fu.units.forEach((u, i) => {
          let d = rng.int(drums);
          for (let k = 0; k < drums && width[d] + u.widthM > longestM; k++) d = (d + 1) % drums;
          start[i] = d;
          width[d] += u.widthM;
          if (rng.next() < 0.15) fixed[i] = d;
        });
        // Some drums must keep the bays they have (as a pin to their last bay would ask).
        const bays = new Array<number>(drums).fill(0);
        fu.units.forEach((u, i) => (bays[start[i]] += u.bays.length));
        const needed = new Map<number, number>();
        for (let d = 0; d < drums; d++) if (rng.next() < 0.3) needed.set(d, bays[d]);
        const out = refineDrums(fu, start, drums, fixed, longestM, needed);
        const baysAfter = new Array<number>(drums).fill(0);
        fu.units.forEach((u, i) => (baysAfter[out[i]] += u.bays.length));
        for (const [d, k] of needed) expect(baysAfter[d]).toBeGreaterThanOrEqual(k);
        fu.units.forEach((_, i) => {
          if (fixed[i] !== -1) expect(out[i]).toBe(fixed[i]);
          expect(out[i]).toBeGreaterThanOrEqual(0);
          expect(out[i]).toBeLessThan(drums);
        });
        const after = new Array<number>(drums).fill(0);
        fu.units.forEach((u, i) => (after[out[i]] += u.widthM));
        after.forEach((w, d) => {
          if (width[d] <= longestM + 1e-9) expect(w).toBeLessThanOrEqual(longestM + 1e-9);
        });
        expect(drumLevels(fu, out)).toBeLessThanOrEqual(drumLevels(fu, start));
      }),
      { seed: 5150, numRuns: 150 },
    );
  });

  it('brings a capstan down to the drum its branches are on when there is room', () => {
    const n = randomNetlist(77, 16);
    const fu = frameUnits(n, DEFAULT_PROFILE);
    // Every unit on drum 0 but one driver put alone on drum 2: it should come back.
    const driver = fu.units.findIndex((u) => u.kind === 'gate' && fu.branches.some((b) => b.driver === u.id));
    const start = new Int32Array(fu.units.length);
    start[driver] = 2;
    const fixed = new Int32Array(fu.units.length).fill(-1);
    const out = refineDrums(fu, start, 3, fixed, 100);
    expect(drumLevels(fu, start)).toBeGreaterThan(0);
    expect(drumLevels(fu, out)).toBe(0);
  });
});
