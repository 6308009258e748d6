/**
 * The drive check with the cords as routed in the frame (the `losses` input of
 * physics/check-drive.ts, from physics/routing.ts through the place phase), checked against
 * closed forms:
 * - a pulley of efficiency η passes a tension T on as ηT, so a branch over k pulleys needs
 *   T/η^k — the factor (1/η)^k (a sheave's efficiency per pass is common practice);
 * - over a fixed pin turned through α the capstan equation of Euler and Eytelwein,
 *   T_load = T_hold·e^(μα) (J. L. Meriam & L. G. Kraige, Engineering Mechanics: Statics, the
 *   flexible-belts section — from memory), gives the factor e^(μ_pin·α);
 * and the pipeline's answer when a route makes a budget fail: buffer trees again, from the
 * routed losses, with the build placed once more.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { findCheck } from '../../../src/core/checks/results.js';
import { place } from '../../../src/core/phases/place/index.js';
import { analyse, buildMachine, placeWithDrive } from '../../../src/core/pipeline.js';
import { balanceDrive } from '../../../src/core/physics/buffer-tree.js';
import { checkDrive } from '../../../src/core/physics/check-drive.js';
import { branchKey, driveBudget } from '../../../src/core/physics/drive.js';
import { DEFAULT_PROFILE, type Profile } from '../../../src/core/physics/profile.js';
import { expectedLosses, leavingLoss, lossByBranch } from '../../../src/core/physics/routing.js';
import { fanOut } from './netlists.js';

const withFrame = (frame: Partial<Profile['frame']>, more: Partial<Profile> = {}): Profile => ({
  ...DEFAULT_PROFILE,
  ...more,
  frame: { ...DEFAULT_PROFILE.frame, ...frame },
});

describe('core/physics/check-drive with routed losses', () => {
  // Lever L pulls one port on each of four one-port gates: every branch leaves L's bay.
  const n = fanOut(4, 1);

  it('a branch over k pulleys of efficiency η costs (1/η)^k, and the margin falls by as much', () => {
    for (const eta of [0.95, 0.9, 0.8]) {
      const profile = withFrame({ turn: 'pulley' }, { routing: { ...DEFAULT_PROFILE.routing, pulleyEfficiency: eta } });
      const p = place(n, profile);
      const losses = lossByBranch(p.routing);
      const check = checkDrive(n, profile, [], undefined, losses);
      const straight = checkDrive(n, profile, []);
      const L = check.drivers.find((d) => d.driver === 'L');
      const L0 = straight.drivers.find((d) => d.driver === 'L');
      for (const b of L?.branches ?? []) {
        const route = p.routing.branches.find((r) => r.cord === b.cord && r.target === b.target);
        expect(route?.pulleys).toBe(2); // down into the channel, and up to the lever
        expect(b.routingFactor).toBeCloseTo((1 / eta) ** 2, 12);
        expect(b.loadG).toBeCloseTo(b.baseG / eta ** 2, 9);
      }
      expect(L?.margin).toBeCloseTo((L0?.margin ?? NaN) * eta ** 2, 9);
    }
  });

  it('a branch over smooth pins costs e^(μ_pin·α) for the angle α it turns (capstan equation)', () => {
    for (const muPin of [0.1, 0.2, 0.3]) {
      const profile = withFrame({ turn: 'pin' }, { routing: { ...DEFAULT_PROFILE.routing, muPin } });
      const p = place(n, profile);
      const check = checkDrive(n, profile, [], undefined, lossByBranch(p.routing));
      for (const b of check.drivers.find((d) => d.driver === 'L')?.branches ?? []) {
        const route = p.routing.branches.find((r) => r.cord === b.cord && r.target === b.target);
        // Two right-angle turns: α = π in all.
        expect(route?.pins).toEqual([Math.PI / 2, Math.PI / 2]);
        expect(b.routingFactor).toBeCloseTo(Math.exp(muPin * Math.PI), 12);
      }
    }
  });

  it('a cordRouting entry in the profile still wins over the computed route', () => {
    const profile = withFrame({}, { cordRouting: { 'c.L': { pulleys: 0, pinAngleRad: Math.PI / 2 } } });
    const p = place(n, profile);
    const check = checkDrive(n, profile, [], undefined, lossByBranch(p.routing));
    for (const b of check.drivers.find((d) => d.driver === 'L')?.branches ?? [])
      expect(b.routingFactor).toBeCloseTo(Math.exp(DEFAULT_PROFILE.routing.muPin * (Math.PI / 2)), 12);
    // …and only for its own cord.
    const k = check.drivers.find((d) => d.driver === 'K');
    for (const b of k?.branches ?? []) expect(b.routingFactor).toBeCloseTo(1 / 0.95 ** 2, 12);
  });

  it('a branch the losses do not name takes its cord’s profile routing, as before placement', () => {
    const check = checkDrive(n, DEFAULT_PROFILE, [], undefined, new Map([[branchKey('c.L', 'g1.a'), 3]]));
    const L = check.drivers.find((d) => d.driver === 'L');
    expect(L?.branches.map((b) => b.routingFactor)).toEqual([3, 1, 1, 1]);
  });

  it('the most a computed branch costs is the loss of one that leaves its bay', () => {
    const p = place(n, DEFAULT_PROFILE);
    for (const b of p.routing.branches)
      expect(b.loss).toBeLessThanOrEqual(leavingLoss(DEFAULT_PROFILE, b.cord) + 1e-12);
    expect(leavingLoss(DEFAULT_PROFILE)).toBeCloseTo(1 / 0.95 ** 2, 12);
  });
});

describe('core/pipeline: buffer trees from the routed losses', () => {
  // Smooth pins at every turn: a branch that leaves its bay costs e^(0.2π) ≈ 1.87 (capstan equation).
  const pins = withFrame({ turn: 'pin' });
  const a = analyse(readFileSync('examples/marble-bell.lw', 'utf8'), 'marble-bell.lw');

  it('balances a build with the losses its routes will have, so that placed, every margin holds', () => {
    if (!a.ok) throw new Error('marble bell must analyse');
    const pulleys = buildMachine(a, { encoding: 'binary', checks: false });
    const routed = buildMachine(a, { encoding: 'binary', profile: pins });
    if (!pulleys.ok || !routed.ok) throw new Error('marble bell must build');
    for (const [key, loss] of expectedLosses(routed.build.netlist, pins))
      expect(lossByBranch(routed.placement.routing).get(key), key).toBeCloseTo(loss, 12);
    expect(routed.build.parts.gates).toBeGreaterThan(pulleys.build.parts.gates);
    expect(routed.checks.every((c) => c.ok)).toBe(true);
    // The drive check saw the routed losses, not straight cords.
    const factors = findCheck(routed.checks, 'drive')?.drivers.flatMap((d) => d.branches.map((b) => b.routingFactor));
    expect(factors?.every((f) => Math.abs(f - Math.exp(0.2 * Math.PI)) < 1e-9)).toBe(true);
  });

  it('when a routed branch still breaks a budget, adds buffers with the routed losses and places the build again', () => {
    if (!a.ok) throw new Error('marble bell must analyse');
    const b = buildMachine(a, { encoding: 'binary', checks: false });
    if (!b.ok) throw new Error('marble bell must build');
    // Balanced for pulleys, then placed in a frame of pins: some budget breaks once routed…
    const first = place(b.build.netlist, pins);
    expect(driveBudget(b.build.netlist, pins, lossByBranch(first.routing)).some((x) => !x.ok)).toBe(true);
    // …so the place phase balances again and places again, until every margin holds.
    const again = placeWithDrive(b.build, pins, { seed: 1, pins: {} });
    expect(again.build.parts.gates).toBeGreaterThan(b.build.parts.gates);
    expect(driveBudget(again.build.netlist, pins, lossByBranch(again.placement.routing)).every((x) => x.ok)).toBe(true);
    expect(again.placement.bays).toHaveLength(again.build.parts.gates + again.build.parts.levers);
  });

  it('leaves a build alone when the routed losses break nothing (balanceDrive returns the same netlist)', () => {
    if (!a.ok) throw new Error('marble bell must analyse');
    const b = buildMachine(a, { encoding: 'binary', checks: false });
    if (!b.ok) throw new Error('marble bell must build');
    expect(balanceDrive(b.build.netlist, DEFAULT_PROFILE, lossByBranch(b.placement.routing))).toBe(b.build.netlist);
    expect(placeWithDrive(b.build, DEFAULT_PROFILE, { seed: 1, pins: {} }).build).toBe(b.build);
  });
});
