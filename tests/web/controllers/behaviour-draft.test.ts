import { describe, expect, it } from 'vitest';
import { BEHAVIOURS, writeBehaviour } from '../../../src/core/behaviours/index.js';
import { BehaviourDraft } from '../../../src/web/controllers/behaviour-draft.js';
import { host } from './host.support.js';

describe('web/controllers/behaviour-draft', () => {
  it('starts from the first behaviour with its fields’ examples, optional fields empty, and writes what the core writes', () => {
    const h = host();
    const d = new BehaviourDraft(h);
    const b = BEHAVIOURS[0];
    expect(d.behaviour.name).toBe(b.name);
    for (const f of b.fields) expect(d.value(f.key)).toBe(f.optional ? '' : f.example);
    const values = Object.fromEntries(b.fields.map((f) => [f.key, f.optional ? '' : f.example]));
    expect(d.written).toEqual(writeBehaviour(b.name, values));
  });

  it('keeps what was typed per behaviour, and names the fields a mistake concerns', () => {
    const h = host();
    const d = new BehaviourDraft(h);
    d.choose('sequence');
    d.set('order', '');
    expect(d.written.ok).toBe(false);
    expect(d.problemsOf('order').map((p) => p.code)).toEqual(['LW802']);
    expect(d.problemsOf('output')).toEqual([]);
    d.choose('hold');
    expect(d.written.ok).toBe(true);
    d.choose('sequence');
    expect(d.value('order')).toBe('');
    d.set('order', 'red, red');
    expect(d.written.ok && d.written.sentence).toBe('Pressing red, red in that order opens flap for one clock.');
    expect(h.updates).toBe(5);
    d.choose('no such behaviour');
    expect(d.behaviour.name).toBe('sequence');
  });
});
