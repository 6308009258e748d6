/**
 * Running the `latchwright` command in-process for the CLI tests: `main(argv, io)` with an io
 * that captures standard output and error, and that can serve files from memory (falling back
 * to the disk), so no build step and no child process is needed.
 */
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { expect } from 'vitest';
import { main } from '../../src/cli/main.js';
import { nodeIo, type CliIo } from '../../src/cli/io.js';

/** What one run of the command left behind. */
export interface Run {
  readonly code: number;
  readonly out: string;
  readonly err: string;
}

/** The disk, read by every run (made once: each nodeIo() watches the process's output streams). */
const disk = nodeIo();

/** Run `latchwright ...argv`; `files` (path → text) are read from memory before the disk. */
export async function run(argv: readonly string[], files: Readonly<Record<string, string>> = {}): Promise<Run> {
  let out = '';
  let err = '';
  const io: CliIo = {
    out: (s) => void (out += s),
    err: (s) => void (err += s),
    readText: (path) => (Object.hasOwn(files, path) ? { text: files[path] } : disk.readText(path)),
    interactive: false,
  };
  const code = await main(argv, io);
  return { code, out, err };
}

/** Run with --json expected on standard output, and parse it. */
export async function runJson<T = Record<string, unknown>>(
  argv: readonly string[],
  files: Readonly<Record<string, string>> = {},
): Promise<Run & { json: T }> {
  const r = await run(argv, files);
  let json: T;
  try {
    json = JSON.parse(r.out) as T;
  } catch {
    throw new Error(`not JSON on stdout (exit ${r.code}):\n${r.out}\nstderr:\n${r.err}`);
  }
  return { ...r, json };
}

/** No JavaScript stack-trace line (`    at fn (file:line:col)`) anywhere in what the user sees. */
export function expectNoStack(r: Run): void {
  expect(r.out + r.err).not.toMatch(/^ {4}at \S.*:\d+:\d+\)?$/m);
  expect(r.out + r.err).not.toMatch(/internal error/);
}

const made: string[] = [];

/** A fresh temporary folder for one test (removed by `removeTempDirs`). */
export function tempDir(prefix = 'lw-cli-'): string {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  made.push(dir);
  return dir;
}

/** Remove every folder `tempDir` made in this test file (call from afterAll). */
export function removeTempDirs(): void {
  for (const dir of made.splice(0)) rmSync(dir, { recursive: true, force: true });
}

/** Write a file into a folder and return its path. */
export function writeTemp(dir: string, name: string, text: string): string {
  const p = join(dir, name);
  writeFileSync(p, text, 'utf8');
  return p;
}

/** The example machines shipped in examples/ (our own invented exhibits), by file name without `.lw`. */
export const EXAMPLES: readonly string[] = readdirSync('examples')
  .filter((f) => f.endsWith('.lw'))
  .map((f) => f.slice(0, -3))
  .sort();

export const examplePath = (name: string): string => `examples/${name}.lw`;

export const readText = (path: string): string => readFileSync(path, 'utf8');
