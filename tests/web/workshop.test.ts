/**
 * The workshop's own profile in the page, end to end in a real browser (headless Chromium from
 * the npm package @sparticuz/chromium, ./chromium.ts) against the production build (./page.ts).
 * The guide's slippery cord (examples/profiles/slippery-cord.json, μ = 0.12, docs/guide.md §6)
 * is opened in the Shop view: the friction headroom of the drive check follows it, the
 * verdict is the command line's for `--profile` of the same file (run in-process), the status
 * says own settings and the code book's command names the profile. A bad value shows its code
 * and hint while the build keeps the last good profile; a reload keeps the profile; one click
 * goes back to the shipped defaults. A figure of the folded part of the form (the stage time)
 * gives the timing check the command line gives for a profile file naming the same figure. The
 * choice of inches on the workshop's papers reaches the frame view (its drawing, its summary, a
 * lit cord's piece), the Parts & forces view (check summaries, lever pull, bill of materials,
 * torque chart), the cut list the page downloads, and the profile it saves.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { loadProfile, parseFeetInches } from '../../src/core/index.js';
import { removeTempDirs, run, tempDir } from '../cli/support.js';
import { built, downloaded, openPage, shot, startDesigner, type Designer } from './page.js';

const PROFILE = 'examples/profiles/slippery-cord.json';

let designer: Designer;
let context: BrowserContext;
let page: Page;

const tab = (name: string): Promise<void> => page.getByRole('tab', { name }).click();
const status = (): ReturnType<Page['locator']> => page.locator('lw-app .status');
const headroom = async (): Promise<string> => {
  await tab('Parts & forces');
  return page.locator('lw-parts [data-headroom]').innerText();
};
/** Wait until the latest build is checked and the status does (or does not) say own settings. */
async function builtWith(own: boolean): Promise<void> {
  await built(page);
  await page
    .locator(
      own ? 'lw-app .status[data-work="done"]' : 'lw-app .status[data-work="done"]:not(:has-text("own settings"))',
    )
    .filter(own ? { hasText: 'own settings' } : {})
    .waitFor({ timeout: 60_000 });
}

beforeAll(async () => {
  designer = await startDesigner();
  context = await designer.context();
  page = await openPage(context, designer.url);
});

afterAll(async () => {
  await designer.close();
});

describe('src/web/elements/workshop (end to end in chromium)', () => {
  it('builds with an opened profile, says so, and goes back to the defaults in one click', async () => {
    await page
      .locator('lw-bench select[aria-label="Load an example machine"]')
      .selectOption({ label: 'Marble bell (every third marble)' });
    await builtWith(false);
    expect(await headroom()).toContain('(μ = 0.25 now)');
    const file = await page.locator('lw-bench label.file input').inputValue();

    await tab('Shop');
    await page.locator('lw-workshop input[type=file]').setInputFiles(PROFILE);
    await builtWith(true);
    expect(await headroom()).toContain('(μ = 0.12 now)');
    // The verdict is the command line's for the same machine and profile.
    const cli = await run(['build', 'examples/marble-bell.lw', '--profile', PROFILE]);
    expect(await status().innerText()).toContain(cli.code === 0 ? 'every check passes' : 'failing');
    await tab('Code book');
    expect(await page.locator('lw-codes [data-cli]').innerText()).toBe(
      `latchwright build ${file} --profile slippery-cord.json`,
    );

    // Saved: only what differs from the defaults, which the core reads back to μ = 0.12.
    await tab('Shop');
    const saved = await downloaded(page, () => page.getByRole('button', { name: 'Save the profile' }).click());
    expect(saved.name).toBe('slippery-cord.json');
    const back = loadProfile(JSON.parse(readFileSync(saved.path, 'utf8')), saved.name);
    expect(back.profile?.mu).toBe(0.12);

    // A percentage typed for μ: the loader's code and hint, and the build keeps μ = 0.12.
    const mu = page.getByRole('textbox', { name: /Friction of cord on the turning drum/ });
    await mu.fill('25');
    await mu.press('Enter');
    await mu.blur();
    const problem = page.locator('lw-workshop fieldset[data-field="mu"] .problem');
    await problem.waitFor();
    expect(await problem.innerText()).toMatch(/LW600.*did you mean 0\.25 \(a percentage given as a fraction\)\?/s);
    expect(await mu.getAttribute('aria-invalid')).toBe('true');
    await shot(page, 'workshop');
    await builtWith(true);
    expect(await headroom()).toContain('(μ = 0.12 now)');

    // A reload keeps the profile in use.
    await page.reload();
    await builtWith(true);
    expect(await headroom()).toContain('(μ = 0.12 now)');
    await tab('Shop');
    expect(await page.locator('lw-workshop [data-profile-name]').innerText()).toBe('slippery-cord.json');

    // Back to the shipped defaults: one click.
    await page.getByRole('button', { name: 'Back to the shipped defaults' }).click();
    await builtWith(false);
    expect(await headroom()).toContain('(μ = 0.25 now)');
    expect(await status().innerText()).not.toContain('own settings');
  });

  it('writes the papers and the views in inches when the Shop view says so: Parts & forces, Frame & cords and the cut list follow, and the saved profile names it', async () => {
    await tab('Shop');
    await page.getByRole('radio', { name: /^Inches/ }).check();
    await builtWith(true);
    // The frame view: the key's positions and the drum lengths in inches (the drawing is the core's frameSvg).
    await tab('Frame & cords');
    await page.locator('lw-frame .sheet svg').waitFor();
    const frame = await page.locator('lw-frame .sheet svg').innerHTML();
    expect(frame).toContain('centre in inches from the visitor end');
    expect(frame).toMatch(/drum 1: (\d+ ft )?\d+( \d+\/\d+)? in, \d+ bays|drum 1: \d+ ft, \d+ bays/);
    expect(frame).not.toContain('centre in metres');
    // The cut list from the page is the inch list: its header names the unit, and every cord piece
    // is a whole number of sixteenths at least as long as the command line's metric piece.
    await tab('Parts & forces');
    await page.locator('lw-parts summary', { hasText: 'One document at a time' }).click();
    const cut = await downloaded(page, () => page.locator('lw-parts button[data-doc="cut-list.csv"]').click());
    const inch = readFileSync(cut.path, 'utf8').split('\r\n');
    expect(inch[0]).toBe('group,item,piece,count,length (in),length (ft in),size,where,note');
    const dir = tempDir('lw-units-');
    const cli = await run(['build', 'examples/marble-bell.lw', '--out', join(dir, 'docs')]);
    expect(cli.code).toBe(0);
    const metric = readFileSync(join(dir, 'docs', 'cut-list.csv'), 'utf8').split('\r\n');
    const trunk = (lines: string[]): string[] | undefined =>
      lines.find((l) => l.startsWith('cord,c.in.marble,trunk,'))?.split(',');
    const m = Number(trunk(metric)?.[4]);
    const i = Number(trunk(inch)?.[4]);
    expect(Number.isInteger(i * 16)).toBe(true);
    // 1 in = 0.0254 m exactly (NIST SP 811 B.8).
    expect(i * 0.0254).toBeGreaterThanOrEqual(m - 1e-9);
    expect(i * 0.0254).toBeLessThan(m + 0.0254 / 16);
    // Parts & forces: the check summaries, the lever pull, the bill of materials and the torque chart in
    // ounces and pound-force inches, read back to the command line's SI figures (1 oz = 28.349523125 g,
    // 1 lbf·in = 4.4482216152605 N × 0.0254 m: NIST SP 811 B.8).
    const si = JSON.parse((await run(['build', 'examples/marble-bell.lw', '--json'])).out) as {
      checks: { name: string; worstTorqueNm?: number; operatorForceMaxG?: number }[];
    };
    const drive = si.checks.find((c) => c.name === 'drive');
    const driveWords = await page.locator('lw-parts [data-check="drive"] .summary').innerText();
    const lbfIn = Number(/worst drum torque ([\d.]+) lbf·in/.exec(driveWords)?.[1]);
    expect(Math.abs(lbfIn * 4.4482216152605 * 0.0254 - (drive?.worstTorqueNm ?? NaN))).toBeLessThan(0.006 * 0.113);
    const pullOz = Number(/hardest lever pull ([\d.]+) oz/.exec(driveWords)?.[1]);
    expect(Math.abs(pullOz * 28.349523125 - (drive?.operatorForceMaxG ?? NaN))).toBeLessThanOrEqual(0.05 * 28.35);
    const parts = await page.locator('lw-parts').innerText();
    expect(parts).not.toMatch(/N·m|\d g\b|\d m\b|\d mm\b/);
    expect(await page.locator('lw-parts [data-lever-pull]').innerText()).toMatch(
      /Hardest lever pull: [\d.]+ oz at the weight/,
    );
    expect(await page.locator('lw-parts table[aria-label="Bill of materials"]').innerText()).toMatch(/\d oz\b/);
    expect(
      await page.locator('lw-parts lw-bar-chart[caption="Drum torque per state"] svg').getAttribute('aria-label'),
    ).toMatch(/at [\d.]+ lbf·in/);
    // Frame & cords: the summary and a lit cord's piece in feet and inches, the piece at least the
    // metric one (the command line's wiring list, to the millimetre) and within a sixteenth of it.
    await tab('Frame & cords');
    const summary = await page.locator('lw-frame [data-frame-summary]').innerText();
    expect(summary).toMatch(/on one drum \((\d+ ft )?[\d /]*in\); \d+ ft [\d /]*in of cord/);
    expect(summary).not.toMatch(/\d m\b/);
    const wiring = readFileSync(join(dir, 'docs', 'wiring.csv'), 'utf8').split('\r\n');
    const head = wiring[0].split(',');
    const cord = page.locator('lw-frame path.cord').first();
    const [cordId, target] = [await cord.getAttribute('data-cord'), await cord.getAttribute('data-target')];
    const col = (name: string): number => head.indexOf(name);
    await cord.focus();
    const readout = await page.locator('lw-frame [data-readout]').innerText();
    const piece = /; ((?:\d+ ft ?)?(?:\d+ )?(?:\d+\/\d+ )?in) to\s+cut/.exec(readout)?.[1] ?? '';
    const sixteenths = parseFeetInches(piece);
    expect(sixteenths, readout).toBeDefined();
    // A branch's key is its cord and its target part and port (or the actuator): the wiring list's columns.
    const row = wiring
      .map((l) => l.split(','))
      .find(
        (r) =>
          r[col('cord')] === cordId &&
          [r[col('target')], `${r[col('target')]}.${r[col('port')]}`].includes(target ?? ''),
      );
    const metres = Number(row?.[col('length (m)')]);
    expect(((sixteenths ?? 0) / 16) * 0.0254).toBeGreaterThanOrEqual(metres - 0.0005);
    expect(((sixteenths ?? 0) / 16) * 0.0254).toBeLessThan(metres + 0.0005 + 0.0254 / 16);
    // Saved, the profile names the choice; the command line reads it back.
    await tab('Shop');
    const saved = await downloaded(page, () => page.getByRole('button', { name: 'Save the profile' }).click());
    const value = JSON.parse(readFileSync(saved.path, 'utf8')) as Record<string, unknown>;
    expect(value.documentUnits).toBe('inch');
    expect(loadProfile(value, saved.name).profile?.documentUnits).toBe('inch');
    await page.getByRole('radio', { name: /^Metric/ }).check();
    await builtWith(false);
    // Back in metric, the parts view writes newton-metres and grams again.
    await tab('Parts & forces');
    expect(await page.locator('lw-parts [data-check="drive"] .summary').innerText()).toMatch(/[\d.]+ N·m/);
    removeTempDirs();
  });

  it('takes every other figure of the profile too: a stage time typed there times the clock as --profile does', async () => {
    await tab('Shop');
    await page.locator('lw-workshop details.more summary').click();
    const stage = page.getByRole('textbox', { name: /^Time for one gate stage/ });
    await stage.fill('0.5');
    await stage.press('Enter');
    await stage.blur();
    await builtWith(true);
    await tab('Parts & forces');
    const timing = await page.locator('lw-parts li[data-check="timing"] .summary').innerText();
    // The command line with a profile file that names the same figure.
    const file = join(tempDir('lw-stage-'), 'stage.json');
    writeFileSync(file, JSON.stringify({ stageDelayS: 0.5 }));
    const cli = await run(['build', 'examples/marble-bell.lw', '--profile', file, '--json']);
    const report = JSON.parse(cli.out) as { checks: { name: string; summary: string }[] };
    expect(timing).toBe(report.checks.find((c) => c.name === 'timing')?.summary);
    expect(timing).toMatch(/^φ1 1\.5 s, φ2 2 s/);
    // Saved, it names that figure and nothing else of the defaults.
    await tab('Shop');
    const saved = await downloaded(page, () => page.getByRole('button', { name: 'Save the profile' }).click());
    const value = JSON.parse(readFileSync(saved.path, 'utf8')) as Record<string, unknown>;
    expect(value.stageDelayS).toBe(0.5);
    expect(Object.keys(value).filter((k) => !['$schema', 'description', 'sources'].includes(k))).toEqual([
      'stageDelayS',
    ]);
    expect(loadProfile(value, saved.name).profile?.stageDelayS).toBe(0.5);
    await page.getByRole('button', { name: 'Back to the shipped defaults' }).click();
    await builtWith(false);
    removeTempDirs();
  });
});
