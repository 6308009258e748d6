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
import { toggleReference } from './reference.js';

const VALUES = { input: 'button', output: 'lamp' };
const P = { input: 'button', output: 'lamp' };

describe('core/behaviours/toggle', () => {
  // Reference: the parity of the input's rising edges so far (a press held down is one edge), through xstate 5.33.3's actor.
  it('flips the output on each rising edge, through xstate (fast-check, seed 17)', () => {
    const a = analysedBehaviour('toggle', VALUES);
    fc.assert(
      fc.property(levelClocks(['button'], 100), (clocks) => {
        expect(throughXstate(a, clocks)).toEqual(toggleReference(clocks, P));
      }),
      { seed: 17, numRuns: 200 },
    );
  });

  // Remembering the output (2 values) and the input's last level (2 values) takes 4 states, all
  // distinguishable: the edge-triggered T flip-flop seen as a Moore machine.
  it('has 4 states, and state minimisation removes none', () => {
    expect(stateCounts(analysedBehaviour('toggle', VALUES))).toEqual([4, 4]);
  });

  it('builds with every check passing, and the lever machine flips as the reference does (seed 89)', () => {
    const b = builtWithChecks(analysedBehaviour('toggle', VALUES), 'auto');
    fc.assert(
      fc.property(levelClocks(['button'], 40), (clocks) => {
        expect(throughLevers(b, clocks)).toEqual(toggleReference(clocks, P));
      }),
      { seed: 89, numRuns: 8 },
    );
  });

  it('refuses parameters a user can get wrong, each with its code, the parameter and a hint', () => {
    const code = (v: Record<string, string>) => refusals('toggle', v);
    expect(code({ input: 'button', output: 'button' })).toEqual([['LW803', 'toggle.output', true]]);
    expect(code({ input: 'x'.repeat(129), output: 'lamp' })).toEqual([['LW801', 'toggle.input', true]]);
    expect(code({ output: 'lamp' })).toEqual([['LW802', 'toggle.input', true]]);
  });
});
