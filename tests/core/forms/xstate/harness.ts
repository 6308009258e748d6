/**
 * Side-by-side runners for the xstate interop tests: xstate's own actor (the reference
 * simulator, npm package `xstate` 5.33.3: createMachine, createActor, send, getSnapshot and
 * its inspection events) against our abstract simulator (flatten + stepAbstract).
 *
 * Outputs are read from xstate by the mapping of docs/xstate.md: the state's `meta.outputs`,
 * else 1 for a tag the state carries, else 0; overridden by the `meta.outputs` of the
 * transition xstate reports it took (the `@xstate.microstep` inspection event).
 */
import { createActor, createMachine } from 'xstate';
import { expect } from 'vitest';
import { coverHolds } from '../../../../src/core/model/cube.js';
import type { FlatMachine } from '../../../../src/core/model/flat.js';
import type { Machine, OutBit } from '../../../../src/core/model/machine.js';
import type { Random } from '../../../../src/core/model/random.js';
import { validate } from '../../../../src/core/phases/validate.js';
import { stepAbstract } from '../../../../src/core/sim/abstract.js';

export interface Observed {
  readonly state: string;
  readonly outputs: readonly OutBit[];
}

type OutputsMeta = { outputs?: Record<string, OutBit> } | undefined;
type XsConfig = Parameters<typeof createMachine>[0];
type XsImplementations = Parameters<typeof createMachine>[1];

/** An xstate actor that reports, per event, the state after it and the outputs of that clock. */
export function xstateStepper(config: object, guards: Record<string, unknown>, outputs: readonly string[]) {
  const machine = createMachine(config as XsConfig, { guards } as unknown as XsImplementations);
  let taken: readonly { meta?: unknown }[] = [];
  const actor = createActor(machine, {
    inspect: (ev) => {
      if (ev.type === '@xstate.microstep')
        taken = (ev as unknown as { _transitions: { meta?: unknown }[] })._transitions;
    },
  }).start();
  return (event: { type: string } | null): Observed => {
    const before = actor.getSnapshot();
    const metas = Object.values(before.getMeta() as Record<string, unknown>).map(
      (m) => (m as OutputsMeta)?.outputs ?? {},
    );
    const moore = Object.assign({}, ...metas) as Record<string, OutBit>;
    taken = [];
    // A machine in a top-level final state is stopped: xstate ignores (and warns about) further events.
    if (event && before.status === 'active') actor.send(event);
    expect(actor.getSnapshot().status).not.toBe('error');
    const mealy = (taken[0]?.meta as OutputsMeta)?.outputs ?? {};
    const value = (o: string): OutBit => mealy[o] ?? moore[o] ?? (before.hasTag(o) ? 1 : 0);
    const state = actor.getSnapshot().value; // a flat machine's state value is the state's name
    return { state: typeof state === 'string' ? state : JSON.stringify(state), outputs: outputs.map(value) };
  };
}

/** The flat table of a machine that must validate without errors. */
export function flatOf(m: Machine): FlatMachine {
  const v = validate(m);
  const errors = v.diagnostics.filter((d) => d.severity === 'error');
  expect(errors).toEqual([]);
  if (!v.flat) throw new Error('validate gave no flat table');
  return v.flat;
}

/** Our abstract simulator as a stepper over input assignments. */
export function abstractStepper(f: FlatMachine) {
  let s = f.start;
  return (assignment: string): Observed => {
    const r = stepAbstract(f, s, assignment);
    s = r.next;
    return { state: f.states[s], outputs: r.outputs };
  };
}

/** Our outputs match xstate's where ours are specified ('-' matches either value). */
export function agrees(ours: Observed, theirs: Observed): boolean {
  return ours.state === theirs.state && ours.outputs.every((o, i) => o === '-' || o === theirs.outputs[i]);
}

/** Every input assignment the machine allows (not excluded by `never`). */
export function allowedAssignments(f: FlatMachine): string[] {
  const out: string[] = [];
  for (let m = 0; m < 2 ** f.inputs.length; m++) {
    const s = f.inputs.length === 0 ? '' : m.toString(2).padStart(f.inputs.length, '0');
    if (!coverHolds(f.never, s)) out.push(s);
  }
  return out;
}

/** A random sequence of `length` picks from `choices`. */
export function randomSequence<T>(rng: Random, choices: readonly T[], length: number): T[] {
  return Array.from({ length }, () => choices[rng.int(choices.length)]);
}

/** '0'/'1' string with only lever `i` pulled (i < 0: none). */
export function leverAssignment(n: number, i: number): string {
  return Array.from({ length: n }, (_, k) => (k === i ? '1' : '0')).join('');
}
