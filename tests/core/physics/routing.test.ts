import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { route, type CordRoute, type FrameLayout, type PlacedBay } from '../../../src/core/physics/routing.js';
import { DEFAULT_PROFILE, type Profile } from '../../../src/core/physics/profile.js';
import { place } from '../../../src/core/phases/place/index.js';
import type { Netlist } from '../../../src/core/model/netlist.js';
import { actuator, cord, gate, lever } from './netlists.js';
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
 * A branch's whole path from the positions alone (test-only), with knots at both ends and the
 * take-up: drop to the lower drum's channel, along it, rise to the lever's rail (or out to an
 * actuator). For a cord of one branch this is the piece to cut (design §11, "Cord runs").
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

/** A cord's span along each channel it uses (test-only, from its branches' whole paths): max − min of the capstan's x and its targets'. */
function spans(c: CordRoute): number {
  const byLevel = new Map<number, number[]>();
  for (const b of c.branches) {
    const ch = b.runs.find((x) => x.kind === 'channel');
    if (!ch) continue;
    byLevel.set(ch.from.yM, [...(byLevel.get(ch.from.yM) ?? [ch.from.xM]), ch.to.xM]);
  }
  return [...byLevel.values()].reduce((s, xs) => s + Math.max(...xs) - Math.min(...xs), 0);
}

/**
 * The tree's pieces partition it (test-only): every own run lies on its branch's own path, the
 * own runs of a cord never overlap, and together they are the drop to the lowest channel, the
 * span along each channel and every rise — nothing counted twice, nothing left out.
 */
function checkTree(c: CordRoute, p: Profile): void {
  const f = p.frame;
  const pieces = c.branches.reduce((s, b) => s + b.lengthM, 0);
  expect(c.cutM).toBeCloseTo(c.trunkM + pieces, 12);
  if (c.branches.length === 0 || c.branches[0].runs[0].kind === 'direct') return;
  const segs: string[] = [];
  for (const b of c.branches) {
    const drop = b.runs[0];
    const ch = b.runs[1];
    for (const o of b.own) {
      if (o.kind === 'drop') {
        expect(o.from.xM).toBe(drop.from.xM);
        expect(o.from.yM).toBeLessThanOrEqual(drop.from.yM + 1e-12);
        expect(o.to.yM).toBeGreaterThanOrEqual(drop.to.yM - 1e-12);
      } else if (o.kind === 'channel') expect(o).toEqual(ch);
      else expect(o).toBe(b.runs[b.runs.length - 1]);
      segs.push(
        `${o.kind}:${o.from.xM.toFixed(9)}:${o.from.yM.toFixed(9)}:${o.to.xM.toFixed(9)}:${o.to.yM.toFixed(9)}`,
      );
    }
  }
  expect(new Set(segs).size).toBe(segs.length);
  const lowest = Math.min(...c.branches.map((b) => b.runs[0].to.yM));
  const top = Math.max(...c.branches.map((b) => b.runs[0].from.yM));
  const rises = c.branches.reduce((s, b) => s + b.runs[b.runs.length - 1].lengthM, 0);
  const tree = top - lowest + spans(c) + rises;
  expect(pieces).toBeCloseTo(tree + c.branches.length * (2 * f.knotAllowanceM + f.takeUpAllowanceM), 9);
}

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

  it('measures each branch’s path as drop + channel + rise, through the lower drum’s channel between drums', () => {
    const out = route(netlist, layout, DEFAULT_PROFILE);
    const byPart = new Map(layout.bays.map((b) => [b.part, b]));
    for (const b of out.branches) {
      const [part, port] = targetOf(b.target, b.kind);
      const to = byPart.get(part) as PlacedBay;
      const leverX = to.levers.find((l) => l.name === port)?.xM as number;
      expect(b.crossDrum).toBe(to.drum !== 1);
      const runs = b.runs.reduce((s, x) => s + x.lengthM, 0);
      expect(runs + 2 * F.knotAllowanceM + F.takeUpAllowanceM).toBeCloseTo(
        lengthFromPositions(DEFAULT_PROFILE, byPart.get(b.driver) as PlacedBay, to, leverX),
        12,
      );
      const own = b.own.reduce((s, x) => s + x.lengthM, 0);
      expect(b.lengthM).toBeCloseTo(own + 2 * F.knotAllowanceM + F.takeUpAllowanceM, 12);
      for (const x of b.runs) expect(x.lengthM).toBeCloseTo(Math.hypot(x.to.xM - x.from.xM, x.to.yM - x.from.yM), 12);
    }
    const cross = out.branches.find((b) => b.target === 'g3.b');
    expect(cross?.runs.map((x) => x.kind)).toEqual(['drop', 'channel', 'rise']);
    // Up from drum 1's channel to drum 2's rail.
    expect(cross?.runs[2].lengthM).toBeCloseTo(F.channelBelowDrumM + F.drumSpacingM + F.railAboveDrumM, 12);
    // In drum 1's channel (the lower drum's), as every run of the branch records.
    expect(cross?.runs.map((x) => x.drum)).toEqual([1, 1, 1]);
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
    expect(b.runs[0].drum).toBe(1);
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
        const path = b.runs.reduce((s, x) => s + x.lengthM, 0) + 2 * short.frame.knotAllowanceM;
        expect(path + short.frame.takeUpAllowanceM).toBeCloseTo(
          lengthFromPositions(short, from, to, leverX, b.kind === 'actuator'),
          9,
        );
        drums = Math.max(drums, to.drum);
      }
      for (const c of p.routing.cords) checkTree(c, short);
      expect(p.routing.channelM).toBeCloseTo(
        p.routing.cords.reduce((s, c) => s + spans(c), 0),
        9,
      );
    }
    expect(drums).toBeGreaterThan(1);
  });

  it('runs a cord of three targets on one drum as a tree: along the channel its span, not the sum of its branches', () => {
    const n: Netlist = {
      parts: [lever('in'), gate('g1', 1), gate('g2', 1), gate('g3', 1), gate('g4', 1)],
      cords: [cord('c.in', 'in', ['g1.a', 'g3.a', 'g4.a'])],
    };
    // The lever in the middle: g1 to its left, g3 and g4 to its right.
    const l: FrameLayout = {
      bays: [
        bay('g1', 1, 1, 0.03, ['a']),
        bay('in', 1, 2, 0.09, ['lever']),
        bay('g2', 1, 3, 0.15, ['a']),
        bay('g3', 1, 4, 0.21, ['a']),
        bay('g4', 1, 5, 0.27, ['a']),
      ],
    };
    const out = route(n, l, DEFAULT_PROFILE);
    expect(out.channelM).toBeCloseTo(0.27 - 0.03, 12);
    const [b1, b3, b4] = out.branches;
    // Left side first: g1 owns the drop and the run out to it; g4, the farthest on the right, the run out to it; g3 its rise.
    expect(b1.own.map((x) => x.kind)).toEqual(['drop', 'channel', 'rise']);
    expect(b4.own.map((x) => x.kind)).toEqual(['channel', 'rise']);
    expect(b3.own.map((x) => x.kind)).toEqual(['rise']);
    expect([b1.channelM, b3.channelM, b4.channelM].map((v) => Math.round(v * 1e9) / 1e9)).toEqual([0.06, 0, 0.18]);
    const rise = F.channelBelowDrumM + F.railAboveDrumM;
    const allow = 2 * F.knotAllowanceM + F.takeUpAllowanceM;
    expect(b3.lengthM).toBeCloseTo(rise + allow, 12);
    expect(b1.lengthM).toBeCloseTo(F.channelBelowDrumM - r + 0.06 + rise + allow, 12);
    checkTree(out.cords[0], DEFAULT_PROFILE);
    // Every path still turns twice: its loss is (1/η)², η = 0.95 (definition of pulley efficiency).
    for (const b of out.branches) expect(b.loss).toBeCloseTo(1 / 0.95 ** 2, 12);
    // In the frame: a corner on each side (2), and a pulley at each rise (3).
    expect(out.pulleys).toBe(5);
    expect(out.cords[0].pulleys).toBe(5);
  });

  it('keeps a cord of one branch exactly as long as its path (the same formula as before trees)', () => {
    const out = route(netlist, layout, DEFAULT_PROFILE);
    const one = out.cords.find((c) => c.cord === 'c.g1') as CordRoute;
    const [b] = one.branches;
    expect(b.own).toEqual(b.runs);
    expect(b.lengthM).toBeCloseTo(lengthFromPositions(DEFAULT_PROFILE, layout.bays[1], layout.bays[2], 0.15), 12);
    expect(one.pulleys).toBe(2);
  });

  it('takes one drop through two channels for a driver on drum 2 with targets on drums 1 and 3', () => {
    const n: Netlist = {
      parts: [lever('in'), gate('lo', 1), gate('hi', 1), gate('mid', 1)],
      cords: [cord('c.mid', 'mid', ['lo.a', 'hi.a'])],
    };
    const l: FrameLayout = {
      bays: [
        bay('in', 1, 1, 0.03, ['lever']),
        bay('lo', 1, 2, 0.09, ['a']),
        bay('mid', 2, 1, 0.03, ['a']),
        bay('hi', 3, 1, 0.15, ['a']),
      ],
    };
    const out = route(n, l, DEFAULT_PROFILE);
    const [lo, hi] = out.branches;
    const s = F.drumSpacingM;
    // Highest channel first: drum 2's, for the branch to drum 3, which owns the drop from the drum to it.
    expect(hi.own.map((x) => x.kind)).toEqual(['drop', 'channel', 'rise']);
    expect(hi.own[0].lengthM).toBeCloseTo(F.channelBelowDrumM - r, 12);
    expect(hi.own[1].from.yM).toBeCloseTo(s - F.channelBelowDrumM, 12);
    // Then drum 1's channel: the drop on down from drum 2's channel, one drum spacing.
    expect(lo.own.map((x) => x.kind)).toEqual(['drop', 'channel', 'rise']);
    expect(lo.own[0].lengthM).toBeCloseTo(s, 12);
    expect(lo.own[1].from.yM).toBeCloseTo(-F.channelBelowDrumM, 12);
    // Each run records the drum whose channel it belongs to, and a drop from a knot the channel it leaves.
    expect(hi.own.map((x) => x.drum)).toEqual([2, 2, 2]);
    expect(hi.own[0].knotDrum).toBeUndefined();
    expect(lo.own.map((x) => x.drum)).toEqual([1, 1, 1]);
    expect(lo.own[0].knotDrum).toBe(2);
    expect(lo.runs.map((x) => x.drum)).toEqual([1, 1, 1]);
    // Each branch's path is still the whole way from drum 2.
    expect(lo.runs[0].lengthM).toBeCloseTo(s + F.channelBelowDrumM - r, 12);
    expect(out.channelM).toBeCloseTo(0.06 + 0.12, 12);
    expect(out.pulleys).toBe(4);
    checkTree(out.cords[0], DEFAULT_PROFILE);
  });

  it('counts each shared corner once in the frame, pins as pulleys, and per branch where a cordRouting entry rules', () => {
    // c.in: its three targets all lie right of the lever and run in drum 1's channel (g3 on drum 2 too,
    // the lower drum's channel), so one corner + 3 rises; c.g1: 1 corner + 1 rise.
    const out = route(netlist, layout, DEFAULT_PROFILE);
    expect(out.cords.map((c) => c.pulleys)).toEqual([4, 2]);
    expect(out.pulleys).toBe(6);
    expect(out.branches.reduce((s, b) => s + b.pulleys, 0)).toBe(8);
    const pins: Profile = { ...DEFAULT_PROFILE, frame: { ...F, turn: 'pin' } };
    const p = route(netlist, layout, pins);
    expect([p.pulleys, p.pins]).toEqual([0, 6]);
    const extra: Profile = { ...DEFAULT_PROFILE, routing: { ...DEFAULT_PROFILE.routing, pulleys: 1 } };
    expect(route(netlist, layout, extra).pulleys).toBe(6 + 4);
    // A cordRouting entry wins for its cord: its figures per branch, counted per branch.
    const over: Profile = { ...DEFAULT_PROFILE, cordRouting: { 'c.in': { pulleys: 3 } } };
    const o = route(netlist, layout, over);
    expect(o.cords[0].pulleys).toBe(9);
    expect(o.branches.filter((b) => b.cord === 'c.in').every((b) => b.pulleys === 3 && b.overridden)).toBe(true);
    expect(o.pulleys).toBe(9 + 2);
  });

  it('sends an actuator’s branch out of the frame at the end of the channel run it owns', () => {
    const n: Netlist = {
      parts: [lever('in'), gate('g1', 1), actuator('bell', 100)],
      cords: [cord('c.in', 'in', ['g1.a'], ['bell'])],
    };
    const l: FrameLayout = {
      bays: [bay('bell', 1, 1, 0.03, ['exit']), bay('in', 1, 2, 0.09, ['lever']), bay('g1', 1, 3, 0.15, ['a'])],
    };
    const out = route(n, l, DEFAULT_PROFILE);
    const bell = out.branches.find((b) => b.kind === 'actuator');
    expect(bell?.own.map((x) => x.kind)).toEqual(['drop', 'channel', 'exit']);
    expect(bell?.own[2].lengthM).toBe(F.actuatorRunM);
    expect(out.channelM).toBeCloseTo(0.12, 12);
    checkTree(out.cords[0], DEFAULT_PROFILE);
  });

  // Property (fixed seed): one driver and up to six targets scattered over three drums, in any bays.
  it('cuts every tree into pieces that cover it once, with the channel its spans, wherever the bays stand (property)', () => {
    const spot = fc.record({ drum: fc.integer({ min: 1, max: 3 }), slot: fc.integer({ min: 0, max: 11 }) });
    fc.assert(
      fc.property(
        spot,
        fc.uniqueArray(spot, { minLength: 1, maxLength: 6, selector: (x) => `${x.drum}:${x.slot}` }),
        (d, ts) => {
          const free = ts.filter((t) => t.drum !== d.drum || t.slot !== d.slot);
          const gates = free.map((_, i) => gate(`g${i}`, 1));
          const n: Netlist = {
            parts: [lever('in'), ...gates],
            cords: [
              cord(
                'c.in',
                'in',
                gates.map((g) => `${g.id}.a`),
              ),
            ],
          };
          const l: FrameLayout = {
            bays: [
              bay('in', d.drum, d.slot + 1, 0.03 + 0.06 * d.slot, ['lever']),
              ...free.map((t, i) => bay(`g${i}`, t.drum, t.slot + 1, 0.03 + 0.06 * t.slot, ['a'])),
            ],
          };
          const out = route(n, l, DEFAULT_PROFILE);
          const [c] = out.cords;
          checkTree(c, DEFAULT_PROFILE);
          expect(out.channelM).toBeCloseTo(spans(c), 9);
          // Every branch's own runs lie on its own path, and every path turns twice: (1/η)² (η = 0.95).
          for (const b of c.branches) expect(b.loss).toBeCloseTo(1 / 0.95 ** 2, 12);
          // In the frame: a pulley at each side of each channel used, and one at each rise.
          const sides = new Set(
            c.branches.map(
              (b) => `${b.runs[1].from.yM}|${Math.sign(Math.round((b.runs[1].to.xM - b.runs[1].from.xM) * 1e6))}`,
            ),
          );
          expect(c.pulleys).toBe(sides.size + c.branches.length);
        },
      ),
      { seed: 4242, numRuns: 200 },
    );
  });
});
