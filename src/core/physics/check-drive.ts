/**
 * The `drive` check: force budgets of every capstan, drum torque and operator force together.
 *
 * Contract: passes when every driver's margin is at least profile.minMargin (drum torque and
 * operator force are reported, never failed: the motor or the visitor is chosen to suit them).
 * Fields: `name`, `ok`, `summary`, `minMargin` (smallest finite margin, null without loaded
 * drivers), `weakestCord` (heaviest cord of the driver with that margin), `worstTorqueNm`,
 * `worstPowerW`, `worstAt` (where the worst torque is, null without snapshots),
 * `worstByState` (the worst torque of each state), `operatorForceMaxG` (0 without levers),
 * `drivers` (every budget), and the friction headroom (headroom.ts): `muMin` (the lowest μ at
 * which every capstan still holds), `muAtMinMargin` (the lowest μ at which every capstan keeps
 * the design margin), both null without loaded drivers, and `outputs` (per actuator output:
 * its load, the largest load it could lift at the design margin, its capstan's margin). The
 * snapshots are read once, in order, and not kept (drum.ts streams them): only these
 * worst-case figures are, so any number of snapshots fits in memory.
 * `losses`: each branch's routing loss from the routed frame (physics/routing.ts
 * `lossByBranch`); a branch it does not name takes its cord's profile routing. `drivers`: the
 * budgets, when the caller has them already (`driveBudget`'s result; `losses` is then not read).
 */
import type { CheckBase } from '../model/build.js';
import type { Netlist } from '../model/netlist.js';
import { budgetWords, driveBudget, type BranchLosses, type DriverBudget } from './drive.js';
import { ALL_ENGAGED, drumLoad, type DriveSnapshot } from './drum.js';
import { frictionHeadroom, headroomWords, outputLoadWords, type OutputLoad } from './headroom.js';
import { operatorForces } from './operator.js';
import type { Profile } from './profile.js';
import { joinWords, massFigure, say, torqueFigure, wordsIn, type Words } from '../model/units.js';

/** What the drive check needs to know of where a snapshot was taken: at least the state. */
export interface StatePlace {
  readonly state: string;
}

/** A drum torque and power, and where they occur. */
export interface TorqueCase<W> {
  readonly where: W;
  readonly torqueNm: number;
  readonly powerW: number;
}

export interface DriveCheck<W extends StatePlace = StatePlace> extends CheckBase<'drive'> {
  readonly minMargin: number | null;
  readonly weakestCord: string | null;
  readonly worstTorqueNm: number;
  readonly worstPowerW: number;
  /** Where the worst drum torque is (the first of equals); null without snapshots: every capstan engaged. */
  readonly worstAt: W | null;
  /** The worst drum torque of each state (the first of equals), states in the order the snapshots give them. */
  readonly worstByState: readonly TorqueCase<W>[];
  readonly operatorForceMaxG: number;
  readonly drivers: readonly DriverBudget[];
  /** The lowest μ of cord on drum at which every capstan still holds (margin ≥ 1); null without loads. */
  readonly muMin: number | null;
  /** The lowest μ at which every capstan keeps the design margin (profile.minMargin); null without loads. */
  readonly muAtMinMargin: number | null;
  /** Per output shown by an actuator: its load, the largest it could lift at the design margin, and the margin. */
  readonly outputs: Readonly<Record<string, OutputLoad>>;
}

/**
 * Force budgets, drum torque over the snapshots, and the hardest lever pull. `words` puts a
 * snapshot's place in words for the summary (default: its state).
 */
export function checkDrive<W extends StatePlace>(
  netlist: Netlist,
  profile: Profile,
  snapshots: Iterable<DriveSnapshot<W>>,
  words: (where: W) => string = (w) => w.state,
  losses?: BranchLosses,
  drivers: readonly DriverBudget[] = driveBudget(netlist, profile, losses),
): DriveCheck<W> {
  const drum = drumLoad(netlist, profile, snapshots, (w) => w.state);
  const operatorForceMaxG = operatorForces(netlist, profile).reduce((m, o) => Math.max(m, o.forceG), 0);
  const loaded = drivers.filter((d) => Number.isFinite(d.margin));
  const weakest = loaded.reduce<DriverBudget | undefined>((w, d) => (!w || d.margin < w.margin ? d : w), undefined);
  const failing = drivers.filter((d) => !d.ok);
  const ok = failing.length === 0;
  const headroom = frictionHeadroom(netlist, drivers, profile);
  const friction = joinWords(
    [[`friction headroom: ${headroomWords(headroom, profile)}`], ...outputLoadWords(headroom, profile)],
    '; ',
  );
  const at = drum.worst.where === null ? ALL_ENGAGED : words(drum.worst.where);
  // Typed figures (model/units.ts): `summary` is these in metric, `says` for the workshop's units.
  const torque = say`worst drum torque ${torqueFigure(drum.worst.torqueNm)} (${drum.worst.powerW.toFixed(2)} W) in '${at}'`;
  const pull = say`hardest lever pull ${massFigure(operatorForceMaxG)}`;
  let says: Words;
  if (!ok) {
    // Lead with the weakest failing driver, so the words name the same cord as `weakestCord`.
    const f = failing.reduce((w, d) => (d.margin < w.margin ? d : w));
    const more = failing.length > 1 ? ` (and ${failing.length - 1} more of ${drivers.length} capstans)` : '';
    const w = budgetWords(f, profile);
    says = say`over budget, margin below ${profile.minMargin}: ${w.message}${more}; fix: ${joinWords(w.fixes, '; or ')}; ${friction}`;
  } else if (weakest) {
    says = say`every capstan within budget: smallest margin ${weakest.margin.toFixed(2)} on cord '${weakest.weakestCord}' (≥ ${profile.minMargin}); ${friction}; ${torque}; ${pull}`;
  } else {
    says = say`no capstan carries a load; ${torque}; ${pull}`;
  }
  const summary = wordsIn(says, 'metric');
  return {
    name: 'drive',
    ok,
    summary,
    says,
    minMargin: weakest ? weakest.margin : null,
    weakestCord: weakest ? weakest.weakestCord : null,
    worstTorqueNm: drum.worst.torqueNm,
    worstPowerW: drum.worst.powerW,
    worstAt: drum.worst.where,
    worstByState: drum.worstByGroup.map((r) => ({ where: r.where, torqueNm: r.torqueNm, powerW: r.powerW })),
    operatorForceMaxG,
    drivers,
    muMin: headroom.muMin,
    muAtMinMargin: headroom.muAtMinMargin,
    outputs: headroom.outputs,
  };
}
