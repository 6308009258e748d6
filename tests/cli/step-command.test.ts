/**
 * `latchwright step FILE --inputs SEQ.json --json`: the built machine, stepped clock by clock at
 * part level, against the machine as written. For every example a random input sequence (fixed
 * seed, never-combinations left out) is stepped through the command, and each row's state,
 * outputs and next state are compared with the abstract simulator run on the flattened machine
 * as the file writes it — parsed and flattened here, not taken from the build — through the
 * merge map that `check --json` prints.
 */
import { describe, expect, it } from 'vitest';
import { readMachine } from '../../src/core/forms/detect.js';
import { coverHolds } from '../../src/core/model/cube.js';
import { flatten } from '../../src/core/model/flat.js';
import { seededRandom } from '../../src/core/model/random.js';
import { runAbstract } from '../../src/core/sim/abstract.js';
import { EXAMPLES, examplePath, expectNoStack, readText, run, runJson } from './support.js';

interface StepRow {
  clock: number;
  state: string | null;
  code: string;
  inputs: Record<string, 0 | 1>;
  outputs: Record<string, 0 | 1 | 'X' | '-'>;
  next: string | null;
  nextCode: string;
  alarms: string[];
}

const CLOCKS = 40;

/** A random sequence of input settings, one object per clock, none of them a `never` combination. */
function randomSequence(
  inputs: readonly string[],
  never: readonly string[],
  seed: number,
): { seq: Record<string, 0 | 1>[]; bits: string[] } {
  const rng = seededRandom(seed);
  const seq: Record<string, 0 | 1>[] = [];
  const bits: string[] = [];
  while (seq.length < CLOCKS) {
    const a = inputs.map(() => (rng.int(2) === 1 ? '1' : '0')).join('');
    if (coverHolds(never, a)) continue;
    bits.push(a);
    seq.push(Object.fromEntries(inputs.map((n, i) => [n, a[i] === '1' ? 1 : 0])));
  }
  return { seq, bits };
}

describe('cli/commands/step', () => {
  EXAMPLES.forEach((name, k) => {
    it(`${name}: ${CLOCKS} random clocks at part level match the machine as written, clock by clock`, async () => {
      const file = examplePath(name);
      const parsed = readMachine(readText(file), file);
      expect(parsed.machine).toBeDefined();
      const spec = flatten(parsed.machine!);
      const { seq, bits } = randomSequence(spec.inputs, spec.never, 1000 + k);
      const expected = runAbstract(spec, bits);
      const merged = (await runJson<{ merged: Record<string, string> }>(['check', file, '--json'])).json.merged;

      const files = { 'clocks.json': JSON.stringify(seq) };
      const r = await runJson<StepRow[]>(
        ['step', file, '--inputs', 'clocks.json', '--json', '--encoding', 'binary'],
        files,
      );
      expect(r.code, r.err).toBe(0);
      expect(r.json).toHaveLength(CLOCKS);
      const codeOf = new Map<string, string>();
      r.json.forEach((row, i) => {
        const e = expected[i];
        const at = `clock ${i + 1}`;
        expect(row.clock, at).toBe(i + 1);
        expect(row.inputs, at).toEqual(seq[i]);
        expect(row.state, at).toBe(merged[e.stateName]);
        expect(row.next, at).toBe(merged[e.nextName]);
        spec.outputs.forEach((o, j) => {
          if (e.outputs[j] !== '-') expect(row.outputs[o], `${at} ${o}`).toBe(e.outputs[j]);
        });
        expect(row.alarms, at).toEqual([]);
        // The same state always shows the same code.
        const seen = codeOf.get(row.state!) ?? row.code;
        expect(row.code, at).toBe(seen);
        codeOf.set(row.state!, row.code);
      });

      // The minimised machine itself (--abstract) tells the same story.
      const abs = await runJson<StepRow[]>(
        ['step', file, '--inputs', 'clocks.json', '--json', '--encoding', 'binary', '--abstract'],
        files,
      );
      expect(abs.code).toBe(0);
      expect(abs.json.map((x) => [x.state, x.next])).toEqual(r.json.map((x) => [x.state, x.next]));
    });
  });

  it('without --json: a table, one line per clock', async () => {
    const files = { 'clocks.json': JSON.stringify([{ marble: 1 }, { marble: 1 }, { marble: 1 }, {}]) };
    const r = await run(['step', examplePath('marble-bell'), '--inputs', 'clocks.json', '--encoding', 'binary'], files);
    expect(r.code).toBe(0);
    const lines = r.out.trimEnd().split('\n');
    expect(lines[0].split(/\s+/)).toEqual(['clock', 'state', 'code', 'inputs', 'outputs', 'next', 'alarms']);
    // Three marbles: none → one → two → rung, and the bell shows in rung.
    expect(lines.slice(1).map((l) => l.split(/\s+/).slice(0, 6))).toEqual([
      ['1', 'none', '00', 'marble=1', 'bell=0', 'one'],
      ['2', 'one', '01', 'marble=1', 'bell=0', 'two'],
      ['3', 'two', '10', 'marble=1', 'bell=0', 'rung'],
      ['4', 'rung', '11', 'marble=0', 'bell=1', 'none'],
    ]);
    expectNoStack(r);
  });

  it('gives the same exit status in both modes: 1 for a clock whose inputs are declared impossible', async () => {
    // examples/ferry-gate.lw declares `never visitor & cast_off`.
    const files = { 'clocks.json': JSON.stringify([{ visitor: 1 }, { visitor: 1, cast_off: 1 }]) };
    const argv = ['step', examplePath('ferry-gate'), '--inputs', 'clocks.json', '--encoding', 'binary'];
    const built = await run(argv, files);
    const abstract = await run([...argv, '--abstract'], files);
    expect(built.code).toBe(1);
    expect(abstract.code).toBe(1);
    expect(built.out).toContain('these inputs are declared never to occur');
    expect(abstract.out).toContain('these inputs are declared never to occur');
    const fine = { 'clocks.json': JSON.stringify([{ visitor: 1 }, {}]) };
    expect((await run(argv, fine)).code).toBe(0);
    expect((await run([...argv, '--abstract'], fine)).code).toBe(0);
  });

  it('without --inputs and without a terminal: asks for a sequence file, exit 2', async () => {
    const r = await run(['step', examplePath('marble-bell'), '--encoding', 'binary']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/not at a terminal; give the clocks with --inputs FILE/);
  });
});
