/**
 * The pipeline: the one place that lists the phases, in order. Reading this file tells a
 * newcomer how the product works; each phase is a pure function in src/core/phases/ with its
 * own output type and a contract comment naming its method.
 *
 *   parse → validate → minimise states → encode → excite → guard → minimise logic → map
 *         → balance drive → check
 *
 * `onPhase` (optional) is told how long each phase took; the benchmarks use it.
 */
import { hasErrors, type Diagnostic } from './model/diagnostics.js';
import type { Machine } from './model/machine.js';
import type { FlatMachine } from './model/flat.js';
import { readMachine, type MachineForm } from './forms/detect.js';
import { validate } from './phases/validate.js';
import { minimiseStates, type StateMinimisation } from './phases/minimise-states/index.js';

export type PhaseHook = (phase: string, millis: number) => void;

export interface AnalyseOptions {
  readonly onPhase?: PhaseHook;
  /** A clock for the phase hook (the core itself never reads the time). */
  readonly now?: () => number;
}

/** A machine that parsed and validated, with its minimised form. */
export interface Analysed {
  readonly ok: true;
  readonly form: MachineForm;
  readonly machine: Machine;
  readonly flat: FlatMachine;
  readonly minimised: StateMinimisation;
  readonly diagnostics: readonly Diagnostic[];
}

/** A machine that did not get through parse and validate. */
export interface Rejected {
  readonly ok: false;
  readonly form: MachineForm;
  readonly diagnostics: readonly Diagnostic[];
}

export function timed<T>(opts: AnalyseOptions, phase: string, run: () => T): T {
  if (!opts.onPhase || !opts.now) return run();
  const t0 = opts.now();
  const out = run();
  opts.onPhase(phase, opts.now() - t0);
  return out;
}

/** parse → validate → minimise states. */
export function analyse(text: string, file?: string, opts: AnalyseOptions = {}): Analysed | Rejected {
  const parsed = timed(opts, 'parse', () => readMachine(text, file));
  if (!parsed.machine || hasErrors(parsed.diagnostics)) return { ok: false, form: parsed.form, diagnostics: parsed.diagnostics };
  const machine = parsed.machine;
  const valid = timed(opts, 'validate', () => validate(machine));
  const diagnostics = [...parsed.diagnostics, ...valid.diagnostics];
  if (!valid.flat || hasErrors(diagnostics)) return { ok: false, form: parsed.form, diagnostics };
  const flat = valid.flat;
  const minimised = timed(opts, 'minimise-states', () => minimiseStates(flat));
  return { ok: true, form: parsed.form, machine, flat, minimised, diagnostics };
}
