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

export function nodeIo(): CliIo {
  return {
    out: (s) => void process.stdout.write(s),
    err: (s) => void process.stderr.write(s),
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
