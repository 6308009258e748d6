/**
 * Random test inputs for the xstate interop (invented data, driven by seededRandom): flat
 * xstate configurations inside the supported subset, and random Machines, general or shaped
 * like an xstate import (one lever per clock).
 */
import { alwaysGuard, parseGuard } from '../../../../src/core/forms/expr.js';
import type { Guard, Machine, OutBit, State, Transition } from '../../../../src/core/model/machine.js';
import type { Random } from '../../../../src/core/model/random.js';

const pick = <T>(rng: Random, xs: readonly T[]): T => xs[rng.int(xs.length)];
const bit = (rng: Random): OutBit => pick(rng, [0, 1, '-'] as const);

/** A flat xstate config using every supported construct: target spellings, arrays, targetless, root `on`, tags, Mealy and Moore meta, custom ids, final states. */
export function randomFlatConfig(rng: Random): Record<string, unknown> {
  const n = 1 + rng.int(5);
  const events = ['press', 'coin', 'turn', 'drop'].slice(0, 1 + rng.int(4));
  const id = rng.int(2) === 0 ? 'gate' : undefined;
  const rootRef = id ?? '(machine)';
  const custom = Array.from({ length: n }, () => rng.int(3) === 0);
  const refs = (j: number, fromRoot: boolean): string[] => [
    fromRoot ? `.s${j}` : `s${j}`,
    `#${rootRef}.s${j}`,
    ...(custom[j] ? [`#k${j}`] : []),
  ];
  const outputs = (): Record<string, OutBit> =>
    Object.fromEntries(['o1', 'o2'].filter(() => rng.int(2) === 0).map((o) => [o, bit(rng)]));
  const single = (fromRoot: boolean): unknown => {
    const target = pick(rng, refs(rng.int(n), fromRoot));
    switch (rng.int(4)) {
      case 0:
        return target;
      case 1:
        return { target };
      case 2:
        return { target, meta: { outputs: outputs() }, description: 'invented' };
      default:
        return rng.int(2) === 0 ? {} : { meta: { outputs: outputs() } };
    }
  };
  const candidates = (fromRoot: boolean): unknown => {
    const r = rng.int(8);
    if (r === 0) return [];
    if (r === 1) return [single(fromRoot), single(fromRoot)];
    return single(fromRoot);
  };
  const on = (fromRoot: boolean): Record<string, unknown> =>
    Object.fromEntries(events.filter(() => rng.int(3) !== 0).map((e) => [e, candidates(fromRoot)]));
  const states = Object.fromEntries(
    Array.from({ length: n }, (_, i) => {
      const final = i > 0 && rng.int(6) === 0;
      const s: Record<string, unknown> = final ? { type: 'final' } : { on: on(false) };
      if (custom[i]) s.id = `k${i}`;
      if (rng.int(2) === 0) s.meta = { outputs: outputs() };
      if (rng.int(3) === 0) s.tags = rng.int(2) === 0 ? 't1' : ['t1', 't2'].filter(() => rng.int(2) === 0);
      return [`s${i}`, s];
    }),
  );
  return {
    ...(id ? { id } : {}),
    initial: `s${rng.int(n)}`,
    ...(rng.int(2) === 0 ? { on: on(true) } : {}),
    ...(rng.int(5) === 0 ? { tags: ['t2'] } : {}),
    states,
  };
}

function randomExpr(rng: Random, inputs: readonly string[], depth: number): string {
  if (depth === 0 || rng.int(3) === 0) {
    if (inputs.length === 0 || rng.int(10) === 0) return pick(rng, ['0', '1']);
    return (rng.int(3) === 0 ? '!' : '') + pick(rng, inputs);
  }
  const op = pick(rng, [' & ', ' | ', ' ^ ']);
  return `(${randomExpr(rng, inputs, depth - 1)}${op}${randomExpr(rng, inputs, depth - 1)})`;
}

function guard(text: string, inputs: readonly string[]): Guard {
  const g = parseGuard(text, inputs, {}).guard;
  if (!g) throw new Error(`generator wrote a bad guard: ${text}`);
  return g;
}

/**
 * A random machine. `levers`: one lever per clock (every pair excluded by `never`), guards are
 * ORs of levers, so that with no lever pulled every state stays — the shape of an xstate import.
 */
export function randomMachine(rng: Random, shape: 'general' | 'levers'): Machine {
  const ni = shape === 'levers' ? 1 + rng.int(4) : rng.int(4);
  const inputs = Array.from({ length: ni }, (_, i) => `i${i}`);
  const outputs = Array.from({ length: rng.int(3) }, (_, i) => `o${i}`);
  const ns = 1 + rng.int(5);
  const names = Array.from({ length: ns }, (_, i) => `q${i}`);
  const outs = (): Record<string, OutBit> =>
    Object.fromEntries(outputs.filter(() => rng.int(2) === 0).map((o) => [o, bit(rng)]));
  const never: Guard[] = [];
  if (shape === 'levers') {
    for (let a = 0; a < ni; a++)
      for (let b = a + 1; b < ni; b++) never.push(guard(`${inputs[a]} & ${inputs[b]}`, inputs));
  } else if (ni > 1 && rng.int(3) === 0) {
    never.push(guard(`${pick(rng, inputs)} & ${pick(rng, inputs)}`, inputs));
  }
  const when = (): Guard => {
    if (shape === 'levers')
      return guard(inputs.filter(() => rng.int(2) === 0).join(' | ') || pick(rng, inputs), inputs);
    return rng.int(5) === 0 ? alwaysGuard(ni) : guard(randomExpr(rng, inputs, 2), inputs);
  };
  const states: State[] = names.map((name) => ({
    name,
    outputs: outs(),
    transitions: Array.from({ length: rng.int(4) }, (): Transition => ({
      when: when(),
      to: pick(rng, names),
      outputs: outs(),
    })),
  }));
  return {
    name: 'invented',
    inputs,
    outputs,
    start: pick(rng, names),
    unspecified: rng.int(3) === 0 ? 'dont-care' : 'hold',
    never,
    states,
  };
}
