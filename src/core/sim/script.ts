/**
 * Scripted stepping, the engine of the `step` command: a sequence of input settings, one per
 * clock, run through the built machine (part level: reset, then the two-phase hand procedure
 * per clock on the part simulator) or through the minimised machine itself (abstract level).
 * Each clock gives one row: the state and code before it, the inputs, the outputs shown while
 * those inputs are held before φ1, the state after φ2, and the alarms in words.
 */
import { coverHolds } from '../model/cube.js';
import type { Build } from '../model/build.js';
import { diag, type Diagnostic } from '../model/diagnostics.js';
import { ownValue } from '../model/records.js';
import { stepAbstract } from './abstract.js';
import { assignmentOf, type InputValues } from './hand.js';
import type { PartTiming } from './compile.js';
import { createRunner } from './runner.js';

/** One object per clock: input name → 0/1 (a missing input is released, 0). */
export type SeqArray = readonly InputValues[];

/** An output as a row shows it. */
export type ShownValue = 0 | 1 | 'X' | '-';

/** '0' → 0, '1' → 1; 'X' and '-' stay words. */
function shown(v: string): ShownValue {
  return v === '0' ? 0 : v === '1' ? 1 : v === '-' ? '-' : 'X';
}

export interface StepRow {
  /** Clock number, from 1. */
  readonly clock: number;
  /** State before the clock (null: an unused or undetermined code). */
  readonly state: string | null;
  readonly code: string;
  readonly inputs: InputValues;
  /** Outputs shown while the inputs are held, before φ1: 0, 1, 'X' (undetermined) or '-' (free in the spec, abstract level). */
  readonly outputs: Readonly<Record<string, ShownValue>>;
  /** State after φ2 is released. */
  readonly next: string | null;
  readonly nextCode: string;
  readonly alarms: readonly string[];
}

/** Check a parsed sequence file: an array of objects whose keys are input names and whose values are 0 or 1. */
export function validateSequence(build: Build, seq: unknown, file?: string): Diagnostic[] {
  const inputs = build.machine.inputs;
  const at = (path: string): { file?: string; path: string } => (file === undefined ? { path } : { file, path });
  if (!Array.isArray(seq))
    return [
      diag(
        'LW103',
        'the input sequence must be a JSON array with one object per clock',
        at('$'),
        'write [{"coin": 1}, {}, …]',
      ),
    ];
  const out: Diagnostic[] = [];
  seq.forEach((row: unknown, i) => {
    if (typeof row !== 'object' || row === null || Array.isArray(row)) {
      out.push(
        diag(
          'LW103',
          `clock ${i + 1} of the input sequence is not an object of input settings`,
          at(`$[${i}]`),
          'write {"input": 1, …}',
        ),
      );
      return;
    }
    for (const [k, v] of Object.entries(row)) {
      if (!inputs.includes(k))
        out.push(
          diag(
            'LW208',
            `clock ${i + 1} sets '${k}', which is not an input of ${build.machine.name}`,
            at(`$[${i}].${k}`),
            `inputs: ${inputs.join(', ') || '(none)'}`,
          ),
        );
      else if (v !== 0 && v !== 1)
        out.push(diag('LW103', `clock ${i + 1} sets '${k}' to ${JSON.stringify(v)}; use 0 or 1`, at(`$[${i}].${k}`)));
    }
  });
  return out;
}

/** The words of the never warning, when the inputs are ones the spec declares impossible. */
function neverWords(build: Build, assignment: string): string[] {
  return coverHolds(build.machine.never, assignment) ? ['these inputs are declared never to occur'] : [];
}

/** Run a sequence on the built machine at part level, from reset. */
export function runPartScript(build: Build, seq: SeqArray, timing: PartTiming): StepRow[] {
  const runner = createRunner(build, timing);
  const resetAlarms = runner.reset().map((e) => e.words);
  const inputs = build.machine.inputs;
  return seq.map((values, i) => {
    const r = runner.clock(values);
    const all = { ...Object.fromEntries(inputs.map((n) => [n, 0 as const])), ...values };
    return {
      clock: i + 1,
      state: r.before.state,
      code: r.before.code,
      inputs: all,
      outputs: Object.fromEntries(Object.entries(r.outputs).map(([o, v]) => [o, shown(v)])),
      next: r.after.state,
      nextCode: r.after.code,
      alarms: [
        ...(i === 0 ? resetAlarms : []),
        ...neverWords(build, assignmentOf(inputs, values)),
        ...r.alarms.map((e) => e.words),
      ],
    };
  });
}

/** Run a sequence on the minimised machine itself (no parts). */
export function runAbstractScript(build: Build, seq: SeqArray): StepRow[] {
  const f = build.machine;
  const codes = build.encoding.codes;
  let state = f.start;
  return seq.map((values, i) => {
    const a = assignmentOf(f.inputs, values);
    const { next, outputs } = stepAbstract(f, state, a);
    const row: StepRow = {
      clock: i + 1,
      state: f.states[state],
      code: codes[state] ?? '',
      inputs: Object.fromEntries(f.inputs.map((n) => [n, ownValue(values, n) ?? 0])),
      outputs: Object.fromEntries(f.outputs.map((o, k) => [o, shown(String(outputs[k]))])),
      next: f.states[next],
      nextCode: codes[next] ?? '',
      alarms: neverWords(build, a),
    };
    state = next;
    return row;
  });
}
