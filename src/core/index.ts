/**
 * Latchwright's public entry: everything a program needs to read a machine, analyse it, build
 * it, prove it, step it and print its workshop documents. The package's `exports` point at
 * this file's build output (dist/core/index.js); the CLI, the designer and the benchmarks
 * import the core only from here or from an area's barrel (src/core/<area>/index.ts).
 *
 *   const a = analyse(text, 'bell.lw');           // parse → validate → minimise states
 *   if (a.ok) {
 *     const b = buildMachine(a, { encoding: 'binary' });   // encode → synthesise → check
 *     if (b.ok) writeSomewhere(buildDocuments(b));          // file name → text
 *   }
 *
 * This file sits above every layer of the core (model ← forms, physics ← phases ← sim ←
 * checks ← pipeline ← export, report); it only re-exports. Every name here is public API:
 * DEVELOPERS.md ("Public API") lists them by purpose.
 */

// ── The machine model, diagnostics and the seeded generator ─────────────────────────────────
export type { Expr, Guard, Machine, OutBit, SourceLoc, State, Transition, Unspecified } from './model/machine.js';
export type { FlatMachine, FlatRow } from './model/flat.js';
export type { Build, CheckBase, Encoding, Equation, GuardReport, PartCounts, SignalMap } from './model/build.js';
export { summaryIn } from './model/build.js';
export type {
  ActuatorPart,
  Cord,
  FlagPart,
  GatePart,
  GateRole,
  LatchPart,
  LeverPart,
  LeverRole,
  Netlist,
  Part,
  PortRef,
  PortSpec,
} from './model/netlist.js';
export {
  DIAGNOSTIC_CODES,
  DiagnosticError,
  diag,
  didYouMean,
  ECHO_MAX,
  formatDiagnostic,
  formatLocation,
  hasErrors,
  printable,
  printableDiagnostic,
  shorten,
  type Diagnostic,
  type DiagnosticCode,
  type Severity,
} from './model/diagnostics.js';
export { seededRandom, type Random } from './model/random.js';
export { isJsonObject, nameRecord, nameRecordOf, ownValue } from './model/records.js';
export { counted } from './model/words.js';
export {
  cutFeetInches,
  DOCUMENT_UNITS,
  documentUnitsGuess,
  feetInches,
  fixed,
  GRAMS_PER_OUNCE,
  GRAMS_PER_POUND,
  inMetres,
  massWords,
  METRES_PER_INCH,
  NEWTON_METRES_PER_POUND_FORCE_INCH,
  NEWTONS_PER_POUND_FORCE,
  parseFeetInches,
  quantitiesFor,
  sixteenthsUp,
  sizeInches,
  wordsIn,
  type DocumentUnits,
  type Quantities,
  type Words,
} from './model/units.js';

// ── Parse and print: the text form, the JSON form, xstate configs ───────────────────────────
export { detectForm, readMachine, readMachineValue, type MachineForm, type ReadResult } from './forms/detect.js';
export { parseTextMachine, printTextMachine } from './forms/text.js';
export {
  machineFromJson,
  machineToJson,
  parseJsonMachine,
  type JsonMachine,
  type JsonState,
  type JsonTransition,
  type MachineResult,
} from './forms/json.js';
export { clockEvent, exportXstate, importXstate, type XstateExport, type XstateExportOptions } from './forms/xstate.js';
export { printCubes, printExpr } from './forms/expr.js';
export { locateJsonPaths, readJsonText, withoutBom, type JsonRead } from './forms/json-file.js';

// ── Behaviours: machines written from a sentence and a few parameters ────────────────────────
export {
  BEHAVIOURS,
  BEHAVIOUR_WRITERS,
  behaviourNamed,
  writeBehaviour,
  type BehaviourEntry,
  type BehaviourName,
  type Field,
  type FieldKind,
  type FieldValues,
  type Written,
} from './behaviours/index.js';

// ── Analyse, build, compare: the pipeline ───────────────────────────────────────────────────
export {
  analyse,
  BUILD_DEFAULTS,
  buildMachine,
  buildSearchSetup,
  planBuildSearch,
  compareEncodings,
  runChecks,
  type AnalyseOptions,
  type Analysed,
  type BuildOptions,
  type Built,
  type EncodingRow,
  type PhaseHook,
  type Rejected,
} from './pipeline.js';
export type { StateMinimisation } from './phases/minimise-states/index.js';
export {
  planSearch,
  searchOutcome,
  searchSetupKey,
  searchTaskRunner,
  type SearchExtras,
  type SearchSetup,
} from './search.js';

// ── The frame: where every part sits and how every cord runs ────────────────────────────────
export {
  auditPlacement,
  EXACT_LIMIT,
  place,
  type AuditFinding,
  type Pin,
  type PlaceOptions,
  type PlacedBayInfo,
  type PlacedDrum,
  type Placement,
  type PlacementProblem,
} from './phases/place/index.js';
export {
  leavingLoss,
  lossByBranch,
  route,
  type BranchRoute,
  type CordRoute,
  type CordRun,
  type FrameLayout,
  type PlacedBay,
  type RoutePoint,
  type Routing,
} from './physics/routing.js';

// ── Encodings (the encodings registry) ──────────────────────────────────────────────────────
export {
  DEFAULT_ENCODING,
  DEFAULT_SEARCH,
  encode,
  encodingEntry,
  ENCODING_REGISTRY,
  ENCODING_RUNS,
  ENCODINGS,
  type AutoReport,
  type EncodeOptions,
  type EncodeResult,
  type EncodeStrategy,
  type EncodingEntry,
  type EncodingRun,
  type Progress,
  SKETCH_SEARCH,
  type AutoSearch,
  type SearchTask,
  type TaskResult,
} from './phases/encode/index.js';

// ── The checks ──────────────────────────────────────────────────────────────────────────────
export {
  checkEquivalence,
  type Counterexample,
  type EquivalenceOptions,
  type EquivalenceResult,
} from './checks/equivalence.js';
export {
  checkForbiddenInput,
  type ForbiddenCounterexample,
  type ForbiddenInputOptions,
  type ForbiddenInputResult,
  type RuleViolation,
} from './checks/forbidden-input.js';
export { checkRecovery, type RecoveryOptions, type RecoveryResult } from './checks/recovery.js';
export { checkTiming, type MonteCarloReport, type TimingOptions, type TimingResult } from './checks/timing.js';
export { checkDrive, type DriveCheck } from './physics/check-drive.js';
export { checkLayout, type LayoutFinding, type LayoutResult } from './checks/layout.js';
export {
  driveSnapshots,
  momentWords,
  placeWords,
  type DriveSnapshotRun,
  type SnapshotOptions,
  type SnapshotPlace,
} from './sim/snapshots.js';
export {
  CHECK_NAMES,
  CHECKS,
  findCheck,
  type CheckEntry,
  type CheckName,
  type CheckResult,
  type CheckResultOf,
  type DriveResult,
  type SpecInfo,
} from './checks/registry.js';

// ── Simulate: the pure part step, the runner, the hand procedure, scripts ───────────────────
export { createRunner, type ClockRecord, type PartRunner, type RunnerOptions } from './sim/runner.js';
export { MEMO_BYTES, type MemoStats } from './sim/memo.js';
export {
  isAlarm,
  powerUp,
  readPart,
  simFor,
  stepPart,
  stepSim,
  timingOf,
  type PartEvent,
  type PartEventKind,
  type PartReading,
  type PartSim,
  type PartState,
  type PartTiming,
  type StepOptions,
  type Trit,
} from './sim/part.js';
export {
  assignmentOf,
  clockActions,
  describeAction,
  OPERATING_RULES,
  phaseActions,
  resetActions,
  RULE_WORDS,
  valuesOf,
  type ControlLever,
  type HandAction,
  type InputValues,
  type OperatingRule,
} from './sim/hand.js';
export {
  runAbstractScript,
  runPartScript,
  validateSequence,
  type SeqArray,
  type ShownValue,
  type StepRow,
} from './sim/script.js';
export { runAbstract, stepAbstract, type AbstractClock, type AbstractStepResult } from './sim/abstract.js';
export { flatToJsonText, randomFlatMachine } from './sim/random-machine.js';

// ── The technology profile and the physics of the drive ─────────────────────────────────────
export {
  DEFAULT_PROFILE,
  type CostWeights,
  type Profile,
  type ProfileAbout,
  type RoutingLoss,
} from './physics/profile.js';
export { cordRoutingDiagnostics, loadProfile, profileChanges, type ProfileChange } from './physics/profile-load.js';
export { availableTension, capstanGain, muNeeded, type Tension } from './physics/capstan.js';
export { frictionHeadroom, headroomWords, type Headroom, type OutputLoad } from './physics/headroom.js';
export { sizeActuators } from './physics/actuators.js';
export { withoutCapstan, withoutCapstanWords } from './phases/map/index.js';
export { branchKey, driveBudget, type BranchLoad, type BranchLosses, type DriverBudget } from './physics/drive.js';
export {
  drumLoad,
  type DriveSnapshot,
  type DrumLoad,
  type IndexedOutputs,
  type SnapshotOutputs,
  type SnapshotTorque,
} from './physics/drum.js';
export { operatorForces, type OperatorForce } from './physics/operator.js';
export { billOfMaterials, type BomRow, type FrameFigures } from './physics/bom.js';

// ── Documents (the documents registry) and the report ───────────────────────────────────────
export {
  bomCsv,
  bomRowIn,
  camsSvg,
  cutListCsv,
  cutListRows,
  frameScale,
  frameSvg,
  isoSheetFor,
  type IsoSheet,
  partWords,
  buildDocuments,
  buildSheet,
  buildSheetHtml,
  buildSheetMd,
  CAUTIONS,
  commissioningTour,
  cordFinder,
  cordFinderCsv,
  cordsFor,
  coverageWords,
  CordNarrowing,
  expectedAt,
  faultShort,
  lookColumns,
  narrowedText,
  NONE_WORDS,
  positionWords,
  valueOfWords,
  valuesAt,
  type AheadOutcome,
  type AheadRow,
  type LookColumn,
  type Narrowed,
  type StepSight,
  type SuspectCord,
  coverageBlock,
  coverageLine,
  sheetFaults,
  sightWords,
  diagramSvg,
  documentByFile,
  documentSources,
  documentsOf,
  DOCUMENT_FILES,
  DOCUMENT_MAKERS,
  DOCUMENT_REGISTRY,
  netlistJson,
  partRoles,
  schematicSvg,
  verilogFiles,
  wiringCsv,
  wiringRows,
  type CordFinder,
  type FinderEntry,
  type SheetFaults,
  type DocumentEntry,
  type DocumentFile,
  type DocumentName,
  type DocumentsInput,
  type DocumentSources,
  type CutRow,
  type Drawings,
  type PartRole,
  type SchematicOptions,
  type TourClock,
  type VerilogFiles,
  type WiringRow,
} from './export/index.js';
export { buildReport, equationTexts, layoutBlock, machineBlock, type CommissioningCoverage } from './report.js';
