/**
 * Drawings benchmark (part of `npm run bench`, bench/run.ts; also runs alone:
 *   node --import tsx bench/drawings.ts [fixture …]   — LGSynth'91 fixtures, default scf and s298)
 * The schematic (schematicSvg) and the state diagram (diagramSvg) of the largest LGSynth'91
 * builds, beside the build itself (binary codes, without checks) measured in the same run.
 * Both machines are past the schematic's layered-layout bound, so they are drawn in stage
 * columns (src/core/export/schematic-svg.ts); a third row per machine gives the schematic's
 * layout with its crossing reduction (src/core/export/column-order.ts) beside the same layout
 * without it (the first placement only), so the ratio is what the reduction costs. Figures are
 * medians of three runs; the machine may be shared, so read ratios, not absolute times. Never a
 * test.
 */
import { readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import { analyse, buildMachine, diagramSvg, schematicSvg, type Build } from '../src/core/index.js';
import { schematicLayout } from '../src/core/export/index.js';
import { median } from './median.js';
import { ms, type BenchRow } from './row.js';

export type DrawingBenchRow = BenchRow;

/** Goals of the schematic's time: a few seconds at most for any build (scf and s298 named). */
const SCHEMATIC_GOAL: Readonly<Record<string, string>> = { scf: '< 2 s', s298: '< 5 s' };

/** Rows for the schematic and the state diagram of each fixture. */
export function benchDrawings(fixtures: readonly string[] = ['scf', 's298']): DrawingBenchRow[] {
  const rows: DrawingBenchRow[] = [];
  for (const name of fixtures) {
    const a = analyse(readFileSync(`tests/fixtures/lgsynth91/${name}.json`, 'utf8'), `${name}.json`);
    if (!a.ok) throw new Error(`${name}: ${a.diagnostics.map((d) => d.message).join('; ')}`);
    let build: Build | undefined;
    const ref = median(3, () => {
      const r = buildMachine(a, { encoding: 'binary', checks: false });
      if (!r.ok) throw new Error(`${name}: ${r.diagnostics.map((d) => d.message).join('; ')}`);
      build = r.build;
    });
    if (!build) throw new Error(`${name}: no build`);
    const b = build;
    const parts = b.netlist.parts.length;
    const schematic = median(3, () => schematicSvg(b));
    const diagram = median(3, () => diagramSvg(b));
    const first = median(3, () => schematicLayout(b, { reduceCrossings: false }));
    const reduced = median(3, () => schematicLayout(b));
    const reference = `the build (binary, without checks) ${ms(ref)}`;
    rows.push(
      {
        name: `schematic SVG, ${name} (${parts} parts, stage columns)`,
        figure: ms(schematic),
        reference,
        ratio: (schematic / ref).toFixed(2) + '×',
        goal: SCHEMATIC_GOAL[name] ?? '< 5 s',
      },
      {
        name: `schematic layout, ${name}: stage columns with crossing reduction`,
        figure: ms(reduced),
        reference: `the first placement alone ${ms(first)}`,
        ratio: (reduced / first).toFixed(2) + '×',
        goal: '< 1 s',
      },
      {
        name: `state diagram SVG, ${name} (${b.machine.states.length} states)`,
        figure: ms(diagram),
        reference,
        ratio: (diagram / ref).toFixed(2) + '×',
        goal: '< 5 s',
      },
    );
  }
  return rows;
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const args = process.argv.slice(2);
  for (const row of benchDrawings(args.length > 0 ? args : undefined))
    console.log(`${row.name}: ${row.figure} (${row.reference}; ${row.ratio}; goal ${row.goal})`);
}
