/**
 * xstate interop. The outside reference is the npm package `xstate` 5.33.3 itself: its actor
 * (createMachine, createActor, send, getSnapshot, inspection events) is run side by side with
 * our abstract simulator (flatten + stepAbstract) on random sequences with fixed seeds.
 */
import { readFileSync, readdirSync } from 'node:fs';
import * as fc from 'fast-check';
import { createMachine } from 'xstate';
import { describe, expect, it } from 'vitest';
import { parseTextMachine } from '../../../src/core/forms/text.js';
import { clockEvent, exportXstate, featureNote, importXstate, type Feature } from '../../../src/core/forms/xstate.js';
import { LIMITS } from '../../../src/core/model/limits.js';
import type { Machine } from '../../../src/core/model/machine.js';
import { seededRandom } from '../../../src/core/model/random.js';
import { randomFlatConfig, randomMachine } from './xstate/generators.js';
import {
  abstractStepper,
  agrees,
  allowedAssignments,
  flatOf,
  leverAssignment,
  randomSequence,
  xstateStepper,
  type Observed,
} from './xstate/harness.js';

/** A ticket gate we invent: a coin unlocks (with a chime), a push locks again; staff can reset it from anywhere. */
const ticketGate = {
  id: 'ticket_gate',
  initial: 'locked',
  on: { service: '.locked' },
  states: {
    locked: { tags: ['lamp'], on: { coin: { target: 'unlocked', meta: { outputs: { chime: 1 } } }, push: {} } },
    unlocked: { meta: { outputs: { chime: 0 } }, on: { push: 'locked', coin: { meta: { outputs: { refund: 1 } } } } },
  },
};

/** A three-event sequence lock we invent: dial left, dial right, then press; wrong moves restart. */
const dialLock = {
  id: 'dial',
  initial: 'idle',
  states: {
    idle: { on: { left: 'one', right: 'idle', press: [{ target: '#dial.idle' }, 'one'] } },
    one: { id: 'first', on: { right: { target: '#second' }, left: '#first', press: 'idle' } },
    two: {
      id: 'second',
      on: { press: { target: 'open', meta: { outputs: { bolt: 1 } } }, left: 'idle', right: 'idle' },
    },
    open: { tags: 'bolt', on: { left: 'idle', right: 'idle', press: [] } },
  },
};

/** A kiln door we invent: a final state (the door jams shut after an overheat), and root transitions. */
const kilnDoor = {
  initial: 'closed',
  on: { alarm: { target: '#(machine).jammed', meta: { outputs: { siren: 1 } } }, open: [] },
  states: {
    closed: { on: { open: 'ajar' } },
    ajar: { meta: { outputs: { draught: 1, siren: 0 } }, on: { shut: 'closed', alarm: {} } },
    jammed: { type: 'final', tags: ['siren'] },
  },
};

/** Run an imported config in xstate and our simulator on a random lever sequence; return the first disagreement. */
function compareImport(
  config: object,
  seed: number,
  clocks = 40,
): { ours: Observed; theirs: Observed; clock: number } | undefined {
  const r = importXstate(config);
  expect(r.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
  const m = r.machine as Machine;
  const f = flatOf(m);
  const ours = abstractStepper(f);
  const theirs = xstateStepper(config, {}, m.outputs);
  const levers = [-1, ...m.inputs.map((_, i) => i)];
  const seq = randomSequence(seededRandom(seed), levers, clocks);
  for (let k = 0; k < seq.length; k++) {
    const i = seq[k];
    const o = ours(leverAssignment(m.inputs.length, i));
    const t = theirs(i < 0 ? null : { type: m.inputs[i] });
    if (!agrees(o, t)) return { ours: o, theirs: t, clock: k };
  }
  return undefined;
}

/** Export a machine, run it in xstate and in our simulator on random allowed inputs; return the first disagreement. */
function compareExport(m: Machine, seed: number, form: 'auto' | 'clock' = 'auto', clocks = 40) {
  const f = flatOf(m);
  const x = exportXstate(m, { form });
  const ours = abstractStepper(f);
  const theirs = xstateStepper(JSON.parse(JSON.stringify(x.config)) as object, x.implementations.guards, m.outputs);
  const seq = randomSequence(seededRandom(seed), allowedAssignments(f), clocks);
  for (let k = 0; k < seq.length; k++) {
    const a = seq[k];
    const o = ours(a);
    const lever = a.indexOf('1');
    const event = x.form === 'clock' ? clockEvent(m.inputs, a) : lever < 0 ? null : { type: m.inputs[lever] };
    const t = theirs(event);
    if (!agrees(o, t)) return { ours: o, theirs: t, clock: k, form: x.form };
  }
  return undefined;
}

describe('core/forms/xstate import', () => {
  it('maps the ticket gate: one lever per event, never pairs, tags and Mealy meta as outputs, root on in every state', () => {
    const r = importXstate(ticketGate, 'gate.json');
    expect(r.diagnostics).toEqual([]);
    const m = r.machine as Machine;
    expect(m.name).toBe('ticket_gate');
    expect(m.inputs).toEqual(['coin', 'push', 'service']);
    expect(m.outputs).toEqual(['lamp', 'chime', 'refund']);
    expect(m.unspecified).toBe('hold');
    expect(m.never.map((g) => g.text)).toEqual(['coin & push', 'coin & service', 'push & service']);
    const locked = m.states[0];
    expect({ ...locked.outputs }).toEqual({ lamp: 1 });
    expect(locked.transitions.map((t) => [t.when.text, t.to, { ...t.outputs }])).toEqual([
      ['coin', 'unlocked', { chime: 1 }],
      ['push', 'locked', {}],
      ['service', 'locked', {}],
    ]);
    expect(m.states[1].transitions.map((t) => [t.when.text, t.to])).toEqual([
      ['push', 'locked'],
      ['coin', 'unlocked'],
      ['service', 'locked'],
    ]);
    expect(locked.transitions[0].loc).toEqual({ file: 'gate.json', path: '$.states.locked.on.coin' });
  });

  it('refuses more states than the tool takes (LW400) by counting them, before reading any state', () => {
    const n = LIMITS.states + 1;
    const states: Record<string, unknown> = {};
    // A state whose reading would report problems: none is reported, as none is read.
    for (let i = 0; i < n; i++) states[`s${i}`] = i === 0 ? { entry: ['beep'], on: { GO: '#nowhere' } } : {};
    const r = importXstate({ id: 'big', initial: 's0', states }, 'big.json');
    expect(r.machine).toBeUndefined();
    expect(r.diagnostics).toEqual([
      {
        code: 'LW400',
        severity: 'error',
        message: `the machine has ${n} states; the tool handles at most ${LIMITS.states}`,
        location: { file: 'big.json', path: `$.states.s${LIMITS.states}` },
        hint: 'split the machine',
      },
    ]);
    // At the limit it is read (and validated) as usual.
    delete states[`s${LIMITS.states}`];
    expect(importXstate({ id: 'big', initial: 's0', states }).diagnostics.map((d) => d.code)).toEqual([
      'LW500',
      'LW200',
    ]);
  });

  it('agrees with xstate 5.33.3 (createActor/send/getSnapshot) on state and outputs after every event: ticket gate, dial lock, kiln door', () => {
    [ticketGate, dialLock, kilnDoor].forEach((config, i) => {
      for (const seed of [1, 2, 3]) expect(compareImport(config, 100 * i + seed, 60)).toBeUndefined();
    });
  });

  it('a final state answers to nothing, not even the root transitions (xstate stops the machine there)', () => {
    const m = importXstate(kilnDoor).machine as Machine;
    expect(m.states.find((s) => s.name === 'jammed')?.transitions).toEqual([]);
    // an empty candidate list bubbles to the root; the root's empty list does nothing
    expect(m.states.find((s) => s.name === 'closed')?.transitions.map((t) => [t.when.text, t.to])).toEqual([
      ['open', 'ajar'],
      ['alarm', 'jammed'],
    ]);
  });

  it('marks a final state final, and reads the loads of outputs from the root meta.loadsG', () => {
    const m = importXstate(kilnDoor).machine as Machine;
    expect(m.states.find((s) => s.name === 'jammed')?.final).toBe(true);
    expect(m.states.find((s) => s.name === 'closed')?.final).toBeUndefined();
    const withLoads = importXstate({ ...ticketGate, meta: { loadsG: { chime: 120 } } }, 'gate.json');
    expect(withLoads.diagnostics).toEqual([]);
    expect(withLoads.machine?.loadsG).toEqual({ chime: 120 });
    expect(withLoads.machine?.partLocs?.['load:chime']).toEqual({ file: 'gate.json', path: '$.meta.loadsG.chime' });
    const bad = importXstate({ ...ticketGate, meta: { loadsG: { chime: '120 g', lamp: 0 } } });
    expect(bad.diagnostics.map((d) => [d.code, d.location.path])).toEqual([
      ['LW107', '$.meta.loadsG.chime'],
      ['LW107', '$.meta.loadsG.lamp'],
    ]);
    expect(importXstate({ ...ticketGate, meta: { loadsG: 5 } }).diagnostics[0]).toMatchObject({ code: 'LW501' });
  });

  it('agrees with xstate 5.33.3 on random flat configs of the supported subset (fast-check, fixed seed)', () => {
    let accepted = 0;
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 2 ** 31 - 1 }), (seed) => {
        const config = randomFlatConfig(seededRandom(seed));
        const r = importXstate(config);
        expect(r.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
        accepted++;
        expect(compareImport(config, seed, 30)).toBeUndefined();
      }),
      { seed: 42, numRuns: 100 },
    );
    expect(accepted).toBe(100);
  });

  it('resolves #id, #machine.state, sibling and .child-from-root targets as xstate does, and reports the rest as LW200', () => {
    const bad = (on: Record<string, unknown>, rootOn?: Record<string, unknown>) =>
      importXstate({
        id: 'm',
        initial: 'a',
        ...(rootOn ? { on: rootOn } : {}),
        states: { a: { on }, bb: { id: 'bee' } },
      }).diagnostics;
    expect(bad({ go: 'bx' })).toMatchObject([
      { code: 'LW200', location: { path: '$.states.a.on.go' }, hint: "did you mean 'bb'?" },
    ]);
    expect(bad({ go: '.bb' })).toMatchObject([
      {
        code: 'LW200',
        hint: "'.bb' names a child of state 'a', and states of a flat machine have none; write 'bb' for the state 'bb'",
      },
    ]);
    expect(bad({ go: { target: '#m.bb.x' } })).toMatchObject([
      { code: 'LW200', location: { path: '$.states.a.on.go.target' } },
    ]);
    expect(bad({ go: '#bea' })).toMatchObject([{ code: 'LW200', hint: "did you mean '#bee'?" }]);
    expect(bad({}, { go: 'bb' })).toMatchObject([
      { code: 'LW200', location: { path: '$.on.go' }, hint: "on the machine root a state is written '.bb'" },
    ]);
    expect(bad({ go: '#m' })).toMatchObject([
      { code: 'LW500', message: expect.stringContaining(featureNote('rootTarget').name) as unknown },
    ]);
    for (const ok of ['bb', '#bee', '#m.bb']) expect(bad({ go: ok })).toEqual([]);
    expect(bad({}, { go: '.bb' })).toEqual([]);
    // xstate itself refuses a plain name on the root ("not a valid target from the root node")
    expect(() => createMachine({ initial: 'a', on: { go: 'a' }, states: { a: {} } })).toThrow(/root node/);
  });

  const unsupported: [Feature, unknown, string, string][] = [
    [
      'parallel',
      { initial: 'a', states: { a: { type: 'parallel', states: { x: {}, y: {} } } } },
      '$.states.a.type',
      "state 'a'",
    ],
    ['parallel', { type: 'parallel', states: { x: {}, y: {} } }, '$.type', 'the machine root'],
    ['nested', { initial: 'a', states: { a: { initial: 'x', states: { x: {} } } } }, '$.states.a.states', "state 'a'"],
    ['history', { initial: 'a', states: { a: {}, back: { type: 'history' } } }, '$.states.back.type', "state 'back'"],
    ['after', { initial: 'a', states: { a: { after: { 1000: 'a' } } } }, '$.states.a.after', "state 'a'"],
    ['always', { initial: 'a', states: { a: { always: 'b' }, b: {} } }, '$.states.a.always', "state 'a'"],
    ['eventless', { initial: 'a', states: { a: { on: { '': 'a' } } } }, '$.states.a.on[""]', "state 'a'"],
    [
      'guard',
      { initial: 'a', states: { a: { on: { go: { target: 'a', guard: 'isWarm' } } } } },
      '$.states.a.on.go.guard',
      "state 'a'",
    ],
    [
      'guard',
      { initial: 'a', states: { a: { on: { go: [{ target: 'a', guard: { type: 'isWarm' } }] } } } },
      '$.states.a.on.go[0].guard',
      "state 'a'",
    ],
    [
      'cond',
      { initial: 'a', states: { a: { on: { go: { target: 'a', cond: 'isWarm' } } } } },
      '$.states.a.on.go.cond',
      "state 'a'",
    ],
    [
      'in',
      { initial: 'a', states: { a: { on: { go: { target: 'a', in: '#x' } } } } },
      '$.states.a.on.go.in',
      "state 'a'",
    ],
    [
      'actions',
      { initial: 'a', states: { a: { on: { go: { target: 'a', actions: ['ring'] } } } } },
      '$.states.a.on.go.actions',
      "state 'a'",
    ],
    ['entry', { initial: 'a', states: { a: { entry: 'ring' } } }, '$.states.a.entry', "state 'a'"],
    ['exit', { initial: 'a', states: { a: { exit: ['ring'] } } }, '$.states.a.exit', "state 'a'"],
    ['invoke', { initial: 'a', states: { a: { invoke: { src: 'timer' } } } }, '$.states.a.invoke', "state 'a'"],
    ['entry', { initial: 'a', entry: 'boot', states: { a: {} } }, '$.entry', 'the machine root'],
    ['context', { initial: 'a', context: { count: 0 }, states: { a: {} } }, '$.context', 'the machine root'],
    [
      'finalTransitions',
      { initial: 'a', states: { a: { type: 'final', on: { go: 'a' } } } },
      '$.states.a.on',
      "state 'a'",
    ],
    ['wildcard', { initial: 'a', states: { a: { on: { '*': 'a' } } } }, '$.states.a.on["*"]', "state 'a'"],
    [
      'builtinEvent',
      { initial: 'a', states: { a: { on: { 'xstate.init': 'a' } } } },
      '$.states.a.on["xstate.init"]',
      "state 'a'",
    ],
    [
      'multipleTargets',
      { initial: 'a', states: { a: { on: { go: { target: ['a', 'b'] } } }, b: {} } },
      '$.states.a.on.go.target',
      "state 'a'",
    ],
    ['onDone', { initial: 'a', states: { a: { onDone: 'a' } } }, '$.states.a.onDone', "state 'a'"],
    [
      'rootOutputs',
      { initial: 'a', meta: { outputs: { x: 1 } }, states: { a: {} } },
      '$.meta.outputs',
      'the machine root',
    ],
  ];
  it.each(unsupported)('reports %s as LW500 naming the feature and the state path', (feature, config, path, where) => {
    const r = importXstate(config);
    expect(r.machine).toBeUndefined();
    const d = r.diagnostics.find((x) => x.code === 'LW500');
    expect(d?.location.path).toBe(path);
    expect(d?.message).toContain(featureNote(feature).name);
    expect(d?.message).toContain(where);
    expect(d?.message).toContain(path);
    expect(d?.hint).toBe(featureNote(feature).hint);
  });

  it('accepts empty feature values (entry: [], context: {}) that do nothing in xstate either', () => {
    const r = importXstate({
      initial: 'a',
      context: {},
      entry: [],
      states: { a: { exit: [], on: { go: { target: 'a', actions: [] } } } },
    });
    expect(r.diagnostics).toEqual([]);
  });

  const malformed: [string, unknown, string][] = [
    ['a list', [1, 2], '$'],
    ['null', null, '$'],
    ['no initial', { states: { a: {} } }, '$'],
    ['states not an object', { initial: 'a', states: ['a'] }, '$.states'],
    ['a state that is a number', { initial: 'a', states: { a: 3 } }, '$.states.a'],
    ['on as a list', { initial: 'a', states: { a: { on: [{ event: 'go', target: 'a' }] } } }, '$.states.a.on'],
    ['a transition that is a number', { initial: 'a', states: { a: { on: { go: 7 } } } }, '$.states.a.on.go'],
    ['a null target', { initial: 'a', states: { a: { on: { go: { target: null } } } } }, '$.states.a.on.go.target'],
    ['meta.outputs a list', { initial: 'a', states: { a: { meta: { outputs: ['x'] } } } }, '$.states.a.meta.outputs'],
    ['a tag that is a number', { initial: 'a', states: { a: { tags: [1] } } }, '$.states.a.tags[0]'],
    ['two states with one id', { initial: 'a', states: { a: { id: 'x' }, b: { id: 'x' } } }, '$.states.b.id'],
    [
      'a tag contradicted by meta',
      { initial: 'a', states: { a: { tags: ['x'], meta: { outputs: { x: 0 } } } } },
      '$.states.a.meta.outputs',
    ],
  ];
  it.each(malformed)('reports a malformed config (%s) as LW501 with its JSON path', (_, config, path) => {
    const r = importXstate(config, 'c.json');
    expect(r.machine).toBeUndefined();
    expect(r.diagnostics.find((d) => d.code === 'LW501')?.location).toEqual({ file: 'c.json', path });
  });

  it('reports names that cannot be levers, outputs or states (LW205), bad output values (LW106), an unknown initial state (LW204), a name used twice (LW203)', () => {
    const codes = (c: unknown) => importXstate(c).diagnostics.map((d) => [d.code, d.location.path]);
    expect(codes({ initial: 'a', states: { a: { on: { 'coin.in': 'a' } } } })).toEqual([
      ['LW205', '$.states.a.on["coin.in"]'],
    ]);
    expect(importXstate({ initial: 'a', states: { a: { on: { 'coin.in': 'a' } } } }).diagnostics[0].hint).toContain(
      "'coin_in'",
    );
    expect(codes({ initial: 'a', states: { a: { on: { constructor: 'a' } } } })).toEqual([
      ['LW205', '$.states.a.on.constructor'],
    ]);
    expect(codes({ initial: 'a', states: { 'a b': {}, a: {} } })).toEqual([['LW205', '$.states["a b"]']]);
    expect(codes({ initial: 'a', states: { a: { meta: { outputs: { x: 2 } } } } })).toEqual([
      ['LW106', '$.states.a.meta.outputs.x'],
    ]);
    expect(codes({ initial: 'aa', states: { ab: {} } })).toEqual([['LW204', '$.initial']]);
    expect(codes({ initial: 'a', states: { a: { tags: 'go', on: { go: 'a' } } } })).toEqual([['LW203', '$']]);
    expect(codes({ initial: 'a', states: { a: { colour: 'red' } } })).toEqual([['LW105', '$.states.a.colour']]);
  });

  it('never throws on arbitrary values (fast-check, fixed seed)', () => {
    const junk = fc.anything({ withNullPrototype: true, withObjectString: true, maxDepth: 4 });
    const shaped = fc.record(
      {
        initial: fc.oneof(fc.string(), junk),
        states: fc.dictionary(
          fc.oneof(fc.string(), fc.constantFrom('__proto__', 'constructor', 'a')),
          fc.oneof(junk, fc.record({ on: junk, tags: junk, meta: junk, type: junk })),
        ),
        on: junk,
        id: junk,
      },
      { requiredKeys: [] },
    );
    fc.assert(
      fc.property(fc.oneof(junk, shaped), (v) => {
        const r = importXstate(v);
        expect(r.diagnostics.some((d) => d.message.startsWith('the configuration could not be read'))).toBe(false);
        expect(r.machine === undefined || !r.diagnostics.some((d) => d.severity === 'error')).toBe(true);
      }),
      { seed: 42, numRuns: 400 },
    );
  });
});

describe('core/forms/xstate export', () => {
  const examples = readdirSync(new URL('../../../examples/', import.meta.url))
    .filter((f) => f.endsWith('.lw'))
    .sort();
  const parse = (text: string, file?: string): Machine => {
    const r = parseTextMachine(text, file);
    expect(r.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    return r.machine as Machine;
  };

  it.each(examples)('examples/%s exported and run in xstate 5.33.3 agrees with stepAbstract, in both forms', (file) => {
    const m = parse(readFileSync(new URL(`../../../examples/${file}`, import.meta.url), 'utf8'), file);
    for (const seed of [7, 8]) {
      expect(compareExport(m, seed)).toBeUndefined();
      expect(compareExport(m, seed, 'clock')).toBeUndefined();
    }
  });

  it('writes the loads into the root meta and a final state that answers to nothing as type "final"', () => {
    const m = parse(
      'machine m\ninputs a\noutputs z\nload z 300 g\nstart s\nstate s\n  when a go t\nstate t final with z=1\n',
    );
    expect(exportXstate(m, { form: 'clock' }).config.states.t.type).toBe('final');
    const { config, form } = exportXstate(m);
    expect(form).toBe('levers');
    expect(config.meta.loadsG).toEqual({ z: 300 });
    expect(config.states.t.type).toBe('final');
    expect(config.states.s.type).toBeUndefined();
    const back = importXstate(JSON.parse(JSON.stringify(config)) as unknown).machine as Machine;
    expect(back.loadsG).toEqual({ z: 300 });
    expect(back.states.find((s) => s.name === 't')?.final).toBe(true);
  });

  it('chooses the levers form exactly for machines shaped like an xstate import', () => {
    const lock = parse(readFileSync(new URL('../../../examples/sequence-lock.lw', import.meta.url), 'utf8'));
    expect(exportXstate(lock).form).toBe('levers');
    expect(exportXstate(lock, { form: 'clock' }).form).toBe('clock');
    const odd = parse(readFileSync(new URL('../../../examples/odd-lever.lw', import.meta.url), 'utf8'));
    expect(exportXstate(odd).form).toBe('clock');
  });

  it('writes the clock form as guarded CLOCK candidates in first-match order, outputs in meta', () => {
    const m = parse(
      [
        'machine porch',
        'inputs step, dark',
        'outputs lamp',
        'start off',
        'state off',
        '  when step & dark go on',
        'state on with lamp=1',
        '  when !step go off with lamp=0',
        '  go on',
      ].join('\n'),
    );
    const x = exportXstate(m);
    expect(x.form).toBe('clock');
    expect(x.config).toEqual({
      id: 'porch',
      initial: 'off',
      meta: { form: 'clock', inputs: ['step', 'dark'], outputNames: ['lamp'] },
      states: {
        off: {
          meta: { outputs: { lamp: 0 } },
          on: {
            CLOCK: [
              {
                target: 'on',
                guard: { type: 'holds', params: { cubes: ['11'] } },
                description: 'when step & dark',
                meta: { outputs: { lamp: 0 } },
              },
            ],
          },
        },
        on: {
          meta: { outputs: { lamp: 1 } },
          on: {
            CLOCK: [
              {
                target: 'off',
                guard: { type: 'holds', params: { cubes: ['0-'] } },
                description: 'when !step',
                meta: { outputs: { lamp: 0 } },
              },
              { description: 'when 1', meta: { outputs: { lamp: 1 } } },
            ],
          },
        },
      },
    });
    const holds = x.implementations.guards.holds;
    expect(holds({ event: clockEvent(m.inputs, '11') }, { cubes: ['11'] })).toBe(true);
    expect(holds({ event: { type: 'CLOCK', inputs: { step: true } } }, { cubes: ['1-'] })).toBe(true);
    expect(holds({ event: { type: 'CLOCK' } }, { cubes: ['1-'] })).toBe(false);
    expect(holds({ event: null }, null)).toBe(false);
  });

  it('random machines exported in the clock form agree with stepAbstract in xstate 5.33.3 (fast-check, fixed seed)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 2 ** 31 - 1 }), (seed) => {
        const m = randomMachine(seededRandom(seed), 'general');
        expect(compareExport(m, seed, 'clock', 30)).toBeUndefined();
      }),
      { seed: 42, numRuns: 100 },
    );
  });

  it('random lever-shaped machines export in the levers form, agree with xstate 5.33.3, and import back to the same behaviour', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 2 ** 31 - 1 }), (seed) => {
        const m = randomMachine(seededRandom(seed), 'levers');
        const x = exportXstate(m);
        expect(x.form).toBe('levers');
        expect(compareExport(m, seed, 'auto', 30)).toBeUndefined();
        // round trip: the imported machine steps like the original (levers nobody answers to may vanish)
        const back = importXstate(JSON.parse(JSON.stringify(x.config)));
        expect(back.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
        const b = back.machine as Machine;
        const f = flatOf(m);
        const ours = abstractStepper(f);
        const theirs = abstractStepper(flatOf(b));
        for (const a of randomSequence(seededRandom(seed + 1), allowedAssignments(f), 30)) {
          const lever = a.indexOf('1');
          const o = ours(a);
          const t = theirs(leverAssignment(b.inputs.length, lever < 0 ? -1 : b.inputs.indexOf(m.inputs[lever])));
          expect(agrees(o, t)).toBe(true);
        }
      }),
      { seed: 42, numRuns: 100 },
    );
  });
});
