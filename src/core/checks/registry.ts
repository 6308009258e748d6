/**
 * The checks: the one list of them, in the order reports show them, with a label for people,
 * what each reads from the build and its spec, what it produces, and how to run it.
 * `runChecks` (pipeline.ts) runs them in this order with one seed for all; the shells and the
 * docs read names and labels here.
 *
 * Each check's result has its own type, told apart by `name`: `CheckResult` is their union,
 * and `findCheck(checks, 'drive')` gives the drive check's own type without a cast.
 *
 * Adding a check: write its module (a pure function to a result type extending
 * `CheckBase<'its-name'>`, model/build.ts), add that type to `CheckResult` and one entry to
 * `CHECKS` below.
 */
import type { Build } from '../model/build.js';
import { checkDrive, type DriveCheck } from '../physics/check-drive.js';
import type { Profile } from '../physics/profile.js';
import { driveSnapshots, placeWords, type SnapshotPlace } from '../sim/snapshots.js';
import { checkEquivalence, type EquivalenceResult } from './equivalence.js';
import { forbiddenInputCheck, type ForbiddenInputCheck } from './forbidden-input.js';
import { checkNextStateEquivalence, type NextStateResult } from './logic.js';
import { checkRecovery, type RecoveryResult } from './recovery.js';
import type { SpecInfo } from './spec.js';
import { checkTiming, type TimingResult } from './timing.js';

export type { SpecInfo } from './spec.js';

/** Everything a check may read. */
export interface CheckInput {
  /** The build to check. */
  readonly build: Build;
  /** The machine as written, and how its states merged, as analysed. */
  readonly spec: SpecInfo;
  readonly profile: Profile;
  /** The seed of every random choice a check makes (sampled inputs and codes, Monte Carlo delays). */
  readonly seed: number;
}

/** One thing a check reads: a field of `CheckInput`. */
export type CheckNeed = keyof CheckInput;

/** The drive check's result, its places being those of the drive snapshots (state, code, inputs, clock phase). */
export type DriveResult = DriveCheck<SnapshotPlace>;

/** Every check's result: a union told apart by `name`. */
export type CheckResult =
  ForbiddenInputCheck | NextStateResult | EquivalenceResult | RecoveryResult | TimingResult | DriveResult;

export type CheckName = CheckResult['name'];

/** The result type of the check named N. */
export type CheckResultOf<N extends CheckName> = Extract<CheckResult, { readonly name: N }>;

/** One check as the shells see it. */
export interface CheckEntryOf<N extends CheckName> {
  readonly name: N;
  /** A line for people: what the check shows. */
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
    label: 'No latch sees both its ports pulled at once (S̄ = R̄ = 0), in the equations and in the parts',
    shortLabel: 'forbidden input',
    needs: ['build', 'profile', 'seed'],
    produces:
      'the logic-level proof, the start points simulated, what breaking each operating rule upsets, a counterexample',
    run: ({ build, profile, seed }) => forbiddenInputCheck(build, profile, { seed }),
  }),
  entry({
    name: 'next-state-equivalence',
    label: 'The equations give the specified next state and outputs in every state',
    shortLabel: 'next state',
    needs: ['build'],
    produces: 'the state and input cubes checked, a counterexample',
    run: ({ build }) => checkNextStateEquivalence(build),
  }),
  entry({
    name: 'equivalence',
    label: 'The built machine behaves as the machine as written, part by part',
    shortLabel: 'equivalence',
    needs: ['build', 'spec', 'profile', 'seed'],
    produces: 'product states and pairs explored, exhaustive or sampled, a hand-action counterexample',
    run: ({ build, spec, profile, seed }) => checkEquivalence(build, spec, profile, { seed }),
  }),
  entry({
    name: 'recovery',
    label: 'Every unused code comes back to a used one within a few clocks',
    shortLabel: 'recovery',
    needs: ['build', 'profile', 'seed'],
    produces: 'clocks to recover per unused code, the worst, a lock-up loop',
    run: ({ build, profile, seed }) => checkRecovery(build, profile, { seed }),
  }),
  entry({
    name: 'timing',
    label: 'Clock-phase times, the fastest safe rate and the cam angles, with a Monte Carlo run',
    shortLabel: 'timing',
    needs: ['build', 'profile', 'seed'],
    produces: 'phase times and chains, clock and crank rate, cam windows, the Monte Carlo report',
    run: ({ build, profile, seed }) => checkTiming(build, profile, { seed }),
  }),
  entry({
    name: 'drive',
    label: 'Every capstan within its force budget; drum torque and the hardest lever pull',
    shortLabel: 'drive',
    needs: ['build', 'profile', 'seed'],
    produces: 'margins per driver, the worst drum torque and power overall and per state, the hardest lever pull',
    run: ({ build, profile, seed }) =>
      checkDrive(build.netlist, profile, driveSnapshots(build, profile, seed), placeWords),
  }),
] as const satisfies readonly CheckEntry[];

// Every result type of the union has its entry (a compile-time check).
const _everyCheckListed: Exclude<CheckName, (typeof CHECKS)[number]['name']> extends never ? true : never = true;

/** Every check's name, in order. */
export const CHECK_NAMES: readonly CheckName[] = CHECKS.map((c) => c.name);

/** The result of the check named `name`, with that check's own type; undefined when it was not run. */
export function findCheck<N extends CheckName>(checks: readonly CheckResult[], name: N): CheckResultOf<N> | undefined {
  return checks.find((c): c is CheckResultOf<N> => c.name === name);
}
