/**
 * Arranging the sketch, end to end in a real browser (headless Chromium from the npm package
 * @sparticuz/chromium, through ./page.ts): a state dragged by its card goes where it is put and
 * its transitions' ends follow it onto its outline; the text, the build and the undo history
 * are untouched by moves; a click still finds the state's line and a drag of its dot still
 * draws a transition; Shift and an arrow key move a focused state; a state added by
 * double-click is at the spot clicked; a reload brings the arrangement back; "Back to the
 * layout" puts every state where the automatic layout has it; and a finger moves a state too.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { NEW_MACHINE } from '../../src/web/examples.js';
import { MOVE_STEP } from '../../src/web/elements/sketch-keys.js';
import { built, caret, openPage, pageWork, PHONE, settled, startDesigner, type Designer } from './page.js';

let designer: Designer;
let context: BrowserContext;
let page: Page;

const text = (): Promise<string> => page.locator('lw-editor textarea').inputValue();
const node = (name: string) => page.locator(`lw-diagram g.node[data-state="${name}"]`);
const field = () => page.locator('lw-diagram form.field');
const relayout = () => page.locator('lw-diagram button[data-do="relayout"]');

/** Where a state's card is in the layout's own coordinates (its group's translation). */
const laidAt = (name: string): Promise<string | null> => node(name).getAttribute('transform');

/** The middle of a state's card on screen, left of its dot. */
async function cardMiddle(name: string): Promise<{ x: number; y: number }> {
  const b = await node(name).locator('rect.body').boundingBox();
  if (!b) throw new Error('not drawn');
  return { x: b.x + b.width * 0.4, y: b.y + b.height / 2 };
}

/** Drag from one point to another with the mouse, in steps. */
async function mouseDrag(from: { x: number; y: number }, dx: number, dy: number): Promise<void> {
  await page.mouse.move(from.x, from.y);
  await page.mouse.down();
  await page.mouse.move(from.x + dx, from.y + dy, { steps: 8 });
  await page.mouse.up();
}

/**
 * For each transition touching `name`: how far (layout pixels) its wire's two ends are from the
 * outlines of the cards they belong to.
 */
function endsOffOutline(name: string): Promise<number[]> {
  return page.locator('lw-diagram').evaluate((el, id) => {
    const root = el.shadowRoot as ShadowRoot;
    const card = (s: string) => {
      const g = [...root.querySelectorAll<SVGGElement>('g.node')].find((x) => x.dataset.state === s) as SVGGElement;
      const m = /translate\(([-\d.e]+),([-\d.e]+)\)/.exec(g.getAttribute('transform') ?? '') as RegExpExecArray;
      const r = g.querySelector('rect.body') as SVGRectElement;
      return { x: Number(m[1]), y: Number(m[2]), w: r.width.baseVal.value, h: r.height.baseVal.value };
    };
    // Distance from a point to a rectangle's outline.
    const off = (p: DOMPoint, c: { x: number; y: number; w: number; h: number }): number => {
      const dx = Math.max(c.x - p.x, 0, p.x - (c.x + c.w));
      const dy = Math.max(c.y - p.y, 0, p.y - (c.y + c.h));
      if (dx > 0 || dy > 0) return Math.hypot(dx, dy);
      return Math.min(p.x - c.x, c.x + c.w - p.x, p.y - c.y, c.y + c.h - p.y);
    };
    const out: number[] = [];
    for (const e of root.querySelectorAll<SVGGElement>('g.edge')) {
      const label = e.querySelector('g.label')?.getAttribute('aria-label') ?? '';
      const m = /^Transition from (\S+) to (\S+):/.exec(label);
      if (!m || (m[1] !== id && m[2] !== id) || m[1] === m[2]) continue;
      const wire = e.querySelector('path.wire') as SVGPathElement;
      const start = wire.getPointAtLength(0);
      const end = wire.getPointAtLength(wire.getTotalLength());
      out.push(off(start, card(m[1])), off(end, card(m[2])));
    }
    return out;
  }, name);
}

beforeAll(async () => {
  designer = await startDesigner();
  context = await designer.context();
  page = await openPage(context, designer.url);
});

afterAll(async () => {
  await designer.close();
});

describe('src/web/elements/diagram (arranging the sketch, end to end in chromium)', () => {
  it('moves states by drag and by keys without touching the text, keeps the arrangement over a reload, and puts it back', async () => {
    await page.getByRole('button', { name: 'New machine from a short template' }).click();
    await built(page);
    const laid = { dark: await laidAt('dark'), lit: await laidAt('lit') };
    const work = await pageWork(page);
    await expect(relayout().count()).resolves.toBe(0);

    // Drag lit by its card: it goes where it is put, its transitions' ends stay on the outlines.
    const was = await cardMiddle('lit');
    await mouseDrag(was, -160, 140);
    const now = await cardMiddle('lit');
    expect(Math.hypot(now.x - was.x + 160, now.y - was.y - 140)).toBeLessThan(2);
    const ends = await endsOffOutline('lit');
    expect(ends).toHaveLength(4);
    for (const d of ends) expect(d).toBeLessThan(1.5);
    // Nothing else changed: the text, the build (no new job) and the text's undo.
    expect(await text()).toBe(NEW_MACHINE);
    expect((await pageWork(page)).job).toBe(work.job);
    await expect(relayout().count()).resolves.toBe(1);
    expect(await laidAt('dark')).toBe(laid.dark);

    // A click without a drag still puts the caret on the state's line.
    await page.mouse.click(now.x, now.y);
    expect((await caret(page)).line).toBe(NEW_MACHINE.split('\n').indexOf('state lit with lamp=1') + 1);

    // Shift and an arrow key on the focused state move it a step.
    const before = await cardMiddle('lit');
    await node('lit').focus();
    await page.keyboard.press('Shift+ArrowRight');
    const k = Number(await page.locator('lw-diagram').getAttribute('data-scale'));
    expect((await cardMiddle('lit')).x - before.x).toBeCloseTo(MOVE_STEP * k, 0);
    expect(await text()).toBe(NEW_MACHINE);

    // The dot still draws a transition, onto the moved state.
    await node('dark').hover();
    const dot = await node('dark').locator('circle.handle').boundingBox();
    if (!dot) throw new Error('no dot');
    const target = await cardMiddle('lit');
    await mouseDrag(
      { x: dot.x + dot.width / 2, y: dot.y + dot.height / 2 },
      target.x - dot.x - dot.width / 2,
      target.y - dot.y - dot.height / 2,
    );
    await expect(field().getAttribute('data-field')).resolves.toBe('new-transition');
    await field().locator('input').press('Escape');
    expect(await text()).toBe(NEW_MACHINE);

    // A new state by double-click on an empty spot: it is drawn at the spot.
    const svg = await page.locator('lw-diagram svg').boundingBox();
    if (!svg) throw new Error('no sketch');
    const spot = { x: svg.x + svg.width * 0.75, y: svg.y + svg.height * 0.8 };
    await page.mouse.dblclick(spot.x, spot.y);
    await field().locator('input').fill('ringing');
    await field().locator('input').press('Enter');
    await expect.poll(text).toBe(`${NEW_MACHINE}\nstate ringing\n`);
    await settled(page);
    await node('ringing').waitFor();
    // At the spot of the sketch (the page around it may have moved: a row of actions for the new state).
    const [put, view] = await Promise.all([
      node('ringing').locator('rect.body').boundingBox(),
      page.locator('lw-diagram svg').boundingBox(),
    ]);
    if (!put || !view) throw new Error('not drawn');
    const off = [put.x + put.width / 2 - view.x - (spot.x - svg.x), put.y + put.height / 2 - view.y - (spot.y - svg.y)];
    expect(Math.hypot(off[0], off[1])).toBeLessThan(3);

    // A reload brings the arrangement back (the layout's own coordinates are the same).
    const arranged = { lit: await laidAt('lit'), ringing: await laidAt('ringing'), dark: await laidAt('dark') };
    await page.reload();
    await settled(page);
    await node('ringing').waitFor();
    expect({ lit: await laidAt('lit'), ringing: await laidAt('ringing'), dark: await laidAt('dark') }).toEqual(
      arranged,
    );

    // Renamed on its machine line, the machine keeps its arrangement (the entry moves to the new name).
    const renamed = `${NEW_MACHINE}\nstate ringing\n`.replace('machine new_machine', 'machine porch_lamp');
    await page.locator('lw-editor textarea').fill(renamed);
    await settled(page);
    expect({ lit: await laidAt('lit'), ringing: await laidAt('ringing'), dark: await laidAt('dark') }).toEqual(
      arranged,
    );
    expect(await page.evaluate(() => localStorage.getItem('latchwright.places'))).toContain('"porch_lamp"');

    // Back to the layout: every state where the automatic layout has it, and the arrangement forgotten.
    await relayout().click();
    await expect(relayout().count()).resolves.toBe(0);
    expect(await laidAt('lit')).not.toBe(arranged.lit);
    expect(await page.evaluate(() => localStorage.getItem('latchwright.places'))).toBeNull();
    await page.locator('lw-editor textarea').fill(NEW_MACHINE);
    await settled(page);
    await node('ringing').waitFor({ state: 'detached' });
    expect({ dark: await laidAt('dark'), lit: await laidAt('lit') }).toEqual(laid);
  });

  it('moves a state by touch on a phone, and a tap still finds its line', async () => {
    const phone = await designer.context(PHONE);
    const p = await openPage(phone, designer.url);
    await p.getByRole('button', { name: 'New machine from a short template' }).click();
    await built(p);
    const card = p.locator('lw-diagram g.node[data-state="lit"] rect.body');
    await card.scrollIntoViewIfNeeded();
    const b = await card.boundingBox();
    if (!b) throw new Error('not drawn');
    const cdp = await phone.newCDPSession(p);
    const touch = (type: 'touchStart' | 'touchMove' | 'touchEnd', x: number, y: number): Promise<unknown> =>
      cdp.send('Input.dispatchTouchEvent', { type, touchPoints: type === 'touchEnd' ? [] : [{ x, y }] });
    const [x0, y0] = [b.x + b.width * 0.4, b.y + b.height / 2];
    await touch('touchStart', x0, y0);
    for (let i = 1; i <= 6; i++) await touch('touchMove', x0 - 10 * i, y0 + (i % 2));
    await touch('touchEnd', x0 - 60, y0);
    const a = await card.boundingBox();
    if (!a) throw new Error('not drawn');
    expect(Math.hypot(a.x - b.x + 60, a.y - b.y)).toBeLessThan(2);
    await expect(p.locator('lw-diagram button[data-do="relayout"]').count()).resolves.toBe(1);
    expect(await p.locator('lw-editor textarea').inputValue()).toBe(NEW_MACHINE);
    // A tap (a touch that does not move) on the moved card finds its line in the text. (The card
    // was moved sideways: the part of the sketch this page shows on a phone is a band that high.)
    // The first tap after a drag can be taken as the drag's end (Chromium's gesture detection):
    // an empty spot of the canvas is tapped first.
    const sketch = await p.locator('lw-diagram svg').boundingBox();
    if (!sketch) throw new Error('no sketch');
    await p.touchscreen.tap(sketch.x + sketch.width - 6, a.y + a.height / 2);
    await p.waitForTimeout(400);
    await p.touchscreen.tap(a.x + a.width * 0.4, a.y + a.height / 2);
    await expect
      .poll(async () => (await caret(p)).line)
      .toBe(NEW_MACHINE.split('\n').indexOf('state lit with lamp=1') + 1);
    await expect(p.locator('lw-diagram form.field').count()).resolves.toBe(0);
    await phone.close();
  });
});
