/**
 * The doc-test tool: reads the command transcripts and file excerpts out of a Markdown page,
 * runs each command through the CLI's own `main(argv, io)` in this process (no build step, no
 * child process), and compares what it printed with what the page shows.
 *
 * The page's conventions (also stated at the top of tests/docs/guide.test.ts):
 *
 * - A fenced block whose info string is `sh` is a transcript. Each line starting with `$ ` is
 *   a command, and must be `$ npx latchwright …` (so every command a page shows is one this
 *   test runs); the lines up to the next `$ ` line are its expected output, standard output
 *   and standard error interleaved as a terminal shows them.
 * - An HTML comment on the line just above a fence sets options for that block:
 *   `<!-- doctest: exit=N -->` the exit status every command of the block must give (default 0);
 *   `<!-- doctest: keys="…" -->` run the command as at a terminal, typing these keys (a JSON
 *   string) and then closing standard input; the expected output is the last screen drawn;
 *   `<!-- doctest: file=PATH -->` the block (any info string) is an excerpt of the file PATH.
 * - Matching: exact (trailing spaces and trailing blank lines aside) unless the shown text has
 *   a line that is just `…`; then the shown lines must appear in order, `…` standing for any
 *   number of lines, and the lines between two `…` must be consecutive. A shown line ending in
 *   ` …` matches a line that starts with the text before it.
 * - `--out DIR` is redirected to a fresh temporary folder, written back as DIR in the output;
 *   a file excerpt whose PATH lies under DIR is read from that folder.
 */
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, normalize } from 'node:path';
import { PassThrough } from 'node:stream';
import { vi } from 'vitest';
import { main } from '../../src/cli/main.js';
import { nodeIo, type CliIo } from '../../src/cli/io.js';

/** Options of a block, from the comment above its fence. */
export interface BlockOptions {
  readonly exit?: number;
  readonly keys?: string;
  readonly file?: string;
}

/** One fenced block of a page. */
export interface DocBlock {
  /** 1-based line of the opening fence. */
  readonly line: number;
  readonly info: string;
  readonly body: readonly string[];
  readonly options: BlockOptions;
}

/** One command of a transcript and the output the page shows for it. */
export interface ShownCommand {
  readonly line: number;
  readonly argv: readonly string[];
  readonly shown: readonly string[];
}

const MARKER = /^<!--\s*doctest:\s*(.*?)\s*-->$/;
const FENCE = /^(`{3,}|~{3,})(\S*)\s*$/;
const PROMPT = '$ npx latchwright ';

/** Split a page into its fenced blocks; throws on a doctest comment it cannot read or that no fence follows. */
export function parseBlocks(markdown: string): DocBlock[] {
  const lines = markdown.split('\n');
  const blocks: DocBlock[] = [];
  let pending: { options: BlockOptions; line: number } | undefined;
  for (let i = 0; i < lines.length; i++) {
    const text = lines[i].trimEnd();
    if (text.includes('doctest') && text.startsWith('<!--')) {
      const m = MARKER.exec(text);
      if (!m) throw new Error(`line ${i + 1}: unreadable doctest comment: ${text}`);
      pending = { options: parseOptions(m[1], i + 1), line: i + 1 };
      continue;
    }
    const f = FENCE.exec(text);
    if (pending && !f) throw new Error(`line ${pending.line}: a doctest comment must sit on the line just above a fence`);
    if (f) {
      const close = lines.findIndex((l, j) => j > i && l.trimEnd() === f[1]);
      if (close < 0) throw new Error(`line ${i + 1}: a fence that is never closed`);
      const options = pending?.options ?? {};
      blocks.push({ line: i + 1, info: f[2], body: lines.slice(i + 1, close), options });
      pending = undefined;
      i = close;
      continue;
    }
  }
  if (pending) throw new Error(`line ${pending.line}: a doctest comment with no fence after it`);
  return blocks;
}

function parseOptions(text: string, line: number): BlockOptions {
  const out: { exit?: number; keys?: string; file?: string } = {};
  const re = /(\w+)=("(?:[^"\\]|\\.)*"|\S+)/g;
  let rest = text;
  for (const m of text.matchAll(re)) {
    rest = rest.replace(m[0], '');
    const [, key, raw] = m;
    if (key === 'exit' && /^\d+$/.test(raw)) out.exit = Number(raw);
    else if (key === 'keys' && raw.startsWith('"')) out.keys = JSON.parse(raw) as string;
    else if (key === 'file' && !raw.startsWith('"')) out.file = raw;
    else throw new Error(`line ${line}: unknown doctest option ${m[0]}`);
  }
  if (rest.trim() !== '') throw new Error(`line ${line}: unreadable doctest options: ${text}`);
  return out;
}

/** The commands of a transcript block; throws when a block holds text that is not a runnable command. */
export function commandsOf(block: DocBlock): ShownCommand[] {
  const cmds: { line: number; argv: string[]; shown: string[] }[] = [];
  block.body.forEach((l, k) => {
    const line = block.line + 1 + k;
    if (l.startsWith('$ ')) {
      if (!l.startsWith(PROMPT)) throw new Error(`line ${line}: only \`npx latchwright\` commands can be shown, since the doc test runs every one: ${l}`);
      const words = l.slice(PROMPT.length).trim();
      if (/["'\\|;&<>`$*?]/.test(words)) throw new Error(`line ${line}: keep shown commands free of shell quoting and operators: ${l}`);
      cmds.push({ line, argv: words.split(/\s+/), shown: [] });
    } else if (cmds.length === 0) {
      throw new Error(`line ${line}: a sh block must start with a \`$ npx latchwright …\` command`);
    } else cmds[cmds.length - 1].shown.push(l);
  });
  if (cmds.length === 0) throw new Error(`line ${block.line}: an empty sh block`);
  return cmds;
}

/** Lines of a text with trailing spaces and trailing blank lines removed. */
export function linesOf(text: string): string[] {
  const ls = text.split('\n').map((l) => l.trimEnd());
  while (ls.length > 0 && ls[ls.length - 1] === '') ls.pop();
  return ls;
}

const ELLIPSIS = '…';

function lineMatches(shown: string, actual: string): boolean {
  return shown.endsWith(` ${ELLIPSIS}`) ? actual.startsWith(shown.slice(0, -2)) : shown === actual;
}

function runAt(actual: readonly string[], at: number, seg: readonly string[]): boolean {
  return at >= 0 && at + seg.length <= actual.length && seg.every((s, k) => lineMatches(s, actual[at + k]));
}

/** Compare shown lines with actual ones by the rules above; a description of the first difference, or undefined. */
export function mismatch(shownRaw: readonly string[], actualRaw: readonly string[]): string | undefined {
  const shown = linesOf(shownRaw.join('\n'));
  const actual = linesOf(actualRaw.join('\n'));
  if (!shown.includes(ELLIPSIS)) {
    if (shown.length === actual.length && runAt(actual, 0, shown)) return undefined;
    const k = shown.findIndex((s, j) => j >= actual.length || !lineMatches(s, actual[j]));
    const at = k < 0 ? shown.length : k;
    return `line ${at + 1} differs: shown ${JSON.stringify(shown[at] ?? '(end)')}, got ${JSON.stringify(actual[at] ?? '(end)')}`;
  }
  const segs: string[][] = [[]];
  for (const s of shown) if (s === ELLIPSIS) segs.push([]);
  else segs[segs.length - 1].push(s);
  let pos = 0;
  for (let i = 0; i < segs.length; i++) {
    const seg = segs[i];
    if (seg.length === 0) continue;
    if (i === 0) {
      if (!runAt(actual, 0, seg)) return `the output does not start with ${JSON.stringify(seg[0])}`;
      pos = seg.length;
    } else if (i === segs.length - 1) {
      const at = actual.length - seg.length;
      if (at < pos || !runAt(actual, at, seg)) return `the output does not end with the lines from ${JSON.stringify(seg[0])}`;
      pos = actual.length;
    } else {
      let at = pos;
      while (at + seg.length <= actual.length && !runAt(actual, at, seg)) at++;
      if (at + seg.length > actual.length) return `not found in order: the lines from ${JSON.stringify(seg[0])}`;
      pos = at + seg.length;
    }
  }
  return undefined;
}

/** What one command printed. */
export interface CommandRun {
  readonly code: number;
  readonly lines: readonly string[];
}

const CLEAR_SCREEN = '\u001b[2J\u001b[H';

/** Runs commands through `main`, remembering where each `--out DIR` went. */
export class DocRunner {
  private readonly outDirs = new Map<string, string>();
  private readonly root = mkdtempSync(join(tmpdir(), 'latchwright-docs-'));
  private readonly cache = new Map<string, CommandRun>();

  /** The temporary folder the test uses for `--out` folders (remove it after the test). */
  get tempRoot(): string {
    return this.root;
  }

  /** Run `latchwright ...argv`; with `keys`, as at a terminal typing them. */
  async run(argv: readonly string[], keys?: string): Promise<CommandRun> {
    const key = JSON.stringify([argv, keys ?? null]);
    const hit = this.cache.get(key);
    // A command that writes files is always run again, so later excerpts read its own output.
    if (hit && !argv.includes('--out')) return hit;
    const real = [...argv];
    const o = real.indexOf('--out');
    let outDir: string | undefined;
    if (o >= 0 && real[o + 1] !== undefined) {
      outDir = real[o + 1];
      const tmp = join(this.root, `out${this.outDirs.size}`);
      this.outDirs.set(normalize(outDir).replace(/\/$/, ''), tmp);
      real[o + 1] = tmp;
    }
    let text = '';
    const disk = nodeIo();
    const io: CliIo = {
      out: (s) => void (text += s),
      err: (s) => void (text += s),
      readText: (p) => disk.readText(p),
      interactive: keys !== undefined,
    };
    let code: number;
    if (keys !== undefined) {
      const stdin = new PassThrough();
      stdin.end(keys);
      const spy = vi.spyOn(process, 'stdin', 'get').mockReturnValue(stdin as unknown as typeof process.stdin);
      try {
        code = await main(real, io);
      } finally {
        spy.mockRestore();
      }
      const screens = text.split(CLEAR_SCREEN);
      text = screens[screens.length - 1];
    } else code = await main(real, io);
    if (outDir !== undefined) text = text.split(real[o + 1]).join(outDir);
    const r = { code, lines: linesOf(text) };
    this.cache.set(key, r);
    return r;
  }

  /** Read a file a page quotes: from an `--out` folder when PATH lies under one, else from the repository. */
  readQuoted(path: string): string {
    const p = normalize(path);
    for (const [dir, tmp] of this.outDirs) if (p.startsWith(dir + '/')) return readFileSync(join(tmp, p.slice(dir.length + 1)), 'utf8');
    return readFileSync(p, 'utf8');
  }
}
