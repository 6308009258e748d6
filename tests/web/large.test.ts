/**
 * The designer with a large machine, end to end in a real browser (headless Chromium from the
 * npm package @sparticuz/chromium, ./chromium.ts) against the production build (./page.ts).
 * The machine is planet from the MCNC / LGSynth'91 FSM benchmark set (48 states, 7 inputs, 19
 * outputs; tests/fixtures/lgsynth91/TABLE.md), pasted into the bench in its JSON form as a user
 * would paste it. Its build has several hundred parts, so its schematic is laid out in stage
 * columns and its frame runs over many drums. Expected values come from the tool run in Node
 * on the same text (the build with the same defaults, its placement and its schematic).
 * Nothing here is timed: the figures are in bench/web.ts.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import type { BrowserContext, Page } from 'playwright-core';
import { analyse, buildMachine, type Built } from '../../src/core/pipeline.js';
import { schematicSvg } from '../../src/core/export/schematic-svg.js';
import { VIEWS } from '../../src/web/elements/app-view.js';
import { openPage, pageWork, startDesigner, type Designer, type PageWork } from './page.js';

const FILE = 'tests/fixtures/lgsynth91/planet.json';
const JSON_TEXT = readFileSync(FILE, 'utf8');
/** planet's states, from the LGSynth'91 table (tests/fixtures/lgsynth91/TABLE.md). */
const STATES = 48;

let designer: Designer;
let context: BrowserContext;
let page: Page;
let ref: Built;

/** The page's own account of its latest job and build. */
const host = (): Promise<PageWork> => pageWork(page);

const tab = (id: string): Promise<void> => page.locator(`lw-app #tab-${id}`).click();

beforeAll(async () => {
  const a = analyse(JSON_TEXT, 'planet.json');
  if (!a.ok) throw new Error('planet must read');
  const b = buildMachine(a);
  if (!b.ok) throw new Error('planet must build');
  ref = b;
  designer = await startDesigner();
  context = await designer.context();
  await context.grantPermissions(['clipboard-read', 'clipboard-write'], { origin: designer.url });
  page = await openPage(context, designer.url);
}, 240_000);

afterAll(async () => {
  await designer.close();
});

describe('src/web (a large machine, in chromium)', () => {
  it('takes a pasted benchmark machine, echoes keys while its codes are searched, and builds what Node builds', async () => {
    const before = await host();
    const area = page.locator('lw-editor textarea');
    await page.evaluate((text) => navigator.clipboard.writeText(text), JSON_TEXT);
    await area.focus();
    await page.keyboard.press('Control+A');
    await page.keyboard.press('Control+V');
    await expect(area.inputValue()).resolves.toBe(JSON_TEXT);
    expect((await host()).job).toBeGreaterThan(before.job);
    // The draft comes first, labelled, while the search for the cheapest codes runs. (The file
    // name then follows the machine's name: one more job for the same text.)
    await expect
      .poll(
        async () => {
          const h = await host();
          return h.draft === h.job && h.work === 'drafted';
        },
        { timeout: 120_000 },
      )
      .toBe(true);
    // A key typed meanwhile (a space at the end: the same machine) is in the text at once, and the
    // search carries on for it: no second search, no error.
    await area.evaluate((t: HTMLTextAreaElement) => {
      t.focus();
      t.setSelectionRange(t.value.length, t.value.length);
    });
    await page.keyboard.press('Space');
    await expect(area.inputValue()).resolves.toBe(`${JSON_TEXT} `);
    const typed = (await host()).job;
    await expect.poll(async () => (await host()).checked, { timeout: 240_000 }).toBe(typed);
    const after = await host();
    expect(after.work).toBe('done');
    expect(after.built).toBe(typed);
    expect(after.codes).toBe('searched');
    expect(after.searches).toBe(before.searches + 1);
    // The same codes as `latchwright build` with its defaults: the same frame, bay for bay. A frame
    // this large is drawn after the view has shown a note saying so (watched frame by frame).
    await page.evaluate(() => {
      const w = window as unknown as { lwPending?: string };
      const look = (): void => {
        const frame = document.querySelector('lw-app')?.shadowRoot?.querySelector('lw-frame');
        const note = frame?.shadowRoot?.querySelector('[data-frame-pending]');
        if (note) w.lwPending = note.textContent ?? '';
        else requestAnimationFrame(look);
      };
      requestAnimationFrame(look);
    });
    await tab('frame');
    await expect(page.locator('lw-frame [data-frame-summary]').innerText()).resolves.toContain(
      `${ref.placement.bays.length} bays`,
    );
    const note = await page.evaluate(() => (window as unknown as { lwPending?: string }).lwPending);
    expect(note).toContain(`Drawing the frame: ${ref.placement.bays.length} bays`);
  }, 300_000);

  it('draws every view of the build, and keeps the frame and the schematic drawn while another view shows', async () => {
    const drawn: Record<string, number> = {};
    for (const v of VIEWS) {
      await tab(v.id);
      await expect(page.locator(`lw-app #tab-${v.id}`).getAttribute('aria-selected')).resolves.toBe('true');
      if (v.id === 'sketch') {
        await page.locator('lw-diagram g.node').first().waitFor();
        drawn[v.id] = await page.locator('lw-diagram g.node').count();
      } else if (v.id === 'ledger') drawn[v.id] = await page.locator('lw-state-table tbody tr').count();
      else if (v.id === 'codes') drawn[v.id] = await page.locator('lw-codes table tr').count();
      else if (v.id === 'parts') {
        await page.locator('lw-parts .sheet svg').waitFor({ timeout: 60_000 });
        drawn[v.id] = await page.locator('lw-parts li[data-check]').count();
      } else if (v.id === 'frame') {
        await page.locator('lw-frame .sheet svg').waitFor();
        drawn[v.id] = await page.locator('lw-frame path.cord[data-cord]').count();
      } else drawn[v.id] = await page.locator('lw-stepper button[data-do="clock"]').count();
    }
    expect(drawn.sketch).toBe(STATES);
    expect(drawn.ledger).toBeGreaterThanOrEqual(STATES);
    expect(drawn.codes).toBeGreaterThan(0);
    expect(drawn.parts).toBeGreaterThan(0);
    expect(drawn.frame).toBe(ref.placement.routing.branches.length);
    expect(drawn.trial).toBe(1);
    // The schematic is the one the tool draws of the same build (stage columns past 300 parts).
    const viewBox = /viewBox="([^"]+)"/.exec(schematicSvg(ref.build, undefined, { palette: 'screen' }))?.[1];
    await tab('parts');
    await expect(page.locator('lw-parts .sheet svg').getAttribute('viewBox')).resolves.toBe(viewBox);
    // Away and back: the very same drawings come back, not drawn again.
    const mark = (sel: string) =>
      page.locator(sel).evaluate((el) => ((el as unknown as { lwMark?: number }).lwMark = 1));
    const marked = (sel: string) =>
      page.locator(sel).evaluate((el) => (el as unknown as { lwMark?: number }).lwMark === 1);
    await mark('lw-parts .sheet svg');
    await tab('frame');
    await mark('lw-frame .sheet svg');
    await tab('sketch');
    await tab('parts');
    await expect(marked('lw-parts .sheet svg')).resolves.toBe(true);
    await tab('frame');
    await expect(marked('lw-frame .sheet svg')).resolves.toBe(true);
  }, 120_000);

  it('steps the trial run, and the frame shows its levers as they stand', async () => {
    await tab('trial');
    await page.locator('lw-stepper button[data-do="clock"]').click();
    await expect(page.locator('lw-stepper [data-read="clocks"]').innerText()).resolves.toBe('1');
    await tab('frame');
    await expect(page.locator('lw-frame [data-read="clocks"]').innerText()).resolves.toBe('1');
    await page.locator('lw-frame button[data-do="clock"]').click();
    await expect(page.locator('lw-frame [data-read="clocks"]').innerText()).resolves.toBe('2');
    // Every lever end takes a stand from the simulator: none is left without one.
    const ends = page.locator('lw-frame rect.lever[data-part]');
    const total = await ends.count();
    expect(total).toBeGreaterThan(0);
    await expect(page.locator('lw-frame rect.lever[data-part][data-stand]').count()).resolves.toBe(total);
  }, 120_000);
});
