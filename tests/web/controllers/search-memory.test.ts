/**
 * The page's memory of searches (src/web/controllers/search-memory.ts): least recently used
 * goes first, past its size. The order rule is the textbook LRU replacement policy (e.g.
 * A. S. Tanenbaum, Modern Operating Systems, page replacement: LRU); the outcomes here are
 * invented stand-ins, the mechanism is what is checked.
 */
import { describe, expect, it } from 'vitest';
import { SEARCH_MEMORY, SearchMemory } from '../../../src/web/controllers/search-memory.js';

const outcome = (n: number) => ({ encoding: { strategy: 'auto', bits: 1, codes: [String(n % 2)] }, diagnostics: [] });

describe('src/web/controllers/search-memory', () => {
  it('keeps at most its size, forgetting the least recently used', () => {
    const m = new SearchMemory(3);
    for (const k of ['a', 'b', 'c']) m.remember({ key: k, outcome: outcome(1) });
    m.remember({ key: 'a', outcome: outcome(1) }); // used again
    m.remember({ key: 'd', outcome: outcome(2) });
    expect(m.entries().map((e) => e.key)).toEqual(['d', 'a', 'c']);
  });

  it('holds one entry per key, the newest outcome', () => {
    const m = new SearchMemory();
    m.remember({ key: 'a', outcome: outcome(1) });
    m.remember({ key: 'a', outcome: outcome(2) });
    expect(m.entries()).toEqual([{ key: 'a', outcome: outcome(2) }]);
  });

  it('is small by default: a few machines and their edits', () => {
    const m = new SearchMemory();
    for (let i = 0; i < 20; i++) m.remember({ key: String(i), outcome: outcome(i) });
    expect(m.entries()).toHaveLength(SEARCH_MEMORY);
    expect(m.entries()[0].key).toBe('19');
  });
});
