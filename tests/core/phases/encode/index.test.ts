import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { DEFAULT_SEARCH, ENCODINGS, encode, type EncodeOptions } from '../../../../src/core/phases/encode/index.js';
import type { FlatMachine } from '../../../../src/core/model/flat.js';
import { ring, syntheticCost, tableMachine, wellFormed } from './machines.js';

describe('core/phases/encode', () => {
  it('offers the six strategies by name', () => {
    expect(ENCODINGS).toEqual(['binary', 'gray', 'johnson', 'one-hot', 'pinned', 'auto']);
    // 6 states in 3 bits have 420 classes (McCluskey & Unger 1959): exhaustive by default.
    expect(DEFAULT_SEARCH.exhaustiveClasses).toBeGreaterThanOrEqual(420);
    expect(encode(ring(6), 'auto').search).toMatchObject({ method: 'exhaustive', complete: true, classes: 420 });
    // 7 states: 840 classes, so anneal; binary, Gray and Johnson are priced first (one-hot's
    // 7 bits are more than 3 over the minimum of 3).
    expect(encode(ring(7), 'auto').search).toMatchObject({
      method: 'annealing',
      evaluations: 3 + DEFAULT_SEARCH.annealingEvaluations,
    });
  });

  it('reports an unknown strategy name with LW700 and a did-you-mean', () => {
    const r = encode(ring(4), 'grey' as never);
    expect(r.encoding).toBeUndefined();
    expect(r.diagnostics).toHaveLength(1);
    expect(r.diagnostics[0].code).toBe('LW700');
    expect(r.diagnostics[0].message).toContain("did you mean 'gray'?");
    expect(encode(ring(4), 'onehot' as never).diagnostics[0].message).toContain("'one-hot'");
    expect(encode(ring(4), 'toString' as never).diagnostics[0].code).toBe('LW700');
  });

  it('accepts a strategy function and checks what it returns', () => {
    const reversed = (f: FlatMachine) => ({
      strategy: 'reversed',
      bits: 2,
      codes: f.states.map((_, s) => (3 - s).toString(2).padStart(2, '0')),
    });
    expect(encode(ring(4), reversed).encoding?.codes).toEqual(['11', '10', '01', '00']);
    const clash = () => ({ strategy: 'clash', bits: 2, codes: ['00', '01', '01', '11'] });
    const r = encode(ring(4), clash);
    expect(r.encoding).toBeUndefined();
    expect(r.diagnostics.map((d) => d.code)).toEqual(['LW701']);
    expect(r.diagnostics[0].message).toContain("'s1' and 's2'");
    expect(encode(ring(4), () => ({ strategy: 'short', bits: 2, codes: ['00', '01'] })).diagnostics[0].code).toBe(
      'LW701',
    );
  });

  it('reports bad options with LW700 and runs nothing', () => {
    for (const o of [
      { seed: -1 },
      { seed: 1.5 },
      { budget: { evaluations: 0 } },
      { budget: { millis: Number.NaN } },
    ] as EncodeOptions[]) {
      const r = encode(ring(4), 'auto', o);
      expect(r.encoding, JSON.stringify(o)).toBeUndefined();
      expect(r.diagnostics.map((d) => d.code)).toEqual(['LW700']);
    }
  });

  it('warns that a time budget without a clock is ignored', () => {
    const r = encode(ring(4), 'auto', { budget: { millis: 100 } });
    expect(r.diagnostics.map((d) => [d.code, d.severity])).toEqual([['LW700', 'warning']]);
    expect(r.encoding).toBeDefined();
  });

  it('reports a machine with no states (LW300) instead of throwing', () => {
    const r = encode(tableMachine('empty', 1, []), 'binary');
    expect(r.diagnostics.map((d) => d.code)).toEqual(['LW300']);
  });

  it('every named strategy gives well-formed, repeatable codes on random machines (fast-check, seed 42)', () => {
    const arb = fc.integer({ min: 2, max: 12 }).chain((n) =>
      fc.tuple(
        fc.array(fc.array(fc.integer({ min: 0, max: n - 1 }), { minLength: 2, maxLength: 2 }), {
          minLength: n,
          maxLength: n,
        }),
        fc.integer({ min: 0, max: n - 1 }),
      ),
    );
    fc.assert(
      fc.property(arb, ([next, start]) => {
        const f = tableMachine('random', 1, next, start);
        for (const s of ['binary', 'gray', 'johnson', 'one-hot'] as const) {
          const a = encode(f, s);
          expect(a.encoding && wellFormed(f, a.encoding), s).toBe(true);
          expect(encode(f, s)).toEqual(a);
        }
        expect(encode(f, 'binary').encoding?.codes[start]).toMatch(/^0*$/);
        expect(encode(f, 'one-hot').encoding?.codes[start]).toMatch(/^10*$/);
        const auto = encode(f, 'auto', { cost: syntheticCost(f), budget: { evaluations: 60 } });
        expect(auto.encoding && wellFormed(f, auto.encoding)).toBe(true);
      }),
      { seed: 42, numRuns: 40 },
    );
  });
});
