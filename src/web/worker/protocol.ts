/**
 * Messages between the page and the synthesis workers. Everything crossing is plain data
 * (structured clone), and as little as the page needs. The worker that checks is handed the
 * build the page was sent (its netlist and placement, `BuiltForChecks`) rather than build the
 * machine again from the text: for a large machine a second build costs the checker a second
 * or more, the copy a few tens of milliseconds of the page's thread.
 *
 * A page revision (`rev`) travels with every job and every answer: the page drops answers for
 * a revision it has moved past, and the worker skips stages of a job a newer one replaced.
 */
import {
  BUILD_DEFAULTS,
  type AutoReport,
  type BomRow,
  type Build,
  type CheckResult,
  type Diagnostic,
  type EncodeResult,
  type EncodeStrategy,
  type Encoding,
  type GuardReport,
  type LookColumn,
  type Narrowed,
  type StepSight,
  type Machine,
  type MachineForm,
  type OperatorForce,
  type PartCounts,
  type Pin,
  type Placement,
  type Profile,
  type RuleViolation,
  type TimingResult,
} from '../../core/index.js';
import type { DiagramLayout } from '../diagram/layout.js';

/**
 * Codes chosen in the code book: a named strategy, or exact codes kept from a comparison. Kept
 * codes belong to the machine they were priced for: `states` are its states in the order the
 * codes are given (the minimised machine's), and the build drops them when they differ.
 */
export type EncodingChoice =
  { readonly strategy: EncodeStrategy } | { readonly kept: Encoding; readonly states: readonly string[] };

/** How the page asks for a build. */
export interface BuildSettings {
  readonly encoding: EncodingChoice;
  readonly seed: number;
  /**
   * 'dont-care' or the name of the state unused codes go to; absent: the pipeline's own choice
   * (don't-care unless the build could lock up, then the start state), as the command line.
   */
  readonly unusedCodes?: string;
  /** The workshop's own technology profile (a profile file as `--profile` takes it); absent: the shipped defaults. */
  readonly profile?: ProfileSetting;
  /**
   * Parts the workshop keeps in a bay, by part id, in the order they were kept (`--pin PART=BAY@DRUM`
   * as the command line takes them); absent: every part placed freely. They move the placement
   * only: the encoding search's setup does not depend on them.
   */
  readonly pins?: Readonly<Record<string, Pin>>;
}

/**
 * A technology profile file as the page holds it: its name (the `--profile` file, and the
 * profile's `about.file` as the command line gives it) and its JSON value, which the core's
 * `loadProfile` reads over the defaults exactly as it reads the file for the command line.
 */
export interface ProfileSetting {
  readonly name: string;
  readonly value: Readonly<Record<string, unknown>>;
}

/** The settings a page starts with: the command line's defaults (BUILD_DEFAULTS), so both build the same machine. */
export const DEFAULT_SETTINGS: BuildSettings = {
  encoding: { strategy: BUILD_DEFAULTS.encoding },
  seed: BUILD_DEFAULTS.seed,
};

/**
 * The outcome of an encoding search kept by the page, under the key of the setup it searched
 * (`searchSetupKey`): the search is deterministic for a setup, so an equal setup takes the
 * outcome instead of searching again.
 */
export interface RememberedSearch {
  readonly key: string;
  readonly outcome: EncodeResult;
}

/**
 * Where a build's codes came from: a named strategy or kept codes ('named'); the search run
 * for this build ('searched'); a search of an equal setup the page remembered ('remembered');
 * stand-ins while the search runs ('stand-in': a draft build, replaced when the search ends).
 */
export type CodesFrom = 'named' | 'searched' | 'remembered' | 'stand-in';

/** What a draft build stands in with: the codes of the build shown before (same states), or counting order. */
export type StandIn = 'previous' | 'binary';

/** A setting the build could not use for this machine, dropped, with why in words. */
export interface DroppedSetting {
  readonly setting: 'encoding' | 'unused';
  readonly words: string;
}

/** A machine as read: diagnostics always; the rest when it parsed and validated. */
export interface Reading {
  readonly ok: boolean;
  readonly form: MachineForm;
  readonly diagnostics: readonly Diagnostic[];
  /** The machine's name, whenever it parsed (also when it did not validate). */
  readonly name?: string;
  readonly machine?: Machine;
  /** Original state → the reduced state standing for it. */
  readonly merged?: Readonly<Record<string, string>>;
  readonly reduced?: readonly string[];
  readonly unreachable?: readonly string[];
  readonly method?: string;
  readonly layout?: DiagramLayout;
}

/** A build, as the page shows it. */
export interface BuildView {
  readonly build: Build;
  readonly profile: Profile;
  /** Where every part sits in the frame and how every cord runs (bays, drums, routes, cut lengths). */
  readonly placement: Placement;
  readonly equations: readonly { readonly name: string; readonly expr: string }[];
  readonly guard: GuardReport;
  readonly bom: readonly BomRow[];
  readonly forces: readonly OperatorForce[];
  readonly search?: AutoReport;
  readonly diagnostics: readonly Diagnostic[];
  /** Settings dropped because they were made for another machine (the page forgets them). */
  readonly dropped?: readonly DroppedSetting[];
  readonly codesFrom: CodesFrom;
  /** A draft's stand-in codes (codesFrom 'stand-in' only). */
  readonly standIn?: StandIn;
}

/** The part of a build view the checker checks: the builder's build as the page received it. */
export type BuiltForChecks = Pick<BuildView, 'build' | 'placement' | 'profile' | 'diagnostics'>;

/** One capstan's force margin, named for people: the kind of part and what it does, in words. */
export interface MarginBar {
  readonly driver: string;
  readonly kind: string;
  readonly does: string;
  readonly margin: number;
  readonly ok: boolean;
}

/** The worst drum torque of one state over its inputs and phases. */
export interface TorqueBar {
  readonly state: string;
  readonly torqueNm: number;
  /** Where the worst case is: inputs and phase, in words. */
  readonly at: string;
}

/** What an output shown by an actuator lifts, and the most it could lift at the design margin. */
export interface OutputLoadRow {
  readonly output: string;
  readonly loadG: number;
  readonly maxLoadG: number;
  readonly margin: number;
}

/** Check results and the figures the parts view draws. */
export interface ChecksView {
  readonly checks: readonly CheckResult[];
  readonly margins: readonly MarginBar[];
  readonly minMargin: number;
  /** μ of the profile, and the lowest μ at which every capstan still holds / keeps the design margin (null: no loads). */
  readonly mu: number;
  readonly muMin: number | null;
  readonly muAtMinMargin: number | null;
  /** Outputs shown by an actuator, in output order. */
  readonly outputLoads: readonly OutputLoadRow[];
  readonly torque: readonly TorqueBar[];
  readonly powerW: number;
  readonly timing?: TimingResult;
  readonly rules: readonly RuleViolation[];
}

/** One encoding of the comparison. */
export interface CodeRow {
  readonly strategy: EncodeStrategy;
  readonly ok: boolean;
  readonly encoding?: Encoding;
  /** The states the codes are for, in order (the minimised machine's). */
  readonly states: readonly string[];
  readonly parts?: PartCounts;
  /** Gates computing set/reset product terms. */
  readonly termGates?: number;
  readonly guard?: GuardReport;
  readonly cost?: number;
  readonly cheapest: boolean;
  readonly problem?: string;
}

/** A document for download: text, or bytes (the archive of every document). */
export type ExportFile =
  | { readonly name: string; readonly mime: string; readonly text: string }
  | { readonly name: string; readonly mime: string; readonly bytes: Uint8Array };

/** Ask `export` for this to get the build sheet made ready to print (with its drawings). */
export const PRINT_SHEET = 'print';
/** Ask `export` for this to get every document in one zip archive. */
export const ALL_DOCUMENTS = 'all';

export type ToWorker =
  | { readonly kind: 'read'; readonly rev: number; readonly text: string; readonly file: string }
  | {
      readonly kind: 'build';
      readonly rev: number;
      readonly text: string;
      readonly file: string;
      readonly settings: BuildSettings;
      /** Search outcomes the page keeps (a build whose setup has one of their keys does not search). */
      readonly known?: readonly RememberedSearch[];
      /** The codes of the build the page shows, for a draft while this build searches. */
      readonly previous?: { readonly encoding: Encoding; readonly states: readonly string[] };
    }
  | {
      readonly kind: 'check';
      readonly rev: number;
      readonly text: string;
      readonly file: string;
      /** The settings with the build's codes kept (the key of the checks, jobs.ts `checkKey`). */
      readonly settings: BuildSettings;
      /** The build to check: the builder's, for this revision. */
      readonly made: BuiltForChecks;
    }
  | {
      readonly kind: 'compare';
      readonly rev: number;
      readonly text: string;
      readonly file: string;
      readonly settings: BuildSettings;
    }
  | { readonly kind: 'draw'; readonly rev: number }
  | { readonly kind: 'export'; readonly rev: number; readonly doc: string }
  /** The shakedown walk of the checked build: steps 1 … reached ticked, with the values seen differ; `sheet` asks for the sheet too. */
  | {
      readonly kind: 'walk';
      readonly rev: number;
      readonly ask: number;
      readonly reached: number;
      readonly sights: readonly StepSight[];
      readonly sheet: boolean;
    };

export type FromWorker =
  | { readonly kind: 'reading'; readonly rev: number; readonly reading: Reading }
  | { readonly kind: 'built'; readonly rev: number; readonly view: BuildView; readonly searched?: RememberedSearch }
  /** A build with stand-in codes, shown while the search for this revision's codes runs; its final build follows. */
  | { readonly kind: 'draft'; readonly rev: number; readonly view: BuildView }
  | { readonly kind: 'unbuilt'; readonly rev: number; readonly diagnostics: readonly Diagnostic[] }
  | { readonly kind: 'checked'; readonly rev: number; readonly view: ChecksView }
  | { readonly kind: 'schematic'; readonly rev: number; readonly svg?: string; readonly problem?: string }
  | {
      readonly kind: 'progress';
      readonly rev: number;
      readonly done: number;
      readonly total: number | null;
      readonly best: number;
      readonly stage: string;
    }
  | { readonly kind: 'compared'; readonly rev: number; readonly rows: readonly CodeRow[] }
  | {
      readonly kind: 'exported';
      readonly rev: number;
      readonly doc: string;
      readonly file?: ExportFile;
      readonly problem?: string;
    }
  | {
      readonly kind: 'walked';
      readonly rev: number;
      readonly ask: number;
      readonly walk?: WalkView;
      readonly problem?: string;
    }
  | { readonly kind: 'fault'; readonly rev: number; readonly message: string };

/** One row of the commissioning sheet as the shakedown shows it. */
export interface WalkRow {
  readonly step: number;
  readonly clock: number;
  readonly action: string;
  /** Per column (WalkSheet.columns), the position the sheet gives, in words. */
  readonly expected: readonly string[];
  /** Per column, the value the sheet gives (0, 1, or 2: undetermined, the sheet's '?'). */
  readonly values: readonly number[];
}

/** The commissioning sheet of a checked build, for the shakedown. */
export interface WalkSheet {
  /** The machine's name and a digest of the sheet and the netlist: the walk kept in storage is for this one only. */
  readonly machine: string;
  readonly print: string;
  readonly columns: readonly LookColumn[];
  readonly rows: readonly WalkRow[];
  /** How much of the sheet's faults were walked (a seeded sample for a large build), in words. */
  readonly coverage: string;
}

/** The answer to a walk: the sheet when asked for, and what the walk so far says. */
export interface WalkView {
  readonly sheet?: WalkSheet;
  readonly narrowed: Narrowed;
}
