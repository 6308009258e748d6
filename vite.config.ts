/**
 * Vite configuration of the web designer (src/web). The app is built into dist/web as plain
 * static files with relative paths, so any static server (src/web/serve.ts) can serve it.
 * Synthesis runs in module workers (src/web/worker.ts).
 */
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vite';

const here = (p: string): string => fileURLToPath(new URL(p, import.meta.url));

export default defineConfig({
  root: here('./src/web'),
  base: './',
  publicDir: here('./public'),
  build: {
    outDir: here('./dist/web'),
    emptyOutDir: true,
    target: 'es2022',
    sourcemap: true,
    chunkSizeWarningLimit: 2000,
  },
  worker: { format: 'es' },
  // The dev server may read the example machines and the core above src/web.
  server: { host: '127.0.0.1', port: 5178, strictPort: true, fs: { allow: [here('.')] } },
  preview: { host: '127.0.0.1', port: 5178, strictPort: true },
});
