import { describe, expect, it } from 'vitest';
import { createRunner } from '../../../src/core/sim/runner.js';
import { toggleBuild } from './handmade.js';

describe('core/sim/runner', () => {
  it('clocks, resets and undoes by the hand procedure', () => {
    const r = createRunner(toggleBuild(), { stageDelayS: 0.25 });
    expect(r.reading().code).toBe('X');
    expect(r.reset()).toEqual([]);
    expect(r.reading()).toMatchObject({ state: 'off', code: '0', outputs: { lit: '0' } });
    const c = r.clock({ t: 1 });
    expect(c).toMatchObject({
      before: { state: 'off' },
      outputs: { lit: '0' },
      after: { state: 'on', code: '1', outputs: { lit: '1' } },
      alarms: [],
    });
    r.clock({ t: 0 });
    expect(r.reading().state).toBe('on');
    expect(r.history).toEqual(['reset', 'clock', 'clock']);
    expect(r.undo()).toBe(true);
    expect(r.undo()).toBe(true);
    expect(r.reading()).toMatchObject({ state: 'off', inputs: { t: 0 } });
    expect(r.undo()).toBe(true);
    expect(r.undo()).toBe(false);
  });

  it('reports the alarms of single hand actions', () => {
    const r = createRunner(toggleBuild(), { stageDelayS: 0.25 });
    r.reset();
    r.act({ kind: 'input', input: 't', value: 1 });
    r.act({ kind: 'pull', lever: 'phi1' });
    const alarms = r.act({ kind: 'pull', lever: 'reset' });
    expect(alarms.map((a) => a.kind)).toEqual(['reset-during-clock', 'forbidden-input']);
    expect(r.history).toEqual(['reset', "pull input lever 't'", 'pull φ1', 'pull reset']);
  });
});
