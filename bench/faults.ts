/**
 * Fault simulation of the commissioning sheet (part of `npm run bench`, bench/run.ts; also runs
 * alone: `node --import tsx bench/faults.ts`). For the largest example and scf (LGSynth'91, the
 * largest benchmark under the fault bound), the simulation of every cord fault through the
 * sheet of the transition tour, and the same with the search for clocks that catch the rest,
 * beside the fault-free sheet (the commissioning rows of the same tour) measured in the same
 * run. Binary codes, so the build is quick; figures are medians of three runs. Never a test.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import {
  analyse,
  buildMachine,
  commissioningTour,
  DEFAULT_PROFILE,
  sheetFaults,
  type Build,
} from '../src/core/index.js';
import { commissioningRows } from '../src/core/export/index.js';
import { median } from './median.js';
import { ms, type BenchRow } from './row.js';

function mustBuild(text: string, file: string): Build {
  const a = analyse(text, file);
  if (!a.ok) throw new Error(`${file}: ${a.diagnostics.map((d) => d.message).join('; ')}`);
  const r = buildMachine(a, { encoding: 'binary', checks: false });
  if (!r.ok) throw new Error(`${file}: ${r.diagnostics.map((d) => d.message).join('; ')}`);
  return r.build;
}

/** The example with the most states after minimisation. */
function largestExample(): { name: string; build: Build } {
  const all = readdirSync('examples')
    .filter((f) => f.endsWith('.lw'))
    .map((f) => ({ name: f, build: mustBuild(readFileSync(`examples/${f}`, 'utf8'), f) }));
  return all.sort((x, y) => y.build.machine.states.length - x.build.machine.states.length)[0];
}

/** Two rows per machine: the fault simulation alone, and with the search, against the fault-free sheet. */
export function benchFaults(): BenchRow[] {
  const scf = { name: 'scf', build: mustBuild(readFileSync('tests/fixtures/lgsynth91/scf.json', 'utf8'), 'scf.json') };
  const rows: BenchRow[] = [];
  for (const { name, build } of [largestExample(), scf]) {
    const tour = commissioningTour(build.machine);
    const sheet = median(3, () => commissioningRows(build, DEFAULT_PROFILE, tour));
    const plain = median(3, () => sheetFaults(build, DEFAULT_PROFILE, tour, { extend: false }));
    const whole = median(3, () => sheetFaults(build, DEFAULT_PROFILE, tour));
    const sf = sheetFaults(build, DEFAULT_PROFILE, tour);
    const sample = sf.simulated < sf.collapsed ? `, a sample of ${sf.simulated}` : '';
    const shown = sf.verdicts.filter((v) => v.shown >= 0).length;
    const reference = `the fault-free sheet (${sf.tourRows} rows) ${ms(sheet)}`;
    rows.push(
      {
        name: `fault simulation of the commissioning sheet, ${name} (${sf.collapsed} faults${sample})`,
        figure: ms(plain),
        reference,
        ratio: (plain / sheet).toFixed(1) + '×',
        goal: '< 10 s',
      },
      {
        name: `… with the search for clocks that catch the rest (${sf.extra.length} clocks added; ${shown} of ${sf.simulated} shown)`,
        figure: ms(whole),
        reference,
        ratio: (whole / sheet).toFixed(1) + '×',
        goal: '< 30 s',
      },
    );
  }
  return rows;
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  for (const r of benchFaults())
    process.stdout.write(`${r.name}: ${r.figure} (${r.reference}; ${r.ratio}; goal ${r.goal})\n`);
}
