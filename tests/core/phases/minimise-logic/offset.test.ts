import { describe, it, expect } from 'vitest';
import { makeSpace, parseInput, formatInput } from '../../../../src/core/phases/minimise-logic/bitcube.js';
import { compact } from '../../../../src/core/phases/minimise-logic/tidy.js';
import { boundary, OFFSET_LIMIT } from '../../../../src/core/phases/minimise-logic/offset.js';
import { minimiseSop, verifyCover } from '../../../../src/core/phases/minimise-logic/index.js';
import { seededRandom } from '../../../../src/core/model/random.js';
import { bitsOf, mintermsOf } from './brute.js';

/** A dense random function's allowed set: each point on or don't-care with probability 0.4. */
function denseAllowed(n: number, seed: number): string[] {
  const rnd = seededRandom(seed);
  const out: string[] = [];
  for (let x = 0; x < 2 ** n; x++) if (rnd.next() < 0.4) out.push(bitsOf(x, n));
  return out;
}

describe('core/phases/minimise-logic/offset', () => {
  // The minimiser used to fall back to tautology checks (expand-within.ts) on every function of
  // 13 variables or more; dense functions must now get their off-set, whatever their size.
  it('dense functions of 13 and 14 variables get an explicit off-set, and it misses on ∪ dc', () => {
    for (const n of [13, 14]) {
      const sp = makeSpace(n, 1);
      const allowed = denseAllowed(n, n);
      const b = boundary(sp, [
        compact(
          sp,
          allowed.map((c) => parseInput(sp, c)),
        ),
      ]);
      expect('off' in b).toBe(true);
      if (!('off' in b)) return;
      // By truth table: the off cubes hold exactly the points outside on ∪ dc.
      const inside = new Uint8Array(2 ** n);
      for (const c of allowed) inside[parseInt(c, 2)] = 1;
      const off = new Uint8Array(2 ** n);
      for (const r of b.off) for (const x of mintermsOf(formatInput(sp, r))) off[x] = 1;
      let wrong = 0;
      for (let x = 0; x < 2 ** n; x++) if (off[x] === inside[x]) wrong++;
      expect(wrong).toBe(0);
    }
  });

  it('a sparse function of many variables past the limit gets its allowed sets instead', () => {
    // Ten 2-literal cubes on disjoint variables: 2^10 off cubes. With a floor of 20 000 the
    // off-set is built; fifteen such cubes (2^15 off cubes) pass the limit.
    const n = 40;
    const pairs = (k: number): string[] =>
      Array.from({ length: k }, (_, i) => '-'.repeat(2 * i) + '11' + '-'.repeat(n - 2 * i - 2));
    const sp = makeSpace(n, 1);
    expect(2 ** 15).toBeGreaterThan(Math.max(OFFSET_LIMIT.floor, OFFSET_LIMIT.ratio * 15));
    expect('off' in boundary(sp, [pairs(10).map((c) => parseInput(sp, c))])).toBe(true);
    expect('allowed' in boundary(sp, [pairs(15).map((c) => parseInput(sp, c))])).toBe(true);
    // The minimiser still finishes on it, through the tautology checks of EXPAND.
    const on = pairs(15);
    const cover = minimiseSop(on, [], n);
    expect(
      verifyCover(
        { vars: n, on: [on], dc: [[]] },
        { vars: n, functions: 1, terms: cover.map((cube) => ({ cube, outputs: [0] })) },
      ),
    ).toEqual({ ok: true });
    expect(cover.sort()).toEqual([...on].sort());
  });
});
