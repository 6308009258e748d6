import { describe, expect, it } from 'vitest';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { listFaults } from '../../../src/core/sim/faults.js';
import { SuspectWalk, type SeenValue } from '../../../src/core/sim/narrow.js';
import { simFor, timingOf } from '../../../src/core/sim/part.js';
import type { SheetStep } from '../../../src/core/sim/sheet.js';
import { c17, exhaustive } from './c17.js';

/** c17's exhaustive input set as rows of a sheet: row a sets the inputs to the bits of a (i1 first). */
function c17Walk(): SuspectWalk {
  const b = c17();
  const steps: SheetStep[] = exhaustive().map((actions, a) => ({ clock: a + 1, kind: 'look', at: a, actions }));
  return new SuspectWalk(
    simFor(b, timingOf(DEFAULT_PROFILE)),
    DEFAULT_PROFILE.stageDelayS,
    listFaults(b.netlist).faults,
    steps,
  );
}

/** Look positions of c17: o22's actuator, then o23's (no latches); 1 = lifted. */
const O22 = 0;
const O23 = 1;
const seen = (row: number, ...values: SeenValue[]) => new Map([[row, values]]);
/** Both actuators at rest at rows 0 … n−1 (what 16 = 0 at both its ports gives there: 22 = 23 = 1). */
const bothAtRest = (n: number) =>
  new Map<number, SeenValue[]>(
    Array.from({ length: n }, (_, r) => [
      r,
      [
        { at: O22, value: 0 },
        { at: O23, value: 0 },
      ],
    ]),
  );

describe('core/sim/narrow', () => {
  // ISCAS-85 c17 (Brglez & Fujiwara, 1985), worked by hand from its NAND equations
  // 10 = NAND(1,3), 11 = NAND(3,6), 16 = NAND(2,11), 19 = NAND(11,7), 22 = NAND(10,16),
  // 23 = NAND(16,19). With every input 0: 10 = 11 = 16 = 19 = 1, so 22 = 23 = 0 and both
  // actuators are lifted (an actuator lifts while its NAND gives 0).
  it('c17, inputs 00000, o22 at rest and o23 lifted: only cord 22 broken (worked by hand)', () => {
    // o22 at rest needs NAND 22 at 1, so 10 or 16 at 0 at its port. 10 = 0 needs inputs 1 and 3
    // both stuck at 1 (two faults). 16 = 0 at port 22 alone: only by breaking cord 22's tie,
    // which is cord 22 broken (its only tie; taut 10 collapses into it). 16 = 0 everywhere
    // (cord 2 broken, cord 16 jammed) also drops o23. So: slack cg22.
    const w = c17Walk().walk({ reached: 1, seen: seen(0, { at: O22, value: 0 }) });
    expect(w.suspects().map((f) => f.key)).toEqual(['slack cg22']);
    expect(w.firstDifference).toBe(0);
  });

  it('c17, inputs 00000, both actuators at rest: cord 2 broken or cord 16 jammed, told apart at inputs 00110 (worked by hand)', () => {
    // 16 = 0 at both its ports: cord 2 slack (16 = NAND(1, 11) = NOT 11 = 3·6, 0 here) or cord
    // 16 taut. They differ first where 3 = 6 = 1: setting 00110, row 6. There, with cord 2 broken
    // 16 = 1 and both actuators lift (as the sheet); with cord 16 jammed both stay at rest.
    const w = c17Walk().walk({ reached: 1, seen: seen(0, { at: O22, value: 0 }, { at: O23, value: 0 }) });
    const keys = w.suspects().map((f) => f.key);
    expect(keys).toEqual(['slack ci2', 'taut cg16']);
    const ahead = w.ahead(1);
    expect(ahead.rows.map((r) => r.row)).toEqual([6]);
    const outcomes = ahead.rows[0].outcomes.map((o) => ({
      look: [...o.look],
      asSheet: o.asSheet,
      leaves: o.leaves.map((i) => keys[i]),
    }));
    expect(outcomes).toEqual(
      expect.arrayContaining([
        { look: [1, 1], asSheet: true, leaves: ['slack ci2'] },
        { look: [0, 0], asSheet: false, leaves: ['taut cg16'] },
      ]),
    );
    expect(outcomes).toHaveLength(2);
    // Both stay at rest on rows 1 to 5 under either; at row 6 both lift (as the sheet): cord 2.
    expect(
      w
        .walk({ reached: 7, seen: bothAtRest(6) })
        .suspects()
        .map((f) => f.key),
    ).toEqual(['slack ci2']);
  });

  it('proposes from a later row what a walk started afresh there proposes (the look-ahead kept while it holds)', () => {
    const kept = c17Walk();
    kept.walk({ reached: 1, seen: bothAtRest(1) }).ahead(2);
    for (const reached of [2, 4, 6]) {
      const fresh = c17Walk().walk({ reached, seen: bothAtRest(reached) });
      expect(kept.walk({ reached, seen: bothAtRest(reached) }).ahead(2), `from row ${reached}`).toEqual(fresh.ahead(2));
    }
  });

  it('says plainly when no single fault explains the sights, with the suspects that fitted before', () => {
    // Rows 0 to 5 as above (two suspects), then at row 6 o22 lifted but o23 at rest: neither fits.
    const sights = bothAtRest(6).set(6, [{ at: O23, value: 0 }]);
    const w = c17Walk().walk({ reached: 7, seen: sights });
    expect(w.suspects()).toEqual([]);
    expect(w.beforeNone()?.row).toBe(6);
    expect(w.beforeNone()?.faults.map((f) => f.key)).toEqual(['slack ci2', 'taut cg16']);
  });

  it('gives the same suspects walking row by row as in one go, and starts again when a walked row changes', () => {
    const sights = bothAtRest(6);
    const once = c17Walk().walk({ reached: 6, seen: sights });
    expect(once.suspects()).toHaveLength(2);
    const stepwise = c17Walk();
    for (let r = 0; r <= 6; r++) stepwise.walk({ reached: r, seen: sights });
    expect(stepwise.suspects()).toEqual(once.suspects());
    // The same walker, told that row 0 showed only o22 differ (a walked row changed): cord 22 alone.
    const changed = stepwise.walk({ reached: 1, seen: seen(0, { at: O22, value: 0 }) });
    expect(changed.suspects().map((f) => f.key)).toEqual(['slack cg22']);
  });

  it('leaves every fault a suspect while nothing differs, less those already shown', () => {
    const w = c17Walk().walk({ reached: 0, seen: new Map() });
    expect(w.suspects()).toHaveLength(22);
    expect(w.firstDifference).toBe(-1);
    // The exhaustive set shows every c17 fault (tests/core/sim/faults.test.ts): walked whole, none is left.
    expect(w.walk({ reached: 32, seen: new Map() }).suspects()).toEqual([]);
  });
});
