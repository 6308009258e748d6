import { describe, expect, it } from 'vitest';
import { adjacencyCost, CostBook } from '../../../../src/core/phases/encode/cost.js';
import { ring } from './machines.js';

describe('core/phases/encode/cost', () => {
  it('adjacency cost: transition share × Hamming distance, plus n/2 per bit', () => {
    const f = ring(4); // each step x0 = 1 covers half the input space
    const cost = adjacencyCost(f);
    expect(cost(['00', '01', '11', '10'], 2)).toBeCloseTo(4 * 0.5 * 1 + 2 * 2);
    expect(cost(['00', '01', '10', '11'], 2)).toBeCloseTo(0.5 * (1 + 2 + 1 + 2) + 2 * 2);
  });

  it('prices an assignment once per symmetry class and keeps the first of equal best costs', () => {
    let calls = 0;
    const book = new CostBook({ cost: (c) => (calls++, c[0] === '11' ? 1 : 2), pins: new Map(), maxEvaluations: 10 });
    expect(book.price([0, 1, 3], 2)).toBe(2);
    expect(book.price([3, 2, 0], 2)).toBe(2); // complement of both bits: same class
    expect(calls).toBe(1);
    expect(book.priceCodes(['00', '11', '01'], 2)).toBe(2);
    expect(book.best?.codes).toEqual(['00', '01', '11']);
    expect(book.evaluations).toBe(2);
  });

  it('keeps pinned codes out of the symmetries', () => {
    const book = new CostBook({ cost: () => 0, pins: new Map([[0, '00']]), maxEvaluations: 10 });
    expect(book.group(2)).toHaveLength(2); // identity and the bit swap fix 00
    expect(book.group(3)).toHaveLength(48); // pins of another length fix nothing
  });

  it('treats NaN as an infinite cost and stops at the evaluation budget', () => {
    const book = new CostBook({ cost: () => Number.NaN, pins: new Map(), maxEvaluations: 1 });
    expect(book.price([0, 1], 1)).toBe(Infinity);
    expect(book.exhausted()).toBe(true);
  });
});
