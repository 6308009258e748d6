import { describe, expect, it } from 'vitest';
import { anneal } from '../../../../src/core/phases/encode/anneal.js';
import { CostBook } from '../../../../src/core/phases/encode/cost.js';
import { seededRandom } from '../../../../src/core/model/random.js';
import { ring, syntheticCost } from './machines.js';

describe('core/phases/encode/anneal', () => {
  const f = ring(10);
  const cost = syntheticCost(f);

  function run(seed: number, pinned = new Map<number, number>(), evaluations = 150) {
    const seen: (readonly string[])[] = [];
    const book = new CostBook({
      cost: (c, b) => (seen.push(c), cost(c, b)),
      pins: new Map([...pinned].map(([s, c]) => [s, c.toString(2).padStart(4, '0')])),
      maxEvaluations: evaluations,
    });
    anneal(book, { n: 10, bits: 4, pinned, restarts: 2 }, seededRandom(seed));
    return { book, seen };
  }

  it('never moves a pinned state and only tries distinct codes', () => {
    const { seen } = run(
      3,
      new Map([
        [0, 15],
        [5, 6],
      ]),
    );
    expect(seen.length).toBeGreaterThan(0);
    for (const c of seen) {
      expect(c[0]).toBe('1111');
      expect(c[5]).toBe('0110');
      expect(new Set(c).size).toBe(10);
    }
  });

  it('stays within the evaluation budget and repeats itself for a seed', () => {
    const a = run(11);
    const b = run(11);
    expect(a.book.evaluations).toBe(150);
    expect(a.seen).toEqual(b.seen);
    expect(a.book.best).toEqual(b.book.best);
  });

  it('improves on its random start', () => {
    const { book, seen } = run(5);
    expect(book.best?.cost).toBeLessThan(cost(seen[0], 4));
  });
});
