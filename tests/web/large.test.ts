/**
 * The designer with a large machine, end to end in a real browser (headless Chromium from the
 * npm package @sparticuz/chromium, ./chromium.ts) against the production build (./page.ts).
 * The machine is planet from the MCNC / LGSynth'91 FSM benchmark set (48 states, 7 inputs, 19
 * outputs; tests/fixtures/lgsynth91/TABLE.md), pasted into the bench in its JSON form as a user
 * would paste it. Its build has several hundred parts, so its schematic is laid out in stage
 * columns and its frame runs over many drums. Expected values come from the tool run in Node
 * on the same text (the build with the same defaults, its placement, its schematic and its frame
 * drawing, frame.svg in the screen palette, which the page puts in piece by piece).
 * Nothing here is timed: the figures are in bench/web.ts.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import type { BrowserContext, Page } from 'playwright-core';
import { analyse, buildMachine, type Built } from '../../src/core/pipeline.js';
import { schematicSvg } from '../../src/core/export/schematic-svg.js';
import { frameSvg } from '../../src/core/export/frame-svg.js';
import { PIECE_CHARS } from '../../src/web/elements/frame-view.js';
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
    // Its keep list offers the bays (an option each) only once it is used: not with the drawing.
    await page.locator('lw-frame [data-keep-tools]').click();
    const list = page.locator('lw-frame select[data-keep="part"]');
    await expect(list.locator('option').count()).resolves.toBe(1);
    await list.focus();
    await expect.poll(() => list.locator('option').count()).toBe(ref.placement.bays.length + 1);
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
      } else if (v.id === 'shakedown') {
        // planet's sheet is long: its cords are walked as a seeded sample, and the view says so.
        await page.locator('lw-shakedown [data-walk-sample]').waitFor({ timeout: 120_000 });
        drawn[v.id] = await page.locator('lw-shakedown [data-mark]').count();
      } else if (v.id === 'trial') drawn[v.id] = await page.locator('lw-stepper button[data-do="clock"]').count();
    }
    expect(drawn.sketch).toBe(STATES);
    expect(drawn.ledger).toBeGreaterThanOrEqual(STATES);
    expect(drawn.codes).toBeGreaterThan(0);
    expect(drawn.parts).toBeGreaterThan(0);
    expect(drawn.frame).toBe(ref.placement.routing.branches.length);
    expect(drawn.trial).toBe(1);
    // One button per value the sheet ticks: two Z levers per latch and one per output.
    expect(drawn.shakedown).toBe(2 * ref.build.parts.latches + ref.build.machine.outputs.length);
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

  it("puts a large frame in piece by piece, ending as the core's drawing element for element, and lights one cord and its two ends", async () => {
    await tab('frame');
    await page.locator('lw-frame[data-drawing="whole"]').waitFor({ timeout: 60_000 });
    // The core's drawing of the same build (frame.svg in the screen palette) is long enough to come in pieces.
    const core = frameSvg(ref.build, ref.placement, ref.profile, { palette: 'screen' });
    expect(core.length).toBeGreaterThan(2 * PIECE_CHARS);
    const mismatch = await page.locator('lw-frame .sheet svg').evaluate((svg, text) => {
      // What the page adds: a hit copy over each cord, the copies of a lit cord, focus and stand attributes, lighting classes.
      const added = new Set(['tabindex', 'role', 'aria-label', 'aria-hidden', 'data-stand']);
      const lighting = new Set(['lit', 'end', 'from', 'to', 'veiled']);
      const sig = (el: Element): string =>
        [
          el.localName,
          ...[...el.attributes]
            .filter((a) => !added.has(a.name) && a.name !== 'class')
            .map((a) => `${a.name}=${a.value}`),
          [...el.classList].filter((c) => !lighting.has(c)).join('.'),
          el.children.length === 0 ? (el.textContent ?? '') : '',
        ].join(' ');
      const drawn = [...svg.querySelectorAll('*')].filter(
        (el) => !el.matches('path.hit, path.hit *, g.lit-copies, g.lit-copies *'),
      );
      const doc = new DOMParser().parseFromString(text, 'image/svg+xml');
      const want = [...doc.documentElement.querySelectorAll('*')];
      for (let i = 0; i < Math.max(drawn.length, want.length); i++) {
        const a = drawn[i] ? sig(drawn[i]) : '(none)';
        const b = want[i] ? sig(want[i]) : '(none)';
        if (a !== b) return `element ${i} of ${want.length}: drawn ${a.slice(0, 200)}; frame.svg ${b.slice(0, 200)}`;
      }
      return drawn.length > 0 ? '' : 'nothing drawn';
    }, core);
    expect(mismatch).toBe('');
    // Pointing at a cord where it lies on top of the others lights exactly that branch, its whole path and its ends.
    const at = await page
      .locator('lw-frame path.cord[data-cord]')
      .nth(Math.floor(ref.placement.routing.branches.length / 2))
      .evaluate((el: SVGPathElement) => {
        el.scrollIntoView({ block: 'center', inline: 'center' });
        const m = el.getScreenCTM();
        const root = el.getRootNode() as ShadowRoot;
        for (let j = 1; j < 40 && m; j++) {
          const p = el.getPointAtLength((el.getTotalLength() * j) / 40);
          const x = m.a * p.x + m.c * p.y + m.e;
          const y = m.b * p.x + m.d * p.y + m.f;
          const top = root.elementFromPoint(x, y)?.closest('[data-cord][data-target]');
          if (top)
            return { x, y, cord: top.getAttribute('data-cord') ?? '', target: top.getAttribute('data-target') ?? '' };
        }
        return undefined;
      });
    if (!at) throw new Error('no cord on top anywhere along the one pointed at');
    await page.mouse.move(at.x, at.y);
    const b = ref.placement.routing.branches.find((x) => x.cord === at.cord && x.target === at.target);
    if (!b) throw new Error(`the build has no branch ${at.cord} → ${at.target}`);
    const lit = await page
      .locator('lw-frame path.cord.lit')
      .evaluateAll((ps) => ps.map((p) => `${p.getAttribute('data-cord')}→${p.getAttribute('data-target')}`));
    expect(lit).toEqual([`${b.cord}→${b.target}`]);
    await expect(page.locator('lw-frame path.route.lit').getAttribute('data-route-target')).resolves.toBe(b.target);
    // Drawn again above the dimmed cords: the branch and its whole path.
    await expect(page.locator('lw-frame g.lit-copies path').count()).resolves.toBe(2);
    await expect(page.locator('lw-frame g.cords.veiled').count()).resolves.toBe(1);
    const ends = (side: string) =>
      page.locator(`lw-frame .end.${side}`).evaluateAll((es) => es.map((e) => e.getAttribute('data-part')));
    const from = await ends('from');
    expect(from.length).toBeGreaterThan(0);
    expect(new Set(from)).toEqual(new Set([b.driver]));
    const to = await ends('to');
    expect(to.length).toBeGreaterThan(0);
    expect(new Set(to)).toEqual(new Set([b.part]));
    await page.mouse.move(1, 1);
    await expect(page.locator('lw-frame path.cord.lit').count()).resolves.toBe(0);
    await expect(page.locator('lw-frame g.lit-copies path').count()).resolves.toBe(0);
    await expect(page.locator('lw-frame g.cords.veiled').count()).resolves.toBe(0);
  }, 120_000);
});
