import { readFileSync } from 'node:fs';
import { describe, expect, expectTypeOf, it, vi } from 'vitest';
import {
  CHECK_NAMES,
  CHECKS,
  findCheck,
  type CheckInput,
  type CheckResult,
  type DriveResult,
} from '../../../src/core/checks/registry.js';
import type * as Equivalence from '../../../src/core/checks/equivalence.js';
import type * as Forbidden from '../../../src/core/checks/forbidden-input.js';
import type * as Recovery from '../../../src/core/checks/recovery.js';
import type * as Timing from '../../../src/core/checks/timing.js';
import type { TimingResult } from '../../../src/core/checks/timing.js';
import type * as Snapshots from '../../../src/core/sim/snapshots.js';
import { analyse, buildMachine, runChecks, type Analysed, type Built } from '../../../src/core/pipeline.js';

// Record the seed every randomised check is called with (each wrapper calls the real check).
const seen = vi.hoisted(() => [] as { check: string; seed: number | undefined }[]);

vi.mock('../../../src/core/checks/equivalence.js', async (importOriginal) => {
  const m = await importOriginal<typeof Equivalence>();
  return {
    ...m,
    checkEquivalence: (...a: Parameters<typeof m.checkEquivalence>) => {
      seen.push({ check: 'equivalence', seed: a[3]?.seed });
      return m.checkEquivalence(...a);
    },
  };
});
vi.mock('../../../src/core/checks/forbidden-input.js', async (importOriginal) => {
  const m = await importOriginal<typeof Forbidden>();
  return {
    ...m,
    forbiddenInputCheck: (...a: Parameters<typeof m.forbiddenInputCheck>) => {
      seen.push({ check: 'forbidden-input', seed: a[2]?.seed });
      return m.forbiddenInputCheck(...a);
    },
  };
});
vi.mock('../../../src/core/checks/recovery.js', async (importOriginal) => {
  const m = await importOriginal<typeof Recovery>();
  return {
    ...m,
    checkRecovery: (...a: Parameters<typeof m.checkRecovery>) => {
      seen.push({ check: 'recovery', seed: a[2]?.seed });
      return m.checkRecovery(...a);
    },
  };
});
vi.mock('../../../src/core/checks/timing.js', async (importOriginal) => {
  const m = await importOriginal<typeof Timing>();
  return {
    ...m,
    checkTiming: (...a: Parameters<typeof m.checkTiming>) => {
      seen.push({ check: 'timing', seed: a[2]?.seed });
      return m.checkTiming(...a);
    },
  };
});
vi.mock('../../../src/core/sim/snapshots.js', async (importOriginal) => {
  const m = await importOriginal<typeof Snapshots>();
  return {
    ...m,
    driveSnapshots: (...a: Parameters<typeof m.driveSnapshots>) => {
      seen.push({ check: 'drive', seed: a[2] });
      return m.driveSnapshots(...a);
    },
  };
});

const ORDER = ['forbidden-input', 'next-state-equivalence', 'equivalence', 'recovery', 'timing', 'drive', 'layout'];

function bell(): { a: Analysed; b: Built } {
  const file = 'examples/marble-bell.lw';
  const a = analyse(readFileSync(file, 'utf8'), file);
  if (!a.ok) throw new Error('marble-bell must analyse');
  const b = buildMachine(a, { encoding: 'binary', checks: false });
  if (!b.ok) throw new Error('marble-bell must build');
  return { a, b };
}

describe('core/checks/registry', () => {
  it('lists every check once, in the order reports show them, with labels and what each reads', () => {
    expect(CHECK_NAMES).toEqual(ORDER);
    expect(new Set(CHECK_NAMES).size).toBe(CHECKS.length);
    const fields: (keyof CheckInput)[] = ['build', 'spec', 'profile', 'seed', 'placement'];
    for (const c of CHECKS) {
      expect(c.label.length, c.name).toBeGreaterThan(0);
      expect(c.shortLabel.length, c.name).toBeGreaterThan(0);
      expect(c.produces.length, c.name).toBeGreaterThan(0);
      expect(c.needs, c.name).toContain('build');
      for (const n of c.needs) expect(fields).toContain(n);
    }
    expect(new Set(CHECKS.map((c) => c.shortLabel)).size).toBe(CHECKS.length);
    // Only the logic-level proof on the equations, and the layout (judged from the placement as made), draw nothing at random.
    expect(CHECKS.filter((c) => !c.needs.includes('seed')).map((c) => c.name)).toEqual([
      'next-state-equivalence',
      'layout',
    ]);
    expect(CHECKS.filter((c) => c.needs.includes('spec')).map((c) => c.name)).toEqual(['equivalence']);
    // The checks of the routed frame read the placement.
    expect(CHECKS.filter((c) => c.needs.includes('placement')).map((c) => c.name)).toEqual(['drive', 'layout']);
  });

  it('runs as the pipeline runs the checks: one result per entry, in order, each named by its entry', () => {
    const { a, b } = bell();
    const checks = runChecks(b.build, a, b.profile, 1, b.placement);
    expect(checks.map((c) => c.name)).toEqual(ORDER);
    const input: CheckInput = {
      build: b.build,
      spec: { original: a.flat, merged: a.minimised.merged },
      profile: b.profile,
      seed: 1,
      placement: b.placement,
    };
    const next = CHECKS[1].run(input);
    expect(next).toEqual(checks[1]);
    // Without a placement, runChecks places the build itself with the same seed: the same frame.
    expect(runChecks(b.build, a, b.profile, 1).at(-1)).toEqual(checks.at(-1));
  });

  it('gives each check its own result type by name, without a cast', () => {
    const { a, b } = bell();
    const checks: readonly CheckResult[] = runChecks(b.build, a, b.profile, 1);
    const drive = findCheck(checks, 'drive');
    expectTypeOf(drive).toEqualTypeOf<DriveResult | undefined>();
    expectTypeOf(findCheck(checks, 'timing')).toEqualTypeOf<TimingResult | undefined>();
    expect(drive?.name).toBe('drive');
    expect(drive?.worstByState.map((w) => w.where.state)).toEqual(['none', 'one', 'two', 'rung']);
    expect(findCheck(checks, 'timing')?.monteCarlo.runs).toBe(20);
    expect(findCheck(checks, 'forbidden-input')?.logic.name).toBe('forbidden-input');
    expect(findCheck([], 'drive')).toBeUndefined();
    // Narrowing on `name` works for a whole list too.
    for (const c of checks) if (c.name === 'recovery') expect(c.worstK).not.toBeUndefined();
  });

  it('hands the seed to every check that draws at random (sampled inputs and codes, Monte Carlo, drive snapshots)', () => {
    const { a, b } = bell();
    seen.length = 0;
    const checks = runChecks(b.build, a, b.profile, 42);
    expect(seen).toEqual(
      ['forbidden-input', 'equivalence', 'recovery', 'timing', 'drive'].map((check) => ({ check, seed: 42 })),
    );
    expect(findCheck(checks, 'timing')?.monteCarlo.seed).toBe(42);
  });
});
