/**
 * The shakedown end to end in Chromium (./chromium.ts, driven by playwright-core) against the
 * production build served on 127.0.0.1 (./page.ts): the commissioning sheet of the example the
 * page opens with is walked with what one broken cord makes the machine show (its first sight on
 * the sheet, from the sheet's fault simulation run in Node on the same text), and the page must
 * name the suspects the core's narrowing names (tests/core/export/cord-narrowing.test.ts holds
 * those to the surgery reference), light the cord on the frame, keep the walk across a reload
 * and forget it on "Start again".
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import type { BrowserContext, Page } from 'playwright-core';
import { analyse, buildMachine } from '../../src/core/pipeline.js';
import { documentSources } from '../../src/core/export/documents.js';
import { CordNarrowing } from '../../src/core/export/cord-narrowing.js';
import type { FaultVerdict } from '../../src/core/export/sheet-faults.js';
import { built, openPage, settled, shot, startDesigner, type Designer } from './page.js';

const FILE = 'marble-bell.lw';
const EXAMPLE = readFileSync(fileURLToPath(new URL(`../../examples/${FILE}`, import.meta.url)), 'utf8');

let designer: Designer;
let context: BrowserContext;
let page: Page;
let fault: FaultVerdict;
let expected: string[];

const step = (): Promise<string> => page.locator('lw-shakedown [data-read="walk-step"]').innerText();
const suspects = (): Promise<string[]> =>
  page
    .locator('lw-shakedown [data-list="suspects"] li[data-suspect]')
    .evaluateAll((ls) => ls.map((l) => l.getAttribute('data-suspect') ?? ''));

beforeAll(async () => {
  const a = analyse(EXAMPLE, FILE);
  if (!a.ok) throw new Error('the example must read');
  const b = buildMachine(a);
  if (!b.ok) throw new Error('the example must build');
  const sources = documentSources(b);
  // The shown fault the sheet shows earliest after the first step (so the walk ticks a few steps as the sheet first).
  const shown = sources
    .faults()
    .verdicts.filter((v) => v.shown >= 2)
    .sort((x, y) => x.shown - y.shown);
  fault = shown[0];
  const walk = new CordNarrowing(sources);
  expected = walk
    .narrow(
      fault.shown + 1,
      fault.seen.map((s) => ({ step: fault.shown + 1, at: s.at, value: s.value })),
    )
    .suspects.map((s) => s.fault.key);
  designer = await startDesigner();
  context = await designer.context();
  page = await openPage(context, designer.url);
  await built(page);
}, 300_000);

afterAll(async () => {
  await designer.close();
});

describe('src/web/elements/shakedown (end to end in chromium)', () => {
  it('walks the sheet with a broken cord’s sights, names the suspects by bay and lights them on the frame', async () => {
    await page.getByRole('tab', { name: 'Shakedown' }).click();
    await page.locator('lw-shakedown [data-walk-progress]').waitFor({ timeout: 60_000 });
    expect(await step()).toBe('1');
    for (let i = 0; i < fault.shown; i++) {
      await page.locator('lw-shakedown [data-do="walk-next"]').click();
      await expect.poll(step).toBe(String(i + 2));
    }
    await expect.poll(() => page.locator('lw-shakedown .findings').getAttribute('data-verdict')).toBe('fine');
    for (const s of fault.seen) await page.locator(`lw-shakedown [data-mark="${s.at}"]`).click();
    await expect(page.locator('lw-shakedown [data-do="walk-next"]').innerText()).resolves.toContain('Seen so');
    await page.locator('lw-shakedown [data-do="walk-next"]').click();
    await expect.poll(suspects, { timeout: 30_000 }).toEqual(expected);
    expect(expected).toContain(fault.fault.key);
    const item = page.locator(`lw-shakedown [data-list="suspects"] li[data-suspect="${fault.fault.key}"]`);
    await expect(item.innerText()).resolves.toMatch(/bay \d+, drum \d+/);
    await expect
      .poll(() => page.locator(`lw-shakedown .sheet path.cord.lit[data-cord="${fault.fault.cord}"]`).count())
      .toBeGreaterThan(0);
    await expect(page.locator('lw-shakedown .walk-caution').innerText()).resolves.toContain('Stop the drum');
    await shot(page, 'shakedown');
  }, 180_000);

  it('keeps the walk across a reload, and forgets it on Start again', async () => {
    await page.reload();
    await settled(page);
    await page.locator('lw-shakedown [data-walk-progress]').waitFor({ timeout: 60_000 });
    await expect.poll(step, { timeout: 30_000 }).toBe(String(fault.shown + 2));
    await expect.poll(suspects, { timeout: 30_000 }).toEqual(expected);
    await page.locator('lw-shakedown [data-do="walk-restart"]').click();
    await expect.poll(step).toBe('1');
    await expect.poll(() => page.locator('lw-shakedown .findings').getAttribute('data-verdict')).toBe('fine');
    await expect(page.locator('lw-shakedown .sheet path.cord.lit').count()).resolves.toBe(0);
    const kept = await page.evaluate(() => localStorage.getItem('latchwright.shakedown'));
    expect(JSON.parse(kept ?? '[]')).toEqual([]);
    await page.reload();
    await settled(page);
    await page.locator('lw-shakedown [data-walk-progress]').waitFor({ timeout: 60_000 });
    expect(await step()).toBe('1');
  }, 180_000);
});
