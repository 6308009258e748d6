import { describe, expect, it } from 'vitest';
import { checkDrive } from '../../../src/core/physics/check-drive.js';
import { ALL_ENGAGED } from '../../../src/core/physics/drum.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { fanOut } from './netlists.js';

describe('core/physics/check-drive', () => {
  it('has exactly the fields of the drive check', () => {
    const c = checkDrive(fanOut(10, 1), DEFAULT_PROFILE, []);
    expect(Object.keys(c).sort()).toEqual(
      [
        'name',
        'ok',
        'summary',
        'says',
        'minMargin',
        'weakestCord',
        'worstTorqueNm',
        'worstPowerW',
        'worstAt',
        'worstByState',
        'operatorForceMaxG',
        'drivers',
        'muMin',
        'muAtMinMargin',
        'outputs',
      ].sort(),
    );
    expect(c.name).toBe('drive');
  });

  it('passes ten one-port loads on one lever capstan and reports margin, torque and lever force', () => {
    const c = checkDrive(fanOut(10, 1), DEFAULT_PROFILE, [{ where: { state: 'idle' }, outputs: new Map([['L', 0]]) }]);
    expect(c.ok).toBe(true);
    expect(c.minMargin).toBeCloseTo(Math.exp(Math.PI) / 10, 9);
    expect(c.weakestCord).toBe('c.L');
    // One engaged capstan (L): 0.147100 N × (e^π − 1) × 0.04 m ≈ 0.130276 N·m (see drum.test.ts).
    expect(c.worstTorqueNm).toBeCloseTo(0.13027561, 7);
    expect(c.worstPowerW).toBeCloseTo(0.13027561 * ((2 * Math.PI * 20) / 60), 7);
    expect(c.operatorForceMaxG).toBe(20);
    expect(c.summary).toContain("smallest margin 2.31 on cord 'c.L'");
    expect(c.summary).toContain("(0.27 W) in 'idle'");
    expect(c.worstAt).toEqual({ state: 'idle' });
    expect((JSON.parse(JSON.stringify(c)) as { minMargin: number }).minMargin).toBeCloseTo(2.314, 3);
  });

  it('keeps the worst snapshot of each state (the first of equals) and words the worst place as told', () => {
    type Place = { state: string; phase: string };
    const snap = (state: string, phase: string, l: 0 | 1) => ({
      where: { state, phase },
      outputs: new Map([['L', l]]),
    });
    const c = checkDrive(
      fanOut(10, 1),
      DEFAULT_PROFILE,
      [snap('a', 'rest', 1), snap('a', 'pulled', 0), snap('b', 'rest', 0), snap('b', 'pulled', 0)],
      (w: Place) => `${w.state} while ${w.phase}`,
    );
    // One engaged capstan (L) gives 0.13027561 N·m (hand arithmetic, drum.test.ts); released, none.
    expect(c.worstByState.map((w) => [w.where, w.torqueNm > 0])).toEqual([
      [{ state: 'a', phase: 'pulled' }, true],
      [{ state: 'b', phase: 'rest' }, true],
    ]);
    expect(c.worstAt).toEqual({ state: 'a', phase: 'pulled' });
    expect(c.summary).toContain("in 'a while pulled'");
  });

  it('says every capstan is engaged when it is given no snapshot', () => {
    const c = checkDrive(fanOut(10, 1), DEFAULT_PROFILE, []);
    expect(c.worstAt).toBeNull();
    expect(c.worstByState).toEqual([]);
    expect(c.summary).toContain(`in '${ALL_ENGAGED}'`);
  });

  it('fails past the fan-out and names the cord and the fix', () => {
    const c = checkDrive(fanOut(12, 1), DEFAULT_PROFILE, []);
    expect(c.ok).toBe(false);
    expect(c.weakestCord).toBe('c.L');
    expect(c.summary).toMatch(/cord 'c\.L'.*margin 1\.93.*fix: fewer branches/);
  });

  it('reports no margin for a netlist without cords', () => {
    const c = checkDrive({ parts: [], cords: [] }, DEFAULT_PROFILE, []);
    expect(c.ok).toBe(true);
    expect(c.minMargin).toBeNull();
    expect(c.weakestCord).toBeNull();
    expect(c.operatorForceMaxG).toBe(0);
  });
});
