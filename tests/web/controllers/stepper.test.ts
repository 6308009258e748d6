import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { host } from './host.support.js';
import { analyse, buildMachine } from '../../../src/core/pipeline.js';
import { runAbstract } from '../../../src/core/sim/abstract.js';
import { momentWords, nextPhase, StepperController } from '../../../src/web/controllers/stepper.js';
import { clockActions } from '../../../src/core/sim/hand.js';
import { tracesOf } from '../../../src/web/controllers/traces.js';

const BELL = readFileSync(fileURLToPath(new URL('../../../examples/marble-bell.lw', import.meta.url)), 'utf8');

const key = (k: string, code = '', shiftKey = false, ctrlKey = false): KeyboardEvent =>
  ({ key: k, code, shiftKey, ctrlKey, altKey: false, metaKey: false }) as KeyboardEvent;

const LOCK = readFileSync(fileURLToPath(new URL('../../../examples/sequence-lock.lw', import.meta.url)), 'utf8');

function built(text: string) {
  const a = analyse(text, 'x.lw');
  if (!a.ok) throw new Error('must read');
  const b = buildMachine(a, { encoding: 'binary', checks: false });
  if (!b.ok) throw new Error('must build');
  return { a, b };
}

function bell() {
  const a = analyse(BELL, 'b.lw');
  if (!a.ok) throw new Error('must read');
  const b = buildMachine(a, { encoding: 'gray', checks: false });
  if (!b.ok) throw new Error('must build');
  return { a, b };
}

describe('src/web/controllers/stepper', () => {
  it('starts each build reset, steps like the abstract machine, and undoes a clock as one step', () => {
    const { a, b } = bell();
    const s = new StepperController(host());
    s.follow(b.build, b.profile);
    expect(s.reading?.state).toBe('none');
    s.setInput('marble', 1);
    const run = runAbstract(a.minimised.machine, ['1', '1', '1', '1']);
    for (let i = 0; i < 4; i++) {
      s.clock();
      expect(s.reading?.state).toBe(run[i].nextName);
    }
    expect(s.clocks).toBe(4);
    const before = s.samples.length;
    expect(s.undo()).toBe(true);
    expect(s.clocks).toBe(3);
    expect(s.samples.length).toBe(before - 4);
    expect(s.reading?.state).toBe(run[2].nextName);
  });

  it('answers its keys: φ levers, a whole clock, reset, undo and the input levers', () => {
    const { b } = bell();
    const s = new StepperController(host());
    s.follow(b.build, b.profile);
    expect(s.key(key('!', 'Digit1', true))).toBe(true);
    expect(s.reading?.inputs.marble).toBe(1);
    expect(s.key(key('1', 'Digit1'))).toBe(true);
    expect(s.reading?.phi1).toBe(true);
    expect(s.key(key('2', 'Digit2'))).toBe(true);
    expect(s.alarms.map((x) => x.kind)).toContain('clocks-together');
    expect(s.alarms.some((x) => x.kind === 'forbidden-input' && x.latch !== undefined)).toBe(true);
    expect(s.key(key('z', 'KeyZ', false, true))).toBe(true);
    expect(s.alarms).toHaveLength(0);
    expect(s.key(key('r', 'KeyR'))).toBe(true);
    expect(s.key(key('x', 'KeyX'))).toBe(false);
    expect(s.key(key('@', 'Digit2', true))).toBe(false);
  });

  it('records a trace per lever, bit and output for every hand action', () => {
    const { b } = bell();
    const s = new StepperController(host());
    s.follow(b.build, b.profile);
    s.setInput('marble', 1);
    s.clock();
    const traces = tracesOf(s.samples);
    expect(traces.map((t) => t.name)).toEqual(['marble', 'φ1', 'φ2', 'reset', 'Q0', 'Q1', 'M0', 'M1', 'bell']);
    for (const t of traces) expect(t.values).toHaveLength(s.samples.length);
    // Power-up leaves the latches undetermined until reset.
    expect(traces[4].values[0]).toBe('X');
    expect(traces[1].values.join('')).toBe('0000' + '1000');
  });

  it('counts a clock done lever by lever as the hand procedure describes it, and only then', () => {
    const { a, b } = bell();
    const s = new StepperController(host());
    s.follow(b.build, b.profile);
    s.setInput('marble', 1);
    for (const lever of ['phi1', 'phi1', 'phi2', 'phi2'] as const) s.toggle(lever);
    expect(s.clocks).toBe(1);
    expect(s.reading?.state).toBe(runAbstract(a.minimised.machine, ['1'])[0].nextName);
    // φ2 alone is a transfer, not a clock; reset in the middle starts the procedure again.
    s.toggle('phi2');
    s.toggle('phi2');
    s.toggle('phi1');
    s.reset();
    s.toggle('phi1'); // released after the reset: no φ1 of this clock
    s.toggle('phi2');
    s.toggle('phi2');
    expect(s.clocks).toBe(1);
    // Undo takes the count back with the step.
    for (const lever of ['phi1', 'phi1', 'phi2', 'phi2'] as const) s.toggle(lever);
    expect(s.clocks).toBe(2);
    s.undo();
    expect(s.clocks).toBe(1);
    // The same procedure as the core's clock: φ1 pulled and released, then φ2 (src/core/sim/hand.ts).
    let phase: Parameters<typeof nextPhase>[0] = 'idle';
    let clocked = 0;
    for (const act of clockActions(['marble'], { marble: 1 })) {
      const n = nextPhase(phase, act);
      phase = n.phase;
      if (n.clocked) clocked++;
    }
    expect(clocked).toBe(1);
  });

  it('names the clock and the hand action of every alarm', () => {
    const { b } = bell();
    const s = new StepperController(host());
    s.follow(b.build, b.profile);
    s.clock();
    s.clock();
    s.toggle('phi1');
    s.toggle('phi2');
    expect(s.alarms.length).toBeGreaterThan(0);
    for (const x of s.alarms) {
      expect(x.clock).toBe(3);
      expect(x.moment).toBe('pulling φ2 while φ1 is pulled');
    }
    expect(momentWords({ kind: 'input', input: 'a', value: 1 }, undefined)).toBe('setting a=1');
  });

  it('flags input levers set to a combination the machine declares never, with its line', () => {
    const { a, b } = built(LOCK);
    const s = new StepperController(host());
    s.follow(b.build, b.profile, a.machine.never);
    s.setInput('red', 1);
    expect(s.impossible).toBeUndefined();
    s.setInput('green', 1);
    const line = LOCK.split('\n').indexOf('never red & green') + 1;
    expect(s.impossible).toEqual({ guard: 'red & green', line });
    expect(s.alarms.filter((x) => x.kind === 'never').map((x) => x.words)).toEqual([
      `the inputs red=1 green=1 blue=0 are declared impossible (never red & green, line ${line}): the build may go to any state from here; its latches stay safe`,
    ]);
    s.undo();
    expect(s.impossible).toBeUndefined();
  });
});
