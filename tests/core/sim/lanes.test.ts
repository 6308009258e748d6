import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Build } from '../../../src/core/model/build.js';
import { allCodes, grayAssignments } from '../../../src/core/sim/assignments.js';
import { phaseActions } from '../../../src/core/sim/hand.js';
import { LANES, LaneBatch } from '../../../src/core/sim/lanes.js';
import {
  applyInPlace,
  outputValues,
  simFor,
  stateAtCode,
  type PartEvent,
  type PartSim,
} from '../../../src/core/sim/part.js';
import { sweep } from '../../../src/core/sim/sweep.js';
import { brokenBuild, exampleBuild, exampleNames } from '../checks/builds.js';
import { randomBuild } from './actions.js';

const timing = { stageDelayS: 0.25 };

/** Every (code, inputs) start point of a build, 32 at a time, compared with the event-driven simulator moment by moment. */
function compare(build: Build): { lanes: number; suspect: number; suspectWithAlarm: number } {
  const sim: PartSim = simFor(build, timing);
  const codes = allCodes(sim.slaves.length);
  const inputs = grayAssignments(sim.inputLevers.length);
  const starts = codes.flatMap((c) => inputs.map((a) => [c, a] as const));
  const stats = { lanes: 0, suspect: 0, suspectWithAlarm: 0 };
  const b = new LaneBatch(sim);
  const lane = new Uint8Array(sim.driverCount);
  for (let first = 0; first < starts.length; first += LANES) {
    const n = Math.min(LANES, starts.length - first);
    b.clear();
    for (let i = 0; i < n; i++) {
      b.setCodes(i, starts[first + i][0]);
      b.setInputs(i, starts[first + i][1]);
    }
    b.settleHeld();
    // The reference: each start point on its own, event-driven.
    const refs = starts.slice(first, first + n).map(([c, a]) => stateAtCode(sim, c, a).values);
    const alarms = refs.map((): PartEvent[] => []);
    const same = (moment: string): void => {
      for (let i = 0; i < n; i++) {
        if ((b.suspect >>> i) & 1) continue;
        const got = b.laneValues(i, lane);
        if (!got.every((v, d) => v === refs[i][d]))
          expect({ moment, lane: starts[first + i], got }).toEqual({ moment, lane: starts[first + i], got: refs[i] });
      }
    };
    same('inputs held');
    for (let i = 0; i < n; i++) if (!((b.suspect >>> i) & 1)) expect(b.outputs(i)).toEqual(outputValues(sim, refs[i]));
    for (const a of phaseActions()) {
      const d = a.kind === 'input' ? -1 : a.lever === 'phi1' ? sim.phi1 : sim.phi2;
      b.move(d, a.kind === 'pull' ? 1 : 0);
      refs.forEach((v, i) => applyInPlace(sim, v, 0, a, alarms[i]));
      same(`after ${a.kind} ${a.kind === 'input' ? '' : a.lever}`);
    }
    for (let i = 0; i < n; i++) {
      stats.lanes++;
      if ((b.suspect >>> i) & 1) {
        stats.suspect++;
        if (alarms[i].some((e) => e.kind !== 'change')) stats.suspectWithAlarm++;
      } else expect(alarms[i].filter((e) => e.kind !== 'change')).toEqual([]);
    }
  }
  return stats;
}

describe('core/sim/lanes', () => {
  // Reference: the event-driven three-valued simulator (settle.ts), one start point at a time.
  it.each(exampleNames())(
    'gives the event-driven values at every moment of a clock, from every code and input, on %s',
    (name) => {
      for (const encoding of ['binary', 'one-hot'] as const) {
        const stats = compare(exampleBuild(name, { encoding }).build);
        expect(stats.lanes).toBeGreaterThan(0);
        // A guarded build upsets no latch from any code: every lane is vouched for.
        expect(stats.suspect).toBe(0);
      }
    },
  );

  it('agrees on random machines (fixed seed)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 2, max: 12 }),
        fc.integer({ min: 0, max: 4 }),
        fc.integer({ min: 1, max: 9999 }),
        (states, inputs, seed) => {
          compare(randomBuild(states, inputs, 2, seed));
        },
      ),
      { seed: 97531, numRuns: 20 },
    );
  });

  it('marks the lanes where an unguarded latch sees the forbidden input', () => {
    const stats = compare(brokenBuild('counter-unguarded'));
    expect(stats.suspect).toBeGreaterThan(0);
    expect(stats.suspectWithAlarm).toBe(stats.suspect);
  });

  it('sweeps start points in order, sending each suspect one to the event-driven path in its place', () => {
    const build = brokenBuild('counter-unguarded');
    const sim = simFor(build, timing);
    const order: string[] = [];
    sweep(sim, 8, {
      setUp: (b, lane, i) => {
        b.setCodes(lane, allCodes(2)[i % 4]);
        b.setInputs(lane, i < 4 ? '0' : '1');
      },
      done: (i) => void order.push(`lanes ${i}`),
      slow: (i) => void order.push(`slow ${i}`),
    });
    expect(order.map((s) => Number(s.split(' ')[1]))).toEqual([0, 1, 2, 3, 4, 5, 6, 7]);
    expect(order.some((s) => s.startsWith('slow'))).toBe(true);
  });
});
