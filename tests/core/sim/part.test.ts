import { describe, expect, it } from 'vitest';
import type { Build } from '../../../src/core/model/build.js';
import { resetActions, type HandAction } from '../../../src/core/sim/hand.js';
import {
  powerUp,
  readPart,
  setLeversInPlace,
  simFor,
  slaveCode,
  stateAtCode,
  stepPart,
  stepSim,
  X,
  type PartEvent,
  type PartSim,
  type PartState,
} from '../../../src/core/sim/part.js';
import { latchBuild, toggleBuild } from './handmade.js';

const timing = { stageDelayS: 0.25 };

function run(sim: PartSim, state: PartState, actions: readonly HandAction[]): [PartState, PartEvent[]] {
  const all: PartEvent[] = [];
  for (const a of actions) {
    const [next, events] = stepSim(sim, state, a);
    state = next;
    all.push(...events);
  }
  return [state, all];
}

const lever = (input: string, value: 0 | 1): HandAction => ({ kind: 'input', input, value });

function latchQ(sim: PartSim, s: PartState): [number, number] {
  const l = sim.latches[0];
  return [s.values[l.set], s.values[l.reset]];
}

describe('core/sim/part', () => {
  // NAND set/reset latch table with active-low inputs S̄, R̄, including the forbidden row
  // S̄ = R̄ = 0 → Q = Q̄ = 1: M. Morris Mano & M. D. Ciletti, Digital Design, 5th ed.,
  // §5.3 "Storage Elements: Latches", the SR latch with NAND gates (from memory).
  it('follows the NAND latch table of Mano & Ciletti, forbidden row included', () => {
    const sim = simFor(latchBuild(), timing);
    let [s] = powerUp(sim);
    expect(latchQ(sim, s)).toEqual([X, X]);
    // S̄ = 1, R̄ = 0 (pull r): reset.
    [s] = run(sim, s, [lever('r', 1)]);
    expect(latchQ(sim, s)).toEqual([0, 1]);
    // S̄ = R̄ = 1: no change.
    [s] = run(sim, s, [lever('r', 0)]);
    expect(latchQ(sim, s)).toEqual([0, 1]);
    // S̄ = 0, R̄ = 1: set.
    [s] = run(sim, s, [lever('s', 1)]);
    expect(latchQ(sim, s)).toEqual([1, 0]);
    [s] = run(sim, s, [lever('s', 0)]);
    expect(latchQ(sim, s)).toEqual([1, 0]);
    // S̄ = R̄ = 0: both outputs 1, reported as the forbidden input.
    const [f, events] = run(sim, s, [lever('s', 1), lever('r', 1)]);
    expect(latchQ(sim, f)).toEqual([1, 1]);
    const alarm = events.find((e) => e.kind === 'forbidden-input');
    expect(alarm?.latch).toBe('L');
    expect(alarm?.words).toContain('latch L sees the forbidden input');
  });

  it('leaves X on a latch whose two inputs are released together from the forbidden input', () => {
    const sim = simFor(latchBuild(), timing);
    const [f] = run(sim, powerUp(sim)[0], [lever('s', 1), lever('r', 1)]);
    const values = f.values.slice();
    const events: PartEvent[] = [];
    setLeversInPlace(sim, values, f.timeUs, [sim.inputLevers[0], sim.inputLevers[1]], [0, 0], events);
    expect(latchQ(sim, { values, timeUs: 0 })).toEqual([X, X]);
    expect(events.find((e) => e.kind === 'latch-x')?.words).toMatch(
      /latch L is left undetermined \(X\): both its inputs were released together/,
    );
    // X resolves as soon as one input is pulled again (three-valued NAND: any 0 → 1).
    const [after] = stepSim(sim, { values, timeUs: 0 }, lever('r', 1));
    expect(latchQ(sim, after)).toEqual([0, 1]);
  });

  it('resolves the release race by the delay map: the faster gate falls first', () => {
    for (const [fast, q] of [
      ['L.set', 0],
      ['L.reset', 1],
    ] as const) {
      const slow = fast === 'L.set' ? 'L.reset' : 'L.set';
      const sim = simFor(latchBuild(), { stageDelayS: 0.25, delays: { [fast]: 0.2, [slow]: 0.3 } });
      const [f] = run(sim, powerUp(sim)[0], [lever('s', 1), lever('r', 1)]);
      const values = f.values.slice();
      const events: PartEvent[] = [];
      setLeversInPlace(sim, values, f.timeUs, [sim.inputLevers[0], sim.inputLevers[1]], [0, 0], events);
      expect(latchQ(sim, { values, timeUs: 0 })).toEqual([q, 1 - q]);
      expect(events.some((e) => e.kind === 'latch-x')).toBe(false);
    }
  });

  it('steps the toggle machine by the hand procedure and reads state and outputs', () => {
    const build = toggleBuild();
    let [s] = powerUp(simFor(build, timing));
    const sim = simFor(build, timing);
    expect(slaveCode(sim, s.values)).toBe('X');
    for (const a of resetActions()) s = stepPart(build, s, a, { timing })[0];
    expect(readPart(sim, s)).toMatchObject({ code: '0', state: 'off', masterCode: '0', outputs: { lit: '0' } });
    const clock: HandAction[] = [lever('t', 1), { kind: 'pull', lever: 'phi1' }, { kind: 'release', lever: 'phi1' }];
    [s] = run(sim, s, clock);
    // After φ1 only the master has moved.
    expect(readPart(sim, s)).toMatchObject({ code: '0', masterCode: '1' });
    [s] = run(sim, s, [
      { kind: 'pull', lever: 'phi2' },
      { kind: 'release', lever: 'phi2' },
    ]);
    expect(readPart(sim, s)).toMatchObject({ code: '1', state: 'on', outputs: { lit: '1' } });
    // Each settle takes whole stages: φ2 pull = transfer + 2 latch stages + output decode.
    expect(s.timeUs % 250000).toBe(0);
  });

  it('does not change the state it is given (pure step)', () => {
    const build = toggleBuild();
    const sim = simFor(build, timing);
    const s = stateAtCode(sim, '0', '1');
    const copy = s.values.slice();
    stepPart(build, s, { kind: 'pull', lever: 'phi1' }, { timing });
    expect(s.values).toEqual(copy);
  });

  it('reports each operating rule broken, in words', () => {
    const sim = simFor(toggleBuild(), timing);
    const s = stateAtCode(sim, '0');
    const [, e1] = run(sim, s, [
      { kind: 'pull', lever: 'phi1' },
      { kind: 'pull', lever: 'phi2' },
    ]);
    expect(e1.find((e) => e.kind === 'clocks-together')?.words).toBe(
      'operating rule broken (φ1 and φ2 are never pulled together): pull φ2',
    );
    const [, e2] = run(sim, s, [{ kind: 'pull', lever: 'phi1' }, lever('t', 1)]);
    expect(e2.find((e) => e.kind === 'input-during-phi1')?.rule).toBe('inputs-steady');
    const [, e3] = run(sim, s, [
      { kind: 'pull', lever: 'phi2' },
      { kind: 'pull', lever: 'reset' },
    ]);
    expect(e3.find((e) => e.kind === 'reset-during-clock')?.rule).toBe('reset-alone');
  });

  it('reports an oscillation and leaves the switching parts X', () => {
    const b = latchBuild();
    const ring: Build = {
      ...b,
      netlist: {
        parts: [
          ...b.netlist.parts,
          { kind: 'gate', id: 'ring', name: 'ring', role: 'buffer', ports: [{ name: 'a' }, { name: 'b' }] },
        ],
        cords: [
          ...b.netlist.cords,
          { id: 'r1', driver: 'in_s', ports: [{ part: 'ring', port: 'a' }], actuators: [] },
          { id: 'r2', driver: 'ring', ports: [{ part: 'ring', port: 'b' }], actuators: [] },
        ],
      },
    };
    const sim = simFor(ring, timing);
    const [s] = powerUp(sim);
    const [after, events] = stepSim(sim, s, lever('s', 1));
    const osc = events.find((e) => e.kind === 'oscillation');
    expect(osc?.parts).toEqual(['ring']);
    expect(osc?.words).toBe('the machine does not settle: ring keep switching (left X)');
    expect(after.values[sim.ids.indexOf('ring')]).toBe(X);
    // The latch itself was set normally.
    expect(latchQ(sim, after)).toEqual([1, 0]);
  });

  it('reports change events when traced', () => {
    const build = toggleBuild();
    const s = stateAtCode(simFor(build, timing), '0', '1');
    const [, events] = stepPart(build, s, { kind: 'pull', lever: 'phi1' }, { timing, trace: true });
    expect(events.filter((e) => e.kind === 'change').map((e) => [e.parts?.[0], e.value, e.timeS])).toEqual([
      ['S0.t0', 0, 0.25],
      ['M0.set', 1, 0.5],
      ['M0.reset', 0, 0.75],
    ]);
  });
});
