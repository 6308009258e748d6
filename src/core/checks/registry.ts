/**
 * The checks: the one list of them, in the order reports show them, with a label for people,
 * what each reads from the build and its spec, what it produces, and how to run it.
 * `runChecks` (pipeline.ts) runs them in this order with one seed for all; the shells and the
 * docs read names and labels here.
 *
 * Each check's result has its own type, told apart by `name`: `CheckResult` (results.ts) is
 * their union, and `findCheck(checks, 'drive')` gives the drive check's own type without a
 * cast. A module that only reads results imports results.ts, which pulls in no check code.
 *
 * Adding a check: write its module (a pure function to a result type extending
 * `CheckBase<'its-name'>`, model/build.ts), add that type to `CheckResult` in results.ts and
 * one entry to `CHECKS` below.
 */
import type { Build } from '../model/build.js';
import type { Placement } from '../phases/place/index.js';
import { checkDrive } from '../physics/check-drive.js';
import type { Profile } from '../physics/profile.js';
import { driveSnapshots, placeWords } from '../sim/snapshots.js';
import { routedBudgets } from './budgets.js';
import { checkEquivalence } from './equivalence.js';
import { forbiddenInputCheck } from './forbidden-input.js';
import { checkLayout } from './layout.js';
import { checkNextStateEquivalence } from './logic.js';
import { checkRecovery } from './recovery.js';
import type { CheckName, CheckResultOf } from './results.js';
import type { SpecInfo } from './spec.js';
import { checkTiming } from './timing.js';

export type { SpecInfo } from './spec.js';
export {
  findCheck,
  type CheckName,
  type CheckResult,
  type CheckResultOf,
  type DriveResult,
  type LayoutResult,
} from './results.js';

/** Everything a check may read. */
export interface CheckInput {
  /** The build to check. */
  readonly build: Build;
  /** The machine as written, and how its states merged, as analysed. */
  readonly spec: SpecInfo;
  readonly profile: Profile;
  /** The seed of every random choice a check makes (sampled inputs and codes, Monte Carlo delays). */
  readonly seed: number;
  /** Where every part sits in the frame and how every cord runs (phases/place). */
  readonly placement: Placement;
}

/** One thing a check reads: a field of `CheckInput`. */
export type CheckNeed = keyof CheckInput;

/** One check as the shells see it. */
export interface CheckEntryOf<N extends CheckName> {
  readonly name: N;
  /** What the check shows, in a few words for people (a heading). */
  readonly label: string;
  /** A word or two, for narrow places (a table column, a badge). */
  readonly shortLabel: string;
  /** What it reads from `CheckInput` (its `run` sees only these). */
  readonly needs: readonly CheckNeed[];
  /** What its result carries besides `ok` and `summary`, in words. */
  readonly produces: string;
  readonly run: (input: CheckInput) => CheckResultOf<N>;
}

/** Any check's entry. */
export type CheckEntry = { [N in CheckName]: CheckEntryOf<N> }[CheckName];

/** An entry whose `run` is typed to read only what `needs` lists. */
function entry<N extends CheckName, K extends CheckNeed>(e: {
  readonly name: N;
  readonly label: string;
  readonly shortLabel: string;
  readonly needs: readonly K[];
  readonly produces: string;
  readonly run: (input: Pick<CheckInput, K>) => CheckResultOf<N>;
}): CheckEntryOf<N> {
  return e;
}

/** Every check, in the order reports show them. */
export const CHECKS = [
  entry({
    name: 'forbidden-input',
    label: 'No forbidden latch input',
    shortLabel: 'forbidden input',
    needs: ['build', 'profile', 'seed'],
    produces:
      'the logic-level proof, the start points simulated, what breaking each operating rule upsets, a counterexample',
    run: ({ build, profile, seed }) => forbiddenInputCheck(build, profile, { seed }),
  }),
  entry({
    name: 'next-state-equivalence',
    label: 'Equations match the table',
    shortLabel: 'next state',
    needs: ['build'],
    produces: 'the state and input cubes checked, a counterexample',
    run: ({ build }) => checkNextStateEquivalence(build),
  }),
  entry({
    name: 'equivalence',
    label: 'Build behaves as written',
    shortLabel: 'equivalence',
    needs: ['build', 'spec', 'profile', 'seed'],
    produces:
      'pairs (state as written, build state) and steps explored, exhaustive or sampled, a hand-action counterexample',
    run: ({ build, spec, profile, seed }) => checkEquivalence(build, spec, profile, { seed }),
  }),
  entry({
    name: 'recovery',
    label: 'Recovers from unused codes',
    shortLabel: 'recovery',
    needs: ['build', 'profile', 'seed'],
    produces: 'clocks to recover per unused code, the worst, a lock-up loop',
    run: ({ build, profile, seed }) => checkRecovery(build, profile, { seed }),
  }),
  entry({
    name: 'timing',
    label: 'Timing and clock rate',
    shortLabel: 'timing',
    needs: ['build', 'profile', 'seed'],
    produces: 'phase times and chains, clock and crank rate, cam windows, the Monte Carlo report',
    run: ({ build, profile, seed }) => checkTiming(build, profile, { seed }),
  }),
  entry({
    name: 'drive',
    label: 'Force budgets',
    shortLabel: 'drive',
    needs: ['build', 'profile', 'seed', 'placement'],
    produces:
      'margins per driver with each branch’s routed loss, the worst drum torque and power overall and per state (over every or a sampled set of inputs), the hardest lever pull',
    run: ({ build, profile, seed, placement }) => {
      const snapshots = driveSnapshots(build, profile, seed);
      // The budgets with the routed losses, made once for this check and the layout check.
      const drivers = routedBudgets(build.netlist, profile, placement.routing);
      const r = checkDrive(build.netlist, profile, snapshots, placeWords, undefined, drivers);
      const torqueOver = { clocks: snapshots.clocks, inputs: snapshots.inputs, seed };
      if (snapshots.inputs === 'exhaustive') return { ...r, torqueOver };
      const summary = `${r.summary}; drum torque over ${snapshots.clocks} sampled start points (state × inputs, seed ${seed}), not every one`;
      return { ...r, summary, torqueOver };
    },
  }),
  entry({
    name: 'layout',
    label: 'Frame layout',
    shortLabel: 'layout',
    needs: ['build', 'profile', 'placement'],
    produces:
      'drums and bays, the cord to cut against the netlist order, every rule the layout breaks with what to change, the smallest margin with the routed cords',
    run: ({ build, profile, placement }) => checkLayout(build.netlist, placement, profile),
  }),
] as const satisfies readonly CheckEntry[];

// Every result type of the union has its entry (a compile-time check).
const _everyCheckListed: Exclude<CheckName, (typeof CHECKS)[number]['name']> extends never ? true : never = true;

/** Every check's name, in order. */
export const CHECK_NAMES: readonly CheckName[] = CHECKS.map((c) => c.name);
