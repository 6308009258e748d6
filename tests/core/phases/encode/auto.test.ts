import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { encode } from '../../../../src/core/phases/encode/index.js';
import type { FlatMachine } from '../../../../src/core/model/flat.js';
import { synthesise } from '../../../../src/core/synthesise.js';
import { DEFAULT_PROFILE } from '../../../../src/core/physics/profile.js';
import { partsCost } from '../../../../src/core/phases/map/counts.js';
import { allAssignments, distance, ring, syntheticCost, tableMachine, wellFormed } from './machines.js';

/** The true minimum of a cost over every injective assignment at `bits` (brute force). */
function bruteMinimum(f: FlatMachine, bits: number, cost: (c: readonly string[], b: number) => number): number {
  let best = Infinity;
  for (const a of allAssignments(f.states.length, bits)) best = Math.min(best, cost(a, bits));
  return best;
}

/** Smallest image of an assignment under every bit permutation and complementation. */
function orbitKey(codes: readonly string[]): string {
  const b = codes[0].length;
  const perms = (k: number): number[][] =>
    k === 0
      ? [[]]
      : perms(k - 1).flatMap((p) => Array.from({ length: k }, (_, at) => [...p.slice(0, at), k - 1, ...p.slice(at)]));
  let best = '';
  for (const p of perms(b))
    for (let mask = 0; mask < 2 ** b; mask++) {
      const img = codes
        .map((c) => p.map((_, i) => ((c[p[i]] === '1') !== (((mask >> i) & 1) === 1) ? '1' : '0')).join(''))
        .join(',');
      if (best === '' || img < best) best = img;
    }
  return best;
}

const machineArb = fc.integer({ min: 2, max: 6 }).chain((n) =>
  fc.array(fc.array(fc.integer({ min: 0, max: n - 1 }), { minLength: 4, maxLength: 4 }), {
    minLength: n,
    maxLength: n,
  }),
);

describe('core/phases/encode/auto', () => {
  it('finds the brute-force minimum of a synthetic cost on machines of 2–6 states (fast-check, seed 42)', () => {
    fc.assert(
      fc.property(machineArb, (next) => {
        const f = tableMachine('random', 2, next);
        const cost = syntheticCost(f);
        const r = encode(f, 'auto', { cost });
        expect(r.diagnostics).toEqual([]);
        const e = r.encoding;
        expect(e && wellFormed(f, e)).toBe(true);
        expect(e?.strategy).toBe('auto');
        const bits = Math.ceil(Math.log2(f.states.length));
        // 100 per bit makes the minimum bit count optimal, so brute force there suffices.
        expect(cost(e?.codes ?? [], e?.bits ?? 0)).toBe(bruteMinimum(f, bits, cost));
        expect(r.search?.method).toBe('exhaustive');
      }),
      { seed: 42, numRuns: 25 },
    );
  });

  it('prices each symmetry class at most once and reports the count of classes', () => {
    const f = tableMachine('five', 1, [
      [1, 2],
      [3, 0],
      [4, 4],
      [0, 1],
      [2, 3],
    ]);
    const seen: string[] = [];
    const base = syntheticCost(f);
    const r = encode(f, 'auto', { cost: (c, b) => (seen.push(orbitKey(c)), base(c, b)) });
    expect(new Set(seen).size).toBe(seen.length);
    expect(r.search?.classes).toBe(140); // McCluskey & Unger (1959): 5 states, 3 bits
    expect(r.search?.evaluations).toBe(seen.length);
    // The named strategies' classes are among the 140, plus one-hot (5 bits) and Johnson (3 bits, in the 140).
    expect(seen.length).toBeLessThanOrEqual(141);
  });

  it('tries one bit more on small machines, and takes it when it is cheaper', () => {
    const f = ring(3);
    const r = encode(f, 'auto', { cost: (_c, b) => (b === 3 ? 1 : 2) });
    expect(r.search?.extraBit).toBe(true);
    expect(r.encoding?.bits).toBe(3);
  });

  it('anneals when the classes do not fit the budget, and still reaches the optimum of a 6-state ring', () => {
    const f = ring(6);
    const cost = syntheticCost(f);
    const r = encode(f, 'auto', { cost, budget: { evaluations: 150 } });
    expect(r.search?.method).toBe('annealing');
    expect(r.search?.evaluations).toBeLessThanOrEqual(150);
    expect(cost(r.encoding?.codes ?? [], 3)).toBe(bruteMinimum(f, 3, cost));
  });

  it('closes a 12-state ring into a cycle of single-bit steps, which no named strategy does in 4 bits', () => {
    const f = ring(12);
    const r = encode(f, 'auto', { cost: syntheticCost(f), budget: { evaluations: 600 } });
    const codes = r.encoding?.codes ?? [];
    expect(r.encoding?.bits).toBe(4);
    for (let s = 0; s < 12; s++) expect(distance(codes[s], codes[(s + 1) % 12])).toBe(1);
    const gray = encode(f, 'gray').encoding?.codes ?? [];
    expect(distance(gray[11], gray[0])).toBeGreaterThan(1);
  });

  it('gives the same answer for the same seed (run twice, compare)', () => {
    const f = tableMachine(
      'mix',
      2,
      Array.from({ length: 11 }, (_, s) => [s, (s + 1) % 11, (s * 3 + 2) % 11, (s + 5) % 11]),
    );
    const run = (seed: number) => encode(f, 'auto', { cost: syntheticCost(f), seed, budget: { evaluations: 300 } });
    const a = run(7);
    const b = run(7);
    expect(a.search?.method).toBe('annealing');
    expect(b.encoding).toEqual(a.encoding);
    expect(b.search).toEqual(a.search);
  });

  it('never does worse than the named strategies', () => {
    const f = tableMachine(
      'mix',
      2,
      Array.from({ length: 13 }, (_, s) => [(s * 5) % 13, (s + 1) % 13, (s * 7 + 3) % 13, s]),
    );
    const cost = syntheticCost(f);
    const best = encode(f, 'auto', { cost, budget: { evaluations: 100 } }).encoding;
    for (const named of ['binary', 'gray', 'johnson', 'one-hot'] as const) {
      const e = encode(f, named).encoding;
      if (e) expect(cost(best?.codes ?? [], best?.bits ?? 0)).toBeLessThanOrEqual(cost(e.codes, e.bits));
    }
  });

  it('reports progress after every evaluation, the best never rising', () => {
    const f = ring(10);
    const seen: { done: number; total: number | null; best: number }[] = [];
    const r = encode(f, 'auto', {
      cost: syntheticCost(f),
      budget: { evaluations: 80 },
      onProgress: (p) => seen.push(p),
    });
    expect(seen.map((p) => p.done)).toEqual(Array.from({ length: seen.length }, (_, i) => i + 1));
    expect(seen.length).toBe(r.search?.evaluations);
    expect(seen.every((p) => p.total === 80)).toBe(true);
    for (let i = 1; i < seen.length; i++) expect(seen[i].best).toBeLessThanOrEqual(seen[i - 1].best);
    expect(seen[seen.length - 1].best).toBe(r.search?.bestCost);
  });

  it('announces the exact number of evaluations of an exhaustive search', () => {
    const f = ring(5);
    const seen: { done: number; total: number | null }[] = [];
    encode(f, 'auto', { cost: syntheticCost(f), onProgress: (p) => seen.push(p) });
    const last = seen[seen.length - 1];
    expect(last.done).toBe(last.total);
  });

  it('stops on an injected clock when given a time budget', () => {
    let t = 0;
    const f = ring(12);
    const cost = syntheticCost(f);
    const r = encode(f, 'auto', { cost: (c, b) => ((t += 10), cost(c, b)), budget: { millis: 200 }, now: () => t });
    expect(r.encoding && wellFormed(f, r.encoding)).toBe(true);
    expect(r.search?.evaluations).toBeLessThanOrEqual(21);
    expect(r.search?.evaluations).toBeGreaterThan(4);
  });

  it('searches around pins and keeps them', () => {
    const f = ring(6);
    const cost = syntheticCost(f);
    const r = encode(f, 'auto', { cost, pinned: { s0: '111', s3: '000' } });
    expect(r.encoding?.codes[0]).toBe('111');
    expect(r.encoding?.codes[3]).toBe('000');
    let best = Infinity;
    for (const a of allAssignments(6, 3)) if (a[0] === '111' && a[3] === '000') best = Math.min(best, cost(a, 3));
    expect(cost(r.encoding?.codes ?? [], 3)).toBe(best);
  });

  it('encodes a one-state machine with no bits', () => {
    const f = tableMachine('one', 1, [[0, 0]]);
    expect(encode(f, 'auto', { cost: syntheticCost(f) }).encoding).toEqual({ strategy: 'auto', bits: 0, codes: [''] });
  });

  it('falls back to the adjacency cost without a cost function', () => {
    const r = encode(ring(8), 'auto');
    const codes = r.encoding?.codes ?? [];
    expect(r.encoding?.bits).toBe(3);
    for (let s = 0; s < 8; s++) expect(distance(codes[s], codes[(s + 1) % 8])).toBe(1);
  });
});

describe('core/phases/encode/auto with core/synthesise', () => {
  // An invented exhibit: a flap opens after buttons a, b, a in turn; both at once starts over.
  // Inputs (a, b); next state per input combination 00, 01, 10, 11.
  const table = tableMachine('flap-lock', 2, [
    [0, 0, 1, 0],
    [1, 2, 1, 0],
    [2, 0, 3, 0],
    [3, 0, 0, 0],
  ]);
  const lock: FlatMachine = {
    ...table,
    outputs: ['flap'],
    rows: table.rows.map((rs, s) => rs.map((r) => ({ ...r, out: [s === 3 ? 1 : 0] }))),
  };
  const cost = (codes: readonly string[], bits: number): number =>
    partsCost(
      synthesise(lock, { strategy: 'candidate', bits, codes }, { profile: DEFAULT_PROFILE }).parts,
      DEFAULT_PROFILE.cost,
    );

  it("the real build costs the same across a symmetry class (the search's precondition) and auto finds its minimum", () => {
    const byClass = new Map<string, Set<number>>();
    let best = Infinity;
    for (const a of allAssignments(4, 2)) {
      const c = cost(a, 2);
      best = Math.min(best, c);
      const key = orbitKey(a);
      byClass.set(key, (byClass.get(key) ?? new Set()).add(c));
    }
    expect(byClass.size).toBe(3); // McCluskey & Unger (1959): 4 states, 2 bits
    for (const costs of byClass.values()) expect(costs.size).toBe(1);
    // Budget: the four named strategies and the three classes (skipping the slower extra bit).
    const r = encode(lock, 'auto', { cost, budget: { evaluations: 7 } });
    expect(r.search).toMatchObject({ method: 'exhaustive', complete: true, classes: 3, extraBit: false });
    expect(r.search?.bestCost).toBeLessThanOrEqual(best);
    expect(cost(r.encoding?.codes ?? [], r.encoding?.bits ?? 0)).toBe(r.search?.bestCost);
  });
});
