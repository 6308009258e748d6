/**
 * Benchmark of the two-level minimiser against espresso-iisojs (an independent Espresso-II
 * implementation, single-output), on the same random functions (fixed seed), timed in the
 * same run: each time is the median of several passes over the whole set, ours and theirs
 * alternating within each pass, and the ratio is ours / theirs. Also term and literal totals for both, and every cover checked by truth
 * table. Called by bench/run.ts (`--quick` runs a subset); not a test. Alone:
 *
 *   node --import tsx bench/minimise-logic.ts [--quick]
 */
import { performance } from 'node:perf_hooks';
import { pathToFileURL } from 'node:url';
import { randomCube } from '../tests/core/phases/minimise-logic/brute.js';
import { espresso as referenceEspresso } from 'espresso-iisojs';
import {
  minimiseCover,
  minimiseSop,
  coverStats,
  type MultiFunction,
  type MinimiserMethod,
} from '../src/core/phases/minimise-logic/index.js';
import { type Random, seededRandom } from '../src/core/index.js';
import { literalCount, subtract } from '../src/core/model/index.js';
import { ms, type BenchRow } from './row.js';

export type MinimiserBenchRow = BenchRow;

interface Case {
  readonly n: number;
  readonly on: string[];
  readonly dc: string[];
}

const PASSES = 5;

/** 10 variables; on-set of 4–20 random cubes, a few don't-care cubes outside it. */
function cubeCases(rnd: Random, count: number): Case[] {
  return Array.from({ length: count }, () => {
    const n = 10;
    const on = Array.from({ length: 4 + rnd.int(17) }, () => randomCube(rnd, n, 2 + rnd.int(7)));
    const dc = subtract(
      Array.from({ length: rnd.int(6) }, () => randomCube(rnd, n, 3 + rnd.int(6))),
      on,
    );
    return { n, on, dc };
  });
}

/** 10 variables; every minterm on with probability 0.1–0.4, don't-care with 0.1. */
function mintermCases(rnd: Random, count: number): Case[] {
  return Array.from({ length: count }, () => {
    const n = 10;
    const p = 0.1 + 0.3 * rnd.next();
    const on: string[] = [];
    const dc: string[] = [];
    for (let x = 0; x < 2 ** n; x++) {
      const r = rnd.next();
      const s = x.toString(2).padStart(n, '0');
      if (r < p) on.push(s);
      else if (r < p + 0.1) dc.push(s);
    }
    return { n, on, dc };
  });
}

const toLiterals = (c: string): number[] => {
  const out: number[] = [];
  for (let i = 0; i < c.length; i++) if (c[i] !== '-') out.push((i << 1) | (c[i] === '1' ? 1 : 0));
  return out;
};

function totals(covers: readonly (readonly string[])[]): { terms: number; literals: number } {
  let terms = 0;
  let literals = 0;
  for (const c of covers) {
    terms += c.length;
    for (const t of c) literals += literalCount(t);
  }
  return { terms, literals };
}

/**
 * Median wall times of `passes` runs of each of ours and theirs, alternating within every pass
 * (ours first on even passes, theirs first on odd ones) so that load from other work on a
 * shared machine falls on both.
 */
function interleaved(passes: number, ours: () => void, theirs: () => void): [number, number] {
  const a: number[] = [];
  const b: number[] = [];
  const time = (fn: () => void, into: number[]): void => {
    const t0 = performance.now();
    fn();
    into.push(performance.now() - t0);
  };
  for (let pass = 0; pass < passes; pass++) {
    if (pass % 2 === 0) {
      time(ours, a);
      time(theirs, b);
    } else {
      time(theirs, b);
      time(ours, a);
    }
  }
  const mid = (t: number[]): number => [...t].sort((x, y) => x - y)[Math.floor(t.length / 2)];
  return [mid(a), mid(b)];
}

function compareSingle(
  label: string,
  cases: readonly Case[],
  method: MinimiserMethod,
  passes: number,
): MinimiserBenchRow {
  // Same price as the reference's goal: terms first, then literals.
  const cost = { term: 1000, literal: 1, connection: 0 };
  const literalsIn = cases.map((c) => ({ on: c.on.map(toLiterals), dc: c.dc.map(toLiterals) }));
  let ours: string[][] = [];
  let theirs: number[][][] = [];
  const [tOurs, tTheirs] = interleaved(
    passes,
    () => {
      ours = cases.map((c) => minimiseSop(c.on, c.dc, c.n, { method, cost }));
    },
    () => {
      theirs = literalsIn.map((c) => referenceEspresso(c.on, c.dc));
    },
  );
  const a = totals(ours);
  const b = {
    terms: theirs.reduce((s, c) => s + c.length, 0),
    literals: theirs.reduce((s, c) => s + c.reduce((q, t) => q + t.length, 0), 0),
  };
  return {
    name: `${label}, ${cases.length} functions, method '${method}': time; terms / literals`,
    figure: `${ms(tOurs)}; ${a.terms} / ${a.literals}`,
    reference: `espresso-iisojs ${ms(tTheirs)}; ${b.terms} / ${b.literals}`,
    ratio: `${(tOurs / tTheirs).toFixed(2)}×`,
    goal: '≤ 2× time, ≤ terms',
  };
}

/**
 * Excitation-like multi-output functions (the encoding search's workload): 4 state bits and
 * 4 inputs, set/reset of each bit plus two outputs (10 functions), rows as cubes.
 */
function excitationCases(rnd: Random, count: number): MultiFunction[] {
  const bits = 4;
  const ins = 4;
  return Array.from({ length: count }, () => {
    const m = 2 * bits + 2;
    const on: string[][] = Array.from({ length: m }, () => []);
    const dc: string[][] = Array.from({ length: m }, () => []);
    for (let s = 0; s < 16; s++) {
      const q = s.toString(2).padStart(bits, '0');
      const a = rnd.int(ins);
      const b = (a + 1 + rnd.int(ins - 1)) % ins;
      const guard = (pairs: [number, string][]): string => {
        const g = Array(ins).fill('-');
        for (const [i, v] of pairs) g[i] = v;
        return g.join('');
      };
      const rows: [string, number][] = [
        [guard([[a, '1']]), rnd.int(16)],
        [
          guard([
            [a, '0'],
            [b, '1'],
          ]),
          rnd.int(16),
        ],
        [
          guard([
            [a, '0'],
            [b, '0'],
          ]),
          s,
        ],
      ];
      const outs = [rnd.int(2), rnd.int(2)];
      rows.forEach(([g, to], k) => {
        const nq = to.toString(2).padStart(bits, '0');
        for (let j = 0; j < bits; j++) {
          if (q[j] === '0' && nq[j] === '1') on[2 * j].push(q + g);
          else if (q[j] === '1' && nq[j] === '1') dc[2 * j].push(q + g);
          if (q[j] === '1' && nq[j] === '0') on[2 * j + 1].push(q + g);
          else if (q[j] === '0' && nq[j] === '0') dc[2 * j + 1].push(q + g);
        }
        if (k === 0 && outs[0]) on[2 * bits].push(q + g);
        if (k < 2 && outs[1]) on[2 * bits + 1].push(q + g);
      });
    }
    return { vars: bits + ins, on, dc };
  });
}

function compareMulti(cases: readonly MultiFunction[], passes: number): MinimiserBenchRow {
  let shared = { terms: 0, literals: 0, connections: 0 };
  let theirs: number[][][][] = [];
  const [tOurs, tTheirs] = interleaved(
    passes,
    () => {
      shared = { terms: 0, literals: 0, connections: 0 };
      for (const f of cases) {
        const s = coverStats(minimiseCover(f));
        shared = {
          terms: shared.terms + s.terms,
          literals: shared.literals + s.literals,
          connections: shared.connections + s.connections,
        };
      }
    },
    () => {
      theirs = cases.map((f) => f.on.map((on, j) => referenceEspresso(on.map(toLiterals), f.dc[j].map(toLiterals))));
    },
  );
  const tTerms = theirs.reduce((s, f) => s + f.reduce((q, c) => q + c.length, 0), 0);
  const tLits = theirs.reduce((s, f) => s + f.reduce((q, c) => q + c.reduce((r, t) => r + t.length, 0), 0), 0);
  return {
    name: `excitation-like, 8 variables × 10 functions, ${cases.length} machines, shared terms (default 'auto'): time per machine; terms / literals / branches`,
    figure: `${ms(tOurs / cases.length)}; ${shared.terms} / ${shared.literals} / ${shared.connections}`,
    reference: `espresso-iisojs one function at a time ${ms(tTheirs / cases.length)}; ${tTerms} / ${tLits} / ${tTerms}`,
    ratio: `${(tOurs / tTheirs).toFixed(2)}×`,
    goal: 'fast: called per candidate encoding',
  };
}

/** The size sweep: per size, how many functions and how many timed passes. */
interface SweepSize {
  readonly n: number;
  readonly functions: number;
  readonly passes: number;
}

const SWEEP: readonly SweepSize[] = [
  { n: 6, functions: 8, passes: 5 },
  { n: 7, functions: 8, passes: 5 },
  { n: 8, functions: 8, passes: 5 },
  { n: 9, functions: 4, passes: 5 },
  { n: 10, functions: 4, passes: 5 },
  { n: 11, functions: 2, passes: 3 },
  { n: 12, functions: 1, passes: 3 },
  // espresso-iisojs takes about half a minute at 13 variables and four at 14: one pass each.
  { n: 13, functions: 1, passes: 1 },
  { n: 14, functions: 1, passes: 1 },
];

const QUICK_SWEEP: readonly SweepSize[] = [
  { n: 6, functions: 4, passes: 3 },
  { n: 8, functions: 4, passes: 3 },
  { n: 10, functions: 2, passes: 3 },
  { n: 11, functions: 1, passes: 1 },
  { n: 12, functions: 1, passes: 1 },
];

/** A random function: each point on with probability 0.3, don't-care with 0.1. */
function denseCase(rnd: Random, n: number): Case {
  const on: string[] = [];
  const dc: string[] = [];
  for (let x = 0; x < 2 ** n; x++) {
    const r = rnd.next();
    const s = x.toString(2).padStart(n, '0');
    if (r < 0.3) on.push(s);
    else if (r < 0.4) dc.push(s);
  }
  return { n, on, dc };
}

/** Points of a cube list as a table (variable 0 the most significant bit). */
function table(n: number, cubes: readonly (readonly number[])[]): Uint8Array {
  const t = new Uint8Array(2 ** n);
  for (const lits of cubes) {
    let care = 0;
    let value = 0;
    for (const l of lits) {
      const bit = 2 ** (n - 1 - (l >> 1));
      care += bit;
      if (l & 1) value += bit;
    }
    for (let x = 0; x < t.length; x++) if ((x & care) === value) t[x] = 1;
  }
  return t;
}

/** Throw unless the cover is 1 on the on-set and 0 off on ∪ dc (checked by truth table). */
function checkCover(c: Case, cover: readonly (readonly number[])[], who: string): void {
  const on = table(c.n, c.on.map(toLiterals));
  const dc = table(c.n, c.dc.map(toLiterals));
  const got = table(c.n, cover);
  for (let x = 0; x < got.length; x++)
    if ((on[x] === 1 && got[x] === 0) || (on[x] === 0 && dc[x] === 0 && got[x] === 1))
      throw new Error(`${who}: wrong cover of a ${c.n}-variable function at point ${x}`);
}

/**
 * One size of the sweep: ours and the reference alternate on the same functions within every
 * pass (so load on a shared machine falls on both), each cover checked by truth table.
 */
function compareSize(size: SweepSize): MinimiserBenchRow {
  const cost = { term: 1000, literal: 1, connection: 0 };
  // One seed per size, so the quick subset times the first functions of the full sweep.
  const rnd = seededRandom(1300 + size.n);
  const cases = Array.from({ length: size.functions }, () => denseCase(rnd, size.n));
  const literalsIn = cases.map((c) => ({ on: c.on.map(toLiterals), dc: c.dc.map(toLiterals) }));
  let ours: number[][][] = [];
  let theirs: number[][][] = [];
  const [to, tt] = interleaved(
    size.passes,
    () => {
      ours = cases.map((c) => minimiseSop(c.on, c.dc, c.n, { cost }).map(toLiterals));
    },
    () => {
      theirs = literalsIn.map((c) => referenceEspresso(c.on, c.dc));
    },
  );
  cases.forEach((c, i) => {
    checkCover(c, ours[i], 'ours');
    checkCover(c, theirs[i], 'espresso-iisojs');
  });
  const count = (cs: number[][][]): { terms: number; literals: number } => ({
    terms: cs.reduce((s, c) => s + c.length, 0),
    literals: cs.reduce((s, c) => s + c.reduce((q, t) => q + t.length, 0), 0),
  });
  const a = count(ours);
  const b = count(theirs);
  return {
    name: `${size.n} variables, ${size.functions} random function${size.functions > 1 ? 's' : ''} (30 % on, 10 % don't-care), method 'auto', median of ${size.passes}: time; terms / literals`,
    figure: `${ms(to)}; ${a.terms} / ${a.literals}`,
    reference: `espresso-iisojs ${ms(tt)}; ${b.terms} / ${b.literals}`,
    ratio: `${(to / tt).toFixed(2)}×`,
    goal: '≤ 1× time, ≤ terms',
  };
}

/** The sweep over sizes, one row per size; progress goes to stderr. */
async function sweep(sizes: readonly SweepSize[]): Promise<MinimiserBenchRow[]> {
  const rows: MinimiserBenchRow[] = [];
  for (const size of sizes) {
    process.stderr.write(`bench: two-level minimiser, ${size.n} variables…\n`);
    rows.push(compareSize(size));
    await new Promise((resolve) => setImmediate(resolve)); // let the progress line out
  }
  return rows;
}

export interface MinimiserBenchOptions {
  /** A subset (sizes up to 12 variables, fewer passes) that runs in well under a minute. */
  readonly quick?: boolean;
}

/** Run every comparison; `markdown` is a table ready for docs/benchmarks.md. */
export async function benchMinimiseLogic(
  opts: MinimiserBenchOptions = { quick: process.argv.includes('--quick') },
): Promise<{ rows: MinimiserBenchRow[]; markdown: string }> {
  const quick = opts.quick === true;
  const passes = quick ? 3 : PASSES;
  const rnd = seededRandom(1984);
  const cubesSet = cubeCases(rnd, quick ? 10 : 40);
  const mintermSet = mintermCases(rnd, quick ? 4 : 12);
  const excitation = excitationCases(rnd, quick ? 4 : 12);
  // Untimed passes warm the JIT for both sides (the encoding search runs warm).
  for (let pass = 0; pass < 3; pass++)
    for (const c of [...cubesSet, ...mintermSet.slice(0, 3)]) {
      minimiseSop(c.on, c.dc, c.n);
      minimiseSop(c.on, c.dc, c.n, { method: 'heuristic' });
      referenceEspresso(c.on.map(toLiterals), c.dc.map(toLiterals));
    }
  for (let pass = 0; pass < 2; pass++) for (const f of excitation) minimiseCover(f);
  const rows = [
    compareSingle('10 variables, on-set as random cubes', cubesSet, 'heuristic', passes),
    compareSingle('10 variables, on-set as random cubes', cubesSet, 'auto', passes),
    compareSingle('10 variables, on-set as random minterms', mintermSet, 'heuristic', passes),
    compareSingle('10 variables, on-set as random minterms', mintermSet, 'auto', passes),
    compareMulti(excitation, passes),
    ...(await sweep(quick ? QUICK_SWEEP : SWEEP)),
  ];
  const markdown = [
    `Each time is the median of ${passes} passes over the whole set (the size sweep: of the passes named in the row); the ratio is ours / espresso-iisojs, measured in the same run, the two alternating within each pass so that load falls on both.${quick ? ' Quick subset (`--quick`).' : ''}`,
    '',
    '| benchmark | ours | espresso-iisojs (same run) | time ratio | goal |',
    '|---|---|---|---|---|',
    ...rows.map((r) => `| ${r.name} | ${r.figure} | ${r.reference} | ${r.ratio} | ${r.goal} |`),
  ].join('\n');
  return { rows, markdown };
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const { markdown } = await benchMinimiseLogic();
  process.stdout.write(markdown + '\n');
}
