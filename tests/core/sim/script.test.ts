import { describe, expect, it } from 'vitest';
import { coverHolds } from '../../../src/core/model/cube.js';
import { seededRandom } from '../../../src/core/model/random.js';
import { valuesOf } from '../../../src/core/sim/hand.js';
import { runAbstractScript, runPartScript, validateSequence } from '../../../src/core/sim/script.js';
import { exampleBuild, exampleNames } from '../checks/builds.js';
import { toggleBuild } from './handmade.js';

describe('core/sim/script', () => {
  it('gives one row per clock, outputs read before φ1', () => {
    const rows = runPartScript(toggleBuild(), [{ t: 1 }, {}, { t: 1 }], { stageDelayS: 0.25 });
    expect(rows).toEqual([
      {
        clock: 1,
        state: 'off',
        code: '0',
        inputs: { t: 1 },
        outputs: { lit: 0 },
        next: 'on',
        nextCode: '1',
        alarms: [],
      },
      {
        clock: 2,
        state: 'on',
        code: '1',
        inputs: { t: 0 },
        outputs: { lit: 1 },
        next: 'on',
        nextCode: '1',
        alarms: [],
      },
      {
        clock: 3,
        state: 'on',
        code: '1',
        inputs: { t: 1 },
        outputs: { lit: 1 },
        next: 'off',
        nextCode: '0',
        alarms: [],
      },
    ]);
    expect(runAbstractScript(toggleBuild(), [{ t: 1 }, {}, { t: 1 }])).toEqual(rows);
  });

  // The part-level run and the abstract run of the same build agree clock by clock.
  it.each(exampleNames())('agrees with the abstract machine on a random run of %s', (name) => {
    const { build } = exampleBuild(name);
    const rnd = seededRandom(3);
    // Random inputs, leaving out the combinations the machine declares never to occur.
    const allowed = Array.from({ length: 2 ** build.machine.inputs.length }, (_, m) =>
      m.toString(2).padStart(build.machine.inputs.length, '0'),
    ).filter((a) => !coverHolds(build.machine.never, a));
    const seq = Array.from({ length: 30 }, () => valuesOf(build.machine.inputs, allowed[rnd.int(allowed.length)]));
    const part = runPartScript(build, seq, { stageDelayS: 0.25 });
    const abs = runAbstractScript(build, seq);
    part.forEach((row, i) => {
      expect(row.state).toBe(abs[i].state);
      expect(row.next).toBe(abs[i].next);
      for (const [o, v] of Object.entries(abs[i].outputs)) if (v !== '-') expect(row.outputs[o]).toBe(v);
      expect(row.alarms).toEqual(abs[i].alarms);
    });
  });

  it('reports a bad sequence with codes and JSON paths', () => {
    const b = toggleBuild();
    expect(validateSequence(b, { t: 1 }).map((d) => d.code)).toEqual(['LW103']);
    const ds = validateSequence(b, [{ t: 1 }, { tt: 1 }, { t: 2 }, 5]);
    expect(ds.map((d) => [d.code, d.location.path, d.message])).toEqual([
      ['LW208', '$[1].tt', "clock 2 sets 'tt', which is not an input of toggle"],
      ['LW103', '$[2].t', "clock 3 sets 't' to 2; use 0 or 1"],
      ['LW103', '$[3]', 'clock 4 of the input sequence is not an object of input settings'],
    ]);
  });
});
