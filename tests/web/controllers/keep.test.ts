import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import {
  isFileName,
  keepRead,
  keepSet,
  parseFlag,
  parseJson,
  takeSetAside,
} from '../../../src/web/controllers/keep.js';
import { MemoryStorage } from './storage.support.js';

let store: MemoryStorage;
const flag = (raw: string): boolean | undefined => parseFlag(raw);

describe('src/web/controllers/keep', () => {
  beforeEach(() => {
    store = new MemoryStorage();
    Object.defineProperty(globalThis, 'localStorage', { value: store, configurable: true });
    takeSetAside();
  });
  afterEach(() => {
    Reflect.deleteProperty(globalThis, 'localStorage');
  });

  it('reads a sound entry as its value and leaves it where it is', () => {
    store.items.set('latchwright.dirty', '1');
    expect(keepRead('dirty', flag)).toBe(true);
    expect(takeSetAside()).toEqual([]);
    expect(store.items.get('latchwright.dirty')).toBe('1');
  });

  it('sets a bad entry aside, never over an earlier copy, and says so once', () => {
    store.items.set('latchwright.previous', '{"text": "state a');
    store.items.set('latchwright.aside.previous', 'an older broken copy');
    expect(keepRead('previous', (raw) => parseJson(raw) as object | undefined)).toBeUndefined();
    expect(store.items.get('latchwright.aside.previous')).toBe('an older broken copy');
    expect(store.items.get('latchwright.aside.previous.2')).toBe('{"text": "state a');
    expect(store.items.has('latchwright.previous')).toBe(false);
    expect(takeSetAside()).toEqual([{ key: 'previous', aside: 'latchwright.aside.previous.2' }]);
    expect(takeSetAside()).toEqual([]);
  });

  it('treats a reader that throws like one that refuses', () => {
    store.items.set('latchwright.view', 'x');
    expect(
      keepRead('view', () => {
        throw new Error('no');
      }),
    ).toBeUndefined();
    expect(store.items.get('latchwright.aside.view')).toBe('x');
  });

  it('never writes over a bad entry it could not set aside', () => {
    store.items.set('latchwright.file', '../x');
    store.refuse = true;
    expect(keepRead('file', (raw) => (isFileName(raw) ? raw : undefined))).toBeUndefined();
    expect(takeSetAside()).toEqual([{ key: 'file', aside: undefined }]);
    store.refuse = false;
    expect(keepSet('file', 'machine.lw')).toBe(false);
    expect(store.items.get('latchwright.file')).toBe('../x');
  });

  it('knows a plain file name', () => {
    for (const ok of ['marble-bell.lw', 'a b.lw', 'Glocke_ä.lw']) expect(isFileName(ok), ok).toBe(true);
    for (const bad of ['', '.', '..', 'a/b.lw', 'a\\b.lw', 'a\u0000.lw', 'x'.repeat(121)])
      expect(isFileName(bad), bad).toBe(false);
  });
});
