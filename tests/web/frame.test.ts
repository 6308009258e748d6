/**
 * The frame view end to end in Chromium (./chromium.ts, driven by playwright-core) against the
 * production build served on 127.0.0.1 (./page.ts). Expected values come from the tool run in
 * Node on the same text: the build's placement (the place phase) for the bays and cords, the
 * part-level runner (src/core/sim) for where every lever stands after the same hand actions,
 * and frame.svg (the build documents) for the printed drawing and its scale. Screenshots go to
 * docs/screenshots/ only with LW_SCREENSHOTS=1.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import type { BrowserContext, Page } from 'playwright-core';
import { analyse, buildMachine, type Built } from '../../src/core/pipeline.js';
import { createRunner, type PartRunner } from '../../src/core/sim/runner.js';
import { timingOf } from '../../src/core/sim/part.js';
import { phaseActions, resetActions, type HandAction } from '../../src/core/sim/hand.js';
import { frameScale, frameSvg } from '../../src/core/export/frame-svg.js';
import { MIN_TEXT_PX } from '../../src/web/elements/frame-view.js';
import { built, openPage, overflowing, PHONE, shot, startDesigner, type Designer } from './page.js';

const FILE = 'marble-bell.lw';
const EXAMPLE = readFileSync(fileURLToPath(new URL(`../../examples/${FILE}`, import.meta.url)), 'utf8');

let designer: Designer;
let context: BrowserContext;
let page: Page;
let ref: Built;

const tab = (name: string): Promise<void> => page.getByRole('tab', { name }).click();
const frameTab = (): Promise<void> => tab('Frame & cords');

/**
 * The levers held down, from the simulator's values (the netlist's polarity, model/netlist.ts):
 * an operator lever while pulled (1); a gate's Z lever while the gate gives 1; a port lever
 * while a cord on it pulls, that is while one of its drivers gives 0.
 */
function downInNode(b: Built, r: PartRunner): string[] {
  const v = (id: string): number => r.state.values[r.sim.ids.indexOf(id)];
  const kind = new Map(b.build.netlist.parts.map((p) => [p.id, p.kind]));
  const out: string[] = [];
  for (const bay of b.placement.bays)
    for (const { name } of bay.levers) {
      const k = kind.get(bay.part);
      let down = false;
      if (k === 'lever' || (k === 'gate' && name === 'Z')) down = v(bay.part) === 1;
      else if (k === 'gate')
        down = b.build.netlist.cords.some(
          (c) => c.ports.some((p) => p.part === bay.part && p.port === name) && v(c.driver) === 0,
        );
      if (down) out.push(`${bay.part} ${name}`);
    }
  return out.sort();
}

/** The levers the page's frame shows held down. */
async function downOnPage(): Promise<string[]> {
  const ends = await page
    .locator('lw-frame rect.lever[data-stand="down"]')
    .evaluateAll((rs) => rs.map((r) => `${r.getAttribute('data-part')} ${r.getAttribute('data-lever')}`));
  return ends.sort();
}

/** Put the mouse on a drawn cord: a point on its stroke where no other cord is drawn over it. */
async function pointAt(cord: string, target: string): Promise<void> {
  const p = await page
    .locator(`lw-frame path.cord[data-cord="${cord}"][data-target="${target}"]`)
    .evaluate((el: SVGPathElement) => {
      el.scrollIntoView({ block: 'center', inline: 'center' });
      const m = el.getScreenCTM();
      const root = el.getRootNode() as ShadowRoot;
      const len = el.getTotalLength();
      for (let i = 1; i < 40 && m; i++) {
        const at = el.getPointAtLength((len * i) / 40);
        const x = m.a * at.x + m.c * at.y + m.e;
        const y = m.b * at.x + m.d * at.y + m.f;
        const top = root.elementFromPoint(x, y)?.closest('[data-cord]');
        if (
          top?.getAttribute('data-cord') === el.dataset.cord &&
          top?.getAttribute('data-target') === el.dataset.target
        )
          return { x, y };
      }
      return undefined;
    });
  if (!p) throw new Error(`cord ${cord} → ${target} is covered everywhere`);
  await page.mouse.move(p.x, p.y);
}

beforeAll(async () => {
  const a = analyse(EXAMPLE, FILE);
  if (!a.ok) throw new Error('the example must read');
  const b = buildMachine(a);
  if (!b.ok) throw new Error('the example must build');
  ref = b;
  designer = await startDesigner();
  context = await designer.context();
  page = await openPage(context, designer.url);
  await built(page);
});

afterAll(async () => {
  await designer.close();
});

describe('src/web/elements/frame-view (end to end in chromium)', () => {
  it('shows every bay of the built example, from the placement the build documents use', async () => {
    await frameTab();
    await page.locator('lw-frame .sheet svg').waitFor();
    const labels = await page
      .locator('lw-frame .sheet g[data-part]')
      .evaluateAll((gs) => gs.map((g) => g.getAttribute('data-part') ?? ''));
    expect(labels.sort()).toEqual(ref.placement.bays.map((b) => b.part).sort());
    const ends = await page
      .locator('lw-frame rect.lever[data-part]')
      .evaluateAll((rs) =>
        rs.map((r) => ['data-part', 'data-lever', 'data-drum', 'data-bay'].map((a) => r.getAttribute(a)).join(' ')),
      );
    const placed = ref.placement.bays.flatMap((b) =>
      b.levers.filter((l) => l.name !== 'exit').map((l) => `${b.part} ${l.name} ${b.drum} ${b.bay}`),
    );
    expect(ends.sort()).toEqual(placed.sort());
    // The same drawing as frame.svg: the same picture box, every branch drawn.
    const viewBox = /viewBox="([^"]+)"/.exec(frameSvg(ref.build, ref.placement, ref.profile))?.[1];
    await expect(page.locator('lw-frame .sheet svg').getAttribute('viewBox')).resolves.toBe(viewBox);
    await expect(page.locator('lw-frame path.cord[data-cord]').count()).resolves.toBe(
      ref.placement.routing.branches.length,
    );
    await expect(page.locator('lw-frame [data-frame-summary]').innerText()).resolves.toContain(
      `${ref.placement.bays.length} bays`,
    );
  });

  it("lights one cord's run and its two ends when pointed at, tabbed to or tapped", async () => {
    // A branch cut with a run along the channel of its own (a branch cut as its rise alone comes below).
    const b = ref.placement.routing.branches.find(
      (x) => x.kind === 'port' && x.driver !== x.part && x.own.some((r) => r.kind === 'channel'),
    );
    if (!b) throw new Error('the example has a cord between two bays');
    const port = b.target.slice(b.part.length + 1);
    const litNow = () =>
      page
        .locator('lw-frame path.cord.lit')
        .evaluateAll((ps) => ps.map((p) => `${p.getAttribute('data-cord')}→${p.getAttribute('data-target')}`));
    const ends = (side: string) =>
      page
        .locator(`lw-frame .end.${side}`)
        .evaluateAll((es) =>
          es.map((e) => `${e.localName} ${e.getAttribute('data-part')} ${e.getAttribute('data-lever')}`),
        );
    await pointAt(b.cord, b.target);
    expect(await litNow()).toEqual([`${b.cord}→${b.target}`]);
    // Its whole path from the drum, shared stretches included, is drawn while it is lit.
    const route = page.locator('lw-frame path.route.lit');
    await expect(route.count()).resolves.toBe(1);
    await expect(route.getAttribute('data-route-target')).resolves.toBe(b.target);
    await expect(route.evaluate((el) => getComputedStyle(el).visibility)).resolves.toBe('visible');
    await expect(page.locator('lw-frame .sheet').getAttribute('class')).resolves.toContain('lighting');
    // One end: the capstan that pulls it and its bay's label; the other: the lever it is tied to.
    const from = await ends('from');
    expect(from.length).toBeGreaterThan(0);
    for (const e of from) expect(e.split(' ')[1]).toBe(b.driver);
    expect(from.some((e) => e.startsWith('rect '))).toBe(true);
    const to = await ends('to');
    expect(to).toContain(`rect ${b.part} ${port}`);
    for (const e of to) expect(e.split(' ')[1]).toBe(b.part);
    const words = await page.locator('lw-frame [data-readout]').innerText();
    expect(words).toContain(b.cord);
    expect(words).toContain(`${b.lengthM.toFixed(2)} m to cut`);
    await shot(page, 'frame');
    // Away from every cord, nothing is lit.
    await page.mouse.move(1, 1);
    expect(await litNow()).toEqual([]);
    // Tab to it (keyboard focus), and Enter keeps it lit after the focus leaves.
    await page.locator(`lw-frame path.cord[data-cord="${b.cord}"][data-target="${b.target}"]`).focus();
    expect(await litNow()).toEqual([`${b.cord}→${b.target}`]);
    await page.keyboard.press('Enter');
    await page.locator('lw-frame button[data-do="clock"]').focus();
    expect(await litNow()).toEqual([`${b.cord}→${b.target}`]);
    // A tap elsewhere in the drawing lets it go.
    await page.locator('lw-frame .sheet svg rect.page').dispatchEvent('click');
    expect(await litNow()).toEqual([]);
    // A branch cut as its rise alone, to a lever other cords are tied to as well: it rises on a line of its
    // own beside theirs, so pointing at it lights it and no other.
    const tiedTo = (t: string): number => ref.placement.routing.branches.filter((x) => x.target === t).length;
    const riser = ref.placement.routing.branches.find(
      (x) => x.kind === 'port' && x.own.length === 1 && x.own[0].kind === 'rise' && tiedTo(x.target) > 1,
    );
    if (!riser) throw new Error('the example has a lever with two cords, one only rising from a knot');
    await pointAt(riser.cord, riser.target);
    expect(await litNow()).toEqual([`${riser.cord}→${riser.target}`]);
    await page.mouse.move(1, 1);
    expect(await litNow()).toEqual([]);
  });

  it('shows the levers the trial run holds down, clock by clock, as the simulator has them', async () => {
    const runner = createRunner(ref.build, timingOf(ref.profile));
    const act = (as: readonly HandAction[]): void => as.forEach((a) => runner.act(a));
    act(resetActions()); // the trial run starts from reset
    await tab('Trial run');
    await frameTab();
    expect(await downOnPage()).toEqual(downInNode(ref, runner));
    const seen = new Set<string>([JSON.stringify(await downOnPage())]);
    // Stepped in the trial run, seen on the frame: the marble lever, then three whole clocks.
    await tab('Trial run');
    await page.locator('lw-stepper button[data-input="marble"]').click();
    act([{ kind: 'input', input: 'marble', value: 1 }]);
    for (let clock = 1; clock <= 3; clock++) {
      await tab('Trial run');
      await page.locator('lw-stepper button[data-do="clock"]').click();
      act(phaseActions());
      await frameTab();
      await expect(page.locator('lw-frame [data-read="clocks"]').innerText()).resolves.toBe(String(clock));
      const down = await downOnPage();
      expect(down, `clock ${clock}`).toEqual(downInNode(ref, runner));
      seen.add(JSON.stringify(down));
    }
    // Stepped on the frame itself: φ1 pulled hangs below the rail, and so on.
    await page.locator('lw-frame button[data-do="phi1"]').click();
    act([{ kind: 'pull', lever: 'phi1' }]);
    expect(await downOnPage()).toEqual(downInNode(ref, runner));
    const phi1 = ref.build.netlist.parts.find((p) => p.kind === 'lever' && p.role === 'phi1');
    expect(await downOnPage()).toContain(`${phi1?.id} lever`);
    await page.locator('lw-frame button[data-do="phi1"]').click();
    act([{ kind: 'release', lever: 'phi1' }]);
    await page.locator('lw-frame button[data-do="clock"]').click();
    act(phaseActions());
    expect(await downOnPage()).toEqual(downInNode(ref, runner));
    // The trial run's keys work on the frame: C, a whole clock.
    const before = await page.locator('lw-frame [data-read="clocks"]').innerText();
    await page.keyboard.press('c');
    act(phaseActions());
    await expect(page.locator('lw-frame [data-read="clocks"]').innerText()).resolves.toBe(String(Number(before) + 1));
    expect(await downOnPage()).toEqual(downInNode(ref, runner));
    // The trial run leads here.
    await tab('Trial run');
    await page.locator('button[data-do="see-frame"]').click();
    await expect(page.getByRole('tab', { name: 'Frame & cords' }).getAttribute('aria-selected')).resolves.toBe('true');
    expect(await downOnPage()).toEqual(downInNode(ref, runner));
    // Which levers are down changed from clock to clock.
    expect(seen.size).toBeGreaterThan(2);
    // One meaning of "down" with the trial run: its legend's glyphs stand beside the frame's.
    await expect(page.locator('lw-frame .legend').innerText()).resolves.toContain('held down');
  });

  it('prints frame.svg at its scale, on the sheet its title names', async () => {
    await page.locator('lw-frame button[data-do="print-frame"]').click();
    const frame = page.locator('iframe#lw-print');
    await expect.poll(() => frame.getAttribute('data-printed')).toBe('1');
    const printed = await frame.evaluate((f: HTMLIFrameElement) => {
      const d = f.contentDocument;
      const svg = d?.querySelector('svg');
      return {
        width: svg?.getAttribute('width') ?? '',
        shownPx: svg?.getBoundingClientRect().width ?? 0,
        text: [...(svg?.querySelectorAll('text') ?? [])].map((t) => t.textContent).join(' '),
        style: d?.querySelector('style')?.textContent ?? '',
        cords: svg?.querySelectorAll('path.cord[data-cord]').length ?? 0,
      };
    });
    const paper = frameSvg(ref.build, ref.placement, ref.profile);
    const width = /<svg [^>]*width="(\d+)mm"/.exec(paper)?.[1];
    expect(printed.width).toBe(`${width}mm`);
    // At 100 %: CSS Values 3, 96 px = 25.4 mm.
    expect(printed.shownPx).toBeCloseTo((Number(width) * 96) / 25.4, 0);
    const f = ref.profile.frame;
    const top = ref.placement.drums[ref.placement.drums.length - 1].levelM;
    const scale = frameScale(
      Math.max(...ref.placement.drums.map((d) => d.lengthM)),
      top + f.railAboveDrumM + 0.05 + f.channelBelowDrumM,
    );
    expect(printed.text).toContain(`Scale 1:${scale} when printed at 100 %`);
    expect(printed.style).toMatch(/@page \{ size: \d+mm \d+mm; margin: 0; \}/);
    expect(printed.cords).toBe(ref.placement.routing.branches.length);
    // The paper drawing, not the screen one.
    expect(printed.style).not.toContain('--lw-');
    // Ctrl+P on the frame prints the same drawing, not the page around it.
    await frame.evaluate((f) => f.setAttribute('data-seen', ''));
    // The focus came back from the print frame to the button.
    await expect(
      page.locator('lw-frame button[data-do="print-frame"]').evaluate((b) => b.matches(':focus')),
    ).resolves.toBe(true);
    await page.keyboard.press('Control+P');
    const again = page.locator('iframe#lw-print:not([data-seen])');
    await expect.poll(() => again.getAttribute('data-printed')).toBe('1');
    await expect(again.evaluate((f: HTMLIFrameElement) => f.contentDocument?.title ?? '')).resolves.toBe(
      'Frame — marble_bell',
    );
  });

  it('follows the dark theme on screen', async () => {
    await page.emulateMedia({ colorScheme: 'dark' });
    const fills = await page.locator('lw-frame .sheet svg').evaluate((svg) => ({
      page: getComputedStyle(svg.querySelector('rect.page') as Element).fill,
      panel: getComputedStyle(document.documentElement).getPropertyValue('--lw-panel').trim(),
    }));
    expect(fills.panel).toBe('#24211d');
    expect(fills.page).toBe('rgb(36, 33, 29)');
    await page
      .locator('lw-frame .sheet g.drum-1')
      .evaluate((g) => g.scrollIntoView({ block: 'center', inline: 'start' }));
    await shot(page, 'frame-dark');
    await page.emulateMedia({ colorScheme: 'light' });
  });

  it('draws a machine on two drums with every bay, and lights a cord that goes from one drum to the other', async () => {
    const file = 'crossing.lw';
    const a = analyse(readFileSync(fileURLToPath(new URL(`../../examples/${file}`, import.meta.url)), 'utf8'), file);
    if (!a.ok) throw new Error('the example must read');
    const b = buildMachine(a);
    if (!b.ok) throw new Error('the example must build');
    expect(b.placement.drums.length).toBe(2);
    await page.locator('lw-bench select[aria-label="Load an example machine"]').selectOption({
      label: 'Level crossing with a call button',
    });
    await built(page);
    await frameTab();
    const ends = await page
      .locator('lw-frame rect.lever[data-part]')
      .evaluateAll((rs) =>
        rs.map((r) => ['data-part', 'data-lever', 'data-drum', 'data-bay'].map((x) => r.getAttribute(x)).join(' ')),
      );
    const placed = b.placement.bays.flatMap((bay) =>
      bay.levers.filter((l) => l.name !== 'exit').map((l) => `${bay.part} ${l.name} ${bay.drum} ${bay.bay}`),
    );
    expect(ends.sort()).toEqual(placed.sort());
    const drumOf = new Map(b.placement.bays.map((x) => [x.part, x.drum]));
    const across = b.placement.routing.branches.find(
      (x) => x.kind === 'port' && drumOf.get(x.driver) !== drumOf.get(x.part),
    );
    if (!across) throw new Error('a cord crosses between the drums');
    await page.locator(`lw-frame path.cord[data-cord="${across.cord}"][data-target="${across.target}"]`).focus();
    const lit = await page
      .locator('lw-frame .end[data-part]')
      .evaluateAll((es) => es.map((e) => e.getAttribute('data-part') ?? ''));
    expect(new Set(lit)).toEqual(new Set([across.driver, across.part]));
    await expect(page.locator('lw-frame path.route.lit').getAttribute('data-route-cord')).resolves.toBe(across.cord);
    expect(await downOnPage()).toEqual(
      downInNode(
        b,
        (() => {
          const r = createRunner(b.build, timingOf(b.profile));
          resetActions().forEach((x) => r.act(x));
          return r;
        })(),
      ),
    );
  });

  it('keeps the drawing in its own box on a phone: nothing overflows, the box pans', async () => {
    const phone = await openPage(await designer.context(PHONE), designer.url);
    await built(phone);
    await phone.getByRole('tab', { name: 'Frame & cords' }).click();
    await phone.locator('lw-frame .sheet svg').waitFor();
    expect(await overflowing(phone)).toEqual([]);
    const box = await phone
      .locator('lw-frame .sheet')
      .evaluate((el) => [el.scrollWidth, el.clientWidth, getComputedStyle(el).overflowX]);
    expect(box[2]).toBe('auto');
    expect(Number(box[0])).toBeGreaterThan(Number(box[1]));
    await expect(phone.locator('lw-frame [data-frame-summary]').innerText()).resolves.toContain('Tap a cord');
    // Opened at the smallest readable size, and Fit width goes no smaller.
    const smallest = async (): Promise<number> =>
      Number(await phone.locator('lw-frame').getAttribute('data-smallest-text-px'));
    expect(await smallest()).toBeCloseTo(MIN_TEXT_PX, 1);
    await phone.locator('lw-frame').getByRole('button', { name: 'Fit width' }).click();
    expect(await smallest()).toBeGreaterThanOrEqual(MIN_TEXT_PX - 0.01);
    expect(await overflowing(phone)).toEqual([]);
    await phone.context().close();
  });
});
