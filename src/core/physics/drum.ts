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
 * Precondition: snapshot outputs keyed by driver id (lever or gate). A driver missing from a
 * snapshot is taken as engaged (the safe side) and listed under `assumed`. Each snapshot says
 * where it was taken in a value of the caller's type (`where`; sim/snapshots.ts gives the
 * state, inputs and clock phase), carried through untouched.
 * Postcondition: with no snapshots, the worst case is every capstan engaged at once (`where: null`).
 */
import type { Netlist } from '../model/netlist.js';
import { availableTension, wrapsOf } from './capstan.js';
import { holdWeightG } from './drive.js';
import type { Profile } from './profile.js';

/** One reachable state/phase: where it is (the caller's type), and each driver's output signal. */
export interface DriveSnapshot<W = string> {
  readonly where: W;
  readonly outputs: ReadonlyMap<string, 0 | 1>;
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
  readonly snapshots: readonly SnapshotTorque<W>[];
  /** The worst snapshot (the first of equals); `where` is null when no snapshots were given. */
  readonly worst: { readonly where: W | null; readonly torqueNm: number; readonly powerW: number };
}

/** The worst case in words when no snapshots are given. */
export const ALL_ENGAGED = 'every capstan engaged (no states given)';

/** Torque per snapshot and the worst case, from the capstans engaged in each. */
export function drumLoad<W>(netlist: Netlist, profile: Profile, snapshots: Iterable<DriveSnapshot<W>>): DrumLoad<W> {
  const drivers = new Set(netlist.cords.map((c) => c.driver));
  const capstans = netlist.parts.flatMap((p) => {
    if ((p.kind !== 'lever' && p.kind !== 'gate') || !drivers.has(p.id)) return [];
    const wraps = wrapsOf(p, profile);
    const t = availableTension(profile, holdWeightG(profile, p.kind), wraps);
    return [{ driver: p.id, wraps, torqueNm: t.holdN * (t.gain - 1) * profile.drumRadiusM }];
  });
  const omegaRadS = (2 * Math.PI * profile.drumRpm) / 60;
  const rows: SnapshotTorque<W>[] = [];
  for (const s of snapshots) {
    const engaged: string[] = [];
    const assumed: string[] = [];
    let torqueNm = 0;
    for (const c of capstans) {
      const v = s.outputs.get(c.driver);
      if (v === 1) continue;
      (v === undefined ? assumed : engaged).push(c.driver);
      torqueNm += c.torqueNm;
    }
    rows.push({ where: s.where, engaged, assumed, torqueNm, powerW: torqueNm * omegaRadS });
  }
  let worst: DrumLoad<W>['worst'];
  if (rows.length === 0) {
    const torqueNm = capstans.reduce((t, c) => t + c.torqueNm, 0);
    worst = { where: null, torqueNm, powerW: torqueNm * omegaRadS };
  } else {
    const w = rows.reduce((a, r) => (r.torqueNm > a.torqueNm ? r : a), rows[0]);
    worst = { where: w.where, torqueNm: w.torqueNm, powerW: w.powerW };
  }
  const totalWraps = capstans.reduce((n, c) => n + c.wraps, 0);
  return { capstans, totalWraps, drumLengthM: totalWraps * profile.wrapPitchM, omegaRadS, snapshots: rows, worst };
}
