/**
 * Nothing typed is lost, end to end in Chromium: every entry the designer keeps in the
 * browser's storage is corrupted in turn and the page reloaded — the work must survive, the
 * bad entry must be kept aside (never overwritten) and the page must say so; leaving the page
 * asks first only when the browser refused to keep the text; and a pasted 200 KB machine
 * (a chain of 4,000 states, deeper than a recursive layout's stack) gets a sketch, not a fault.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { KEPT_ENTRIES, type KeptKey } from '../../src/web/controllers/keep.js';
import { openPage, settled, startDesigner, type Designer } from './page.js';

let designer: Designer;
let context: BrowserContext;
let page: Page;

const editor = (): ReturnType<Page['locator']> => page.locator('lw-editor textarea');
const stored = (key: string): Promise<string | null> =>
  page.evaluate((k) => localStorage.getItem(`latchwright.${k}`), key);

/** A value of the right type but the wrong shape for each entry (what another program or a broken write leaves). */
const BAD: Readonly<Record<KeptKey, string>> = {
  text: '\u0000\u0007 not a machine \ud800 but still the user’s text',
  file: '../../etc/passwd',
  'file-named': 'perhaps',
  dirty: '{',
  previous: '{"text": "state a\\n  go a", "file": ',
  view: 'frame-of-the-future',
  theme: 'neon',
  encoding: '{"kept": {"strategy": "auto", "bits": 2, "codes": ["00", "00"]}, "states": ["a"]}',
  unused: '../x y',
  // μ given as a percentage: the core's loader refuses it (LW600), so the page never builds with it.
  profile: '{"name": "shop.json", "value": {"mu": 25}}',
  // A bay counted from 0: the page never sends it to the build.
  pins: '[["g1", {"bay": 0}]]',
  written: '<script>',
  // A place with one coordinate: not a point of the sketch.
  places: '[{"machine": "odd_one_out", "at": {"idle": [12]}}]',
  // A walk that ticked minus one steps.
  shakedown: '[{"machine": "odd_one_out", "print": "00000000", "reached": -1, "sights": []}]',
};

beforeAll(async () => {
  designer = await startDesigner();
  context = await designer.context();
  // Corruption happens while the page is away: an entry named for the next load is written
  // before any of the page's own code runs (after the page that was there has said goodbye).
  await context.addInitScript(() => {
    const next = sessionStorage.getItem('lw-test-corrupt');
    if (next === null) return;
    sessionStorage.removeItem('lw-test-corrupt');
    const [k, v] = JSON.parse(next) as [string, string];
    localStorage.setItem(`latchwright.${k}`, v);
  });
  page = await openPage(context, designer.url);
});

afterAll(async () => {
  await designer.close();
});

describe('src/web/controllers/keep (end to end in chromium)', () => {
  it('survives every stored entry corrupted in turn: the work stays, the bad entry is set aside with a notice', async () => {
    // Something worth keeping: an edit, and an earlier machine to bring back.
    await page
      .locator('lw-bench select[aria-label="Load an example machine"]')
      .selectOption({ label: 'Odd one out (two levers, one chime)' });
    await settled(page);
    await editor().focus();
    await page.keyboard.press('Control+End');
    await page.keyboard.type('# my own notes\n');
    await settled(page);
    const keys = Object.keys(KEPT_ENTRIES) as KeptKey[];
    // The page keeps nothing that is not on the list (the list is what this test corrupts).
    const kept = await page.evaluate(() =>
      Object.keys(localStorage).filter((k) => k.startsWith('latchwright.') && !k.startsWith('latchwright.aside.')),
    );
    for (const k of kept) expect(keys).toContain(k.slice('latchwright.'.length));
    for (const key of keys) {
      const work = await editor().inputValue();
      await page.evaluate((kv) => sessionStorage.setItem('lw-test-corrupt', JSON.stringify(kv)), [key, BAD[key]]);
      await page.reload();
      await settled(page);
      if (key === 'text') {
        // Any text is somebody's text: it is shown as it is, and nothing is set aside.
        expect(await editor().inputValue(), key).toBe(BAD.text);
        await editor().focus();
        await page.keyboard.press('Control+A');
        await page.keyboard.insertText(work);
        await settled(page);
        continue;
      }
      expect(await editor().inputValue(), key).toBe(work);
      expect(await stored(`aside.${key}`), key).toBe(BAD[key]);
      await expect(page.locator('lw-bench .notice').innerText(), key).resolves.toContain(KEPT_ENTRIES[key]);
      // Typing on keeps working and never touches the set-aside copy.
      await editor().focus();
      await page.keyboard.press('Control+End');
      await page.keyboard.type(`# after ${key}\n`);
      await expect.poll(() => stored('text')).toBe(await editor().inputValue());
      expect(await stored(`aside.${key}`), key).toBe(BAD[key]);
    }
  });

  it('asks before leaving only when the browser did not keep the text', async () => {
    const dialogs: string[] = [];
    page.on('dialog', (d) => {
      dialogs.push(d.type());
      void d.accept();
    });
    await editor().focus();
    await page.keyboard.type('# kept\n');
    await page.reload();
    await settled(page);
    expect(dialogs).toEqual([]);
    // A full or refusing storage: the page says so at once, and leaving asks first.
    await page.evaluate(() => {
      Storage.prototype.setItem = () => {
        throw new DOMException('full', 'QuotaExceededError');
      };
    });
    await editor().focus();
    await page.keyboard.type('# not kept\n');
    await expect(page.locator('lw-bench .notice').innerText()).resolves.toContain('not keeping the text');
    await page.reload();
    await settled(page);
    expect(dialogs).toEqual(['beforeunload']);
  });

  it('reads a pasted 200 KB machine and sketches it without a fault', async () => {
    const n = 4000; // the most states the tool takes (LW400)
    let text = '# A very long chain of stations.\nmachine long_chain\ninputs step\noutputs lamp\nstart s0\n';
    for (let i = 0; i < n; i++)
      text += `state s${i}${i % 50 === 0 ? ' with lamp=1' : ''} # a station of the chain\n  when step go s${(i + 1) % n}\n`;
    expect(text.length).toBeGreaterThan(200_000);
    // As a paste arrives: the whole text at once, one input event. (The browser's own typing
    // path, which the test driver's fill would use, is itself slow for 13,000 lines.)
    await editor().evaluate((t: HTMLTextAreaElement, v: string) => {
      t.value = v;
      t.dispatchEvent(new InputEvent('input', { bubbles: true, composed: true, inputType: 'insertFromPaste' }));
    }, text);
    const job = Number(await page.locator('lw-app').getAttribute('data-job'));
    await page.waitForFunction((j) => Number(document.querySelector('lw-app')?.getAttribute('data-read')) >= j, job, {
      timeout: 60_000,
    });
    await expect(page.locator('lw-app .status').getAttribute('data-work')).resolves.not.toBe('failed');
    await expect(page.locator('lw-problems li.error').count()).resolves.toBe(0);
    await page.getByRole('tab', { name: 'Sketch' }).click();
    await expect(page.locator('lw-diagram .note').innerText()).resolves.toContain(`A large machine (${n} states)`);
    await expect(page.locator('lw-diagram g.node').count()).resolves.toBe(n);
  });
});
