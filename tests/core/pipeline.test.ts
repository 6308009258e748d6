/**
 * The place phase in the pipeline (src/core/pipeline.ts): the build comes back placed, pins are
 * kept, and pin problems come back as coded diagnostics — LW707 (an error: the pin is wrong
 * whatever the build) and LW708 (a warning: this build could not keep it).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { findCheck } from '../../src/core/checks/results.js';
import type { Pin } from '../../src/core/phases/place/index.js';
import { analyse, buildMachine, PLACE_ROUNDS, type Analysed } from '../../src/core/pipeline.js';

function bell(): Analysed {
  const a = analyse(readFileSync('examples/marble-bell.lw', 'utf8'), 'marble-bell.lw');
  if (!a.ok) throw new Error('marble bell must analyse');
  return a;
}

describe('core/pipeline (place)', () => {
  it('places every build, timed as its own phase between balancing and the checks', () => {
    const phases: string[] = [];
    let t = 0;
    const b = buildMachine(bell(), { encoding: 'binary', onPhase: (p) => phases.push(p), now: () => t++ });
    expect(b.ok).toBe(true);
    expect(phases.slice(-3)).toEqual(['synthesise', 'place', 'check']);
    if (b.ok)
      expect(b.placement.bays.map((x) => x.part).sort()).toEqual(
        b.build.netlist.parts
          .filter((p) => p.kind === 'gate' || p.kind === 'lever')
          .map((p) => p.id)
          .sort(),
      );
    expect(PLACE_ROUNDS).toBeGreaterThanOrEqual(1);
  });

  it('places with less effort when asked (placeEffort): every part still placed and its layout check passing', () => {
    const full = buildMachine(bell(), { encoding: 'binary' });
    const rough = buildMachine(bell(), {
      encoding: 'binary',
      placeEffort: { exactLimit: 0, improve: { kicks: 0, work: 0 } },
    });
    if (!full.ok || !rough.ok) throw new Error('the bell must build');
    const parts = (b: typeof full): string[] => b.placement.bays.map((x) => x.part).sort();
    expect(parts(rough)).toEqual(parts(full));
    expect(findCheck(rough.checks, 'layout')?.ok).toBe(true);
    // Left out, the effort is the place phase's own default.
    expect(buildMachine(bell(), { encoding: 'binary', placeEffort: {} })).toEqual(full);
  });

  it('keeps a pinned latch in its bay and the next, and a pinned part on another drum', () => {
    const b = buildMachine(bell(), { encoding: 'binary', pins: { m1: { bay: 9 }, 'o.bell.1': { bay: 2, drum: 2 } } });
    if (!b.ok) throw new Error(b.diagnostics.map((d) => d.message).join('; '));
    const at = new Map(b.placement.bays.map((x) => [x.part, x]));
    expect([at.get('m1.set')?.bay, at.get('m1.reset')?.bay]).toEqual([9, 10]);
    expect([at.get('o.bell.1')?.drum, at.get('o.bell.1')?.bay]).toEqual([2, 2]);
    expect(b.diagnostics.filter((d) => d.code === 'LW707' || d.code === 'LW708')).toEqual([]);
    expect(findCheck(b.checks, 'layout')?.ok).toBe(true);
  });

  it('rejects a pin on a part the build does not have, with a did-you-mean (LW707)', () => {
    const b = buildMachine(bell(), { encoding: 'binary', pins: { 't.S0.l': { bay: 3 } } });
    expect(b.ok).toBe(false);
    const d = b.diagnostics.find((x) => x.code === 'LW707');
    expect(d).toMatchObject({ severity: 'error', location: { path: '--pin t.S0.l' }, hint: "did you mean 't.S0.1'?" });
  });

  it('rejects a pin on a flag, on a drum the frame does not carry, or on a bay another pin holds (LW707)', () => {
    const cases: Record<string, Pin>[] = [
      { 'flag.bell': { bay: 2 } },
      { 'tr0.set': { bay: 1, drum: 3 } },
      { 'm0.set': { bay: 4 }, 'm0.reset': { bay: 4 } },
    ];
    for (const pins of cases) {
      const b = buildMachine(bell(), { encoding: 'binary', pins, checks: false });
      expect(b.ok, JSON.stringify(pins)).toBe(false);
      expect(b.diagnostics.map((x) => x.code)).toContain('LW707');
    }
  });

  it('builds, with a warning, when this build cannot keep a pin (LW708): a bay past the end of the drum', () => {
    const b = buildMachine(bell(), { encoding: 'binary', pins: { 'o.bell.1': { bay: 200 } } });
    expect(b.ok).toBe(true);
    const d = b.diagnostics.find((x) => x.code === 'LW708');
    expect(d?.severity).toBe('warning');
    expect(d?.message).toMatch(/pinned to bay 200 of drum 1, which has \d+ bays/);
    if (b.ok) expect(b.placement.pinned).toEqual([]);
  });
});
