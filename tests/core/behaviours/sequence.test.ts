import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { failureFunction, nextPrefix } from '../../../src/core/behaviours/index.js';
import {
  analysedBehaviour,
  builtWithChecks,
  stateCounts,
  throughLevers,
  throughXstate,
  type Clock,
  refusals,
} from './harness.js';
import { sequenceReference } from './reference.js';

type Fallback = 'overlap' | 'strict';
type Open = 'one-clock' | 'until-closed';
interface Lock {
  inputs: string[];
  order: string[];
  output: string;
  close?: string;
  fallback: Fallback;
  open: Open;
}

const LEVERS = ['red', 'green', 'blue'];

const valuesOf = (p: Lock) => ({
  inputs: p.inputs.join(','),
  order: p.order.join(','),
  output: p.output,
  fallback: p.fallback,
  open: p.open,
  ...(p.close ? { close: p.close } : {}),
});

/** Locks over two or three levers (the third a decoy when the order leaves it out), orders of 1 to 6 presses. */
const locks: fc.Arbitrary<Lock> = fc
  .record({
    levers: fc.integer({ min: 2, max: 3 }),
    order: fc.array(fc.integer({ min: 0, max: 2 }), { minLength: 1, maxLength: 6 }),
    fallback: fc.constantFrom<Fallback>('overlap', 'strict'),
    open: fc.constantFrom<Open>('one-clock', 'until-closed'),
    close: fc.boolean(),
  })
  .map(({ levers, order, fallback, open, close }) => ({
    inputs: LEVERS.slice(0, levers),
    order: order.map((i) => LEVERS[i % levers]),
    output: 'flap',
    fallback,
    open,
    ...(close ? { close: 'shut' } : {}),
  }));

/** Clocks that are mostly single presses (so orders get completed), with idle clocks, presses of two at once and closes. */
function pressClocks(p: Lock, maxLength = 60): fc.Arbitrary<Clock[]> {
  const all = [...p.inputs, ...(p.close ? [p.close] : [])];
  const only = (...pulled: string[]): Clock => Object.fromEntries(all.map((n) => [n, pulled.includes(n) ? 1 : 0]));
  const clock = fc.oneof(
    { weight: 2, arbitrary: fc.constant(only()) },
    { weight: 12, arbitrary: fc.constantFrom(...p.inputs).map((x) => only(x)) },
    { weight: 1, arbitrary: fc.constant(only(p.inputs[0], p.inputs[1])) },
    { weight: p.close ? 1 : 0, arbitrary: fc.constant(only(...(p.close ? [p.close, p.inputs[0]] : []))) },
  );
  return fc.array(clock, { minLength: 1, maxLength });
}

describe('core/behaviours/sequence', () => {
  // Cormen, Leiserson, Rivest, Stein, "Introduction to Algorithms" (3rd ed.), §32.4: the prefix
  // function of ababaca is 0 0 1 2 3 0 1 (their Figure 32.10), written here with π[0] = 0 first.
  it('computes the Knuth–Morris–Pratt failure function of the textbook pattern ababaca', () => {
    expect(failureFunction([...'ababaca'])).toEqual([0, 0, 0, 1, 2, 3, 0, 1]);
    // CLRS §32.3, Figure 32.7: the string-matching automaton of ababaca (its transition table, rows
    // 0, 5 and 7; the figures are from memory of the book, and agree with δ(q, a) worked by hand).
    const pi = failureFunction([...'ababaca']);
    const d = (q: number, a: string) => nextPrefix([...'ababaca'], pi, q, a, 'overlap');
    expect([d(5, 'a'), d(5, 'b'), d(5, 'c')]).toEqual([1, 4, 6]);
    expect([d(7, 'a'), d(7, 'b'), d(7, 'c')]).toEqual([1, 2, 0]);
    expect([d(0, 'a'), d(0, 'b'), d(0, 'c')]).toEqual([1, 0, 0]);
  });

  // Reference: "the presses so far end with the order" (CLRS §32.3) or, strict, the progress since
  // the last wrong press — run through xstate 5.33.3's own actor on the exported configuration.
  it('opens exactly when the reference says, through xstate, over random locks and presses (fast-check, seed 5)', () => {
    fc.assert(
      fc.property(
        locks.chain((p) => fc.tuple(fc.constant(p), pressClocks(p))),
        ([p, clocks]) => {
          const a = analysedBehaviour('sequence', valuesOf(p));
          expect(throughXstate(a, clocks)).toEqual(sequenceReference(clocks, p));
        },
      ),
      { seed: 5, numRuns: 200 },
    );
  });

  // CLRS §32.3: the string-matching automaton of a pattern of length m has m + 1 states, and it is
  // minimal (state q is the longest prefix of the pattern ending the text so far; they all differ).
  it('has m + 1 states for an order of m presses, and state minimisation removes none (fast-check, seed 13)', () => {
    fc.assert(
      fc.property(locks, (p) => {
        const m = p.order.length;
        expect(stateCounts(analysedBehaviour('sequence', valuesOf(p)))).toEqual([m + 1, m + 1]);
      }),
      { seed: 13, numRuns: 150 },
    );
    const long = {
      inputs: LEVERS,
      order: [...'rgbrgbrgbrgbrgbr'].map((c) => LEVERS['rgb'.indexOf(c)]),
      output: 'flap',
      fallback: 'overlap',
      open: 'one-clock',
    } as const;
    expect(
      stateCounts(
        analysedBehaviour('sequence', valuesOf({ ...long, inputs: [...long.inputs], order: [...long.order] })),
      ),
    ).toEqual([17, 17]);
  });

  it('remembers an overlapping start after a wrong press (red, red, green, red opens red, green, red)', () => {
    const p: Lock = {
      inputs: LEVERS,
      order: ['red', 'green', 'red'],
      output: 'flap',
      fallback: 'overlap',
      open: 'one-clock',
    };
    const press = (x: string): Clock => ({
      red: x === 'red' ? 1 : 0,
      green: x === 'green' ? 1 : 0,
      blue: x === 'blue' ? 1 : 0,
    });
    const clocks = ['red', 'red', 'green', 'red', 'none'].map(press);
    const shown = throughXstate(analysedBehaviour('sequence', valuesOf(p)), clocks).map((s) => s.flap);
    expect(shown).toEqual([0, 0, 0, 0, 1]);
    const strict = throughXstate(analysedBehaviour('sequence', valuesOf({ ...p, fallback: 'strict' })), clocks);
    expect(strict.map((s) => s.flap)).toEqual([0, 0, 0, 0, 0]);
  });

  it('builds with every check passing, and the lever machine opens as the reference does (seed 34)', () => {
    const cases: Lock[] = [
      { inputs: LEVERS, order: ['red', 'green', 'red'], output: 'flap', fallback: 'overlap', open: 'one-clock' },
      {
        inputs: ['red', 'green'],
        order: ['green', 'green', 'red'],
        output: 'flap',
        fallback: 'strict',
        open: 'until-closed',
        close: 'shut',
      },
    ];
    for (const p of cases) {
      const b = builtWithChecks(analysedBehaviour('sequence', valuesOf(p)));
      fc.assert(
        fc.property(pressClocks(p, 40), (clocks) => {
          expect(throughLevers(b, clocks)).toEqual(sequenceReference(clocks, p));
        }),
        { seed: 34, numRuns: 6 },
      );
    }
  });

  it('refuses parameters a user can get wrong, each with its code, the parameter and a hint', () => {
    const code = (v: Record<string, string>) => refusals('sequence', v);
    expect(code({ order: '', output: 'flap' })).toEqual([['LW802', 'sequence.order', true]]);
    expect(code({ order: ' , ', output: 'flap' })).toEqual([['LW802', 'sequence.order', true]]);
    expect(code({ order: 'a,b,c,d,e,f,g,h,i' + ',a'.repeat(8), output: 'flap' })).toEqual([
      ['LW800', 'sequence.order', true],
      ['LW800', 'sequence.inputs', true],
    ]);
    expect(code({ order: 'red,gr-een', output: 'flap' })).toEqual([['LW801', 'sequence.order', true]]);
    expect(code({ inputs: 'red,green', order: 'red,blue', output: 'flap' })).toEqual([
      ['LW805', 'sequence.order', true],
    ]);
    expect(code({ inputs: 'red,green,red', order: 'red', output: 'flap' })).toEqual([
      ['LW803', 'sequence.inputs', true],
    ]);
    expect(code({ order: 'red,green', output: 'flap', close: 'green' })).toEqual([['LW803', 'sequence.inputs', true]]);
    expect(code({ order: 'red,flap', output: 'flap' })).toEqual([['LW803', 'sequence.inputs', true]]);
    expect(code({ order: 'red', output: 'flap', fallback: 'lenient' })).toEqual([['LW804', 'sequence.fallback', true]]);
  });
});
