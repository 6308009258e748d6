/**
 * The `xstate` library as a second reference: the machine exported as an xstate configuration
 * (the clock form: one CLOCK event carrying every input) and run by xstate's own actor, clock
 * by clock, beside the campaign's reference interpreter of the JSON form. Only states are
 * compared here (the reference's outputs are held to the build in explore.ts); a clock whose
 * next state the spec leaves free ends the walk.
 */
import { createActor, createMachine } from 'xstate';
import { clockEvent, exportXstate, type Machine } from '../../src/core/index.js';
import type { Rng } from './random.js';
import type { Reference } from './reference.js';

/** The first difference between xstate and the reference on a few random walks, in words; undefined when none. */
export function compareWithXstate(m: Machine, ref: Reference, r: Rng, walks = 3, clocks = 25): string | undefined {
  const x = exportXstate(m, { form: 'clock' });
  const config = JSON.parse(JSON.stringify(x.config)) as Parameters<typeof createMachine>[0];
  const machine = createMachine(config, { guards: x.implementations.guards });
  const allowed = ref.assignments.filter((a) => !ref.isNever(a));
  if (allowed.length === 0) return undefined;
  for (let w = 0; w < walks; w++) {
    const actor = createActor(machine);
    actor.start();
    let state: string | null = ref.spec.start;
    const path: string[] = [];
    for (let k = 0; k < clocks && state !== null; k++) {
      const a = r.pick(allowed);
      path.push(a);
      if (actor.getSnapshot().status === 'active') actor.send(clockEvent(m.inputs, a));
      state = ref.step(state, a).next;
      const theirs = JSON.stringify(actor.getSnapshot().value).replace(/^"|"$/g, '');
      if (state !== null && theirs !== state)
        return `after [${path.join(' ')}] xstate is in '${theirs}', the reference in '${state}'`;
    }
    actor.stop();
  }
  return undefined;
}
