/**
 * Benchmark of the two-level minimiser against espresso-iisojs (an independent Espresso-II
 * implementation, single-output), on the same random functions (fixed seed), timed in the
 * same run: each time is the median of several passes over the whole set, and the ratio is
 * ours / theirs. Also term and literal totals for both. Called by bench/run.ts; not a test.
 */
import { median as medianOf } from './median.js';
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

export interface MinimiserBenchRow {
  readonly name: string;
  readonly figure: string;
  readonly reference: string;
  readonly ratio: string;
  readonly goal: string;
}

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

const ms = (x: number): string => `${x.toFixed(1)} ms`;

function compareSingle(label: string, cases: readonly Case[], method: MinimiserMethod): MinimiserBenchRow {
  // Same price as the reference's goal: terms first, then literals.
  const cost = { term: 1000, literal: 1, connection: 0 };
  const literalsIn = cases.map((c) => ({ on: c.on.map(toLiterals), dc: c.dc.map(toLiterals) }));
  let ours: string[][] = [];
  let theirs: number[][][] = [];
  const tOurs = medianOf(PASSES, () => {
    ours = cases.map((c) => minimiseSop(c.on, c.dc, c.n, { method, cost }));
  });
  const tTheirs = medianOf(PASSES, () => {
    theirs = literalsIn.map((c) => referenceEspresso(c.on, c.dc));
  });
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

function compareMulti(cases: readonly MultiFunction[]): MinimiserBenchRow {
  let shared = { terms: 0, literals: 0, connections: 0 };
  let theirs: number[][][][] = [];
  const tOurs = medianOf(PASSES, () => {
    shared = { terms: 0, literals: 0, connections: 0 };
    for (const f of cases) {
      const s = coverStats(minimiseCover(f));
      shared = {
        terms: shared.terms + s.terms,
        literals: shared.literals + s.literals,
        connections: shared.connections + s.connections,
      };
    }
  });
  const tTheirs = medianOf(PASSES, () => {
    theirs = cases.map((f) => f.on.map((on, j) => referenceEspresso(on.map(toLiterals), f.dc[j].map(toLiterals))));
  });
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

/** Run every comparison; `markdown` is a table ready for docs/benchmarks.md. */
export function benchMinimiseLogic(): { rows: MinimiserBenchRow[]; markdown: string } {
  const rnd = seededRandom(1984);
  const cubesSet = cubeCases(rnd, 40);
  const mintermSet = mintermCases(rnd, 12);
  const excitation = excitationCases(rnd, 12);
  // Untimed passes warm the JIT for both sides (the encoding search runs warm).
  for (let pass = 0; pass < 3; pass++)
    for (const c of [...cubesSet, ...mintermSet.slice(0, 3)]) {
      minimiseSop(c.on, c.dc, c.n);
      minimiseSop(c.on, c.dc, c.n, { method: 'heuristic' });
      referenceEspresso(c.on.map(toLiterals), c.dc.map(toLiterals));
    }
  for (let pass = 0; pass < 2; pass++) for (const f of excitation) minimiseCover(f);
  const rows = [
    compareSingle('10 variables, on-set as random cubes', cubesSet, 'heuristic'),
    compareSingle('10 variables, on-set as random cubes', cubesSet, 'auto'),
    compareSingle('10 variables, on-set as random minterms', mintermSet, 'heuristic'),
    compareSingle('10 variables, on-set as random minterms', mintermSet, 'auto'),
    compareMulti(excitation),
  ];
  const markdown = [
    `Each time is the median of ${PASSES} passes over the whole set; the ratio is ours / espresso-iisojs, measured in the same run.`,
    '',
    '| benchmark | ours | espresso-iisojs (same run) | time ratio | goal |',
    '|---|---|---|---|---|',
    ...rows.map((r) => `| ${r.name} | ${r.figure} | ${r.reference} | ${r.ratio} | ${r.goal} |`),
  ].join('\n');
  return { rows, markdown };
}
