/**
 * The designer and the HTML documents held to the Web Content Accessibility Guidelines by an
 * independent checker: axe-core (Deque Systems, MPL-2.0), its rules for WCAG 2.0, 2.1 and 2.2
 * levels A and AA (W3C Recommendations; among them 1.4.3 contrast of text at least 4.5:1,
 * 2.5.3 a control's visible label part of its accessible name, 4.1.2 every control named),
 * run in Chromium on every view of the page in the light and the dark theme (the shakedown with
 * a value marked seen the other way, so its findings show), on a phone, with
 * the notation card open, the behaviour panel open, with a text that does not read, and on the build sheet, the
 * bring-up sheet and the commissioning sheet.
 *
 * One reading is set aside, and only where named: 2.5.3 on the sketch's state cards. A card
 * draws its name, its outputs and, above its corner, its code as separate SVG text elements,
 * which the checker joins without a space ("01one"); the card's accessible name carries each
 * of them in words ("State one, code 01, line 21"), so a word spoken to press it is in it.
 */
import { createRequire } from 'node:module';
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { analyse, buildMachine } from '../../src/core/pipeline.js';
import { buildDocuments } from '../../src/core/export/index.js';
import { built, DESKTOP, openPage, PHONE, settled, startDesigner, type Designer } from './page.js';

const AXE = createRequire(import.meta.url).resolve('axe-core/axe.min.js');
const TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];
const VIEWS = ['Sketch', 'Ledger', 'Code book', 'Parts & forces', 'Frame & cords', 'Trial run', 'Shakedown', 'Shop'];

let designer: Designer;

beforeAll(async () => {
  designer = await startDesigner();
}, 300_000);

afterAll(async () => {
  await designer?.close();
});

/** Every violation axe finds in the page, as `rule: target — summary` lines (empty when none). */
async function violations(page: Page): Promise<string[]> {
  if (!(await page.evaluate(() => 'axe' in window))) await page.addScriptTag({ path: AXE });
  // A string, so that nothing of the test's own compilation reaches the page.
  return page.evaluate(`(async () => {
    const res = await window.axe.run(document, {
      runOnly: { type: 'tag', values: ${JSON.stringify(TAGS)} },
      elementRef: true,
    });
    const setAside = (rule, el) =>
      rule === 'label-content-name-mismatch' &&
      el instanceof SVGGElement && el.matches('g.node') &&
      el.getRootNode().host?.localName === 'lw-diagram';
    return res.violations.flatMap((v) =>
      v.nodes
        .filter((n) => !setAside(v.id, n.element))
        .map((n) => v.id + ': ' + n.target.flat().join(' ') + ' — ' + n.failureSummary.replace(/\\s+/g, ' ')),
    );
  })()`);
}

async function designerPage(context: BrowserContext): Promise<Page> {
  const page = await openPage(context, designer.url);
  await built(page);
  return page;
}

describe('the designer and its documents against WCAG 2.2 A/AA (axe-core, in chromium)', () => {
  for (const scheme of ['light', 'dark'] as const) {
    it(`every view, in the ${scheme} theme`, async () => {
      const context = await designer.context({ ...DESKTOP, colorScheme: scheme });
      const page = await designerPage(context);
      const found: string[] = [];
      for (const view of VIEWS) {
        await page.getByRole('tab', { name: view }).click();
        await expect(page.getByRole('tab', { name: view }).getAttribute('aria-selected')).resolves.toBe('true');
        if (view === 'Frame & cords') await page.locator('lw-frame .sheet svg').waitFor();
        if (view === 'Parts & forces') await page.locator('lw-parts .sheet svg').waitFor({ timeout: 60_000 });
        if (view === 'Shakedown') {
          // A step ticked as the sheet, then one with a value seen the other way: the suspects and the frame lit.
          await page.locator('lw-shakedown [data-do="walk-next"]').click({ timeout: 60_000 });
          await page.locator('lw-shakedown [data-mark="0"]').click();
          await page.locator('lw-shakedown [data-do="walk-next"]').click();
          await page.locator('lw-shakedown .findings[data-verdict]:not([data-verdict="fine"])').waitFor();
        }
        found.push(...(await violations(page)).map((v) => `${view}: ${v}`));
      }
      expect(found).toEqual([]);
      await context.close();
    }, 180_000);

    it(`the notation card, and a text that does not read (the last sketch kept, dimmed), in the ${scheme} theme`, async () => {
      const context = await designer.context({ ...DESKTOP, colorScheme: scheme });
      const page = await designerPage(context);
      await page.getByRole('button', { name: 'Notation' }).click();
      const found = (await violations(page)).map((v) => `notation card: ${v}`);
      await page.keyboard.press('Escape');
      await page
        .locator('lw-editor textarea')
        .fill('machine x\ninputs a\noutputs y\nstart s\nstate s\n  when a go t\n  when q go s\n');
      await settled(page);
      await expect(page.locator('lw-app .status').getAttribute('data-work')).resolves.toBe('refused');
      found.push(...(await violations(page)).map((v) => `refused: ${v}`));
      expect(found).toEqual([]);
      await context.close();
    }, 180_000);
  }

  it('the behaviour panel, with a field that cannot be used, in both themes', async () => {
    const found: string[] = [];
    for (const scheme of ['light', 'dark'] as const) {
      const context = await designer.context({ ...DESKTOP, colorScheme: scheme });
      const page = await designerPage(context);
      await page.getByRole('button', { name: 'From a behaviour…' }).click();
      await page.locator('lw-behaviour-card dialog').waitFor();
      found.push(...(await violations(page)).map((v) => `${scheme} behaviour panel: ${v}`));
      await page.locator('lw-behaviour-card #field-every').fill('1');
      found.push(...(await violations(page)).map((v) => `${scheme} behaviour panel, refused: ${v}`));
      await context.close();
    }
    expect(found).toEqual([]);
  }, 180_000);

  it('on a phone', async () => {
    const context = await designer.context(PHONE);
    const page = await designerPage(context);
    expect(await violations(page)).toEqual([]);
    await context.close();
  }, 180_000);

  it('the build sheet, the bring-up sheet and the commissioning sheet as written by build --out', async () => {
    const text = readFileSync(fileURLToPath(new URL('../../examples/marble-bell.lw', import.meta.url)), 'utf8');
    const a = analyse(text, 'marble-bell.lw');
    if (!a.ok) throw new Error('must read');
    const b = buildMachine(a);
    if (!b.ok) throw new Error('must build');
    const docs = buildDocuments(b);
    const context = await designer.context(DESKTOP);
    const page = await context.newPage();
    const found: string[] = [];
    for (const file of ['build-sheet.html', 'bring-up.html', 'commissioning.html'] as const) {
      await page.setContent(docs.get(file) ?? '');
      found.push(...(await violations(page)).map((v) => `${file}: ${v}`));
    }
    expect(found).toEqual([]);
    await context.close();
  }, 180_000);
});
