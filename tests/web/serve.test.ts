/**
 * The designer's static server: files below its folder and nothing else, 400 for a request
 * path that is not valid percent-encoding (RFC 3986 §2.1: a `%` must be followed by two hex
 * digits, and the bytes must decode as UTF-8), and the next free port when the one asked for
 * is taken.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { spawn } from 'node:child_process';
import { request } from 'node:http';
import { createServer, type Server } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { PORT_TRIES, serveFrom, serveStatic, type Served } from '../../src/web/serve.js';

let dir: string;
let served: Served;

/** One raw GET (the path sent exactly as given, no client-side normalisation). */
function get(port: number, path: string): Promise<{ status: number; body: string }> {
  return new Promise((ok, fail) => {
    const req = request({ host: '127.0.0.1', port, path, method: 'GET' }, (res) => {
      let body = '';
      res.setEncoding('utf8');
      res.on('data', (c: string) => (body += c));
      res.on('end', () => ok({ status: res.statusCode ?? 0, body }));
    });
    req.on('error', fail);
    req.end();
  });
}

/** Hold a port as another program would. */
function occupy(port: number): Promise<Server> {
  return new Promise((ok, fail) => {
    const s = createServer();
    s.once('error', fail);
    s.listen(port, '127.0.0.1', () => ok(s));
  });
}

describe('src/web/serve', () => {
  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'lw-serve-'));
    writeFileSync(join(dir, 'index.html'), '<!doctype html><title>t</title>');
    served = await serveStatic(dir);
  });

  afterAll(async () => {
    await served.close();
    rmSync(dir, { recursive: true, force: true });
  });

  it('serves the folder and refuses what is outside it', async () => {
    expect((await get(served.port, '/')).status).toBe(200);
    expect((await get(served.port, '/index.html')).status).toBe(200);
    expect((await get(served.port, '/nothing.js')).status).toBe(404);
    expect((await get(served.port, '/%2e%2e/%2e%2e/etc/passwd')).status).not.toBe(200);
  });

  it('answers a path that is not valid percent-encoding with 400, and stays up', async () => {
    for (const bad of ['/%E0%A4%A', '/%', '/%zz', '/%C0%AF', '/a%00b']) {
      const r = await get(served.port, bad);
      expect(r.status, bad).toBe(400);
    }
    expect((await get(served.port, '/')).status).toBe(200);
  });

  it('moves to the next free port when the one asked for is taken', async () => {
    const probe = await serveStatic(dir);
    const port = probe.port;
    await probe.close();
    const holder = await occupy(port);
    try {
      const s = await serveFrom(dir, port);
      expect(s.port).toBeGreaterThan(port);
      expect(s.port).toBeLessThan(port + PORT_TRIES);
      expect((await get(s.port, '/')).status).toBe(200);
      await s.close();
    } finally {
      await new Promise<void>((ok) => holder.close(() => ok()));
    }
  });

  it('as a command (npm start), prints the address it took when its port is taken', async () => {
    const probe = await serveStatic(dir);
    const port = probe.port;
    await probe.close();
    const holder = await occupy(port);
    const child = spawn(process.execPath, [
      '--import',
      'tsx',
      'src/web/serve.ts',
      '--port',
      String(port),
      '--dir',
      dir,
    ]);
    try {
      const line = await new Promise<string>((ok, fail) => {
        let out = '';
        child.stdout.setEncoding('utf8');
        child.stdout.on('data', (c: string) => {
          out += c;
          if (out.includes('\n')) ok(out.split('\n')[0]);
        });
        child.on('exit', (code) => fail(new Error(`the server ended (${code}): ${out}`)));
      });
      const m = /^Latchwright designer: http:\/\/127\.0\.0\.1:(\d+)\/ \(port (\d+) was taken\)$/.exec(line);
      expect(m, line).not.toBeNull();
      expect(Number(m?.[2])).toBe(port);
      expect((await get(Number(m?.[1]), '/')).status).toBe(200);
    } finally {
      child.kill();
      await new Promise<void>((ok) => holder.close(() => ok()));
    }
  });
});
