/**
 * The designer on a phone (390 px wide, worked by touch), end to end in Chromium: nothing
 * sticks out of the screen in any view, wide tables scroll in boxes of their own, the header
 * keeps the theme button and a one-line status on screen, the hints name touch gestures, and
 * Fit keeps the sketch's text readable (MIN_LABEL_PX) and lets the rest be dragged to.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { MIN_LABEL_PX } from '../../src/web/elements/diagram.js';
import { built, openPage, overflowing, PHONE, shot, startDesigner, type Designer } from './page.js';

let designer: Designer;
let page: Page;

const tab = (name: string): Promise<void> => page.getByRole('tab', { name }).click();

beforeAll(async () => {
  designer = await startDesigner();
  page = await openPage(await designer.context(PHONE), designer.url);
  await built(page);
});

afterAll(async () => {
  await designer.close();
});

describe('src/web on a phone (end to end in chromium)', () => {
  it('keeps the header on screen: the theme button, and the status on one line', async () => {
    const box = async (sel: string) => (await page.locator(sel).boundingBox()) ?? { x: -1, y: 0, width: 0, height: 0 };
    const theme = await box('lw-app button.theme');
    expect(theme.x).toBeGreaterThanOrEqual(0);
    expect(theme.x + theme.width).toBeLessThanOrEqual(390);
    const status = await box('lw-app .status');
    expect(status.x + status.width).toBeLessThanOrEqual(390);
    const line = await page
      .locator('lw-app .status')
      .evaluate((el) => parseFloat(getComputedStyle(el).lineHeight) || 20);
    expect(status.height).toBeLessThan(2 * line + 8);
    await expect(page.locator('lw-app .status').innerText()).resolves.toBe('Built · every check passes');
    await shot(page, 'phone-bench');
  });

  it('lets nothing overflow in any view; tables scroll in their own boxes', async () => {
    for (const view of [
      'Sketch',
      'Ledger',
      'Code book',
      'Parts & forces',
      'Frame & cords',
      'Trial run',
      'Shakedown',
      'Shop',
    ]) {
      await tab(view);
      if (view === 'Code book') {
        await page.getByRole('button', { name: 'Price every encoding' }).click();
        await page.locator('lw-codes tr.cheapest').first().waitFor({ timeout: 60_000 });
        const table = page.locator('lw-codes .wide');
        const sizes = await table.evaluate((el) => [el.scrollWidth, el.clientWidth, getComputedStyle(el).overflowX]);
        expect(sizes[2]).toBe('auto');
        // Eleven columns do not fit 390 px: the box scrolls, the page does not.
        expect(Number(sizes[0])).toBeGreaterThan(Number(sizes[1]));
      }
      if (view === 'Parts & forces') await page.locator('lw-parts .sheet svg').waitFor();
      if (view === 'Frame & cords') await page.locator('lw-frame .sheet svg').waitFor();
      if (view === 'Trial run')
        for (let i = 0; i < 12; i++) await page.locator('lw-stepper button[data-do="clock"]').click();
      if (view === 'Shakedown') {
        await page.locator('lw-shakedown [data-mark="0"]').click({ timeout: 60_000 });
        await page.locator('lw-shakedown [data-do="walk-next"]').click();
        await page.locator('lw-shakedown .findings[data-verdict]:not([data-verdict="fine"])').waitFor();
      }
      expect(await overflowing(page), view).toEqual([]);
    }
    await shot(page, 'phone-trial', true);
    // No key hints on a touch screen.
    await expect(page.locator('lw-stepper kbd').first().isVisible()).resolves.toBe(false);
  });

  it('gives the sketch a screenful of its own below the text, not a sliver under its tools', async () => {
    await tab('Sketch');
    // The stacked layout's promise (app-styles.ts): the sketch's view is max(24rem, 70vh) high;
    // once it was sized as a share of what the text left of the screen, and its drawing got 0 px.
    const heights = await page.locator('lw-diagram').evaluate((d) => ({
      drawing: (d.shadowRoot?.querySelector('svg') as SVGSVGElement).getBoundingClientRect().height,
      screen: innerHeight,
    }));
    expect(heights.drawing).toBeGreaterThanOrEqual(0.4 * heights.screen);
    expect(await overflowing(page)).toEqual([]);
  });

  it('describes touch gestures, and Fit keeps the sketch readable, showing it from its start', async () => {
    await tab('Sketch');
    await expect(page.locator('lw-diagram .legend').innerText()).resolves.toContain('pinch to zoom');
    // A chain of five stations with long names: too wide for 390 px at a readable size.
    const names = [
      'waiting_for_visitor',
      'first_lever_pulled',
      'second_lever_pulled',
      'third_lever_pulled',
      'bell_ringing',
    ];
    const text = [
      'machine chain_of_five',
      'inputs pull',
      'outputs bell',
      `start ${names[0]}`,
      ...names.flatMap((n, i) => [
        `state ${n}${i === 4 ? ' with bell=1' : ''}`,
        `  when pull go ${names[(i + 1) % 5]}`,
      ]),
      '',
    ].join('\n');
    await page.locator('lw-editor textarea').fill(text);
    await built(page);
    await page.locator('lw-diagram').getByRole('button', { name: /^Fit/ }).click();
    const scale = Number(await page.locator('lw-diagram').getAttribute('data-scale'));
    expect(scale * 12).toBeGreaterThanOrEqual(MIN_LABEL_PX - 1e-6);
    await expect(page.locator('lw-diagram .note').innerText()).resolves.toContain('drag to see the rest');
    // The start state is on screen.
    const start = await page.locator(`lw-diagram g.node[data-state="${names[0]}"]`).boundingBox();
    expect(start && start.x >= 0 && start.x + start.width <= 390).toBe(true);
    expect(await overflowing(page)).toEqual([]);
  });
});
