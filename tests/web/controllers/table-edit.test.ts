import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { addState, addTransition, reguard, retarget } from '../../../src/web/controllers/table-edit.js';
import { apply, read } from './edits.support.js';

const LOCK = readFileSync(fileURLToPath(new URL('../../../examples/sequence-lock.lw', import.meta.url)), 'utf8');

/** Lines that differ between two texts of the same length in lines. */
function changedLines(a: string, b: string): string[] {
  const x = a.split('\n');
  const y = b.split('\n');
  return y.filter((l, i) => l !== x[i]);
}

describe('src/web/controllers/table-edit', () => {
  const m = read(LOCK);
  const gotRed = m.states.find((s) => s.name === 'got_red');
  if (!gotRed) throw new Error('example changed');

  it('retargets a transition in place, leaving every other line as written', () => {
    const t2 = apply(LOCK, retarget(LOCK, gotRed.transitions[1], 'open'));
    expect(changedLines(LOCK, t2)).toEqual(['  when green go open']);
    expect(read(t2).states.find((s) => s.name === 'got_red')?.transitions[1].to).toBe('open');
  });

  it('rewrites a guard, drops it, and adds one to an unguarded transition', () => {
    const t2 = apply(LOCK, reguard(LOCK, gotRed.transitions[0], 'blue & !red'));
    expect(changedLines(LOCK, t2)).toEqual(['  when blue & !red go open']);
    const dropped = apply(LOCK, reguard(LOCK, gotRed.transitions[0], ''));
    expect(changedLines(LOCK, dropped)).toEqual(['  go open']);
    const back = read(dropped).states.find((s) => s.name === 'got_red');
    if (!back) throw new Error('state lost');
    const again = apply(dropped, reguard(dropped, back.transitions[0], 'blue'));
    expect(again).toBe(LOCK);
    // An always-transition asked to stay always: nothing to do.
    expect(reguard(dropped, back.transitions[0], '1')).toBeUndefined();
  });

  it('adds a transition after the last one of its state, and a new state at the end', () => {
    const t2 = apply(LOCK, addTransition(LOCK, gotRed, 'locked', 'red'));
    const m2 = read(t2);
    const s2 = m2.states.find((s) => s.name === 'got_red');
    expect(s2?.transitions.map((t) => `${t.when.text}->${t.to}`)).toEqual([
      'blue->open',
      'green->got_green',
      'red->locked',
      'red->locked',
    ]);
    expect(t2.split('\n').length).toBe(LOCK.split('\n').length + 1);
    const t3 = apply(LOCK, addState(LOCK, 'spare'));
    expect(t3.startsWith(LOCK)).toBe(true);
    expect(read(t3).states.map((s) => s.name)).toContain('spare');
  });

  it('keeps CRLF text intact around an edit', () => {
    const crlf = LOCK.replace(/\n/g, '\r\n');
    const mc = read(crlf);
    const s = mc.states.find((x) => x.name === 'got_red');
    if (!s) throw new Error('state lost');
    const t2 = apply(crlf, retarget(crlf, s.transitions[1], 'open'));
    expect(t2).toBe(crlf.replace('go open\r\n  when green go got_green', 'go open\r\n  when green go open'));
    const t3 = apply(crlf, addTransition(crlf, s, 'locked'));
    expect(t3).toBe(crlf.replace('  when red go locked\r\n', '  when red go locked\n  go locked\r\n'));
  });
});
