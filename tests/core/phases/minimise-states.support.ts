/**
 * Helpers shared by the minimise-states tests: hand-written state tables, random machines,
 * the LGSynth'91 fixtures and two independent ways to check that a reduced machine covers
 * the original (an exact product walk on cubes, and random runs of the abstract simulator).
 */
import { readFileSync } from 'node:fs';
import { coverHolds, overlaps, subtract, mintermString } from '../../../src/core/model/cube.js';
import { DONT_CARE, flatten, rowFor, type FlatMachine, type FlatRow } from '../../../src/core/model/flat.js';
import type { OutBit } from '../../../src/core/model/machine.js';
import { seededRandom } from '../../../src/core/model/random.js';
import { parseJsonMachine } from '../../../src/core/forms/json.js';
import { stepAbstract } from '../../../src/core/sim/abstract.js';
import { randomFlatMachine } from '../../../src/core/sim/random-machine.js';

/**
 * A state table as a textbook prints it: one entry per input combination (counting order,
 * first input most significant), each "next/outputs" with '-' for a free next state or output.
 */
export function tableMachine(spec: {
  inputs: string[];
  outputs: string[];
  start?: string;
  rows: Record<string, string[]>;
}): FlatMachine {
  const states = Object.keys(spec.rows);
  const index = new Map(states.map((s, i) => [s, i]));
  const rows = states.map((s) =>
    spec.rows[s].map((entry, m): FlatRow => {
      const [next, outs] = entry.split('/');
      return {
        cube: mintermString(m, spec.inputs.length),
        next: next === '-' ? DONT_CARE : (index.get(next) as number),
        out: [...outs].map((c): OutBit => (c === '-' ? '-' : c === '1' ? 1 : 0)),
        transition: 0,
      };
    }),
  );
  return {
    name: 'table',
    inputs: spec.inputs,
    outputs: spec.outputs,
    states,
    start: index.get(spec.start ?? states[0]) as number,
    rows,
    never: [],
  };
}

/** A random machine with free next states and outputs sprinkled in (probabilities pNext, pOut). */
export function randomIncomplete(
  seed: number,
  states: number,
  inputs: number,
  outputs: number,
  pNext: number,
  pOut: number,
): FlatMachine {
  const f = randomFlatMachine(states, inputs, outputs, seed);
  const rng = seededRandom(seed ^ 0x5bd1e995);
  return {
    ...f,
    rows: f.rows.map((rs) =>
      rs.map((r) => ({
        ...r,
        next: rng.next() < pNext ? DONT_CARE : r.next,
        out: r.out.map((o) => (rng.next() < pOut ? '-' : o)),
      })),
    ),
  };
}

/** A random completely specified machine with some states copied (so equivalent states exist). */
export function randomWithTwins(seed: number, states: number, inputs: number): FlatMachine {
  const f = randomFlatMachine(states, inputs, 1, seed);
  const rng = seededRandom(seed + 17);
  const twins = 1 + rng.int(Math.max(1, Math.floor(states / 2)));
  const names = [...f.states];
  const rows = f.rows.map((rs) => [...rs]);
  for (let k = 0; k < twins; k++) {
    const of = rng.int(names.length);
    const id = names.length;
    names.push(`${names[of]}_twin${k}`);
    rows.push(rows[of].map((r) => ({ ...r })));
    // Send some transitions to the twin instead of the original.
    for (const rs of rows)
      for (let i = 0; i < rs.length; i++) if (rs[i].next === of && rng.int(2) === 1) rs[i] = { ...rs[i], next: id };
  }
  return { ...f, states: names, rows };
}

/**
 * Exact check that `reduced` covers `original` from the start states: walk every reachable
 * pair (original state, reduced state) on overlapping row cubes; wherever the original
 * specifies an output the reduced machine must give it, and wherever the original specifies
 * the next state the reduced machine must specify one too. Returns a description of the first
 * violation, or null.
 */
export function coverViolation(original: FlatMachine, reduced: FlatMachine): string | null {
  const seen = new Set<string>();
  const stack: [number, number][] = [[original.start, reduced.start]];
  while (stack.length > 0) {
    const [s, t] = stack.pop() as [number, number];
    const k = `${s},${t}`;
    if (seen.has(k)) continue;
    seen.add(k);
    for (const r of original.rows[s]) {
      const where = `original ${original.states[s]} / reduced ${reduced.states[t]} on ${r.cube}`;
      const mine = reduced.rows[t].filter((q) => overlaps(q.cube, r.cube));
      if (
        subtract(
          [r.cube],
          mine.map((q) => q.cube),
        ).length > 0
      )
        return `${where}: reduced rows leave inputs out`;
      for (const q of mine) {
        if (r.out.some((o, i) => o !== '-' && q.out[i] !== o))
          return `${where}: outputs ${r.out.join('')} vs ${q.out.join('')}`;
        if (r.next === DONT_CARE) continue;
        if (q.next === DONT_CARE) return `${where}: reduced next state free`;
        stack.push([r.next, q.next]);
      }
    }
  }
  return null;
}

/**
 * Random runs through the abstract simulator (stepAbstract): count clocks where the original
 * specifies an output and the reduced machine gives another. A run stops where the original
 * leaves its next state free (nothing after it is specified).
 */
export function randomRunMismatches(
  original: FlatMachine,
  reduced: FlatMachine,
  seed: number,
  runs: number,
  length: number,
): number {
  const rng = seededRandom(seed);
  let bad = 0;
  for (let k = 0; k < runs; k++) {
    let s = original.start;
    let t = reduced.start;
    for (let c = 0; c < length; c++) {
      let a = '';
      for (let tries = 0; tries < 100; tries++) {
        a = Array.from({ length: original.inputs.length }, () => String(rng.int(2))).join('');
        if (!coverHolds(original.never, a)) break;
      }
      const row = rowFor(original, s, a);
      if (row === undefined) break;
      const o = stepAbstract(original, s, a);
      const r = stepAbstract(reduced, t, a);
      if (o.outputs.some((v, i) => v !== '-' && v !== r.outputs[i])) bad++;
      if (row.next === DONT_CARE) break;
      s = o.next;
      t = r.next;
    }
  }
  return bad;
}

const FIXTURES = new URL('../../fixtures/lgsynth91/', import.meta.url);

/** One row of TABLE.md (MCNC / LGSynth'91 reference figures). */
export interface BenchmarkFigures {
  readonly name: string;
  readonly states: number;
  readonly reachable: number | null;
  readonly complete: boolean;
  readonly minimal: number | null;
}

/** Parse tests/fixtures/lgsynth91/TABLE.md (columns: name | inputs | outputs | states | reachable | specification | minimal states). */
export function benchmarkTable(): BenchmarkFigures[] {
  const text = readFileSync(new URL('TABLE.md', FIXTURES), 'utf8');
  const num = (s: string): number | null => (s.trim() === '' ? null : Number(s));
  return text
    .split('\n')
    .map((l) => l.split('|').map((c) => c.trim()))
    .filter((c) => c.length >= 8 && /^[a-z]/.test(c[1]) && /^\d+$/.test(c[4]))
    .map((c) => ({
      name: c[1],
      states: Number(c[4]),
      reachable: num(c[5]),
      complete: c[6] === 'complete',
      minimal: num(c[7]),
    }));
}

/** A benchmark machine from the fixtures, parsed by the JSON form and flattened. */
export function benchmarkMachine(name: string): FlatMachine {
  const result = parseJsonMachine(readFileSync(new URL(`${name}.json`, FIXTURES), 'utf8'), `${name}.json`);
  if (result.machine === undefined) throw new Error(`${name}: ${result.diagnostics.map((d) => d.message).join('; ')}`);
  return flatten(result.machine);
}
