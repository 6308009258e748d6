import { describe, expect, it } from 'vitest';
import { startFirst, transitionWeights, traversal } from '../../../../src/core/phases/encode/order.js';
import { ring, tableMachine } from './machines.js';

describe('core/phases/encode/order', () => {
  it('weighs transitions by their share of the input space, both directions, ignoring self-loops', () => {
    // s0: x0=0 → s0, x0=1 → s1; s1: always → s0
    const f = tableMachine('w', 1, [
      [0, 1],
      [0, 0],
    ]);
    const w = transitionWeights(f);
    expect(w[0][1]).toBeCloseTo(1.5);
    expect(w[1][0]).toBeCloseTo(1.5);
    expect(w[0][0]).toBe(0);
  });

  it('puts the start state first, then FlatMachine order', () => {
    expect(startFirst(tableMachine('s', 0, [[0], [1], [2], [3]], 2))).toEqual([2, 0, 1, 3]);
  });

  it('walks a ring in ring order from the start', () => {
    const f = { ...ring(5), start: 3 };
    expect(traversal(f)).toEqual([3, 4, 0, 1, 2]);
  });

  it('follows the heaviest transition, and jumps to the state heaviest to the placed ones at a dead end', () => {
    // 2 inputs: s0 → s2 on three minterms, → s1 on one; s2 → s0 only; s1 → s3.
    const f = tableMachine('h', 2, [
      [1, 2, 2, 2],
      [3, 3, 3, 3],
      [0, 0, 0, 0],
      [3, 3, 3, 3],
    ]);
    expect(traversal(f)).toEqual([0, 2, 1, 3]);
  });
});
