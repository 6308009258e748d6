import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { Build } from '../../../src/core/model/build.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { coverageOf, sheetFaults } from '../../../src/core/export/sheet-faults.js';
import { commissioningTour, type TourClock } from '../../../src/core/export/tour.js';
import { sheetSteps } from '../../../src/core/sim/sheet.js';
import { firstShown, readingsThrough, withFault } from '../sim/fault-surgery.js';
import { randomBuild } from '../sim/actions.js';
import { example, exampleNames } from './support.js';

/** Every verdict of the fault simulation held to the surgery reference over the extended sheet. */
function holdToSurgery(b: Build, label: string): void {
  const tour = commissioningTour(b.machine);
  const sf = sheetFaults(b, DEFAULT_PROFILE, tour);
  const all: TourClock[] = [...tour, ...sf.extra];
  const rows = sheetSteps(b.machine.inputs, b.encoding.bits > 0, all).map((s) => s.actions);
  const good = readingsThrough(b, rows);
  for (const v of sf.verdicts) {
    const bad = readingsThrough(withFault(b, v.fault), rows);
    expect(firstShown(good, bad), `${label}: ${v.fault.key}`).toBe(v.shown);
  }
}

describe('core/export/sheet-faults', () => {
  // Reference: each fault made by netlist surgery and stepped by the event-driven part simulator
  // (tests/core/sim/fault-surgery.ts), read as a person reads the machine.
  it('gives, for every fault of every example, the first row the surgery reference shows it at', () => {
    for (const name of exampleNames()) holdToSurgery(example(name).build, name);
  }, 120_000);

  it('agrees with the surgery reference on random builds (fast-check, fixed seed)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 2, max: 4 }),
        fc.integer({ min: 0, max: 2 }),
        fc.integer({ min: 1, max: 2 }),
        fc.integer({ min: 0, max: 1_000_000 }),
        (states, inputs, outputs, seed) => holdToSurgery(randomBuild(states, inputs, outputs, seed), `seed ${seed}`),
      ),
      { seed: 20261205, numRuns: 12 },
    );
  }, 120_000);

  it('shows with the appended clocks at least what the tour shows, and says which part showed each fault', () => {
    for (const name of exampleNames()) {
      const b = example(name).build;
      const tour = commissioningTour(b.machine);
      const sf = sheetFaults(b, DEFAULT_PROFILE, tour);
      const c = coverageOf(sf).total;
      expect(c.tour + c.extra + c.never + c.open, name).toBe(c.faults);
      expect(sf.collapsed, name).toBeLessThanOrEqual(sf.all);
      for (const v of sf.verdicts) {
        if (v.by === 'tour') expect(v.shown, name).toBeLessThan(sf.tourRows);
        if (v.by === 'extra') expect(v.shown, name).toBeGreaterThanOrEqual(sf.tourRows);
        if (v.shown >= 0) expect(v.seen.length, name).toBeGreaterThan(0);
      }
      expect(sf.extra.every((x) => x.extra === true && b.machine.rows[x.state][x.row].next === x.next)).toBe(true);
    }
  });

  // Structural equivalence (Abramovici, Breuer & Friedman, 1990, ch. 4 — from memory): a fault
  // collapsed into another is shown at the same row as it, by the surgery reference.
  it('collapses only faults the surgery reference cannot tell apart on the extended sheet', () => {
    for (const name of exampleNames()) {
      const b = example(name).build;
      const tour = commissioningTour(b.machine);
      const sf = sheetFaults(b, DEFAULT_PROFILE, tour);
      const rows = sheetSteps(b.machine.inputs, b.encoding.bits > 0, [...tour, ...sf.extra]).map((s) => s.actions);
      const good = readingsThrough(b, rows);
      for (const v of sf.verdicts)
        for (const key of v.fault.same) {
          const [kind, cord] = key.split(' ') as ['slack' | 'taut', string];
          const bad = readingsThrough(withFault(b, { key, kind, cord, same: [] }), rows);
          expect(firstShown(good, bad), `${name}: ${key} ≡ ${v.fault.key}`).toBe(v.shown);
        }
    }
  }, 120_000);

  // A fault declared never showable is shown by no random clock sequence from reset (the
  // surgery reference), with clocks the state table specifies and resets anywhere.
  it('declares never showable only faults no random sequence from reset shows (fast-check, fixed seed)', () => {
    const builds = [1, 2, 3, 4, 5, 6].map((seed) => randomBuild(3, 2, 1, seed));
    builds.push(example('marble-bell.lw').build, example('crossing.lw').build);
    const never = builds.flatMap((b) => {
      const sf = sheetFaults(b, DEFAULT_PROFILE, commissioningTour(b.machine));
      return sf.verdicts.filter((v) => v.by === 'never').map((v) => ({ b, v }));
    });
    expect(never.length).toBeGreaterThan(0);
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: never.length - 1 }),
        fc.array(fc.tuple(fc.boolean(), fc.nat()), { minLength: 1, maxLength: 8 }),
        (pick, moves) => {
          const { b, v } = never[pick];
          const f = b.machine;
          let s = f.start;
          const clocks = moves.map(([reset, n]): TourClock => {
            const from = reset && n % 4 === 0 ? f.start : s;
            const rows = f.rows[from].flatMap((r, k) => (r.next >= 0 ? [k] : []));
            const row = rows[n % rows.length];
            const inputs = [...f.rows[from][row].cube]
              .map((ch, i) => (ch === '-' ? String((n >> i) & 1) : ch))
              .join('');
            s = f.rows[from][row].next;
            return { reset: from === f.start && reset && n % 4 === 0, inputs, state: from, row, next: s };
          });
          const rows = sheetSteps(f.inputs, true, clocks).map((st) => st.actions);
          expect(firstShown(readingsThrough(b, rows), readingsThrough(withFault(b, v.fault), rows))).toBe(-1);
        },
      ),
      { seed: 5122026, numRuns: 60 },
    );
  }, 120_000);

  it('is deterministic', () => {
    const b = example('crossing.lw').build;
    const tour = commissioningTour(b.machine);
    expect(sheetFaults(b, DEFAULT_PROFILE, tour)).toEqual(sheetFaults(b, DEFAULT_PROFILE, tour));
  });
});
