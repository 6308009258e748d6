import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { createMachine, getInitialSnapshot, getNextSnapshot } from 'xstate';
import { DONT_CARE, type FlatMachine } from '../../../src/core/model/flat.js';
import { runAbstract, stepAbstract } from '../../../src/core/sim/abstract.js';
import { tableMachine } from '../phases/minimise-states.support.js';

// M. Morris Mano & Michael D. Ciletti, Digital Design, 5th ed. (2013), §5.7 "State Reduction
// and Assignment": the seven-state table (states a–g, input x, output y) — from memory.
const MANO = {
  inputs: ['x'],
  outputs: ['y'],
  rows: {
    a: ['a/0', 'b/0'],
    b: ['c/0', 'd/0'],
    c: ['a/0', 'd/0'],
    d: ['e/0', 'f/1'],
    e: ['a/0', 'f/1'],
    f: ['g/0', 'f/1'],
    g: ['a/0', 'f/1'],
  } as Record<string, string[]>,
};

describe('core/sim/abstract', () => {
  it("steps the Mano & Ciletti table through the book's input sequence 01010110100 (5th ed. §5.7, from memory)", () => {
    const f = tableMachine(MANO);
    const run = runAbstract(f, [...'01010110100']);
    // The book lists states a a b c d e f f g f g a and outputs 0 0 0 0 0 1 1 0 1 0 0.
    expect(
      run
        .map((r) => r.stateName)
        .concat(run[run.length - 1].nextName)
        .join(' '),
    ).toBe('a a b c d e f f g f g a');
    expect(run.map((r) => r.outputs.join('')).join(' ')).toBe('0 0 0 0 0 1 1 0 1 0 0');
    expect(run.map((r) => r.clock)).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10]);
  });

  it('agrees with xstate 5 (independent reference simulator) on the state sequence of random runs', () => {
    const f = tableMachine(MANO);
    const states: Record<string, { on: Record<string, string> }> = {};
    for (const [name, entries] of Object.entries(MANO.rows))
      states[name] = { on: { x0: entries[0].split('/')[0], x1: entries[1].split('/')[0] } };
    const reference = createMachine({ id: 'mano', initial: 'a', states });
    fc.assert(
      fc.property(fc.array(fc.constantFrom('0', '1'), { maxLength: 40 }), (seq) => {
        const ours = runAbstract(f, seq).map((r) => r.nextName);
        let snap = getInitialSnapshot(reference);
        const theirs = seq.map((x) => {
          snap = getNextSnapshot(reference, snap, { type: `x${x}` });
          return typeof snap.value === 'string' ? snap.value : JSON.stringify(snap.value);
        });
        expect(ours).toEqual(theirs);
      }),
      { seed: 42, numRuns: 100 },
    );
  });

  it('stays in the state where the next state is free, and says so', () => {
    const f = tableMachine({ inputs: ['x'], outputs: ['z'], rows: { p: ['-/1', 'q/0'], q: ['p/-', 'q/1'] } });
    expect(stepAbstract(f, 0, '0')).toEqual({ next: 0, outputs: [1] });
    const run = runAbstract(f, ['1', '0', '0']);
    expect(run.map((r) => [r.stateName, r.nextName, r.nextFree])).toEqual([
      ['p', 'q', false],
      ['q', 'p', false],
      ['p', 'p', true],
    ]);
    expect(run[1].outputs).toEqual(['-']);
  });

  it('gives free outputs and stays on inputs the machine excludes with `never`', () => {
    const f: FlatMachine = {
      name: 'n',
      inputs: ['a', 'b'],
      outputs: ['z'],
      states: ['s', 't'],
      start: 0,
      never: ['11'],
      rows: [
        [
          { cube: '0-', next: 1, out: [1], transition: 0 },
          { cube: '10', next: DONT_CARE, out: [0], transition: 1 },
        ],
        [
          { cube: '0-', next: 0, out: [0], transition: 0 },
          { cube: '10', next: 1, out: [1], transition: 1 },
        ],
      ],
    };
    expect(stepAbstract(f, 0, '11')).toEqual({ next: 0, outputs: ['-'] });
    const run = runAbstract(f, ['01', '11', '10'], 1);
    expect(run.map((r) => [r.stateName, r.excluded, r.outputs[0]])).toEqual([
      ['t', false, 0],
      ['s', true, '-'],
      ['s', false, 0],
    ]);
  });

  it('returns a copy of the row outputs (the caller may not change the table)', () => {
    const f = tableMachine(MANO);
    const step = stepAbstract(f, 3, '1');
    step.outputs[0] = 0;
    expect(f.rows[3][1].out).toEqual([1]);
  });
});
