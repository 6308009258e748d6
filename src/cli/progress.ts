/**
 * The progress line of long work, on standard error when it is a terminal: the phase under
 * way, and for the encoding search how many candidates were looked at and the best cost so
 * far. Redrawn in place (carriage return, erase to the end of the line) at most ten times a
 * second, and erased when the work is done, so it never mixes with the report.
 */
import type { Progress } from '../core/index.js';

export interface ProgressLine {
  /** A phase started. */
  readonly phase: (name: string) => void;
  /** The encoding search moved on. */
  readonly search: (p: Progress) => void;
  /** Erase the line. */
  readonly done: () => void;
}

const PHASE_WORDS: Readonly<Record<string, string>> = {
  encode: 'searching state codes',
  synthesise: 'synthesising',
  check: 'checking',
};

/** A progress line drawn with `write`; `now` in milliseconds. */
export function progressLine(write: (s: string) => void, now: () => number = Date.now): ProgressLine {
  let last = -Infinity;
  let shown = false;
  const draw = (text: string, force: boolean): void => {
    const t = now();
    if (!force && t - last < 100) return;
    last = t;
    shown = true;
    write(`\r\x1b[K${text}`);
  };
  return {
    phase: (name) => draw(`latchwright: ${PHASE_WORDS[name] ?? name}…`, true),
    search: (p) => draw(`latchwright: ${searchWords(p)}`, false),
    done: () => {
      if (shown) write('\r\x1b[K');
      shown = false;
    },
  };
}

/** "searching state codes: 120 of 400 looked at (30 %), best cost 3077". */
export function searchWords(p: Progress): string {
  const of = p.total !== null && p.total > 0 ? ` of ${p.total}` : '';
  const share = p.total !== null && p.total > 0 ? ` (${Math.min(100, Math.round((100 * p.done) / p.total))} %)` : '';
  const best = Number.isFinite(p.best) ? `, best cost ${p.best}` : '';
  return `searching state codes: ${p.done}${of} looked at${share}${best}`;
}
