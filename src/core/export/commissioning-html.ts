/**
 * The commissioning sheet as a printable page (landscape): how to use it, the safety
 * cautions, and the sequence table with a tick box per hand action and the expected position
 * of every latch lever and output after it. Content from commissioning.ts; rendered by the
 * shared Doc renderer (every name escaped there).
 */
import type { Build } from '../model/build.js';
import { renderDocHtml } from './build-sheet-html.js';
import { CAUTIONS } from './build-sheet.js';
import { showsWords, type CommissioningRow } from './commissioning.js';
import { p, table, type Doc } from './doc.js';
import { reachableTransitions, type TourClock } from './tour.js';

/** What the sequence covers, in words. */
function coverage(taken: number, reachable: number): string {
  return taken >= reachable
    ? `The sequence takes every one of the ${reachable} reachable transitions of the state table at least once, so it visits every reachable state.`
    : `The sequence takes ${taken} of the ${reachable} reachable transitions of the state table (it was cut short).`;
}

/** The commissioning sheet as a Doc. */
export function commissioningDoc(build: Build, rows: readonly CommissioningRow[], tour: readonly TourClock[]): Doc {
  const f = build.machine;
  const first = rows[0];
  const latches = first?.latches ?? [];
  const outputs = first?.outputs ?? [];
  const headers = [
    'step',
    'clock',
    'do this',
    ...latches.map((l) => `${l.id}: set Z · reset Z`),
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
        ],
      },
      {
        id: 'safety',
        title: 'Safety',
        blocks: [{ kind: 'note', tone: 'caution', title: 'Cautions', items: CAUTIONS }],
      },
      {
        id: 'sequence',
        title: 'Sequence',
        blocks: [table(headers, body, { tick: true, mono: latches.map((_, i) => 3 + i) })],
      },
    ],
  };
}

/** The commissioning sheet as a printable, self-contained HTML page. */
export function commissioningHtml(build: Build, rows: readonly CommissioningRow[], tour: readonly TourClock[]): string {
  return renderDocHtml(commissioningDoc(build, rows, tour));
}
