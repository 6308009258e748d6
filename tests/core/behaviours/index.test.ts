import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { BEHAVIOURS, BEHAVIOUR_WRITERS, writeBehaviour } from '../../../src/core/behaviours/index.js';
import { parseTextMachine, printTextMachine } from '../../../src/core/forms/text.js';
import { analyse } from '../../../src/core/pipeline.js';
import { analysedBehaviour } from './harness.js';

describe('core/behaviours/index', () => {
  it('writes every behaviour from the examples of its fields, readable and commented', () => {
    for (const b of BEHAVIOURS) {
      const values = Object.fromEntries(b.fields.map((f) => [f.key, f.example]));
      const w = BEHAVIOUR_WRITERS[b.name](values);
      expect(w.ok, b.name).toBe(true);
      if (!w.ok) continue;
      const a = analysedBehaviour(b.name, values);
      // Every state line says in words what the state remembers.
      const stateLines = w.text.split('\n').filter((l) => l.startsWith('state '));
      expect(stateLines.length).toBe(a.machine.states.length);
      for (const l of stateLines) expect(l).toMatch(/ # remembers: \S/);
      // The header comment is the sentence, carried as the machine's description.
      expect(a.machine.description?.split('\n')[0]).toBe(w.sentence);
      // The text form reads back to the same machine when printed and read again.
      const again = parseTextMachine(printTextMachine(a.machine));
      expect(again.machine?.states.map((s) => s.name)).toEqual(a.machine.states.map((s) => s.name));
    }
  });

  it('names an unknown behaviour with LW804 and the nearest name', () => {
    const w = writeBehaviour('toggel', {});
    expect(w.ok).toBe(false);
    if (!w.ok)
      expect(w.diagnostics.map((d) => [d.code, d.location.path, d.hint])).toEqual([
        [
          'LW804',
          'behaviour',
          'did you mean toggle? behaviours: counting, sequence, hold, toggle, collect, cycle, delay',
        ],
      ]);
  });

  it('gives a field of a user name no special meaning (constructor, __proto__)', () => {
    const w = writeBehaviour('toggle', { input: 'constructor', output: '__proto__', name: 'toString' });
    expect(w.ok).toBe(true);
    expect(
      writeBehaviour(
        'toggle',
        Object.assign(Object.create(null) as object, { input: 'a', output: 'b' }) as Record<string, string>,
      ).ok,
    ).toBe(true);
  });

  it('docs/behaviours.md gives each behaviour its section and each of its options', () => {
    const doc = readFileSync('docs/behaviours.md', 'utf8');
    for (const b of BEHAVIOURS) {
      expect(doc).toContain(`### ${b.name} — `);
      const section = doc.slice(doc.indexOf(`### ${b.name} — `)).split('\n### ')[0];
      for (const f of b.fields.filter((x) => x.key !== 'name'))
        expect(section, `${b.name} --${f.key}`).toContain(`\`--${f.key} `);
    }
  });

  it('answers any field values with a machine that reads cleanly or with LW800–LW805, never an exception (fast-check, seed 9)', () => {
    const word = fc.oneof(
      fc.constantFrom(
        'a',
        'b',
        'lamp',
        'red',
        '2',
        '3',
        '40',
        'x y',
        '-',
        '',
        ' ',
        'constructor',
        'same-clock',
        'strict',
        'until-closed',
      ),
      fc.string({ maxLength: 6 }),
    );
    const values = fc.dictionary(
      fc.constantFrom(...new Set(BEHAVIOURS.flatMap((b) => b.fields.map((f) => f.key)))),
      fc.array(word, { maxLength: 4 }).map((ws) => ws.join(',')),
    );
    fc.assert(
      fc.property(fc.constantFrom(...BEHAVIOURS.map((b) => b.name)), values, (name, v) => {
        const w = writeBehaviour(name, v);
        if (!w.ok) {
          expect(w.diagnostics.length).toBeGreaterThan(0);
          for (const d of w.diagnostics) {
            expect(d.code).toMatch(/^LW80[0-5]$/);
            expect(d.location.path).toMatch(new RegExp(`^${name}\\.`));
            expect(d.hint).toBeDefined();
          }
          return;
        }
        const a = analyse(w.text, 'w.lw');
        expect(a.diagnostics.filter((d) => d.severity !== 'info')).toEqual([]);
        expect(a.ok).toBe(true);
      }),
      { seed: 9, numRuns: 1500 },
    );
  });
});
