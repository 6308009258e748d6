import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { writeBehaviour } from '../../../src/core/behaviours/index.js';
import {
  analysedBehaviour,
  builtWithChecks,
  levelClocks,
  stateCounts,
  throughLevers,
  throughXstate,
  refusals,
} from './harness.js';
import { countingReference } from './reference.js';

type Timing = 'same-clock' | 'next-clock';

const values = (every: number, timing: Timing, clear: boolean) => ({
  input: 'marble',
  every: String(every),
  output: 'bell',
  timing,
  ...(clear ? { clear: 'reset_count' } : {}),
});

describe('core/behaviours/counting', () => {
  // Reference: the count of pulses modulo N, straight from the definition; run through xstate 5.33.3's own actor.
  it('gives the output on every Nth pulse, as the count modulo N says, through xstate (fast-check, seed 8)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 2, max: 9 }),
        fc.constantFrom<Timing>('same-clock', 'next-clock'),
        fc.boolean(),
        levelClocks(['marble', 'reset_count'], 80),
        (every, timing, clear, clocks) => {
          const a = analysedBehaviour('counting', values(every, timing, clear));
          const p = { input: 'marble', every, output: 'bell', timing, ...(clear ? { clear: 'reset_count' } : {}) };
          // Without a clear input, a clear lever in the clocks is no input of the machine and is not pulled.
          const used = clear ? clocks : clocks.map((c) => ({ marble: c.marble }));
          expect(throughXstate(a, used)).toEqual(countingReference(used, p));
        },
      ),
      { seed: 8, numRuns: 120 },
    );
  });

  // A modulo-N counter has N states (the residues 0 … N−1; any textbook on sequential circuits);
  // shown one clock after, the residue 0 is remembered twice (just reached and showing, or not): N + 1.
  it('has N states (Mealy) or N + 1 (Moore), and state minimisation removes none of them', () => {
    for (const every of [2, 3, 5, 8, 16, 32]) {
      expect(stateCounts(analysedBehaviour('counting', values(every, 'same-clock', true)))).toEqual([every, every]);
      expect(stateCounts(analysedBehaviour('counting', values(every, 'next-clock', false)))).toEqual([
        every + 1,
        every + 1,
      ]);
    }
  });

  it('builds with every check passing, and the lever machine counts as the reference does (seed 21)', () => {
    for (const [every, timing, clear] of [
      [3, 'same-clock', false],
      [4, 'next-clock', true],
    ] as const) {
      const a = analysedBehaviour('counting', values(every, timing, clear));
      const b = builtWithChecks(a);
      const p = { input: 'marble', every, output: 'bell', timing, ...(clear ? { clear: 'reset_count' } : {}) };
      fc.assert(
        fc.property(levelClocks(clear ? ['marble', 'reset_count'] : ['marble'], 40), (clocks) => {
          expect(throughLevers(b, clocks)).toEqual(countingReference(clocks, p));
        }),
        { seed: 21, numRuns: 6 },
      );
    }
  });

  it('writes a state line that says in words what the state remembers', () => {
    const w = writeBehaviour('counting', values(3, 'same-clock', false));
    expect(w.ok && w.text).toMatch(/^state count_2 +# remembers: 2 pulses counted$/m);
    expect(w.ok && w.sentence).toBe('Every 3rd pulse of marble sets bell to 1 on the same clock.');
  });

  it('refuses parameters a user can get wrong, each with its code, the parameter and a hint', () => {
    const code = (v: Record<string, string>) => refusals('counting', v);
    expect(code({ input: 'marble', every: '1', output: 'bell' })).toEqual([['LW800', 'counting.every', true]]);
    expect(code({ input: 'marble', every: '33', output: 'bell' })).toEqual([['LW800', 'counting.every', true]]);
    expect(code({ input: 'marble', every: 'three', output: 'bell' })).toEqual([['LW800', 'counting.every', true]]);
    expect(code({ input: '2marble', every: '3', output: 'bell' })).toEqual([['LW801', 'counting.input', true]]);
    expect(code({ every: '3', output: 'bell' })).toEqual([['LW802', 'counting.input', true]]);
    expect(code({ input: 'marble', every: '3', output: 'bell', clear: 'marble' })).toEqual([
      ['LW803', 'counting.clear', true],
    ]);
    expect(code({ input: 'marble', every: '3', output: 'bell', timing: 'later' })).toEqual([
      ['LW804', 'counting.timing', true],
    ]);
    expect(code({ input: 'marble', every: '3', output: 'bell', name: '-x' })).toEqual([
      ['LW801', 'counting.name', true],
    ]);
  });
});
