import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { contains, coverContains, intersectCovers } from '../../../src/core/model/cube.js';
import { DONT_CARE, type FlatMachine } from '../../../src/core/model/flat.js';
import { excite } from '../../../src/core/phases/excite.js';
import {
  guard,
  proveExclusive,
  setFirst,
  splitFunction,
  termsOf,
  unguardedFunction,
  type Price,
} from '../../../src/core/phases/guard.js';
import { minimiseCover } from '../../../src/core/phases/minimise-logic/index.js';
import type { SopCover } from '../../../src/core/phases/minimise-logic/types.js';
import {
  Logic,
  allDontCaresOne,
  allDontCaresZero,
  coverFormula,
  randomEncoding,
  randomMachine,
  unsat,
} from '../support/synthesis.js';

/** Price by term and literal count (enough to exercise the choice). */
const price = (c: SopCover): Price => {
  const cords = c.terms.reduce((s, t) => s + [...t.cube].filter((x) => x !== '-').length + t.outputs.length, 0);
  return { gates: c.terms.length, cords, cost: 4 * c.terms.length + cords };
};

/**
 * One bit q, input x. A: x = 1 → B, x = 0 → free. B: x = 0 → A, x = 1 → free.
 * S must be 1 at (q, x) = 01 and 0 at 10; R the other way round; 00 and 11 are free.
 */
const loose: FlatMachine = {
  name: 'loose',
  inputs: ['x'],
  outputs: [],
  states: ['A', 'B'],
  start: 0,
  rows: [
    [
      { cube: '0', next: DONT_CARE, out: [], transition: -1 },
      { cube: '1', next: 1, out: [], transition: 0 },
    ],
    [
      { cube: '0', next: 0, out: [], transition: 0 },
      { cube: '1', next: DONT_CARE, out: [], transition: -1 },
    ],
  ],
  never: [],
};
const looseEnc = { strategy: 'binary', bits: 1, codes: ['0', '1'] };

describe('core/phases/guard', () => {
  it('without the guard, two minimum covers of S and R overlap: the guard matters', () => {
    const ex = excite(loose, looseEnc);
    const f = unguardedFunction(ex);
    // S = x and R = q are each a one-literal cover inside on ∪ dc of its own function …
    const s = ['-1'],
      r = ['1-'];
    expect(coverContains(s, f.on[0]) && coverContains([...f.on[0], ...f.dc[0]], s)).toBe(true);
    expect(coverContains(r, f.on[1]) && coverContains([...f.on[1], ...f.dc[1]], r)).toBe(true);
    // … and together they pull S̄ and R̄ at once when q = 1, x = 1.
    const unsafe: SopCover = {
      vars: 2,
      functions: 2,
      terms: [
        { cube: '-1', outputs: [0] },
        { cube: '1-', outputs: [1] },
      ],
    };
    expect(proveExclusive(unsafe, 1)).toEqual({ ok: false, latchesChecked: 1, overlap: { bit: 0, point: '11' } });
    // The guarded functions leave no such choice: on ∪ dc of S and of R are disjoint.
    const g = splitFunction(ex);
    expect(intersectCovers([...g.on[0], ...g.dc[0]], [...g.on[1], ...g.dc[1]])).toEqual([]);
  });

  it("split-by-bit leaves the next state free on global don't-cares (no forced hold, so unused codes are no traps)", () => {
    const ex = excite(loose, looseEnc);
    const g = splitFunction(ex);
    // At q = 0, x = 0 (free): S may be 1 (next 1) or 0 with R = 0 (next 0).
    expect(g.dc[0].some((c) => contains(c, '00'))).toBe(true);
    // At q = 1, x = 1 (free): R may be 1 (next 0) or 0 with S = 0 (next 1).
    expect(g.dc[1].some((c) => contains(c, '11'))).toBe(true);
  });

  it("is safe whatever the minimiser does with its don't-cares (random machines, MiniSat via logic-solver)", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 1e9 }), (seed) => {
        const f = randomMachine(seed, { maxStates: 6, maxInputs: 3, maxOutputs: 0, incomplete: true });
        const bits = Math.max(1, Math.ceil(Math.log2(f.states.length))) + (seed % 2);
        const ex = excite(f, randomEncoding(f, bits, seed));
        const vars = ex.vars;
        for (const minimise of [allDontCaresOne, allDontCaresZero, minimiseCover]) {
          for (const method of ['split-by-bit', 'set-first'] as const) {
            const g = guard(ex, { method, minimise, price });
            expect(g.report.ok).toBe(true);
            expect(g.report.method).toBe(method);
            for (let j = 0; j < bits; j++) {
              // Independent proof: S_j ∧ R_j is UNSAT over all codes × all inputs.
              expect(
                unsat(
                  Logic.and(
                    coverFormula(termsOf(g.cover, 2 * j), vars),
                    coverFormula(termsOf(g.cover, 2 * j + 1), vars),
                  ),
                ),
              ).toBe(true);
              // And the covers still implement the on-sets.
              expect(coverContains(termsOf(g.cover, 2 * j), ex.set[j].on)).toBe(true);
              expect(coverContains(termsOf(g.cover, 2 * j + 1), ex.reset[j].on)).toBe(true);
            }
          }
        }
        // The split function itself is safe by construction, before any minimiser.
        const s = splitFunction(ex);
        for (let j = 0; j < bits; j++)
          expect(intersectCovers([...s.on[2 * j], ...s.dc[2 * j]], [...s.on[2 * j + 1], ...s.dc[2 * j + 1]])).toEqual(
            [],
          );
      }),
      { seed: 42, numRuns: 15 },
    );
  });

  it("set-first takes the set cover out of the reset don't-cares", () => {
    const ex = excite(loose, looseEnc);
    const { cover, functions } = setFirst(ex, allDontCaresOne);
    expect([...termsOf(cover, 0)].sort()).toEqual(['00', '01', '11']);
    expect(intersectCovers(functions[1].dc[0], termsOf(cover, 0))).toEqual([]);
    expect(proveExclusive(cover, 1).ok).toBe(true);
  });

  it('auto keeps the cheaper safe method and reports the cost against the unguarded minimisation', () => {
    const ex = excite(loose, looseEnc);
    const split = guard(ex, { method: 'split-by-bit', minimise: minimiseCover, price });
    const first = guard(ex, { method: 'set-first', minimise: minimiseCover, price });
    const auto = guard(ex, { minimise: minimiseCover, price });
    const cheaper = price(split.cover).cost <= price(first.cover).cost ? split : first;
    expect(auto.report.method).toBe(cheaper.report.method);
    const base = price(minimiseCover(unguardedFunction(ex)));
    expect(auto.report.extraGates).toBe(price(auto.cover).gates - base.gates);
    expect(auto.report.extraCords).toBe(price(auto.cover).cords - base.cords);
  });

  it('reports an unprovable cover as not ok (a minimiser that ignores its off-set)', () => {
    const ex = excite(loose, looseEnc);
    const careless = (): SopCover => ({ vars: 2, functions: 2, terms: [{ cube: '--', outputs: [0, 1] }] });
    const g = guard(ex, { minimise: careless, price });
    expect(g.report.ok).toBe(false);
    expect(g.proof.overlap?.bit).toBe(0);
  });

  it('needs nothing for a machine without state bits', () => {
    const ex = excite(
      { ...loose, states: ['A'], rows: [loose.rows[0].map((r) => ({ ...r, next: 0 }))] },
      { strategy: 'x', bits: 0, codes: [''] },
    );
    const g = guard(ex, { minimise: minimiseCover, price });
    expect(g.report).toEqual({ ok: true, extraGates: 0, extraCords: 0, method: 'none (no latches)' });
  });
});
