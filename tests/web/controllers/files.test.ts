import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { createActor, createMachine } from 'xstate';
import { readMachine } from '../../../src/core/forms/detect.js';
import { machineToJson } from '../../../src/core/forms/json.js';
import { openedText, savedText } from '../../../src/web/controllers/files.js';

const LOCK = readFileSync(fileURLToPath(new URL('../../../examples/sequence-lock.lw', import.meta.url)), 'utf8');

const canonical = (text: string): unknown => {
  const r = readMachine(text);
  if (!r.machine) throw new Error('must read');
  return machineToJson(r.machine);
};

describe('src/web/controllers/files', () => {
  it('keeps a text-form file as written, errors and all', () => {
    expect(openedText(LOCK, 'lock.lw')).toEqual({ ok: true, text: LOCK, file: 'lock.lw' });
    const broken = LOCK.replace('go open', 'go opne');
    expect(openedText(broken, 'lock.lw')).toEqual({ ok: true, text: broken, file: 'lock.lw' });
  });

  it('turns a saved JSON form back into the same machine in the text form', () => {
    const saved = savedText(LOCK, 'lock.lw', 'json');
    if ('problems' in saved) throw new Error(saved.problems.join(' '));
    expect(saved.name).toBe('lock.json');
    const opened = openedText(saved.text, saved.name);
    if (!opened.ok) throw new Error(opened.problems.join(' '));
    expect(opened.file).toBe('lock.lw');
    expect(canonical(opened.text)).toEqual(canonical(LOCK));
  });

  it('saves an xstate configuration that xstate itself runs, and reads it back', () => {
    const saved = savedText(LOCK, 'lock.lw', 'xstate');
    if ('problems' in saved) throw new Error(saved.problems.join(' '));
    expect(saved.name).toBe('lock.xstate.json');
    // xstate (v5) is the reference: the configuration must create and start as a machine.
    const actor = createActor(createMachine(JSON.parse(saved.text) as never)).start();
    expect(actor.getSnapshot().value).toBe('locked');
    const opened = openedText(saved.text, saved.name);
    expect(opened.ok).toBe(true);
    if (opened.ok) expect(opened.note).toContain('xstate configuration');
  });

  it('reports why a JSON file cannot be read, in the command line wording, and refuses to save a broken machine in other forms', () => {
    const r = openedText('{"name": 3}', 'bad.json');
    expect(r.ok).toBe(false);
    if (!r.ok)
      expect(r.problems[0]).toBe(
        'bad.json:1:10 $.name: error LW103: $.name should be a string, not number 3 — see schemas/machine.schema.json',
      );
    // A machine that does not parse cannot be put in another form (one that only fails
    // validation, e.g. an unknown target, can: the JSON form carries the same mistake).
    expect(savedText(LOCK.replace('when blue go open', 'when blue & go open'), 'lock.lw', 'json')).toHaveProperty(
      'problems',
    );
    expect(savedText('anything', 'x.lw', 'text')).toEqual({ name: 'x.lw', mime: 'text/plain', text: 'anything' });
  });
});
