/**
 * Starting from a behaviour in the designer, end to end in Chromium: the bench's "From a
 * behaviour…" panel, worked from the keyboard, writes a sequence lock whose sentence and text
 * are the core's own (writeBehaviour run in Node on the same fields), puts it on the bench
 * keeping the earlier machine, and the page then sketches it and builds it with every check
 * passing. Every field shows its value whichever behaviour was picked before. On a phone nothing of the panel sticks out of the screen; in the dark theme it
 * takes the theme's colours.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { BEHAVIOURS, writeBehaviour } from '../../src/core/behaviours/index.js';
import { built, DESKTOP, openPage, overflowing, PHONE, shot, startDesigner, type Designer } from './page.js';

let designer: Designer;

beforeAll(async () => {
  designer = await startDesigner();
});

afterAll(async () => {
  await designer.close();
});

const panel = (page: Page) => page.locator('lw-behaviour-card dialog');

/** Open the panel from the bench with the keyboard. */
async function openPanel(page: Page): Promise<void> {
  await page.getByRole('button', { name: 'From a behaviour…' }).focus();
  await page.keyboard.press('Enter');
  await panel(page).waitFor();
}

describe('src/web behaviour panel (end to end in chromium)', () => {
  it('makes a sequence lock from the bench panel by keyboard; the sketch shows it and it builds with every check passing', async () => {
    const page = await openPage(await designer.context(DESKTOP), designer.url);
    await built(page);
    const before = await page.locator('lw-editor textarea').inputValue();
    await openPanel(page);
    await panel(page).locator('select').first().selectOption('sequence');
    // Optional fields start empty: the levers default to those the order names; a decoy lever is typed in.
    await panel(page).locator('#field-inputs').fill('red, green, blue');
    const order = panel(page).locator('#field-order');
    await order.focus();
    await order.fill('red, green, green, red');
    const values = {
      inputs: 'red, green, blue',
      order: 'red, green, green, red',
      output: 'flap',
      fallback: 'overlap',
      open: 'one-clock',
    };
    const w = writeBehaviour('sequence', values);
    if (!w.ok) throw new Error('the lock must be written');
    await expect(panel(page).locator('.sentence').innerText()).resolves.toBe(w.sentence);
    await expect(panel(page).locator('pre').textContent()).resolves.toBe(w.text);
    // An empty order is refused with the core's words, and the panel will not put it on the bench.
    await order.fill('');
    await expect(panel(page).locator('.sentence.problem').innerText()).resolves.toContain(
      'order of presses (--order) is not given',
    );
    await expect(panel(page).getByRole('button', { name: 'Put it on the bench' }).isDisabled()).resolves.toBe(true);
    await order.fill('red, green, green, red');
    await shot(page, 'behaviour-panel');
    await panel(page).getByRole('button', { name: 'Put it on the bench' }).focus();
    await page.keyboard.press('Enter');
    await expect(panel(page).isVisible()).resolves.toBe(false);
    await expect(page.locator('lw-editor textarea').inputValue()).resolves.toBe(w.text);
    await built(page);
    await expect(page.locator('lw-app .status').innerText()).resolves.toBe('Built · every check passes');
    // CLRS §32.3: an order of 4 presses has 5 states; the sketch draws each.
    await expect(page.locator('lw-diagram g.node').count()).resolves.toBe(5);
    await expect(page.locator('lw-diagram g.node[data-state="open"]').count()).resolves.toBe(1);
    await page.getByRole('button', { name: 'Bring back the earlier machine' }).click();
    await expect(page.locator('lw-editor textarea').inputValue()).resolves.toBe(before);
    await page.context().close();
  });

  it('shows each field its value whichever behaviour was picked before (a number field turning into a text one keeps the text)', async () => {
    const page = await openPage(await designer.context(DESKTOP), designer.url);
    await built(page);
    await openPanel(page);
    const pick = panel(page).locator('select').first();
    for (const from of BEHAVIOURS)
      for (const to of BEHAVIOURS.filter((b) => b !== from)) {
        await pick.selectOption(from.name);
        await pick.selectOption(to.name);
        // A field not typed in shows its example; an optional one starts empty.
        for (const f of to.fields.filter((x) => !x.choices))
          await expect(
            panel(page).locator(`#field-${f.key}`).inputValue(),
            `${from.name} → ${to.name}: ${f.key}`,
          ).resolves.toBe(f.optional ? '' : f.example);
      }
    await page.context().close();
  });

  it('fits a phone: nothing of the panel sticks out of a 390 px screen', async () => {
    const page = await openPage(await designer.context(PHONE), designer.url);
    await built(page);
    await page.getByRole('button', { name: 'From a behaviour…' }).click();
    await panel(page).waitFor();
    for (const { name } of BEHAVIOURS) {
      await panel(page).locator('select').first().selectOption(name);
      expect(await overflowing(page), name).toEqual([]);
      const box = await panel(page).boundingBox();
      expect(box && box.x >= 0 && box.x + box.width <= 390).toBe(true);
    }
    await page.context().close();
  });

  it('takes the dark theme’s colours', async () => {
    const page = await openPage(await designer.context({ ...DESKTOP, colorScheme: 'dark' }), designer.url);
    await openPanel(page);
    // theme.css: --lw-panel is #24211d and --lw-ink #efe7d8 in the dark theme.
    const colours = await panel(page).evaluate((d) => [getComputedStyle(d).backgroundColor, getComputedStyle(d).color]);
    expect(colours).toEqual(['rgb(36, 33, 29)', 'rgb(239, 231, 216)']);
    await page.context().close();
  });
});
