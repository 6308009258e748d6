import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { clockEvent, exportXstate } from '../../../src/core/forms/xstate.js';
import { coverHolds } from '../../../src/core/model/cube.js';
import { seededRandom } from '../../../src/core/model/random.js';
import { analyse, buildMachine } from '../../../src/core/pipeline.js';
import { clockActions, resetActions, valuesOf, type HandAction } from '../../../src/core/sim/hand.js';
import { powerUp, readPart, simFor, stepSim } from '../../../src/core/sim/part.js';
import { CHECKPOINT_EVERY, createRunner } from '../../../src/core/sim/runner.js';
import { exampleBuild, exampleNames } from '../checks/builds.js';
import { xstateStepper } from '../forms/xstate/harness.js';
import { toggleBuild } from './handmade.js';

describe('core/sim/runner', () => {
  it('clocks, resets and undoes by the hand procedure', () => {
    const r = createRunner(toggleBuild(), { stageDelayS: 0.25 });
    expect(r.reading().code).toBe('X');
    expect(r.reset()).toEqual([]);
    expect(r.reading()).toMatchObject({ state: 'off', code: '0', outputs: { lit: '0' } });
    const c = r.clock({ t: 1 });
    expect(c).toMatchObject({
      before: { state: 'off' },
      outputs: { lit: '0' },
      after: { state: 'on', code: '1', outputs: { lit: '1' } },
      alarms: [],
    });
    r.clock({ t: 0 });
    expect(r.reading().state).toBe('on');
    expect(r.history).toEqual(['reset', 'clock', 'clock']);
    expect(r.undo()).toBe(true);
    expect(r.undo()).toBe(true);
    expect(r.reading()).toMatchObject({ state: 'off', inputs: { t: 0 } });
    expect(r.undo()).toBe(true);
    expect(r.undo()).toBe(false);
  });

  it('reports the alarms of single hand actions', () => {
    const r = createRunner(toggleBuild(), { stageDelayS: 0.25 });
    r.reset();
    r.act({ kind: 'input', input: 't', value: 1 });
    r.act({ kind: 'pull', lever: 'phi1' });
    const alarms = r.act({ kind: 'pull', lever: 'reset' });
    expect(alarms.map((a) => a.kind)).toEqual(['reset-during-clock', 'forbidden-input']);
    expect(r.history).toEqual(['reset', "pull input lever 't'", 'pull φ1', 'pull reset']);
  });
});

describe('core/sim/runner, fast', () => {
  it('undoes across its kept copies by replaying, to exactly the state before the step', () => {
    const r = createRunner(toggleBuild(), { stageDelayS: 0.25 });
    const states: string[] = [];
    const snapshot = (): string => JSON.stringify([...r.state.values, r.state.timeUs]);
    states.push(snapshot());
    r.reset();
    const rnd = seededRandom(9);
    for (let i = 0; i < 3 * CHECKPOINT_EVERY + 5; i++) {
      states.push(snapshot());
      if (i % 7 === 3) r.act({ kind: 'input', input: 't', value: rnd.int(2) as 0 | 1 });
      else r.clock({ t: rnd.int(2) as 0 | 1 });
    }
    for (let i = states.length - 1; i >= 0; i--) {
      expect(r.undo()).toBe(true);
      expect(snapshot()).toBe(states[i]);
    }
    expect(r.undo()).toBe(false);
  });

  it('reads a clock lazily, the same as reading the event-driven simulator at those moments', () => {
    const { build } = exampleBuild('crossing');
    const r = createRunner(build, { stageDelayS: 0.25 });
    const sim = simFor(build, { stageDelayS: 0.25 });
    let ref = powerUp(sim)[0];
    const step = (a: HandAction): void => {
      ref = stepSim(sim, ref, a, true)[0]; // trace: always the event-driven settling
    };
    r.reset();
    resetActions().forEach(step);
    const rnd = seededRandom(4);
    for (let k = 0; k < 200; k++) {
      const inputs = Object.fromEntries(build.machine.inputs.map((n) => [n, rnd.int(2) as 0 | 1]));
      const c = r.clock(inputs);
      const actions = clockActions(build.machine.inputs, inputs);
      actions.slice(0, -4).forEach(step);
      expect(c.before).toEqual(readPart(sim, ref));
      actions.slice(-4).forEach(step);
      expect(c.after).toEqual(readPart(sim, ref));
      expect(r.reading()).toEqual(readPart(sim, ref));
    }
  });

  // Reference simulator: the npm package xstate (5.33.3) running the exported machine, clock by clock.
  it.each(exampleNames())('shows the outputs and goes to the states xstate does, clock by clock, on %s', (name) => {
    const file = `examples/${name}.lw`;
    const a = analyse(readFileSync(file, 'utf8'), file);
    if (!a.ok) throw new Error('example must analyse');
    const b = buildMachine(a, { encoding: 'binary', checks: false });
    if (!b.ok) throw new Error('example must build');
    const x = exportXstate(a.machine, { form: 'clock' });
    const theirs = xstateStepper(
      JSON.parse(JSON.stringify(x.config)) as object,
      x.implementations.guards,
      a.machine.outputs,
    );
    const ours = createRunner(b.build, { stageDelayS: 0.25 });
    ours.reset();
    const complete = a.minimised.method === 'partition-refinement';
    const rnd = seededRandom(31);
    for (let k = 0; k < 300; k++) {
      const assignment = a.machine.inputs.map(() => (rnd.next() < 0.5 ? '0' : '1')).join('');
      if (coverHolds(a.flat.never, assignment)) continue;
      const c = ours.clock(valuesOf(a.machine.inputs, assignment));
      const t = theirs(clockEvent(a.machine.inputs, assignment));
      a.machine.outputs.forEach((o, i) => {
        if (t.outputs[i] !== '-')
          expect({ clock: k, o, v: c.outputs[o] }).toEqual({ clock: k, o, v: String(t.outputs[i]) });
      });
      if (complete) expect(c.after.state).toBe(a.minimised.merged[t.state]);
      expect(c.alarms).toEqual([]);
    }
  });
});
