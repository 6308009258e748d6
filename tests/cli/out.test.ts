/**
 * `latchwright build FILE --out DIR [--force]`: the build documents written into a folder; a
 * later build into a folder the tool made replaces it whole; a non-empty folder the tool did
 * not make is refused (LW702) unless --force, which writes beside what is there.
 */
import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { DOCUMENT_FILES } from '../../src/core/export/index.js';
import { BUILD_MARKER } from '../../src/cli/write-out.js';
import { expectNoStack, removeTempDirs, run, tempDir } from './support.js';

const MB = 'examples/marble-bell.lw';
const LIGHT = 'examples/lighthouse.lw';
const build = (file: string, dir: string, ...more: string[]) =>
  run(['build', file, '--encoding', 'binary', '--out', dir, ...more]);

afterAll(removeTempDirs);

describe('cli/commands/out (build --out)', () => {
  it('writes every build document and the marker into a new folder (parents made), and says so', async () => {
    const dir = join(tempDir(), 'workshop', 'marble-bell');
    const r = await build(MB, dir);
    expect(r.code).toBe(0);
    expect(readdirSync(dir).sort()).toEqual([...DOCUMENT_FILES, BUILD_MARKER].sort());
    expect(r.out.split('\n')[0]).toBe(`wrote ${DOCUMENT_FILES.length} files to ${dir}: ${DOCUMENT_FILES.join(', ')}`);
    // The report still follows, and the documents are of the machine built.
    expect(r.out).toContain('marble_bell: 4 states');
    expect(readFileSync(join(dir, 'build-sheet.md'), 'utf8')).toContain('marble_bell');
    expect(JSON.parse(readFileSync(join(dir, 'netlist.json'), 'utf8'))).toEqual(expect.any(Object));
    expect(readFileSync(join(dir, BUILD_MARKER), 'utf8')).toContain('latchwright build');
  });

  it('a second build into a folder it made replaces the whole folder', async () => {
    const dir = join(tempDir(), 'out');
    expect((await build(MB, dir)).code).toBe(0);
    writeFileSync(join(dir, 'left-over.txt'), 'from before', 'utf8');
    const r = await build(LIGHT, dir);
    expect(r.code).toBe(0);
    expect(existsSync(join(dir, 'left-over.txt'))).toBe(false);
    expect(readdirSync(dir).sort()).toEqual([...DOCUMENT_FILES, BUILD_MARKER].sort());
    expect(readFileSync(join(dir, 'build-sheet.md'), 'utf8')).toContain('lighthouse');
    // No temporary folder is left beside it.
    expect(readdirSync(join(dir, '..'))).toEqual(['out']);
  });

  it('an empty folder is used as it is', async () => {
    const dir = tempDir();
    expect((await build(MB, dir)).code).toBe(0);
    expect(readdirSync(dir)).toContain(BUILD_MARKER);
  });

  it('a non-empty folder it did not make is refused with LW702 and left untouched', async () => {
    const dir = join(tempDir(), 'letters');
    mkdirSync(dir);
    writeFileSync(join(dir, 'letter.txt'), 'dear workshop', 'utf8');
    const r = await build(MB, dir);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err).toMatch(
      new RegExp(
        `^${dir.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}: error LW702: .* not empty and was not made by latchwright build .*--force`,
      ),
    );
    expect(readdirSync(dir)).toEqual(['letter.txt']);
    expectNoStack(r);
  });

  it('--force writes the documents beside what is there, adding no marker', async () => {
    const dir = join(tempDir(), 'letters');
    mkdirSync(dir);
    writeFileSync(join(dir, 'letter.txt'), 'dear workshop', 'utf8');
    const r = await build(MB, dir, '--force');
    expect(r.code).toBe(0);
    expect(readdirSync(dir).sort()).toEqual([...DOCUMENT_FILES, 'letter.txt'].sort());
    expect(readFileSync(join(dir, 'letter.txt'), 'utf8')).toBe('dear workshop');
  });

  it('a file where the folder should be: LW704, exit 2', async () => {
    const dir = tempDir();
    const file = join(dir, 'taken');
    writeFileSync(file, 'a file', 'utf8');
    const r = await build(MB, file);
    expect(r.code).toBe(2);
    expect(r.err).toContain(`error LW704: ${file} exists and is not a folder`);
    expect(readFileSync(file, 'utf8')).toBe('a file');
  });

  it('with --json the report goes to standard output and the folder is still written', async () => {
    const dir = join(tempDir(), 'json-out');
    const r = await run(['build', MB, '--encoding', 'binary', '--json', '--out', dir]);
    expect(r.code).toBe(0);
    expect((JSON.parse(r.out) as { machine: { name: string } }).machine.name).toBe('marble_bell');
    expect(readdirSync(dir)).toContain('netlist.json');
  });
});
