import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Build } from '../../../src/core/model/build.js';
import { seededRandom } from '../../../src/core/model/random.js';
import { isBinary, isReady, moverFor } from '../../../src/core/sim/fast.js';
import {
  applyFastInPlace,
  applyInPlace,
  powerUp,
  simFor,
  stateAtCode,
  type PartEvent,
} from '../../../src/core/sim/part.js';
import { exampleBuild, exampleNames } from '../checks/builds.js';
import { randomActions, randomBuild } from './actions.js';

const timing = { stageDelayS: 0.25 };

/**
 * Run the same hand actions on two copies of the machine, one settled by the event-driven
 * simulator (settle.ts, the reference), one by the fast pass where it can vouch for the result
 * (fast.ts): after every action the values of every part, the alarms and the time must be the
 * same. Returns how many actions the fast pass settled.
 */
function agreeOn(build: Build, seed: number, count: number, delays?: Record<string, number>): number {
  const sim = simFor(build, delays ? { ...timing, delays } : timing);
  const mover = moverFor(sim);
  const reference = powerUp(sim)[0].values.slice();
  const fast = reference.slice();
  let tRef = 0;
  let tFast = 0;
  let ready = false;
  let passes = 0;
  const evaluations = () => sim.evaluations;
  for (const a of randomActions(seededRandom(seed), build.machine.inputs, count)) {
    const refEvents: PartEvent[] = [];
    const fastEvents: PartEvent[] = [];
    tRef = applyInPlace(sim, reference, tRef, a, refEvents);
    const before = evaluations();
    tFast = applyFastInPlace(sim, fast, tFast, a, fastEvents, ready);
    if (ready && evaluations() > before) passes++;
    ready = mover.ready;
    // Compare cheaply; let expect describe the first difference.
    const same =
      tFast === tRef &&
      fast.every((v, i) => v === reference[i]) &&
      JSON.stringify(fastEvents) === JSON.stringify(refEvents);
    if (!same) {
      expect(fastEvents).toEqual(refEvents);
      expect(tFast).toBe(tRef);
      expect(fast).toEqual(reference);
    }
    if (ready && !isReady(sim, fast)) expect.fail('the fast pass left a state it calls ready that is not');
  }
  return passes;
}

describe('core/sim/fast', () => {
  // The reference is the event-driven three-valued simulator (settle.ts), itself checked against
  // the NAND latch table of Mano & Ciletti in part.test.ts.
  it.each(exampleNames())(
    'gives the same values, alarms and times as the event-driven simulator, action by action, on %s',
    (name) => {
      for (const encoding of ['binary', 'one-hot', 'gray'] as const) {
        const { build } = exampleBuild(name, { encoding });
        const passes = agreeOn(build, 11, 1500);
        // Most moves go through the fast pass (the rest: power-up, rule breaking, upset latches).
        if (build.encoding.bits > 0) expect(passes).toBeGreaterThan(500);
      }
    },
  );

  it('agrees on random machines and random hand actions (fixed seed)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 2, max: 9 }),
        fc.integer({ min: 0, max: 3 }),
        fc.integer({ min: 1, max: 3 }),
        fc.integer({ min: 1, max: 10_000 }),
        (states, inputs, outputs, seed) => {
          agreeOn(randomBuild(states, inputs, outputs, seed), seed, 400);
        },
      ),
      { seed: 20260515, numRuns: 25 },
    );
  });

  it('agrees with unequal stage delays, where glitches and races show', () => {
    const { build } = exampleBuild('crossing');
    const rnd = seededRandom(3);
    const delays: Record<string, number> = {};
    for (const p of build.netlist.parts) if (p.kind === 'gate') delays[p.id] = 0.1 + 0.4 * rnd.next();
    agreeOn(build, 5, 2000, delays);
  });

  it('tells a ready state from one the fast pass must not start from', () => {
    const { build } = exampleBuild('marble-bell');
    const sim = simFor(build, timing);
    const [up] = powerUp(sim);
    expect(isBinary(sim, up.values)).toBe(false); // latches X until reset
    const at = stateAtCode(sim, build.encoding.codes[1], '1');
    expect(isReady(sim, at.values)).toBe(true);
    const unsettled = at.values.slice();
    const gate = sim.leverCount + sim.driverCount - sim.leverCount - 1;
    unsettled[gate] ^= 1;
    expect(isReady(sim, unsettled)).toBe(false);
  });
});
