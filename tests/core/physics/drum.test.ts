import { describe, expect, it } from 'vitest';
import { drumLoad, type DriveSnapshot } from '../../../src/core/physics/drum.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { cord, gate, lever } from './netlists.js';

// Lever L → one-port gate g1 → port a of gate g2; lever M → port b of g2. g2 drives no cord,
// so three capstans turn on the drum: L, g1, M.
const n = {
  parts: [lever('L'), lever('M'), gate('g1', 1), gate('g2', 2, 'output')],
  cords: [cord('cL', 'L', ['g1.a']), cord('c1', 'g1', ['g2.a']), cord('cM', 'M', ['g2.b'])],
};

// By hand, default profile: T_hold = 15 g × 9.80665 m/s² = 0.14709975 N; e^π − 1 = 22.14069263;
// r = 0.04 m → one engaged capstan takes 0.14709975 × 22.14069263 × 0.04 = 0.13027561 N·m.
// ω = 20 rev/min × 2π / 60 = 2.09439510 rad/s.
const ONE = 0.13027561;
const OMEGA = 2.0943951;

describe('core/physics/drum', () => {
  it('sums the torque of the engaged capstans per snapshot and finds the worst (hand arithmetic)', () => {
    const d = drumLoad(n, DEFAULT_PROFILE, [
      // Nothing pulled: L and M rest (output 0, cords pull), so g1's port is down, g1 = 1.
      {
        where: 'rest',
        outputs: new Map([
          ['L', 0],
          ['M', 0],
          ['g1', 1],
          ['g2', 1],
        ]),
      },
      // L pulled: L's cord slack, g1's port up, g1 = 0 (its cord pulls); M still pulls.
      {
        where: 'L pulled',
        outputs: new Map([
          ['L', 1],
          ['M', 0],
          ['g1', 0],
          ['g2', 1],
        ]),
      },
      {
        where: 'both pulled',
        outputs: new Map([
          ['L', 1],
          ['M', 1],
          ['g1', 0],
          ['g2', 1],
        ]),
      },
    ]);
    expect(d.capstans.map((c) => c.driver)).toEqual(['L', 'M', 'g1']);
    expect(d.capstans[0].torqueNm).toBeCloseTo(ONE, 7);
    expect(d.snapshotCount).toBe(3);
    expect(d.worstSnapshot?.engaged).toEqual(['L', 'M']);
    expect(d.worst.where).toBe('rest'); // first of the equal worst cases
    expect(d.worst.torqueNm).toBeCloseTo(0.26055123, 7);
    expect(d.worst.powerW).toBeCloseTo(0.26055123 * OMEGA, 7);
    expect(d.omegaRadS).toBeCloseTo(OMEGA, 7);
  });

  it('keeps the worst snapshot of each group, read as a stream, from Maps or from values by index', () => {
    const ids = ['L', 'M', 'g1', 'g2'];
    // A generator: the snapshots are made as they are read, never held together.
    function* snapshots(): Generator<DriveSnapshot> {
      yield { where: 'a rest', outputs: { ids, values: [0, 0, 1, 1] } };
      yield { where: 'a L pulled', outputs: { ids, values: Uint8Array.from([1, 0, 0, 1]) } };
      // Lane 1 of packed words: L = 1, M = 1, g1 = 0, g2 = 1 (bit 1 of each word).
      yield { where: 'b both pulled', outputs: { ids, values: Int32Array.from([2, 2, 1, 3]), lane: 1 } };
      yield { where: 'b X on g1', outputs: { ids, values: [1, 1, 2, 1] } };
    }
    const d = drumLoad(n, DEFAULT_PROFILE, snapshots(), (w) => w.split(' ')[0]);
    expect(d.snapshotCount).toBe(4);
    expect(d.worstByGroup.map((r) => [r.where, r.engaged])).toEqual([
      ['a rest', ['L', 'M']],
      ['b both pulled', ['g1']],
    ]);
    expect(d.worstByGroup[0].torqueNm).toBeCloseTo(2 * ONE, 7);
    expect(d.worstByGroup[1].torqueNm).toBeCloseTo(ONE, 7); // an X output counts as engaged: 'b X on g1' ties, the first is kept
  });

  it('measures the drum from total wraps × pitch: 3 capstans × 2 wraps × 8 mm = 48 mm', () => {
    const d = drumLoad(n, DEFAULT_PROFILE, []);
    expect(d.totalWraps).toBe(6);
    expect(d.drumLengthM).toBeCloseTo(0.048, 12);
  });

  it('takes every capstan as engaged when no snapshot is given', () => {
    const d = drumLoad(n, DEFAULT_PROFILE, []);
    expect(d.worst.where).toBeNull();
    expect(d.worst.torqueNm).toBeCloseTo(3 * ONE, 7);
  });

  it('counts a driver missing from a snapshot as engaged and says so', () => {
    const d = drumLoad(n, DEFAULT_PROFILE, [{ where: 'partial', outputs: new Map([['L', 1]]) }]);
    expect(d.worstSnapshot?.engaged).toEqual([]);
    expect(d.worstSnapshot?.assumed).toEqual(['M', 'g1']);
    expect(d.worstSnapshot?.torqueNm).toBeCloseTo(2 * ONE, 7);
  });

  it('uses the lever weight for a lever capstan and scales with the drum radius', () => {
    const d = drumLoad(n, { ...DEFAULT_PROFILE, leverWeightG: 30, drumRadiusM: 0.08 }, []);
    expect(d.capstans[0].torqueNm).toBeCloseTo(4 * ONE, 7);
    expect(d.capstans[2].torqueNm).toBeCloseTo(2 * ONE, 7);
  });
});
