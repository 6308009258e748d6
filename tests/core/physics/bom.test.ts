import { describe, expect, it } from 'vitest';
import { billOfMaterials } from '../../../src/core/physics/bom.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { actuator, cord, gate, lever } from './netlists.js';

// Inputs a, b; clock φ1; a two-port gate g2 (a, φ1) and a one-port inverter g1 on b;
// g2's output pulls an actuator and the inverter's port; g1 drives nothing (a flag reads it).
const n = {
  parts: [
    lever('a'),
    lever('b'),
    lever('p1', 'phi1'),
    gate('g1', 1),
    gate('g2', 2, 'output'),
    { kind: 'flag' as const, id: 'f', name: 'f', output: 'lamp', gate: 'g1', inverted: false },
    actuator('flap', 120),
  ],
  cords: [
    cord('ca', 'a', ['g2.a']),
    cord('cp', 'p1', ['g2.b']),
    cord('cb', 'b', ['g1.a']),
    cord('c2', 'g2', [], ['flap']),
  ],
};

describe('core/physics/bom', () => {
  const rows = billOfMaterials(n, DEFAULT_PROFILE);
  const row = (item: string) => rows.find((r) => r.item === item);

  it('counts levers by kind', () => {
    expect(row('operator lever')?.count).toBe(2);
    expect(row('clock lever')?.count).toBe(1);
    expect(row('reset lever')).toBeUndefined();
    expect(row('summing lever Z')?.count).toBe(2);
    expect(row('port lever')?.count).toBe(2); // only the two-port gate has port levers
    expect(row('flag')?.count).toBe(1);
    expect(row('actuator flap')).toMatchObject({ count: 1, each: 120, unit: 'g load' });
  });

  it('lists weights with count, mass each and total mass', () => {
    expect(row('port pull-up weight')).toMatchObject({ kind: 'weight', count: 2, each: 15, unit: 'g', total: 30 });
    expect(row('Z weight')).toMatchObject({ count: 2, each: 15, total: 30 });
    expect(row('lever pull-up weight')).toMatchObject({ count: 3, each: 15, total: 45 });
  });

  it('counts capstans (drivers with a cord), wraps, drum length, cord and routing hardware', () => {
    expect(row('capstan')).toMatchObject({ count: 4, each: 2, unit: 'turns', total: 8 });
    expect(row('drum')?.each).toBeCloseTo(0.064, 9); // 8 wraps × 8 mm
    expect(row('cord branch')).toMatchObject({ count: 4, each: 0.6, total: 2.4 });
    // 2 turns × 2π × 0.04 m ≈ 0.503 m of cord on the drum per capstan.
    expect(row('capstan wrap cord')).toMatchObject({ count: 4, each: 0.503, total: 2.011 });
    expect(row('redirect pin')).toBeUndefined();
    const routed = billOfMaterials(n, {
      ...DEFAULT_PROFILE,
      cordRouting: { ca: { pinAngleRad: Math.PI, pulleys: 1 } },
    });
    expect(routed.find((r) => r.item === 'redirect pin')?.count).toBe(2); // half a turn: two quarter-turn pins
    expect(routed.find((r) => r.item === 'pulley')?.count).toBe(1);
  });
});
