/** The CLI's window on the world, injectable so commands can be tested without a terminal. */
import { closeSync, constants, fstatSync, openSync, readSync, statSync } from 'node:fs';
import { availableParallelism } from 'node:os';

export interface CliIo {
  readonly out: (s: string) => void;
  readonly err: (s: string) => void;
  /** Read a file as UTF-8, or return an error message. */
  readonly readText: (path: string) => { text: string } | { error: string };
  /** True when standard input and output are a terminal (interactive stepping). */
  readonly interactive: boolean;
  /** Threads the encoding search may use (search-pool.ts); absent or 1: it runs on the command's own thread. */
  readonly threads?: number;
  /** Writes the progress line of long work (standard error, only when it is a terminal). */
  readonly progress?: (s: string) => void;
}

/**
 * The largest file a command reads: 16 MiB, far above the largest machine inside the limits of
 * docs/notation.md (a 4096-state table written one input combination per line is a few MB).
 */
export const MAX_READ_BYTES = 16 * 1024 * 1024;

/** The two output streams nodeIo writes to (injectable for tests). */
export interface OutputStreams {
  readonly stdout: NodeJS.WritableStream;
  readonly stderr: NodeJS.WritableStream;
}

const writers = new WeakMap<NodeJS.WritableStream, (s: string) => void>();

/**
 * A stream that stops quietly once its reader has gone (`latchwright build … | head -1`): the
 * broken pipe (EPIPE) is the reader's choice, not a fault, so later writes are dropped and the
 * command ends with the status its checks earned. Any other write error is thrown as before.
 */
function quietWriter(stream: NodeJS.WritableStream): (s: string) => void {
  // One writer (one listener) per stream, however often nodeIo is called.
  const known = writers.get(stream);
  if (known) return known;
  let closed = false;
  stream.on('error', (e: NodeJS.ErrnoException) => {
    // After a broken pipe, a write already under way may still fail ("stream destroyed").
    if (e.code !== 'EPIPE' && !closed) throw e;
    closed = true;
  });
  const write = (s: string): void => {
    if (!closed) stream.write(s);
  };
  writers.set(stream, write);
  return write;
}

export function nodeIo(streams: OutputStreams = process): CliIo {
  const err = quietWriter(streams.stderr);
  return {
    out: quietWriter(streams.stdout),
    err,
    readText,
    interactive: Boolean(process.stdin.isTTY && process.stdout.isTTY),
    threads: availableParallelism(),
    ...(process.stderr.isTTY ? { progress: err } : {}),
  };
}

/**
 * A file as UTF-8 text, read with a size cap. Only regular files are read: a folder, a device
 * (`/dev/zero` never ends) or a pipe (a FIFO with no writer blocks for ever) is refused before
 * any byte is read; the pipe is opened without waiting for a writer, so it cannot hang.
 */
export function readText(path: string, cap = MAX_READ_BYTES): { text: string } | { error: string } {
  let fd: number | undefined;
  try {
    const kind = notAFile(statSync(path), path);
    if (kind) return { error: kind };
    fd = openSync(path, constants.O_RDONLY | constants.O_NONBLOCK);
    const st = fstatSync(fd);
    const again = notAFile(st, path);
    if (again) return { error: again };
    if (st.size > cap) return { error: tooBig(path, cap) };
    const buf = Buffer.alloc(Math.min(cap + 1, st.size + 1));
    let got = 0;
    for (let n = 1; n > 0 && got < buf.length; got += n) n = readSync(fd, buf, got, buf.length - got, null);
    // A file that grew while being read is held to the same cap.
    if (got > cap) return { error: tooBig(path, cap) };
    return { text: buf.subarray(0, got).toString('utf8') };
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    return {
      error:
        code === 'ENOENT'
          ? `no such file: ${path}`
          : code === 'EISDIR'
            ? `${path} is a folder, not a file`
            : `cannot read ${path} (${code ?? 'error'})`,
    };
  } finally {
    if (fd !== undefined) closeSync(fd);
  }
}

/** Why a path that exists is not a file to read, if it is not. */
function notAFile(st: { isFile(): boolean; isDirectory(): boolean }, path: string): string | undefined {
  if (st.isFile()) return undefined;
  if (st.isDirectory()) return `${path} is a folder, not a file`;
  return `${path} is not a regular file (a device, a pipe or a socket): name a file`;
}

function tooBig(path: string, cap: number): string {
  return `${path} is larger than ${cap / (1024 * 1024)} MiB, more than any machine inside the tool's limits`;
}
