/**
 * The commissioning sheet as a printable page (landscape): how to use it, the safety
 * cautions, where every lever is (by bay: "bay 7, drum 1"), the sequence table with a tick
 * box per hand action and the expected position of every latch lever and output after it,
 * then, when the fault simulation is given, the clocks appended to catch the cords the tour
 * does not show and the section on finding a broken cord (cord-finder.ts), and the frame
 * drawing, state diagram and schematic, each on a page of its own. Content from
 * commissioning.ts; rendered by the shared Doc renderer (every name escaped there).
 */
import type { Build } from '../model/build.js';
import { counted } from '../model/words.js';
import type { Placement } from '../phases/place/index.js';
import { renderDocHtml } from './build-sheet-html.js';
import { renderDocMd } from './build-sheet-md.js';
import { CAUTIONS, drawingFigures, type Drawings } from './build-sheet.js';
import { bayWords, showsWords, type CommissioningRow } from './commissioning.js';
import { coverageWords, finderSection, type CordFinder } from './cord-finder.js';
import { p, table, type Block, type Doc, type Section } from './doc.js';
import { partWords } from './part-words.js';
import type { SheetFaults } from './sheet-faults.js';
import { reachableTransitions, type TourClock } from './tour.js';
import type { DocumentUnits } from '../model/units.js';

/** What the sequence covers, in words. */
function coverage(taken: number, reachable: number): string {
  return taken >= reachable
    ? `The sequence takes every one of the ${reachable} reachable transitions of the state table at least once, so it visits every reachable state.`
    : `The sequence takes ${taken} of the ${reachable} reachable transitions of the state table (it was cut short).`;
}

/** Every bay and the levers in it, and where each flag rides. */
function whereSection(build: Build, placement: Placement, units: DocumentUnits): Section {
  const words = partWords(build, units);
  const where = bayWords(placement);
  const blocks: Block[] = [
    p(
      'Bays are counted from 1 at the visitor end of each drum (the frame drawing numbers them). Each bay holds its levers side by side on the pivot rail, left to right as listed.',
    ),
    table(
      ['where', 'part', 'what it does', 'levers, left to right'],
      placement.bays.map((b) => [
        `bay ${b.bay}, drum ${b.drum}`,
        b.part,
        words.get(b.part) ?? '',
        b.levers
          .map((l) =>
            l.name === 'lever'
              ? 'hand lever'
              : l.name === 'exit'
                ? 'exit pulley'
                : b.levers.length === 1
                  ? `${l.name} (its Z)`
                  : l.name,
          )
          .join(', '),
      ]),
      { tick: true, mono: [1] },
    ),
  ];
  const flags = build.netlist.parts.flatMap((q) => (q.kind === 'flag' && q.fixed === undefined ? [q] : []));
  if (flags.length > 0)
    blocks.push(
      table(
        ['flag', 'shows', 'rides on'],
        flags.map((q) => [q.id, q.output, `the Z lever of ${q.gate} (${where(q.gate)})`]),
        { mono: [0] },
      ),
    );
  return { id: 'levers', title: 'Where the levers are', blocks };
}

function drawingsSection(drawings: Drawings): Section {
  const f = drawingFigures(drawings);
  return { id: 'drawings', title: 'Drawings', blocks: [f.frame, f.stateDiagram, f.schematic] };
}

/** The fault simulation of the sheet and its dictionary, for the sheet's section on finding a broken cord. */
export interface SheetFaultWords {
  readonly sheet: SheetFaults;
  readonly finder: CordFinder;
}

/** The sequence table, split where the clocks appended to catch the remaining cords begin. */
function sequenceSections(
  headers: readonly string[],
  body: readonly (readonly string[])[],
  rows: readonly CommissioningRow[],
  tour: readonly TourClock[],
  mono: readonly number[],
): Section[] {
  const first = tour.findIndex((c) => c.extra === true);
  const split = first < 0 ? rows.length : rows.findIndex((r) => r.clock > first);
  const at = split < 0 ? rows.length : split;
  const sections: Section[] = [
    { id: 'sequence', title: 'Sequence', blocks: [table(headers, body.slice(0, at), { tick: true, mono })] },
  ];
  if (at < rows.length)
    sections.push({
      id: 'catching',
      title: 'Clocks that catch the remaining cords',
      blocks: [
        p(
          `The tour above leaves some broken cords unshown. Go on with these ${counted(tour.length - first, 'clock')} (the steps go on counting): each run of them shows at least one of those cords, at the row the section on finding the cord gives.`,
        ),
        table(headers, body.slice(at), { tick: true, mono }),
      ],
    });
  return sections;
}

/** The commissioning sheet as a Doc; `placement` names every lever by its bay, `drawings` adds the drawings, `faults` the section on finding a broken cord, `units` the workshop's units of an actuator's load. */
export function commissioningDoc(
  build: Build,
  rows: readonly CommissioningRow[],
  tour: readonly TourClock[],
  placement?: Placement,
  drawings?: Drawings,
  faults?: SheetFaultWords,
  units: DocumentUnits = 'metric',
): Doc {
  const f = build.machine;
  const [first] = rows;
  const [latches, outputs] = [first?.latches ?? [], first?.outputs ?? []];
  const latchBays = new Map(
    placement?.latches.map((l) => [l.latch, ` (bays ${l.bays[0]} and ${l.bays[1]}, drum ${l.drum})`]),
  );
  const headers = [
    'step',
    'clock',
    'do this',
    ...latches.map((l) => `${l.id}${latchBays.get(l.id) ?? ''}: set Z · reset Z`),
    ...outputs.map((o) => `${o.output} (${o.kind})`),
    'state after',
    'note',
  ];
  const body = rows.map((r) => [
    String(r.step),
    r.clock === 0 ? '—' : String(r.clock),
    r.action,
    ...r.latches.map((l) => `${l.setZ} · ${l.resetZ}`),
    ...r.outputs.map((o) => showsWords(o.kind, o.shows)),
    r.code === '' ? r.state : `${r.state} (${r.code})`,
    r.note,
  ]);
  const resets = tour.filter((c) => c.reset).length;
  const taken = new Set(tour.map((c) => `${c.state}:${c.row}`)).size;
  const seq = build.encoding.bits > 0;
  return {
    title: `Commissioning sheet — ${f.name}`,
    subtitle: `${tour.length} clocks${resets > 0 ? ` with ${resets} extra ${resets === 1 ? 'reset' : 'resets'}` : ''}; ${rows.length} hand actions`,
    landscape: true,
    sections: [
      {
        id: 'use',
        title: 'How to use this sheet',
        blocks: [
          p(
            seq
              ? 'Work down the table. Do exactly what a row says, wait for the levers to come to rest, then compare every lever and flag with the row and tick it. The first row that differs points at the part to look at: a latch lever in the wrong position points at that latch and the cords into its ports.'
              : 'Set the input levers as each row says, wait for the levers to come to rest, and compare the flags with the row.',
          ),
          ...(seq
            ? [
                p(
                  'A latch has two gates, each with a summing lever Z. A gate whose output is 1 has its Z lever down, so a latch holding 1 has its set-side Z down and its reset-side Z up (written "down · up"); holding 0, "up · down". "?" means the latch is undetermined (before the first reset).',
                ),
              ]
            : []),
          p('A flag "up (1)" shows 1. An actuator "lifted (1)" is pulling its load.'),
          p(coverage(taken, reachableTransitions(f).length)),
          ...(faults ? [p(coverageWords(faults.sheet))] : []),
        ],
      },
      {
        id: 'safety',
        title: 'Safety',
        blocks: [{ kind: 'note', tone: 'caution', title: 'Cautions', items: CAUTIONS }],
      },
      ...(placement ? [whereSection(build, placement, units)] : []),
      ...sequenceSections(
        headers,
        body,
        rows,
        tour,
        latches.map((_, i) => 3 + i),
      ),
      ...(faults ? [finderSection(faults.finder, faults.sheet)] : []),
      ...(drawings ? [drawingsSection(drawings)] : []),
    ],
  };
}

/** The commissioning sheet as a printable, self-contained HTML page. */
export function commissioningHtml(
  build: Build,
  rows: readonly CommissioningRow[],
  tour: readonly TourClock[],
  placement?: Placement,
  drawings?: Drawings,
  faults?: SheetFaultWords,
  units: DocumentUnits = 'metric',
): string {
  return renderDocHtml(commissioningDoc(build, rows, tour, placement, drawings, faults, units));
}

/** The commissioning sheet in Markdown (the same content; drawings linked to their files). */
export function commissioningMd(
  build: Build,
  rows: readonly CommissioningRow[],
  tour: readonly TourClock[],
  placement?: Placement,
  drawings?: Drawings,
  faults?: SheetFaultWords,
  units: DocumentUnits = 'metric',
): string {
  return renderDocMd(commissioningDoc(build, rows, tour, placement, drawings, faults, units));
}
