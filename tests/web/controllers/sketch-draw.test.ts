import { describe, expect, it } from 'vitest';
import { analyse } from '../../../src/core/pipeline.js';
import { parseTextMachine } from '../../../src/core/forms/text.js';
import type { Machine } from '../../../src/core/model/machine.js';
import { SketchDraw } from '../../../src/web/controllers/sketch-draw.js';
import { applyEdit, type TextEdit } from '../../../src/web/controllers/table-edit.js';

/** A demo machine: a lamp that a button turns on and off. */
const LAMP = `machine lamp
inputs button, reset
outputs lamp
start dark

state dark   # waiting
  when button go lit

state lit with lamp=1
  when button | reset go dark
`;

function read(text: string): Machine {
  const r = parseTextMachine(text);
  if (!r.machine) throw new Error(r.diagnostics.map((d) => d.message).join('; '));
  return r.machine;
}

function drawer(): SketchDraw {
  let updates = 0;
  return new SketchDraw({
    addController: () => undefined,
    removeController: () => undefined,
    requestUpdate: () => void updates++,
    updateComplete: Promise.resolve(true),
  });
}

function apply(e: TextEdit | undefined): string {
  if (!e) throw new Error('no edit');
  return applyEdit(LAMP, e);
}

/** The first error the core finds in a text, worded as the sketch words it. */
function coreError(text: string): string {
  const d = analyse(text).diagnostics.find((x) => x.severity === 'error');
  return d ? `${d.code}: ${d.message}${d.hint ? ` — ${d.hint}` : ''}` : '';
}

describe('src/web/controllers/sketch-draw', () => {
  const m = read(LAMP);
  const at = { x: 10, y: 10 };

  it('adds a state by name, refusing an empty, taken or malformed one with the reason the core gives', () => {
    const d = drawer();
    d.open('new-state', at, m);
    d.type('');
    expect(d.submit(m, LAMP)).toBeUndefined();
    expect(d.field?.problem).toBe('Give the new state a name.');
    d.type('lit');
    expect(d.submit(m, LAMP)).toBeUndefined();
    expect(d.field?.problem).toBe(coreError(`${LAMP}\nstate lit\n`));
    expect(d.field?.problem).toMatch(/^LW203/);
    d.type('glow ing');
    expect(d.submit(m, LAMP)).toBeUndefined();
    expect(d.field?.problem).toMatch(/^LW101/);
    d.type('glowing');
    expect(apply(d.submit(m, LAMP))).toBe(`${LAMP}\nstate glowing\n`);
    expect(d.field).toBeUndefined();
    expect(d.said).toContain('Added state glowing.');
  });

  it('writes a drawn transition at the end of its state, with the core’s did-you-mean for a misspelt input', () => {
    const d = drawer();
    d.open('new-transition', at, m, { state: 'lit', to: 'lit' });
    d.type('rest');
    expect(d.submit(m, LAMP)).toBeUndefined();
    expect(d.field?.problem).toMatch(/^LW201: .*did you mean 'reset'\?/);
    d.type('reset & !button');
    const t2 = apply(d.submit(m, LAMP));
    expect(t2).toBe(LAMP.replace('go dark\n', 'go dark\n  when reset & !button go lit\n'));
    expect(read(t2).states[1].transitions.map((t) => `${t.when.text}->${t.to}`)).toEqual([
      'button | reset->dark',
      'reset & !button->lit',
    ]);
  });

  it('opens a field with what is written now: the guard, the name, the outputs', () => {
    const d = drawer();
    d.open('guard', at, m, { state: 'lit', to: 'dark', index: 0 });
    expect(d.field?.value).toBe('button | reset');
    d.open('rename', at, m, { state: 'dark' });
    expect(d.field?.value).toBe('dark');
    d.open('outputs', at, m, { state: 'lit' });
    expect(d.field?.value).toBe('lamp=1');
    // A name left as it was, or an always-guard left empty, closes the field with no edit.
    d.open('rename', at, m, { state: 'dark' });
    expect(d.submit(m, LAMP)).toBeUndefined();
    expect(d.field).toBeUndefined();
  });

  it('refuses to delete the start state, and says which transitions went with a deleted state', () => {
    const d = drawer();
    expect(d.act('delete', m, LAMP, { kind: 'state', id: 'dark' })).toBeUndefined();
    expect(d.said).toBe('dark is the start state: make another state the start before deleting it.');
    const t2 = apply(d.act('delete', m, LAMP, { kind: 'state', id: 'lit' }));
    expect(d.said).toContain('Deleted state lit with its transitions and 1 transition into it (from dark).');
    expect(read(t2).states.map((s) => `${s.name}:${s.transitions.length}`)).toEqual(['dark:0']);
    expect(t2).toContain('state dark   # waiting\n');
  });

  it('makes a state the start and deletes one transition of a label', () => {
    const d = drawer();
    expect(apply(d.act('start', m, LAMP, { kind: 'state', id: 'lit' }))).toBe(LAMP.replace('start dark', 'start lit'));
    const t2 = apply(d.act('delete', m, LAMP, { kind: 'edge', from: 'dark', to: 'lit', index: 0 }));
    expect(t2).toBe(LAMP.replace('  when button go lit\n', ''));
  });
});
