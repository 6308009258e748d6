/**
 * The bench's text across reloads, in Node with the browser's globals stood in: the address
 * bar (location, history), the storage, and the page's event listeners. A reload is a new
 * controller on the same storage, with the address the browser had when the reload began.
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { SourceController } from '../../../src/web/controllers/source.js';
import { takeSetAside } from '../../../src/web/controllers/keep.js';
import { machineHash } from '../../../src/web/controllers/link.js';
import { host } from './host.support.js';
import { MemoryStorage } from './storage.support.js';

const FIRST =
  'machine shed_door\ninputs key\noutputs bolt\nstart shut\n\nstate shut\n  when key go open\n\nstate open with bolt=1\n  go shut\n';
const LATER = FIRST + '# a note typed just before the reload\n';

let store: MemoryStorage;
let listeners: Map<string, () => void>;
const address = { hash: '' };

/** The page opened at the address it has now: a controller connected as the element would connect it. */
function open(): SourceController {
  const c = new SourceController(host(), () => undefined);
  c.hostConnected();
  return c;
}

/**
 * Leaving the page (a reload): the page's pagehide handler runs, but the browser goes to the
 * address it had before; `meanwhile` happens to the storage while no page is there.
 */
function reload(meanwhile?: () => void): SourceController {
  const before = address.hash;
  listeners.get('pagehide')?.();
  address.hash = before;
  meanwhile?.();
  return open();
}

describe('src/web/controllers/source', () => {
  beforeEach(() => {
    vi.useFakeTimers();
    store = new MemoryStorage();
    listeners = new Map();
    address.hash = '';
    vi.stubGlobal('localStorage', store);
    vi.stubGlobal('location', address);
    vi.stubGlobal('history', {
      replaceState: (_s: unknown, _t: string, url: string) => {
        address.hash = url;
      },
    });
    vi.stubGlobal('addEventListener', (type: string, f: () => void) => listeners.set(type, f));
    vi.stubGlobal('removeEventListener', (type: string) => listeners.delete(type));
    takeSetAside();
  });
  afterEach(() => {
    vi.unstubAllGlobals();
    vi.useRealTimers();
  });

  it('keeps the newer work over its own older link when a reload comes before the link is written', () => {
    const page = open();
    page.edit(FIRST);
    vi.runAllTimers();
    expect(address.hash).toBe(machineHash(FIRST));
    page.edit(LATER);
    // Reloaded before the address bar caught up (HASH_DELAY_MS): the address still carries FIRST.
    expect(reload().text).toBe(LATER);
  });

  it('keeps it too when the record of its own links was unreadable and set aside at the load before', () => {
    const page = open();
    page.edit(FIRST);
    vi.runAllTimers();
    // Another program's leftovers in the page's record of its links, written while the page was
    // away: set aside at the next load.
    const again = reload(() => store.setItem('latchwright.written', '<script>'));
    expect(again.text).toBe(FIRST);
    expect(store.getItem('latchwright.aside.written')).toBe('<script>');
    // Typed straight away, and reloaded before the page wrote the new link: the address still
    // carries FIRST, which the lost record knew as the page's own. Before, the page took it for
    // a link someone opened, showed FIRST and moved the newer work aside.
    again.edit(LATER);
    expect(reload().text).toBe(LATER);
  });

  it('still opens a link someone else made, and keeps the work on the bench to bring back', () => {
    const page = open();
    page.edit(LATER);
    vi.runAllTimers();
    address.hash = machineHash(FIRST.replace('shed_door', 'gate_post'));
    const opened = open();
    expect(opened.text).toContain('machine gate_post');
    expect(opened.notice?.restore).toBe(true);
  });
});
