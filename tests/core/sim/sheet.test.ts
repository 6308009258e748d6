import { describe, expect, it } from 'vitest';
import { clockSteps, sheetSteps } from '../../../src/core/sim/sheet.js';

describe('core/sim/sheet', () => {
  // The two-phase hand procedure (DESIGN §5, the product's own rule): reset, then per clock the
  // input levers that move, pull φ1, release, pull φ2, release.
  it('gives a reset, then per clock the input row and the four phase rows', () => {
    const steps = sheetSteps(['a', 'b'], true, [
      { reset: false, inputs: '10' },
      { reset: true, inputs: '11' },
    ]);
    expect(steps.map((s) => `${s.clock}:${s.kind}`)).toEqual([
      '0:reset',
      '1:inputs',
      '1:pull-phi1',
      '1:release-phi1',
      '1:pull-phi2',
      '1:release-phi2',
      '2:reset',
      '2:inputs',
      '2:pull-phi1',
      '2:release-phi1',
      '2:pull-phi2',
      '2:release-phi2',
    ]);
    // Only the levers that move: a pulled first, then b alone.
    expect(steps[1].actions).toEqual([{ kind: 'input', input: 'a', value: 1 }]);
    expect(steps[7].actions).toEqual([{ kind: 'input', input: 'b', value: 1 }]);
  });

  it('keeps an input row with no move, and gives a one-state machine one row per setting', () => {
    expect(clockSteps(['a'], true, { reset: false, inputs: '1' }, 4, '1')[0]).toEqual({
      clock: 5,
      kind: 'inputs',
      at: 4,
      actions: [],
    });
    expect(sheetSteps([], false, [{ reset: false, inputs: '' }]).map((s) => s.kind)).toEqual(['look']);
    expect(sheetSteps(['a'], false, [{ reset: true, inputs: '1' }]).map((s) => s.kind)).toEqual(['inputs']);
  });
});
