/**
 * Flat xstate configurations as people write them (docs/xstate.md): events in `on` with a
 * target, a list of candidates, `{}` (stay) or `[]` (no answer); `#id` and `#machine.name`
 * targets; Moore outputs by `tags` and `meta.outputs`, Mealy outputs on transitions; final
 * states; a machine-level `on`. The reference is xstate's own actor: after every event the
 * imported machine, read by the campaign's interpreter, must be in the state xstate is in.
 */
import { createActor, createMachine } from 'xstate';
import { importXstate, machineToJson } from '../../src/core/index.js';
import type { Rng } from './random.js';
import { Reference, type SpecJson } from './reference.js';

const EVENTS = ['coin', 'push', 'tick', 'go', 'stop', 'lid'];
const NAMES = ['idle', 'armed', 'open', 'shut', 'wait', 'ring', 'done', 'half'];
const OUTS = ['lamp', 'bell', 'flap'];

type Config = Record<string, unknown>;

function outputs(r: Rng): Record<string, 0 | 1 | '-'> {
  return Object.fromEntries(r.sample(OUTS, r.int(1, 2)).map((o) => [o, r.pick<0 | 1 | '-'>([0, 1, 1, '-'])]));
}

function target(r: Rng, id: string, names: readonly string[], onMachine: boolean): string {
  const n = r.pick(names);
  const form = r.int(0, 2);
  if (form === 1) return `#${id}.${n}`;
  return onMachine ? `.${n}` : n;
}

function candidate(r: Rng, id: string, names: readonly string[], onMachine: boolean): unknown {
  const roll = r.next();
  if (roll < 0.4) return target(r, id, names, onMachine);
  if (roll < 0.55) return {};
  return { target: target(r, id, names, onMachine), ...(r.chance(0.5) ? { meta: { outputs: outputs(r) } } : {}) };
}

function onOf(r: Rng, id: string, names: readonly string[], events: readonly string[], onMachine: boolean): Config {
  const on: Config = {};
  for (const e of r.sample(events, r.int(0, events.length))) {
    const roll = r.next();
    on[e] =
      roll < 0.1
        ? []
        : roll < 0.3
          ? Array.from({ length: r.int(1, 2) }, () => candidate(r, id, names, onMachine))
          : candidate(r, id, names, onMachine);
  }
  return on;
}

/** A random flat configuration. */
export function randomXstateConfig(r: Rng, index: number): Config {
  const id = `cfg_${index}`;
  const names = r.sample(NAMES, r.int(1, 6));
  const events = r.sample(EVENTS, r.int(1, 4));
  const states: Config = {};
  for (const n of names) {
    const final = r.chance(0.1);
    states[n] = {
      ...(final ? { type: 'final' } : { on: onOf(r, id, names, events, false) }),
      ...(r.chance(0.3) ? { tags: r.sample(OUTS, 1) } : {}),
      ...(r.chance(0.3) ? { meta: { outputs: outputs(r) } } : {}),
    };
  }
  return {
    id,
    initial: r.pick(names),
    ...(r.chance(0.3) ? { on: onOf(r, id, names, events, true) } : {}),
    states,
  };
}

/**
 * Import the configuration and hold it to xstate's actor on random event sequences. Returns
 * the imported machine in the JSON form (for the builds), or the import's diagnostics, and
 * the first difference in words.
 */
export function importAgainstXstate(
  r: Rng,
  config: Config,
): { spec?: SpecJson; diagnostics: string[]; difference?: string } {
  const imported = importXstate(config, 'config.json');
  const errors = imported.diagnostics.filter((d) => d.severity === 'error');
  if (!imported.machine || errors.length > 0)
    return { diagnostics: imported.diagnostics.map((d) => `${d.code} ${d.message}`) };
  const spec = machineToJson(imported.machine) as unknown as SpecJson;
  const ref = new Reference(spec);
  const machine = createMachine(config as Parameters<typeof createMachine>[0]);
  const inputs = spec.inputs;
  for (let w = 0; w < 3; w++) {
    const actor = createActor(machine);
    actor.start();
    let state = spec.start;
    const path: string[] = [];
    for (let k = 0; k < 25; k++) {
      const lever = r.int(-1, inputs.length - 1);
      path.push(lever < 0 ? '(none)' : inputs[lever]);
      // A stopped actor (a final state reached) takes no event: xstate would only warn.
      if (lever >= 0 && actor.getSnapshot().status === 'active') actor.send({ type: inputs[lever] });
      const a = inputs.map((_, i) => (i === lever ? '1' : '0')).join('');
      state = ref.step(state, a).next ?? state;
      const theirs = JSON.stringify(actor.getSnapshot().value).replace(/^"|"$/g, '');
      if (theirs !== state)
        return {
          spec,
          diagnostics: [],
          difference: `after [${path.join(' ')}] xstate is in '${theirs}', the import in '${state}'`,
        };
    }
    actor.stop();
  }
  return { spec, diagnostics: [] };
}
