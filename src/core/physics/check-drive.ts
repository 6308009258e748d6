/**
 * The `drive` check: force budgets of every capstan, drum torque and operator force together.
 *
 * Contract: passes when every driver's margin is at least profile.minMargin (drum torque and
 * operator force are reported, never failed: the motor or the visitor is chosen to suit them).
 * Fields: `name`, `ok`, `summary`, `minMargin` (smallest finite margin, null without loaded
 * drivers), `weakestCord` (heaviest cord of the driver with that margin), `worstTorqueNm`,
 * `worstPowerW`, `operatorForceMaxG` (0 without levers), `drivers` (every budget).
 */
import type { CheckResult } from '../model/build.js';
import type { Netlist } from '../model/netlist.js';
import { driveBudget, type DriverBudget } from './drive.js';
import { drumLoad, type DriveSnapshot } from './drum.js';
import { operatorForces } from './operator.js';
import type { Profile } from './profile.js';

export interface DriveCheck extends CheckResult {
  readonly name: 'drive';
  readonly minMargin: number | null;
  readonly weakestCord: string | null;
  readonly worstTorqueNm: number;
  readonly worstPowerW: number;
  readonly operatorForceMaxG: number;
  readonly drivers: readonly DriverBudget[];
}

/** Force budgets, drum torque over the snapshots, and the hardest lever pull. */
export function checkDrive(netlist: Netlist, profile: Profile, snapshots: Iterable<DriveSnapshot>): DriveCheck {
  const drivers = driveBudget(netlist, profile);
  const drum = drumLoad(netlist, profile, snapshots);
  const operatorForceMaxG = operatorForces(netlist, profile).reduce((m, o) => Math.max(m, o.forceG), 0);
  const loaded = drivers.filter((d) => Number.isFinite(d.margin));
  const weakest = loaded.reduce<DriverBudget | undefined>((w, d) => (!w || d.margin < w.margin ? d : w), undefined);
  const failing = drivers.filter((d) => !d.ok);
  const ok = failing.length === 0;
  const torque = `worst drum torque ${drum.worst.torqueNm.toFixed(3)} N·m (${drum.worst.powerW.toFixed(2)} W) in '${drum.worst.label}'`;
  const pull = `hardest lever pull ${operatorForceMaxG} g`;
  let summary: string;
  if (!ok) {
    // Lead with the weakest failing driver, so the words name the same cord as `weakestCord`.
    const f = failing.reduce((w, d) => (d.margin < w.margin ? d : w));
    const more = failing.length > 1 ? ` (and ${failing.length - 1} more of ${drivers.length} capstans)` : '';
    summary = `over budget, margin below ${profile.minMargin}: ${f.message}${more}; fix: ${(f.fixes ?? []).join('; or ')}`;
  } else if (weakest) {
    summary = `every capstan within budget: smallest margin ${weakest.margin.toFixed(2)} on cord '${weakest.weakestCord}' (≥ ${profile.minMargin}); ${torque}; ${pull}`;
  } else {
    summary = `no capstan carries a load; ${torque}; ${pull}`;
  }
  return {
    name: 'drive',
    ok,
    summary,
    minMargin: weakest ? weakest.margin : null,
    weakestCord: weakest ? weakest.weakestCord : null,
    worstTorqueNm: drum.worst.torqueNm,
    worstPowerW: drum.worst.powerW,
    operatorForceMaxG,
    drivers,
  };
}
