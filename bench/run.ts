/**
 * `npm run bench`: every benchmark, each figure a median of several runs, reported beside a
 * reference measured in the same run (a ratio). Writes docs/benchmarks.md. Never a test.
 */
import { writeFileSync, readFileSync, readdirSync } from 'node:fs';
import os from 'node:os';
import { createActor, createMachine } from 'xstate';
import {
  analyse,
  type Analysed,
  billOfMaterials,
  buildMachine,
  type Built,
  checkDrive,
  checkEquivalence,
  checkForbiddenInput,
  checkRecovery,
  clockEvent,
  createRunner,
  DEFAULT_PROFILE,
  driveSnapshots,
  exportXstate,
  type FlatMachine,
  printCubes,
  randomFlatMachine,
  seededRandom,
  timingOf,
} from '../src/core/index.js';
import { benchMinimiseLogic } from './minimise-logic.js';
import { median } from './median.js';
import { benchBuildTable } from './build-table.js';

interface Row {
  readonly name: string;
  readonly figure: string;
  readonly reference: string;
  readonly ratio: string;
  readonly goal: string;
}

const ms = (x: number): string => (x >= 1000 ? `${(x / 1000).toFixed(2)} s` : `${x.toFixed(1)} ms`);

/** A flat table back into the JSON form (one transition per row), so the benchmark includes parsing. */
function flatToJsonText(f: FlatMachine): string {
  return JSON.stringify({
    name: f.name,
    inputs: f.inputs,
    outputs: f.outputs,
    start: f.states[f.start],
    states: f.states.map((name, s) => ({
      name,
      transitions: f.rows[s].map((r) => ({
        when: printCubes([r.cube], f.inputs),
        to: f.states[r.next],
        outputs: Object.fromEntries(f.outputs.map((o, k) => [o, r.out[k]])),
      })),
    })),
  });
}

function mustAnalyse(text: string, file: string): Analysed {
  const a = analyse(text, file);
  if (!a.ok) throw new Error(`${file}: ${a.diagnostics.map((d) => d.message).join('; ')}`);
  return a;
}

function mustBuild(a: Analysed, encoding: 'auto' | 'binary', checks = true): Built {
  const b = buildMachine(a, { encoding, checks });
  if (!b.ok) throw new Error(b.diagnostics.map((d) => d.message).join('; '));
  return b;
}

function benchAnalyse(): Row {
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

function benchAuto(): Row {
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

function benchSimulation(): Row[] {
  const a = mustAnalyse(readFileSync('examples/crossing.lw', 'utf8'), 'crossing.lw');
  const b = mustBuild(a, 'binary', false);
  const rnd = seededRandom(5);
  const f = b.build.machine;
  const seq = Array.from({ length: 2000 }, () => f.inputs.map(() => (rnd.next() < 0.5 ? '0' : '1')).join(''));
  const runner = createRunner(b.build, timingOf(DEFAULT_PROFILE));
  runner.reset();
  const ev0 = runner.sim.evaluations;
  const t = median(1, () => {
    for (const s of seq) runner.clock(Object.fromEntries(f.inputs.map((n, i) => [n, s[i] === '1' ? 1 : 0])));
  });
  const evals = runner.sim.evaluations - ev0;
  const x = exportXstate(a.machine, { form: 'clock' });
  const actor = createActor(createMachine(x.config as never, x.implementations as never)).start();
  const tx = median(1, () => {
    for (const s of seq) actor.send(clockEvent(f.inputs, s));
  });
  return [
    {
      name: 'part-level simulation, crossing example, 2000 clocks',
      figure: `${(((evals / t) * 1000) / 1e6).toFixed(2)} M gate evaluations/s`,
      reference: '—',
      ratio: '—',
      goal: '≥ 1 M/s',
    },
    {
      name: 'part-level clocks per second vs xstate actor steps per second (same machine, same 2000 clocks)',
      figure: `${((seq.length / t) * 1000).toFixed(0)} clocks/s`,
      reference: `xstate ${((seq.length / tx) * 1000).toFixed(0)} steps/s`,
      ratio: (tx / t).toFixed(2) + '×',
      goal: '—',
    },
  ];
}

function benchChecks(): Row {
  // About 200 states need 8 state bits; 6 inputs.
  const text = flatToJsonText(randomFlatMachine(200, 6, 2, 3));
  const a = mustAnalyse(text, 'random-200.json');
  const b = mustBuild(a, 'binary', false);
  const spec = { original: a.flat, merged: a.minimised.merged };
  const t = median(3, () => {
    checkEquivalence(b.build, spec, DEFAULT_PROFILE);
    checkForbiddenInput(b.build, DEFAULT_PROFILE);
    checkRecovery(b.build, DEFAULT_PROFILE);
  });
  const ref = median(3, () => mustBuild(a, 'binary', false));
  return {
    name: `exhaustive checks (equivalence, forbidden input, recovery), ${b.build.encoding.bits} state bits × 6 inputs`,
    figure: ms(t),
    reference: `synthesis of the same build ${ms(ref)}`,
    ratio: (t / ref).toFixed(1) + '×',
    goal: '< 1 s',
  };
}

function benchDrive(): Row {
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
  const rows: Row[] = [];
  const step = (label: string): void => void process.stdout.write(`bench: ${label}…\n`);
  step('analyse');
  rows.push(benchAnalyse());
  step('auto encoding');
  rows.push(benchAuto());
  step('simulation');
  rows.push(...benchSimulation());
  step('checks');
  rows.push(benchChecks());
  step('drive');
  rows.push(benchDrive());
  step('two-level minimiser');
  const logic = await benchMinimiseLogic({ quick: process.argv.includes('--quick') });
  const extra: string[] = [];
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
