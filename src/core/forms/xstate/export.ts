/**
 * Export a Machine as an xstate v5 configuration plus the guard implementations it names,
 * such that `createMachine(config, implementations)` steps like the machine, clock by clock
 * (the mapping is documented in docs/xstate.md).
 *
 * Two forms:
 *   - levers: one event type per input, for machines shaped like an xstate import (every pair
 *     of levers is excluded by `never`, and a clock with no lever pulled stays in the state).
 *     Built from the flat table (flat.ts): per state, the row of each single pulled lever.
 *     A clock with no lever pulled is "send nothing".
 *   - clock: one event per clock, `{ type: 'CLOCK', inputs: { a: 1, b: 0 } }`; each state's
 *     transitions become guarded candidates in the machine's first-match order, every guard a
 *     reference `{ type: 'holds', params: { cubes } }` to one implementation that evaluates
 *     the cover against the event's inputs. When no candidate holds, xstate ignores the event
 *     and the machine stays: that is the `hold` rule (and a valid choice for `dont-care`).
 * Outputs travel in `meta.outputs`, always naming every output: on a state, the values while
 * no transition is taken; on a transition, the values while it is taken.
 *
 * Preconditions: the machine is validated (every transition names a state; names are unique).
 * Postconditions: the config is plain JSON data; the behaviour on input combinations that the
 * machine's `never` list excludes is whatever the candidates give (the machine leaves it open).
 */
import { coverContains, universe, type Cube } from '../../model/cube.js';
import { DONT_CARE, flatten, rowFor, type FlatMachine } from '../../model/flat.js';
import { transitionOutputs, type Machine, type OutBit } from '../../model/machine.js';
import {
  CLOCK_EVENT,
  HOLDS_GUARD,
  type XstateConfig,
  type XstateForm,
  type XstateGuardFn,
  type XstateStateConfig,
  type XstateTransitionConfig,
} from './types.js';

export interface XstateExport {
  readonly form: XstateForm;
  readonly config: XstateConfig;
  /** Pass as the second argument of xstate's `createMachine`. */
  readonly implementations: { readonly guards: Readonly<Record<string, XstateGuardFn>> };
}

export interface XstateExportOptions {
  /** `auto` (default): the levers form when the machine has the lever shape, else the clock form. */
  readonly form?: 'auto' | 'clock';
}

/** Export a validated machine as an xstate configuration and its guard implementations. */
export function exportXstate(m: Machine, options: XstateExportOptions = {}): XstateExport {
  const f = flatten(m);
  if ((options.form ?? 'auto') === 'auto' && hasLeverShape(f)) {
    return { form: 'levers', config: leversConfig(m, f), implementations: { guards: {} } };
  }
  return { form: 'clock', config: clockConfig(m), implementations: { guards: clockGuards(m.inputs) } };
}

/** The one guard implementation of the clock form, for a machine with these inputs (in cube order). */
export function clockGuards(inputs: readonly string[]): Record<string, XstateGuardFn> {
  const holds: XstateGuardFn = ({ event }, params) => {
    const cubes = isRecord(params) && Array.isArray(params.cubes) ? params.cubes : [];
    const assignment = clockAssignment(inputs, event);
    return cubes.some(
      (c) =>
        typeof c === 'string' &&
        c.length === inputs.length &&
        [...c].every((ch, i) => ch === '-' || ch === assignment[i]),
    );
  };
  return { [HOLDS_GUARD]: holds };
}

/** The clock-form event for a full input assignment ('0'/'1' per input, in input order). */
export function clockEvent(
  inputs: readonly string[],
  assignment: string,
): { type: typeof CLOCK_EVENT; inputs: Record<string, 0 | 1> } {
  return { type: CLOCK_EVENT, inputs: Object.fromEntries(inputs.map((n, i) => [n, assignment[i] === '1' ? 1 : 0])) };
}

/** Read an event's inputs as an assignment string: 1 or true is pulled; anything else (or missing) is released. */
function clockAssignment(inputs: readonly string[], event: unknown): string {
  const values = isRecord(event) && isRecord(event.inputs) ? event.inputs : {};
  return inputs
    .map((n) =>
      Object.prototype.hasOwnProperty.call(values, n) && (values[n] === 1 || values[n] === true) ? '1' : '0',
    )
    .join('');
}

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null;
}

/** A record of every output (built with fromEntries, so that any name becomes an own property). */
function outputsRecord(names: readonly string[], values: readonly OutBit[]): Record<string, OutBit> {
  return Object.fromEntries(names.map((n, i) => [n, values[i]]));
}

const oneHot = (n: number, i: number): string => '0'.repeat(i) + '1' + '0'.repeat(n - i - 1);

/** Every pair of inputs is excluded by `never`, and with no lever pulled every state stays. */
export function hasLeverShape(f: FlatMachine): boolean {
  const n = f.inputs.length;
  for (let a = 0; a < n; a++) {
    for (let b = a + 1; b < n; b++) {
      const pair: Cube = universe(n).slice(0, a) + '1' + universe(n).slice(a + 1, b) + '1' + universe(n).slice(b + 1);
      if (!coverContains(f.never, [pair])) return false;
    }
  }
  const zero = '0'.repeat(n);
  return f.states.every((_, s) => {
    const r = rowFor(f, s, zero);
    return r === undefined || r.next === s || r.next === DONT_CARE;
  });
}

function leversConfig(m: Machine, f: FlatMachine): XstateConfig {
  const n = f.inputs.length;
  const states = m.states.map((s, si): [string, XstateStateConfig] => {
    const rest = rowFor(f, si, '0'.repeat(n));
    const stay = rest ? rest.out : m.outputs.map((o) => s.outputs[o] ?? 0);
    const on: [string, XstateTransitionConfig][] = [];
    f.inputs.forEach((lever, i) => {
      const r = rowFor(f, si, oneHot(n, i));
      if (!r) return; // this lever alone cannot be pulled
      const moves = r.next !== si && r.next !== DONT_CARE;
      if (!moves && r.out.every((v, k) => v === stay[k])) return; // same as not answering: xstate ignores the event
      on.push([
        lever,
        { ...(moves ? { target: f.states[r.next] } : {}), meta: { outputs: outputsRecord(m.outputs, r.out) } },
      ]);
    });
    return [
      s.name,
      {
        ...finalType(s.final, on.length),
        meta: { outputs: outputsRecord(m.outputs, stay) },
        ...(on.length ? { on: Object.fromEntries(on) } : {}),
      },
    ];
  });
  return header(m, 'levers', Object.fromEntries(states));
}

function clockConfig(m: Machine): XstateConfig {
  const n = m.inputs.length;
  const states = m.states.map((s): [string, XstateStateConfig] => {
    const candidates: XstateTransitionConfig[] = [];
    for (const t of s.transitions) {
      if (t.when.cubes.length === 0) continue; // never holds
      const always = t.when.cubes.includes(universe(n));
      candidates.push({
        ...(t.to !== s.name ? { target: t.to } : {}),
        ...(always ? {} : { guard: { type: HOLDS_GUARD, params: { cubes: [...t.when.cubes] } } }),
        description: `when ${t.when.text}`,
        meta: { outputs: outputsRecord(m.outputs, transitionOutputs(m, s, t)) },
      });
      if (always) break; // later transitions can never fire
    }
    return [
      s.name,
      {
        ...finalType(s.final, candidates.length),
        meta: {
          outputs: outputsRecord(
            m.outputs,
            m.outputs.map((o) => s.outputs[o] ?? 0),
          ),
        },
        ...(candidates.length ? { on: { [CLOCK_EVENT]: candidates } } : {}),
      },
    ];
  });
  return header(m, 'clock', Object.fromEntries(states));
}

/** `type: "final"` for a state marked final that answers to nothing (xstate takes no transition out of a final state). */
function finalType(final: boolean | undefined, answers: number): { type?: 'final' } {
  return final === true && answers === 0 ? { type: 'final' } : {};
}

function header(m: Machine, form: XstateForm, states: Record<string, XstateStateConfig>): XstateConfig {
  return {
    id: m.name,
    initial: m.start,
    ...(m.description !== undefined ? { description: m.description } : {}),
    meta: {
      form,
      inputs: [...m.inputs],
      outputNames: [...m.outputs],
      ...(m.loadsG && Object.keys(m.loadsG).length > 0 ? { loadsG: { ...m.loadsG } } : {}),
    },
    states,
  };
}
