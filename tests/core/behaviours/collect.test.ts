import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  analysedBehaviour,
  builtWithChecks,
  stateCounts,
  throughLevers,
  throughXstate,
  type Clock,
  refusals,
} from './harness.js';
import { collectReference } from './reference.js';

const NAMES = ['red', 'blue', 'green', 'amber'];

/** Clocks where each input is pulled now and then (about one clock in five), and a clear rarely. */
const sparse = (inputs: readonly string[], clear: string | undefined, maxLength: number): fc.Arbitrary<Clock[]> =>
  fc.array(
    fc
      .tuple(
        fc.array(fc.integer({ min: 0, max: 9 }), { minLength: inputs.length, maxLength: inputs.length }),
        fc.integer({ min: 0, max: 19 }),
      )
      .map(
        ([draws, c]) =>
          Object.fromEntries([
            ...inputs.map((x, i) => [x, draws[i] < 2 ? 1 : 0] as const),
            ...(clear ? [[clear, c === 0 ? 1 : 0] as const] : []),
          ]) as Clock,
      ),
    { minLength: 1, maxLength },
  );

const valuesOf = (k: number, clear: boolean) => ({
  inputs: NAMES.slice(0, k).join(','),
  output: 'gate',
  ...(clear ? { clear: 'clear' } : {}),
});

describe('core/behaviours/collect', () => {
  // Reference: "the set of inputs pulled since the last clear holds them all", through xstate 5.33.3's actor.
  it('gives the output once every input has been pulled, in any order, through xstate (fast-check, seed 44)', () => {
    const cases = fc
      .record({ k: fc.integer({ min: 2, max: 4 }), clear: fc.boolean() })
      .chain((c) => fc.tuple(fc.constant(c), sparse(NAMES.slice(0, c.k), c.clear ? 'clear' : undefined, 60)));
    fc.assert(
      fc.property(cases, ([{ k, clear }, clocks]) => {
        const a = analysedBehaviour('collect', valuesOf(k, clear));
        const p = { inputs: NAMES.slice(0, k), output: 'gate', ...(clear ? { clear: 'clear' } : {}) };
        expect(throughXstate(a, clocks)).toEqual(collectReference(clocks, p));
      }),
      { seed: 44, numRuns: 120 },
    );
  });

  // The subsets of k inputs: 2^k states, all distinguishable (see the module's contract).
  it('has 2^k states for k inputs, and state minimisation removes none', () => {
    for (const k of [2, 3, 4])
      for (const clear of [false, true])
        expect(stateCounts(analysedBehaviour('collect', valuesOf(k, clear)))).toEqual([2 ** k, 2 ** k]);
  });

  it('builds with every check passing, and the lever machine collects as the reference does (seed 71)', () => {
    const b = builtWithChecks(analysedBehaviour('collect', valuesOf(2, true)));
    const p = { inputs: ['red', 'blue'], output: 'gate', clear: 'clear' };
    fc.assert(
      fc.property(sparse(['red', 'blue'], 'clear', 40), (clocks) => {
        expect(throughLevers(b, clocks)).toEqual(collectReference(clocks, p));
      }),
      { seed: 71, numRuns: 6 },
    );
  });

  it('refuses parameters a user can get wrong, each with its code, the parameter and a hint', () => {
    const code = (v: Record<string, string>) => refusals('collect', v);
    expect(code({ inputs: 'red', output: 'gate' })).toEqual([['LW800', 'collect.inputs', true]]);
    expect(code({ inputs: 'a,b,c,d,e', output: 'gate' })).toEqual([['LW800', 'collect.inputs', true]]);
    expect(code({ inputs: 'red,red', output: 'gate' })).toEqual([['LW803', 'collect.inputs', true]]);
    expect(code({ inputs: 'red,blue', output: 'gate', clear: 'blue' })).toEqual([['LW803', 'collect.clear', true]]);
    expect(code({ output: 'gate' })).toEqual([['LW802', 'collect.inputs', true]]);
  });
});
