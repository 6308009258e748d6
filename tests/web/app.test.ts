/**
 * The designer end to end in a real browser (headless Chromium from the npm package
 * @sparticuz/chromium, started by ./chromium.ts and driven by playwright-core) against the
 * production build served on 127.0.0.1 by the test itself (./page.ts).
 * Expected values come from the tool itself run in Node on the same text — the CLI's own
 * wording of a diagnostic (formatDiagnostic), `latchwright build` run in-process for the
 * netlist, the abstract machine (runAbstract) for the state after each clock, the part-level
 * runner for the latches a broken rule upsets — so the page is checked against the tool, not
 * against itself. Screenshots go to docs/screenshots/ only with LW_SCREENSHOTS=1.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { BrowserContext, Page } from 'playwright-core';
import { strFromU8, unzipSync } from 'fflate';
import { analyse, buildMachine } from '../../src/core/pipeline.js';
import { formatDiagnostic } from '../../src/core/model/diagnostics.js';
import { readMachine } from '../../src/core/forms/detect.js';
import { printTextMachine } from '../../src/core/forms/text.js';
import { runAbstract } from '../../src/core/sim/abstract.js';
import { createRunner } from '../../src/core/sim/runner.js';
import { isAlarm, timingOf } from '../../src/core/sim/part.js';
import { RULE_WORDS } from '../../src/core/sim/hand.js';
import { DOCUMENT_REGISTRY } from '../../src/core/export/documents.js';
import { machineHash } from '../../src/web/controllers/link.js';
import { run, tempDir, removeTempDirs } from '../cli/support.js';
import { built, caret, downloaded, openPage, settled, shot, startDesigner, type Designer } from './page.js';

const example = (f: string): string =>
  readFileSync(fileURLToPath(new URL(`../../examples/${f}`, import.meta.url)), 'utf8');
const EXAMPLE = example('marble-bell.lw');
const FILE = 'marble-bell.lw';

/** A three-button cabinet lock typed from scratch (an invented exhibit): A, then C, then B opens the drawer. */
const CABINET = `# Cabinet lock: press A, then C, then B, and the drawer opens.
machine cabinet_lock
inputs a, b, c
outputs drawer
start shut
never a & b
never a & c
never b & c

state shut
  when a go got_a

state got_a
  when c go got_ac
  when b go shut

state got_ac
  when b go open
  when a go shut

state open with drawer=1
  when a | b | c go shut
`;

let designer: Designer;
let context: BrowserContext;
let page: Page;

const editor = (): ReturnType<Page['locator']> => page.locator('lw-editor textarea');
const tab = (name: string): Promise<void> => page.getByRole('tab', { name }).click();
const read = (what: string): Promise<string> => page.locator(`lw-stepper [data-read="${what}"]`).innerText();
const status = (): ReturnType<Page['locator']> => page.locator('lw-app .status');
const loadExample = (label: string): Promise<string[]> =>
  page.locator('lw-bench select[aria-label="Load an example machine"]').selectOption({ label });

/** Put the caret at the end of a 1-based line of the editor. */
async function caretAtEndOf(line: number): Promise<void> {
  await editor().evaluate((t: HTMLTextAreaElement, l: number) => {
    const lines = t.value.split('\n');
    const at = lines.slice(0, l).join('\n').length;
    t.focus();
    t.setSelectionRange(at, at);
  }, line);
}

/** Replace the whole text on the bench, as a paste does. */
async function replaceText(text: string): Promise<void> {
  await editor().focus();
  await page.keyboard.press('Control+A');
  await page.keyboard.insertText(text);
}

/** The netlist `latchwright build FILE --out DIR` writes, run in-process. */
async function cliNetlist(path: string): Promise<{ code: number; netlist: string }> {
  const dir = tempDir('lw-web-cli-');
  const r = await run(['build', path, '--out', dir]);
  return { code: r.code, netlist: readFileSync(join(dir, 'netlist.json'), 'utf8') };
}

async function browserNetlist(): Promise<string> {
  await tab('Parts & forces');
  await page.locator('lw-parts details').evaluate((d: HTMLDetailsElement) => (d.open = true));
  const f = await downloaded(page, () => page.locator('lw-parts button[data-doc="netlist.json"]').click());
  return readFileSync(f.path, 'utf8');
}

beforeAll(async () => {
  designer = await startDesigner();
});

afterAll(async () => {
  await designer.close();
  removeTempDirs();
});

describe('src/web (end to end in chromium)', () => {
  beforeAll(async () => {
    context = await designer.context();
    page = await openPage(context, designer.url);
  });

  it('loads with the first example, built with the command line’s defaults', async () => {
    await built(page);
    expect(await editor().inputValue()).toBe(EXAMPLE);
    await expect(page.locator('lw-diagram g.node').count()).resolves.toBe(4);
    await expect(status().innerText()).resolves.toBe('Built · every check passes');
    await shot(page, 'sketch');
    await tab('Code book');
    await expect(page.locator('lw-codes select[aria-label="Encoding used for the build"]').inputValue()).resolves.toBe(
      'auto',
    );
    await expect(page.locator('lw-codes [data-cli]').innerText()).resolves.toBe(`latchwright build ${FILE}`);
    await tab('Sketch');
  });

  it('jumps from a state in the sketch to its line; Enter on a state or a transition moves the caret and changes nothing', async () => {
    await page.locator('lw-diagram g.node[data-state="two"]').click();
    expect((await caret(page)).line).toBe(EXAMPLE.split('\n').indexOf('state two') + 1);
    await page.locator('lw-diagram g.node[data-state="rung"]').focus();
    await page.keyboard.press('Enter');
    expect(await caret(page)).toEqual({
      line: EXAMPLE.split('\n').indexOf('state rung with bell=1') + 1,
      selected: '',
    });
    expect(await editor().inputValue()).toBe(EXAMPLE);
    await page.locator('lw-diagram g.label[aria-label^="Transition from rung to none"]').focus();
    await page.keyboard.press('Enter');
    expect((await caret(page)).line).toBe(EXAMPLE.split('\n').indexOf('  go none') + 1);
    expect(await editor().inputValue()).toBe(EXAMPLE);
    // A key typed next goes in at the caret: nothing was selected to be typed over.
    await page.keyboard.press('End');
    expect(await editor().inputValue()).toBe(EXAMPLE);
  });

  it('marks a typed error at its line with the command line wording, and clears it when fixed', async () => {
    await caretAtEndOf(22); // "  when marble go two"
    await page.keyboard.press('Backspace');
    await page.keyboard.press('Backspace');
    await page.keyboard.type('ow');
    const broken = EXAMPLE.replace('when marble go two', 'when marble go tow');
    expect(await editor().inputValue()).toBe(broken);
    const expected = analyse(broken, FILE)
      .diagnostics.filter((d) => d.severity === 'error')
      .map(formatDiagnostic);
    expect(expected).toHaveLength(1);
    const entry = page.locator('lw-problems li.error');
    await entry.waitFor();
    expect(await entry.locator('.line').innerText()).toBe(expected[0]);
    await expect(page.locator('lw-editor .numbers div.error').innerText()).resolves.toBe('22');
    await expect(page.locator('lw-editor mark.error').innerText()).resolves.toBe('tow');
    await shot(page, 'bench-error');
    // The entry jumps to the line: the caret lands on the word it names.
    await entry.locator('button').click();
    expect((await caret(page)).selected).toBe('tow');
    await page.keyboard.type('two');
    expect(await editor().inputValue()).toBe(EXAMPLE);
    await built(page);
    await expect(page.locator('lw-problems li.error').count()).resolves.toBe(0);
  });

  it('keeps the ledger in step with the text and edits the text from it', async () => {
    await tab('Ledger');
    const guard = page.getByLabel('Guard of transition 1 to one');
    await expect(guard.first().inputValue()).resolves.toBe('marble');
    await shot(page, 'ledger');
    await guard.first().fill('marble | 0');
    await guard.first().press('Enter');
    await expect.poll(() => editor().inputValue()).toContain('state none\n  when marble | 0 go one');
    await guard.first().fill('marble');
    await guard.first().press('Enter');
    await expect.poll(() => editor().inputValue()).toBe(EXAMPLE);
    await built(page);
  });

  it('builds with codes picked from the comparison, and drops them with a notice for a machine they do not fit', async () => {
    await tab('Code book');
    await page.getByRole('button', { name: 'Price every encoding' }).click();
    const cheapest = page.locator('lw-codes tr.cheapest');
    await cheapest.first().waitFor({ timeout: 60_000 });
    await expect(
      page.locator('lw-codes table[aria-label="Encodings priced"] tbody tr').count(),
    ).resolves.toBeGreaterThanOrEqual(4);
    await shot(page, 'code-book');
    await cheapest.first().getByRole('button').click();
    await built(page);
    await expect(page.locator('lw-codes select[aria-label="Encoding used for the build"]').inputValue()).resolves.toBe(
      'kept',
    );
    await expect(status().innerText()).resolves.toContain('own settings');
    // The crossing has 5 states: the 4 codes kept for the bell cannot be its codes.
    await loadExample('Level crossing with a call button');
    await built(page);
    await expect(page.locator('lw-bench .notice').innerText()).resolves.toContain(
      'the codes you picked were for 4 states; back to the searched codes',
    );
    await expect(page.locator('lw-problems li.error').count()).resolves.toBe(0);
    await expect(status().innerText()).resolves.toBe('Built · every check passes');
    await expect(page.locator('lw-codes select[aria-label="Encoding used for the build"]').inputValue()).resolves.toBe(
      'auto',
    );
  });

  it('builds the level crossing exactly as `latchwright build` does, and offers the fix of a failing check', async () => {
    const cli = await cliNetlist('examples/crossing.lw');
    expect(cli.code).toBe(0);
    expect(await browserNetlist()).toBe(cli.netlist);
    // Unused codes left free let the crossing lock up: the recovery check fails and offers its fix.
    await tab('Code book');
    await page.locator('lw-codes select[aria-label="Where unused state codes go"]').selectOption('dont-care');
    await built(page);
    await expect(page.locator('lw-codes [data-cli]').innerText()).resolves.toBe(
      'latchwright build crossing.lw --unused dont-care',
    );
    await expect(status().getAttribute('data-tone')).resolves.toBe('bad');
    await tab('Parts & forces');
    const recovery = page.locator('lw-parts li[data-check="recovery"]');
    await expect(recovery.getAttribute('class')).resolves.toBe('bad');
    await expect(page.locator('lw-parts button[data-fix="defaults"]').count()).resolves.toBe(1);
    await recovery.locator('button[data-fix="unused-to-start"]').click();
    await built(page);
    await expect(page.locator('lw-parts li[data-check="recovery"]').getAttribute('class')).resolves.toBe('ok');
    await expect(status().innerText()).resolves.toBe('Built · every check passes · own settings');
    await tab('Code book');
    await expect(page.locator('lw-codes [data-cli]').innerText()).resolves.toBe(
      'latchwright build crossing.lw --unused road_open',
    );
    await page.locator('lw-codes select[aria-label="Where unused state codes go"]').selectOption('');
    await built(page);
    await page.getByRole('button', { name: 'Bring back the earlier machine' }).click();
    await built(page);
    expect(await editor().inputValue()).toBe(EXAMPLE);
  });

  it('shows parts and margins named by what each capstan does, never cut, and the schematic by role', async () => {
    await tab('Parts & forces');
    await page.locator('lw-parts li[data-check]').first().waitFor();
    await expect(page.locator('lw-parts li[data-check].bad').count()).resolves.toBe(0);
    const chart = page.locator('lw-parts lw-bar-chart').first();
    await expect(chart.locator('.marker').count()).resolves.toBe(1);
    const cut = await chart.evaluate((host) => {
      const svg = host.shadowRoot?.querySelector('svg');
      if (!svg) return ['no chart'];
      const box = svg.getBoundingClientRect();
      return [...svg.querySelectorAll('text')]
        .filter((t) => {
          const r = t.getBoundingClientRect();
          return r.left < box.left - 0.5 || r.right > box.right + 0.5 || t.textContent?.endsWith('…');
        })
        .map((t) => t.textContent ?? '');
    });
    expect(cut).toEqual([]);
    const names = await chart.evaluate((host) =>
      [...(host.shadowRoot?.querySelectorAll('text.name') ?? [])].map((t) => t.textContent),
    );
    expect(names.join(' ')).toMatch(/φ1 term: (sets|resets) M\d/);
    expect(names.join(' ')).not.toMatch(/t\.[SR]\d/);
    const sheet = page.locator('lw-parts .sheet svg');
    await sheet.waitFor();
    const words = await sheet.evaluate((s) => s.textContent ?? '');
    expect(words).toMatch(/resets M\d when/);
    expect(words).toContain('flag reads Z');
    await shot(page, 'parts-and-forces');
  });

  it('prints the build sheet with its drawings, and downloads every document in one archive', async () => {
    const zip = await downloaded(page, () => page.locator('lw-parts button[data-doc="all"]').click());
    expect(zip.name).toBe('marble_bell-documents.zip');
    const files = unzipSync(readFileSync(zip.path));
    expect(Object.keys(files)).toEqual(DOCUMENT_REGISTRY.map((d) => `marble_bell-${d.file}`));
    expect(strFromU8(files['marble_bell-build-sheet.html'])).toContain('marble_bell');
    // The bring-up sheet is one of them, with a button of its own.
    expect(strFromU8(files['marble_bell-bring-up.html'])).toContain('Bring-up in stages — marble_bell');
    expect(strFromU8(files['marble_bell-bring-up.md'])).toContain('## Stage 3:');
    await expect.poll(() => page.locator('lw-parts button[data-doc="bring-up.html"]').count()).toBe(1);
    await page.locator('lw-parts button[data-do="print"]').click();
    const frame = page.locator('iframe#lw-print');
    await expect.poll(() => frame.getAttribute('data-printed')).toBe('1');
    const printed = await frame.evaluate((f: HTMLIFrameElement) => ({
      // A drawing inline, or embedded as an image whose source is the SVG (the sheet's frame drawing and the rest).
      drawings: f.contentDocument?.querySelectorAll('svg, img[src^="data:image/svg+xml"]').length ?? 0,
      title: f.contentDocument?.title ?? '',
    }));
    expect(printed.drawings).toBeGreaterThanOrEqual(2);
    expect(printed.title).toContain('marble_bell');
  });

  it('steps five clocks by hand and reads the state and outputs the machine should have', async () => {
    await tab('Trial run');
    await page.locator('lw-stepper button[data-input="marble"]').click();
    for (let i = 0; i < 5; i++) await page.locator('lw-stepper button[data-do="clock"]').click();
    const a = analyse(EXAMPLE, FILE);
    if (!a.ok) throw new Error('the example must read');
    const f = a.minimised.machine;
    const runs = runAbstract(f, ['1', '1', '1', '1', '1', '1', '1']);
    expect(await read('clocks')).toBe('5');
    expect(await read('state')).toBe(runs[5].stateName);
    expect(await read('outputs')).toBe(f.outputs.map((o, k) => `${o}=${runs[5].outputs[k]}`).join(' '));
    // A clock done lever by lever counts as one: φ1 pulled and released, φ2 pulled and released.
    for (const k of ['1', '1', '2', '2']) await page.keyboard.press(k);
    expect(await read('clocks')).toBe('6');
    expect(await read('state')).toBe(runs[6].stateName);
    await shot(page, 'trial-run');
  });

  it('draws each lever where it stands, one meaning for all, with a legend', async () => {
    const lever = (name: string) => page.locator(`lw-stepper lw-lever-bank figure[data-lever="${name}"]`);
    await expect(lever('marble').getAttribute('data-stand')).resolves.toBe('down'); // pulled
    await expect(lever('φ1').getAttribute('data-stand')).resolves.toBe('up'); // released
    const latches = await page
      .locator('lw-stepper lw-lever-bank figure.latch')
      .evaluateAll((fs) =>
        fs.map((f) => [f.getAttribute('data-value'), f.getAttribute('data-set'), f.getAttribute('data-reset')]),
      );
    expect(latches.length).toBe(4);
    // Holding 1: set side down, reset side up; holding 0: the other way round.
    for (const [q, set, reset] of latches) expect([set, reset]).toEqual(q === '1' ? ['down', 'up'] : ['up', 'down']);
    await expect(page.locator('lw-stepper lw-lever-bank .legend').innerText()).resolves.toContain('set side down');
  });

  it('raises an alarm naming the clock, the hand action and the latch when φ1 and φ2 are pulled together', async () => {
    await page.keyboard.press('1');
    await page.keyboard.press('2');
    const alarms = page.locator('lw-stepper .alarms li');
    await alarms.first().waitFor();
    const words = await alarms.allInnerTexts();
    expect(words.some((w) => w.includes(`(${RULE_WORDS['clocks-apart']})`))).toBe(true);
    // The same hand actions on the same build, in Node, name the latches that see S̄ = R̄ = 0.
    const a = analyse(EXAMPLE, FILE);
    if (!a.ok) throw new Error('the example must read');
    const b = buildMachine(a, { checks: false });
    if (!b.ok) throw new Error('the example must build');
    const runner = createRunner(b.build, timingOf(b.profile));
    runner.reset();
    runner.act({ kind: 'input', input: 'marble', value: 1 });
    for (let i = 0; i < 6; i++) runner.clock({ marble: 1 });
    runner.act({ kind: 'pull', lever: 'phi1' });
    const events = runner.act({ kind: 'pull', lever: 'phi2' });
    const latches = events.filter((e) => e.kind === 'forbidden-input');
    expect(latches.length).toBeGreaterThan(0);
    // Every alarm the runner raised is on the page, in the same words, with its clock and hand action.
    for (const e of events.filter(isAlarm))
      expect(words).toContain(`Clock 7, pulling φ2 while φ1 is pulled: ${e.words}`);
    for (const e of latches)
      expect(words.some((w) => w.includes(e.latch ?? '?') && w.includes('forbidden input'))).toBe(true);
    await shot(page, 'trial-run-alarm');
    await page.keyboard.press('u');
    await page.keyboard.press('u');
    await expect(alarms.count()).resolves.toBe(0);
  });

  it('keeps the timing diagram in its own box: twenty more clocks scroll it, not the page', async () => {
    for (let i = 0; i < 20; i++) await page.keyboard.press('c');
    expect(await read('clocks')).toBe('26');
    const sizes = await page.evaluate(() => {
      const app = document.querySelector('lw-app')?.shadowRoot;
      const view = app?.querySelector('#view') as HTMLElement;
      const chart = app?.querySelector('lw-stepper')?.shadowRoot?.querySelector('lw-timing-chart')?.shadowRoot;
      const box = chart?.querySelector('.scroll') as HTMLElement;
      return {
        page: document.documentElement.scrollWidth,
        window: innerWidth,
        view: [view.scrollWidth, view.clientWidth],
        box: [box.scrollWidth, box.clientWidth, box.scrollLeft],
      };
    });
    expect(sizes.page).toBeLessThanOrEqual(sizes.window);
    expect(sizes.view[0]).toBeLessThanOrEqual(sizes.view[1]);
    expect(sizes.box[0]).toBeGreaterThan(sizes.box[1]);
    // Kept at its newest end.
    expect(sizes.box[2]).toBeGreaterThan(0);
  });

  it('flags input levers set to a combination the machine declares never', async () => {
    await loadExample('Sequence lock (green, red, blue)');
    await built(page);
    await page.locator('lw-stepper button[data-input="red"]').click();
    await expect(page.locator('lw-stepper p.never').count()).resolves.toBe(0);
    await page.locator('lw-stepper button[data-input="green"]').click();
    await expect(page.locator('lw-stepper p.never').getAttribute('data-never')).resolves.toBe('red & green');
    await expect(page.locator('lw-stepper .alarms li[data-kind="never"]').innerText()).resolves.toMatch(
      /^Clock 1, setting green=1: the inputs red=1 green=1 blue=0 are declared impossible \(never red & green, line \d+\)/,
    );
    await page.locator('lw-stepper button[data-input="green"]').click();
    await expect(page.locator('lw-stepper p.never').count()).resolves.toBe(0);
    await page.getByRole('button', { name: 'Bring back the earlier machine' }).click();
    await built(page);
  });

  it('turns the status amber with a count when there are warnings, and a click shows them', async () => {
    await caretAtEndOf(EXAMPLE.split('\n').length);
    await page.keyboard.type('state lost\n  go none\n');
    await built(page);
    await expect(status().getAttribute('data-tone')).resolves.toBe('warn');
    await expect(status().innerText()).resolves.toBe('Built · every check passes · 1 warning');
    await status().click();
    await expect(page.getByRole('tab', { name: 'Parts & forces' }).getAttribute('aria-selected')).resolves.toBe('true');
    const findings = page.locator('lw-parts #findings');
    await expect(findings.innerText()).resolves.toContain('LW303');
    await expect(findings.evaluate((el) => el === (el.getRootNode() as ShadowRoot).activeElement)).resolves.toBe(true);
    await replaceText(EXAMPLE);
    await built(page);
    await tab('Trial run');
  });

  it('finds the work still there after a reload, and asks nothing: nothing would be lost', async () => {
    await caretAtEndOf(30); // "  go none"
    await page.keyboard.type('  # kept across reloads');
    const edited = await editor().inputValue();
    const dialogs: string[] = [];
    const onDialog = (d: { type(): string; accept(): Promise<void> }): void => {
      dialogs.push(d.type());
      void d.accept();
    };
    page.on('dialog', onDialog);
    await page.reload();
    await built(page);
    page.off('dialog', onDialog);
    expect(dialogs).toEqual([]);
    expect(await editor().inputValue()).toBe(edited);
    await expect(page.getByRole('tab', { name: 'Trial run' }).getAttribute('aria-selected')).resolves.toBe('true');
  });

  it('carries the machine in a link that opens it elsewhere, drawn in the dark theme', async () => {
    // The page writes the link a moment after the text changes (the hash delay of
    // controllers/source.ts): wait for it to carry the text on the bench.
    const hash = machineHash(await editor().inputValue());
    await page.waitForURL((u) => u.hash === hash);
    const url = page.url();
    expect(url).toContain('#m=');
    const other = await designer.context({ viewport: { width: 1280, height: 800 }, colorScheme: 'dark' });
    const p2 = await openPage(other, url);
    await built(p2);
    expect(await p2.locator('lw-editor textarea').inputValue()).toBe(await editor().inputValue());
    await p2.getByRole('tab', { name: 'Sketch' }).click();
    await shot(p2, 'sketch-dark');
    await p2.getByRole('tab', { name: 'Parts & forces' }).click();
    const sheet = p2.locator('lw-parts .sheet svg');
    await sheet.waitFor();
    // The schematic follows the theme: its page is the dark panel, not white paper.
    const colours = await sheet.evaluate((s) => ({
      page: getComputedStyle(s.querySelector('.page') as Element).fill,
      panel: getComputedStyle(s.closest('.sheet') as Element).backgroundColor,
    }));
    expect(colours.page).toBe(colours.panel);
    expect(colours.page).not.toBe('rgb(255, 255, 255)');
    await p2.locator('lw-parts .sheet').scrollIntoViewIfNeeded();
    await shot(p2, 'schematic-dark');
    await other.close();
  });

  it('opens an xstate configuration as the text form, keeping the earlier machine to bring back', async () => {
    const before = await editor().inputValue();
    const config = {
      id: 'gate',
      initial: 'shut',
      states: {
        shut: { on: { push: 'open' } },
        open: { on: { push: 'shut', lock: 'locked' } },
        locked: { on: { key: 'shut' } },
      },
    };
    const json = JSON.stringify(config);
    await page
      .locator('lw-bench input[type=file]')
      .setInputFiles({ name: 'gate.json', mimeType: 'application/json', buffer: Buffer.from(json) });
    await expect(page.locator('lw-bench .notice').innerText()).resolves.toContain(
      'Read gate.json (an xstate configuration)',
    );
    await built(page);
    const opened = await editor().inputValue();
    const ref = readMachine(json, 'gate.json');
    if (!ref.machine) throw new Error('the configuration must read');
    expect(opened).toBe(printTextMachine(ref.machine));
    await expect(page.getByLabel(/^File name/).inputValue()).resolves.toBe('gate.lw');
    await page.getByRole('button', { name: 'Bring back the earlier machine' }).click();
    await built(page);
    expect(await editor().inputValue()).toBe(before);
  });

  it("places a JSON file's missing list at its object, and says a problem with no line concerns the whole machine", async () => {
    const before = await editor().inputValue();
    await replaceText('{"name": "x"}');
    await settled(page);
    const entries = page.locator('lw-problems li.error');
    await entries.first().waitFor();
    const lines = await entries.evaluateAll((ls) => ls.map((l) => l.getAttribute('data-line')));
    expect(lines.length).toBeGreaterThan(0);
    for (const line of lines) expect(line).toBe('1');
    // Every problem of reading has a place; a problem of the whole run (an option, a budget)
    // has none and is shown as such.
    const problems = page.locator('lw-problems');
    await problems.evaluate((el) => {
      (el as unknown as { diagnostics: unknown[] }).diagnostics = [
        { code: 'LW700', severity: 'error', message: 'seed -1 is not a whole number ≥ 0', location: {} },
      ];
    });
    await expect.poll(() => problems.locator('li.error').getAttribute('data-line')).toBe('machine');
    const rows = await problems
      .locator('li.error')
      .evaluateAll((ls) => ls.map((l) => [l.getAttribute('data-line'), l.querySelector('.sev')?.textContent ?? '']));
    expect(rows).toEqual([['machine', expect.stringContaining('whole machine')]]);
    await replaceText(before);
    await built(page);
  });

  it('stops a running encoding search when asked', async () => {
    await loadExample('Level crossing with a call button');
    await built(page);
    await tab('Code book');
    await page.getByRole('button', { name: 'Price every encoding' }).click();
    await page.getByRole('button', { name: 'Stop pricing' }).click();
    await expect(page.locator('lw-codes').getByText('Pricing stopped.').count()).resolves.toBe(1);
    await page.getByRole('button', { name: 'Bring back the earlier machine' }).click();
    await built(page);
    expect(await editor().inputValue()).toContain('# kept across reloads');
  });
});

describe('src/web (a machine from scratch, end to end in chromium)', () => {
  it('starts from New with the notation card, names the file after the machine, and builds what `latchwright build` builds of the saved file', async () => {
    const ctx = await designer.context();
    page = await openPage(ctx, designer.url);
    await page.getByRole('button', { name: 'New machine from a short template' }).click();
    await settled(page);
    const template = await editor().inputValue();
    expect(template).toMatch(/^# /);
    expect(template).toContain('machine new_machine');
    await expect.poll(() => page.getByLabel(/^File name/).inputValue()).toBe('new_machine.lw');
    // The notation card: Ctrl+/ from the text, every statement of the text form, Escape to close.
    await editor().focus();
    await page.keyboard.press('Control+Slash');
    const card = page.locator('lw-notation-card dialog');
    await expect(card.getAttribute('open')).resolves.toBe('');
    const rows = await card.locator('table[aria-label="Statements"] tbody tr td:first-child').allInnerTexts();
    for (const w of ['machine NAME', 'inputs A, B, …', 'never EXPR', 'when EXPR go STATE [with X=V, …]'])
      expect(rows).toContain(w);
    await shot(page, 'notation-card');
    await page.keyboard.press('Escape');
    await expect(card.getAttribute('open')).resolves.toBeNull();
    // Typed over: the file name follows the machine's name, errors and all.
    const typo = CABINET.replace('when c go got_ac', 'when c go got_ca');
    await replaceText(typo);
    await expect.poll(() => page.getByLabel(/^File name/).inputValue()).toBe('cabinet_lock.lw');
    const expected = analyse(typo, 'cabinet_lock.lw')
      .diagnostics.filter((d) => d.severity === 'error')
      .map(formatDiagnostic);
    await expect.poll(() => page.locator('lw-problems li.error .line').allInnerTexts()).toEqual(expected);
    expect(expected[0]).toMatch(/^cabinet_lock\.lw:\d+:\d+: error /);
    await replaceText(CABINET);
    await built(page);
    // Saved, then built by the command line: the same netlist as the designer's.
    const saved = await downloaded(page, () =>
      page
        .locator('lw-bench select[aria-label="Save the machine"]')
        .selectOption('text')
        .then(() => undefined),
    );
    expect(saved.name).toBe('cabinet_lock.lw');
    expect(readFileSync(saved.path, 'utf8')).toBe(CABINET);
    const cli = await cliNetlist(saved.path);
    expect(await browserNetlist()).toBe(cli.netlist);
    // A name typed for the file stays, whatever the machine is called.
    await page.getByLabel(/^File name/).fill('lock-v2');
    await page.getByLabel(/^File name/).press('Enter');
    await expect.poll(() => page.getByLabel(/^File name/).inputValue()).toBe('lock-v2.lw');
    await replaceText(CABINET.replace('machine cabinet_lock', 'machine drawer_lock'));
    await built(page);
    await expect(page.getByLabel(/^File name/).inputValue()).resolves.toBe('lock-v2.lw');
    await ctx.close();
  });
});
