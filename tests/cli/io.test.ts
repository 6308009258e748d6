import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Writable } from 'node:stream';
import { describe, expect, it } from 'vitest';
import { nodeIo, readText } from '../../src/cli/io.js';
import { main } from '../../src/cli/main.js';

/** A stream whose reader has gone, as standard output is after `| head -1` ends: every write fails with EPIPE. */
class ClosedPipe extends Writable {
  writes = 0;
  override _write(_chunk: unknown, _enc: BufferEncoding, done: (e?: Error | null) => void): void {
    this.writes++;
    done(Object.assign(new Error('write EPIPE'), { code: 'EPIPE' }));
  }
}

/** A stream that keeps what it is given. */
class Kept extends Writable {
  text = '';
  override _write(chunk: Buffer, _enc: BufferEncoding, done: (e?: Error | null) => void): void {
    this.text += chunk.toString('utf8');
    done();
  }
}

const tick = (): Promise<void> => new Promise((r) => setImmediate(r));

describe('cli/io', () => {
  it('ends quietly with the status the checks earned when standard output is closed early', async () => {
    const stdout = new ClosedPipe();
    const stderr = new Kept();
    const io = nodeIo({ stdout, stderr });
    // The first write fails; the error arrives later, as from a real pipe, and must not escape.
    io.out('first line\n');
    await tick();
    const code = await main(['build', 'examples/marble-bell.lw', '--encoding', 'binary'], io);
    await tick();
    expect(code).toBe(0);
    expect(stdout.writes).toBe(1);
    expect(stderr.text).toBe('');
    // A build whose checks fail keeps its status (1), whether or not anyone reads the report.
    const failing = await main(
      ['build', 'examples/marble-bell.lw', '--encoding', 'binary', '--profile', 'examples/profiles/slippery-cord.json'],
      io,
    );
    expect(failing).toBe(1);
  });

  it('writes through while the reader is there', () => {
    const stdout = new Kept();
    const io = nodeIo({ stdout, stderr: new Kept() });
    io.out('a');
    io.out('b\n');
    expect(stdout.text).toBe('ab\n');
  });

  describe('readText', () => {
    it('reads a regular file, and refuses one past the size cap before reading it', () => {
      const dir = mkdtempSync(join(tmpdir(), 'lw-io-'));
      try {
        const file = join(dir, 'm.lw');
        writeFileSync(file, 'machine m\n');
        expect(readText(file)).toEqual({ text: 'machine m\n' });
        const refused = readText(file, 4);
        expect('error' in refused && refused.error).toMatch(/larger than/);
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
    });

    it('refuses a device that never ends (/dev/zero) and a folder, at once', () => {
      const zero = readText('/dev/zero');
      expect('error' in zero && zero.error).toMatch(/not a regular file/);
      const folder = readText('examples');
      expect('error' in folder && folder.error).toMatch(/is a folder/);
    });

    it.runIf(process.platform !== 'win32')('refuses a named pipe with no writer instead of waiting for one', () => {
      const dir = mkdtempSync(join(tmpdir(), 'lw-io-'));
      try {
        const fifo = join(dir, 'pipe');
        execFileSync('mkfifo', [fifo]);
        const r = readText(fifo);
        expect('error' in r && r.error).toMatch(/not a regular file/);
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
    });
  });
});
