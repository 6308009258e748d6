/**
 * The designer's remembered searches and draft builds, end to end in a real browser (headless
 * Chromium from the npm package @sparticuz/chromium, ./chromium.ts) against the production build
 * (./page.ts). The machine is cse from the MCNC / LGSynth'91 FSM benchmark set (16 states after
 * minimisation), whose code search is long enough to watch. Nothing here is timed: the page
 * says on its host element where the shown build's codes came from (`data-codes`), how many
 * searches have finished (`data-searches`) and which revision had a draft (`data-draft`); the
 * final netlist is compared with `latchwright build` of the same text, run in-process.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { machineFromJson, printTextMachine } from '../../src/core/index.js';
import { machineHash } from '../../src/web/controllers/link.js';
import { removeTempDirs, run, tempDir } from '../cli/support.js';
import { built, downloaded, pageWork, startDesigner, type Designer, type PageWork } from './page.js';

const CSE = 'tests/fixtures/lgsynth91/cse.json';
const m = machineFromJson(JSON.parse(readFileSync(CSE, 'utf8')) as unknown, CSE);
if (!m.machine) throw new Error('cse must read');
const TEXT = `${printTextMachine(m.machine)}# notes typed here\n`;
/** One transition of state st1 sent elsewhere: a machine never searched before. */
const FROM = '  when x2 go st0 with z1=0, z2=0, z3=0, z4=0, z5=-, z6=1, z7=0';
const TO = FROM.replace('go st0', 'go st2');

let designer: Designer;
let context: BrowserContext;
let page: Page;

/** The page's own account of its latest job and build. */
const host = (): Promise<PageWork> => pageWork(page);

/** Replace `from` in the text by `to` as one edit (a paste over a selection). */
async function edit(from: string, to: string): Promise<void> {
  const area = page.locator('lw-editor textarea');
  await area.evaluate((t: HTMLTextAreaElement, f: string) => {
    const at = t.value.indexOf(f);
    t.focus();
    t.setSelectionRange(at, at + f.length);
  }, from);
  await page.keyboard.insertText(to);
}

/** Type one character into the closing comment line. */
async function typeInComment(): Promise<void> {
  await page.locator('lw-editor textarea').evaluate((t: HTMLTextAreaElement) => {
    t.focus();
    t.setSelectionRange(t.value.length - 1, t.value.length - 1);
  });
  await page.keyboard.press('x');
}

/** Record, in the page, what the views said while a draft build was shown. */
async function watchDrafts(opts: { stop: boolean }): Promise<void> {
  await page.evaluate((stop) => {
    const app = document.querySelector('lw-app') as HTMLElement;
    const root = app.shadowRoot as ShadowRoot;
    const w = window as unknown as { lwDraftSeen?: { note: string; status: string; work: string } };
    w.lwDraftSeen = undefined;
    const look = (): void => {
      if (app.dataset.codes !== 'stand-in') return;
      const status = root.querySelector('.status');
      w.lwDraftSeen ??= {
        note: root.querySelector('[data-note="draft"]')?.textContent ?? '',
        status: status?.textContent ?? '',
        work: status?.getAttribute('data-work') ?? '',
      };
      // Stop the search as soon as it can be stopped, so the draft stays on screen to be examined.
      if (stop)
        root.querySelector<HTMLButtonElement>('button[aria-label="Stop the code search of this build"]')?.click();
    };
    new MutationObserver(look).observe(root, { subtree: true, childList: true, attributes: true });
    new MutationObserver(look).observe(app, { attributes: true });
  }, opts.stop);
}

const draftSeen = (): Promise<{ note: string; status: string; work: string } | undefined> =>
  page.evaluate(
    () => (window as unknown as { lwDraftSeen?: { note: string; status: string; work: string } }).lwDraftSeen,
  );

beforeAll(async () => {
  designer = await startDesigner();
  context = await designer.context();
  page = await context.newPage();
  page.on('pageerror', (e) => {
    throw e;
  });
  await page.goto(designer.url + machineHash(TEXT));
  // Opening a link may start a second job (the file name following the machine's name): wait for the latest.
  await page.waitForTimeout(300);
  await page.waitForFunction(
    () => {
      const app = document.querySelector('lw-app') as HTMLElement | null;
      const work = app?.shadowRoot?.querySelector('.status')?.getAttribute('data-work');
      return app !== null && app.dataset.built === app.dataset.job && work === 'done';
    },
    undefined,
    { timeout: 120_000, polling: 50 },
  );
}, 240_000);

afterAll(async () => {
  await designer.close();
  removeTempDirs();
});

describe('src/web (remembered searches and draft builds, in chromium)', () => {
  it('a comment typed builds with the remembered codes: no search runs again, no draft is shown', async () => {
    const before = await host();
    expect(before.searches).toBeGreaterThanOrEqual(1);
    await typeInComment();
    const job = (await host()).job;
    expect(job).toBeGreaterThan(before.job);
    await expect.poll(async () => (await host()).built, { timeout: 60_000 }).toBe(job);
    const after = await host();
    expect(after.codes).toBe('remembered');
    expect(after.searches).toBe(before.searches);
    expect(after.draft).toBeLessThan(job);
    await built(page);
  }, 120_000);

  it('an edit to a transition shows a labelled draft at once, then the final build, which the documents are made from', async () => {
    const before = await host();
    await watchDrafts({ stop: false });
    await edit(FROM, TO);
    const job = (await host()).job;
    await expect.poll(async () => (await host()).built, { timeout: 120_000 }).toBe(job);
    await built(page, 120_000);
    const after = await host();
    // A draft was shown for this very revision before the final build replaced it.
    expect(after.draft).toBe(job);
    expect(after.codes).toBe('searched');
    expect(after.searches).toBe(before.searches + 1);
    const seen = await draftSeen();
    expect(seen?.work).toBe('drafted');
    expect(seen?.status).toContain('Draft build');
    expect(seen?.note).toContain('stand-ins');
    expect(await page.locator('lw-app [data-note="draft"]').count()).toBe(0);
    // The final build's netlist is what `latchwright build` makes of the same text.
    const dir = tempDir('lw-web-drafts-');
    const file = join(dir, 'cse.lw');
    writeFileSync(file, await page.locator('lw-editor textarea').inputValue());
    const out = join(dir, 'out');
    const cli = await run(['build', file, '--out', out]);
    expect([0, 1], cli.err).toContain(cli.code);
    await page.getByRole('tab', { name: 'Parts & forces' }).click();
    await page.locator('lw-parts details').evaluate((d: HTMLDetailsElement) => (d.open = true));
    const f = await downloaded(page, () => page.locator('lw-parts button[data-doc="netlist.json"]').click());
    expect(readFileSync(f.path, 'utf8')).toBe(readFileSync(join(out, 'netlist.json'), 'utf8'));
  }, 240_000);

  it('undoing the edit returns to a machine searched before: its codes are remembered', async () => {
    const before = await host();
    await edit(TO, FROM);
    const job = (await host()).job;
    await expect.poll(async () => (await host()).built, { timeout: 60_000 }).toBe(job);
    const after = await host();
    expect(after.codes).toBe('remembered');
    expect(after.searches).toBe(before.searches);
    expect(after.draft).toBeLessThan(job);
    await built(page);
  }, 120_000);

  it('while a draft is shown nothing is exported or printed from it, and the page says why', async () => {
    await page.getByRole('tab', { name: 'Parts & forces' }).click();
    await watchDrafts({ stop: true });
    await edit(FROM, FROM.replace('go st0', 'go st9'));
    const job = (await host()).job;
    // The search is stopped as soon as it can be: the draft stays.
    await expect.poll(async () => (await host()).work, { timeout: 60_000 }).toBe('stopped');
    const h = await host();
    expect(h.draft).toBe(job);
    expect(h.built).toBeLessThan(job);
    expect(h.codes).toBe('stand-in');
    await expect(page.locator('lw-app .status').innerText()).resolves.toContain('draft build');
    await expect(page.locator('lw-app [data-note="draft"]').innerText()).resolves.toContain('stopped');
    const buttons = page.locator('lw-parts section[aria-label="Build documents"] button');
    expect(await buttons.count()).toBeGreaterThan(1);
    expect(await buttons.evaluateAll((bs) => bs.every((b) => (b as HTMLButtonElement).disabled))).toBe(true);
    await expect(page.locator('lw-parts [data-note="exports"]').innerText()).resolves.toContain(
      'Not from a draft build',
    );
    // The checks of the build before are not shown against the draft: they wait for the final build.
    await expect(page.locator('lw-parts section[aria-label="Checks"]').innerText()).resolves.toContain(
      'on the final build',
    );
    expect(await page.locator('lw-parts li[data-check]').count()).toBe(0);
    await page.getByRole('tab', { name: 'Frame & cords' }).click();
    await expect(page.locator('lw-app [data-note="draft"]').count()).resolves.toBe(1);
  }, 120_000);
});
