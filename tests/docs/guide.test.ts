/**
 * The doc test of the user documentation: every command docs/guide.md,
 * docs/operating-and-safety.md and docs/behaviours.md show is run, and what it prints must still be what the page
 * shows; every file a page quotes must still say what the page quotes; every relative link
 * must lead somewhere.
 *
 * How a page marks what is tested (tool: tests/docs/transcript.ts):
 * - A fenced block with the info string `sh` is a transcript: each `$ npx latchwright …` line
 *   is a command (no other command may be shown in one), the lines up to the next `$` line
 *   its output — standard output and standard error interleaved, as a terminal shows them.
 *   The command runs through `main(argv, io)` of src/cli/main.ts in this process, with the
 *   repository root as the working folder: the code the compiled `bin/latchwright.js` calls,
 *   without a build step.
 * - `<!-- doctest: exit=N -->` on the line above a fence: the exit status every command of the
 *   block must give (default 0). `<!-- doctest: keys="…" -->`: the command runs as at a
 *   terminal, the keys (a JSON string) typed and then standard input closed; the output
 *   compared is the last screen drawn. `<!-- doctest: file=PATH -->`: the block (any info
 *   string) is an excerpt of the file PATH.
 * - Matching rule: short outputs are shown whole and must match exactly (trailing spaces and
 *   trailing blank lines aside). A long output may be cut with lines holding only `…`: then
 *   the lines shown must appear in the output in the same order, `…` standing for any number
 *   of lines and the lines between two `…` being consecutive in the output. A shown line that
 *   ends in ` …` matches an output line that starts with the text before it.
 * - `--out DIR` is redirected to a temporary folder (removed afterwards) and written back as
 *   DIR in the output; an excerpt of `DIR/…` reads the file from there.
 * Pages show no timings or dates: every figure they quote is deterministic.
 */
import { existsSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { dirname, join, normalize } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { OPERATING_RULES, RULE_WORDS } from '../../src/core/sim/hand.js';
import { commandsOf, DocRunner, linesOf, mismatch, parseBlocks, type DocBlock } from './transcript.js';

const PAGES = ['docs/guide.md', 'docs/operating-and-safety.md', 'docs/behaviours.md'] as const;
const runner = new DocRunner();
afterAll(() => rmSync(runner.tempRoot, { recursive: true, force: true }));

const read = (path: string): string => readFileSync(path, 'utf8');

/** What a block is, in a test's name. */
function title(page: string, b: DocBlock): string {
  if (b.options.file) return `${page}:${b.line} quotes ${b.options.file}`;
  const first = b.body[0] ?? '';
  return `${page}:${b.line} ${first}${b.options.keys !== undefined ? ` (keys ${JSON.stringify(b.options.keys)})` : ''}`;
}

/** The blocks of a page that the test checks, in page order. */
const checked = (page: string): DocBlock[] => parseBlocks(read(page)).filter((b) => b.info === 'sh' || b.options.file !== undefined);

for (const page of PAGES) {
  describe(page, () => {
    it('has commands and quotations to check', () => {
      expect(checked(page).length).toBeGreaterThan(0);
    });

    // Blocks run in page order: a quotation of a --out folder follows the build that wrote it.
    for (const b of checked(page)) {
      it(title(page, b), async () => {
        if (b.options.file !== undefined) {
          const why = mismatch(b.body, linesOf(runner.readQuoted(b.options.file)));
          expect(why, `${page}:${b.line}: the quotation of ${b.options.file} no longer matches: ${why}`).toBeUndefined();
          return;
        }
        for (const c of commandsOf(b)) {
          const r = await runner.run(c.argv, b.options.keys);
          const got = `exit ${r.code}:\n${r.lines.join('\n')}`;
          expect(r.code, `${page}:${c.line}: exit status of latchwright ${c.argv.join(' ')}\n${got}`).toBe(b.options.exit ?? 0);
          const why = mismatch(c.shown, r.lines);
          expect(why, `${page}:${c.line}: latchwright ${c.argv.join(' ')} printed something else: ${why}\n--- printed ---\n${r.lines.join('\n')}`).toBeUndefined();
        }
      });
    }
  });
}

/** GitHub's heading anchors: lower case, punctuation dropped, spaces to hyphens. */
function anchors(markdown: string): Set<string> {
  const out = new Set<string>();
  let fenced = false;
  for (const l of markdown.split('\n')) {
    if (/^(```|~~~)/.test(l)) fenced = !fenced;
    const h = /^#{1,6}\s+(.*?)\s*$/.exec(l);
    if (h && !fenced) out.add(h[1].toLowerCase().replace(/[^\p{L}\p{N}\s_-]/gu, '').replace(/\s/g, '-'));
  }
  return out;
}

/** Every relative link and image (Markdown or an HTML img) of a page, outside code, with the problem if it leads nowhere. */
function brokenLinks(page: string): string[] {
  const text = read(page).replace(/^(```|~~~)[^\n]*\n[\s\S]*?^\1\s*$/gm, '').replace(/`[^`\n]*`/g, '');
  const problems: string[] = [];
  const targets = [
    ...[...text.matchAll(/!?\[[^\]]*\]\(([^)\s]+)\)/g)].map((m) => m[1]),
    ...[...text.matchAll(/<img\s[^>]*\bsrc="([^"]+)"/g)].map((m) => m[1]),
  ];
  for (const target of targets) {
    if (/^[a-z]+:/i.test(target)) continue;
    const [path, anchor] = target.split('#', 2);
    const file = path === '' ? page : normalize(join(dirname(page), decodeURIComponent(path)));
    if (!existsSync(file)) problems.push(`${target}: no such file (${file})`);
    else if (anchor !== undefined && file.endsWith('.md') && !anchors(read(file)).has(decodeURIComponent(anchor))) problems.push(`${target}: no heading for #${anchor} in ${file}`);
  }
  return problems;
}

describe('docs (links and contents)', () => {
  // README.md and docs/benchmarks.md are left out: `npm run bench` writes the latter.
  const pages = [
    ...readdirSync('docs').filter((f) => f.endsWith('.md') && f !== 'benchmarks.md').map((f) => `docs/${f}`),
    ...readdirSync('docs/methods').filter((f) => f.endsWith('.md')).map((f) => `docs/methods/${f}`),
  ];
  it.each(pages)('every relative link and image in %s leads to a file and heading that exist', (page) => {
    expect(brokenLinks(page)).toEqual([]);
  });

  it('docs/methods/README.md links every method note', () => {
    const index = read('docs/methods/README.md');
    const notes = readdirSync('docs/methods').filter((f) => f.endsWith('.md') && f !== 'README.md');
    expect(notes.length).toBeGreaterThan(0);
    expect(notes.filter((f) => !index.includes(`](${f}`))).toEqual([]);
  });

  it('docs/guide.md starts the browser designer the way the tree does', () => {
    const guide = read('docs/guide.md');
    const start = (JSON.parse(read('package.json')) as { scripts: Record<string, string> }).scripts.start;
    // §9 says `npm start` builds and serves the designer and `npm run demo` runs the command-line demo.
    expect(start, 'package.json "start" changed: update §9 of docs/guide.md').toBe('vite build && node --import tsx src/web/serve.ts');
    expect((JSON.parse(read('package.json')) as { scripts: Record<string, string> }).scripts.demo).toMatch(/latchwright\.js demo$/);
    expect(guide).toContain('`npm start` builds the designer');
    expect(guide).toContain('`npm run demo`');
    expect(read('vite.config.ts')).toContain("outDir: here('./dist/web')");
    expect(read('src/web/serve.ts')).toContain("Number(flag('port') ?? 5178)");
    expect(guide).toContain('<http://127.0.0.1:5178/>');
  });

  it('README.md lists the guide and the safety page among its documentation', () => {
    const docs = read('README.md').split('## Documentation')[1]?.split('\n## ')[0] ?? '';
    expect(docs).toContain('](docs/guide.md)');
    expect(docs).toContain('](docs/operating-and-safety.md)');
  });

  // The cautions of the design brief (DESIGN §9), which the safety page carries in full.
  it.each([
    'Turning drums catch hair, cords, sleeves and fingers',
    'guard them and fit a stop within reach',
    'Hanging weights fall when a cord breaks',
    'keep them low, enclosed, or caught',
    'Levers make pinch points',
    'risk assessment under the local machinery and exhibit-safety rules',
    "ISO 12100's risk-assessment method is a common starting point — from memory",
    "support, and never replace, a competent person's judgement",
    'local codes and licensed practice',
  ])('docs/operating-and-safety.md carries the caution "%s"', (words) => {
    expect(read('docs/operating-and-safety.md').replace(/\s+/g, ' ')).toContain(words);
  });

  it('every operating rule has a section on the safety page, headed in the words of the forbidden-input check', () => {
    const headings = read('docs/operating-and-safety.md').split('\n').filter((l) => l.startsWith('### ')).map((l) => l.slice(4).toLowerCase());
    expect(OPERATING_RULES.length).toBe(3);
    for (const rule of OPERATING_RULES) expect(headings).toContain(RULE_WORDS[rule].toLowerCase());
  });
});

describe('tests/docs/transcript (the doc-test tool itself)', () => {
  it('matches a short output exactly and reports the first differing line', () => {
    expect(mismatch(['a', 'b'], ['a', 'b', ''])).toBeUndefined();
    expect(mismatch(['a', 'b'], ['a', 'c'])).toMatch(/line 2 differs/);
    expect(mismatch(['a'], ['a', 'b'])).toMatch(/line 2 differs/);
  });

  it('matches cut outputs in order, with consecutive runs between the cuts', () => {
    const out = ['head', 'x', 'p', 'q', 'y', 'tail'];
    expect(mismatch(['head', '…', 'p', 'q', '…', 'tail'], out)).toBeUndefined();
    expect(mismatch(['…', 'q', 'p', '…'], out)).toMatch(/not found in order/);
    expect(mismatch(['head', '…', 'p', 'y', '…'], out)).toMatch(/not found in order/);
    expect(mismatch(['x', '…'], out)).toMatch(/does not start/);
    expect(mismatch(['…', 'y'], out)).toMatch(/does not end/);
    expect(mismatch(['he …', '…'], out)).toBeUndefined();
  });

  it('refuses pages whose marks it cannot honour', () => {
    expect(() => parseBlocks('<!-- doctest: exit=2 -->\n\n```sh\n$ npx latchwright check x\n```\n')).toThrow(/just above a fence/);
    expect(() => parseBlocks('<!-- doctest: exits=2 -->\n```sh\n```\n')).toThrow(/unknown doctest option/);
    expect(() => parseBlocks('<!-- doctest: file=a.txt -->')).toThrow(/no fence/);
    const [b] = parseBlocks('```sh\n$ ls -l\n```\n');
    expect(() => commandsOf(b)).toThrow(/only `npx latchwright` commands/);
    const [c] = parseBlocks('```sh\nnpm start\n```\n');
    expect(() => commandsOf(c)).toThrow(/must start with/);
  });
});
