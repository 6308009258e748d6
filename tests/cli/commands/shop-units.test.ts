/**
 * `build --shop-units`: every figure a person reads follows the workshop's units, across every
 * document and the printed report, for every example.
 *
 * Metric: every document, the printed report and `--json` are byte for byte what they were
 * before inch figures reached the check summaries, the wiring list and the bill of materials'
 * notes (SHA-256 digests stored in tests/fixtures/documents/metric-digests.json, made from main
 * at that time; `LW_UPDATE_EXPECTED=1` rewrites them, to be reviewed).
 *
 * Inch: a scan of every human-facing document (Markdown, HTML, CSV, the SVGs' text) and the
 * printed report finds no metric length, mass or torque, outside the places docs/profile.md
 * names as SI (the HTML's print style sheet; the machine's description, the author's own
 * words). The inch figures read back agree with the metric build's SI data (`--json`) within
 * the precision units.ts states: 1/32 in for a length to the nearest sixteenth, a sixteenth
 * (up) for a cut, 0.05 oz, 0.005 lbf·in, 0.0005 in for a size. Factors: 1 in = 0.0254 m,
 * 1 oz = 28.349523125 g, 1 lbf = 4.4482216152605 N (NIST SP 811, 2008, appendix B.8).
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analyse } from '../../../src/core/pipeline.js';
import { parseFeetInches } from '../../../src/core/model/units.js';
import { expectStoredDigests } from '../../core/export/support.js';
import { EXAMPLES, examplePath, removeTempDirs, run, tempDir } from '../support.js';

const DIGESTS = 'tests/fixtures/documents/metric-digests.json';
const INCH_M = 0.0254;
const OUNCE_G = 28.349523125;
const LBF_IN_NM = 4.4482216152605 * INCH_M;

interface Made {
  readonly report: string;
  readonly files: Map<string, string>;
}

/** Build `name` with `units` into a fresh folder: the printed report and every file written. */
async function built(name: string, units: 'metric' | 'inch'): Promise<Made> {
  const dir = tempDir('lw-units-');
  const r = await run(['build', examplePath(name), '--shop-units', units, '--out', dir]);
  const files = new Map(readdirSync(dir).map((f) => [f, readFileSync(join(dir, f), 'utf8')]));
  return { report: r.out.replaceAll(dir, '<out>'), files };
}

/** Data for programs, and the marker file of the output folder: not read by a person. */
const NOT_READ = new Set(['netlist.json', 'machine.v', 'machine_tb.v', '.latchwright-build']);

/** What a person reads of a file: an HTML page without its style sheet and embedded images, an SVG's text. */
function readText(file: string, text: string): string {
  if (file.endsWith('.svg')) return [...text.matchAll(/>([^<]+)</g)].map((m) => m[1]).join('\n');
  if (file.endsWith('.html'))
    return text.replace(/<style>[\s\S]*?<\/style>/g, '').replace(/src="data:[^"]*"/g, 'src=""');
  return text;
}

/** Metric lengths, masses and torques, and column heads in them. */
const METRIC = /\d\s?(?:mm|cm|m|kg|g|N·m|N)\b|\b(?:mm|kg)\b|N·m|\((?:m|mm|g|kg)\)|\bmetres?\b|\bgrams?\b/g;

/** The author's description with escapes undone and white space closed up, to tell the author's words from ours. */
const plainWords = (s: string): string =>
  s
    .replace(/\\(.)/g, '$1')
    .replace(/&amp;/g, '&')
    .replace(/&#39;|&apos;/g, "'")
    .replace(/&quot;/g, '"')
    .replace(/\s+/g, ' ');

function description(name: string): string {
  const a = analyse(readFileSync(examplePath(name), 'utf8'), `${name}.lw`);
  return a.ok ? plainWords(a.machine.description ?? '') : '';
}

/** Every metric token of `text` that is not inside the machine's description. */
function metricTokens(text: string, author: string): string[] {
  const out: string[] = [];
  for (const m of text.matchAll(METRIC)) {
    const around = plainWords(text.slice(Math.max(0, m.index - 14), m.index + m[0].length + 6));
    if (author !== '' && author.includes(around.trim())) continue;
    out.push(around);
  }
  return out;
}

/** Metres of feet and inches as the documents write them (`3 ft 4 5/16 in`). */
function metresOf(words: string): number {
  const n = parseFeetInches(words.trim());
  if (n === undefined) throw new Error(`not feet and inches: '${words}'`);
  return (n / 16) * INCH_M;
}

/** Grams of a mass as the documents write it (`0.7 oz`, `1 lb 1.6 oz`, `2 lb`). */
function gramsOf(words: string): number {
  const m = /^(?:(\d+) lb)? ?(?:([\d.]+) oz)?$/.exec(words.trim());
  if (!m || (m[1] === undefined && m[2] === undefined)) throw new Error(`not a mass: '${words}'`);
  return (Number(m[1] ?? 0) * 16 + Number(m[2] ?? 0)) * OUNCE_G;
}

/** The CSV's records as objects by column head (RFC 4180: quoted cells, doubled quotes, CRLF). */
function csvRecords(text: string): Record<string, string>[] {
  const rows: string[][] = [];
  let row: string[] = [];
  let cell = '';
  let quoted = false;
  for (let k = 0; k < text.length; k++) {
    const ch = text[k];
    if (quoted && ch === '"' && text[k + 1] === '"') {
      cell += '"';
      k++;
    } else if (ch === '"') quoted = !quoted;
    else if (quoted || (ch !== ',' && ch !== '\r')) cell += ch;
    else if (ch === ',') {
      row.push(cell);
      cell = '';
    } else {
      // CRLF ends a record.
      rows.push([...row, cell]);
      row = [];
      cell = '';
      k++;
    }
  }
  if (cell !== '' || row.length > 0) rows.push([...row, cell]);
  const [head, ...body] = rows;
  return body.map((r) => Object.fromEntries(r.map((v, i) => [head[i], v])));
}

interface SiData {
  readonly checks: readonly Record<string, unknown>[];
}
const check = <T>(d: SiData, name: string): T => d.checks.find((c) => c.name === name) as T;

const metric = new Map<string, Made>();
const inch = new Map<string, Made>();
const json = new Map<string, { text: string; data: SiData }>();

beforeAll(async () => {
  for (const name of EXAMPLES) {
    metric.set(name, await built(name, 'metric'));
    inch.set(name, await built(name, 'inch'));
    const text = (await run(['build', examplePath(name), '--json'])).out;
    json.set(name, { text, data: JSON.parse(text) as SiData });
  }
}, 300_000);

afterAll(removeTempDirs);

describe('src/cli/commands/build (--shop-units)', () => {
  it('writes every metric document, the printed report and --json byte for byte as before (stored digests)', () => {
    const all: Record<string, string> = {};
    for (const name of EXAMPLES) {
      const m = metric.get(name) as Made;
      all[`${name}/report`] = m.report;
      for (const [file, text] of [...m.files].sort(([a], [b]) => a.localeCompare(b))) all[`${name}/${file}`] = text;
      all[`${name}/--json`] = json.get(name)?.text ?? '';
    }
    expectStoredDigests(DIGESTS, all);
  });

  it('keeps --json in SI in inch mode: only the profile block names the choice', async () => {
    for (const name of EXAMPLES) {
      const i = JSON.parse((await run(['build', examplePath(name), '--json', '--shop-units', 'inch'])).out) as Record<
        string,
        unknown
      >;
      const m = JSON.parse(json.get(name)?.text ?? '{}') as Record<string, unknown>;
      expect({ ...i, profile: undefined }, name).toEqual({ ...m, profile: undefined });
    }
  });

  it('finds no metric length, mass or torque in any inch document or the printed report, for every example', () => {
    for (const name of EXAMPLES) {
      const made = inch.get(name) as Made;
      const author = description(name);
      expect(made.files.size, name).toBeGreaterThan(10);
      expect(metricTokens(made.report, author), `${name} report`).toEqual([]);
      for (const [file, text] of made.files) {
        if (NOT_READ.has(file)) continue;
        expect(metricTokens(readText(file, text), author), `${name} ${file}`).toEqual([]);
      }
    }
  });

  it('writes a failing build in inches too: the over-budget words, their fixes and the layout findings', async () => {
    // The guide's slippery cord (μ = 0.12) fails the drive and layout checks of the canal lock.
    const dir = tempDir('lw-units-');
    const argv = ['build', examplePath('canal-lock'), '--profile', 'examples/profiles/slippery-cord.json'];
    const r = await run([...argv, '--shop-units', 'inch', '--out', dir]);
    expect(r.out).toMatch(
      /FAIL drive: over budget, .* lifts [\d.]+ oz .*; fix: a lighter load on '\w+': at most [\d.]+ oz/,
    );
    expect(r.out).toMatch(/FAIL layout: .*with its cords as routed, .* must lift [\d.]+ oz/);
    const author = description('canal-lock');
    expect(metricTokens(r.out, author)).toEqual([]);
    for (const file of ['build-sheet.md', 'build-sheet.html', 'wiring.csv', 'bom.csv'])
      expect(metricTokens(readText(file, readFileSync(join(dir, file), 'utf8')), author), file).toEqual([]);
    // The same build in metric says grams, as it always did.
    expect((await run(argv)).out).toMatch(/FAIL drive: over budget, .* lifts [\d.]+ g /);
  });

  it('scans with a pattern that does find the metric figures of a metric build (the scan can fail)', () => {
    const made = metric.get('canal-lock') as Made;
    const author = description('canal-lock');
    expect(metricTokens(made.report, author).length).toBeGreaterThan(5);
    const wiring = metricTokens(readText('wiring.csv', made.files.get('wiring.csv') ?? ''), author);
    expect(wiring.some((t) => t.includes('load 300 g'))).toBe(true);
    expect(wiring.some((t) => t.includes('length (m)'))).toBe(true);
    // The author's own words are left as written, in both systems.
    expect(readText('build-sheet.md', inch.get('canal-lock')?.files.get('build-sheet.md') ?? '')).toContain(
      '450 g each',
    );
  });

  it('reads the inch figures back to the metric build’s SI data within their stated precision', () => {
    for (const name of EXAMPLES) {
      const si = json.get(name)?.data as SiData;
      const report = inch.get(name)?.report ?? '';
      const layout = check<{
        drums: { lengthM: number }[];
        longestDrumM: number;
        totalCordM: number;
        baselineCordM: number;
      }>(si, 'layout');
      // Layout: drums, the longest allowed and the cord to the nearest sixteenth (within 1/32 in).
      const nearest = INCH_M / 32 + 1e-9;
      const l =
        /layout: .*?drums? \((.*?); longest allowed (.*?)\).*?; (.*?) of cord to cut \((.*?) in netlist order\)/.exec(
          report,
        );
      expect(l, `${name} layout`).not.toBeNull();
      const [, drums, longest, total, baseline] = l as RegExpExecArray;
      const drumWords = drums.split('; ').map((d) => d.replace(/, \d+ bays$/, ''));
      expect(drumWords.length, name).toBe(layout.drums.length);
      drumWords.forEach((d, k) =>
        expect(Math.abs(metresOf(d) - layout.drums[k].lengthM), `${name} drum`).toBeLessThanOrEqual(nearest),
      );
      expect(Math.abs(metresOf(longest) - layout.longestDrumM)).toBeLessThanOrEqual(nearest);
      expect(Math.abs(metresOf(total) - layout.totalCordM), `${name} cord`).toBeLessThanOrEqual(nearest);
      expect(Math.abs(metresOf(baseline) - layout.baselineCordM)).toBeLessThanOrEqual(nearest);
      // Drive: the torque to 0.01 lbf·in, the hardest pull to 0.1 oz.
      const drive = check<{ worstTorqueNm: number; operatorForceMaxG: number }>(si, 'drive');
      const torque = Number(/worst drum torque ([\d.]+) lbf·in/.exec(report)?.[1]);
      expect(Math.abs(torque * LBF_IN_NM - drive.worstTorqueNm), `${name} torque`).toBeLessThanOrEqual(
        0.005 * LBF_IN_NM + 1e-12,
      );
      const pull = /hardest lever pull ((?:\d+ lb ?)?(?:[\d.]+ oz)?)/.exec(report)?.[1] ?? '';
      expect(Math.abs(gramsOf(pull) - drive.operatorForceMaxG), `${name} pull`).toBeLessThanOrEqual(
        0.05 * OUNCE_G + 1e-9,
      );
    }
  });

  it('writes the wiring list and the drum note in inches and ounces that read back to the metric ones', () => {
    for (const name of EXAMPLES) {
      const m = csvRecords(metric.get(name)?.files.get('wiring.csv') ?? '');
      const i = csvRecords(inch.get(name)?.files.get('wiring.csv') ?? '');
      expect(i.length, name).toBe(m.length);
      expect(Object.keys(i[0])).toContain('length (in)');
      expect(Object.keys(i[0])).toContain('load (oz)');
      i.forEach((r, k) => {
        // The piece cut in inches: the metric cut rounded up to the sixteenth (never short, within 1/16 in).
        const lengthM = Number(m[k]['length (m)']);
        const inches = Number(r['length (in)']);
        expect(Number.isInteger(inches * 16), `${name} step ${k + 1}`).toBe(true);
        expect(inches * INCH_M).toBeGreaterThanOrEqual(lengthM - 1e-9);
        expect(inches * INCH_M).toBeLessThan(lengthM + INCH_M / 16);
        // The load to 0.1 oz (the metric to 0.1 g).
        expect(Math.abs(Number(r['load (oz)']) * OUNCE_G - Number(m[k]['load (g)']))).toBeLessThanOrEqual(
          0.05 * OUNCE_G + 0.05,
        );
      });
      // The drum's radius in the bill of materials: a size to 0.001 in (or a true fraction).
      const radius = (file: Made | undefined, unit: string): number =>
        Number(new RegExp(`radius ([\\d.]+) ${unit} at`).exec(file?.files.get('bom.csv') ?? '')?.[1]);
      const rIn = radius(inch.get(name), 'in');
      expect(Math.abs(rIn * INCH_M - radius(metric.get(name), 'm')), name).toBeLessThanOrEqual(0.0005 * INCH_M + 1e-12);
    }
  });
});
