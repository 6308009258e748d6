/**
 * The layout check: the placement keeps the rules of design §11 and the force margins hold with
 * the routed cords; a failure says what to change. Placements are taken from the place phase
 * and then broken by hand, so each rule is seen to fail on its own.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { checkLayout } from '../../../src/core/checks/layout.js';
import { findCheck } from '../../../src/core/checks/results.js';
import type { Netlist } from '../../../src/core/model/netlist.js';
import { place, type Placement } from '../../../src/core/phases/place/index.js';
import { analyse, buildMachine, type Built } from '../../../src/core/pipeline.js';
import { DEFAULT_PROFILE, type Profile } from '../../../src/core/physics/profile.js';

const frame = (f: Partial<Profile['frame']>, more: Partial<Profile> = {}): Profile => ({
  ...DEFAULT_PROFILE,
  ...more,
  frame: { ...DEFAULT_PROFILE.frame, ...f },
});

function built(name: string, profile: Profile = DEFAULT_PROFILE): Built {
  const a = analyse(readFileSync(`examples/${name}`, 'utf8'), name);
  if (!a.ok) throw new Error(name);
  const b = buildMachine(a, { encoding: 'binary', profile });
  if (!b.ok) throw new Error(b.diagnostics.map((d) => d.message).join('; '));
  return b;
}

const bell = built('marble-bell.lw');
const n: Netlist = bell.build.netlist;

describe('core/checks/layout', () => {
  it('passes a placement from the place phase, and says how long the frame is and how much cord it takes', () => {
    const r = checkLayout(n, bell.placement, DEFAULT_PROFILE);
    expect(r).toMatchObject({ name: 'layout', ok: true, findings: [], notes: [] });
    expect(r.drums).toEqual([{ drum: 1, lengthM: bell.placement.drums[0].lengthM, bays: bell.placement.bays.length }]);
    expect(r.totalCordM).toBeLessThanOrEqual(r.baselineCordM);
    expect(r.summary).toMatch(/every part in a bay of its own on 1 drum/);
    expect(r.minMargin).toBeGreaterThanOrEqual(DEFAULT_PROFILE.minMargin);
    expect(findCheck(bell.checks, 'layout')).toEqual(r);
  });

  it('passes a machine split over two drums when the test profile shortens the longest drum', () => {
    const profile = frame({ longestDrumM: 0.8 });
    const b = built('marble-bell.lw', profile);
    const r = findCheck(b.checks, 'layout');
    expect(r?.ok).toBe(true);
    expect(r?.drums).toHaveLength(2);
    for (const d of r?.drums ?? []) expect(d.lengthM).toBeLessThanOrEqual(0.8 + 1e-9);
  });

  it('fails when the frame cannot carry the drums, and says to allow a longer drum or more drums', () => {
    const profile = frame({ longestDrumM: 0.5, drumsPerFrame: 2 });
    const p = place(n, profile);
    const r = checkLayout(n, p, profile);
    expect(r.ok).toBe(false);
    const rules = r.findings.map((f) => f.rule);
    expect(rules).toContain('too-many-drums');
    const f = r.findings.find((x) => x.rule === 'too-many-drums');
    expect(f?.hint).toMatch(/frame\.drumsPerFrame/);
    expect(f?.hint).toMatch(/frame\.longestDrumM/);
    expect(r.summary).toMatch(/fix: /);
  });

  it('fails on two parts in one bay, and on a part with no bay', () => {
    const [a, b, ...rest] = bell.placement.bays;
    const shared: Placement = { ...bell.placement, bays: [a, { ...b, bay: a.bay, xM: a.xM }, ...rest] };
    expect(checkLayout(n, shared, DEFAULT_PROFILE).findings.map((x) => x.rule)).toContain('shared-bay');
    const missing: Placement = { ...bell.placement, bays: bell.placement.bays.slice(1) };
    const r = checkLayout(n, missing, DEFAULT_PROFILE);
    expect(r.ok).toBe(false);
    expect(r.findings.find((x) => x.rule === 'no-bay')?.message).toContain(`'${a.part}' has no bay`);
  });

  it('fails on a drum longer than allowed, saying to allow a longer drum or a second one', () => {
    const long: Placement = {
      ...bell.placement,
      drums: bell.placement.drums.map((d) => ({ ...d, lengthM: DEFAULT_PROFILE.frame.longestDrumM + 0.1 })),
    };
    const f = checkLayout(n, long, DEFAULT_PROFILE).findings.find((x) => x.rule === 'drum-too-long');
    expect(f?.hint).toMatch(/longer drum/);
    expect(f?.hint).toMatch(/more drums per frame/);
  });

  it('fails on a branch whose length is not the runs it is cut as and the allowances', () => {
    const [first, ...others] = bell.placement.routing.branches;
    const wrong: Placement = {
      ...bell.placement,
      routing: { ...bell.placement.routing, branches: [{ ...first, lengthM: first.lengthM + 0.05 }, ...others] },
    };
    expect(checkLayout(n, wrong, DEFAULT_PROFILE).findings.map((x) => x.rule)).toEqual(['branch-length']);
  });

  it('fails when a margin breaks with the cords as routed, and names more wraps as a way out', () => {
    // Smooth pins at every turn, μ_pin 0.3: a branch leaving its bay costs e^(0.3π) ≈ 2.57.
    const profile = frame({ turn: 'pin' }, { routing: { ...DEFAULT_PROFILE.routing, muPin: 0.3 } });
    const r = checkLayout(n, place(n, profile), profile);
    expect(r.ok).toBe(false);
    const m = r.findings.find((x) => x.rule === 'margin');
    expect(m?.message).toMatch(/^with its cords as routed, /);
    expect(m?.hint).toMatch(/more wraps: [\d.]+ turns/);
    expect(r.minMargin).toBeLessThan(profile.minMargin);
  });

  it('notes, without failing, pulleys that bend the cord tighter than 4 × its diameter', () => {
    const profile = frame({ pulleyDiameterM: 0.02 }); // 10 mm radius for 3 mm cord: under 12 mm
    const r = checkLayout(n, place(n, profile), profile);
    expect(r.ok).toBe(true);
    expect(r.notes[0]).toMatch(/tighter than 4 × its diameter/);
  });

  it('exempts a pinned hand lever from the end rules', () => {
    const a = analyse(readFileSync('examples/marble-bell.lw', 'utf8'), 'marble-bell.lw');
    if (!a.ok) throw new Error('marble bell must analyse');
    const b = buildMachine(a, { encoding: 'binary', pins: { rst: { bay: 3 } } });
    if (!b.ok) throw new Error(b.diagnostics.map((d) => d.message).join('; '));
    expect(b.placement.bays.find((x) => x.part === 'rst')?.bay).toBe(3);
    expect(b.placement.pinned).toEqual(['rst']);
    expect(findCheck(b.checks, 'layout')?.ok).toBe(true);
    const unpinned: Placement = { ...b.placement, pinned: [] };
    expect(checkLayout(b.build.netlist, unpinned, DEFAULT_PROFILE).findings.map((x) => x.rule)).toContain('end-rule');
  });
});
