import { describe, expect, it } from 'vitest';
import { operatorForces } from '../../../src/core/physics/operator.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { cord, gate, lever } from './netlists.js';

describe('core/physics/operator', () => {
  it('gives every lever its pull-up weight plus the handle allowance, in grams and newtons', () => {
    const n = {
      parts: [lever('a'), lever('p1', 'phi1'), lever('rs', 'reset'), gate('g', 1)],
      cords: [cord('c', 'a', ['g.a'])],
    };
    const f = operatorForces(n, { ...DEFAULT_PROFILE, leverWeightG: 20, operatorExtraG: 3 });
    expect(f.map((x) => [x.lever, x.role, x.forceG])).toEqual([
      ['a', 'input', 23],
      ['p1', 'phi1', 23],
      ['rs', 'reset', 23],
    ]);
    expect(f[0].forceN).toBeCloseTo(0.023 * 9.80665, 12);
  });

  it('is 15 g + 5 g = 20 g with the default profile', () => {
    expect(operatorForces({ parts: [lever('a')], cords: [] }, DEFAULT_PROFILE)[0].forceG).toBe(20);
  });
});
