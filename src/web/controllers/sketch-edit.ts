/**
 * Edits drawn in the sketch, turned into small edits of the text at the places the parser
 * recorded (the same way as the ledger's, table-edit.ts): rename a state with every reference
 * to it, make a state the start, set or clear a state's outputs, delete a transition or a
 * state. An edit that touches several places is one edit of the span between them, so it is
 * undone in one step; everything outside the places changed stays as the user wrote it. Pure.
 *
 * Whether an edit is acceptable is asked of the core itself (`trialEdit`): the edited text is
 * read and validated as any text is, and the first error it would have is the reason given.
 */
import { analyse, type Machine, type SourceLoc, type State, type Transition } from '../../core/index.js';
import { lineStarts, offsetOf } from './text-marks.js';
import { applyEdit, type TextEdit } from './table-edit.js';

/** Offset of a parser location in the text form, if it has a line. */
function at(text: string, loc: SourceLoc | undefined): number | undefined {
  return loc?.line === undefined ? undefined : offsetOf(text, loc.line, loc.column ?? 1);
}

/**
 * Several edits of one text as one: the span from the first to the last, with the text between
 * them kept. Undefined when any is missing or two overlap.
 */
export function joinEdits(text: string, edits: readonly (TextEdit | undefined)[]): TextEdit | undefined {
  if (edits.length === 0 || edits.some((e) => e === undefined)) return undefined;
  const sorted = [...(edits as TextEdit[])].sort((a, b) => a.from - b.from || a.to - b.to);
  let insert = '';
  let pos = sorted[0].from;
  for (const e of sorted) {
    if (e.from < pos) return undefined;
    insert += text.slice(pos, e.from) + e.insert;
    pos = e.to;
  }
  return { from: sorted[0].from, to: pos, insert };
}

/** Replace the name written at `loc` (which reads `name`). */
function nameAt(text: string, loc: SourceLoc | undefined, name: string, by: string): TextEdit | undefined {
  const from = at(text, loc);
  if (from === undefined || text.slice(from, from + name.length) !== name) return undefined;
  return { from, to: from + name.length, insert: by };
}

/** Rename a state: its declaration, the start line when it is the start, and every transition into it. */
export function renameState(text: string, m: Machine, old: string, name: string): TextEdit | undefined {
  const s = m.states.find((x) => x.name === old);
  if (!s || name === old) return undefined;
  const edits = [nameAt(text, s.partLocs?.name, old, name)];
  if (m.start === old) edits.push(nameAt(text, m.partLocs?.start, old, name));
  for (const x of m.states)
    for (const t of x.transitions) if (t.to === old) edits.push(nameAt(text, t.partLocs?.to, old, name));
  return joinEdits(text, edits);
}

/** Make another state the start (the `start` line names it). */
export function setStart(text: string, m: Machine, name: string): TextEdit | undefined {
  if (m.start === name || !m.states.some((s) => s.name === name)) return undefined;
  return nameAt(text, m.partLocs?.start, m.start, name);
}

/** The span of a 1-based line with its line break (or, for a last line with none, the break before it). */
function lineRange(text: string, starts: readonly number[], line: number): TextEdit | undefined {
  if (line < 1 || line > starts.length) return undefined;
  if (line < starts.length) return { from: starts[line - 1], to: starts[line], insert: '' };
  const from = line > 1 ? starts[line - 1] - (text.slice(0, starts[line - 1]).endsWith('\r\n') ? 2 : 1) : 0;
  return { from, to: text.length, insert: '' };
}

/** Remove whole lines (1-based), as one edit. */
function removeLines(text: string, lines: Iterable<number>): TextEdit | undefined {
  const starts = lineStarts(text);
  const ranges: TextEdit[] = [];
  for (const l of [...new Set(lines)].sort((a, b) => a - b)) {
    const r = lineRange(text, starts, l);
    if (!r) return undefined;
    const prev = ranges[ranges.length - 1];
    if (prev && r.from <= prev.to) ranges[ranges.length - 1] = { ...prev, to: Math.max(prev.to, r.to) };
    else ranges.push(r);
  }
  return joinEdits(text, ranges);
}

/** Delete a transition (its line). */
export function deleteTransition(text: string, t: Transition): TextEdit | undefined {
  return t.loc?.line === undefined ? undefined : removeLines(text, [t.loc.line]);
}

/** A state's deletion: the edit, and the transitions of other states that went with it (they led into it). */
export interface StateDeletion {
  readonly edit: TextEdit;
  readonly into: readonly { readonly from: string; readonly transition: Transition }[];
}

const blank = (text: string, line: number): boolean => {
  const starts = lineStarts(text);
  if (line < 1 || line > starts.length) return true;
  return text.slice(starts[line - 1], line < starts.length ? starts[line] : text.length).trim() === '';
};

/**
 * Delete a state: its line, its transitions' lines and the lines of every transition into it
 * (reported in `into`). Comment lines stay. When its block stood between blank lines, one of
 * them goes too. The start state is not deleted (undefined): make another state the start first.
 */
export function deleteState(text: string, m: Machine, name: string): StateDeletion | undefined {
  const s = m.states.find((x) => x.name === name);
  if (!s || m.start === name || s.loc?.line === undefined) return undefined;
  const into = m.states
    .filter((x) => x.name !== name)
    .flatMap((x) => x.transitions.filter((t) => t.to === name).map((t) => ({ from: x.name, transition: t })));
  const lines = new Set<number>([s.loc.line]);
  for (const t of [...s.transitions, ...into.map((i) => i.transition)]) {
    if (t.loc?.line === undefined) return undefined;
    lines.add(t.loc.line);
  }
  const last = Math.max(s.loc.line, ...s.transitions.map((t) => t.loc?.line ?? 0));
  const count = lineStarts(text).length;
  // Keep one blank line between the blocks around it (or none after the last block).
  const before = s.loc.line - 1;
  if (before >= 1 && blank(text, before)) {
    const atEnd = Array.from({ length: count - last }, (_, i) => last + 1 + i).every((l) => blank(text, l));
    if (atEnd) lines.add(before);
    else if (blank(text, last + 1)) lines.add(last + 1);
  }
  const edit = removeLines(text, lines);
  return edit ? { edit, into } : undefined;
}

/** Where a state's `with …` part is written: [from, to) with any blanks before it, or undefined when it has none. */
function withSpan(text: string, s: State): { from: number; to: number } | undefined {
  const keys = Object.keys(s.partLocs ?? {}).filter((k) => k.startsWith('out:'));
  if (keys.length === 0) return undefined;
  let first = Infinity;
  let end = -1;
  for (const k of keys) {
    const p = at(text, s.partLocs?.[k]);
    if (p === undefined) return undefined;
    first = Math.min(first, p);
    const value = /^\s*=\s*[01-]/.exec(text.slice(p + k.length - 4));
    if (!value) return undefined;
    end = Math.max(end, p + k.length - 4 + value[0].length);
  }
  let w = first;
  while (w > 0 && (text[w - 1] === ' ' || text[w - 1] === '\t')) w--;
  if (text.slice(w - 4, w) !== 'with') return undefined;
  let from = w - 4;
  while (from > 0 && (text[from - 1] === ' ' || text[from - 1] === '\t')) from--;
  return { from, to: end };
}

/**
 * Set a state's outputs to `outs`, written as after `with` in the text (`lamp=1, bell=-`); an
 * empty `outs` clears them. The rest of the state's line (code, final, comment) stays.
 */
export function setOutputs(text: string, s: State, outs: string): TextEdit | undefined {
  const words = outs.trim().replace(/^with\s+/, '');
  const span = withSpan(text, s);
  if (span) return { ...span, insert: words ? ` with ${words}` : '' };
  if (!words) return undefined;
  const name = at(text, s.partLocs?.name);
  if (name === undefined) return undefined;
  const after = name + s.name.length;
  return { from: after, to: after, insert: ` with ${words}` };
}

/** A state's outputs as the text form writes them after `with` (only those written). */
export function outputsText(s: State, order: readonly string[]): string {
  const written = Object.keys(s.outputs);
  const names = [...order.filter((o) => written.includes(o)), ...written.filter((o) => !order.includes(o))];
  return names.map((o) => `${o}=${s.outputs[o]}`).join(', ');
}

/** What the edited text would be, or why it is refused: the first error the core finds in it. */
export type Trial = { readonly ok: true; readonly text: string } | { readonly ok: false; readonly problem: string };

export function trialEdit(text: string, edit: TextEdit | undefined): Trial {
  if (!edit) return { ok: false, problem: 'This cannot be drawn here: edit it in the text.' };
  const next = applyEdit(text, edit);
  const read = analyse(next);
  const err = read.diagnostics.find((d) => d.severity === 'error');
  if (!err) return { ok: true, text: next };
  const hint = err.hint ? ` — ${err.hint}` : '';
  return { ok: false, problem: `${err.code}: ${err.message}${hint}` };
}
