/**
 * Node-side tooling for the browser tests and the browser benchmark: build the designer with
 * vite into a folder. Chromium itself is started by tests/web/chromium.ts.
 */
import { fileURLToPath } from 'node:url';

const CONFIG = fileURLToPath(new URL('../../vite.config.ts', import.meta.url));

/** Build the designer into `outDir` (production build, as `npm start` serves it). */
export async function buildDesigner(outDir: string): Promise<void> {
  const { build } = await import('vite');
  await build({ configFile: CONFIG, logLevel: 'error', build: { outDir, emptyOutDir: true, sourcemap: false } });
}
