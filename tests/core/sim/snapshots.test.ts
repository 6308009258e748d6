import { describe, expect, it } from 'vitest';
import type { SnapshotOutputs } from '../../../src/core/physics/drum.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { driveSnapshots, momentWords, placeWords } from '../../../src/core/sim/snapshots.js';
import { exampleBuild } from '../checks/builds.js';
import { toggleBuild } from './handmade.js';

/** A driver's output in a snapshot, whichever form the snapshot gives its outputs in. */
function outputOf(o: SnapshotOutputs, id: string): number | undefined {
  if (!('ids' in o)) return o.get(id);
  const v = o.values[o.ids.indexOf(id)];
  return o.lane === undefined ? v : (v >>> o.lane) & 1;
}

describe('core/sim/snapshots', () => {
  it('takes one snapshot per state × input combination × clock moment up to φ2 pulled, each saying where in typed fields', () => {
    const b = toggleBuild();
    const run = driveSnapshots(b, DEFAULT_PROFILE);
    expect(run).toMatchObject({ inputs: 'exhaustive', clocks: 2 * 2, seed: 1 });
    const snaps = [...run];
    expect(snaps).toHaveLength(2 * 2 * 4);
    expect(snaps.slice(0, 4).map((s) => s.where)).toEqual([
      { state: 'off', code: '0', inputs: '0', phase: 'inputs-held' },
      { state: 'off', code: '0', inputs: '0', phase: 'phi1-pulled' },
      { state: 'off', code: '0', inputs: '0', phase: 'phi1-released' },
      { state: 'off', code: '0', inputs: '0', phase: 'phi2-pulled' },
    ]);
    // The typed place agrees with the levers the snapshot shows (a lever's output is 1 while pulled).
    const id = b.signals;
    for (const s of snaps) {
      expect(outputOf(s.outputs, id.inputs.t)).toBe(Number(s.where.inputs));
      expect(outputOf(s.outputs, id.phi1)).toBe(s.where.phase === 'phi1-pulled' ? 1 : 0);
      expect(outputOf(s.outputs, id.phi2)).toBe(s.where.phase === 'phi2-pulled' ? 1 : 0);
    }
  });

  it('puts a place in words only when asked', () => {
    const w = { state: 'off', code: '0', inputs: '1', phase: 'phi1-pulled' } as const;
    expect(placeWords(w)).toBe('off, inputs 1, φ1 pulled');
    expect(momentWords({ inputs: '', phase: 'inputs-held' })).toBe('inputs —, inputs held');
  });

  it('has only the inputs-held moment for a machine without latches (no clock)', () => {
    const { build } = exampleBuild('odd-lever');
    expect(build.encoding.bits).toBe(0);
    const snaps = [...driveSnapshots(build, DEFAULT_PROFILE)];
    expect(new Set(snaps.map((s) => s.where.phase))).toEqual(new Set(['inputs-held']));
  });
});
