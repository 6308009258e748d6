/**
 * The export layer's barrel. The build documents: everything `latchwright build --out DIR`
 * writes, as file name → text, listed once in the documents registry (documents.ts). Pure
 * functions of the build, its checks and the technology profile; the CLI writes the files
 * (src/cli/write-out.ts). docs/build-documents.md describes each one.
 *
 * Preconditions: a Build from the pipeline (netlist invariants of model/netlist.ts hold) and
 * the checks it ran (any missing check is reported as not run, never guessed).
 * Postconditions: the same input gives byte-identical files; every user-given name is
 * escaped for each format (escape.ts, csv.ts, JSON.stringify).
 */
export type { DocumentsInput, Drawings } from './build-sheet.js';
export { camsSvg, camSpecs, RAMP_MAX_DEG } from './cams-svg.js';
export { cutListCsv, cutListRows, cutMetres, type CutRow } from './cut-list.js';
export { frameScale, frameSvg, isoSheetFor, type IsoSheet } from './frame-svg.js';
export { partWords } from './part-words.js';
export {
  bringUpPlan,
  branchesOf,
  GATES_PER_STAGE,
  mountStages,
  type Branch,
  type BringUpPlan,
  type BringUpStage,
  type MountStage,
} from './bring-up.js';
export {
  PLAN_WORK,
  SEARCH_ACTIONS,
  SEARCH_POSITIONS,
  type GateCheck,
  type SearchReach,
  type Sighting,
  type Trial,
  type ZPosition,
} from './bring-up-search.js';
export { BRING_UP_CAUTIONS, bringUpDoc, bringUpHtml, bringUpMd } from './bring-up-doc.js';
export {
  buildDocuments,
  documentByFile,
  documentSources,
  documentsOf,
  DOCUMENT_FILES,
  DOCUMENT_MAKERS,
  DOCUMENT_REGISTRY,
  type DocumentEntry,
  type DocumentFile,
  type DocumentName,
  type DocumentSources,
} from './documents.js';
export { CAUTIONS, buildSheet } from './build-sheet.js';
export { bomCsv, bomRowIn } from './bom-csv.js';
export { buildSheetHtml, renderDocHtml } from './build-sheet-html.js';
export { buildSheetMd, renderDocMd } from './build-sheet-md.js';
export { commissioningCsv, commissioningRows, type CommissioningRow } from './commissioning.js';
export { commissioningHtml, commissioningMd } from './commissioning-html.js';
export {
  cordFinder,
  cordFinderCsv,
  cordsFor,
  coverageWords,
  sightWords,
  type CordFinder,
  type FinderEntry,
  type Sight,
} from './cord-finder.js';
export {
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
} from './cord-narrowing.js';
export {
  coverageBlock,
  coverageLine,
  coverageOf,
  sheetFaults,
  FAULT_WORK,
  type FaultVerdict,
  type SheetFaults,
} from './sheet-faults.js';
export { csvField, recordsToCsv, toCsv, type CsvCell } from './csv.js';
export { diagramLayout, diagramSvg } from './diagram-svg.js';
export { netlistDocument, netlistJson, NETLIST_FORMAT, NETLIST_VERSION } from './netlist-json.js';
export { partRoles, type PartRole } from './roles.js';
export { schematicLayout, schematicSvg, type SchematicLayout, type SchematicOptions } from './schematic-svg.js';
export { commissioningTour, reachableTransitions, type TourClock, type TourOptions } from './tour.js';
export { verilogFiles, type VerilogFiles } from './verilog.js';
export { wiringCsv, wiringRows, type WiringRow } from './wiring.js';
export { layOut, layoutGraph, type LaidGraph, type LayoutGraph } from './dagre.js';
