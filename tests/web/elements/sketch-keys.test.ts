import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import {
  labelKey,
  moveKey,
  MOVE_STEP,
  sketchKey,
  stateKey,
  targetKey,
  type Key,
} from '../../../src/web/elements/sketch-keys.js';

const key = (k: string, mods: Partial<Key> = {}): Key => ({
  key: k,
  shiftKey: false,
  ctrlKey: false,
  altKey: false,
  metaKey: false,
  ...mods,
});

/** The keys table of the user's guide, "Drawing a machine" (docs/designer.md). */
const GUIDE = readFileSync(fileURLToPath(new URL('../../../docs/designer.md', import.meta.url)), 'utf8');

describe('src/web/elements/sketch-keys', () => {
  it('reads the keys on a focused state, in either case, and none with Ctrl, Alt or ⌘', () => {
    expect(['t', 'T', 'F2', 'o', 's', 'Delete', 'Backspace'].map((k) => stateKey(key(k)))).toEqual([
      'link',
      'link',
      'rename',
      'outputs',
      'start',
      'delete',
      'delete',
    ]);
    expect(stateKey(key('s', { ctrlKey: true }))).toBeUndefined();
    expect(stateKey(key('t', { metaKey: true }))).toBeUndefined();
    expect(stateKey(key('Enter'))).toBeUndefined();
  });

  it('moves a focused state a step with Shift and an arrow key, and not with the arrows alone or with Ctrl', () => {
    expect(moveKey(key('ArrowRight', { shiftKey: true }))).toEqual({ dx: MOVE_STEP, dy: 0 });
    expect(moveKey(key('ArrowLeft', { shiftKey: true }))).toEqual({ dx: -MOVE_STEP, dy: 0 });
    expect(moveKey(key('ArrowUp', { shiftKey: true }))).toEqual({ dx: 0, dy: -MOVE_STEP });
    expect(moveKey(key('ArrowDown', { shiftKey: true }))).toEqual({ dx: 0, dy: MOVE_STEP });
    expect(moveKey(key('ArrowDown'))).toBeUndefined();
    expect(moveKey(key('ArrowDown', { shiftKey: true, ctrlKey: true }))).toBeUndefined();
    expect(moveKey(key('T', { shiftKey: true }))).toBeUndefined();
    // The state's own keys stay as they were with Shift held (Shift+T is still T).
    expect(stateKey(key('T', { shiftKey: true }))).toBe('link');
  });

  it('moves between targets with the arrows and Tab, takes one with Enter, stops with Escape', () => {
    expect(targetKey(key('ArrowRight'))).toEqual({ step: 1 });
    expect(targetKey(key('Tab'))).toEqual({ step: 1 });
    expect(targetKey(key('Tab', { shiftKey: true }))).toEqual({ step: -1 });
    expect(targetKey(key('ArrowUp'))).toEqual({ step: -1 });
    expect(targetKey(key('Enter'))).toBe('take');
    expect(targetKey(key('Escape'))).toBe('stop');
    expect(targetKey(key('x'))).toBeUndefined();
  });

  it('reads the keys on a transition label', () => {
    expect(labelKey(key('ArrowDown'))).toEqual({ step: 1 });
    expect(labelKey(key('ArrowUp'))).toEqual({ step: -1 });
    expect(labelKey(key('G'))).toBe('guard');
    expect(labelKey(key('F2'))).toBe('guard');
    expect(labelKey(key('Backspace'))).toBe('delete');
  });

  it('reads undo and redo with Ctrl or ⌘, N for a new state', () => {
    expect(sketchKey(key('z', { ctrlKey: true }))).toEqual({ again: false });
    expect(sketchKey(key('Z', { ctrlKey: true, shiftKey: true }))).toEqual({ again: true });
    expect(sketchKey(key('y', { ctrlKey: true }))).toEqual({ again: true });
    expect(sketchKey(key('z', { metaKey: true }))).toEqual({ again: false });
    expect(sketchKey(key('n'))).toBe('new-state');
    expect(sketchKey(key('n', { ctrlKey: true }))).toBeUndefined();
    expect(sketchKey(key('z'))).toBeUndefined();
  });

  it('matches the keys the user guide lists', () => {
    const table = GUIDE.slice(GUIDE.indexOf('## Drawing a machine'), GUIDE.indexOf('## The frame'));
    for (const k of [
      '`N`',
      '`T`',
      '`F2`',
      '`G`',
      '`O`',
      '`S`',
      'Delete or Backspace',
      'Ctrl+Z',
      'Ctrl+Shift+Z',
      'Ctrl+Y',
      'Shift+arrow keys',
      '**Back to the layout**',
    ])
      expect(table).toContain(k);
  });
});
