/**
 * Drive snapshots: the settled output of every driver (lever or gate) in each state of the
 * built machine, input combination and clock phase, as the drum torque of the drive check
 * needs them (a capstan is engaged while its driver's output is 0). Each snapshot says where
 * it was taken in typed fields (`SnapshotPlace`); `placeWords` puts that in words for reports.
 *
 * Method: simulation of the compiled netlist from each used state code, through the moments
 * of one clock (clocking.ts) up to φ2 pulled: after φ2 is released the machine is in its next
 * state with the same inputs held, which is that state's own first snapshot. The clocks run
 * 32 at a time on the bit-parallel simulator (lanes.ts); a clock it cannot vouch for runs on
 * the three-valued event-driven one, where an X output counts as engaged (the worst case for
 * torque). The input combinations are assignments.ts's rule (exhaustive up to 16 inputs, else
 * one per row cube plus seeded samples), without the `never` ones.
 * Bound: the snapshots are made as they are read (a generator) and never held together, so
 * memory does not grow with their number; past `maxClocks` (state × input combination) start
 * points, each state gets an equal share of seeded sampled combinations (one per row cube of
 * the state first) and the run says `inputs: 'sampled'`.
 */
import type { Build } from '../model/build.js';
import { seededRandom } from '../model/random.js';
import type { Profile } from '../physics/profile.js';
import type { DriveSnapshot } from '../physics/drum.js';
import { inputAssignments, machineInputs } from './assignments.js';
import { CLOCK_PHASES, PHASE_WORDS, type ClockPhase } from './clocking.js';
import { LANES, LaneBatch } from './lanes.js';
import { applyInPlace, setLeversInPlace, simFor, stateAtCode, timingOf, type PartSim } from './part.js';

/** Where a drive snapshot was taken. */
export interface SnapshotPlace {
  /** The state of the built machine, and its code. */
  readonly state: string;
  readonly code: string;
  /** The input combination held: '0'/'1' per input in the machine's order ('' without inputs). */
  readonly inputs: string;
  readonly phase: ClockPhase;
}

/** The snapshots of a build, made as they are read, and how their input combinations were chosen. */
export interface DriveSnapshotRun extends Iterable<DriveSnapshot<SnapshotPlace>> {
  /** Every combination (within assignments.ts's rule), or a seeded sample past the bound. */
  readonly inputs: 'exhaustive' | 'sampled';
  /** Start points (state × input combination), each giving one snapshot per moment. */
  readonly clocks: number;
  readonly seed: number;
}

export interface SnapshotOptions {
  /** Start points (state × input combination) beyond which each state's combinations are sampled (default 262 144). */
  readonly maxClocks?: number;
}

/** Snapshots per clock: every moment up to φ2 pulled; a machine without latches has no clock, only its inputs. */
const SNAPSHOT_PHASES = CLOCK_PHASES.filter((p) => p.phase !== 'phi2-released');

/** Snapshots of every state × input combination × phase (bounded as described above). */
export function driveSnapshots(
  build: Build,
  profile: Pick<Profile, 'stageDelayS'>,
  seed = 1,
  opts: SnapshotOptions = {},
): DriveSnapshotRun {
  const sim = simFor(build, timingOf(profile));
  const f = build.machine;
  const base = inputAssignments(machineInputs(f), seededRandom(seed));
  const maxClocks = opts.maxClocks ?? 1 << 18;
  const sampled = f.states.length * base.list.length > maxClocks;
  const rnd = seededRandom(seed);
  const perState = Math.max(1, Math.floor(maxClocks / f.states.length));
  const lists = f.states.map((_, s) => {
    if (!sampled) return base.list;
    const cubes = f.rows[s].map((r) => r.cube);
    const space = { inputs: f.inputs.length, cubes, never: f.never };
    const rule = { maxExhaustiveInputs: -1, samples: Math.max(0, perState - cubes.length) };
    return inputAssignments(space, rnd, rule).list.slice(0, perState);
  });
  const clocks = lists.reduce((n, l) => n + l.length, 0);
  return {
    inputs: sampled || !base.exhaustive ? 'sampled' : 'exhaustive',
    clocks,
    seed,
    [Symbol.iterator]: () => snapshotsOf(sim, lists),
  };
}

const PHASES_OF = (sim: PartSim): typeof SNAPSHOT_PHASES =>
  sim.build.encoding.bits === 0 ? SNAPSHOT_PHASES.slice(0, 1) : SNAPSHOT_PHASES;

/** The snapshots, state by state, 32 input combinations at a time. */
function* snapshotsOf(sim: PartSim, lists: readonly (readonly string[])[]): Generator<DriveSnapshot<SnapshotPlace>> {
  const f = sim.build.machine;
  const phases = PHASES_OF(sim);
  const batch = new LaneBatch(sim);
  for (let s = 0; s < f.states.length; s++) {
    const state = f.states[s];
    const code = sim.build.encoding.codes[s];
    const list = lists[s];
    for (let first = 0; first < list.length; first += LANES) {
      const n = Math.min(LANES, list.length - first);
      const taken = lanePhases(batch, code, list, first, n, phases);
      for (let lane = 0; lane < n; lane++) {
        const inputs = list[first + lane];
        const slow = (batch.suspect >>> lane) & 1 ? eventDriven(sim, code, inputs, phases) : null;
        for (let p = 0; p < phases.length; p++) {
          const where = { state, code, inputs, phase: phases[p].phase };
          yield slow
            ? { where, outputs: { ids: sim.ids, values: slow[p] } }
            : { where, outputs: { ids: sim.ids, values: taken[p], lane } };
        }
      }
    }
  }
}

/** One batch through the moments of a clock: a copy of the lane words at each moment. */
function lanePhases(
  b: LaneBatch,
  code: string,
  list: readonly string[],
  first: number,
  n: number,
  phases: typeof SNAPSHOT_PHASES,
): Int32Array[] {
  b.clear();
  for (let lane = 0; lane < n; lane++) {
    b.setCodes(lane, code);
    b.setInputs(lane, list[first + lane]);
  }
  b.settleHeld();
  const out: Int32Array[] = [];
  const sim = b.sim;
  for (const p of phases) {
    const a = p.action;
    if (a && a.kind !== 'input')
      b.move(a.lever === 'phi1' ? sim.phi1 : a.lever === 'phi2' ? sim.phi2 : sim.reset, a.kind === 'pull' ? 1 : 0);
    out.push(b.words.slice());
  }
  return out;
}

/** The moments of one clock from a state and inputs, event-driven (three-valued): the values at each. */
function eventDriven(sim: PartSim, code: string, inputs: string, phases: typeof SNAPSHOT_PHASES): Uint8Array[] {
  const zero = '0'.repeat(sim.build.machine.inputs.length);
  const values = stateAtCode(sim, code, zero).values;
  const to = [...inputs].map((x) => (x === '1' ? 1 : 0));
  setLeversInPlace(sim, values, 0, Array.from(sim.inputLevers), to, []);
  const out: Uint8Array[] = [];
  let t = 0;
  for (const p of phases) {
    if (p.action) t = applyInPlace(sim, values, t, p.action, []);
    out.push(values.slice());
  }
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
