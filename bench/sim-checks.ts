/**
 * Benchmarks of the part-level simulator and the exhaustive checks, for `npm run bench`
 * (bench/run.ts calls `benchSimulatorAndChecks` once and prints its section). Each figure is
 * measured beside its reference in the same run, in CPU time of this process (the machine is
 * shared), as the median of several interleaved runs:
 * - the runner (one input sequence, the hand procedure clock by clock) against xstate's actor
 *   running the same machine on the same inputs, warm, over 100 000 clocks, with the runner's
 *   cold figure (its memo of clocks empty at the first clock) and its figure without the memo;
 * - 32 input sequences at once on the bit-parallel lanes, clocks summed over the lanes;
 * - the exhaustive checks (equivalence, forbidden input, recovery) of an 8-state-bit ×
 *   6-input build, then every check of it, against one clock from every (code, inputs)
 *   start point on the event-driven simulator, one at a time (what the checks ran on before);
 * - every check of the cse benchmark machine (16 states), as the designer runs them after a
 *   keystroke, against its build.
 * The checks share work within a build (compiled netlist, settle programs, clock records, move
 * memo, routed budgets), so each timed run of them checks a copy of the build that no check has
 * seen (`unseen`): the figure is what checking a new build costs, not a second look at one.
 */
import { readFileSync } from 'node:fs';
import { createActor, createMachine } from 'xstate';
import {
  type Analysed,
  type Build,
  buildMachine,
  type Built,
  checkEquivalence,
  checkForbiddenInput,
  checkRecovery,
  clockEvent,
  createRunner,
  DEFAULT_PROFILE,
  exportXstate,
  flatToJsonText,
  randomFlatMachine,
  runChecks,
  seededRandom,
  timingOf,
} from '../src/core/index.js';
import {
  allCodes,
  clockFrom,
  grayAssignments,
  LaneBatch,
  latchesOf,
  simFor,
  stateAtCode,
} from '../src/core/sim/index.js';
import { mustAnalyse } from './machines.js';
import { ms, type BenchRow } from './row.js';

export type SimBenchRow = BenchRow;

/** CPU milliseconds (user + system) of one call. */
function cpu(fn: () => void): number {
  const t0 = process.cpuUsage();
  fn();
  const t = process.cpuUsage(t0);
  return (t.user + t.system) / 1000;
}

/** Medians of interleaved runs of two functions. */
function interleaved(runs: number, a: () => void, b: () => void): [number, number] {
  const ta: number[] = [];
  const tb: number[] = [];
  for (let i = 0; i < runs; i++) {
    ta.push(cpu(a));
    tb.push(cpu(b));
  }
  const mid = (xs: number[]): number => xs.sort((x, y) => x - y)[Math.floor(xs.length / 2)];
  return [mid(ta), mid(tb)];
}

const rate = (n: number, t: number): string => `${Math.round((n / t) * 1000).toLocaleString('en')}`;

/** A copy of a build and its placement that no check has seen: every memo keyed by them starts empty. */
function unseen(b: Built): { build: Build; placement: Built['placement'] } {
  return { build: { ...b.build }, placement: { ...b.placement, routing: { ...b.placement.routing } } };
}

/** A build without its checks, with `encoding` or else the command line's default (as the designer builds). */
function mustBuild(a: Analysed, encoding?: 'binary'): Built {
  const b = buildMachine(a, { ...(encoding ? { encoding } : {}), checks: false });
  if (!b.ok) throw new Error(b.diagnostics.map((d) => d.message).join('; '));
  return b;
}

const GOAL_RATIO = 10;

const plural = (n: number, word: string): string => `${n} ${word}${n === 1 ? '' : 's'}`;

/** Medians of interleaved runs of several timed functions (each returns its own CPU milliseconds). */
function interleavedTimed(runs: number, fns: readonly (() => number)[]): number[] {
  const times = fns.map(() => [] as number[]);
  for (let i = 0; i < runs; i++) fns.forEach((fn, k) => times[k].push(fn()));
  return times.map((xs) => xs.sort((p, q) => p - q)[Math.floor(xs.length / 2)]);
}

/**
 * The runner against xstate's actor on one machine over `clocks` clocks of seeded random inputs,
 * all in the same run: warm (the runner has run the same clocks once, so its memo of clocks
 * holds them; xstate after 5 000 steps, its cost does not depend on what it has seen), cold (a
 * fresh runner, its memo empty at the first clock) and without the memo (how it stepped before).
 */
function runnerRow(label: string, a: Analysed, build: Build, clocks: number): SimBenchRow {
  const f = build.machine;
  const rnd = seededRandom(5);
  const seq = Array.from({ length: clocks }, () => a.machine.inputs.map(() => (rnd.next() < 0.5 ? '0' : '1')).join(''));
  const values = seq.map((s) => Object.fromEntries(f.inputs.map((n, i) => [n, s[i] === '1' ? 1 : 0] as const)));
  const events = seq.map((s) => clockEvent(a.machine.inputs, s));
  const x = exportXstate(a.machine, { form: 'clock' });
  const warm = Math.min(clocks, 5000);
  const ours = (warmUp: number, memoBytes?: number) => (): number => {
    const r = createRunner(build, timingOf(DEFAULT_PROFILE), memoBytes === undefined ? {} : { memoBytes });
    r.reset();
    for (let i = 0; i < warmUp; i++) r.clock(values[i]);
    return cpu(() => {
      for (let i = 0; i < clocks; i++) r.clock(values[i]);
    });
  };
  const theirs = (): number => {
    const actor = createActor(createMachine(x.config as never, x.implementations as never)).start();
    for (let i = 0; i < warm; i++) actor.send(events[i]);
    return cpu(() => {
      for (let i = 0; i < clocks; i++) actor.send(events[i]);
    });
  };
  const [tw, tc, tn, tx] = interleavedTimed(5, [ours(clocks), ours(0), ours(warm, 0), theirs]);
  const probe = createRunner(build, timingOf(DEFAULT_PROFILE));
  probe.reset();
  for (let i = 0; i < clocks; i++) probe.clock(values[i]);
  const memo = probe.memoStats();
  const cold = `cold: ${memo.misses.toLocaleString('en')} of the ${clocks.toLocaleString('en')} clocks settle in full, ${memo.heldHits.toLocaleString('en')} settle only their input levers`;
  const ratio = tx / tw;
  const us = (t: number): string => ((t / clocks) * 1000).toFixed(2);
  const short =
    ratio >= GOAL_RATIO
      ? `met: a clock seen before is one look-up in the memo of clocks (${plural(memo.states, 'settled state')}, ${plural(memo.clocks, 'clock')} kept), ${us(tw)} µs per clock`
      : `short by ${(GOAL_RATIO / ratio).toFixed(1)}×: the goal leaves ${((tx / clocks / GOAL_RATIO) * 1000).toFixed(2)} µs per clock, the runner takes ${us(tw)} µs with ${plural(memo.states, 'settled state')} and ${plural(memo.clocks, 'clock')} in its memo`;
  return {
    name: `runner, ${label} (${plural(build.machine.states.length, 'state')}, ${plural(build.parts.gates, 'gate')}), warm, ${clocks.toLocaleString('en')} clocks`,
    figure: `${rate(clocks, tw)} clocks/s; cold (memo empty at the first clock) ${rate(clocks, tc)}; without the memo ${rate(clocks, tn)}`,
    reference: `xstate actor ${rate(clocks, tx)} steps/s`,
    ratio: `${ratio.toFixed(2)}× (cold ${(tx / tc).toFixed(2)}×, without the memo ${(tx / tn).toFixed(2)}×)`,
    goal: `≥ ${GOAL_RATIO}× (${short}; ${cold}, each with exact times for every part its lever moves reach)`,
  };
}

/** 32 seeded input sequences at once on the lanes: each clock sets each lane's inputs, then the four clock moves. */
function lanesRow(label: string, a: Analysed, build: Build, clocks: number): SimBenchRow {
  const sim = simFor(build, timingOf(DEFAULT_PROFILE));
  const n = build.machine.inputs.length;
  const rnd = seededRandom(6);
  const steps = Math.ceil(clocks / 32);
  const seq = Array.from({ length: steps * 32 }, () =>
    Array.from({ length: n }, () => (rnd.next() < 0.5 ? '0' : '1')).join(''),
  );
  const start = stateAtCode(sim, build.encoding.codes[build.machine.start]).values;
  const lanes = (): void => {
    const b = new LaneBatch(sim);
    b.clear();
    for (let lane = 0; lane < 32; lane++) b.setLatches(lane, latchesOf(sim, start));
    for (let k = 0; k < steps; k++) {
      for (let lane = 0; lane < 32; lane++) b.setInputs(lane, seq[k * 32 + lane]);
      b.settleHeld();
      b.clock();
    }
  };
  const x = exportXstate(a.machine, { form: 'clock' });
  const events = seq.slice(0, clocks).map((s) => clockEvent(a.machine.inputs, s));
  const theirs = (): void => {
    const actor = createActor(createMachine(x.config as never, x.implementations as never)).start();
    for (const e of events) actor.send(e);
  };
  lanes();
  theirs();
  const [tl, tx] = interleaved(5, lanes, theirs);
  const done = steps * 32;
  const lanesRatio = done / tl / (clocks / tx);
  return {
    name: `32 input sequences at once on the bit-parallel lanes, ${label}, ${done.toLocaleString('en')} clocks summed over the lanes`,
    figure: `${rate(done, tl)} clocks/s`,
    reference: `xstate actor ${rate(clocks, tx)} steps/s (one sequence)`,
    ratio: `${lanesRatio.toFixed(1)}×`,
    goal: `the runner's ≥ ${GOAL_RATIO}× is per sequence; summed over 32 sequences ${lanesRatio >= GOAL_RATIO ? 'met' : `short by ${(GOAL_RATIO / lanesRatio).toFixed(1)}×`}`,
  };
}

/**
 * The three exhaustive checks of an 8-bit × 6-input build, and then every check of it, against
 * one event-driven clock from every start point.
 */
export function checksRows(): SimBenchRow[] {
  const text = flatToJsonText(randomFlatMachine(200, 6, 2, 3));
  const a = mustAnalyse(text, 'random-200.json');
  const built = mustBuild(a, 'binary');
  const { build } = built;
  const spec = { original: a.flat, merged: a.minimised.merged };
  const sim = simFor(build, timingOf(DEFAULT_PROFILE));
  const checks = (): void => {
    const b = unseen(built).build;
    checkEquivalence(b, spec, DEFAULT_PROFILE);
    checkForbiddenInput(b, DEFAULT_PROFILE);
    checkRecovery(b, DEFAULT_PROFILE);
  };
  // The checks reuse the build's own placement, as builds and the designer's checks do.
  const every = (): void => {
    const u = unseen(built);
    void runChecks(u.build, a, DEFAULT_PROFILE, 1, u.placement);
  };
  const inputs = grayAssignments(build.machine.inputs.length);
  const eventDriven = (): void => {
    for (const c of allCodes(build.encoding.bits))
      for (const i of inputs) clockFrom(sim, stateAtCode(sim, c, i).values);
  };
  checks();
  every();
  const [tc, te] = interleaved(3, checks, eventDriven);
  const [ta] = interleaved(3, every, () => undefined);
  const size = `${build.encoding.bits} state bits × ${build.machine.inputs.length} inputs (${plural(build.parts.gates, 'gate')})`;
  const reference = `one clock from each of the ${(2 ** build.encoding.bits * inputs.length).toLocaleString('en')} start points, event-driven, one at a time: ${ms(te)}`;
  const goal = (t: number): string => `< 1 s (${t < 1000 ? 'met' : `short by ${ms(t - 1000)}`})`;
  return [
    {
      name: `exhaustive checks (equivalence, forbidden input, recovery), ${size}, on a build no check has seen`,
      figure: ms(tc),
      reference,
      ratio: `${(tc / te).toFixed(2)}×`,
      goal: goal(tc),
    },
    {
      name: `every check (the exhaustive ones, next-state equivalence, timing with its Monte Carlo runs, drive, layout), ${size}, the build placed once beforehand, on a copy no check has seen`,
      figure: ms(ta),
      reference,
      ratio: `${(ta / te).toFixed(2)}×`,
      goal: goal(ta),
    },
  ];
}

/** Every check of the cse machine, as the designer runs them after a keystroke, against its build. */
export function cseRow(): SimBenchRow {
  const file = 'tests/fixtures/lgsynth91/cse.json';
  const a = mustAnalyse(readFileSync(file, 'utf8'), file);
  const built = mustBuild(a);
  const { build } = built;
  const checks = (): void => {
    const u = unseen(built);
    void runChecks(u.build, a, DEFAULT_PROFILE, 1, u.placement);
  };
  const rebuild = (): void => void mustBuild(a);
  checks();
  const [tc, tb] = interleaved(3, checks, rebuild);
  return {
    name: `every check of the cse benchmark machine (${build.machine.states.length} states), as after a keystroke in the designer`,
    figure: ms(tc),
    reference: `its build (the command line's default encoding, as the designer builds; no checks) ${ms(tb)}`,
    ratio: `${(tc / tb).toFixed(2)}×`,
    goal: `keystroke → every check < 500 ms, of which the build's goal is 150 ms: checks < 350 ms (${tc < 350 ? 'met' : `short by ${ms(tc - 350)}`})`,
  };
}

const RUNNER_EXAMPLES = [
  'canal-lock',
  'crossing',
  'ferry-gate',
  'lighthouse',
  'marble-bell',
  'odd-lever',
  'sequence-lock',
];

/** The runner rows of the examples, `clocks` clocks each. */
function runnerExampleRows(clocks: number): SimBenchRow[] {
  return RUNNER_EXAMPLES.map((name) => {
    const file = `examples/${name}.lw`;
    const a = mustAnalyse(readFileSync(file, 'utf8'), file);
    return runnerRow(`example ${name}`, a, mustBuild(a, 'binary').build, clocks);
  });
}

/** The simulator and checks section of the benchmarks; `quick` leaves out the large machines. */
export function benchSimulatorAndChecks(quick: boolean): { rows: SimBenchRow[]; markdown: string } {
  const clocks = quick ? 20_000 : 100_000;
  const rows: SimBenchRow[] = runnerExampleRows(clocks);
  const crossing = mustAnalyse(readFileSync('examples/crossing.lw', 'utf8'), 'crossing.lw');
  rows.push(lanesRow('example crossing', crossing, mustBuild(crossing, 'binary').build, clocks));
  if (!quick) {
    const file = 'tests/fixtures/lgsynth91/s298.json';
    const s298 = mustAnalyse(readFileSync(file, 'utf8'), file);
    const { build } = mustBuild(s298, 'binary');
    rows.push(runnerRow("LGSynth'91 s298", s298, build, clocks));
    rows.push(lanesRow("LGSynth'91 s298", s298, build, clocks));
    rows.push(...checksRows());
  }
  rows.push(cseRow());
  const markdown = [
    '| benchmark | figure | reference (same run) | ratio | goal |',
    '|---|---|---|---|---|',
    ...rows.map((r) => `| ${r.name} | ${r.figure} | ${r.reference} | ${r.ratio} | ${r.goal} |`),
    '',
    'CPU time of this process (user + system), median of interleaved runs. The runner moves one lever at a time by the settle programs (sim/program.ts, sim/fast.ts), with every settling time exact, and answers a clock it has seen from the same settled state from its memo of clocks (sim/memo.ts), which gives the same record; "warm" is its second pass over the same clocks, "cold" its first; the lanes carry 32 independent input sequences in one machine word per part. The designer rows of the first table time a whole keystroke in the browser, build and checks together.',
  ].join('\n');
  return { rows, markdown };
}
