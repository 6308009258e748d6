/**
 * The did-you-mean search: the same answer as a plain Levenshtein table wherever it searches,
 * and bounded work where the plain table is quadratic.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { boundedDistance, didYouMean, HINT_NAME_MAX, HINT_WORK } from '../../../src/core/model/did-you-mean.js';

/** The full Levenshtein table (Wagner & Fischer, J. ACM 21, 1974), as the reference. */
function levenshtein(a: string, b: string): number {
  let prev = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const cur = [i];
    for (let j = 1; j <= b.length; j++)
      cur[j] = Math.min(prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + (a[i - 1] === b[j - 1] ? 0 : 1));
    prev = cur;
  }
  return prev[b.length];
}

/** The search as it was before it was bounded: the closest candidate (the first of equals), if close enough. */
function plainDidYouMean(name: string, candidates: readonly string[]): string | undefined {
  let best: string | undefined;
  let bestD = Infinity;
  for (const c of candidates) {
    const d = levenshtein(name.toLowerCase(), c.toLowerCase());
    if (d < bestD) {
      bestD = d;
      best = c;
    }
  }
  return best !== undefined && bestD <= Math.max(2, Math.floor(name.length / 3)) ? best : undefined;
}

describe('core/model/did-you-mean', () => {
  it('gives the textbook distances (from memory: kitten → sitting 3; intention → execution 5 with unit costs, Jurafsky & Martin ch. 2)', () => {
    expect(boundedDistance('kitten', 'sitting', 5)).toBe(3);
    expect(boundedDistance('intention', 'execution', 9)).toBe(5);
    expect(levenshtein('intention', 'execution')).toBe(5);
    // Past the bound it answers bound + 1, without filling the table.
    expect(boundedDistance('kitten', 'sitting', 2)).toBe(3);
    expect(boundedDistance('a', 'abcdef', 1)).toBe(2);
    expect(boundedDistance('', '', 0)).toBe(0);
  });

  it('agrees with the full table within the bound (property, fixed seed)', () => {
    const word = fc.string({ unit: fc.constantFrom('a', 'b', 'c', 'd'), maxLength: 12 });
    fc.assert(
      fc.property(word, word, fc.integer({ min: 0, max: 8 }), (a, b, k) => {
        const d = levenshtein(a, b);
        expect(boundedDistance(a, b, k)).toBe(d <= k ? d : k + 1);
      }),
      { seed: 12, numRuns: 2000 },
    );
  });

  it('picks what the plain search picks (property, fixed seed)', () => {
    const word = fc.string({ unit: fc.constantFrom('a', 'b', 'B', 'c', '_', '1'), maxLength: 10 });
    fc.assert(
      fc.property(word, fc.array(word, { maxLength: 30 }), (name, candidates) => {
        expect(didYouMean(name, candidates)).toBe(plainDidYouMean(name, candidates));
      }),
      { seed: 7, numRuns: 1500 },
    );
    expect(didYouMean('marbel', ['lid', 'marble'])).toBe('marble');
    expect(didYouMean('MARBLE', ['marble'])).toBe('marble');
    expect(didYouMean('zzz', ['marble'])).toBeUndefined();
  });

  it('does no work on a name past HINT_NAME_MAX, and skips candidates by length first', () => {
    const long = 'a'.repeat(100_000);
    expect(didYouMean(long, [long.slice(1) + 'b'])).toBeUndefined();
    expect(didYouMean('a'.repeat(HINT_NAME_MAX), ['a'.repeat(HINT_NAME_MAX - 1) + 'b'])).toBe(
      'a'.repeat(HINT_NAME_MAX - 1) + 'b',
    );
    // Candidates of very different length never reach the table: a list of huge names costs nothing.
    const huge = Array.from({ length: 50 }, (_, i) => `${i}`.repeat(200_000));
    expect(didYouMean('stat', [...huge, 'state'])).toBe('state');
  });

  it('stops after HINT_WORK cells, answering with the best found so far', () => {
    // 5,000 candidates two edits away, then one a single edit away: the plain search finds the
    // last one; the bounded search has spent its cells before it gets there.
    const name = 'q'.repeat(30);
    const many = Array.from({ length: 5000 }, (_, i) => 'q'.repeat(28) + String.fromCharCode(65 + (i % 16)) + 'z');
    const closest = 'q'.repeat(29) + 'z';
    expect(many.length * (name.length + 1) * 3).toBeGreaterThan(HINT_WORK);
    expect(plainDidYouMean(name, [...many, closest])).toBe(closest);
    expect(didYouMean(name, [...many, closest])).toBe(many[0]);
    // 4,096 misspelt names against 4,096 states stay a few million cells in all.
    const states = Array.from({ length: 4096 }, (_, i) => `s${i}`);
    for (let i = 0; i < 4096; i += 512) expect(didYouMean(`t${i}`, states)).toBe(`s${i}`);
  });
});
