/**
 * The MCNC / LGSynth'91 FSM benchmark machines (open dataset; provenance in
 * tests/fixtures/lgsynth91/PROVENANCE.md), read with the JSON form and flattened, against the
 * reference figures of tests/fixtures/lgsynth91/TABLE.md (parsed here, never copied):
 * - completely specified machines: the minimal state count, from an independent
 *   partition-refinement implementation (exact and unique);
 * - incompletely specified lion, train4, lion9, train11, beecount, ex3, ex5, ex7, s8: the exact
 *   minima of SAT-based exact minimisation (A. Abel and J. Reineke, ICCAD 2015).
 */
import { describe, expect, it } from 'vitest';
import { isIncomplete } from '../../../src/core/model/flat.js';
import { minimiseStates, type StateMinimisation } from '../../../src/core/phases/minimise-states/index.js';
import { benchmarkMachine, benchmarkTable, coverViolation, randomRunMismatches } from './minimise-states.support.js';

const table = benchmarkTable();
const results = new Map<string, StateMinimisation>();
const resultFor = (name: string): StateMinimisation => {
  let r = results.get(name);
  if (r === undefined) {
    r = minimiseStates(benchmarkMachine(name));
    results.set(name, r);
  }
  return r;
};

describe("core/phases/minimise-states on MCNC / LGSynth'91 (TABLE.md)", () => {
  it('reads all 53 machines of the table', () => {
    expect(table).toHaveLength(53);
  });

  for (const row of table) {
    it(`${row.name}: reachable count, covering, fixed point, never below the reference`, () => {
      const f = benchmarkMachine(row.name);
      const r = resultFor(row.name);
      expect(f.states).toHaveLength(row.states);
      if (row.reachable !== null) expect(f.states.length - r.unreachable.length).toBe(row.reachable);
      expect(r.method).toBe(isIncomplete(f) ? 'compatibility' : 'partition-refinement');
      // Every benchmark machine finishes the exact search within the default budget.
      expect(r.exact).toBe(true);
      expect(r.machine.states.length).toBeLessThanOrEqual(f.states.length - r.unreachable.length);
      if (row.minimal !== null) expect(r.machine.states.length).toBeGreaterThanOrEqual(row.minimal);
      expect(coverViolation(f, r.machine)).toBeNull();
      expect(randomRunMismatches(f, r.machine, 91, 40, 40)).toBe(0);
      expect(minimiseStates(r.machine).machine).toEqual(r.machine);
    });
  }

  const complete = table.filter((t) => t.complete && t.minimal !== null);
  it.each(complete.map((t) => [t.name, t.minimal as number]))(
    '%s (completely specified) reaches the minimal count %i exactly',
    (name, minimal) => {
      const r = resultFor(name);
      expect(r.method).toBe('partition-refinement');
      expect(r.exact).toBe(true);
      expect(r.machine.states).toHaveLength(minimal);
    },
  );

  const incomplete = table.filter((t) => !t.complete && t.minimal !== null);
  it('reaches the Abel & Reineke exact minimum on every incompletely specified machine that has one', () => {
    const reached = incomplete.filter((t) => resultFor(t.name).machine.states.length === t.minimal).map((t) => t.name);
    // lion, train4, lion9, train11, beecount, ex3, ex5, ex7, s8: all nine are reached.
    expect(reached).toEqual(incomplete.map((t) => t.name));
    expect(incomplete).toHaveLength(9);
    for (const t of incomplete) expect(resultFor(t.name).exact).toBe(true);
  });
});
