import * as fs from 'node:fs';
import {
  existsSync,
  mkdirSync,
  mkdtempSync,
  readdirSync,
  readFileSync,
  rmSync,
  statSync,
  symlinkSync,
  utimesSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { BUILD_MARKER, writeBuildFolder, type WriteFs } from '../../src/cli/write-out.js';

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

  it('removes the temporary folders of earlier runs that were stopped half-way, and nothing else', () => {
    const dir = fresh();
    const parent = join(dir, '..');
    mkdirSync(parent, { recursive: true });
    // Leftovers of runs whose process is gone: one that got as far as the marker, one stopped
    // right after making its folder, and an earlier build moved aside and never deleted.
    const gone = 999_999_999;
    const made = (name: string, marker: boolean, more: string[] = []): string => {
      const p = join(parent, name);
      mkdirSync(p);
      if (marker) writeFileSync(join(p, BUILD_MARKER), 'x');
      for (const f of more) writeFileSync(join(p, f), 'partial');
      return p;
    };
    made(`out.tmp-${gone}-0a1b2c3d`, true, ['build-sheet.html']);
    made(`out.tmp-${gone}-11111111`, false);
    made(`out.tmp-${gone}-22222222.old`, true, ['wiring.csv']);
    // An earlier build that was being deleted when the run stopped: its marker is gone already.
    made(`out.tmp-${gone}-66666666.old`, false, ['build-sheet.html']);
    // Kept: a run still going (this process's parent is alive), a folder of someone else's, a
    // leftover of a live-looking run that holds foreign files, and another target's leftovers.
    made(`out.tmp-${process.ppid}-33333333`, true);
    made(`out.tmp-${gone}-44444444`, false, ['holiday.jpg']);
    made('out.tmp-notes', false, ['mine.txt']);
    made(`other.tmp-${gone}-55555555`, true);
    // From versions without the process id in the name: old enough and holding only our files.
    const legacy = made('out.tmp-Ab12Cd', false, ['build-sheet.html', 'wiring.csv']);
    const hour = Date.now() / 1000 - 3600;
    utimesSync(legacy, hour, hour);
    const fresh6 = made('out.tmp-Zz98Yy', false, ['build-sheet.html']);
    const r = writeBuildFolder(dir, docs('one'), { force: false });
    expect(r).toEqual({ ok: true, files: ['build-sheet.html', 'wiring.csv'], notes: [] });
    expect(readdirSync(parent).sort()).toEqual(
      [
        'out',
        `out.tmp-${process.ppid}-33333333`,
        `out.tmp-${gone}-44444444`,
        'out.tmp-notes',
        `other.tmp-${gone}-55555555`,
        'out.tmp-Zz98Yy',
      ].sort(),
    );
    expect(existsSync(fresh6)).toBe(true);
  });

  it("makes folders with the user's umask, not mode 0700", () => {
    const old = process.umask(0o022);
    try {
      const dir = fresh();
      expect(writeBuildFolder(dir, new Map([['sub/a.txt', 'a']]), { force: false }).ok).toBe(true);
      expect(statSync(dir).mode & 0o777).toBe(0o755);
      expect(statSync(join(dir, 'sub')).mode & 0o777).toBe(0o755);
      expect(statSync(join(dir, '..')).mode & 0o777).toBe(0o755);
      // A second build (replacing the first) keeps the same mode.
      expect(writeBuildFolder(dir, docs('two'), { force: false }).ok).toBe(true);
      expect(statSync(dir).mode & 0o777).toBe(0o755);
    } finally {
      process.umask(old);
    }
  });

  it('follows a symbolic link to an empty folder (or to an earlier build), and the link stays a link', () => {
    const real = fresh();
    mkdirSync(real, { recursive: true });
    const link = join(real, '..', 'link');
    symlinkSync(real, link);
    const r = writeBuildFolder(link, docs('one'), { force: false });
    expect(r.ok).toBe(true);
    expect(fs.lstatSync(link).isSymbolicLink()).toBe(true);
    expect(readFileSync(join(link, 'build-sheet.html'), 'utf8')).toBe('<p>one</p>\n');
    expect(readFileSync(join(real, 'build-sheet.html'), 'utf8')).toBe('<p>one</p>\n');
    expect(writeBuildFolder(link, docs('two'), { force: false }).ok).toBe(true);
    expect(readFileSync(join(real, 'build-sheet.html'), 'utf8')).toBe('<p>two</p>\n');
    expect(readdirSync(join(real, '..')).sort()).toEqual(['link', 'out']);
    // A link to a file, or to nothing, is refused as LW704.
    const file = join(real, '..', 'plain.txt');
    writeFileSync(file, 'x');
    const toFile = join(real, '..', 'to-file');
    symlinkSync(file, toFile);
    const dangling = join(real, '..', 'dangling');
    symlinkSync(join(real, '..', 'nowhere'), dangling);
    for (const bad of [toFile, dangling]) {
      const b = writeBuildFolder(bad, docs('one'), { force: false });
      expect(b.ok ? '' : b.diagnostic.code).toBe('LW704');
    }
  });

  it('an earlier build that cannot be removed is an LW706 warning naming it; the new documents are in place', () => {
    const dir = fresh();
    expect(writeBuildFolder(dir, docs('one'), { force: false }).ok).toBe(true);
    const denied: WriteFs = {
      ...fs,
      rmSync: (path, opts) => {
        if (String(path).endsWith('.old'))
          throw Object.assign(new Error('permission denied'), { code: 'EACCES', syscall: 'rmdir' });
        fs.rmSync(path, opts);
      },
    };
    const r = writeBuildFolder(dir, docs('two'), { force: false, fs: denied });
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(r.notes.map((d) => d.code)).toEqual(['LW706']);
      expect(r.notes[0].severity).toBe('warning');
      expect(r.notes[0].message).toMatch(
        /the earlier build, moved aside to .*\.old could not be removed \(EACCES on rmdir\)/,
      );
      expect(r.notes[0].location.file).toMatch(/\.old$/);
    }
    expect(readFileSync(join(dir, 'build-sheet.html'), 'utf8')).toBe('<p>two</p>\n');
    const old = r.ok ? r.notes[0].location.file : undefined;
    expect(existsSync(old!)).toBe(true);
    // A later build, once the process that left it is gone, removes it.
    const later = writeBuildFolder(dir, docs('three'), { force: false, alive: () => false });
    expect(later).toEqual({ ok: true, files: ['build-sheet.html', 'wiring.csv'], notes: [] });
    expect(existsSync(old!)).toBe(false);
    expect(leftovers(dir)).toEqual([]);
  });

  it('a failure to move the earlier build aside, or to put the new one in place, is LW704 and leaves the earlier build', () => {
    const dir = fresh();
    expect(writeBuildFolder(dir, docs('one'), { force: false }).ok).toBe(true);
    const failing = (which: (from: string, to: string) => boolean): WriteFs => ({
      ...fs,
      renameSync: (from, to) => {
        if (which(String(from), String(to)))
          throw Object.assign(new Error('busy'), { code: 'EBUSY', syscall: 'rename' });
        fs.renameSync(from, to);
      },
    });
    const aside = (from: string): boolean => from === dir;
    const inPlace = (from: string, to: string): boolean => to === dir && !from.endsWith('.old');
    for (const which of [aside, inPlace]) {
      const r = writeBuildFolder(dir, docs('two'), { force: false, fs: failing(which) });
      expect(r.ok ? '' : r.diagnostic.code).toBe('LW704');
      expect(readFileSync(join(dir, 'build-sheet.html'), 'utf8')).toBe('<p>one</p>\n');
      expect(leftovers(dir)).toEqual([]);
    }
  });
});
