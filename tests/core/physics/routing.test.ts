import { describe, expect, it } from 'vitest';
import { route, type FrameLayout, type PlacedBay } from '../../../src/core/physics/routing.js';
import { DEFAULT_PROFILE, type Profile } from '../../../src/core/physics/profile.js';
import { place } from '../../../src/core/phases/place/index.js';
import type { Netlist } from '../../../src/core/model/netlist.js';
import { cord, gate, lever } from './netlists.js';
import { randomNetlist } from '../phases/place/support.js';

const F = DEFAULT_PROFILE.frame;
const r = DEFAULT_PROFILE.drumRadiusM;

const bay = (part: string, drum: number, index: number, xM: number, levers: string[], widthM = 0.06): PlacedBay => ({
  part,
  drum,
  bay: index,
  xM,
  widthM,
  levers: levers.map((name, i) => ({ name, xM: xM - widthM / 2 + ((i + 0.5) * widthM) / levers.length })),
});

/** A lever driving two one-port gates two bays away, and a two-port gate on a second drum. */
const netlist: Netlist = {
  parts: [lever('in'), gate('g1', 1), gate('g2', 1), gate('g3', 2)],
  cords: [cord('c.in', 'in', ['g1.a', 'g2.a', 'g3.b']), cord('c.g1', 'g1', ['g2.a'])],
};
const layout: FrameLayout = {
  bays: [
    bay('in', 1, 1, 0.03, ['lever']),
    bay('g1', 1, 2, 0.09, ['a']),
    bay('g2', 1, 3, 0.15, ['a']),
    bay('g3', 2, 1, 0.45, ['a', 'b', 'Z'], 0.09),
  ],
};

/**
 * A branch's length from the positions alone (test-only): drop to the lower drum's channel,
 * along it, rise to the lever's rail (or out to an actuator), knots at both ends, take-up.
 */
function lengthFromPositions(p: Profile, from: PlacedBay, to: PlacedBay, leverX: number, actuator = false): number {
  const f = p.frame;
  const lower = Math.min(from.drum, to.drum);
  const channelY = (lower - 1) * f.drumSpacingM - f.channelBelowDrumM;
  const drop = (from.drum - 1) * f.drumSpacingM - p.drumRadiusM - channelY;
  const rise = actuator ? f.actuatorRunM : (to.drum - 1) * f.drumSpacingM + f.railAboveDrumM - channelY;
  return drop + Math.abs(from.xM - leverX) + rise + 2 * f.knotAllowanceM + f.takeUpAllowanceM;
}

/** `gate.port` (gate ids may hold dots) or an actuator id: the part and the lever tied to. */
const targetOf = (t: string, kind: 'port' | 'actuator'): [string, string] =>
  kind === 'port' ? [t.slice(0, t.lastIndexOf('.')), t.slice(t.lastIndexOf('.') + 1)] : [t, 'exit'];

describe('core/physics/routing', () => {
  // Pulley efficiency η: each pulley passes η of the tension, so k pulleys need 1/η^k more (definition of efficiency).
  it('charges 1/η per pulley: k pulleys pass η^k of the tension', () => {
    const out = route(netlist, layout, DEFAULT_PROFILE);
    for (const b of out.branches) {
      expect(b.pulleys).toBe(2);
      expect(b.pins).toEqual([]);
      expect(1 / b.loss).toBeCloseTo(0.95 ** 2, 12);
    }
    for (const k of [0, 1, 3, 5]) {
      const p: Profile = { ...DEFAULT_PROFILE, cordRouting: { 'c.in': { pulleys: k, pulleyEfficiency: 0.9 } } };
      const b = route(netlist, layout, p).branches.filter((x) => x.cord === 'c.in');
      for (const x of b) {
        expect(x.overridden).toBe(true);
        expect(x.pulleys).toBe(k);
        expect(1 / x.loss).toBeCloseTo(0.9 ** k, 12);
      }
    }
  });

  // Capstan equation (Euler–Eytelwein): a pin turning the cord α with friction μ costs e^(μα)
  // (J. L. Meriam & L. G. Kraige, Engineering Mechanics: Statics, flexible belts — from memory).
  it('charges e^(μ_pin·α) over smooth pins', () => {
    const pins: Profile = {
      ...DEFAULT_PROFILE,
      frame: { ...F, turn: 'pin' },
      routing: { ...DEFAULT_PROFILE.routing, muPin: 0.3 },
    };
    for (const b of route(netlist, layout, pins).branches) {
      expect(b.pulleys).toBe(0);
      expect(b.pins).toEqual([Math.PI / 2, Math.PI / 2]);
      expect(b.loss).toBeCloseTo(Math.exp(0.3 * Math.PI), 12);
    }
    // An override's pin angle replaces the computed turns, and its μ wins.
    const over: Profile = { ...pins, cordRouting: { 'c.g1': { pinAngleRad: 1, muPin: 0.5 } } };
    const g1 = route(netlist, layout, over).branches.find((b) => b.cord === 'c.g1');
    expect(g1?.loss).toBeCloseTo(Math.exp(0.5), 12);
    // The profile-wide extras add to every computed route.
    const extra: Profile = {
      ...DEFAULT_PROFILE,
      routing: { ...DEFAULT_PROFILE.routing, pulleys: 1, pinAngleRad: 0.5 },
    };
    const b = route(netlist, layout, extra).branches[0];
    expect(b.pulleys).toBe(3);
    expect(b.loss).toBeCloseTo(Math.exp(0.2 * 0.5) / 0.95 ** 3, 12);
  });

  it('measures each branch as drop + channel + rise + knots + take-up, through the lower drum channel between drums', () => {
    const out = route(netlist, layout, DEFAULT_PROFILE);
    const byPart = new Map(layout.bays.map((b) => [b.part, b]));
    for (const b of out.branches) {
      const [part, port] = targetOf(b.target, b.kind);
      const to = byPart.get(part) as PlacedBay;
      const leverX = to.levers.find((l) => l.name === port)?.xM as number;
      expect(b.lengthM).toBeCloseTo(
        lengthFromPositions(DEFAULT_PROFILE, byPart.get(b.driver) as PlacedBay, to, leverX),
        12,
      );
      expect(b.crossDrum).toBe(to.drum !== 1);
      const runs = b.runs.reduce((s, x) => s + x.lengthM, 0);
      expect(b.lengthM).toBeCloseTo(runs + 2 * F.knotAllowanceM + F.takeUpAllowanceM, 12);
      for (const x of b.runs) expect(x.lengthM).toBeCloseTo(Math.hypot(x.to.xM - x.from.xM, x.to.yM - x.from.yM), 12);
    }
    const cross = out.branches.find((b) => b.target === 'g3.b');
    expect(cross?.runs.map((x) => x.kind)).toEqual(['drop', 'channel', 'rise']);
    // Up from drum 1's channel to drum 2's rail.
    expect(cross?.runs[2].lengthM).toBeCloseTo(F.channelBelowDrumM + F.drumSpacingM + F.railAboveDrumM, 12);
    // Trunk: hold lever to the drum, the wraps, one knot.
    expect(out.cords[0].trunkM).toBeCloseTo(
      F.railAboveDrumM - r + 2 * Math.PI * r * DEFAULT_PROFILE.wraps + F.knotAllowanceM,
      12,
    );
    expect(out.totalCordM).toBeCloseTo(
      out.cords.reduce((s, c) => s + c.cutM, 0),
      12,
    );
  });

  it('rises directly when a cord never leaves its bay', () => {
    const n: Netlist = { parts: [gate('g', 2)], cords: [cord('c.g', 'g', ['g.a'])] };
    const l: FrameLayout = { bays: [bay('g', 1, 1, 0.045, ['a', 'b', 'Z'], 0.09)] };
    const [b] = route(n, l, DEFAULT_PROFILE).branches;
    expect(b.runs.map((x) => x.kind)).toEqual(['direct']);
    expect(b.pulleys).toBe(0);
    expect(b.loss).toBe(1);
    expect(b.runs[0].lengthM).toBeCloseTo(Math.hypot(0.03, F.railAboveDrumM - r), 12);
  });

  // Rope-rescue practice: bend radius at least 4 × the cord diameter (common practice).
  it('checks the bend radius against 4 cord diameters', () => {
    expect(route(netlist, layout, DEFAULT_PROFILE).bend).toEqual({ radiusM: 0.015, minRadiusM: 0.012, ok: true });
    const thick: Profile = { ...DEFAULT_PROFILE, frame: { ...F, cordDiameterM: 0.004 } };
    expect(route(netlist, layout, thick).bend.ok).toBe(false);
  });

  it('matches lengths recomputed from a placement’s positions, on random builds split over drums', () => {
    const short: Profile = { ...DEFAULT_PROFILE, frame: { ...F, longestDrumM: 0.3, drumsPerFrame: 9 } };
    let drums = 1;
    for (let s = 1; s <= 10; s++) {
      const n = randomNetlist(400 + s, 12);
      const p = place(n, short, { seed: s });
      const byPart = new Map(p.bays.map((b) => [b.part, b]));
      for (const b of p.routing.branches) {
        if (b.runs[0].kind === 'direct') continue;
        const [part, port] = targetOf(b.target, b.kind);
        const to = byPart.get(part) as PlacedBay;
        const leverX = to.levers.find((l) => l.name === port)?.xM as number;
        const from = byPart.get(b.driver) as PlacedBay;
        expect(b.lengthM).toBeCloseTo(lengthFromPositions(short, from, to, leverX, b.kind === 'actuator'), 9);
        drums = Math.max(drums, to.drum);
      }
    }
    expect(drums).toBeGreaterThan(1);
  });
});
