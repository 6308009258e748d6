/** What the shell shows: the views in tab order, and small readings of the controllers' state. */
import type { Reading, BuildView } from '../worker/protocol.js';
import { Search, Work, type SynthesisController } from '../controllers/synthesis.js';

/** A function that returns its last result while its arguments are the same (by identity). */
export function remember<A extends readonly unknown[], R>(fn: (...args: A) => R): (...args: A) => R {
  let last: { args: A; result: R } | undefined;
  return (...args: A): R => {
    if (last && last.args.length === args.length && last.args.every((a, i) => a === args[i])) return last.result;
    last = { args, result: fn(...args) };
    return last.result;
  };
}

/** The views, in our own workshop words. */
export const VIEWS = [
  { id: 'sketch', label: 'Sketch' },
  { id: 'ledger', label: 'Ledger' },
  { id: 'codes', label: 'Code book' },
  { id: 'parts', label: 'Parts & forces' },
  { id: 'trial', label: 'Trial run' },
] as const;

export type ViewId = (typeof VIEWS)[number]['id'];

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

/** The status line in words, and its tone. */
export function statusWords(s: SynthesisController): { words: string; tone: 'busy' | 'ok' | 'bad' } {
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
    case Work.stopped:
      return { words: 'Code search stopped; the views show the last build', tone: 'bad' };
    case Work.checking:
      return { words: `Built · checking…${searching}`, tone: 'busy' };
    case Work.refused:
      return { words: `Fix the problems on the bench${searching}`, tone: 'bad' };
    case Work.failed:
      return { words: `Internal fault: ${s.fault ?? 'unknown'}`, tone: 'bad' };
    case Work.done: {
      const failing = s.checks?.checks.filter((c) => !c.ok).length ?? 0;
      return failing === 0
        ? { words: `Built · every check passes${searching}`, tone: 'ok' }
        : { words: `Built · ${failing} check${failing === 1 ? '' : 's'} failing${searching}`, tone: 'bad' };
    }
  }
}
