/** What the shell shows: the views in tab order, and small readings of the controllers' state. */
import type { Diagnostic } from '../../core/index.js';
import type { Reading, BuildView } from '../worker/protocol.js';
import { isDefault, Search, Work, type SynthesisController } from '../controllers/synthesis.js';

/** A function that returns its last result while its arguments are the same (by identity). */
export function remember<A extends readonly unknown[], R>(fn: (...args: A) => R): (...args: A) => R {
  let last: { args: A; result: R } | undefined;
  return (...args: A): R => {
    if (last && last.args.length === args.length && last.args.every((a, i) => a === args[i])) return last.result;
    last = { args, result: fn(...args) };
    return last.result;
  };
}

/**
 * The views, in our own workshop words, in tab order. Adding a view is one entry here and one
 * renderer in <lw-app>'s table of views (the compiler asks for it).
 */
export const VIEWS = [
  { id: 'sketch', label: 'Sketch' },
  { id: 'ledger', label: 'Ledger' },
  { id: 'codes', label: 'Code book' },
  { id: 'parts', label: 'Parts & forces' },
  { id: 'frame', label: 'Frame & cords' },
  { id: 'trial', label: 'Trial run' },
  { id: 'shakedown', label: 'Shakedown' },
  { id: 'workshop', label: 'Shop' },
] as const;

export type ViewId = (typeof VIEWS)[number]['id'];

/** A stored view name, if it is one of the views. */
export const parseView = (raw: string): ViewId | undefined => VIEWS.find((v) => v.id === raw)?.id;

/** Diagnostics with the bench's file name where they name no file (so none reads `<input>`). */
export function withFile(ds: readonly Diagnostic[], file: string): readonly Diagnostic[] {
  return ds.map((d) => (d.location.file === undefined ? { ...d, location: { ...d.location, file } } : d));
}

/** The code of every state as written, through the state it was merged into. */
export function codesByState(r: Reading | undefined, b: BuildView | undefined): Record<string, string> {
  const out: Record<string, string> = {};
  if (!r?.merged || !b) return out;
  const f = b.build.machine;
  for (const [orig, reduced] of Object.entries(r.merged)) {
    const i = f.states.indexOf(reduced);
    const code = i >= 0 ? b.build.encoding.codes[i] : undefined;
    if (code !== undefined && code !== '') out[orig] = code;
  }
  return out;
}

/** The states as written that stand for the reduced state the machine is in. */
export function litStates(r: Reading | undefined, state: string | null): Set<string> {
  if (!r?.merged || state === null) return new Set();
  return new Set(Object.entries(r.merged).flatMap(([orig, reduced]) => (reduced === state ? [orig] : [])));
}

/** The status line's tone: busy, all good, warnings to read (amber), or something failing. */
export type Tone = 'busy' | 'ok' | 'warn' | 'bad';

/** The status line in words, and its tone; `warnings` counts the warnings of the text and the build. */
export function statusWords(s: SynthesisController, warnings = 0): { words: string; tone: Tone } {
  const searching = s.search === Search.running ? ' · pricing encodings' : '';
  const p = s.buildProgress;
  switch (s.work) {
    case Work.reading:
      return { words: `Reading…${searching}`, tone: 'busy' };
    case Work.building:
      return {
        words: p
          ? `Searching codes: ${p.done}${p.total !== null ? ` of ${p.total}` : ''} priced, best cost ${p.best}`
          : `Building…${searching}`,
        tone: 'busy',
      };
    case Work.drafted:
      return {
        words: `Draft build shown · choosing its codes${p ? `: ${p.done}${p.total !== null ? ` of ${p.total}` : ''} priced, best cost ${p.best}` : '…'}${searching}`,
        tone: 'busy',
      };
    case Work.stopped:
      return {
        words: s.provisional
          ? 'Code search stopped; the views show the draft build (stand-in codes, not checked)'
          : 'Code search stopped; the views show the last build',
        tone: 'bad',
      };
    case Work.checking:
      return { words: `Built · checking…${searching}`, tone: 'busy' };
    case Work.refused:
      return { words: `Fix the problems on the bench${searching}`, tone: 'bad' };
    case Work.failed:
      return { words: `Internal fault: ${s.fault ?? 'unknown'}`, tone: 'bad' };
    case Work.done: {
      const failing = s.checks?.checks.filter((c) => !c.ok).length ?? 0;
      const warned = warnings > 0 ? ` · ${warnings} warning${warnings === 1 ? '' : 's'}` : '';
      const own = isDefault(s.settings) ? '' : ' · own settings';
      if (failing > 0)
        return {
          words: `Built · ${failing} check${failing === 1 ? '' : 's'} failing${warned}${own}${searching}`,
          tone: 'bad',
        };
      return { words: `Built · every check passes${warned}${own}${searching}`, tone: warnings > 0 ? 'warn' : 'ok' };
    }
  }
}
