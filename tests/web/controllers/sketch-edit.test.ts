import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import type { Machine, State } from '../../../src/core/model/machine.js';
import { apply, read } from './edits.support.js';
import {
  deleteState,
  deleteTransition,
  joinEdits,
  outputsText,
  renameState,
  setOutputs,
  setStart,
  trialEdit,
} from '../../../src/web/controllers/sketch-edit.js';

const LOCK = readFileSync(fileURLToPath(new URL('../../../examples/sequence-lock.lw', import.meta.url)), 'utf8');

/** A demo machine written with comments, odd spacing and a state named in several places. */
const YARD = `# Yard gate (demo)
machine yard
inputs car, gone   # two levers
outputs gate, bell

start shut   # resting

state shut  code 00   with bell=1 # rings while shut
  when car go open   # a car comes
  go shut

# the open gate
state open with gate=1, bell=0 final
  when gone go shut
  when car go open

state spare
  go shut
`;

function state(m: Machine, name: string): State {
  const s = m.states.find((x) => x.name === name);
  if (!s) throw new Error(`no state ${name}`);
  return s;
}

/** The machine as plain words: start, then each state with its outputs and its transitions `guard->to`. */
function shape(m: Machine): string[] {
  return [
    `start ${m.start}`,
    ...m.states.map(
      (s) =>
        `${s.name} [${outputsText(s, m.outputs)}] ${s.transitions.map((t) => `${t.when.text}->${t.to}`).join(' ')}`,
    ),
  ];
}

/** The lines with a comment, which no edit here may change (unless it deletes their statement). */
const comments = (text: string): string[] => text.split('\n').filter((l) => l.includes('#'));

describe('src/web/controllers/sketch-edit', () => {
  const yard = read(YARD);

  it('joins separate edits into one span, keeping the text between them', () => {
    const text = 'abcdef';
    const e = joinEdits(text, [
      { from: 4, to: 5, insert: 'E' },
      { from: 0, to: 1, insert: 'A' },
    ]);
    expect(e).toEqual({ from: 0, to: 5, insert: 'AbcdE' });
    expect(apply(text, e)).toBe('AbcdEf');
    expect(
      joinEdits(text, [
        { from: 0, to: 3, insert: '' },
        { from: 2, to: 4, insert: '' },
      ]),
    ).toBeUndefined();
    expect(joinEdits(text, [undefined])).toBeUndefined();
  });

  it('renames a state at its declaration, the start line and every transition into it', () => {
    const t2 = apply(YARD, renameState(YARD, yard, 'shut', 'closed'));
    expect(shape(read(t2))).toEqual([
      'start closed',
      'closed [bell=1] car->open 1->closed',
      'open [gate=1, bell=0] gone->closed car->open',
      'spare [] 1->closed',
    ]);
    // Only the names changed; the comments (one says "shut") and every other character are as written.
    const outsideComments = (l: string): string => {
      const k = l.indexOf('#');
      return k < 0 ? l.replace(/\bshut\b/g, 'closed') : l.slice(0, k).replace(/\bshut\b/g, 'closed') + l.slice(k);
    };
    expect(t2).toBe(YARD.split('\n').map(outsideComments).join('\n'));
    expect(t2).toContain('# rings while shut\n');
  });

  it('refuses a rename to a taken or malformed name with the core diagnostic', () => {
    const taken = trialEdit(YARD, renameState(YARD, yard, 'spare', 'open'));
    expect(taken.ok).toBe(false);
    if (!taken.ok) expect(taken.problem).toMatch(/^LW203: the state 'open' is declared twice/);
    const bad = trialEdit(YARD, renameState(YARD, yard, 'spare', 'sp-are'));
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.problem).toMatch(/^LW205:/);
    expect(trialEdit(YARD, renameState(YARD, yard, 'spare', 'reserve')).ok).toBe(true);
  });

  it('makes another state the start', () => {
    const t2 = apply(YARD, setStart(YARD, yard, 'open'));
    expect(shape(read(t2))[0]).toBe('start open');
    expect(t2).toBe(YARD.replace('start shut ', 'start open '));
    expect(setStart(YARD, yard, 'shut')).toBeUndefined();
  });

  it('sets, changes and clears the outputs of a state, keeping its code, final mark and comment', () => {
    const spare = apply(YARD, setOutputs(YARD, state(yard, 'spare'), 'gate=1'));
    expect(shape(read(spare))[3]).toBe('spare [gate=1] 1->shut');
    expect(spare).toContain('\nstate spare with gate=1\n');
    const shut = apply(YARD, setOutputs(YARD, state(yard, 'shut'), 'gate=-, bell=0'));
    expect(shut).toContain('state shut  code 00 with gate=-, bell=0 # rings while shut\n');
    expect(shape(read(shut))[1]).toBe('shut [gate=-, bell=0] car->open 1->shut');
    const open = apply(YARD, setOutputs(YARD, state(yard, 'open'), ''));
    expect(open).toContain('\nstate open final\n');
    const m = read(open);
    expect(outputsText(state(m, 'open'), m.outputs)).toBe('');
    expect(state(m, 'open').final).toBe(true);
    // Nothing to clear on a state with no outputs.
    expect(setOutputs(YARD, state(yard, 'spare'), '')).toBeUndefined();
  });

  it('refuses outputs the machine does not declare, with the core diagnostic', () => {
    const t = trialEdit(YARD, setOutputs(YARD, state(yard, 'spare'), 'lamp=1'));
    expect(t.ok).toBe(false);
    if (!t.ok) expect(t.problem).toMatch(/^LW202:/);
  });

  it('deletes a transition (its line only)', () => {
    const t2 = apply(YARD, deleteTransition(YARD, state(yard, 'open').transitions[1]));
    expect(shape(read(t2))[2]).toBe('open [gate=1, bell=0] gone->shut');
    expect(t2).toBe(YARD.replace('  when car go open\n\nstate spare', '\nstate spare'));
  });

  it('deletes a state with its transitions and the transitions into it, and says which', () => {
    const d = deleteState(YARD, yard, 'open');
    if (!d) throw new Error('not deleted');
    expect(d.into.map((i) => `${i.from}:${i.transition.when.text}`)).toEqual(['shut:car']);
    const t2 = apply(YARD, d.edit);
    expect(shape(read(t2))).toEqual(['start shut', 'shut [bell=1] 1->shut', 'spare [] 1->shut']);
    // The comment above the deleted state stays.
    expect(t2).toContain('  go shut\n\n# the open gate\n\nstate spare\n');
    expect(comments(t2)).toEqual(comments(YARD).filter((l) => !l.includes('a car comes')));
  });

  it('deletes the last state of the text, and refuses to delete the start state', () => {
    const d = deleteState(YARD, yard, 'spare');
    if (!d) throw new Error('not deleted');
    const t2 = apply(YARD, d.edit);
    expect(t2.endsWith('  when car go open\n')).toBe(true);
    expect(read(t2).states.map((s) => s.name)).toEqual(['shut', 'open']);
    expect(deleteState(YARD, yard, 'shut')).toBeUndefined();
  });

  it('keeps CRLF line breaks when it deletes and renames', () => {
    const crlf = LOCK.replace(/\n/g, '\r\n');
    const m = read(crlf);
    const d = deleteState(crlf, m, 'open');
    if (!d) throw new Error('not deleted');
    const t2 = apply(crlf, d.edit);
    expect(t2).not.toMatch(/[^\r]\n/);
    expect(shape(read(t2))).toEqual([
      'start locked',
      'locked [] green->got_green',
      'got_green [] red->got_red blue->locked',
      'got_red [] green->got_green red->locked',
    ]);
    const t3 = apply(crlf, renameState(crlf, m, 'locked', 'idle'));
    expect(t3).toBe(crlf.replace(/\blocked\b/g, 'idle'));
  });

  it('reads the example as before after a rename and its reverse', () => {
    const m = read(LOCK);
    const there = apply(LOCK, renameState(LOCK, m, 'got_red', 'red_seen'));
    const back = apply(there, renameState(there, read(there), 'red_seen', 'got_red'));
    expect(back).toBe(LOCK);
  });
});
