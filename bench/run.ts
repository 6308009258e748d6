/**
 * `npm run bench`: every benchmark, each figure a median of several runs, reported beside a
 * reference measured in the same run (a ratio). Writes docs/benchmarks.md. Never a test.
 */
import { writeFileSync, readFileSync, readdirSync } from 'node:fs';
import os from 'node:os';
import {
  type Analysed,
  billOfMaterials,
  buildMachine,
  type Built,
  checkDrive,
  DEFAULT_PROFILE,
  driveSnapshots,
  flatToJsonText,
  randomFlatMachine,
} from '../src/core/index.js';
import { benchMinimiseLogic } from './minimise-logic.js';
import { benchPlace } from './place.js';
import { benchSimulatorAndChecks } from './sim-checks.js';
import { median } from './median.js';
import { benchBuildTable } from './build-table.js';
import { benchDrawings } from './drawings.js';
import { benchFaults } from './faults.js';
import { mustAnalyse } from './machines.js';
import { ms, type BenchRow } from './row.js';

function mustBuild(a: Analysed, encoding: 'auto' | 'binary', checks = true): Built {
  const b = buildMachine(a, { encoding, checks });
  if (!b.ok) throw new Error(b.diagnostics.map((d) => d.message).join('; '));
  return b;
}

function benchAnalyse(): BenchRow {
  const text = flatToJsonText(randomFlatMachine(1000, 6, 3, 7));
  const t = median(5, () => mustAnalyse(text, 'random-1000.json'));
  const ref = median(5, () => JSON.parse(text) as unknown);
  return {
    name: 'parse + validate + minimise, random 1000 states × 6 inputs',
    figure: ms(t),
    reference: `JSON.parse of the same file ${ms(ref)}`,
    ratio: (t / ref).toFixed(0) + '×',
    goal: '< 1 s',
  };
}

function benchAuto(): BenchRow {
  const text = flatToJsonText(randomFlatMachine(16, 4, 2, 11));
  const a = mustAnalyse(text, 'random-16.json');
  const t = median(3, () => mustBuild(a, 'auto', false));
  const ref = median(3, () => mustBuild(a, 'binary', false));
  return {
    name: `build --encoding auto, random 16 states × 4 inputs (${a.minimised.machine.states.length} after minimisation), without checks`,
    figure: ms(t),
    reference: `binary encoding ${ms(ref)}`,
    ratio: (t / ref).toFixed(1) + '×',
    goal: '< 5 s',
  };
}

function benchDrive(): BenchRow {
  const sizes = readdirSync('examples')
    .filter((f) => f.endsWith('.lw'))
    .map((f) => ({ f, a: mustAnalyse(readFileSync(`examples/${f}`, 'utf8'), f) }))
    .sort((x, y) => y.a.minimised.machine.states.length - x.a.minimised.machine.states.length);
  const { f, a } = sizes[0];
  const full = median(3, () => mustBuild(a, 'auto', true));
  const b = mustBuild(a, 'auto', false);
  const drive = median(3, () => {
    checkDrive(b.build.netlist, DEFAULT_PROFILE, driveSnapshots(b.build, DEFAULT_PROFILE));
    billOfMaterials(b.build.netlist, DEFAULT_PROFILE);
  });
  return {
    name: `drive check + BOM, largest example (${f})`,
    figure: ms(drive),
    reference: `whole build with checks ${ms(full)}`,
    ratio: `${((drive / full) * 100).toFixed(1)} %`,
    goal: '< 10 % of build',
  };
}

async function main(): Promise<void> {
  const rows: BenchRow[] = [];
  const step = (label: string): void => void process.stdout.write(`bench: ${label}…\n`);
  step('analyse');
  rows.push(benchAnalyse());
  step('auto encoding');
  rows.push(benchAuto());
  step('drive');
  rows.push(benchDrive());
  // ── Simulator and checks: a section of their own (bench/sim-checks.ts) ──
  step('simulator and checks');
  const simChecks = benchSimulatorAndChecks(process.argv.includes('--quick'));
  // ── end of the simulator and checks section ──
  step('two-level minimiser');
  const logic = await benchMinimiseLogic({ quick: process.argv.includes('--quick') });
  const extra: string[] = [];
  // ── Placement and routing (bench/place.ts): its rows in the table, its own section below ──
  step('placement and routing');
  const placement = benchPlace();
  rows.push(...placement.rows);
  extra.push(placement.markdown, '');
  // ── end of placement and routing ──
  // ── Drawings (bench/drawings.ts): the schematic and the state diagram of the largest builds ──
  step('drawings');
  rows.push(...benchDrawings());
  // ── end of drawings ──
  // ── Fault simulation of the commissioning sheet (bench/faults.ts) ──
  step('fault simulation of the commissioning sheet');
  rows.push(...benchFaults());
  // ── end of fault simulation ──
  extra.push(await benchBuildTable({ quick: process.argv.includes('--quick') }));
  try {
    step('browser');
    const { benchWeb } = await import('./web.js');
    rows.push(...(await benchWeb()).rows);
  } catch (e) {
    extra.push(`Browser benchmark not run: ${e instanceof Error ? e.message : String(e)}`);
  }
  const md = [
    '# Benchmarks',
    '',
    `Written by \`npm run bench\` on ${new Date().toISOString().slice(0, 10)} — ${os.cpus().length} × ${os.cpus()[0]?.model ?? 'CPU'}, Node ${process.version}.`,
    'Each figure is a median of several runs; the reference is measured in the same run, so the ratio carries across machines better than the figure.',
    '',
    '| benchmark | figure | reference (same run) | ratio | goal |',
    '|---|---|---|---|---|',
    ...rows.map((r) => `| ${r.name} | ${r.figure} | ${r.reference} | ${r.ratio} | ${r.goal} |`),
    '',
    '## Simulator and checks',
    '',
    simChecks.markdown,
    '',
    '## Two-level minimiser against espresso-iisojs (Espresso-II)',
    '',
    logic.markdown,
    '',
    ...extra,
    '',
  ].join('\n');
  writeFileSync('docs/benchmarks.md', md);
  process.stdout.write(md);
}

await main();
