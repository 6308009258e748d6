/**
 * Write the build documents into a folder, atomically: the reader of the folder sees either
 * the old documents or the new ones, never a half-written mix.
 *
 * How: everything is written into a fresh temporary folder beside the target
 * (`DIR.tmp-<pid>-<random>`), starting with a marker file `.latchwright-build`, and then
 * renamed into place (rename(2) is atomic within one file system, and a sibling folder is on
 * the same one). The target may be:
 * - missing: the temporary folder is renamed to it (parents are created first);
 * - an empty folder: it is removed and replaced;
 * - a folder holding our marker (an earlier build): it is moved aside (`<temporary>.old`),
 *   replaced, and then deleted; if the replacing rename fails, the old folder is moved back;
 * - a symbolic link to a folder: the same, for the folder it points to (the link stays);
 * - any other non-empty folder: refused with LW702, unless `force`. With `force` the
 *   documents are written into that folder file by file, each one atomically (a temporary
 *   file beside it, then rename); the folder's other files are left alone and no marker is
 *   added, since the folder is still not ours to replace.
 * Folders are made with mkdir(2), so they get the user's umask (mkdtemp would make them 0700).
 *
 * Housekeeping: a run killed half-way (kill -9, a power cut) leaves its temporary folder
 * behind. Each build removes the leftovers of earlier runs into the same target: folders named
 * as ours (`DIR.tmp-<pid>-<random>`, with or without `.old`) whose process is gone and which
 * carry our marker or hold nothing but files a build writes (a run stopped while deleting the
 * earlier build has already deleted its marker); and, from versions that did not put the
 * process id in the name,
 * `DIR.tmp-<6 characters>` folders untouched for ten minutes that hold nothing but files a
 * build writes.
 *
 * Anything the file system refuses becomes an LW704 diagnostic; a temporary folder left by a
 * failure is removed. A folder that cannot be removed after the new documents are in place
 * (the earlier build, a leftover) is an LW706 warning naming it: the build itself succeeded.
 */
import * as nodeFs from 'node:fs';
import { randomBytes } from 'node:crypto';
import { basename, dirname, isAbsolute, join, resolve } from 'node:path';
import { diag, type Diagnostic } from '../core/index.js';

/** The file that marks a folder as made by `latchwright build`. */
export const BUILD_MARKER = '.latchwright-build';

/** The file-system calls the writer makes (tests put a failing one in their place). */
export type WriteFs = Pick<
  typeof nodeFs,
  | 'lstatSync'
  | 'statSync'
  | 'realpathSync'
  | 'mkdirSync'
  | 'readdirSync'
  | 'renameSync'
  | 'rmdirSync'
  | 'rmSync'
  | 'writeFileSync'
>;

export type WriteResult =
  | { readonly ok: true; readonly files: string[]; readonly notes: Diagnostic[] }
  | { readonly ok: false; readonly diagnostic: Diagnostic };

export interface WriteOptions {
  readonly force: boolean;
  readonly fs?: WriteFs;
  /** Whether a process is running (default: signal 0, ESRCH meaning gone). */
  readonly alive?: (pid: number) => boolean;
  /** The time now in milliseconds (default Date.now), for the age of legacy leftovers. */
  readonly now?: () => number;
}

const MARKER_TEXT = (names: readonly string[]): string =>
  [
    'This folder was written by `latchwright build`.',
    'The next build into it replaces the whole folder: keep nothing else here.',
    '',
    ...names,
    '',
  ].join('\n');

/** Leftovers from versions without the process id in the name are left alone this long (ms). */
const LEGACY_AGE_MS = 10 * 60 * 1000;

/** A relative file name that stays inside the folder. */
function badName(name: string): boolean {
  if (name === '' || isAbsolute(name) || name.includes('\\') || name.includes('\0')) return true;
  return name.split('/').some((seg) => seg === '' || seg === '.' || seg === '..') || name === BUILD_MARKER;
}

const failure = (dir: string, message: string, hint?: string): WriteResult => ({
  ok: false,
  diagnostic: diag('LW704', message, { file: dir }, hint),
});

const reason = (e: unknown): string => {
  const err = e as NodeJS.ErrnoException;
  return err.code ? `${err.code}${err.syscall ? ` on ${err.syscall}` : ''}` : String(e);
};

function processAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code !== 'ESRCH';
  }
}

const escapeRe = (s: string): string => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/** One write: the target, the file system, and the warnings gathered on the way. */
class FolderWriter {
  readonly notes: Diagnostic[] = [];
  private readonly fs: WriteFs;

  constructor(private readonly opts: WriteOptions) {
    this.fs = opts.fs ?? nodeFs;
  }

  stat(path: string, follow = false): nodeFs.Stats | undefined {
    try {
      return follow ? this.fs.statSync(path) : this.fs.lstatSync(path);
    } catch {
      return undefined;
    }
  }

  /** Remove `path` (a whole folder); LW706 naming it when the file system refuses. */
  remove(path: string, what: string): void {
    try {
      this.fs.rmSync(path, { recursive: true, force: true });
    } catch (e) {
      this.notes.push(
        diag(
          'LW706',
          `${what} ${path} could not be removed (${reason(e)})`,
          { file: path },
          'the new documents are in place; remove that folder by hand',
        ),
      );
    }
  }

  /** Remove, quietly, a temporary folder of this run after a failure (the failure is what gets reported). */
  discard(path: string): void {
    try {
      this.fs.rmSync(path, { recursive: true, force: true });
    } catch {
      // nothing more to do: the diagnostic of the failure names the folder's parent
    }
  }

  /** A fresh temporary folder beside `target`, made with mkdir(2) so it gets the user's umask. */
  makeTemp(target: string): string {
    for (let attempt = 0; ; attempt++) {
      const tmp = `${target}.tmp-${process.pid}-${randomBytes(4).toString('hex')}`;
      try {
        this.fs.mkdirSync(tmp);
        return tmp;
      } catch (e) {
        if ((e as NodeJS.ErrnoException).code !== 'EEXIST' || attempt > 8) throw e;
      }
    }
  }

  /** Remove the temporary folders earlier runs into `target` left behind (see the module comment). */
  sweep(target: string, ours: ReadonlySet<string>): void {
    const parent = dirname(target);
    const base = escapeRe(basename(target));
    const current = new RegExp(`^${base}\\.tmp-(\\d+)-[0-9a-f]{8}(\\.old)?$`);
    const legacy = new RegExp(`^${base}\\.tmp-[A-Za-z0-9]{6}(\\.old)?$`);
    let names: string[];
    try {
      names = this.fs.readdirSync(parent);
    } catch {
      return;
    }
    const alive = this.opts.alive ?? processAlive;
    const now = (this.opts.now ?? Date.now)();
    for (const name of names) {
      const path = join(parent, name);
      const m = current.exec(name);
      const st = m || legacy.test(name) ? this.stat(path) : undefined;
      if (!st?.isDirectory()) continue;
      const entries = this.entries(path);
      if (entries === undefined) continue;
      const stale = m
        ? !alive(Number(m[1])) && (entries.includes(BUILD_MARKER) || entries.every((e) => ours.has(e)))
        : now - st.mtimeMs > LEGACY_AGE_MS && entries.every((e) => ours.has(e));
      if (stale) this.remove(path, 'the temporary folder of an interrupted build,');
    }
  }

  entries(path: string): string[] | undefined {
    try {
      return this.fs.readdirSync(path);
    } catch {
      return undefined;
    }
  }

  writeAll(folder: string, files: ReadonlyMap<string, string>, marker: string): void {
    // The marker first: a folder of ours is recognisable however early the run was stopped.
    this.fs.writeFileSync(join(folder, BUILD_MARKER), marker, 'utf8');
    for (const [name, text] of files) {
      const path = join(folder, name);
      this.fs.mkdirSync(dirname(path), { recursive: true });
      this.fs.writeFileSync(path, text, 'utf8');
    }
  }
}

/** The folder to write: `dir` itself, or the folder a symbolic link at `dir` points to. */
function resolveTarget(w: FolderWriter, fs: WriteFs, dir: string): { target: string } | { error: WriteResult } {
  const target = resolve(dir);
  const st = w.stat(target);
  if (!st?.isSymbolicLink()) return { target };
  if (!w.stat(target, true)?.isDirectory())
    return {
      error: failure(dir, `${dir} is a symbolic link to something that is not a folder`, 'point it at a folder'),
    };
  try {
    return { target: fs.realpathSync(target) };
  } catch (e) {
    return { error: failure(dir, `cannot follow the symbolic link ${dir} (${reason(e)})`) };
  }
}

/** Write `files` (name → text) into `dir` as described in the module comment. */
export function writeBuildFolder(dir: string, files: ReadonlyMap<string, string>, opts: WriteOptions): WriteResult {
  const names = [...files.keys()];
  const bad = names.find(badName);
  if (bad !== undefined)
    return failure(
      dir,
      `cannot write a document named '${bad}' into a folder`,
      'document names are plain relative paths',
    );
  const w = new FolderWriter(opts);
  const fs = opts.fs ?? nodeFs;
  const resolved = resolveTarget(w, fs, dir);
  if ('error' in resolved) return resolved.error;
  const target = resolved.target;
  const st = w.stat(target);
  if (st && !st.isDirectory())
    return failure(dir, `${dir} exists and is not a folder`, 'choose a folder name that is free, or a folder');
  let entries: string[] = [];
  try {
    if (st) entries = fs.readdirSync(target);
  } catch (e) {
    return failure(dir, `cannot read the folder ${dir} (${reason(e)})`);
  }
  const ours = entries.includes(BUILD_MARKER);
  if (st && entries.length > 0 && !ours) {
    if (!opts.force) {
      return {
        ok: false,
        diagnostic: diag(
          'LW702',
          `${dir} is not empty and was not made by latchwright build (${entries.length} ${entries.length === 1 ? 'entry' : 'entries'}, no ${BUILD_MARKER} file)`,
          { file: dir },
          'choose another folder, or pass --force to write the documents into it beside what is there',
        ),
      };
    }
    return writeInto(fs, dir, target, files);
  }
  return replaceFolder(w, fs, { dir, target, exists: st !== undefined, empty: entries.length === 0 }, files);
}

/** The target is missing, empty, or ours: write beside it and rename into place. */
function replaceFolder(
  w: FolderWriter,
  fs: WriteFs,
  t: { readonly dir: string; readonly target: string; readonly exists: boolean; readonly empty: boolean },
  files: ReadonlyMap<string, string>,
): WriteResult {
  const { dir, target } = t;
  const names = [...files.keys()];
  let tmp: string;
  try {
    fs.mkdirSync(dirname(target), { recursive: true });
    w.sweep(target, new Set([BUILD_MARKER, ...names.map((n) => n.split('/')[0])]));
    tmp = w.makeTemp(target);
  } catch (e) {
    return failure(dir, `cannot make a folder beside ${dir} (${reason(e)})`);
  }
  try {
    w.writeAll(tmp, files, MARKER_TEXT(names));
  } catch (e) {
    w.discard(tmp);
    return failure(dir, `cannot write the documents (${reason(e)})`);
  }
  const old = `${tmp}.old`;
  try {
    if (t.exists && t.empty) fs.rmdirSync(target);
    else if (t.exists) fs.renameSync(target, old);
  } catch (e) {
    w.discard(tmp);
    return failure(dir, `cannot move the earlier build in ${dir} aside (${reason(e)})`);
  }
  try {
    fs.renameSync(tmp, target);
  } catch (e) {
    w.discard(tmp);
    return putBack(w, fs, dir, target, old, e);
  }
  if (w.stat(old)) w.remove(old, 'the earlier build, moved aside to');
  return { ok: true, files: names, notes: w.notes };
}

/** The new folder could not be put in place: move the earlier build back, and say what happened. */
function putBack(w: FolderWriter, fs: WriteFs, dir: string, target: string, old: string, e: unknown): WriteResult {
  if (w.stat(old)) {
    try {
      fs.renameSync(old, target);
    } catch (back) {
      return failure(
        dir,
        `cannot put the new documents in place at ${dir} (${reason(e)}), nor the earlier build back (${reason(back)}); it is at ${old}`,
        `move ${old} back to ${dir} by hand`,
      );
    }
  }
  return failure(dir, `cannot put the new documents in place at ${dir} (${reason(e)})`);
}

/** `--force` into a folder that is not ours: each file replaced atomically, nothing else touched. */
function writeInto(fs: WriteFs, dir: string, target: string, files: ReadonlyMap<string, string>): WriteResult {
  const written: string[] = [];
  for (const [name, text] of files) {
    const path = join(target, name);
    const tmp = join(dirname(path), `.${basename(path)}.tmp-${process.pid}`);
    try {
      fs.mkdirSync(dirname(path), { recursive: true });
      fs.writeFileSync(tmp, text, 'utf8');
      fs.renameSync(tmp, path);
      written.push(name);
    } catch (e) {
      try {
        fs.rmSync(tmp, { force: true });
      } catch {
        // the failure below is what matters
      }
      return failure(
        dir,
        `cannot write ${name} into ${dir} (${reason(e)}); ${written.length} of ${files.size} documents were written`,
      );
    }
  }
  return { ok: true, files: written, notes: [] };
}
