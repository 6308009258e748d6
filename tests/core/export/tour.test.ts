import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { DONT_CARE, rowFor, type FlatMachine } from '../../../src/core/model/flat.js';
import { coverHolds } from '../../../src/core/model/cube.js';
import { commissioningTour, reachableTransitions, type TourClock } from '../../../src/core/export/tour.js';
import { randomMachine } from '../support/synthesis.js';
import { exampleNames, minimisedExample } from './support.js';

/** Replay a tour on the table itself: every clock must be the row it claims, from where the previous one left. */
function replay(f: FlatMachine, tour: readonly TourClock[]): Set<string> {
  const taken = new Set<string>();
  let s = f.start;
  for (const c of tour) {
    if (c.reset) s = f.start;
    expect(c.state).toBe(s);
    expect(coverHolds(f.never, c.inputs)).toBe(false);
    const row = rowFor(f, s, c.inputs);
    expect(row).toBe(f.rows[s][c.row]);
    expect(row?.next).toBe(c.next);
    expect(c.next).not.toBe(DONT_CARE);
    taken.add(`${s}:${c.row}`);
    s = c.next;
  }
  return taken;
}

describe('core/export/tour', () => {
  // A hand-made machine: a two-state toggle on input t, and a trap state reachable only by u.
  const trap: FlatMachine = {
    name: 'trap',
    inputs: ['t', 'u'],
    outputs: ['z'],
    states: ['a', 'b', 'stuck'],
    start: 0,
    never: ['11'],
    rows: [
      [
        { cube: '10', next: 1, out: [0], transition: 0 },
        { cube: '01', next: 2, out: [0], transition: 1 },
        { cube: '00', next: 0, out: [0], transition: -1 },
      ],
      [
        { cube: '10', next: 0, out: [1], transition: 0 },
        { cube: '0-', next: 1, out: [1], transition: -1 },
      ],
      [{ cube: '--', next: 2, out: [0], transition: -1 }],
    ],
  };

  it('takes every reachable transition, resetting out of a state it cannot leave', () => {
    const tour = commissioningTour(trap);
    const taken = replay(trap, tour);
    expect([...taken].sort()).toEqual(
      reachableTransitions(trap)
        .map(([s, k]) => `${s}:${k}`)
        .sort(),
    );
    // The trap is entered once and left by a reset; nothing else needs one.
    expect(tour.filter((c) => c.reset).length).toBe(0);
    expect(tour[tour.length - 1].next).toBe(2);
    // Free inputs are released: the hold row '0-' of b is taken with u released.
    expect(tour.find((c) => c.state === 1 && c.row === 1)?.inputs).toBe('00');
  });

  it('resets when transitions are left behind a one-way door, and only then', () => {
    // Two traps reachable from the start: at least one reset is unavoidable.
    const forks: FlatMachine = {
      name: 'forks',
      inputs: ['t', 'u'],
      outputs: [],
      states: ['a', 'x', 'y'],
      start: 0,
      never: ['11'],
      rows: [
        [
          { cube: '10', next: 1, out: [], transition: 0 },
          { cube: '01', next: 2, out: [], transition: 1 },
          { cube: '00', next: 0, out: [], transition: -1 },
        ],
        [{ cube: '--', next: 1, out: [], transition: -1 }],
        [{ cube: '--', next: 2, out: [], transition: -1 }],
      ],
    };
    const tour = commissioningTour(forks);
    expect(tour.filter((c) => c.reset)).toHaveLength(1);
    expect(replay(forks, tour).size).toBe(reachableTransitions(forks).length);
    // The start state's own loop is taken before the machine leaves for a trap.
    expect(tour[0]).toEqual({ reset: false, inputs: '00', state: 0, row: 2, next: 0 });
  });

  it('leaves out rows whose next state is free, and unreachable states', () => {
    const f: FlatMachine = {
      ...trap,
      rows: [
        [
          { cube: '1-', next: DONT_CARE, out: [0], transition: 0 },
          { cube: '0-', next: 0, out: [0], transition: -1 },
        ],
        trap.rows[1],
        trap.rows[2],
      ],
      never: [],
    };
    expect(reachableTransitions(f)).toEqual([[0, 1]]);
    expect(commissioningTour(f)).toEqual([{ reset: false, inputs: '00', state: 0, row: 1, next: 0 }]);
  });

  it('covers every reachable transition of random machines (property, seeded)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1_000_000 }), (seed) => {
        const f = randomMachine(seed, { maxStates: 8, maxInputs: 3, maxOutputs: 2, incomplete: true });
        const tour = commissioningTour(f);
        const taken = replay(f, tour);
        expect(taken.size).toBe(reachableTransitions(f).length);
      }),
      { seed: 42, numRuns: 200 },
    );
  });

  it('covers every reachable transition of the built examples, deterministically', () => {
    for (const name of exampleNames()) {
      const f = minimisedExample(name);
      const tour = commissioningTour(f);
      expect(replay(f, tour).size, name).toBe(reachableTransitions(f).length);
      expect(commissioningTour(f)).toEqual(tour);
    }
  });

  it('stops at maxClocks', () => {
    expect(commissioningTour(trap, { maxClocks: 2 })).toHaveLength(2);
  });
});
