/**
 * Drive snapshots: the settled output of every driver (lever or gate) in each reachable
 * state, input combination and clock phase, as the drum and drive checks need them (a
 * capstan is engaged while its driver's output is 0).
 *
 * Method: three-valued simulation of the compiled netlist (part.ts) from each used state code,
 * through the hand procedure's phases: inputs held, φ1 pulled, φ1 released, φ2 pulled. Input
 * combinations are tried exhaustively up to EXHAUSTIVE_INPUTS, else one per row cube plus
 * seeded samples (clocking.ts). An X output counts as engaged (the worst case for torque).
 */
import type { Build } from '../model/build.js';
import type { Profile } from '../physics/profile.js';
import type { DriveSnapshot } from '../physics/drum.js';
import { seededRandom } from '../model/random.js';
import { coverHolds } from '../model/cube.js';
import { EXHAUSTIVE_INPUTS, forEachHeld, grayAssignments, sampledAssignments } from '../checks/clocking.js';
import { applyInPlace, simFor, stateAtCode, timingOf, type PartSim } from './part.js';
import type { HandAction } from './hand.js';

const PHASES: readonly { readonly label: string; readonly action?: HandAction }[] = [
  { label: 'inputs held' },
  { label: 'φ1 pulled', action: { kind: 'pull', lever: 'phi1' } as HandAction },
  { label: 'φ1 released', action: { kind: 'release', lever: 'phi1' } as HandAction },
  { label: 'φ2 pulled', action: { kind: 'pull', lever: 'phi2' } as HandAction },
];

/** Snapshots of every reachable state × input combination × phase (bounded as described above). */
export function driveSnapshots(build: Build, profile: Pick<Profile, 'stageDelayS'>, seed = 1): DriveSnapshot[] {
  const sim = simFor(build, timingOf(profile));
  const f = build.machine;
  const n = f.inputs.length;
  const all =
    n <= EXHAUSTIVE_INPUTS
      ? grayAssignments(n)
      : sampledAssignments(
          f.rows.flatMap((rs) => rs.map((r) => r.cube)),
          n,
          64,
          seededRandom(seed),
        );
  const assignments = all.filter((a) => !coverHolds(f.never, a));
  const out: DriveSnapshot[] = [];
  const phases = build.encoding.bits === 0 ? PHASES.slice(0, 1) : PHASES;
  f.states.forEach((name, s) => {
    const base = stateAtCode(sim, build.encoding.codes[s]).values;
    forEachHeld(sim, base, assignments, (held, a) => {
      const values = held.slice();
      let t = 0;
      for (const p of phases) {
        if (p.action) t = applyInPlace(sim, values, t, p.action, []);
        out.push({ label: `${name}, inputs ${a || '—'}, ${p.label}`, outputs: driverOutputs(sim, values) });
      }
    });
  });
  return out;
}

function driverOutputs(sim: PartSim, values: Uint8Array): Map<string, 0 | 1> {
  const m = new Map<string, 0 | 1>();
  // X (value 2) counts as engaged: report it as 0.
  for (let d = 0; d < sim.driverCount; d++) m.set(sim.ids[d], values[d] === 1 ? 1 : 0);
  return m;
}
