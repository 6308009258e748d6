import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  analysedBehaviour,
  builtWithChecks,
  levelClocks,
  refusals,
  stateCounts,
  throughLevers,
  throughXstate,
} from './harness.js';
import { delayReference } from './reference.js';

const valuesOf = (k: number) => ({ input: 'marble', clocks: String(k), output: 'flap' });

describe('core/behaviours/delay', () => {
  // Reference: the input's value K clocks back in the history (0 before the first clock), through xstate 5.33.3's actor.
  it('repeats the input K clocks later, through xstate (fast-check, seed 53)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 4 }).chain((k) => fc.tuple(fc.constant(k), levelClocks(['marble'], 50))),
        ([k, clocks]) => {
          const a = analysedBehaviour('delay', valuesOf(k));
          expect(throughXstate(a, clocks)).toEqual(
            delayReference(clocks, { input: 'marble', clocks: k, output: 'flap' }),
          );
        },
      ),
      { seed: 53, numRuns: 120 },
    );
  });

  // The K-bit shift register as a Moore machine: 2^K states, all distinguishable (the next K
  // outputs read the K remembered bits back; Kohavi, Switching and Finite Automata Theory,
  // 2nd ed. 1978, ch. 15 — from memory).
  it('has 2^K states, and state minimisation removes none', () => {
    for (let k = 1; k <= 4; k++)
      expect(stateCounts(analysedBehaviour('delay', valuesOf(k))), `K = ${k}`).toEqual([2 ** k, 2 ** k]);
  });

  it('builds with every check passing, and the lever machine repeats the input as the reference does (seed 71)', () => {
    const b = builtWithChecks(analysedBehaviour('delay', valuesOf(2)), 'auto');
    fc.assert(
      fc.property(levelClocks(['marble'], 30), (clocks) => {
        expect(throughLevers(b, clocks)).toEqual(
          delayReference(clocks, { input: 'marble', clocks: 2, output: 'flap' }),
        );
      }),
      { seed: 71, numRuns: 6 },
    );
  });

  it('refuses parameters a user can get wrong, each with its code, the parameter and a hint', () => {
    const code = (v: Record<string, string>) => refusals('delay', v);
    expect(code({ ...valuesOf(2), clocks: '5' })).toEqual([['LW800', 'delay.clocks', true]]);
    expect(code({ ...valuesOf(2), clocks: '0' })).toEqual([['LW800', 'delay.clocks', true]]);
    expect(code({ ...valuesOf(2), output: 'marble' })).toEqual([['LW803', 'delay.output', true]]);
    expect(code({ clocks: '2', output: 'flap' })).toEqual([['LW802', 'delay.input', true]]);
  });
});
