/**
 * Drum torque and power (design §4).
 *
 * Method: the capstan equation (see capstan.ts). An engaged capstan whose load has reached its
 * stop slips on the turning drum with tension T_hold on its tail and at most T_hold·e^(μθ) on
 * its load side, so friction takes torque up to T_hold·(e^(μθ) − 1)·r_drum from the drum — the
 * bound used here for every engaged capstan (a capstan still lifting takes less), with θ of its
 * own turns (an actuator's capstan may have more than the profile's `wraps`). A capstan
 * is engaged when its driver's output signal is 0: its cord pulls (for a lever: the lever is
 * not pulled). Torques add per snapshot (one reachable state in one clock phase); the worst
 * snapshot sizes the motor or the crank. Power = torque × ω, ω = 2π·rpm/60.
 * Precondition: snapshot outputs keyed by driver id (a Map), or given by index over a list of
 * driver ids (`IndexedOutputs`, as a simulator holds them). A driver missing from a snapshot is
 * taken as engaged (the safe side) and listed under `assumed`. Each snapshot says where it was
 * taken in a value of the caller's type (`where`; sim/snapshots.ts gives the state, inputs and
 * clock phase), carried through untouched.
 * The snapshots are read once, in order, and not kept: only the worst one and the worst of
 * each group (the caller's `groupOf`, e.g. the state) are, so the memory does not grow with
 * their number.
 * Postcondition: with no snapshots, the worst case is every capstan engaged at once (`where: null`).
 */
import type { Netlist } from '../model/netlist.js';
import { availableTension, wrapsOf } from './capstan.js';
import { holdWeightG } from './drive.js';
import type { Profile } from './profile.js';

/**
 * Outputs by index: driver `ids[i]` shows `values[i]` (0, 1, or 2 for X), or, when `lane` is
 * given, bit `lane` of `values[i]` (one lane of a bit-parallel simulator).
 */
export interface IndexedOutputs {
  readonly ids: readonly string[];
  readonly values: ArrayLike<number>;
  readonly lane?: number;
}

/** Each driver's output signal in a snapshot: a Map by driver id, or by index. */
export type SnapshotOutputs = ReadonlyMap<string, 0 | 1> | IndexedOutputs;

/** One reachable state/phase: where it is (the caller's type), and each driver's output signal. */
export interface DriveSnapshot<W = string> {
  readonly where: W;
  readonly outputs: SnapshotOutputs;
}

export interface SnapshotTorque<W = string> {
  readonly where: W;
  /** Drivers the snapshot gives as 0: their capstans are engaged. */
  readonly engaged: readonly string[];
  /** Drivers the snapshot did not give, counted as engaged. */
  readonly assumed: readonly string[];
  readonly torqueNm: number;
  readonly powerW: number;
}

export interface DrumLoad<W = string> {
  /** Capstans on the drum: every lever or gate with an output cord, with its turns. */
  readonly capstans: readonly { readonly driver: string; readonly wraps: number; readonly torqueNm: number }[];
  readonly totalWraps: number;
  /** Drum length the wraps take: total wraps × wrap pitch. */
  readonly drumLengthM: number;
  readonly omegaRadS: number;
  /** Snapshots read. */
  readonly snapshotCount: number;
  /** The worst snapshot (the first of equals); `where` is null when no snapshots were given. */
  readonly worst: { readonly where: W | null; readonly torqueNm: number; readonly powerW: number };
  /** The worst snapshot in full (engaged capstans); null without snapshots. */
  readonly worstSnapshot: SnapshotTorque<W> | null;
  /** The worst snapshot of each group (the first of equals), groups in the order they first appear; empty without `groupOf`. */
  readonly worstByGroup: readonly SnapshotTorque<W>[];
}

/** The worst case in words when no snapshots are given. */
export const ALL_ENGAGED = 'every capstan engaged (no states given)';

interface Capstan {
  readonly driver: string;
  readonly wraps: number;
  readonly torqueNm: number;
}

/** Reads a snapshot's outputs for the capstans: the value (0, 1, X = 2; undefined when not given) of capstan k. */
class CapstanReader {
  private ids: readonly string[] | null = null;
  private index = new Int32Array(0);
  /** The torque of each of the 32 lanes of lane words already summed (a batch's words serve 32 snapshots). */
  private readonly laneTorques = new WeakMap<object, Float64Array>();
  /** The capstans grouped by torque (few groups: a lever's and a gate's), for counting engaged ones 32 lanes at a time. */
  private readonly groups: { readonly torqueNm: number; readonly members: Int32Array }[];

  constructor(private readonly capstans: readonly Capstan[]) {
    const byTorque = new Map<number, number[]>();
    capstans.forEach((c, k) => {
      const g = byTorque.get(c.torqueNm);
      if (g) g.push(k);
      else byTorque.set(c.torqueNm, [k]);
    });
    this.groups = [...byTorque].map(([torqueNm, ks]) => ({ torqueNm, members: Int32Array.from(ks) }));
  }

  /**
   * Torque of the engaged capstans of one snapshot: per group of equal torque, the engaged
   * capstans counted, times their torque (the same sum whichever form the outputs come in).
   */
  torque(outputs: SnapshotOutputs): number {
    if (!('ids' in outputs)) {
      let t = 0;
      for (const g of this.groups) {
        let count = 0;
        for (let m = 0; m < g.members.length; m++) if (outputs.get(this.capstans[g.members[m]].driver) !== 1) count++;
        t += count * g.torqueNm;
      }
      return t;
    }
    const index = this.indexFor(outputs.ids);
    const v = outputs.values;
    if (outputs.lane !== undefined) {
      let lanes = this.laneTorques.get(v);
      if (!lanes) this.laneTorques.set(v, (lanes = this.sumLanes(index, v)));
      return lanes[outputs.lane];
    }
    let t = 0;
    for (const g of this.groups) {
      let count = 0;
      for (let m = 0; m < g.members.length; m++) {
        const i = index[g.members[m]];
        if (i < 0 || v[i] !== 1) count++;
      }
      t += count * g.torqueNm;
    }
    return t;
  }

  /**
   * The torque of all 32 lanes of some lane words at once: per torque group, the engaged
   * capstans of every lane counted in a bit-sliced counter (one word per bit of the count).
   */
  private sumLanes(index: Int32Array, v: ArrayLike<number>): Float64Array {
    const laneTorque = new Float64Array(32);
    for (const g of this.groups) {
      const planes: number[] = [];
      for (let m = 0; m < g.members.length; m++) {
        const i = index[g.members[m]];
        let carry = i < 0 ? -1 : ~v[i]; // engaged where the output is 0 (or not given)
        for (let p = 0; carry !== 0; p++) {
          if (p === planes.length) planes.push(0);
          const sum = planes[p] ^ carry;
          carry &= planes[p];
          planes[p] = sum;
        }
      }
      for (let lane = 0; lane < 32; lane++) {
        let count = 0;
        for (let p = 0; p < planes.length; p++) count += ((planes[p] >>> lane) & 1) << p;
        laneTorque[lane] += count * g.torqueNm;
      }
    }
    return laneTorque;
  }

  /** Capstans engaged, and those the snapshot does not give. */
  lists(outputs: SnapshotOutputs): { engaged: string[]; assumed: string[] } {
    const engaged: string[] = [];
    const assumed: string[] = [];
    const capstans = this.capstans;
    if (!('ids' in outputs)) {
      for (const c of capstans) {
        const v = outputs.get(c.driver);
        if (v !== 1) (v === undefined ? assumed : engaged).push(c.driver);
      }
      return { engaged, assumed };
    }
    const index = this.indexFor(outputs.ids);
    const { values, lane } = outputs;
    for (let k = 0; k < capstans.length; k++) {
      const i = index[k];
      const raw = i >= 0 ? values[i] : undefined;
      const v = raw === undefined || lane === undefined ? raw : (raw >>> lane) & 1;
      if (v !== 1) (v === undefined ? assumed : engaged).push(capstans[k].driver);
    }
    return { engaged, assumed };
  }

  private indexFor(ids: readonly string[]): Int32Array {
    if (ids !== this.ids) {
      const at = new Map(ids.map((id, i) => [id, i]));
      this.index = Int32Array.from(this.capstans, (c) => at.get(c.driver) ?? -1);
      this.ids = ids;
    }
    return this.index;
  }
}

/** Torque per snapshot, streamed, and the worst cases (overall and per group), from the capstans engaged in each. */
export function drumLoad<W>(
  netlist: Netlist,
  profile: Profile,
  snapshots: Iterable<DriveSnapshot<W>>,
  groupOf?: (where: W) => string,
): DrumLoad<W> {
  const drivers = new Set(netlist.cords.map((c) => c.driver));
  const capstans = netlist.parts.flatMap((p) => {
    if ((p.kind !== 'lever' && p.kind !== 'gate') || !drivers.has(p.id)) return [];
    const wraps = wrapsOf(p, profile);
    const t = availableTension(profile, holdWeightG(profile, p.kind), wraps);
    return [{ driver: p.id, wraps, torqueNm: t.holdN * (t.gain - 1) * profile.drumRadiusM }];
  });
  const omegaRadS = (2 * Math.PI * profile.drumRpm) / 60;
  const reader = new CapstanReader(capstans);
  const row = (s: DriveSnapshot<W>, torqueNm: number): SnapshotTorque<W> => ({
    where: s.where,
    ...reader.lists(s.outputs),
    torqueNm,
    powerW: torqueNm * omegaRadS,
  });
  let count = 0;
  let worstRow: SnapshotTorque<W> | null = null;
  const byGroup = new Map<string, SnapshotTorque<W>>();
  for (const s of snapshots) {
    count++;
    const torqueNm = reader.torque(s.outputs);
    if (!worstRow || torqueNm > worstRow.torqueNm) worstRow = row(s, torqueNm);
    if (groupOf) {
      const g = groupOf(s.where);
      const w = byGroup.get(g);
      if (!w || torqueNm > w.torqueNm) byGroup.set(g, row(s, torqueNm));
    }
  }
  let worst: DrumLoad<W>['worst'];
  if (!worstRow) {
    const torqueNm = capstans.reduce((t, c) => t + c.torqueNm, 0);
    worst = { where: null, torqueNm, powerW: torqueNm * omegaRadS };
  } else worst = { where: worstRow.where, torqueNm: worstRow.torqueNm, powerW: worstRow.powerW };
  const totalWraps = capstans.reduce((n, c) => n + c.wraps, 0);
  return {
    capstans,
    totalWraps,
    drumLengthM: totalWraps * profile.wrapPitchM,
    omegaRadS,
    snapshotCount: count,
    worst,
    worstSnapshot: worstRow,
    worstByGroup: [...byGroup.values()],
  };
}
