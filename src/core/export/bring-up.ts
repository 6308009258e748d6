/**
 * The staged bring-up of a build: the stages (bring-up-stages.ts: what to mount and tie, in
 * what order) with each one's check found on the partial machine (bring-up-search.ts). This
 * module only puts the two together, so neither needs the other's caller.
 */
import type { Build } from '../model/build.js';
import type { Profile } from '../physics/profile.js';
import { searchStages, type StageChecks } from './bring-up-search.js';
import { mountStages, type MountStage } from './bring-up-stages.js';

export {
  branchesOf,
  branchId,
  GATES_PER_STAGE,
  mountStages,
  type Branch,
  type MountStage,
  type StageKind,
} from './bring-up-stages.js';

/** A stage with its check. */
export type BringUpStage = MountStage & StageChecks;

/** The staged bring-up of a build. */
export interface BringUpPlan {
  readonly stages: readonly BringUpStage[];
}

/** The staged bring-up of a build: the stages, and each one's check found on the partial machine. */
export function bringUpPlan(build: Build, profile: Pick<Profile, 'stageDelayS'>): BringUpPlan {
  const stages = mountStages(build.netlist);
  const checks = searchStages(build, profile, stages);
  return { stages: stages.map((s, i) => ({ ...s, ...checks[i] })) };
}
