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

/** Streams whose reader went away (`latchwright … | head`): nothing more is written to them. */
const closed = new Set<NodeJS.WriteStream>();
let watching = false;

/**
 * A reader that stops reading (EPIPE) ends our output there, quietly, as for any command in a
 * pipe; without a listener Node would throw the stream's error with a stack trace.
 */
function watchStreams(): void {
  if (watching) return;
  watching = true;
  for (const stream of [process.stdout, process.stderr]) {
    stream.on('error', (e: NodeJS.ErrnoException) => {
      closed.add(stream);
      if (e.code !== 'EPIPE' && stream === process.stdout && !closed.has(process.stderr))
        process.stderr.write(`latchwright: standard output failed (${e.code ?? e.message})\n`);
    });
  }
}

function write(stream: NodeJS.WriteStream, s: string): void {
  if (!closed.has(stream)) stream.write(s);
}

export function nodeIo(): CliIo {
  watchStreams();
  return {
    out: (s) => write(process.stdout, s),
    err: (s) => write(process.stderr, s),
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
