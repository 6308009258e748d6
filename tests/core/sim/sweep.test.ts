import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Build } from '../../../src/core/model/build.js';
import { allCodes, grayAssignments } from '../../../src/core/sim/assignments.js';
import { LaneBatch } from '../../../src/core/sim/lanes.js';
import { latchesAtCode, show, simFor, type PartSim } from '../../../src/core/sim/part.js';
import { batchKey, codesBatchKey, sweep } from '../../../src/core/sim/sweep.js';
import { brokenBuild, exampleBuild, exampleNames } from '../checks/builds.js';
import { randomBuild } from './actions.js';

const timing = { stageDelayS: 0.25 };

/** One clock from every (code, masters free or equal, inputs) start point: what `held` and `done` read, or 'slow'. */
function clocks(sim: PartSim, how: 'codes' | 'latches', keep: boolean): string[] {
  const bits = sim.slaves.length;
  const inputs = grayAssignments(sim.inputLevers.length);
  const out: string[] = [];
  const batch = new LaneBatch(sim);
  for (const c of allCodes(bits))
    for (const m of [
      c,
      ...allCodes(bits)
        .filter((x) => x !== c)
        .slice(0, 1),
    ]) {
      const latches = latchesAtCode(sim, c, m);
      sweep<string>(
        sim,
        inputs.length,
        {
          setUp: (b, lane, i) => {
            if (how === 'codes') b.setCodes(lane, c, m);
            else b.setLatches(lane, latches);
            b.setInputs(lane, inputs[i]);
          },
          ...(keep
            ? {
                recordKey: (first: number, n: number) =>
                  how === 'codes' ? codesBatchKey(sim, c, m, inputs, first, n) : batchKey(latches, inputs, first, n),
              }
            : {}),
          held: (b, lane) => b.outputs(lane).map(show).join(''),
          done: (i, b, lane, shown) =>
            void out.push(`${c}/${m}/${inputs[i]}: ${shown} → ${b.slaveCode(lane)} ${b.latchesOf(lane).join('')}`),
          slow: (i) => void out.push(`${c}/${m}/${inputs[i]}: slow`),
        },
        batch,
      );
    }
  return out;
}

describe('core/sim/sweep', () => {
  // A kept batch must read exactly as the batch it was kept from: the same lanes vouched for,
  // the same outputs held, the same latches after the clock (the reference: sweeps that keep nothing).
  it('reads a kept clock batch as running it again would, on every example and the broken fixtures', () => {
    const builds: [string, Build][] = [
      ...exampleNames().map((n): [string, Build] => [n, exampleBuild(n).build]),
      ...['counter-unguarded', 'toggle-release-race', 'counter-lock-up'].map((n): [string, Build] => [
        n,
        brokenBuild(n),
      ]),
    ];
    for (const [name, build] of builds) {
      const sim = simFor(build, timing);
      const fresh = clocks(sim, 'codes', false);
      expect(clocks(sim, 'codes', true), `${name}, kept`).toEqual(fresh);
      expect(clocks(sim, 'codes', true), `${name}, read back`).toEqual(fresh);
      // The same batches set up latch by latch carry the same name, and read the same.
      expect(clocks(sim, 'latches', true), `${name}, by latches`).toEqual(fresh);
      expect(clocks(sim, 'latches', false), `${name}, by latches, kept nothing`).toEqual(fresh);
    }
  });

  it('reads kept batches as running them again would, on random builds (fast-check, fixed seed)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 2, max: 9 }),
        fc.integer({ min: 1, max: 4 }),
        fc.nat(1000),
        (states, inputs, seed) => {
          const sim = simFor(randomBuild(states, inputs, 2, seed), timing);
          const fresh = clocks(sim, 'latches', false);
          expect(clocks(sim, 'latches', true)).toEqual(fresh);
          expect(clocks(sim, 'codes', true)).toEqual(fresh);
        },
      ),
      { seed: 424242, numRuns: 12 },
    );
  });
});
