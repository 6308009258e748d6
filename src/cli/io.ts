/** The CLI's window on the world, injectable so commands can be tested without a terminal. */
import { readFileSync } from 'node:fs';

export interface CliIo {
  readonly out: (s: string) => void;
  readonly err: (s: string) => void;
  /** Read a file as UTF-8, or return an error message. */
  readonly readText: (path: string) => { text: string } | { error: string };
  /** True when standard input and output are a terminal (interactive stepping). */
  readonly interactive: boolean;
}

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
  return {
    out: quietWriter(streams.stdout),
    err: quietWriter(streams.stderr),
    readText(path) {
      try {
        return { text: readFileSync(path, 'utf8') };
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
      }
    },
    interactive: Boolean(process.stdin.isTTY && process.stdout.isTTY),
  };
}
