/**
 * Keeping a part in a bay from the frame view, end to end in Chromium (./chromium.ts) against
 * the production build (./page.ts): a lever end dragged onto another bay is kept there, as the
 * core places the same machine with the same pin (`buildMachine` with `pins`, run in Node);
 * the code book's command carries the `--pin`; a pin the build cannot keep shows the command
 * line's code and hint beside it; a reload keeps the pins; letting every part go gives the first
 * placement back; a pin of a part another machine does not have is reported (LW707), never
 * dropped, until it is let go. A cord tapped gets a route of its own in the workshop's profile (its
 * `cordRouting` entry, docs/profile.md), as the core routes it with that profile, and loses it again.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import type { BrowserContext, Page } from 'playwright-core';
import { analyse, buildMachine, loadProfile, type Built, type Pin } from '../../src/core/index.js';
import { built, openPage, settled, startDesigner, type Designer } from './page.js';

const FILE = 'marble-bell.lw';
const EXAMPLE = readFileSync(fileURLToPath(new URL(`../../examples/${FILE}`, import.meta.url)), 'utf8');

let designer: Designer;
let context: BrowserContext;
let page: Page;

function buildWith(pins: Readonly<Record<string, Pin>>, profileValue?: Record<string, unknown>): Built {
  const a = analyse(EXAMPLE, FILE);
  if (!a.ok) throw new Error('the example must read');
  const profile = profileValue ? loadProfile(profileValue, 'workshop-profile.json').profile : undefined;
  const b = buildMachine(a, { pins, checks: false, ...(profile ? { profile } : {}) });
  if (!b.ok) throw new Error('the example must build');
  return b;
}

/** Where the page's frame has every part: `part drum bay`, sorted. */
const baysOnPage = (): Promise<string[]> =>
  page
    .locator('lw-frame rect.lever[data-part]')
    .evaluateAll((rs) =>
      [
        ...new Set(rs.map((r) => ['data-part', 'data-drum', 'data-bay'].map((a) => r.getAttribute(a)).join(' '))),
      ].sort(),
    );
const baysOf = (b: Built): string[] =>
  b.placement.bays
    .filter((x) => x.levers.some((l) => l.name !== 'exit'))
    .map((x) => `${x.part} ${x.drum} ${x.bay}`)
    .sort();
const bayOf = (part: string): Promise<string | null> =>
  page.locator(`lw-frame rect.lever[data-part="${part}"]`).first().getAttribute('data-bay');

/** The centre of an element of the frame, on screen (scrolled into the box first when asked). */
async function centre(selector: string, scroll = false): Promise<{ x: number; y: number }> {
  const el = page.locator(selector).first();
  if (scroll) await el.evaluate((e) => e.scrollIntoView({ block: 'center', inline: 'center' }));
  const box = await el.boundingBox();
  if (!box) throw new Error(`${selector} is not on screen`);
  return { x: box.x + box.width / 2, y: box.y + box.height / 2 };
}

/** Wait for a build of a newer job than the one shown now. */
async function rebuilt(job: string | null): Promise<void> {
  await page.waitForFunction((j) => document.querySelector('lw-app')?.dataset.job !== j, job);
  await built(page);
}
const job = (): Promise<string | null> => page.locator('lw-app').getAttribute('data-job');
const keepOpen = (): Promise<boolean> =>
  page.locator('lw-frame details.keep-tools').evaluate((d) => (d as HTMLDetailsElement).open);
/** Open the keep field by its one line, as a person does (a part picked opens it by itself). */
async function openKeep(): Promise<void> {
  if (!(await keepOpen())) await page.locator('lw-frame [data-keep-tools]').click();
  await page.locator('lw-frame select[data-keep="part"]').waitFor();
}

beforeAll(async () => {
  designer = await startDesigner();
  context = await designer.context();
  page = await openPage(context, designer.url);
  await built(page);
  await page.getByRole('tab', { name: 'Frame & cords' }).click();
  await page.locator('lw-frame .sheet svg').waitFor();
});

afterAll(async () => {
  await designer?.close();
});

describe('src/web/elements/frame-view (keeping parts in a bay, end to end in chromium)', () => {
  it('keeps a dragged lever in the bay it is let go over, as the core places it with that pin', async () => {
    const first = buildWith({});
    expect(await baysOnPage()).toEqual(baysOf(first));
    expect(await bayOf('in.marble')).toBe('1');
    // The keep field is one line until it is wanted: the drawing keeps the room.
    expect(await keepOpen()).toBe(false);
    // Picked up by its bay's label (cords rise across the lever ends themselves).
    const from = await centre('lw-frame g[data-part="in.marble"] text', true);
    const to = await centre('lw-frame rect.lever[data-bay="7"][data-drum="1"]');
    const before = await job();
    await page.mouse.move(from.x, from.y);
    await page.mouse.down();
    await page.mouse.move((from.x + to.x) / 2, to.y, { steps: 4 });
    await page.mouse.move(to.x, to.y, { steps: 4 });
    await expect(page.locator('lw-frame [data-readout] [data-drop]').innerText()).resolves.toBe('bay 7, drum 1');
    await page.mouse.up();
    await rebuilt(before);
    expect(await bayOf('in.marble')).toBe('7');
    expect(await baysOnPage()).toEqual(baysOf(buildWith({ 'in.marble': { bay: 7 } })));
    await expect(page.locator('lw-frame [data-kept-part="in.marble"]').innerText()).resolves.toContain('in.marble=7');
    await expect(page.locator('lw-app .status').innerText()).resolves.toContain('own settings');
    // The part a drag ends on is picked, and the field opens on it.
    expect(await keepOpen()).toBe(true);
    await expect(page.locator('lw-frame [data-keep-status]').innerText()).resolves.toContain(
      'in.marble stands in bay 7',
    );
  });

  it("writes the pin on the code book's command line", async () => {
    await page.getByRole('tab', { name: 'Code book' }).click();
    await expect(page.locator('lw-codes [data-cli]').innerText()).resolves.toBe(
      `latchwright build ${FILE} --pin in.marble=7`,
    );
    await page.getByRole('tab', { name: 'Frame & cords' }).click();
  });

  it("shows the command line's code and hint beside a pin the build cannot keep", async () => {
    const bays = buildWith({ 'in.marble': { bay: 7 } }).placement.drums[0].bays.length;
    await openKeep();
    await page.locator('lw-frame select[data-keep="part"]').selectOption('rst');
    await page.locator('lw-frame input[data-keep="bay"]').fill(String(bays + 5));
    await page.locator('lw-frame input[data-keep="drum"]').fill('1');
    const before = await job();
    await page.locator('lw-frame button[data-do="keep"]').click();
    await rebuilt(before);
    const note = page.locator('lw-frame [data-kept-part="rst"] [data-pin-note="LW708"]');
    // The place phase's words (src/core/phases/place/pins.ts), as the command line prints them.
    await expect(note.innerText()).resolves.toContain(`pin it to a bay from 1 to ${bays}`);
    await expect(note.innerText()).resolves.toContain('warning LW708');
  });

  it('keeps the pins over a reload, and letting every part go gives the first placement back', async () => {
    await page.reload();
    await built(page);
    await page.getByRole('tab', { name: 'Frame & cords' }).click();
    await page.locator('lw-frame .sheet svg').waitFor();
    expect(await bayOf('in.marble')).toBe('7');
    await expect(page.locator('lw-frame [data-kept-part]').count()).resolves.toBe(2);
    const before = await job();
    await page.locator('lw-frame button[data-do="release-all"]').click();
    await rebuilt(before);
    expect(await baysOnPage()).toEqual(baysOf(buildWith({})));
    await expect(page.locator('lw-frame [data-kept]').count()).resolves.toBe(0);
    await expect(page.locator('lw-app .status').innerText()).resolves.not.toContain('own settings');
    await expect(page.evaluate(() => localStorage.getItem('latchwright.pins'))).resolves.toBeNull();
  });

  it("sets a tapped cord's own route in the workshop's profile, as the core routes it, and clears it", async () => {
    const first = buildWith({});
    const b = first.placement.routing.branches.find((x) => x.kind === 'port' && x.driver !== x.part);
    if (!b) throw new Error('the example has a cord between two bays');
    const pulleys = b.pulleys + 2;
    const routed = buildWith({}, { cordRouting: { [b.cord]: { pulleys } } });
    expect(routed.placement.routing.branches.find((x) => x.cord === b.cord && x.target === b.target)?.pulleys).toBe(
      pulleys,
    );
    await page.locator(`lw-frame path.cord[data-cord="${b.cord}"][data-target="${b.target}"]`).first().focus();
    await page.keyboard.press('Enter');
    const row = page.locator(`lw-frame [data-route-cord="${b.cord}"]`);
    await row.locator('input[data-route="pulleys"]').fill(String(pulleys));
    const before = await job();
    await row.locator('button[data-do="route-set"]').click();
    await rebuilt(before);
    await expect(page.locator('lw-frame [data-readout]').innerText()).resolves.toContain(`over ${pulleys} pulleys`);
    await page.getByRole('tab', { name: 'Code book' }).click();
    await expect(page.locator('lw-codes [data-cli]').innerText()).resolves.toBe(
      `latchwright build ${FILE} --profile workshop-profile.json`,
    );
    await page.getByRole('tab', { name: 'Shop' }).click();
    await expect(page.locator(`lw-workshop [data-cord-route="${b.cord}"]`).innerText()).resolves.toContain(
      `"pulleys":${pulleys}`,
    );
    await page.getByRole('tab', { name: 'Frame & cords' }).click();
    const again = await job();
    await page.locator(`lw-frame [data-route-cord="${b.cord}"] button[data-do="route-clear"]`).click();
    await rebuilt(again);
    await expect(page.locator('lw-frame [data-readout]').innerText()).resolves.not.toContain(`over ${pulleys} pulleys`);
    await expect(page.locator('lw-app .status').innerText()).resolves.not.toContain('own settings');
  });

  it('reports a pin of a part the next machine does not have, with the command line’s LW707, until it is let go', async () => {
    const before = await job();
    await openKeep();
    await page.locator('lw-frame select[data-keep="part"]').selectOption('in.marble');
    await page.locator('lw-frame input[data-keep="bay"]').fill('3');
    await page.locator('lw-frame button[data-do="keep"]').click();
    await rebuilt(before);
    await page
      .locator('lw-bench select[aria-label="Load an example machine"]')
      .selectOption({ label: 'Odd one out (two levers, one chime)' });
    await settled(page);
    await expect(page.locator('lw-app .status').getAttribute('data-work')).resolves.toBe('refused');
    const note = page.locator('lw-frame [data-kept-part="in.marble"] [data-pin-note="LW707"]');
    // The place phase's words (src/core/phases/place/pins.ts) with its hint.
    await expect(note.innerText()).resolves.toContain("a pin names 'in.marble', which is not a part of this build");
    // On the bench too, as every problem of the build is.
    await page.locator('lw-bench').getByText(/LW707/).first().waitFor();
    const again = await job();
    await page.locator('lw-frame [data-kept-part="in.marble"] button[data-do="release-part"]').click();
    await rebuilt(again);
    await expect(page.locator('lw-frame [data-kept]').count()).resolves.toBe(0);
  });
});
