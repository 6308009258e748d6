import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  analysedBehaviour,
  builtWithChecks,
  levelClocks,
  stateCounts,
  throughLevers,
  throughXstate,
  refusals,
} from './harness.js';
import { holdReference } from './reference.js';

const values = (clocks: number, holding: boolean) => ({
  input: 'sensor',
  clocks: String(clocks),
  output: 'unlock',
  ...(holding ? { holding: 'waiting' } : {}),
});

describe('core/behaviours/hold', () => {
  // Reference: "the last K clocks all held the input", straight from the definition; through xstate 5.33.3's actor.
  it('gives the output once the last K clocks all held, through xstate (fast-check, seed 3)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 2, max: 6 }), fc.boolean(), levelClocks(['sensor'], 80), (k, holding, clocks) => {
        const a = analysedBehaviour('hold', values(k, holding));
        const p = { input: 'sensor', clocks: k, output: 'unlock', ...(holding ? { holding: 'waiting' } : {}) };
        expect(throughXstate(a, clocks)).toEqual(holdReference(clocks, p));
      }),
      { seed: 3, numRuns: 120 },
    );
  });

  // A counter of consecutive held clocks saturating at K has K + 1 states (0 … K held clocks), all
  // distinguishable (state k needs K − k more held clocks): the textbook shift-counter argument.
  it('has K + 1 states, and state minimisation removes none', () => {
    for (const k of [2, 3, 7, 32]) {
      expect(stateCounts(analysedBehaviour('hold', values(k, false)))).toEqual([k + 1, k + 1]);
      expect(stateCounts(analysedBehaviour('hold', values(k, true)))).toEqual([k + 1, k + 1]);
    }
  });

  it('builds with every check passing, and the lever machine holds as the reference does (seed 55)', () => {
    for (const [k, holding] of [
      [2, false],
      [3, true],
    ] as const) {
      const b = builtWithChecks(analysedBehaviour('hold', values(k, holding)));
      const p = { input: 'sensor', clocks: k, output: 'unlock', ...(holding ? { holding: 'waiting' } : {}) };
      fc.assert(
        fc.property(levelClocks(['sensor'], 40), (clocks) => {
          expect(throughLevers(b, clocks)).toEqual(holdReference(clocks, p));
        }),
        { seed: 55, numRuns: 6 },
      );
    }
  });

  it('refuses parameters a user can get wrong, each with its code, the parameter and a hint', () => {
    const code = (v: Record<string, string>) => refusals('hold', v);
    expect(code({ input: 'sensor', clocks: '1', output: 'unlock' })).toEqual([['LW800', 'hold.clocks', true]]);
    expect(code({ input: 'sensor', clocks: '2', output: 'un lock' })).toEqual([['LW801', 'hold.output', true]]);
    expect(code({ input: 'sensor', clocks: '2' })).toEqual([['LW802', 'hold.output', true]]);
    expect(code({ input: 'sensor', clocks: '2', output: 'unlock', holding: 'unlock' })).toEqual([
      ['LW803', 'hold.holding', true],
    ]);
  });
});
