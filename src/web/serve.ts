/**
 * A small static file server for the built designer (dist/web), on 127.0.0.1 only. Used by
 * `npm start`, the browser tests and the browser benchmark. Serves files below its folder and
 * nothing else (paths are resolved and checked against the folder), with the media types a
 * module worker needs.
 *
 *   node --import tsx src/web/serve.ts [--port 5178] [--dir dist/web]
 */
import { createServer, type Server } from 'node:http';
import { readFile, stat } from 'node:fs/promises';
import { extname, join, resolve, sep } from 'node:path';
import { fileURLToPath } from 'node:url';

const TYPES: Readonly<Record<string, string>> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.json': 'application/json',
  '.map': 'application/json',
  '.png': 'image/png',
  '.ico': 'image/x-icon',
  '.txt': 'text/plain; charset=utf-8',
};

export interface Served {
  readonly url: string;
  readonly port: number;
  close(): Promise<void>;
}

/** Serve `dir` on 127.0.0.1 at `port` (0: any free port). */
export async function serveStatic(dir: string, port = 0): Promise<Served> {
  const root = resolve(dir);
  const server: Server = createServer((req, res) => {
    void (async () => {
      const path = decodeURIComponent(new URL(req.url ?? '/', 'http://127.0.0.1').pathname);
      let file = resolve(join(root, path));
      if (file !== root && !file.startsWith(root + sep)) {
        res.writeHead(403).end('outside the served folder');
        return;
      }
      try {
        if ((await stat(file)).isDirectory()) file = join(file, 'index.html');
        const body = await readFile(file);
        res.writeHead(200, {
          'content-type': TYPES[extname(file)] ?? 'application/octet-stream',
          'cache-control': 'no-cache',
        });
        res.end(req.method === 'HEAD' ? undefined : body);
      } catch {
        res.writeHead(404, { 'content-type': 'text/plain; charset=utf-8' }).end('not found');
      }
    })();
  });
  await new Promise<void>((ok, fail) => {
    server.once('error', fail);
    server.listen(port, '127.0.0.1', () => ok());
  });
  const address = server.address();
  const actual = typeof address === 'object' && address ? address.port : port;
  return {
    url: `http://127.0.0.1:${actual}/`,
    port: actual,
    close: () => new Promise<void>((ok) => server.close(() => ok())),
  };
}

/** The folder the build writes to (vite.config.ts). */
export const BUILT_DIR = fileURLToPath(new URL('../../dist/web', import.meta.url));

async function main(argv: readonly string[]): Promise<void> {
  const flag = (name: string): string | undefined => {
    const i = argv.indexOf(`--${name}`);
    return i >= 0 ? argv[i + 1] : undefined;
  };
  const port = Number(flag('port') ?? 5178);
  const dir = flag('dir') ?? BUILT_DIR;
  try {
    await stat(join(dir, 'index.html'));
  } catch {
    process.stderr.write(`latchwright: no built designer in ${dir}; run \`npx vite build\` first.\n`);
    process.exitCode = 2;
    return;
  }
  const s = await serveStatic(dir, port);
  process.stdout.write(`Latchwright designer: ${s.url}\n(Ctrl+C stops it.)\n`);
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) void main(process.argv.slice(2));
