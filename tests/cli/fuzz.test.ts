/**
 * Fuzzing the command line with broken machines: every example (examples/*.lw, our own
 * scenarios) in all three forms — the text form as written, the JSON form from the JSON
 * printer, an xstate configuration from the xstate exporter — mutated at random (seeded, so
 * every run of the suite sees the same inputs) and read by `check` (and now and then built),
 * in-process. Whatever the input, the tool must answer with exit 0 (a machine that stayed
 * valid), 1 (a check failed) or 2 with coded diagnostics that each name a file and a place —
 * never a stack trace, never an uncoded or internal error (LW900), never a control character
 * on the terminal.
 *
 * The suite's run is fixed and small (a few seconds). LW_FUZZ_RUNS=N runs N mutations per
 * example and form instead (and builds more of the valid ones), and LW_FUZZ_SEED=N another
 * seed, for a longer run by hand; such a run prints its slowest inputs (no test here measures
 * time: each run's work is bounded by the fixed number of mutants).
 */
import { afterAll, describe, expect, it } from 'vitest';
import { exportXstate, machineToJson, parseTextMachine, seededRandom, type Random } from '../../src/core/index.js';
import { EXAMPLES, examplePath, readText, run, type Run } from './support.js';

const RUNS = Number(process.env.LW_FUZZ_RUNS ?? 0) || 12;
/** The seed; LW_FUZZ_SEED=N gives another fixed sequence of mutants, for a run by hand. */
const SEED = Number(process.env.LW_FUZZ_SEED ?? 0) || 0x5eed;
const LONG = process.env.LW_FUZZ_RUNS !== undefined;
/** Build one valid mutant in this many (builds take far longer than checks). */
const BUILD_EVERY = LONG ? 5 : 40;

// eslint-disable-next-line no-control-regex -- looking for control characters is the point
const CONTROL = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f]/;

/** Pieces of text a careless or hostile user might put anywhere. */
const JUNK = [
  '\u0000',
  '\u0007',
  '\u001b[2J',
  '\u001b]0;title\u0007',
  '\u009b31m',
  '\u202e',
  '\ufeff',
  '\r',
  '\r\n',
  '\n\n',
  '\t',
  '{',
  '}',
  '[',
  ']',
  '"',
  "'",
  ',',
  ':',
  '=',
  '#',
  '!',
  '&',
  '|',
  '^',
  '(',
  ')',
  '-',
  '0',
  '1',
  'state',
  'go',
  'when',
  'with',
  'code',
  'machine',
  'inputs',
  'outputs',
  'start',
  'never',
  'unspecified dont-care',
  '__proto__',
  'constructor',
  'toString',
  'hasOwnProperty',
  '1e309',
  '-1e999',
  '9007199254740993',
  '-0',
  'NaN',
  'null',
  'true',
  'φ₁',
  '😀',
  '('.repeat(2000),
  ')'.repeat(300),
  '!'.repeat(5000),
  'x'.repeat(5000),
  '[{'.repeat(3000),
  '"' + 'y'.repeat(3000) + '"',
];

const pick = <T>(rng: Random, xs: readonly T[]): T => xs[rng.int(xs.length)];

/** Text mutations: delete, duplicate, insert junk, swap lines, truncate, replace a word, change case. */
const TEXT_MUTATIONS: ((s: string, rng: Random) => string)[] = [
  (s, rng) => {
    const i = rng.int(s.length + 1);
    return s.slice(0, i) + s.slice(i + 1 + rng.int(20));
  },
  (s, rng) => {
    const i = rng.int(s.length + 1);
    const j = Math.min(s.length, i + rng.int(60));
    return s.slice(0, j) + s.slice(i, j) + s.slice(j);
  },
  (s, rng) => {
    const i = rng.int(s.length + 1);
    return s.slice(0, i) + pick(rng, JUNK) + s.slice(i);
  },
  (s, rng) => {
    const lines = s.split('\n');
    const a = rng.int(lines.length);
    const b = rng.int(lines.length);
    [lines[a], lines[b]] = [lines[b], lines[a]];
    return lines.join('\n');
  },
  (s, rng) => s.slice(0, rng.int(s.length + 1)),
  (s, rng) => {
    const words = s.match(/[A-Za-z_][A-Za-z0-9_]*/g) ?? ['x'];
    const from = pick(rng, words);
    const to = rng.int(2) === 0 ? pick(rng, words) : pick(rng, JUNK);
    return s.replace(from, to);
  },
  (s, rng) => {
    const i = rng.int(s.length + 1);
    const j = Math.min(s.length, i + rng.int(40));
    return s.slice(0, i) + s.slice(i, j).toUpperCase() + s.slice(j);
  },
];

/** A value of any JSON type, some of them awkward. */
function junkValue(rng: Random): unknown {
  const k = rng.int(12);
  if (k === 0) return null;
  if (k === 1) return rng.int(2) === 0;
  if (k === 2) return pick(rng, [0, 1, -1, 2, 0.5, 1e308, -0]);
  if (k === 3) return pick(rng, JUNK);
  if (k === 4) return [];
  if (k === 5) return {};
  if (k === 6) return [pick(rng, JUNK), 1];
  if (k === 7) return { [pick(rng, JUNK)]: pick(rng, JUNK) };
  if (k === 8) return JSON.parse('['.repeat(200) + ']'.repeat(200)) as unknown;
  if (k === 9) return 'z'.repeat(rng.int(3) * 4000);
  if (k === 10) return { target: pick(rng, JUNK), meta: { outputs: { [pick(rng, JUNK)]: 2 } } };
  return pick(rng, ['-', '', 'a & ', '((a)', 'marble | !', 'hold', 'dont-care']);
}

type Json = unknown;

/** Every object and array in a JSON value, with the value itself. */
function containers(v: Json, out: (Record<string, Json> | Json[])[] = []): (Record<string, Json> | Json[])[] {
  if (Array.isArray(v)) {
    out.push(v);
    for (const x of v) containers(x, out);
  } else if (typeof v === 'object' && v !== null) {
    out.push(v as Record<string, Json>);
    for (const x of Object.values(v)) containers(x, out);
  }
  return out;
}

/** Structural mutations of a decoded JSON machine: drop, retype, rename or repeat a member. */
function mutateJson(value: Json, rng: Random): Json {
  const all = containers(value);
  const c = pick(rng, all);
  if (Array.isArray(c)) {
    const i = rng.int(c.length + 1);
    const how = rng.int(3);
    if (how === 0 && c.length > 0) c.splice(i % c.length, 1);
    else if (how === 1 && c.length > 0) c.splice(i, 0, structuredClone(c[i % c.length]));
    else c.splice(i, 0, junkValue(rng));
    return value;
  }
  const keys = Object.keys(c);
  const key = keys.length > 0 ? pick(rng, keys) : 'states';
  const how = rng.int(4);
  if (how === 0) delete c[key];
  else if (how === 1) c[key] = junkValue(rng);
  else {
    // Rename (or add) a key, keeping the order; defineProperty so that `__proto__` is a plain key.
    const renamed = how === 2 ? pick(rng, [...JUNK.slice(30, 46), key + 's', key.toUpperCase()]) : key;
    const entries = Object.entries(c).map(([k, v]): [string, Json] => [k === key ? renamed : k, v]);
    for (const k of Object.keys(c)) delete c[k];
    for (const [k, v] of entries)
      Object.defineProperty(c, k, { value: v, enumerable: true, writable: true, configurable: true });
  }
  return value;
}

interface Case {
  readonly name: string;
  readonly form: 'text' | 'json' | 'xstate';
  readonly text: string;
}

/** The examples in the three forms. */
function bases(): Case[] {
  return EXAMPLES.flatMap((name): Case[] => {
    const text = readText(examplePath(name));
    const m = parseTextMachine(text).machine;
    if (!m) throw new Error(`example ${name} does not parse`);
    return [
      { name, form: 'text', text },
      { name, form: 'json', text: JSON.stringify(machineToJson(m), null, 2) },
      { name, form: 'xstate', text: JSON.stringify(exportXstate(m).config, null, 2) },
    ];
  });
}

function mutate(c: Case, rng: Random): string {
  let text = c.text;
  const rounds = 1 + rng.int(3);
  for (let k = 0; k < rounds; k++) {
    if (c.form !== 'text' && rng.int(2) === 0) {
      try {
        text = JSON.stringify(mutateJson(JSON.parse(text), rng), null, rng.int(2) * 2);
        continue;
      } catch {
        // an earlier round broke the JSON: mutate the text instead
      }
    }
    text = pick(rng, TEXT_MUTATIONS)(text, rng);
  }
  return text;
}

interface Diag {
  code: string;
  severity: string;
  message: string;
  location: { file?: string; line?: number; column?: number; path?: string };
}

/**
 * What every answer must be, whatever the input. Every diagnostic names the file; those of
 * reading (`placed`) also a line or a JSON path — a build's remarks about the whole machine
 * (LW701, LW703) have the file alone.
 */
function expectAnswer(r: Run, file: string, label: string, placed = true): { ok: boolean; diagnostics: Diag[] } {
  const seen = r.out + r.err;
  expect(seen, label).not.toMatch(/^ {4}at \S.*:\d+:\d+\)?$/m);
  expect(seen, label).not.toMatch(/internal error|LW900/);
  expect(seen, label).not.toMatch(CONTROL);
  expect([0, 1, 2], label).toContain(r.code);
  expect(r.err, label).toBe('');
  const doc = JSON.parse(r.out) as { ok: boolean; diagnostics: Diag[] };
  for (const d of doc.diagnostics) {
    expect(d.code, label).toMatch(/^LW\d{3}$/);
    expect(['error', 'warning', 'info'], label).toContain(d.severity);
    expect(d.location.file, `${label}: ${d.code} names no file`).toBe(file);
    if (placed)
      expect(d.location.line !== undefined || d.location.path !== undefined, `${label}: ${d.code} has no place`).toBe(
        true,
      );
    expect(d.message.length, label).toBeLessThan(1000);
  }
  if (r.code === 2) {
    expect(doc.ok, label).toBe(false);
    expect(
      doc.diagnostics.some((d) => d.severity === 'error'),
      `${label}: exit 2 with no error`,
    ).toBe(true);
  }
  return doc;
}

const slowest: { ms: number; label: string }[] = [];

afterAll(() => {
  if (!LONG) return;
  slowest.sort((a, b) => b.ms - a.ms);
  console.log(`fuzz: ${RUNS} mutations per example and form; slowest:`);
  for (const s of slowest.slice(0, 10)) console.log(`  ${s.ms.toFixed(0)} ms  ${s.label}`);
});

describe('cli: fuzzed machines (seeded mutations of every example, in-process)', () => {
  const cases = bases();

  it('has every example in all three forms, each read cleanly before it is mutated', async () => {
    expect(cases).toHaveLength(EXAMPLES.length * 3);
    for (const c of cases.filter((x) => x.form !== 'xstate')) {
      const file = `${c.name}.${c.form === 'text' ? 'lw' : 'json'}`;
      expect((await run(['check', file, '--json'], { [file]: c.text })).code, file).toBe(0);
    }
  });

  for (const c of cases) {
    it(`${c.name} (${c.form}): ${RUNS} mutants answered with a code and a place`, async () => {
      const rng = seededRandom(SEED ^ (c.name.length * 7919) ^ ['text', 'json', 'xstate'].indexOf(c.form));
      const file = `${c.name}${c.form === 'text' ? '.lw' : c.form === 'json' ? '.json' : '.xstate.json'}`;
      let valid = 0;
      for (let k = 0; k < RUNS; k++) {
        const text = mutate(c, rng);
        const label = `${file} mutant ${k}`;
        const t0 = performance.now();
        const r = await run(['check', file, '--json'], { [file]: text });
        if (LONG) slowest.push({ ms: performance.now() - t0, label });
        const doc = expectAnswer(r, file, label);
        // The same input as text on the terminal: diagnostics on standard error, nothing raw.
        if (k % 4 === 0) {
          const t = await run(['check', file], { [file]: text });
          expect(t.out + t.err, label).not.toMatch(CONTROL);
          expect(t.code, label).toBe(r.code);
        }
        if (doc.ok && ++valid % BUILD_EVERY === 1) {
          const b = await run(['build', file, '--json', '--encoding', 'binary'], { [file]: text });
          expectAnswer(b, file, `${label} (build)`, false);
        }
      }
    });
  }
});
