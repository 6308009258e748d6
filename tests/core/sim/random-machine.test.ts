import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { disjointSize, overlaps } from '../../../src/core/model/cube.js';
import { isIncomplete } from '../../../src/core/model/flat.js';
import { flatToJsonText, randomFlatMachine } from '../../../src/core/sim/random-machine.js';
import { analyse } from '../../../src/core/pipeline.js';
import { reachableStates } from '../../../src/core/phases/minimise-states/reachable.js';

describe('core/sim/random-machine', () => {
  it('builds completely specified tables whose rows are disjoint and cover every input', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 30 }),
        fc.integer({ min: 0, max: 10 }),
        fc.integer({ min: 0, max: 3 }),
        fc.integer(),
        (n, k, m, seed) => {
          const f = randomFlatMachine(n, k, m, seed);
          expect(f.states).toHaveLength(n);
          expect(f.inputs).toHaveLength(k);
          expect(isIncomplete(f)).toBe(false);
          for (const rows of f.rows) {
            expect(rows.length).toBeGreaterThanOrEqual(1);
            expect(rows.length).toBeLessThanOrEqual(4);
            expect(disjointSize(rows.map((r) => r.cube))).toBe(2 ** k);
            for (let i = 0; i < rows.length; i++)
              for (let j = i + 1; j < rows.length; j++) expect(overlaps(rows[i].cube, rows[j].cube)).toBe(false);
            for (const r of rows) {
              expect(r.next).toBeGreaterThanOrEqual(0);
              expect(r.next).toBeLessThan(n);
              expect(r.out).toHaveLength(m);
            }
          }
          expect(reachableStates(f).every(Boolean)).toBe(true);
        },
      ),
      { seed: 42, numRuns: 60 },
    );
  });

  it('is deterministic per seed and differs between seeds', () => {
    expect(randomFlatMachine(50, 6, 2, 7)).toEqual(randomFlatMachine(50, 6, 2, 7));
    expect(randomFlatMachine(50, 6, 2, 7)).not.toEqual(randomFlatMachine(50, 6, 2, 8));
  });

  it('makes the benchmark size (1000 states, 6 inputs) with every state reachable', () => {
    const f = randomFlatMachine(1000, 6, 3, 1);
    expect(f.states).toHaveLength(1000);
    expect(new Set(f.states).size).toBe(1000);
    expect(reachableStates(f).filter(Boolean)).toHaveLength(1000);
  });

  // The JSON form's semantics (docs/notation.md: transitions tried in order, the first `when`
  // that holds fires): a table of disjoint rows written one transition per row reads back as
  // the same table, row for row.
  it('writes a table into the JSON form that reads back as the same table', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 12 }), fc.integer({ min: 0, max: 5 }), fc.integer(), (n, k, seed) => {
        const f = randomFlatMachine(n, k, 2, seed);
        const read = analyse(flatToJsonText(f), 'random.json');
        expect(read.ok).toBe(true);
        if (!read.ok) return;
        const g = read.flat;
        expect([g.name, g.inputs, g.outputs, g.states, g.start]).toEqual([
          f.name,
          f.inputs,
          f.outputs,
          f.states,
          f.start,
        ]);
        const rows = (m: typeof f) => m.rows.map((rs) => rs.map((r) => [r.cube, r.next, r.out]));
        expect(rows(g)).toEqual(rows(f));
      }),
      { seed: 11, numRuns: 40 },
    );
  });
});
