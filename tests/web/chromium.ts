/**
 * The one place where the browser tests and the browser benchmark (bench/web.ts) start
 * Chromium, so that `npm test` needs nothing but Node and npm.
 *
 * The browser is the headless Chromium that the npm package `@sparticuz/chromium` ships inside
 * its tarball (brotli-compressed; nothing is downloaded at install or at run time). On first use
 * it is unpacked into `<tmpdir>/latchwright-chromium-<version>-<uid>/` with the libraries and
 * fonts the same package ships beside it: NSS, NSPR and expat (its `al2023` bundle), so the
 * binary needs only the C library of the machine, and Open Sans with a fontconfig file that
 * also takes in the system's fonts where there are any. The folder is filled under a temporary
 * name and renamed into place, so a run that is stopped half-way, or two runs at once, never
 * leave a half-written browser behind.
 *
 * LW_CHROMIUM=/path/to/chromium uses another Chromium instead (e.g. Debian's /usr/bin/chromium),
 * and so does a machine that is not Linux on x86-64 (the package ships no other build) when it
 * has /usr/bin/chromium. A missing browser is an error that says what to do, never a skip.
 *
 * Flags: headless, no sandbox (we run as root in a container), no GPU, and no network chatter
 * (no QUIC, first-run, background networking, component updates or sync). Playwright starts
 * every browser with a fresh profile of its own (`--user-data-dir=<tmpdir>/playwright_…`, removed
 * when the browser closes; it refuses that flag from callers).
 */
import { createRequire } from 'node:module';
import {
  createReadStream,
  createWriteStream,
  existsSync,
  mkdirSync,
  mkdtempSync,
  readdirSync,
  readFileSync,
  renameSync,
  rmSync,
  statSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve, sep } from 'node:path';
import { pipeline } from 'node:stream/promises';
import { brotliDecompressSync, createBrotliDecompress } from 'node:zlib';
import type { Browser } from 'playwright-core';

/** Flags for this sandboxed machine: see the file comment. */
export const CHROMIUM_ARGS: readonly string[] = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

/** Debian's chromium, used only when LW_CHROMIUM names no other and the npm build cannot run here. */
const SYSTEM_CHROMIUM = '/usr/bin/chromium';

/** A Chromium to start: its binary, what to add to its environment, and where it came from. */
export interface ChromiumBinary {
  readonly path: string;
  readonly env: Readonly<Record<string, string>>;
  readonly source: string;
}

/** Launch headless Chromium (see the file comment for which one, and its flags). */
export async function launchChromium(): Promise<Browser> {
  const exe = await chromiumBinary();
  const env: Record<string, string> = {};
  for (const [k, v] of Object.entries(process.env)) if (v !== undefined) env[k] = v;
  const { chromium } = await import('playwright-core');
  return chromium.launch({ executablePath: exe.path, args: [...CHROMIUM_ARGS], env: { ...env, ...exe.env } });
}

/** The Chromium this machine will use, unpacked if need be. */
export async function chromiumBinary(): Promise<ChromiumBinary> {
  const chosen = process.env.LW_CHROMIUM;
  if (chosen) {
    if (!existsSync(chosen)) throw new Error(`LW_CHROMIUM=${chosen}: no such file`);
    return { path: chosen, env: {}, source: `LW_CHROMIUM (${chosen})` };
  }
  if (process.platform === 'linux' && process.arch === 'x64') return npmChromium();
  if (existsSync(SYSTEM_CHROMIUM)) return { path: SYSTEM_CHROMIUM, env: {}, source: SYSTEM_CHROMIUM };
  throw new Error(
    `@sparticuz/chromium ships a Chromium for Linux on x86-64 only, and this is ${process.platform}-${process.arch} ` +
      `with no ${SYSTEM_CHROMIUM}: set LW_CHROMIUM to a Chromium binary. The browser tests do not skip.`,
  );
}

/** The npm package's Chromium, unpacked once per version (and user) into the temporary folder. */
async function npmChromium(): Promise<ChromiumBinary> {
  const entry = createRequire(import.meta.url).resolve('@sparticuz/chromium');
  const pkg = resolve(dirname(entry), '..', '..');
  const { version } = JSON.parse(readFileSync(join(pkg, 'package.json'), 'utf8')) as { version: string };
  const dir = join(tmpdir(), `latchwright-chromium-${version}-${process.getuid?.() ?? 0}`);
  if (!existsSync(join(dir, 'chromium'))) await unpack(join(pkg, 'bin'), dir);
  const libs = [join(dir, 'lib'), ...(process.env.LD_LIBRARY_PATH ?? '').split(':').filter(Boolean)];
  return {
    path: join(dir, 'chromium'),
    env: { LD_LIBRARY_PATH: libs.join(':'), FONTCONFIG_FILE: join(dir, 'fonts.conf') },
    source: `@sparticuz/chromium ${version} (${dir})`,
  };
}

/** Unpack the package's `bin` folder into `dir`: filled under another name, then renamed into place. */
async function unpack(bin: string, dir: string): Promise<void> {
  removeStale(dir);
  const part = mkdtempSync(`${dir}.part-`);
  try {
    await pipeline(
      createReadStream(join(bin, 'chromium.br')),
      createBrotliDecompress(),
      createWriteStream(join(part, 'chromium'), { mode: 0o755 }),
    );
    untar(brotliDecompressSync(readFileSync(join(bin, 'al2023.tar.br'))), part); // lib/: NSS, NSPR, expat
    untar(brotliDecompressSync(readFileSync(join(bin, 'fonts.tar.br'))), part); // fonts/Open_Sans/
    writeFileSync(
      join(part, 'fonts.conf'),
      [
        '<?xml version="1.0"?>',
        '<!DOCTYPE fontconfig SYSTEM "fonts.dtd">',
        '<fontconfig>',
        '  <include ignore_missing="yes">/etc/fonts/fonts.conf</include>',
        `  <dir>${join(dir, 'fonts')}</dir>`,
        `  <cachedir>${join(dir, 'fonts-cache')}</cachedir>`,
        '</fontconfig>',
        '',
      ].join('\n'),
    );
    try {
      renameSync(part, dir);
    } catch (e) {
      // Another run unpacked the same version first: use theirs.
      if (!existsSync(join(dir, 'chromium'))) throw e;
    }
  } finally {
    rmSync(part, { recursive: true, force: true });
  }
}

/** Remove half-filled folders that a stopped run left, once they are an hour old. */
function removeStale(dir: string): void {
  const parent = dirname(dir);
  const prefix = `${dir.slice(parent.length + 1)}.part-`;
  for (const name of readdirSync(parent)) {
    const path = join(parent, name);
    if (name.startsWith(prefix) && Date.now() - statSync(path).mtimeMs > 3_600_000)
      rmSync(path, { recursive: true, force: true });
  }
}

/** NUL-terminated ASCII field of a tar header. */
const field = (h: Buffer, at: number, length: number): string =>
  h
    .subarray(at, at + length)
    .toString('latin1')
    .replace(/\0[\s\S]*$/, '');

/**
 * Extract a tar archive (POSIX ustar and the GNU variant, IEEE Std 1003.1 `pax` format
 * description) of plain files and folders into `into`; anything else is an error.
 */
function untar(tar: Buffer, into: string): void {
  const root = resolve(into);
  for (let at = 0; at + 512 <= tar.length;) {
    const h = tar.subarray(at, at + 512);
    const name = field(h, 0, 100);
    if (name === '') break;
    const prefix = field(h, 257, 6) === 'ustar' ? field(h, 345, 155) : '';
    const size = parseInt(field(h, 124, 12).trim() || '0', 8);
    const type = String.fromCharCode(h[156] || 48);
    const target = resolve(root, prefix ? `${prefix}/${name}` : name);
    if (target !== root && !target.startsWith(root + sep)) throw new Error(`tar entry ${name} leaves ${root}`);
    if (type === '5') mkdirSync(target, { recursive: true });
    else if (type === '0') {
      mkdirSync(dirname(target), { recursive: true });
      writeFileSync(target, tar.subarray(at + 512, at + 512 + size), {
        mode: parseInt(field(h, 100, 8).trim() || '644', 8) & 0o777,
      });
    } else throw new Error(`tar entry ${name}: type '${type}' is not a file or a folder`);
    at += 512 + Math.ceil(size / 512) * 512;
  }
}
