import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { BUILD_MARKER, writeBuildFolder } from '../../src/cli/write-out.js';

const root = mkdtempSync(join(tmpdir(), 'lw-write-out-'));
afterAll(() => rmSync(root, { recursive: true, force: true }));

let n = 0;
/** A fresh path under the test folder (not created). */
const fresh = (): string => join(root, `case${++n}`, 'out');

const docs = (tag: string): Map<string, string> =>
  new Map([
    ['build-sheet.html', `<p>${tag}</p>\n`],
    ['wiring.csv', `step\r\n${tag}\r\n`],
  ]);

/** Names in the folder that holds `dir`, other than `dir` itself: leftovers of a write. */
const leftovers = (dir: string): string[] => readdirSync(join(dir, '..')).filter((e) => e !== 'out' && e !== 'file');

describe('cli/write-out', () => {
  it('creates a missing folder (and its parents) with the documents and the marker', () => {
    const dir = fresh();
    const r = writeBuildFolder(dir, docs('one'), { force: false });
    expect(r).toEqual({ ok: true, files: ['build-sheet.html', 'wiring.csv'], notes: [] });
    expect(readdirSync(dir).sort()).toEqual([BUILD_MARKER, 'build-sheet.html', 'wiring.csv']);
    expect(readFileSync(join(dir, 'wiring.csv'), 'utf8')).toBe('step\r\none\r\n');
    expect(readFileSync(join(dir, BUILD_MARKER), 'utf8')).toContain('latchwright build');
    expect(leftovers(dir)).toEqual([]);
  });

  it('replaces a folder it made as a whole: old documents do not linger', () => {
    const dir = fresh();
    writeBuildFolder(dir, new Map([...docs('one'), ['old.svg', '<svg/>']]), { force: false });
    const r = writeBuildFolder(dir, docs('two'), { force: false });
    expect(r.ok).toBe(true);
    expect(readdirSync(dir).sort()).toEqual([BUILD_MARKER, 'build-sheet.html', 'wiring.csv']);
    expect(readFileSync(join(dir, 'build-sheet.html'), 'utf8')).toBe('<p>two</p>\n');
    expect(leftovers(dir)).toEqual([]);
  });

  it('takes over an empty folder', () => {
    const dir = fresh();
    mkdirSync(dir, { recursive: true });
    expect(writeBuildFolder(dir, docs('one'), { force: false }).ok).toBe(true);
    expect(existsSync(join(dir, BUILD_MARKER))).toBe(true);
  });

  it('refuses a non-empty folder it did not make (LW702) and leaves it untouched', () => {
    const dir = fresh();
    mkdirSync(dir, { recursive: true });
    writeFileSync(join(dir, 'notes.txt'), 'mine');
    const r = writeBuildFolder(dir, docs('one'), { force: false });
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.diagnostic.code).toBe('LW702');
      expect(r.diagnostic.message).toContain(dir);
      expect(r.diagnostic.hint).toContain('--force');
    }
    expect(readdirSync(dir)).toEqual(['notes.txt']);
    expect(leftovers(dir)).toEqual([]);
  });

  it('with force, writes the documents into that folder beside what is there, without claiming it', () => {
    const dir = fresh();
    mkdirSync(dir, { recursive: true });
    writeFileSync(join(dir, 'notes.txt'), 'mine');
    writeFileSync(join(dir, 'wiring.csv'), 'stale');
    const r = writeBuildFolder(dir, docs('one'), { force: true });
    expect(r).toEqual({ ok: true, files: ['build-sheet.html', 'wiring.csv'], notes: [] });
    expect(readdirSync(dir).sort()).toEqual(['build-sheet.html', 'notes.txt', 'wiring.csv']);
    expect(readFileSync(join(dir, 'wiring.csv'), 'utf8')).toBe('step\r\none\r\n');
    expect(readFileSync(join(dir, 'notes.txt'), 'utf8')).toBe('mine');
  });

  it('reports a file in the way, or a path that cannot be made, as LW704 and leaves nothing behind', () => {
    const dir = fresh();
    mkdirSync(join(dir, '..'), { recursive: true });
    writeFileSync(dir, 'a file');
    const r = writeBuildFolder(dir, docs('one'), { force: true });
    expect(r.ok ? '' : r.diagnostic.code).toBe('LW704');
    const blocked = join(dir, 'inside');
    const r2 = writeBuildFolder(blocked, docs('one'), { force: false });
    expect(r2.ok ? '' : r2.diagnostic.code).toBe('LW704');
    expect(readdirSync(join(dir, '..'))).toEqual(['out']);
  });

  it('refuses document names that would leave the folder or clash with the marker', () => {
    for (const bad of ['../x.csv', '/etc/x', '', 'a//b', BUILD_MARKER]) {
      const r = writeBuildFolder(fresh(), new Map([[bad, 'x']]), { force: false });
      expect(r.ok ? '' : r.diagnostic.code, bad).toBe('LW704');
    }
    const dir = fresh();
    expect(writeBuildFolder(dir, new Map([['verilog/machine.v', 'module m; endmodule\n']]), { force: false }).ok).toBe(
      true,
    );
    expect(readFileSync(join(dir, 'verilog', 'machine.v'), 'utf8')).toContain('endmodule');
  });
});
