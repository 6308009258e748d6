/**
 * Edits made in the state ledger, turned into small edits of the text at the places the
 * parser recorded (line and column of each guard, target and statement), so the rest of the
 * text — comments, layout, order — stays exactly as the user wrote it. Pure.
 */
import type { State, Transition } from '../../core/index.js';
import { lineStarts, offsetOf } from './text-marks.js';

/** Replace text[from, to) by `insert`. */
export interface TextEdit {
  readonly from: number;
  readonly to: number;
  readonly insert: string;
}

export function applyEdit(text: string, e: TextEdit): string {
  return text.slice(0, e.from) + e.insert + text.slice(e.to);
}

/** Offset of a parser location in the text form, if it has a line. */
function at(text: string, loc: { line?: number; column?: number } | undefined): number | undefined {
  return loc?.line === undefined ? undefined : offsetOf(text, loc.line, loc.column ?? 1);
}

/** Send a transition to another state. */
export function retarget(text: string, t: Transition, to: string): TextEdit | undefined {
  const from = at(text, t.partLocs?.to);
  if (from === undefined) return undefined;
  return { from, to: from + t.to.length, insert: to };
}

/** Give a transition another guard; an empty guard (or 1) makes it always fire. */
export function reguard(text: string, t: Transition, guard: string): TextEdit | undefined {
  const stmt = at(text, t.loc);
  if (stmt === undefined) return undefined;
  const g = guard.trim();
  const always = g === '' || g === '1';
  if (!text.startsWith('when', stmt)) return always ? undefined : { from: stmt, to: stmt, insert: `when ${g} ` };
  const from = at(text, t.when.loc);
  if (from === undefined) return undefined;
  const end = from + t.when.text.length;
  if (!always) return { from, to: end, insert: g };
  let to = end;
  while (text[to] === ' ' || text[to] === '\t') to++;
  return { from: stmt, to, insert: '' };
}

/** Add a transition at the end of a state's list. */
export function addTransition(text: string, s: State, to: string, guard = ''): TextEdit | undefined {
  const lines = [s.loc?.line, ...s.transitions.map((t) => t.loc?.line)].filter((l): l is number => l !== undefined);
  if (lines.length === 0) return undefined;
  const last = Math.max(...lines);
  const starts = lineStarts(text);
  const end =
    last < starts.length
      ? starts[last] - (text[starts[last] - 2] === '\r' && text[starts[last] - 1] === '\n' ? 2 : 1)
      : text.length;
  const g = guard.trim();
  return { from: end, to: end, insert: `\n  ${g && g !== '1' ? `when ${g} ` : ''}go ${to}` };
}

/** Add a new state (with no transitions) at the end of the text. */
export function addState(text: string, name: string): TextEdit {
  const gap = text.endsWith('\n\n') ? '' : text.endsWith('\n') ? '\n' : '\n\n';
  return { from: text.length, to: text.length, insert: `${gap}state ${name}\n` };
}
