/**
 * Drive snapshots: the settled output of every driver (lever or gate) in each state of the
 * built machine, input combination and clock phase, as the drum torque of the drive check
 * needs them (a capstan is engaged while its driver's output is 0). Each snapshot says where
 * it was taken in typed fields (`SnapshotPlace`); `placeWords` puts that in words for reports.
 *
 * Method: three-valued simulation of the compiled netlist (part.ts) from each used state code,
 * through the moments of one clock (clocking.ts) up to φ2 pulled: after φ2 is released the
 * machine is in its next state with the same inputs held, which is that state's own first
 * snapshot. The input combinations are assignments.ts's rule (exhaustive up to 16 inputs,
 * else one per row cube plus seeded samples), without the `never` ones. An X output counts as
 * engaged (the worst case for torque).
 */
import type { Build } from '../model/build.js';
import { seededRandom } from '../model/random.js';
import type { Profile } from '../physics/profile.js';
import type { DriveSnapshot } from '../physics/drum.js';
import { inputAssignments, machineInputs } from './assignments.js';
import { CLOCK_PHASES, forEachHeld, PHASE_WORDS, type ClockPhase } from './clocking.js';
import { applyInPlace, simFor, stateAtCode, timingOf, type PartSim } from './part.js';

/** Where a drive snapshot was taken. */
export interface SnapshotPlace {
  /** The state of the built machine, and its code. */
  readonly state: string;
  readonly code: string;
  /** The input combination held: '0'/'1' per input in the machine's order ('' without inputs). */
  readonly inputs: string;
  readonly phase: ClockPhase;
}

/** Snapshots per clock: every moment up to φ2 pulled; a machine without latches has no clock, only its inputs. */
const SNAPSHOT_PHASES = CLOCK_PHASES.filter((p) => p.phase !== 'phi2-released');

/** Snapshots of every state × input combination × phase (bounded as described above). */
export function driveSnapshots(
  build: Build,
  profile: Pick<Profile, 'stageDelayS'>,
  seed = 1,
): DriveSnapshot<SnapshotPlace>[] {
  const sim = simFor(build, timingOf(profile));
  const f = build.machine;
  const assignments = inputAssignments(machineInputs(f), seededRandom(seed)).list;
  const out: DriveSnapshot<SnapshotPlace>[] = [];
  const phases = build.encoding.bits === 0 ? SNAPSHOT_PHASES.slice(0, 1) : SNAPSHOT_PHASES;
  f.states.forEach((state, s) => {
    const code = build.encoding.codes[s];
    forEachHeld(sim, stateAtCode(sim, code).values, assignments, (held, inputs) => {
      const values = held.slice();
      let t = 0;
      for (const p of phases) {
        if (p.action) t = applyInPlace(sim, values, t, p.action, []);
        out.push({ where: { state, code, inputs, phase: p.phase }, outputs: driverOutputs(sim, values) });
      }
    });
  });
  return out;
}

/** "state, inputs 01, φ1 pulled": a snapshot's place in words. */
export function placeWords(p: SnapshotPlace): string {
  return `${p.state}, ${momentWords(p)}`;
}

/** "inputs 01, φ1 pulled": the inputs and phase of a snapshot's place, without its state. */
export function momentWords(p: Pick<SnapshotPlace, 'inputs' | 'phase'>): string {
  return `inputs ${p.inputs || '—'}, ${PHASE_WORDS[p.phase]}`;
}

function driverOutputs(sim: PartSim, values: Uint8Array): Map<string, 0 | 1> {
  const m = new Map<string, 0 | 1>();
  // X (value 2) counts as engaged: report it as 0.
  for (let d = 0; d < sim.driverCount; d++) m.set(sim.ids[d], values[d] === 1 ? 1 : 0);
  return m;
}
