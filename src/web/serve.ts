/**
 * A small static file server for the built designer (dist/web), on 127.0.0.1 only. Used by
 * `npm start`, the browser tests and the browser benchmark. Serves files below its folder and
 * nothing else (paths are resolved and checked against the folder), with the media types a
 * module worker needs. A request it cannot read (a path that is not valid percent-encoding,
 * which any web page could send) gets 400 and the server stays up; any other fault in one
 * request gets 500, never a crash.
 *
 *   node --import tsx src/web/serve.ts [--port 5178] [--dir dist/web]
 *
 * When the port is taken, the next free one above it is used (up to PORT_TRIES ports), and the
 * address printed says which.
 */
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
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

/** How many ports, from the one asked for, are tried before giving up. */
export const PORT_TRIES = 20;

const PLAIN = { 'content-type': 'text/plain; charset=utf-8' } as const;

/** The path asked for, decoded; undefined when the request line cannot be read as one. */
function requestPath(url: string | undefined): string | undefined {
  try {
    const path = decodeURIComponent(new URL(url ?? '/', 'http://127.0.0.1').pathname);
    return path.includes('\0') ? undefined : path;
  } catch {
    return undefined;
  }
}

/** Answer one request from the folder `root`. */
async function answer(root: string, req: IncomingMessage, res: ServerResponse): Promise<void> {
  const path = requestPath(req.url);
  if (path === undefined) {
    res.writeHead(400, PLAIN).end('bad request: the path is not valid percent-encoding');
    return;
  }
  let file = resolve(join(root, path));
  if (file !== root && !file.startsWith(root + sep)) {
    res.writeHead(403, PLAIN).end('outside the served folder');
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
    res.writeHead(404, PLAIN).end('not found');
  }
}

/** Serve `dir` on 127.0.0.1 at `port` (0: any free port); fails with EADDRINUSE when it is taken. */
export async function serveStatic(dir: string, port = 0): Promise<Served> {
  const root = resolve(dir);
  const server: Server = createServer((req, res) => {
    answer(root, req, res).catch(() => {
      if (!res.headersSent) res.writeHead(500, PLAIN);
      res.end('the server could not answer this request');
    });
  });
  // A broken connection (a client that hangs up mid-request) is that client's problem, not the server's.
  server.on('clientError', (_e, socket) => socket.destroy());
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

/** Serve `dir` at `port`, or at the next free port above it (PORT_TRIES in all). */
export async function serveFrom(dir: string, port: number): Promise<Served> {
  for (let p = port; ; p++) {
    try {
      return await serveStatic(dir, p);
    } catch (e) {
      const taken = (e as NodeJS.ErrnoException).code === 'EADDRINUSE';
      if (!taken || p >= port + PORT_TRIES - 1 || p >= 65535) throw e;
    }
  }
}

/** The folder the build writes to (vite.config.ts). */
export const BUILT_DIR = fileURLToPath(new URL('../../dist/web', import.meta.url));

async function main(argv: readonly string[]): Promise<void> {
  const flag = (name: string): string | undefined => {
    const i = argv.indexOf(`--${name}`);
    return i >= 0 ? argv[i + 1] : undefined;
  };
  // The designer's port when none is given (vite.config.ts uses the same one for development).
  const port = Number(flag('port') ?? 5178);
  const dir = flag('dir') ?? BUILT_DIR;
  const fail = (words: string): void => {
    process.stderr.write(`latchwright: ${words}\n`);
    process.exitCode = 2;
  };
  if (!Number.isInteger(port) || port < 1 || port > 65535)
    return fail(`--port ${flag('port')} is not a port number (1–65535)`);
  try {
    await stat(join(dir, 'index.html'));
  } catch {
    return fail(`no built designer in ${dir}; run \`npx vite build\` first.`);
  }
  try {
    const s = await serveFrom(dir, port);
    const moved = s.port !== port ? ` (port ${port} was taken)` : '';
    process.stdout.write(`Latchwright designer: ${s.url}${moved}\n(Ctrl+C stops it.)\n`);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    fail(
      code === 'EADDRINUSE'
        ? `ports ${port}–${port + PORT_TRIES - 1} are all taken; give another with --port N`
        : `cannot serve the designer (${code ?? (e instanceof Error ? e.message : String(e))})`,
    );
  }
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) void main(process.argv.slice(2));
