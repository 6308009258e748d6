import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkEquivalence } from '../../../src/core/checks/equivalence.js';
import { DONT_CARE, type FlatMachine } from '../../../src/core/model/flat.js';
import { seededRandom } from '../../../src/core/model/random.js';
import { minimiseStates } from '../../../src/core/phases/minimise-states/index.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { synthesise } from '../../../src/core/synthesise.js';
import { binaryEncoding, randomMachine } from '../support/synthesis.js';
import { compatibilityTable, conforms } from './conformance.js';

/** The reduced machine with one specified output flipped or one specified next state moved (seeded), or as it is. */
function mutate(m: FlatMachine, seed: number): FlatMachine {
  const rng = seededRandom(seed);
  const spots = m.rows.flatMap((rs, s) => rs.map((_, k) => [s, k] as const));
  if (spots.length === 0 || rng.next() < 0.3) return m;
  const [s, k] = spots[rng.int(spots.length)];
  const rows = m.rows.map((rs, i) =>
    i !== s
      ? rs
      : rs.map((r, j) => {
          if (j !== k) return r;
          const at = r.out.findIndex((o) => o !== '-');
          if (rng.next() < 0.5 && at >= 0)
            return { ...r, out: r.out.map((o, q) => (q === at ? (o === 1 ? 0 : 1) : o)) };
          return r.next === DONT_CARE ? r : { ...r, next: rng.int(m.states.length) };
        }),
  );
  return { ...m, rows };
}

describe('core/checks/equivalence on incompletely specified machines', () => {
  // Reference: an independent product exploration (conformance.ts) on the event-driven
  // simulator, with the compatibility table struck out in rounds over enumerated inputs.
  it('gives the verdict of an independent product exploration on random machines and their reductions (fixed seed)', () => {
    let failures = 0;
    let passes = 0;
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1_000_000 }), (seed) => {
        const written = randomMachine(seed, { maxStates: 6, maxInputs: 3, maxOutputs: 2, incomplete: true });
        const reduced = mutate(minimiseStates(written).machine, seed + 1);
        const build = synthesise(reduced, binaryEncoding(reduced), { profile: DEFAULT_PROFILE });
        const check = checkEquivalence(build, { original: written }, DEFAULT_PROFILE);
        const reference = conforms(build, written);
        expect(check.ok).toBe(reference.ok);
        if (check.ok) expect(check.states).toBe(reference.pairs);
        if (check.ok) passes++;
        else failures++;
      }),
      { seed: 424242, numRuns: 120 },
    );
    // Both verdicts occur: the comparison is not vacuous.
    expect(passes).toBeGreaterThan(20);
    expect(failures).toBeGreaterThan(10);
  });

  it('accepts every unmutated reduction, where the reduced machine may go to any compatible state', () => {
    let offTheMap = 0;
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1_000_000 }), (seed) => {
        const written = randomMachine(seed, { maxStates: 8, maxInputs: 3, maxOutputs: 2, incomplete: true });
        const min = minimiseStates(written);
        const build = synthesise(min.machine, binaryEncoding(min.machine), { profile: DEFAULT_PROFILE });
        const check = checkEquivalence(build, { original: written, merged: min.merged }, DEFAULT_PROFILE);
        expect(check.summary).toMatch(/^the build behaves as the machine as written/);
        const reference = conforms(build, written, min.merged);
        expect(reference.ok).toBe(true);
        if (reference.leftTheMap) offTheMap++;
      }),
      { seed: 515151, numRuns: 60 },
    );
    // Some builds reach a code other than the merged state's: a check by the merged-state map would fail them.
    expect(offTheMap).toBeGreaterThan(0);
  });

  it('builds the same compatibility relation as the struck-out table', () => {
    const written = randomMachine(77, { maxStates: 7, maxInputs: 2, maxOutputs: 2, incomplete: true });
    const reduced = minimiseStates(written).machine;
    const table = compatibilityTable(written, reduced);
    const build = synthesise(reduced, binaryEncoding(reduced), { profile: DEFAULT_PROFILE });
    expect(checkEquivalence(build, { original: written }, DEFAULT_PROFILE).ok).toBe(true);
    // Every written state is compatible with the reduced state its class went to.
    const merged = minimiseStates(written).merged;
    for (const [o, m] of Object.entries(merged))
      expect(table[written.states.indexOf(o)][reduced.states.indexOf(m)]).toBe(true);
  });
});
