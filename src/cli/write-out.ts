/**
 * Write the build documents into a folder, atomically: the reader of the folder sees either
 * the old documents or the new ones, never a half-written mix.
 *
 * How: everything is written into a fresh temporary folder beside the target
 * (`DIR.tmp-XXXXXX`, made by mkdtemp), together with a marker file `.latchwright-build`,
 * and then renamed into place (rename(2) is atomic within one file system, and a sibling
 * folder is on the same one). The target may be:
 * - missing: the temporary folder is renamed to it (parents are created first);
 * - an empty folder: it is removed and replaced;
 * - a folder holding our marker (an earlier build): it is moved aside, replaced, and then
 *   deleted; if the replacing rename fails, the old folder is moved back;
 * - any other non-empty folder: refused with LW702, unless `force`. With `force` the
 *   documents are written into that folder file by file, each one atomically (a temporary
 *   file beside it, then rename); the folder's other files are left alone and no marker is
 *   added, since the folder is still not ours to replace.
 * Anything the file system refuses becomes an LW704 diagnostic; a temporary folder left by a
 * failure is removed.
 */
import {
  lstatSync,
  mkdirSync,
  mkdtempSync,
  readdirSync,
  renameSync,
  rmdirSync,
  rmSync,
  writeFileSync,
  type Stats,
} from 'node:fs';
import { basename, dirname, isAbsolute, join, resolve } from 'node:path';
import { diag, type Diagnostic } from '../core/index.js';

/** The file that marks a folder as made by `latchwright build`. */
export const BUILD_MARKER = '.latchwright-build';

export type WriteResult =
  { readonly ok: true; readonly files: string[] } | { readonly ok: false; readonly diagnostic: Diagnostic };

const MARKER_TEXT = (names: readonly string[]): string =>
  [
    'This folder was written by `latchwright build`.',
    'The next build into it replaces the whole folder: keep nothing else here.',
    '',
    ...names,
    '',
  ].join('\n');

/** A relative file name that stays inside the folder. */
function badName(name: string): boolean {
  if (name === '' || isAbsolute(name) || name.includes('\\') || name.includes('\0')) return true;
  return name.split('/').some((seg) => seg === '' || seg === '.' || seg === '..') || name === BUILD_MARKER;
}

function statOf(path: string): Stats | undefined {
  try {
    return lstatSync(path);
  } catch {
    return undefined;
  }
}

const failure = (dir: string, message: string, hint?: string): WriteResult => ({
  ok: false,
  diagnostic: diag('LW704', message, { file: dir }, hint),
});

const reason = (e: unknown): string => {
  const err = e as NodeJS.ErrnoException;
  return err.code ? `${err.code}${err.syscall ? ` on ${err.syscall}` : ''}` : String(e);
};

function writeAll(folder: string, files: ReadonlyMap<string, string>): void {
  for (const [name, text] of files) {
    const path = join(folder, name);
    mkdirSync(dirname(path), { recursive: true });
    writeFileSync(path, text, 'utf8');
  }
}

/** Write `files` (name → text) into `dir` as described in the module comment. */
export function writeBuildFolder(
  dir: string,
  files: ReadonlyMap<string, string>,
  opts: { readonly force: boolean },
): WriteResult {
  const names = [...files.keys()];
  const bad = names.find(badName);
  if (bad !== undefined)
    return failure(
      dir,
      `cannot write a document named '${bad}' into a folder`,
      'document names are plain relative paths',
    );
  const target = resolve(dir);
  const st = statOf(target);
  if (st && !st.isDirectory())
    return failure(dir, `${dir} exists and is not a folder`, 'choose a folder name that is free, or a folder');
  let entries: string[] = [];
  try {
    if (st) entries = readdirSync(target);
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
    return writeInto(dir, target, files);
  }
  let tmp: string;
  try {
    mkdirSync(dirname(target), { recursive: true });
    tmp = mkdtempSync(join(dirname(target), `${basename(target)}.tmp-`));
  } catch (e) {
    return failure(dir, `cannot make a folder beside ${dir} (${reason(e)})`);
  }
  try {
    writeAll(tmp, files);
    writeFileSync(join(tmp, BUILD_MARKER), MARKER_TEXT(names), 'utf8');
  } catch (e) {
    rmSync(tmp, { recursive: true, force: true });
    return failure(dir, `cannot write the documents (${reason(e)})`);
  }
  const old = `${tmp}.old`;
  try {
    if (st && entries.length === 0) rmdirSync(target);
    else if (st) renameSync(target, old);
  } catch (e) {
    rmSync(tmp, { recursive: true, force: true });
    return failure(dir, `cannot move the earlier build in ${dir} aside (${reason(e)})`);
  }
  try {
    renameSync(tmp, target);
  } catch (e) {
    rmSync(tmp, { recursive: true, force: true });
    if (statOf(old)) renameSync(old, target);
    return failure(dir, `cannot put the new documents in place at ${dir} (${reason(e)})`);
  }
  rmSync(old, { recursive: true, force: true });
  return { ok: true, files: names };
}

/** `--force` into a folder that is not ours: each file replaced atomically, nothing else touched. */
function writeInto(dir: string, target: string, files: ReadonlyMap<string, string>): WriteResult {
  const written: string[] = [];
  for (const [name, text] of files) {
    const path = join(target, name);
    const tmp = join(dirname(path), `.${basename(path)}.tmp-${process.pid}`);
    try {
      mkdirSync(dirname(path), { recursive: true });
      writeFileSync(tmp, text, 'utf8');
      renameSync(tmp, path);
      written.push(name);
    } catch (e) {
      rmSync(tmp, { force: true });
      return failure(
        dir,
        `cannot write ${name} into ${dir} (${reason(e)}); ${written.length} of ${files.size} documents were written`,
      );
    }
  }
  return { ok: true, files: written };
}
