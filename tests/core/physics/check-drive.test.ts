import { describe, expect, it } from 'vitest';
import { checkDrive } from '../../../src/core/physics/check-drive.js';
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
        'minMargin',
        'weakestCord',
        'worstTorqueNm',
        'worstPowerW',
        'operatorForceMaxG',
        'drivers',
      ].sort(),
    );
    expect(c.name).toBe('drive');
  });

  it('passes ten one-port loads on one lever capstan and reports margin, torque and lever force', () => {
    const c = checkDrive(fanOut(10, 1), DEFAULT_PROFILE, [{ label: 'idle', outputs: new Map([['L', 0]]) }]);
    expect(c.ok).toBe(true);
    expect(c.minMargin).toBeCloseTo(Math.exp(Math.PI) / 10, 9);
    expect(c.weakestCord).toBe('c.L');
    // One engaged capstan (L): 0.147100 N × (e^π − 1) × 0.04 m ≈ 0.130276 N·m (see drum.test.ts).
    expect(c.worstTorqueNm).toBeCloseTo(0.13027561, 7);
    expect(c.worstPowerW).toBeCloseTo(0.13027561 * ((2 * Math.PI * 20) / 60), 7);
    expect(c.operatorForceMaxG).toBe(20);
    expect(c.summary).toContain("smallest margin 2.31 on cord 'c.L'");
    expect((JSON.parse(JSON.stringify(c)) as { minMargin: number }).minMargin).toBeCloseTo(2.314, 3);
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
