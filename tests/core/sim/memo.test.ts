import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Build } from '../../../src/core/model/build.js';
import { seededRandom } from '../../../src/core/model/random.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { analyse } from '../../../src/core/pipeline.js';
import { randomFlatMachine } from '../../../src/core/sim/random-machine.js';
import { synthesise } from '../../../src/core/synthesise.js';
import { clockActions, type ControlLever, type HandAction, type InputValues } from '../../../src/core/sim/hand.js';
import { MEMO_BYTES } from '../../../src/core/sim/memo.js';
import {
  applyInPlace,
  powerUp,
  readPart,
  simFor,
  type PartEvent,
  type PartReading,
  type PartSim,
  type PartState,
  type PartTiming,
} from '../../../src/core/sim/part.js';
import { createRunner, type ClockRecord, type PartRunner } from '../../../src/core/sim/runner.js';
import { exampleBuild, exampleNames } from '../checks/builds.js';
import { randomBuild } from './actions.js';

/** One step a person at the levers takes through the runner. */
type Step =
  | { readonly kind: 'clock'; readonly inputs: number }
  | { readonly kind: 'act'; readonly action: HandAction }
  | { readonly kind: 'half'; readonly inputs: number }
  | { readonly kind: 'reset' }
  | { readonly kind: 'undo' };

/**
 * Steps, mostly clocks. Half the clocks draw their inputs from a pool of three combinations, so
 * the run comes back to states and clocks it has seen (the memo's case); the rest draw from
 * every combination. Now and then a control lever is moved alone (which may break an operating
 * rule and bump the latches to an unused code), half a clock (inputs set, φ1 pulled and
 * released, φ2 left alone: the masters then differ from the slaves), a reset, or an undo.
 */
function stepsArb(inputs: number, length: number): fc.Arbitrary<Step[]> {
  const all = 2 ** Math.min(inputs, 20);
  const lever = fc.constantFrom<ControlLever>('phi1', 'phi2', 'reset');
  const step: fc.Arbitrary<Step> = fc.oneof(
    { weight: 8, arbitrary: fc.integer({ min: 0, max: 2 }).map((k): Step => ({ kind: 'clock', inputs: k % all })) },
    { weight: 8, arbitrary: fc.integer({ min: 0, max: all - 1 }).map((k): Step => ({ kind: 'clock', inputs: k })) },
    {
      weight: 2,
      arbitrary: fc
        .tuple(fc.boolean(), lever)
        .map(([pull, l]): Step => ({ kind: 'act', action: { kind: pull ? 'pull' : 'release', lever: l } })),
    },
    { weight: 2, arbitrary: fc.integer({ min: 0, max: all - 1 }).map((k): Step => ({ kind: 'half', inputs: k })) },
    { weight: 1, arbitrary: fc.constant<Step>({ kind: 'reset' }) },
    { weight: 1, arbitrary: fc.constant<Step>({ kind: 'undo' }) },
  );
  return fc.array(step, { minLength: length, maxLength: length });
}

/** Input levers from a step's number: input i takes bit i mod 20 (wider machines repeat the pattern). */
function inputValues(names: readonly string[], k: number): InputValues {
  return Object.fromEntries(names.map((n, i) => [n, ((k >>> (i % 20)) & 1) as 0 | 1]));
}

/** A clock's record as plain data (every reading put in words), to compare whole. */
function plain(r: ClockRecord): object {
  return { inputs: r.inputs, before: r.before, outputs: r.outputs, after: r.after, alarms: r.alarms };
}

/**
 * The event-driven reference: settle.ts through part.ts's `applyInPlace` (every move settled by
 * the event queue, never by the fast pass or the memo), with a stack of states for undo.
 */
class Reference {
  private state: PartState;
  private readonly past: PartState[] = [];
  constructor(private readonly sim: PartSim) {
    this.state = powerUp(sim)[0];
  }
  get now(): PartState {
    return this.state;
  }
  /** Do the actions as one step; their alarms, in order. */
  step(actions: readonly HandAction[]): PartEvent[] {
    this.past.push(this.state);
    return this.run(actions);
  }
  /** A clock: the readings with the inputs held and after φ2, and the alarms. */
  clock(inputs: InputValues): { before: PartReading; after: PartReading; alarms: PartEvent[] } {
    this.past.push(this.state);
    const m = this.sim.build.machine;
    const now = readPart(this.sim, this.state).inputs;
    const actions = clockActions(m.inputs, inputs, now);
    const alarms = this.run(actions.slice(0, -4));
    const before = readPart(this.sim, this.state);
    alarms.push(...this.run(actions.slice(-4)));
    return { before, after: readPart(this.sim, this.state), alarms };
  }
  undo(): boolean {
    const s = this.past.pop();
    if (s) this.state = s;
    return s !== undefined;
  }
  private run(actions: readonly HandAction[]): PartEvent[] {
    const alarms: PartEvent[] = [];
    const values = this.state.values.slice();
    let t = this.state.timeUs;
    for (const a of actions) t = applyInPlace(this.sim, values, t, a, alarms);
    this.state = { values, timeUs: t };
    return alarms;
  }
}

/** What a run saw: clocks answered by the memo, clocks that started at an unused code. */
interface Seen {
  hits: number;
  heldHits: number;
  emptied: number;
  unusedStarts: number;
  /** Clocks from an unused code into a state of the machine. */
  recoveries: number;
  /** Clocks from an unused code that the memo answered whole. */
  unusedHits: number;
  clocks: number;
}

function sameState(a: PartState, b: PartState): boolean {
  return a.timeUs === b.timeUs && a.values.length === b.values.length && a.values.every((v, i) => v === b.values[i]);
}

/**
 * Run the steps on a runner with the memo, one without it and the event-driven reference: every
 * clock's whole record, every step's alarms and the state (every part's value and the time)
 * after every step must be the same on all three.
 */
function agree(build: Build, steps: readonly Step[], timing: PartTiming, memoBytes = MEMO_BYTES): Seen {
  const sim = simFor(build, timing);
  const memo = createRunner(build, timing, { memoBytes });
  const plainRunner = createRunner(build, timing, { memoBytes: 0 });
  const ref = new Reference(sim);
  const names = build.machine.inputs;
  const seen: Seen = { hits: 0, heldHits: 0, emptied: 0, unusedStarts: 0, recoveries: 0, unusedHits: 0, clocks: 0 };
  const both = (f: (r: PartRunner) => unknown): [unknown, unknown] => [f(memo), f(plainRunner)];
  steps.forEach((s, k) => {
    if (s.kind === 'clock') {
      const inputs = inputValues(names, s.inputs);
      const hitsBefore = memo.memoStats().hits;
      const [a, b] = both((r) => plain(r.clock(inputs)));
      const r = ref.clock(inputs);
      expect({ k, memo: a }).toEqual({ k, memo: b });
      const expected = { inputs, before: r.before, outputs: r.before.outputs, after: r.after, alarms: r.alarms };
      expect({ k, memo: a }).toEqual({ k, memo: expected });
      seen.clocks++;
      if (r.before.state === null && !r.before.code.includes('X')) {
        seen.unusedStarts++;
        if (r.after.state !== null) seen.recoveries++;
        if (memo.memoStats().hits > hitsBefore) seen.unusedHits++;
      }
    } else if (s.kind === 'act') {
      const [a, b] = both((r) => r.act(s.action));
      expect({ k, a }).toEqual({ k, a: b });
      expect({ k, a }).toEqual({ k, a: ref.step([s.action]) });
    } else if (s.kind === 'half') {
      const inputs = inputValues(names, s.inputs);
      const actions = clockActions(names, inputs).slice(0, -2);
      for (const action of actions) {
        const [a, b] = both((r) => r.act(action));
        expect({ k, a }).toEqual({ k, a: b });
        expect({ k, a }).toEqual({ k, a: ref.step([action]) });
      }
    } else if (s.kind === 'reset') {
      const [a, b] = both((r) => r.reset());
      expect({ k, a }).toEqual({ k, a: b });
      expect({ k, a }).toEqual({ k, a: ref.step([...resetSteps]) });
    } else {
      const [a, b] = both((r) => r.undo());
      const u = ref.undo();
      expect({ k, a, b }).toEqual({ k, a: u, b: u });
    }
    if (!sameState(memo.state, ref.now) || !sameState(plainRunner.state, ref.now)) {
      expect({ k, memo: memo.state }).toEqual({ k, memo: ref.now });
      expect({ k, plain: plainRunner.state }).toEqual({ k, plain: ref.now });
    }
  });
  expect(memo.history).toEqual(plainRunner.history);
  seen.hits = memo.memoStats().hits;
  seen.heldHits = memo.memoStats().heldHits;
  seen.emptied = memo.memoStats().emptied;
  return seen;
}

/**
 * Steps from power-up that leave the machine ready at a code no state has (its latches each
 * holding a value, the control levers released), found by seeded rule-breaking lever moves
 * (control levers pulled and released at random, half clocks, clocks) on a runner; null when
 * none is found.
 */
function pathToUnusedCode(build: Build, seed: number): Step[] | null {
  const rnd = seededRandom(seed);
  const names = build.machine.inputs;
  const levers: readonly ControlLever[] = ['phi1', 'phi2', 'reset'];
  for (let attempt = 0; attempt < 20; attempt++) {
    const r = createRunner(build, timing, { memoBytes: 0 });
    r.reset();
    const steps: Step[] = [{ kind: 'reset' }];
    for (let i = 0; i < 200; i++) {
      const x = rnd.next();
      const inputs = rnd.int(2 ** names.length);
      let s: Step;
      if (x < 0.5)
        s = { kind: 'act', action: { kind: rnd.next() < 0.5 ? 'pull' : 'release', lever: levers[rnd.int(3)] } };
      else if (x < 0.7) s = { kind: 'half', inputs };
      else s = { kind: 'clock', inputs };
      steps.push(s);
      if (s.kind === 'act') r.act(s.action);
      else if (s.kind === 'clock') r.clock(inputValues(names, s.inputs));
      else for (const a of clockActions(names, inputValues(names, s.inputs)).slice(0, -2)) r.act(a);
      const now = r.reading();
      const held = now.latches.every((l) => l.q !== 'X' && l.qBar !== 'X' && l.q !== l.qBar);
      if (now.state === null && held && !now.phi1 && !now.phi2 && !now.reset) return steps;
    }
  }
  return null;
}

const resetSteps: readonly HandAction[] = [
  { kind: 'pull', lever: 'reset' },
  { kind: 'release', lever: 'reset' },
];

const timing = { stageDelayS: 0.25 };

describe('core/sim/memo', () => {
  // The reference is the event-driven three-valued simulator (settle.ts, by part.ts's
  // applyInPlace, as fast.test.ts uses it), itself checked against the NAND latch table of Mano & Ciletti, Digital Design, in
  // part.test.ts; the runner without the memo is the runner as it stepped before the memo.
  it.each(exampleNames())(
    'gives every clock the same record as the runner without it and the event-driven simulator, on %s',
    (name) => {
      let hits = 0;
      let heldHits = 0;
      let inputs = 0;
      for (const encoding of ['binary', 'one-hot'] as const) {
        const { build } = exampleBuild(name, { encoding });
        inputs = build.machine.inputs.length;
        fc.assert(
          fc.property(stepsArb(build.machine.inputs.length, 160), (steps) => {
            const seen = agree(build, [{ kind: 'reset' }, ...steps], timing);
            hits += seen.hits;
            heldHits += seen.heldHits;
          }),
          { seed: 20261205, numRuns: 6 },
        );
      }
      // The runs come back to clocks they have seen, so the memo answers many of them whole, and
      // some new clocks from a held state it has seen.
      expect(hits).toBeGreaterThan(200);
      if (inputs > 0) expect(heldHits).toBeGreaterThan(0);
    },
  );

  it('agrees on random machines, through bumped latches and unused codes (fixed seed)', () => {
    const seen: Seen = { hits: 0, heldHits: 0, emptied: 0, unusedStarts: 0, recoveries: 0, unusedHits: 0, clocks: 0 };
    fc.assert(
      fc.property(
        fc.integer({ min: 2, max: 9 }),
        fc.integer({ min: 0, max: 3 }),
        fc.integer({ min: 1, max: 3 }),
        fc.integer({ min: 1, max: 10_000 }),
        (states, inputs, outputs, seed) => {
          const build = randomBuild(states, inputs, outputs, seed);
          const steps = fc.sample(stepsArb(inputs, 200), { seed, numRuns: 1 })[0];
          const s = agree(build, [{ kind: 'reset' }, ...steps], timing);
          seen.hits += s.hits;
          seen.heldHits += s.heldHits;
          seen.unusedStarts += s.unusedStarts;
          seen.recoveries += s.recoveries;
          seen.clocks += s.clocks;
        },
      ),
      { seed: 20261206, numRuns: 30 },
    );
    expect(seen.hits).toBeGreaterThan(seen.clocks / 4);
    expect(seen.heldHits).toBeGreaterThan(0);
    // Rule-breaking lever moves leave some clocks starting at a code no state has, and the
    // machine recovers from it into one of its states.
    expect(seen.unusedStarts).toBeGreaterThan(0);
    expect(seen.recoveries).toBeGreaterThan(0);
  });

  it('answers clocks from unused codes exactly, and recovers from them as the machine does', () => {
    let found = 0;
    let unusedHits = 0;
    let recoveries = 0;
    for (let seed = 41; seed < 61 && found < 4; seed++) {
      const inputs = 1 + (seed % 2);
      const build = randomBuild([3, 5, 6, 7][seed % 4], inputs, 1, seed);
      const prefix = pathToUnusedCode(build, seed);
      if (!prefix) continue;
      found++;
      // From the unused code: each clock, taken back and taken again (the memo answers the second).
      const again: Step[] = [];
      for (let k = 0; k < 2 ** inputs; k++)
        again.push({ kind: 'clock', inputs: k }, { kind: 'undo' }, { kind: 'clock', inputs: k }, { kind: 'undo' });
      const seen = agree(build, [...prefix, ...again], timing);
      unusedHits += seen.unusedHits;
      recoveries += seen.recoveries;
    }
    expect(found).toBe(4);
    expect(unusedHits).toBeGreaterThan(4);
    expect(recoveries).toBeGreaterThan(4);
  });

  it('agrees with unequal stage delays, where glitches and races show', () => {
    const rnd = seededRandom(7);
    for (const name of ['crossing', 'sequence-lock']) {
      const { build } = exampleBuild(name);
      const delays: Record<string, number> = {};
      for (const p of build.netlist.parts) if (p.kind === 'gate') delays[p.id] = 0.1 + 0.4 * rnd.next();
      const steps = fc.sample(stepsArb(build.machine.inputs.length, 400), { seed: 3, numRuns: 1 })[0];
      expect(agree(build, [{ kind: 'reset' }, ...steps], { ...timing, delays }).hits).toBeGreaterThan(50);
    }
  });

  it('agrees on a machine too wide for a number to name its states (50 input levers)', () => {
    const f = randomFlatMachine(3, 50, 2, 5);
    const build = synthesise(
      f,
      { strategy: 'binary', bits: 2, codes: ['00', '01', '10'] },
      { profile: DEFAULT_PROFILE },
    );
    const steps = fc.sample(stepsArb(50, 300), { seed: 13, numRuns: 1 })[0];
    expect(agree(build, [{ kind: 'reset' }, ...steps], timing).hits).toBeGreaterThan(50);
  });

  // LGSynth'91 s298 (tests/fixtures/lgsynth91/, provenance in its PROVENANCE.md), synthesised
  // with binary codes by state order (no placement or buffer trees: what the runner steps is the
  // same kind of netlist, and this keeps the test short).
  it("agrees on LGSynth'91 s298", () => {
    const file = 'tests/fixtures/lgsynth91/s298.json';
    const a = analyse(readFileSync(file, 'utf8'), file);
    if (!a.ok) throw new Error('s298 must analyse');
    const f = a.minimised.machine;
    const bits = Math.ceil(Math.log2(f.states.length));
    const codes = f.states.map((_, i) => i.toString(2).padStart(bits, '0'));
    const build = synthesise(f, { strategy: 'binary', bits, codes }, { profile: DEFAULT_PROFILE });
    expect(build.parts.gates).toBeGreaterThan(500); // before the drive check adds buffer trees
    const steps = fc.sample(stepsArb(f.inputs.length, 120), { seed: 17, numRuns: 1 })[0];
    expect(agree(build, [{ kind: 'reset' }, ...steps], timing).hits).toBeGreaterThan(10);
  });

  it('stays exact when its bound empties it again and again', () => {
    const { build } = exampleBuild('lighthouse');
    const steps = fc.sample(stepsArb(build.machine.inputs.length, 600), { seed: 11, numRuns: 1 })[0];
    const seen = agree(build, [{ kind: 'reset' }, ...steps], timing, 2500);
    expect(seen.emptied).toBeGreaterThan(2);
    expect(seen.hits).toBeGreaterThan(0);
  });

  it('rests through a run that seldom comes back to a clock, and keeps again when it does', () => {
    // A 14-input machine stepped at random: nearly every clock is new to the memo.
    const build = randomBuild(9, 14, 2, 3);
    const rnd = seededRandom(19);
    const steps: Step[] = [{ kind: 'reset' }];
    for (let i = 0; i < 4000; i++) steps.push({ kind: 'clock', inputs: rnd.int(2 ** 14) });
    for (let i = 0; i < 4000; i++) steps.push({ kind: 'clock', inputs: rnd.int(3) });
    const memo = createRunner(build, timing);
    const plainRunner = createRunner(build, timing, { memoBytes: 0 });
    let hitsWhileRepeating = 0;
    for (const [i, s] of steps.entries()) {
      if (s.kind === 'reset') {
        memo.reset();
        plainRunner.reset();
        continue;
      }
      if (s.kind !== 'clock') continue;
      const inputs = inputValues(build.machine.inputs, s.inputs);
      const hitsBefore = memo.memoStats().hits;
      const a = plain(memo.clock(inputs));
      const b = plain(plainRunner.clock(inputs));
      if (JSON.stringify(a) !== JSON.stringify(b)) expect({ i, a }).toEqual({ i, a: b });
      if (i > 4000 && memo.memoStats().hits > hitsBefore) hitsWhileRepeating++;
    }
    expect(memo.state).toEqual(plainRunner.state);
    expect(memo.memoStats().rested).toBeGreaterThan(0);
    // Back in a few states with three input combinations, the memo keeps and answers again.
    expect(hitsWhileRepeating).toBeGreaterThan(2000);
  });

  it('keeps nothing with a bound of 0, and clocks from a state that is not ready are settled', () => {
    const { build } = exampleBuild('marble-bell');
    const off = createRunner(build, timing, { memoBytes: 0 });
    off.reset();
    for (let i = 0; i < 20; i++) off.clock({});
    expect(off.memoStats()).toEqual({ hits: 0, heldHits: 0, misses: 0, states: 0, clocks: 0, emptied: 0, rested: 0 });
    const on = createRunner(build, timing);
    on.clock({}); // at power-up the latches are X: not ready, not kept
    expect(on.memoStats()).toMatchObject({ hits: 0, heldHits: 0, states: 0, clocks: 0 });
    on.reset();
    on.clock({});
    on.clock({});
    on.clock({});
    expect(on.memoStats().hits).toBeGreaterThan(0);
  });
});
