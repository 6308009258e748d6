/**
 * Drawing a machine in the sketch, end to end in a real browser (headless Chromium from the
 * npm package @sparticuz/chromium, through ./page.ts): from New, every edit is made in the
 * sketch alone — a new state by double-click, a transition by dragging a state's dot and one
 * by keys, outputs, the start, a rename, a guard, a deletion — and each must land in the text
 * as the edit the parser's places call for. The expected text is written out in full here;
 * the refusals must carry the core's own diagnostics (analyse, as the command line reports
 * them); the finished text, built by `latchwright build` run in-process, must give the very
 * netlist the page built; Ctrl+Z in the sketch takes back the last drawn edit and Ctrl+Shift+Z
 * makes it again. With LW_SCREENSHOTS=1 it takes the docs' picture of a field refusing a guard.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { analyse } from '../../src/core/pipeline.js';
import { NEW_MACHINE } from '../../src/web/examples.js';
import { run, tempDir, removeTempDirs } from '../cli/support.js';
import { built, downloaded, openPage, PHONE, settled, shot, startDesigner, type Designer } from './page.js';

let designer: Designer;
let context: BrowserContext;
let page: Page;

const text = (): Promise<string> => page.locator('lw-editor textarea').inputValue();
const node = (name: string) => page.locator(`lw-diagram g.node[data-state="${name}"]`);
const field = () => page.locator('lw-diagram form.field');

/** Wait until the page has read the latest text (the sketch then shows it and takes drawing again). */
async function read(): Promise<void> {
  await page.waitForFunction(() => {
    const app = document.querySelector('lw-app');
    return app !== null && app.dataset.read === app.dataset.job;
  });
}

/** Type into the open field and press Enter. */
async function answer(value: string): Promise<void> {
  await field().locator('input').fill(value);
  await field().locator('input').press('Enter');
}

/** The problem the open field shows after an answer was refused. */
const problem = (): Promise<string> => field().locator('.problem').innerText();

/** The first error the core finds in `t`, as the sketch words it: code, message and hint. */
function coreError(t: string): string {
  const d = analyse(t).diagnostics.find((x) => x.severity === 'error');
  if (!d) throw new Error('no error');
  return `${d.code}: ${d.message}${d.hint ? ` — ${d.hint}` : ''}`;
}

/** Where a state is drawn, from the sketch's top left corner (the page around it may move). */
async function placeOf(name: string): Promise<{ x: number; y: number }> {
  const [a, b] = await Promise.all([node(name).boundingBox(), page.locator('lw-diagram svg').boundingBox()]);
  if (!a || !b) throw new Error('not drawn');
  return { x: a.x - b.x, y: a.y - b.y };
}

/** Drag a state's dot onto another state (once the page has stopped moving: a draft build's note comes and goes). */
async function drag(from: string, to: string): Promise<void> {
  await built(page);
  await node(from).hover();
  const dot = await node(from).locator('circle.handle').boundingBox();
  const target = await node(to).locator('rect.body').boundingBox();
  if (!dot || !target) throw new Error('not drawn');
  await page.mouse.move(dot.x + dot.width / 2, dot.y + dot.height / 2);
  await page.mouse.down();
  await page.mouse.move(target.x + target.width / 2, target.y + target.height / 2, { steps: 6 });
  await page.mouse.up();
}

beforeAll(async () => {
  designer = await startDesigner();
  context = await designer.context();
  page = await openPage(context, designer.url);
});

afterAll(async () => {
  await designer.close();
  removeTempDirs();
});

describe('src/web/elements/diagram (drawing a machine, end to end in chromium)', () => {
  it('draws a machine from New in the sketch alone: the text, the checks, undo and the command line’s netlist agree', async () => {
    await page.getByRole('button', { name: 'New machine from a short template' }).click();
    await settled(page);
    expect(await text()).toBe(NEW_MACHINE);

    // A new state: double-click an empty corner of the canvas. Taken and malformed names are refused at once.
    const box = await page.locator('lw-diagram svg').boundingBox();
    if (!box) throw new Error('no sketch');
    await page.mouse.dblclick(box.x + 12, box.y + box.height - 12);
    await answer('dark');
    expect(await problem()).toBe(coreError(`${NEW_MACHINE}\nstate dark\n`));
    expect(await problem()).toMatch(/^LW203: the state 'dark' is declared twice/);
    await answer('ring-ing');
    expect(await problem()).toBe(coreError(`${NEW_MACHINE}\nstate ring-ing\n`));
    expect(await text()).toBe(NEW_MACHINE);
    const litWas = await placeOf('lit');
    await answer('ringing');
    let want = `${NEW_MACHINE}\nstate ringing\n`;
    expect(await text()).toBe(want);
    await read();
    // The states already there stay about where they were in the sketch (less than a line of its
    // text: the layout centres each rank anew), at the same scale, rather than the whole sketch being fitted again.
    await node('ringing').waitFor();
    const litNow = await placeOf('lit');
    expect(Math.hypot(litNow.x - litWas.x, litNow.y - litWas.y)).toBeLessThan(16);

    // A transition by dragging lit's dot onto ringing; a misspelt input gets the core's did-you-mean.
    await drag('lit', 'ringing');
    await expect(field().getAttribute('data-field')).resolves.toBe('new-transition');
    await expect(field().locator('.offer button').allInnerTexts()).resolves.toEqual(['button']);
    await answer('buton');
    expect(await problem()).toMatch(/^LW201: .*did you mean 'button'\?/);
    await shot(page, 'sketch-drawing');
    await answer('button');
    want = want.replace('  when button go dark\n', '  when button go dark\n  when button go ringing\n');
    expect(await text()).toBe(want);
    await read();

    // A transition by keys: T on ringing, the arrow keys to dark, Enter, and no guard (always).
    await node('ringing').focus();
    await page.keyboard.press('t');
    const names = await page
      .locator('lw-diagram g.node')
      .evaluateAll((gs) => gs.map((g) => g.getAttribute('data-state')));
    const steps = (names.indexOf('dark') - names.indexOf('ringing') - 1 + 2 * names.length) % names.length;
    for (let i = 0; i < steps; i++) await page.keyboard.press('ArrowRight');
    expect(await node('dark').getAttribute('class')).toMatch(/\btarget\b/);
    await page.keyboard.press('Enter');
    await answer('');
    want += '  go dark\n';
    expect(await text()).toBe(want);
    await read();

    // Outputs (O), then the start (S), both from the keys on a focused state.
    await node('ringing').focus();
    await page.keyboard.press('o');
    await answer('lamp=1');
    want = want.replace('state ringing\n', 'state ringing with lamp=1\n');
    expect(await text()).toBe(want);
    await read();
    await node('ringing').focus();
    await page.keyboard.press('s');
    want = want.replace('start dark ', 'start ringing ');
    expect(await text()).toBe(want);
    await read();

    // Rename dark by double-click: its declaration and every transition into it.
    await node('dark').dblclick();
    await answer('lit');
    expect(await problem()).toMatch(/^LW203: the state 'lit' is declared twice/);
    await answer('idle');
    want = want
      .replace('state dark\n', 'state idle\n')
      .replace('  when button go dark\n', '  when button go idle\n')
      .replace('  go dark\n', '  go idle\n');
    expect(await text()).toBe(want);
    await read();

    // A guard changed by double-clicking its label.
    await page.locator('lw-diagram g.label[aria-label^="Transition from lit to idle"] text').first().dblclick();
    await answer('!button');
    want = want.replace(
      '  when button go idle\n  when button go ringing',
      '  when !button go idle\n  when button go ringing',
    );
    expect(await text()).toBe(want);
    await read();

    // A state drawn and deleted again (Delete on it): its transitions go with it, and the sketch says so.
    await page.locator('lw-diagram button[data-do="new-state"]').click();
    await answer('spare');
    await read();
    await drag('idle', 'spare');
    await answer('');
    await read();
    const before = want;
    await node('spare').focus();
    await page.keyboard.press('Delete');
    await expect(page.locator('lw-diagram .said').innerText()).resolves.toContain('1 transition into it (from idle)');
    await read();
    expect(await text()).toBe(before);
    await expect(node('spare').count()).resolves.toBe(0);

    const final = want;
    expect(final).toContain('\nstart ringing ');
    expect(final.endsWith('state ringing with lamp=1\n  go idle\n')).toBe(true);

    // Undo in the sketch takes back the deletion, redo makes it again.
    await node('ringing').focus();
    await page.keyboard.press('Control+z');
    await expect.poll(text).toContain('state spare');
    await read();
    await page.locator('lw-diagram g.node').first().focus();
    await page.keyboard.press('Control+Shift+z');
    await expect.poll(text).toBe(final);

    // Built, every check passing, and the netlist is the command line's from the same text.
    await built(page);
    await expect(page.locator('lw-app .status').innerText()).resolves.toBe('Built · every check passes');
    const file = join(tempDir('lw-drawn-'), 'new_machine.lw');
    writeFileSync(file, final);
    const dir = tempDir('lw-drawn-out-');
    const cli = await run(['build', file, '--out', dir]);
    expect(cli.code, cli.err).toBe(0);
    await page.getByRole('tab', { name: 'Parts & forces' }).click();
    await page.locator('lw-parts details').evaluate((d: HTMLDetailsElement) => (d.open = true));
    const f = await downloaded(page, () => page.locator('lw-parts button[data-doc="netlist.json"]').click());
    expect(readFileSync(f.path, 'utf8')).toBe(readFileSync(join(dir, 'netlist.json'), 'utf8'));

    // An edit in the ledger is typed into the text the same way: the text's own Ctrl+Z takes it back.
    await page.getByRole('tab', { name: 'Ledger' }).click();
    const guard = page.locator('lw-state-table input[aria-label="Guard of transition 1 to idle"]').nth(1);
    await guard.fill('button');
    await guard.press('Tab');
    const guarded = final.replace(
      'state ringing with lamp=1\n  go idle\n',
      'state ringing with lamp=1\n  when button go idle\n',
    );
    await expect.poll(text).toBe(guarded);
    await page.locator('lw-editor textarea').focus();
    await page.keyboard.press('Control+z');
    await expect.poll(text).toBe(final);
    // And Ctrl+Z in the ledger itself (outside a text field) takes back its last edit.
    const target = page.locator('lw-state-table select[aria-label="Target of transition 1"]').first();
    await target.selectOption('ringing');
    await expect.poll(text).toBe(final.replace('  when button go lit #', '  when button go ringing #'));
    await read();
    await target.focus();
    await page.keyboard.press('Control+z');
    await expect.poll(text).toBe(final);

    // A machine in the JSON form is shown, not drawn on: the sketch says so and offers no drawing.
    const json = JSON.stringify({
      name: 'tiny',
      inputs: ['a'],
      outputs: [],
      start: 's',
      states: [
        { name: 's', transitions: [{ when: 'a', to: 't' }] },
        { name: 't', transitions: [{ to: 's' }] },
      ],
    });
    await page.locator('lw-editor textarea').fill(json);
    await settled(page);
    await page.getByRole('tab', { name: 'Sketch' }).click();
    await node('t').waitFor();
    await expect(page.locator('lw-diagram .legend').innerText()).resolves.toContain(
      'this machine is not in the text form, so the sketch only shows it',
    );
    await expect(page.locator('lw-diagram button[data-do="new-state"]').count()).resolves.toBe(0);
    const sketch = await page.locator('lw-diagram svg').boundingBox();
    if (!sketch) throw new Error('no sketch');
    await page.mouse.dblclick(sketch.x + 12, sketch.y + sketch.height - 12);
    await node('t').focus();
    await page.keyboard.press('Delete');
    await expect(field().count()).resolves.toBe(0);
    expect(await text()).toBe(json);
  });

  it('takes a file with CRLF line breaks as the textarea holds it, so a drawing is undone by the text’s own undo', async () => {
    // A file saved on a system that ends lines with CR LF: the bench holds it with LF, as its
    // textarea does (HTML's API value of a textarea), lines and columns unchanged.
    const crlf = NEW_MACHINE.replace(/\n/g, '\r\n');
    await page
      .locator('lw-bench input[type=file]')
      .setInputFiles({ name: 'dos.lw', mimeType: 'text/plain', buffer: Buffer.from(crlf) });
    await expect.poll(text).toBe(NEW_MACHINE);
    await page.getByRole('tab', { name: 'Sketch' }).click();
    await built(page);
    await node('dark').focus();
    await page.keyboard.press('n');
    await answer('spare');
    await expect.poll(text).toBe(`${NEW_MACHINE}\nstate spare\n`);
    await page.locator('lw-editor textarea').focus();
    await page.keyboard.press('Control+z');
    await expect.poll(text).toBe(NEW_MACHINE);
  });

  it('draws a transition by touch on a phone: tap a state, drag its dot onto another', async () => {
    const phone = await designer.context(PHONE);
    page = await openPage(phone, designer.url);
    await page.getByRole('button', { name: 'New machine from a short template' }).click();
    await built(page);
    await node('lit').scrollIntoViewIfNeeded();
    await node('lit').tap();
    const dot = await node('lit').locator('circle.handle').boundingBox();
    const target = await node('dark').locator('rect.body').boundingBox();
    if (!dot || !target) throw new Error('not drawn');
    // A finger on the dot, moved in steps onto dark and lifted (Chromium's own touch input).
    const cdp = await phone.newCDPSession(page);
    const touch = (type: 'touchStart' | 'touchMove' | 'touchEnd', x: number, y: number): Promise<unknown> =>
      cdp.send('Input.dispatchTouchEvent', { type, touchPoints: type === 'touchEnd' ? [] : [{ x, y }] });
    const [x0, y0] = [dot.x + dot.width / 2, dot.y + dot.height / 2];
    const [x1, y1] = [target.x + target.width / 2, target.y + target.height / 2];
    await touch('touchStart', x0, y0);
    for (let i = 1; i <= 6; i++) await touch('touchMove', x0 + ((x1 - x0) * i) / 6, y0 + ((y1 - y0) * i) / 6);
    await touch('touchEnd', x1, y1);
    await expect(field().getAttribute('data-field')).resolves.toBe('new-transition');
    // The first tap after a drag can be taken as the drag's end (Chromium's gesture detection): tap the field first.
    await field().locator('input').tap();
    await field().locator('.offer button').tap();
    await expect.poll(() => field().locator('input').inputValue()).toBe('button');
    await field().getByRole('button', { name: 'OK' }).tap();
    await expect
      .poll(text)
      .toBe(NEW_MACHINE.replace('  when button go dark\n', '  when button go dark\n  when button go dark\n'));
    await phone.close();
  });
});
