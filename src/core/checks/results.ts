/**
 * Every check's result type, as one union told apart by `name`, and the typed lookup. Types
 * only, plus `findCheck`: a shell or a document that reads results imports this module, not
 * the checks themselves (registry.ts lists and runs them).
 */
import type { DriveCheck } from '../physics/check-drive.js';
import type { SnapshotPlace } from '../sim/snapshots.js';
import type { EquivalenceResult } from './equivalence.js';
import type { ForbiddenInputCheck } from './forbidden-input.js';
import type { LayoutResult } from './layout.js';
import type { NextStateResult } from './logic.js';
import type { RecoveryResult } from './recovery.js';
import type { TimingResult } from './timing.js';

/**
 * The drive check's result, its places being those of the drive snapshots (state, code, inputs,
 * clock phase), and which input combinations the drum torque was taken over.
 */
export type DriveResult = DriveCheck<SnapshotPlace> & {
  /** Start points (state × input combination) simulated for the drum torque, and whether they were all of them or a seeded sample. */
  readonly torqueOver: { readonly clocks: number; readonly inputs: 'exhaustive' | 'sampled'; readonly seed: number };
};

/** Every check's result: a union told apart by `name`. */
export type CheckResult =
  | ForbiddenInputCheck
  | NextStateResult
  | EquivalenceResult
  | RecoveryResult
  | TimingResult
  | DriveResult
  | LayoutResult;

export type { LayoutResult } from './layout.js';

export type CheckName = CheckResult['name'];

/** The result type of the check named N. */
export type CheckResultOf<N extends CheckName> = Extract<CheckResult, { readonly name: N }>;

/** The result of the check named `name`, with that check's own type; undefined when it was not run. */
export function findCheck<N extends CheckName>(checks: readonly CheckResult[], name: N): CheckResultOf<N> | undefined {
  return checks.find((c): c is CheckResultOf<N> => c.name === name);
}
