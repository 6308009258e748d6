/**
 * The designer end to end in a real browser (headless Chromium from the npm package
 * @sparticuz/chromium, started by ./chromium.ts and driven by playwright-core) against the
 * production build served on 127.0.0.1 by the test itself.
 * Expected values come from the core run in Node on the same text — the CLI's own wording of
 * a diagnostic (formatDiagnostic), the abstract machine (runAbstract) for the state after
 * each clock, the part-level runner for the latches a broken rule upsets — so the page is
 * checked against the tool, not against itself. Screenshots of each view go to
 * docs/screenshots/.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { analyse, buildMachine } from '../../src/core/pipeline.js';
import { formatDiagnostic } from '../../src/core/model/diagnostics.js';
import { readMachine } from '../../src/core/forms/detect.js';
import { printTextMachine } from '../../src/core/forms/text.js';
import { runAbstract } from '../../src/core/sim/abstract.js';
import { createRunner } from '../../src/core/sim/runner.js';
import { isAlarm, timingOf } from '../../src/core/sim/part.js';
import { RULE_WORDS } from '../../src/core/sim/hand.js';
import { buildDesigner } from '../../src/web/browser.js';
import { serveStatic, type Served } from '../../src/web/serve.js';
import { machineHash } from '../../src/web/controllers/link.js';
import { launchChromium } from './chromium.js';

const SHOTS = fileURLToPath(new URL('../../docs/screenshots/', import.meta.url));
const EXAMPLE = readFileSync(fileURLToPath(new URL('../../examples/marble-bell.lw', import.meta.url)), 'utf8');
const FILE = 'marble-bell.lw';

let out: string;
let server: Served | undefined;
let browser: Browser | undefined;
let context: BrowserContext;
let page: Page;

const editor = (): ReturnType<Page['locator']> => page.locator('lw-editor textarea');
const tab = (name: string): Promise<void> => page.getByRole('tab', { name }).click();
const built = (): Promise<void> => page.locator('lw-app .status[data-work="done"]').waitFor({ timeout: 30_000 });
const read = (what: string): Promise<string> => page.locator(`lw-stepper [data-read="${what}"]`).innerText();
const shot = (name: string): Promise<Buffer> => page.screenshot({ path: join(SHOTS, `${name}.png`) });

/** Put the caret at the end of a 1-based line of the editor. */
async function caretAtEndOf(line: number): Promise<void> {
  await editor().evaluate((t: HTMLTextAreaElement, l: number) => {
    const lines = t.value.split('\n');
    const at = lines.slice(0, l).join('\n').length;
    t.focus();
    t.setSelectionRange(at, at);
  }, line);
}

describe('src/web (end to end in chromium)', () => {
  beforeAll(async () => {
    out = mkdtempSync(join(tmpdir(), 'latchwright-web-'));
    browser = await launchChromium();
    await buildDesigner(out);
    server = await serveStatic(out);
    context = await browser.newContext({
      viewport: { width: 1280, height: 800 },
      acceptDownloads: true,
      colorScheme: 'light',
    });
    page = await context.newPage();
    page.on('pageerror', (e) => {
      throw e;
    });
  });

  afterAll(async () => {
    await browser?.close();
    await server?.close();
    rmSync(out, { recursive: true, force: true });
  });

  it('loads with the first example on the bench, built and checked', async () => {
    await page.goto(server?.url ?? '');
    await built();
    expect(await editor().inputValue()).toBe(EXAMPLE);
    await expect(page.locator('lw-diagram g.node').count()).resolves.toBe(4);
    await shot('sketch');
  });

  it('jumps from a state in the sketch to its line in the text', async () => {
    await page.locator('lw-diagram g.node[data-state="two"]').click();
    const caret = await editor().evaluate(
      (t: HTMLTextAreaElement) => t.value.slice(0, t.selectionStart).split('\n').length,
    );
    expect(caret).toBe(EXAMPLE.split('\n').indexOf('state two') + 1);
  });

  it('marks a typed error at its line with the command line wording, and clears it when fixed', async () => {
    await caretAtEndOf(22); // "  when marble go two"
    await page.keyboard.press('Backspace');
    await page.keyboard.press('Backspace');
    await page.keyboard.type('ow');
    const broken = EXAMPLE.replace('when marble go two', 'when marble go tow');
    expect(await editor().inputValue()).toBe(broken);
    const a = analyse(broken, FILE);
    const expected = a.diagnostics.filter((d) => d.severity === 'error').map(formatDiagnostic);
    expect(expected).toHaveLength(1);
    const entry = page.locator('lw-problems li.error');
    await entry.waitFor();
    expect(await entry.locator('.line').innerText()).toBe(expected[0]);
    await expect(page.locator('lw-editor .numbers div.error').innerText()).resolves.toBe('22');
    await expect(page.locator('lw-editor mark.error').innerText()).resolves.toBe('tow');
    await shot('bench-error');
    // The entry jumps to the line: the caret lands on the word it names.
    await entry.locator('button').click();
    const selected = await editor().evaluate((t: HTMLTextAreaElement) =>
      t.value.slice(t.selectionStart, t.selectionEnd),
    );
    expect(selected).toBe('tow');
    await page.keyboard.type('two');
    expect(await editor().inputValue()).toBe(EXAMPLE);
    await built();
    await expect(page.locator('lw-problems li.error').count()).resolves.toBe(0);
  });

  it('keeps the ledger in step with the text and edits the text from it', async () => {
    await tab('Ledger');
    const guard = page.getByLabel('Guard of transition 1 to one');
    await expect(guard.first().inputValue()).resolves.toBe('marble');
    await shot('ledger');
    await guard.first().fill('marble | 0');
    await guard.first().press('Enter');
    await expect.poll(() => editor().inputValue()).toContain('state none\n  when marble | 0 go one');
    await guard.first().fill('marble');
    await guard.first().press('Enter');
    await expect.poll(() => editor().inputValue()).toBe(EXAMPLE);
    await built();
  });

  it('prices every encoding and builds with the one picked', async () => {
    await tab('Code book');
    await page.getByRole('button', { name: 'Price every encoding' }).click();
    const cheapest = page.locator('lw-codes tr.cheapest');
    await cheapest.first().waitFor({ timeout: 60_000 });
    await expect(
      page.locator('lw-codes table[aria-label="Encodings priced"] tbody tr').count(),
    ).resolves.toBeGreaterThanOrEqual(4);
    await shot('code-book');
    await cheapest.first().getByRole('button').click();
    await built();
    await expect(page.locator('lw-codes select[aria-label="Encoding used for the build"]').inputValue()).resolves.toBe(
      'auto',
    );
    // Back to counting order for the rest of the run.
    await page.locator('lw-codes select[aria-label="Encoding used for the build"]').selectOption('binary');
    await built();
  });

  it('shows parts, margins with the minimum marked, and exports a build document', async () => {
    await tab('Parts & forces');
    await page.locator('lw-parts li[data-check]').first().waitFor();
    await expect(page.locator('lw-parts li[data-check].bad').count()).resolves.toBe(0);
    await expect(page.locator('lw-parts lw-bar-chart .marker').count()).resolves.toBe(1);
    await page.locator('lw-parts .sheet img').waitFor();
    await shot('parts-and-forces');
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.locator('lw-parts button[data-doc="build-sheet.html"]').click(),
    ]);
    expect(download.suggestedFilename()).toBe('marble_bell-build-sheet.html');
    const sheet = readFileSync((await download.path()) ?? '', 'utf8');
    expect(sheet).toContain('marble_bell');
  });

  it('steps five clocks by hand and reads the state and outputs the machine should have', async () => {
    await tab('Trial run');
    await page.locator('lw-stepper button[data-input="marble"]').click();
    for (let i = 0; i < 5; i++) await page.locator('lw-stepper button[data-do="clock"]').click();
    const a = analyse(EXAMPLE, FILE);
    if (!a.ok) throw new Error('the example must read');
    const f = a.minimised.machine;
    const run = runAbstract(f, ['1', '1', '1', '1', '1', '1']);
    expect(await read('clocks')).toBe('5');
    expect(await read('state')).toBe(run[5].stateName);
    expect(await read('outputs')).toBe(f.outputs.map((o, k) => `${o}=${run[5].outputs[k]}`).join(' '));
    await shot('trial-run');
  });

  it('raises an alarm naming the latch when φ1 and φ2 are pulled together', async () => {
    await page.keyboard.press('1');
    await page.keyboard.press('2');
    const alarms = page.locator('lw-stepper .alarms li');
    await alarms.first().waitFor();
    const words = await alarms.allInnerTexts();
    expect(words.some((w) => w.includes(`(${RULE_WORDS['clocks-apart']})`))).toBe(true);
    // The same hand actions on the same build, in Node, name the latches that see S̄ = R̄ = 0.
    const a = analyse(EXAMPLE, FILE);
    if (!a.ok) throw new Error('the example must read');
    const b = buildMachine(a, { encoding: 'binary', checks: false });
    if (!b.ok) throw new Error('the example must build');
    const runner = createRunner(b.build, timingOf(b.profile));
    runner.reset();
    runner.act({ kind: 'input', input: 'marble', value: 1 });
    for (let i = 0; i < 5; i++) runner.clock({ marble: 1 });
    const events = [...runner.act({ kind: 'pull', lever: 'phi1' }), ...runner.act({ kind: 'pull', lever: 'phi2' })];
    const latches = events.filter((e) => e.kind === 'forbidden-input');
    expect(latches.length).toBeGreaterThan(0);
    // Every alarm the runner raised is on the page, in the same words, the latch named.
    for (const e of events.filter(isAlarm)) expect(words).toContain(`Step 9: ${e.words}`);
    for (const e of latches)
      expect(words.some((w) => w.includes(e.latch ?? '?') && w.includes('forbidden input'))).toBe(true);
    await shot('trial-run-alarm');
    await page.keyboard.press('u');
    await page.keyboard.press('u');
    await expect(alarms.count()).resolves.toBe(0);
  });

  it('finds the work still there after a reload, warning first about unsaved changes', async () => {
    await caretAtEndOf(30); // "  go none"
    await page.keyboard.type('  # kept across reloads');
    const edited = await editor().inputValue();
    const dialogs: string[] = [];
    page.once('dialog', (d) => {
      dialogs.push(d.type());
      void d.accept();
    });
    await page.reload();
    await built();
    expect(dialogs).toEqual(['beforeunload']);
    expect(await editor().inputValue()).toBe(edited);
    await expect(page.getByRole('tab', { name: 'Trial run' }).getAttribute('aria-selected')).resolves.toBe('true');
  });

  it('carries the machine in a link that opens it elsewhere', async () => {
    // The page writes the link a moment after the text changes (the hash delay of
    // controllers/source.ts): wait for it to carry the text on the bench.
    const hash = machineHash(await editor().inputValue());
    await page.waitForURL((u) => u.hash === hash);
    const url = page.url();
    expect(url).toContain('#m=');
    const other = await context.browser()?.newContext({ viewport: { width: 1280, height: 800 }, colorScheme: 'dark' });
    if (!other) throw new Error('no second context');
    const p2 = await other.newPage();
    await p2.goto(url);
    await p2.locator('lw-app .status[data-work="done"]').waitFor({ timeout: 30_000 });
    expect(await p2.locator('lw-editor textarea').inputValue()).toBe(await editor().inputValue());
    await p2.getByRole('tab', { name: 'Sketch' }).click();
    await p2.screenshot({ path: join(SHOTS, 'sketch-dark.png') });
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
    await built();
    const opened = await editor().inputValue();
    const ref = readMachine(json, 'gate.json');
    if (!ref.machine) throw new Error('the configuration must read');
    expect(opened).toBe(printTextMachine(ref.machine));
    await page.getByRole('button', { name: 'Bring back the earlier machine' }).click();
    await built();
    expect(await editor().inputValue()).toBe(before);
  });

  it('stops a running encoding search when asked', async () => {
    await page
      .locator('lw-bench select[aria-label="Load an example machine"]')
      .selectOption({ label: 'Level crossing with a call button' });
    await built();
    await tab('Code book');
    await page.getByRole('button', { name: 'Price every encoding' }).click();
    await page.getByRole('button', { name: 'Stop pricing' }).click();
    await expect(page.locator('lw-codes').getByText('Pricing stopped.').count()).resolves.toBe(1);
    await page.getByRole('button', { name: 'Bring back the earlier machine' }).click();
    await built();
    expect(await editor().inputValue()).toContain('# kept across reloads');
  });
});
