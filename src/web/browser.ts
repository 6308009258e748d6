/**
 * Node-side tooling for the browser tests and the browser benchmark: build the designer with
 * vite into a folder, and start Debian's chromium headless (no GPU, no network chatter).
 * A missing chromium is an error with a clear message, never a silent skip.
 */
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import type { Browser } from 'playwright-core';

/** Where Debian (and the CI image) installs chromium. */
export const CHROMIUM_PATH = '/usr/bin/chromium';

export const CHROMIUM_ARGS: readonly string[] = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--disable-quic',
  '--no-first-run',
];

const CONFIG = fileURLToPath(new URL('../../vite.config.ts', import.meta.url));

/** Build the designer into `outDir` (production build, as `npm start` serves it). */
export async function buildDesigner(outDir: string): Promise<void> {
  const { build } = await import('vite');
  await build({ configFile: CONFIG, logLevel: 'error', build: { outDir, emptyOutDir: true, sourcemap: false } });
}

/** Launch chromium headless; throws with what to install when it is missing. */
export async function launchChromium(): Promise<Browser> {
  if (!existsSync(CHROMIUM_PATH)) {
    throw new Error(
      `chromium is not installed at ${CHROMIUM_PATH}: the browser tests need it (Debian: apt-get install chromium). They do not skip.`,
    );
  }
  const { chromium } = await import('playwright-core');
  return chromium.launch({ executablePath: CHROMIUM_PATH, args: [...CHROMIUM_ARGS] });
}
