import { describe, expect, it } from 'vitest';
import { CHECKS } from '../../../src/core/checks/registry.js';
import type { Build } from '../../../src/core/model/build.js';
import { seededRandom } from '../../../src/core/model/random.js';
import { place } from '../../../src/core/phases/place/index.js';
import { checkDrive } from '../../../src/core/physics/check-drive.js';
import type { DriveSnapshot, SnapshotOutputs } from '../../../src/core/physics/drum.js';
import { inputAssignments, machineInputs } from '../../../src/core/sim/assignments.js';
import { CLOCK_PHASES, forEachHeld } from '../../../src/core/sim/clocking.js';
import { applyInPlace, simFor, stateAtCode, timingOf } from '../../../src/core/sim/part.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { driveSnapshots, momentWords, placeWords, type SnapshotPlace } from '../../../src/core/sim/snapshots.js';
import { exampleBuild, exampleNames } from '../checks/builds.js';
import { randomBuild } from './actions.js';
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

/**
 * The drive snapshots as they were taken before they were streamed: every state × input
 * combination × moment simulated event-driven (forEachHeld from the state's code, then the
 * clock's moments), each snapshot a Map of every driver's output, all held in one array.
 */
function heldSnapshots(build: Build): DriveSnapshot<SnapshotPlace>[] {
  const sim = simFor(build, timingOf(DEFAULT_PROFILE));
  const f = build.machine;
  const tries = inputAssignments(machineInputs(f), seededRandom(1)).list;
  const phases = CLOCK_PHASES.filter((p) => p.phase !== 'phi2-released').slice(0, build.encoding.bits === 0 ? 1 : 4);
  const out: DriveSnapshot<SnapshotPlace>[] = [];
  f.states.forEach((state, s) => {
    const code = build.encoding.codes[s];
    forEachHeld(sim, stateAtCode(sim, code).values, tries, (held, inputs) => {
      const values = held.slice();
      let t = 0;
      for (const p of phases) {
        if (p.action) t = applyInPlace(sim, values, t, p.action, []);
        const m = new Map<string, 0 | 1>(sim.ids.map((id, d) => [id, values[d] === 1 ? 1 : 0]));
        out.push({ where: { state, code, inputs, phase: p.phase }, outputs: m });
      }
    });
  });
  return out;
}

describe('core/sim/snapshots, streamed', () => {
  it.each(exampleNames())('gives the same worst drum figures as every snapshot held at once, on %s', (name) => {
    const { build } = exampleBuild(name);
    const streamed = checkDrive(build.netlist, DEFAULT_PROFILE, driveSnapshots(build, DEFAULT_PROFILE), placeWords);
    const held = checkDrive(build.netlist, DEFAULT_PROFILE, heldSnapshots(build), placeWords);
    expect(streamed).toEqual(held);
  });

  it('samples each state past the bound on start points, seeded, and says so', () => {
    const { build } = exampleBuild('sequence-lock');
    const combinations = inputAssignments(machineInputs(build.machine), seededRandom(1)).list.length;
    const all = driveSnapshots(build, DEFAULT_PROFILE, 1);
    expect(all).toMatchObject({ inputs: 'exhaustive', clocks: build.machine.states.length * combinations });
    const sampled = driveSnapshots(build, DEFAULT_PROFILE, 1, { maxClocks: 12 });
    expect(sampled).toMatchObject({ inputs: 'sampled', seed: 1 });
    expect(sampled.clocks).toBeLessThanOrEqual(12);
    const places = [...sampled].map((s) => placeWords(s.where));
    expect([...driveSnapshots(build, DEFAULT_PROFILE, 1, { maxClocks: 12 })].map((s) => placeWords(s.where))).toEqual(
      places,
    );
    expect(new Set(places.map((p) => p.split(',')[0])).size).toBe(build.machine.states.length); // every state keeps a share
  });

  it("says in the drive check's words when the drum torque was taken over sampled inputs", () => {
    const { build, spec } = exampleBuild('sequence-lock');
    const entry = CHECKS.find((c) => c.name === 'drive');
    if (!entry) throw new Error('the drive check is registered');
    const r = entry.run({
      build,
      spec,
      profile: DEFAULT_PROFILE,
      seed: 1,
      placement: place(build.netlist, DEFAULT_PROFILE),
    });
    expect(r.torqueOver).toMatchObject({ inputs: 'exhaustive', seed: 1 });
    expect(r.summary).not.toContain('sampled');
    // 17 inputs: past the exhaustive bound of sim/assignments.ts, so the combinations are sampled.
    const wide = randomBuild(3, 17, 1, 5);
    const w = entry.run({
      build: wide,
      spec: {},
      profile: DEFAULT_PROFILE,
      seed: 2,
      placement: place(wide.netlist, DEFAULT_PROFILE, { seed: 2 }),
    });
    expect(w.torqueOver).toMatchObject({ inputs: 'sampled', seed: 2 });
    expect(w.summary).toMatch(/drum torque over \d+ sampled start points \(state × inputs, seed 2\), not every one$/);
  });
});
