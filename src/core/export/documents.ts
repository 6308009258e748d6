/**
 * The documents registry: every build document, once, with everything a shell needs — a
 * stable name, the file name, a label for a button, the media type, the words and format the
 * docs list (docs/build-documents.md is generated from them) — and, beside it, how to make
 * each one. `latchwright build --out`, the designer's export buttons and the docs all read
 * this file, so adding a document is one exporter module plus one entry in DOCUMENT_REGISTRY
 * and one line in DOCUMENT_MAKERS (the compiler asks for it).
 *
 * The entries are plain data and the makers a separate table so that the designer's page,
 * which shows a button per document but never makes one, does not bundle the exporters (its
 * worker does).
 *
 * Order: the order the documents are listed and written in.
 * Postcondition: the same input gives byte-identical documents; the pieces several documents
 * share (the placement, the drawings, the commissioning sequence, its simulated rows, the
 * Verilog pair, the fault simulation of the commissioning sheet) are made once per input, when
 * first asked for.
 */
import { findCheck } from '../checks/results.js';
import { checkTiming } from '../checks/timing.js';
import { place, type Placement } from '../phases/place/index.js';
import { billOfMaterials } from '../physics/bom.js';
import { bomCsv } from './bom-csv.js';
import { buildSheetHtml, renderDocHtml } from './build-sheet-html.js';
import { buildSheetMd, renderDocMd } from './build-sheet-md.js';
import { bringUpDoc } from './bring-up-doc.js';
import { bringUpPlan } from './bring-up.js';
import type { DocumentsInput, Drawings } from './build-sheet.js';
import { camsSvg } from './cams-svg.js';
import { commissioningCsv, commissioningRows, type CommissioningRow } from './commissioning.js';
import { commissioningHtml, commissioningMd } from './commissioning-html.js';
import { cordFinder, cordFinderCsv, type CordFinder } from './cord-finder.js';
import { cutListCsv, cutListRows } from './cut-list.js';
import { diagramSvg } from './diagram-svg.js';
import type { Doc } from './doc.js';
import { frameSvg } from './frame-svg.js';
import { netlistJson } from './netlist-json.js';
import { schematicSvg } from './schematic-svg.js';
import { sheetFaults, type SheetFaults } from './sheet-faults.js';
import { commissioningTour, type TourClock } from './tour.js';
import { verilogFiles, type VerilogFiles } from './verilog.js';
import { wiringCsv, wiringRows } from './wiring.js';

/** What a document is made from: the input, and the pieces several documents share (each made once). */
export interface DocumentSources {
  readonly input: DocumentsInput;
  /** Where every part sits and how every cord runs: the input's, or the build placed with the profile. */
  placement(): Placement;
  /** The frame drawing, the state diagram and the schematic (SVG texts), which the sheets embed. */
  drawings(): Drawings;
  /**
   * The commissioning input sequence: the one given, or the transition tour of the built
   * machine followed by the clocks that catch the cords it does not show (`faults().extra`).
   * The sheet, its CSV and Markdown and the Verilog testbench all step this one sequence.
   */
  tour(): readonly TourClock[];
  /** The fault simulation of the commissioning sheet: coverage, and the clocks appended to the sequence. */
  faults(): SheetFaults;
  /** The dictionary of broken cords by the first row that shows each. */
  finder(): CordFinder;
  /** The commissioning rows: the part-level simulator run through `tour()`. */
  steps(): readonly CommissioningRow[];
  /** The structural Verilog module and its testbench. */
  verilog(): VerilogFiles;
  /** The bring-up in stages, as one document for both its files. */
  bringUp(): Doc;
}

/** One entry of the documents registry (plain data; its maker is DOCUMENT_MAKERS[name]). */
export interface DocumentEntry {
  /** Stable identifier (kebab-case). */
  readonly name: string;
  /** File name in the build folder (and the suffix of a download's name). */
  readonly file: string;
  /** Button text in the designer. */
  readonly label: string;
  /** Media type of a download. */
  readonly mime: string;
  /** What it is, in a few words (the docs table). */
  readonly summary: string;
  /** Its format, with the standard it follows (the docs table). */
  readonly format: string;
}

/** Every build document, in the order they are listed and written. */
export const DOCUMENT_REGISTRY = [
  {
    name: 'build-sheet-html',
    file: 'build-sheet.html',
    label: 'Build sheet (HTML, printable)',
    mime: 'text/html',
    summary: 'the build sheet, printable',
    format: 'HTML, self-contained',
  },
  {
    name: 'build-sheet-md',
    file: 'build-sheet.md',
    label: 'Build sheet (Markdown)',
    mime: 'text/markdown',
    summary: 'the same sheet',
    format: 'Markdown (CommonMark with pipe tables)',
  },
  {
    name: 'wiring',
    file: 'wiring.csv',
    label: 'Wiring list (CSV)',
    mime: 'text/csv',
    summary: 'one row per cord branch, in tying order',
    format: 'CSV (RFC 4180)',
  },
  {
    name: 'bom',
    file: 'bom.csv',
    label: 'Bill of materials (CSV)',
    mime: 'text/csv',
    summary: 'bill of materials',
    format: 'CSV (RFC 4180)',
  },
  {
    name: 'cut-list',
    file: 'cut-list.csv',
    label: 'Cut list (CSV)',
    mime: 'text/csv',
    summary: 'every cord piece cut to length, lever blanks, drums, pulleys, weights and cam discs',
    format: 'CSV (RFC 4180)',
  },
  {
    name: 'bring-up-html',
    file: 'bring-up.html',
    label: 'Bring-up in stages (HTML, printable)',
    mime: 'text/html',
    summary: 'the order to mount the parts and tie the cords, stage by stage, with a check after each',
    format: 'HTML, self-contained',
  },
  {
    name: 'bring-up-md',
    file: 'bring-up.md',
    label: 'Bring-up in stages (Markdown)',
    mime: 'text/markdown',
    summary: 'the same stages',
    format: 'Markdown (CommonMark with pipe tables)',
  },
  {
    name: 'netlist',
    file: 'netlist.json',
    label: 'Netlist (JSON)',
    mime: 'application/json',
    summary: 'every part and cord, with its bay and position and each branch’s length',
    format: 'JSON, described by `schemas/netlist.schema.json`',
  },
  {
    name: 'frame',
    file: 'frame.svg',
    label: 'Frame drawing (SVG)',
    mime: 'image/svg+xml',
    summary: 'front elevation to scale: drums, bays and what each does, cord runs, pulleys, dimensions',
    format: 'SVG, sized in millimetres at a stated scale',
  },
  {
    name: 'cams',
    file: 'cams.svg',
    label: 'Cam templates (SVG, 1:1)',
    mime: 'image/svg+xml',
    summary: 'the φ1 and φ2 cam discs to cut, full size, with a check bar (100 mm, or 4 in)',
    format: 'SVG, sized in millimetres at 1:1',
  },
  {
    name: 'schematic',
    file: 'schematic.svg',
    label: 'Schematic (SVG)',
    mime: 'image/svg+xml',
    summary: 'the parts and cords, left to right through one clock',
    format: 'SVG',
  },
  {
    name: 'state-diagram',
    file: 'state-diagram.svg',
    label: 'State diagram (SVG)',
    mime: 'image/svg+xml',
    summary: 'states, codes and transitions',
    format: 'SVG',
  },
  {
    name: 'commissioning-html',
    file: 'commissioning.html',
    label: 'Commissioning sheet (HTML)',
    mime: 'text/html',
    summary: 'what to do at the bench, step by step, with expected lever positions',
    format: 'HTML, self-contained',
  },
  {
    name: 'commissioning-md',
    file: 'commissioning.md',
    label: 'Commissioning sheet (Markdown)',
    mime: 'text/markdown',
    summary: 'the same sheet',
    format: 'Markdown (CommonMark with pipe tables)',
  },
  {
    name: 'commissioning-csv',
    file: 'commissioning.csv',
    label: 'Commissioning sheet (CSV)',
    mime: 'text/csv',
    summary: 'the same sequence',
    format: 'CSV (RFC 4180)',
  },
  {
    name: 'cord-finder',
    file: 'cord-finder.csv',
    label: 'Finding a broken cord (CSV)',
    mime: 'text/csv',
    summary: 'by the first row of the commissioning sheet that differs and what is seen there, the cords to look at',
    format: 'CSV (RFC 4180)',
  },
  {
    name: 'verilog',
    file: 'machine.v',
    label: 'Verilog module',
    mime: 'text/plain',
    summary: 'structural Verilog of the build',
    format: 'Verilog (IEEE 1364-2005)',
  },
  {
    name: 'verilog-testbench',
    file: 'machine_tb.v',
    label: 'Verilog testbench',
    mime: 'text/plain',
    summary: 'a self-checking testbench for it',
    format: 'Verilog (IEEE 1364-2005)',
  },
] as const satisfies readonly DocumentEntry[];

export type DocumentName = (typeof DOCUMENT_REGISTRY)[number]['name'];
export type DocumentFile = (typeof DOCUMENT_REGISTRY)[number]['file'];

/** What the commissioning sheet is made from, in the order both its writers (HTML, Markdown) take it. */
const commissioningFrom = (d: DocumentSources): Parameters<typeof commissioningHtml> => [
  d.input.build,
  d.steps(),
  d.tour(),
  d.placement(),
  d.drawings(),
  { sheet: d.faults(), finder: d.finder() },
  d.input.profile.documentUnits,
];

/** How each registered document is made, by name. */
export const DOCUMENT_MAKERS: { readonly [N in DocumentName]: (sources: DocumentSources) => string } = {
  'build-sheet-html': (d) => buildSheetHtml({ ...d.input, placement: d.placement() }, d.drawings()),
  'build-sheet-md': (d) => buildSheetMd({ ...d.input, placement: d.placement() }, d.drawings()),
  wiring: (d) =>
    wiringCsv(wiringRows(d.input.build.netlist, d.input.profile, d.placement()), d.input.profile.documentUnits),
  bom: (d) =>
    bomCsv(billOfMaterials(d.input.build.netlist, d.input.profile, d.placement()), d.input.profile.documentUnits),
  'cut-list': (d) =>
    cutListCsv(cutListRows(d.input.build, d.placement(), d.input.profile), d.input.profile.documentUnits),
  'bring-up-html': (d) => renderDocHtml(d.bringUp()),
  'bring-up-md': (d) => renderDocMd(d.bringUp()),
  netlist: (d) => netlistJson(d.input.build, { placement: d.placement(), profile: d.input.profile }),
  frame: (d) => d.drawings().frame,
  cams: (d) =>
    camsSvg(
      d.input.build.machine.name,
      d.input.build.encoding.bits === 0
        ? undefined
        : (findCheck(d.input.checks, 'timing') ?? checkTiming(d.input.build, d.input.profile, { runs: 0 })),
      d.input.profile,
    ),
  schematic: (d) => d.drawings().schematic,
  'state-diagram': (d) => d.drawings().stateDiagram,
  'commissioning-html': (d) => commissioningHtml(...commissioningFrom(d)),
  'commissioning-md': (d) => commissioningMd(...commissioningFrom(d)),
  'commissioning-csv': (d) => commissioningCsv(d.steps()),
  'cord-finder': (d) => cordFinderCsv(d.finder()),
  verilog: (d) => d.verilog().module,
  'verilog-testbench': (d) => d.verilog().testbench,
};

/** The file names, in the order they are listed. */
export const DOCUMENT_FILES: readonly DocumentFile[] = DOCUMENT_REGISTRY.map((d) => d.file);

/** The registry entry for a file name, if there is one. */
export function documentByFile(file: string): (typeof DOCUMENT_REGISTRY)[number] | undefined {
  return DOCUMENT_REGISTRY.find((d) => d.file === file);
}

/** The sources of every document of one input; shared pieces are made on first use and kept. */
export function documentSources(input: DocumentsInput): DocumentSources {
  const once = <T>(make: () => T): (() => T) => {
    let kept: { value: T } | undefined;
    return () => (kept ??= { value: make() }).value;
  };
  const placement = once(() => input.placement ?? place(input.build.netlist, input.profile));
  const drawings = once(() => ({
    frame: frameSvg(input.build, placement(), input.profile),
    stateDiagram: diagramSvg(input.build),
    schematic: schematicSvg(input.build, undefined, { units: input.profile.documentUnits }),
  }));
  const given = once(() => input.tour ?? commissioningTour(input.build.machine));
  // A sequence the caller gives is stepped as given; the tour gets the clocks that catch the rest.
  const faults = once(() => sheetFaults(input.build, input.profile, given(), { extend: input.tour === undefined }));
  const tour = once(() => [...given(), ...faults().extra]);
  const steps = once(() => commissioningRows(input.build, input.profile, tour(), placement()));
  const finder = once(() => cordFinder(input.build, steps(), faults(), placement()));
  const verilog = once(() => verilogFiles(input.build, input.profile, tour()));
  const bringUp = once(() =>
    bringUpDoc({
      build: input.build,
      plan: bringUpPlan(input.build, input.profile),
      placement: placement(),
      profile: input.profile,
      wiring: wiringRows(input.build.netlist, input.profile, placement()),
    }),
  );
  return { input, placement, drawings, tour, faults, finder, steps, verilog, bringUp };
}

/** Every build document: file name → content, in registry order. */
export function buildDocuments(input: DocumentsInput): Map<DocumentFile, string> {
  return documentsOf(documentSources(input));
}

/** Every build document from sources already made (a shell that reads them for more than the documents). */
export function documentsOf(sources: DocumentSources): Map<DocumentFile, string> {
  return new Map(DOCUMENT_REGISTRY.map((d) => [d.file, DOCUMENT_MAKERS[d.name](sources)]));
}
