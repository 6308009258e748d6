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
import { cycleReference } from './reference.js';

const OUTPUTS = ['red', 'amber', 'green'];

/** A list of steps as the option writes it: each the outputs that show joined by +, or 0. */
const written = (steps: readonly (readonly string[])[]): string =>
  steps.map((s) => (s.length === 0 ? '0' : s.join('+'))).join(',');

/**
 * Step lists over the three outputs: 2 to 8 steps, each any subset (so repeats are common),
 * keeping the outputs that move (shown at some steps, not at all); lists where none moves are
 * left out (the behaviour refuses them, tested below).
 */
const stepLists = fc
  .array(fc.subarray(OUTPUTS), { minLength: 2, maxLength: 8 })
  .map((steps) => {
    const moving = OUTPUTS.filter((o) => steps.some((s) => s.includes(o)) && !steps.every((s) => s.includes(o)));
    return { outputs: moving, steps: steps.map((s) => moving.filter((o) => s.includes(o))) };
  })
  .filter((l) => l.outputs.length > 0);

/**
 * The smallest period of a cyclic list that divides its length: the length of its primitive
 * root (M. Lothaire, Combinatorics on Words, 1983, ch. 1 — from memory), by definition:
 * the least p dividing k with step j equal to step j + p for every j.
 */
function smallestPeriod(steps: readonly (readonly string[])[]): number {
  const k = steps.length;
  const key = steps.map((s) => s.join('+'));
  for (let p = 1; p < k; p++) if (k % p === 0 && key.every((s, j) => s === key[(j + p) % k])) return p;
  return k;
}

describe('core/behaviours/cycle', () => {
  // Reference: the step index moved on one each (advancing) clock modulo the list's length, back to 0 on a restart, through xstate 5.33.3's actor.
  it('shows each step in turn, every clock or on each pull, with or without a restart, through xstate (fast-check, seed 23)', () => {
    const cases = fc.record({ list: stepLists, advance: fc.boolean(), restart: fc.boolean() });
    fc.assert(
      fc.property(
        cases.chain((c) =>
          fc.tuple(
            fc.constant(c),
            levelClocks([...(c.advance ? ['cam'] : []), ...(c.restart ? ['again'] : []), 'unused'], 40),
          ),
        ),
        ([c, clocks]) => {
          const p = {
            outputs: c.list.outputs,
            steps: c.list.steps,
            ...(c.advance ? { advance: 'cam' } : {}),
            ...(c.restart ? { restart: 'again' } : {}),
          };
          const a = analysedBehaviour('cycle', {
            outputs: c.list.outputs.join(','),
            steps: written(c.list.steps),
            ...(c.advance ? { advance: 'cam' } : {}),
            ...(c.restart ? { restart: 'again' } : {}),
          });
          expect(throughXstate(a, clocks)).toEqual(cycleReference(clocks, p));
        },
      ),
      { seed: 23, numRuns: 150 },
    );
  });

  // A list of k steps gives k states; the states one smallest period apart show the same and move
  // alike, so minimisation leaves exactly the smallest period (a restart input keeps that).
  it('has one state per step, and state minimisation leaves the list’s smallest period (fast-check, seed 31)', () => {
    fc.assert(
      fc.property(stepLists, fc.boolean(), fc.boolean(), ({ outputs, steps }, advance, restart) => {
        const a = analysedBehaviour('cycle', {
          outputs: outputs.join(','),
          steps: written(steps),
          ...(advance ? { advance: 'cam' } : {}),
          ...(restart ? { restart: 'again' } : {}),
        });
        expect(stateCounts(a)).toEqual([steps.length, smallestPeriod(steps)]);
      }),
      { seed: 31, numRuns: 120 },
    );
    // By hand: a crossing's red, green, red, green is two steps over.
    expect(stateCounts(analysedBehaviour('cycle', { outputs: 'red,green', steps: 'red green red green' }))).toEqual([
      4, 2,
    ]);
  });

  it('builds with every check passing, and the lever machine shows the steps as the reference does (seed 61)', () => {
    const values = { outputs: 'red,amber,green', steps: 'red,red+amber,green,amber', advance: 'cam', restart: 'again' };
    const b = builtWithChecks(analysedBehaviour('cycle', values), 'auto');
    const p = {
      outputs: OUTPUTS,
      steps: [['red'], ['red', 'amber'], ['green'], ['amber']],
      advance: 'cam',
      restart: 'again',
    };
    fc.assert(
      fc.property(levelClocks(['cam', 'again'], 30), (clocks) => {
        expect(throughLevers(b, clocks)).toEqual(cycleReference(clocks, p));
      }),
      { seed: 61, numRuns: 6 },
    );
  });

  it('refuses parameters a user can get wrong, each with its code, the parameter and a hint', () => {
    const code = (v: Record<string, string>) => refusals('cycle', v);
    const base = { outputs: 'red,green' };
    expect(code({ ...base, steps: 'red,blue' })).toEqual([['LW805', 'cycle.steps', true]]);
    // An output that never moves: shown at no step, or at every step.
    expect(code({ outputs: 'red,green,amber', steps: 'red,green' })).toEqual([['LW805', 'cycle.steps', true]]);
    expect(code({ ...base, steps: 'red+green,red' })).toEqual([['LW805', 'cycle.steps', true]]);
    expect(code({ ...base, steps: 'red++green,0' })).toEqual([['LW805', 'cycle.steps', true]]);
    expect(code({ ...base, steps: 'red+red,green' })).toEqual([['LW803', 'cycle.steps', true]]);
    expect(code({ ...base, steps: 'red' })).toEqual([['LW800', 'cycle.steps', true]]);
    expect(code({ ...base, steps: Array(17).fill('red').join(',') })).toEqual([['LW800', 'cycle.steps', true]]);
    expect(code({ outputs: 'a,b,c,d,e,f,g', steps: 'a,b' })).toEqual([['LW800', 'cycle.outputs', true]]);
    expect(code({ ...base, steps: 'red,green', advance: 'red' })).toEqual([['LW803', 'cycle.advance', true]]);
    expect(code({ ...base, steps: 'red,green', advance: 'cam', restart: 'cam' })).toEqual([
      ['LW803', 'cycle.restart', true],
    ]);
    expect(code({ ...base })).toEqual([['LW802', 'cycle.steps', true]]);
    expect(code({ steps: 'red,green' })).toEqual([['LW802', 'cycle.outputs', true]]);
  });
});
