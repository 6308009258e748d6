/**
 * The build table of `npm run bench`: every LGSynth'91 machine built as the command line
 * builds it (the encoding search on worker threads from 130 states, every check), each in a child process
 * (build-one.ts) so that its peak resident memory is its own (a build over 5 s three times,
 * its median run kept); then the growth of the build
 * time per doubling of states on random machines of 4–128 states (4 inputs, 2 outputs).
 * `--quick` builds a subset (three small machines, 4–16 states) in about a minute on a loaded 2-core machine,
 * with the reference's three runs (a few seconds each) on top.
 * Goals (issue figures): every machine under 10 s and under 500 MB.
 *
 * The same-run reference: one fixed build with no search (REFERENCE: s298 with binary codes,
 * every check), in a child process like the others, at the start, the middle and the end of
 * the table; its median stands beside the slowest build, as a ratio, so that a slow day (a
 * busy or slower machine) shows in the reference as well as in the builds.
 *
 * On its own, `node --import tsx bench/build-table.ts [MACHINE…]` prints the build table of
 * the machines named (every one when none is), with the reference, and writes no file.
 */
import { execFile } from 'node:child_process';
import { readdirSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import type { BuildFigures } from './build-one.js';
import { middle } from './median.js';

const FIXTURES = 'tests/fixtures/lgsynth91';
/** A build past this is stopped and reported as such (ms). */
const STOP_AFTER = 120_000;
const QUICK_MACHINES = ['bbara', 's27', 'tbk'];

/** The reference build: a fixed machine and named codes, so no search (build-one.ts SOURCE ENCODING). */
const REFERENCE = { machine: 's298', encoding: 'binary' } as const;

/** One build in a child process (with named codes when given), or why it gave no figures. */
function buildInChild(source: string, encoding?: string): Promise<BuildFigures | string> {
  return new Promise((resolve) => {
    execFile(
      process.execPath,
      ['--import', 'tsx', 'bench/build-one.ts', source, ...(encoding ? [encoding] : [])],
      { timeout: STOP_AFTER, maxBuffer: 1 << 20 },
      (error, stdout) => {
        if (error) resolve(error.killed ? `stopped after ${STOP_AFTER / 1000} s` : `failed (${error.code ?? 'error'})`);
        else resolve(JSON.parse(stdout) as BuildFigures);
      },
    );
  });
}

/** A build past this share of the goal is built twice more and the median run kept (ms). */
const AGAIN_PAST = 5_000;

/** One build, or for a slow one (past AGAIN_PAST) the run of median time of three. */
async function medianBuild(source: string): Promise<BuildFigures | string> {
  const first = await buildInChild(source);
  if (typeof first === 'string' || first.ms <= AGAIN_PAST) return first;
  const runs = [first];
  for (let i = 0; i < 2; i++) {
    const r = await buildInChild(source);
    if (typeof r !== 'string') runs.push(r);
  }
  return runs.sort((a, b) => a.ms - b.ms)[Math.floor(runs.length / 2)];
}

const seconds = (ms: number): string => (ms / 1000).toFixed(2);

function row(name: string, r: BuildFigures | string): string {
  if (typeof r === 'string') return `| ${name} | — | ${r} | — | — | — | — | — |`;
  if (!r.ok)
    return `| ${name} | ${r.states} → ${r.minimised} | refused (${r.problem ?? 'error'}) | — | — | — | ${r.peakRssMb} | — |`;
  const share = r.ms > 0 ? Math.round((100 * r.searchMs) / r.ms) : 0;
  return `| ${name} | ${r.states} → ${r.minimised} | ${seconds(r.ms)} | ${seconds(r.searchMs)} (${share} %) | ${seconds(r.checkMs)} | ${r.cost} | ${r.peakRssMb} | ${r.checksPassed ? 'all pass' : `fails: ${(r.failing ?? ['a check']).join(', ')}`} |`;
}

/** The share of cord a build saves against its netlist order, as `build --json` reports it (none for a build with no cord). */
function pushSaved(into: number[], r: BuildFigures | string): void {
  if (typeof r === 'string' || !r.ok || r.cordM === undefined || !r.baselineCordM) return;
  into.push(1 - r.cordM / r.baselineCordM);
}

function cordSavedLine(saved: { readonly fixtures: readonly number[]; readonly examples: readonly number[] }): string {
  const pc = (xs: readonly number[]): string => (xs.length === 0 ? '—' : `${(middle(xs) * 100).toFixed(1)} %`);
  const all = [...saved.fixtures, ...saved.examples];
  return `Cord to cut against the netlist order, as \`build --json\` reports it (\`layout.totalCordM\` against \`layout.baselineCordM\`, searched codes), median: ${pc(all)} less over ${all.length} builds (${saved.examples.length} examples: ${pc(saved.examples)}; ${saved.fixtures.length} machines above that have cord: ${pc(saved.fixtures)}); goal ≥ 30 % (the placement section gives the same figure with binary codes, and why it falls short).`;
}

/** One run of the reference build: its wall time (ms), or why it gave none. */
async function referenceRun(): Promise<number | string> {
  process.stdout.write(`bench: reference build (${REFERENCE.machine}, ${REFERENCE.encoding} codes)…\n`);
  const r = await buildInChild(`${FIXTURES}/${REFERENCE.machine}.json`, REFERENCE.encoding);
  if (typeof r === 'string') return r;
  return r.ok ? r.ms : `refused (${r.problem ?? 'error'})`;
}

/**
 * The row under the table: the slowest build beside the same-run reference (median of its
 * runs), as a ratio, and how the 10 s goal reads against the reference.
 */
export function slowestLine(
  slowest: { readonly name: string; readonly ms: number },
  refs: readonly (number | string)[],
): string {
  const head = `Slowest: ${slowest.name} in ${seconds(slowest.ms)} s (goal < 10 s each).`;
  const times = refs.filter((x): x is number => typeof x === 'number');
  const what = `${REFERENCE.machine} built with ${REFERENCE.encoding} codes (no search, every check), in a child process like the builds, at the start, middle and end of the table`;
  if (times.length === 0) return `${head} Reference (${what}) gave no time: ${refs.map(String).join('; ')}.`;
  const ref = middle(times);
  const goal = 10_000 / ref;
  const ratio = slowest.ms / ref;
  const reads =
    ratio < goal ? `under the goal by ${(goal / ratio).toFixed(2)}×` : `over the goal by ${(ratio / goal).toFixed(2)}×`;
  return `${head} Same-run reference: ${what}, median of ${times.length} runs ${seconds(ref)} s (runs ${times.map(seconds).join(', ')} s). The slowest build is ${ratio.toFixed(2)}× the reference; the 10 s goal is ${goal.toFixed(2)}× it on this machine today, so the slowest build reads ${reads}. Compare the ratio across machines and days, not the seconds.`;
}

/** The build table of these LGSynth'91 machines (file names without .json), with the reference measured at the start, middle and end. */
async function machineRows(
  names: readonly string[],
): Promise<{ rows: string[]; slowest: { name: string; ms: number }; refs: (number | string)[]; saved: number[] }> {
  const rows: string[] = [];
  const saved: number[] = [];
  let slowest = { name: '', ms: 0 };
  const refs: (number | string)[] = [await referenceRun()];
  const half = Math.floor(names.length / 2); // with one machine, the middle run comes just before it
  for (const [i, name] of names.entries()) {
    if (i === half) refs.push(await referenceRun());
    process.stdout.write(`bench: build ${name}…\n`);
    const r = await medianBuild(`${FIXTURES}/${name}.json`);
    if (typeof r !== 'string' && r.ms > slowest.ms) slowest = { name, ms: r.ms };
    rows.push(row(name, r));
    pushSaved(saved, r);
  }
  refs.push(await referenceRun());
  return { rows, slowest, refs, saved };
}

const TABLE_HEAD = [
  "## Builds of the LGSynth'91 machines",
  '',
  "Each build as `latchwright build` runs it (encoding search on worker threads from 130 states, src/cli/search-pool.ts, every check), in a child process of its own; a build over 5 s is run three times and the row is its median run. Goals: under 10 s and under 500 MB peak resident memory each. The shipped profile's frame carries 2 drums of at most 1.5 m, so a larger machine fails the layout check and says what to change (tests/core/checks/lgsynth91.test.ts builds every machine with every check passing under a profile that allows more drums). Under the table, the slowest build stands beside a reference measured in the same run (one fixed build with no search, at the start, middle and end of the table) as a ratio, which carries across machines and busy days better than the seconds.",
  '',
  '| machine | states (→ minimised) | build s | search s (share) | checks s | parts cost | peak RSS MB | checks |',
  '|---|---|---|---|---|---|---|---|',
];

/** Every LGSynth'91 machine's name (the fixtures' file names without .json), sorted. */
function allMachines(): string[] {
  return readdirSync(FIXTURES)
    .filter((f) => f.endsWith('.json'))
    .map((f) => f.slice(0, -5))
    .sort();
}

/** The build table and the growth table, as Markdown. */
export async function benchBuildTable(opts: { readonly quick: boolean }): Promise<string> {
  const all = allMachines();
  const names = opts.quick ? all.filter((n) => QUICK_MACHINES.includes(n)) : all;
  const table = await machineRows(names);
  const lines = [...TABLE_HEAD, ...table.rows];
  const saved: { fixtures: number[]; examples: number[] } = { fixtures: table.saved, examples: [] };
  lines.push('', slowestLine(table.slowest, table.refs), '');
  for (const f of opts.quick ? [] : readdirSync('examples').filter((x) => x.endsWith('.lw'))) {
    process.stdout.write(`bench: build ${f}…\n`);
    pushSaved(saved.examples, await buildInChild(`examples/${f}`));
  }
  lines.push(cordSavedLine(saved), '');
  lines.push(
    '## Build time per doubling of states',
    '',
    'Random machines (src/core/sim/random-machine.ts, 4 inputs, 2 outputs, seed 1), built as above.',
    '',
    '| states | build s | growth over half as many states | search s | checks s | peak RSS MB |',
    '|---|---|---|---|---|---|',
  );
  let previous: number | undefined;
  for (let states = 4; states <= (opts.quick ? 16 : 128); states *= 2) {
    process.stdout.write(`bench: build random ${states} states…\n`);
    const r = await buildInChild(`random:${states}:4:2:1`);
    if (typeof r === 'string' || !r.ok) {
      lines.push(`| ${states} | ${typeof r === 'string' ? r : `refused (${r.problem ?? 'error'})`} | — | — | — | — |`);
      previous = undefined;
      continue;
    }
    const growth = previous !== undefined && previous > 0 ? `${(r.ms / previous).toFixed(2)}×` : '—';
    lines.push(
      `| ${states} | ${seconds(r.ms)} | ${growth} | ${seconds(r.searchMs)} | ${seconds(r.checkMs)} | ${r.peakRssMb} |`,
    );
    previous = r.ms;
  }
  return lines.join('\n');
}

/** The build table alone for the machines named (all when none), printed; no file written. */
async function standalone(names: readonly string[]): Promise<void> {
  const all = allMachines();
  const unknown = names.filter((n) => !all.includes(n));
  if (unknown.length > 0) {
    process.stderr.write(`bench: no machine ${unknown.join(', ')} in ${FIXTURES}; there are ${all.join(', ')}\n`);
    process.exitCode = 2;
    return;
  }
  const table = await machineRows(names.length > 0 ? names : all);
  process.stdout.write([...TABLE_HEAD, ...table.rows, '', slowestLine(table.slowest, table.refs), ''].join('\n'));
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) await standalone(process.argv.slice(2));
