/**
 * Running a machine written from a behaviour side by side with a reference: the same clocks
 * through xstate's own actor (npm package `xstate` 5.33.3, an independent implementation of
 * the state machine, fed the configuration the tool exports) and through the built lever
 * machine (the part-level runner, clocked by the hand procedure). Each returns, per clock,
 * the outputs of that clock, to be compared with a plain function of the input history.
 */
import fc from 'fast-check';
import { expect } from 'vitest';
import { writeBehaviour } from '../../../src/core/behaviours/index.js';
import { clockEvent, exportXstate } from '../../../src/core/forms/xstate.js';
import { analyse, buildMachine, type Analysed, type Built } from '../../../src/core/pipeline.js';
import { createRunner } from '../../../src/core/sim/runner.js';
import { xstateStepper } from '../forms/xstate/harness.js';

/** One clock's inputs: input name → 1 (pulled) or 0. */
export type Clock = Readonly<Record<string, 0 | 1>>;
/** One clock's outputs: output name → 0 or 1. */
export type Shown = Record<string, 0 | 1>;

/** The analysed machine of a behaviour that must be written and read without error. */
export function analysedBehaviour(behaviour: string, values: Readonly<Record<string, string>>): Analysed {
  const w = writeBehaviour(behaviour, values);
  if (!w.ok) throw new Error(`${behaviour} not written: ${w.diagnostics.map((d) => d.message).join('; ')}`);
  const a = analyse(w.text, `${behaviour}.lw`);
  if (!a.ok)
    throw new Error(`${behaviour} does not read: ${a.diagnostics.map((d) => d.message).join('; ')}\n${w.text}`);
  expect(a.diagnostics.filter((d) => d.severity !== 'info')).toEqual([]);
  return a;
}

/** What a behaviour says of parameters it refuses: code, parameter path and whether a hint is given, per diagnostic ([] when written). */
export function refusals(
  behaviour: string,
  values: Readonly<Record<string, string>>,
): [string, string | undefined, boolean][] {
  const w = writeBehaviour(behaviour, values);
  return w.ok ? [] : w.diagnostics.map((d) => [d.code, d.location.path, d.hint !== undefined]);
}

const assignmentOf = (inputs: readonly string[], c: Clock): string => inputs.map((n) => (c[n] ? '1' : '0')).join('');

/** The outputs of each clock as xstate's actor steps the exported configuration (clock form). */
export function throughXstate(a: Analysed, clocks: readonly Clock[]): Shown[] {
  const x = exportXstate(a.machine, { form: 'clock' });
  const step = xstateStepper(
    JSON.parse(JSON.stringify(x.config)) as object,
    x.implementations.guards,
    a.machine.outputs,
  );
  return clocks.map((c) => {
    const seen = step(clockEvent(a.machine.inputs, assignmentOf(a.machine.inputs, c)));
    return Object.fromEntries(a.machine.outputs.map((o, i) => [o, seen.outputs[i] === 1 ? 1 : 0]));
  });
}

/** A build with every check, which must succeed with every check passing. */
export function builtWithChecks(a: Analysed, encoding: 'auto' | 'binary' = 'binary'): Built {
  const b = buildMachine(a, { encoding });
  if (!b.ok) throw new Error(`does not build: ${b.diagnostics.map((d) => d.message).join('; ')}`);
  expect(b.checks.filter((c) => !c.ok).map((c) => c.name)).toEqual([]);
  return b;
}

/** The outputs of each clock as the built lever machine shows them, from reset, by the hand procedure. */
export function throughLevers(b: Built, clocks: readonly Clock[]): Shown[] {
  const r = createRunner(b.build, { stageDelayS: 0.25 });
  r.reset();
  const inputs = b.analysed.machine.inputs;
  return clocks.map((c) => {
    const record = r.clock(Object.fromEntries(inputs.map((n) => [n, c[n] ?? 0])));
    expect(record.alarms).toEqual([]);
    return Object.fromEntries(b.analysed.machine.outputs.map((o) => [o, record.outputs[o] === '1' ? 1 : 0]));
  });
}

/** Clocks where each of `inputs` is pulled with probability about 1/2. */
export function levelClocks(inputs: readonly string[], maxLength = 60): fc.Arbitrary<Clock[]> {
  const clock = fc
    .tuple(...inputs.map(() => fc.boolean()))
    .map((bits) => Object.fromEntries(inputs.map((n, i) => [n, bits[i] ? 1 : 0])) as Clock);
  return fc.array(clock, { minLength: 1, maxLength });
}

/** States before and after the tool's state minimisation: [written, minimised]. */
export function stateCounts(a: Analysed): [number, number] {
  return [a.machine.states.length, a.minimised.machine.states.length];
}
