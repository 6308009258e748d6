import { describe, expect, it } from 'vitest';
import { sizeActuators } from '../../../src/core/physics/actuators.js';
import { driveBudget } from '../../../src/core/physics/drive.js';
import { drumLoad } from '../../../src/core/physics/drum.js';
import { billOfMaterials } from '../../../src/core/physics/bom.js';
import { DEFAULT_PROFILE, type Profile } from '../../../src/core/physics/profile.js';
import type { GatePart, Netlist } from '../../../src/core/model/netlist.js';
import { actuator, cord, evaluate, gate, lever } from './netlists.js';

const P = DEFAULT_PROFILE;
const budget = (n: Netlist, id: string, p: Profile = P) => driveBudget(n, p).find((b) => b.driver === id);
const gateOf = (n: Netlist, id: string): GatePart | undefined =>
  n.parts.find((p): p is GatePart => p.kind === 'gate' && p.id === id);

/** Lever L drives output gate d (one port) whose own cord pulls only the actuator. */
const dedicated = (loadG: number): Netlist => ({
  parts: [lever('L'), gate('d', 1, 'output'), actuator('act.gate', loadG)],
  cords: [cord('c.L', 'L', ['d.a']), cord('c.d', 'd', [], ['act.gate'])],
});

/** Gate d's cord pulls three one-port gates and the actuator. */
const shared = (loadG: number): Netlist => ({
  parts: [lever('L'), gate('d', 1, 'output'), gate('g1', 1), gate('g2', 1), gate('g3', 1), actuator('act.gate', loadG)],
  cords: [cord('c.L', 'L', ['d.a']), cord('c.d', 'd', ['g1.a', 'g2.a', 'g3.a'], ['act.gate'])],
});

describe('core/physics/actuators', () => {
  // Hand computation from design §4 (capstan equation, T_hold = 15 g, μ = 0.25, margin 2):
  // a 300 g paddle needs a gain of 2·300/15 = 40, θ = ln 40 / 0.25 = 14.76 rad = 2.35 turns,
  // so 2.5 turns (quarter turns), which hold 15 g · e^(0.25·2π·2.5) = 761.3 g: margin 2.538.
  it('gives a 300 g actuator 2.5 turns and the margin a hand computation gives (2.538)', () => {
    const n = sizeActuators(dedicated(300), P);
    expect(gateOf(n, 'd')?.wraps).toBe(2.5);
    const b = budget(n, 'd');
    expect(b?.wraps).toBe(2.5);
    expect(b?.availableG).toBeCloseTo(15 * Math.exp(0.25 * 2 * Math.PI * 2.5), 9);
    expect(b?.availableG).toBeCloseTo(761.3, 1);
    expect(b?.margin).toBeCloseTo(2.538, 3);
    expect(b?.ok).toBe(true);
  });

  it('leaves a light actuator alone: the profile turns already carry it', () => {
    const n = dedicated(120);
    expect(sizeActuators(n, P)).toBe(n);
    expect(budget(n, 'd')?.margin).toBeCloseTo((15 * Math.exp(Math.PI)) / 120, 9); // 2.89
  });

  it('moves a heavy actuator off a shared cord onto a buffer pair of its own, keeping the signal', () => {
    const n = sizeActuators(shared(450), P);
    const ids = n.parts.map((p) => p.id);
    expect(ids).toEqual(['L', 'd', 'g1', 'g2', 'g3', 'act.gate.a', 'act.gate.b', 'act.gate']);
    expect(n.cords.find((c) => c.id === 'c.d')).toMatchObject({
      actuators: [],
      ports: expect.arrayContaining([{ part: 'act.gate.a', port: 'in' }]) as unknown,
    });
    expect(n.cords.find((c) => c.id === 'c.act.gate.b')).toMatchObject({
      driver: 'act.gate.b',
      ports: [],
      actuators: ['act.gate'],
    });
    // 450 g: gain 60, θ = ln 60 / 0.25 = 16.38 rad = 2.61 turns → 2.75 turns.
    expect(gateOf(n, 'act.gate.b')?.wraps).toBe(2.75);
    expect(driveBudget(n, P).every((b) => b.ok)).toBe(true);
    // The pair repeats d's signal (two inverters), so the actuator is pulled exactly when before.
    for (const pulled of [new Set<string>(), new Set(['L'])]) {
      const v = evaluate(n, pulled);
      expect(v.get('act.gate.b')).toBe(v.get('d'));
    }
  });

  it('stops at maxWraps, so the drive check names the output, how far short and what to change', () => {
    const n = sizeActuators(dedicated(5000), P);
    expect(gateOf(n, 'd')?.wraps).toBe(4);
    const b = budget(n, 'd');
    // 4 turns hold 15 g · e^(0.25·8π) = 15 g · e^(2π) = 8032 g; at margin 2, 4016 g: 984 g short.
    const most = (15 * Math.exp(2 * Math.PI)) / 2;
    expect(b?.ok).toBe(false);
    expect(b?.message).toContain("output 'act.gate' lifts 5000 g");
    expect(b?.message).toContain(
      `can move at most ${Math.round(most)} g at margin 2: ${Math.round(5000 - most)} g short`,
    );
    expect(b?.message).toContain('the most maxWraps allows');
    expect(b?.fixes?.[0]).toContain(`at most ${Math.floor(most)} g`);
    // The turns the fix names do carry it.
    const turns = Number(/more wraps: ([\d.]+) turns/.exec(b?.fixes?.[1] ?? '')?.[1]);
    expect(turns).toBe(4.25);
    expect(budget(sizeActuators(dedicated(5000), { ...P, maxWraps: turns }), 'd')?.ok).toBe(true);
  });

  it('counts each capstan with its own turns in the drum torque, drum length and bill of materials', () => {
    const n = sizeActuators(dedicated(300), P);
    const d = drumLoad(n, P, []);
    expect(d.totalWraps).toBe(2 + 2.5);
    expect(d.drumLengthM).toBeCloseTo(4.5 * P.wrapPitchM, 12);
    const t = d.capstans.find((c) => c.driver === 'd');
    // T_hold·(e^(μθ) − 1)·r with θ of 2.5 turns (design §4).
    expect(t?.torqueNm).toBeCloseTo(
      (15 / 1000) * 9.80665 * (Math.exp(0.25 * 2 * Math.PI * 2.5) - 1) * P.drumRadiusM,
      12,
    );
    const bom = billOfMaterials(n, P);
    expect(bom.filter((r) => r.kind === 'capstan').map((r) => [r.item, r.count, r.each])).toEqual([
      ['capstan', 1, 2],
      ['capstan, 2.5 turns', 1, 2.5],
    ]);
    expect(bom.find((r) => r.item === 'drum')?.each).toBeCloseTo(0.036, 6);
    expect(bom.find((r) => r.kind === 'actuator')?.note).toBe(
      'shows output act.gate; lifted by the capstan of d, 2.5 turns',
    );
  });
});
