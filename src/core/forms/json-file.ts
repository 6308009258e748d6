/**
 * Reading a JSON file as the user wrote it — a machine, an xstate configuration, a technology
 * profile or a step input sequence:
 * - a UTF-8 byte order mark at the start is skipped (RFC 8259 §8.1 lets a reader ignore it);
 * - a syntax error is LW100 at its line and column;
 * - a number too large to hold (`1e309`, which JSON.parse reads as Infinity) is LW108 at its
 *   line and column;
 * - a key written twice in one object is LW109 at the second (JSON.parse would keep the last
 *   and drop the first without a word: RFC 8259 §4 leaves duplicate names to the reader);
 * - nesting past JSON_DEPTH_MAX levels is LW406 at the bracket that goes too deep: no file
 *   the tool reads needs more than a few, and a value nested thousands deep would exhaust the
 *   stack of whatever walks it later (a message that describes it, a copy);
 * - diagnostics about the value, which name JSON paths, get the line and column of the value
 *   the path names (of the nearest enclosing value when the path names a missing member).
 */
import { diag, type Diagnostic } from '../model/diagnostics.js';
import type { SourceLoc } from '../model/machine.js';
import { membersKept, membersWritten, pathPrefixes, scanJson, tooDeep } from './json-positions.js';
import { locateJsonError } from './json-syntax.js';

/** Deepest nesting of objects and lists a JSON file may have. */
export const JSON_DEPTH_MAX = 64;

export type JsonRead =
  | { readonly ok: true; readonly value: unknown; readonly text: string }
  | { readonly ok: false; readonly diagnostics: Diagnostic[] };

/** The text without a leading byte order mark (U+FEFF). */
export function withoutBom(text: string): string {
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

/** Offsets at which lines start, for `positionOf`. */
function lineStarts(text: string): number[] {
  const starts = [0];
  for (let k = text.indexOf('\n'); k >= 0; k = text.indexOf('\n', k + 1)) starts.push(k + 1);
  return starts;
}

/** 1-based line and column of an offset, by binary search over the line starts. */
function positionOf(starts: readonly number[], offset: number): { line: number; column: number } {
  let lo = 0;
  let hi = starts.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (starts[mid] <= offset) lo = mid;
    else hi = mid - 1;
  }
  return { line: lo + 1, column: offset - starts[lo] + 1 };
}

const at = (file: string | undefined, l: Omit<SourceLoc, 'file'>): SourceLoc =>
  file === undefined ? l : { file, ...l };

/**
 * Parse a JSON file's text (BOM skipped); LW100 or LW108 with a line and column when it cannot
 * be used. `what` names the file in the message ("the profile"), when given.
 */
export function readJsonText(text: string, file?: string, what?: string): JsonRead {
  const src = withoutBom(text);
  let value: unknown;
  try {
    value = JSON.parse(src);
  } catch (e) {
    const found = locateJsonError(src) ?? { pos: 0, msg: e instanceof Error ? e.message : 'not valid JSON' };
    const pos = positionOf(lineStarts(src), found.pos);
    return {
      ok: false,
      diagnostics: [
        diag(
          'LW100',
          `${what === undefined ? '' : `${what} is `}not valid JSON: ${found.msg}`,
          at(file, pos),
          'check brackets, commas and quotes near this position',
        ),
      ],
    };
  }
  const deep = tooDeep(src, JSON_DEPTH_MAX);
  if (deep >= 0)
    return {
      ok: false,
      diagnostics: [
        diag(
          'LW406',
          `${what === undefined ? 'the file' : what} nests objects and lists more than ${JSON_DEPTH_MAX} levels deep`,
          at(file, positionOf(lineStarts(src), deep)),
          'check the brackets near this position',
        ),
      ],
    };
  // Only a long exponent or a very long number can overflow; skip the scan when there is none.
  if (/[eE]\+?\d{3}|\d{300}/.test(src)) {
    const { overflows } = scanJson(src, new Set());
    if (overflows.length > 0) {
      const starts = lineStarts(src);
      return {
        ok: false,
        diagnostics: overflows.map((o) =>
          diag(
            'LW108',
            `the number ${o.text} is too large to hold (a JSON reader takes it for infinity)`,
            at(file, { ...positionOf(starts, o.offset), path: o.path }),
            'write a number of ordinary size',
          ),
        ),
      };
    }
  }
  if (membersWritten(src) !== membersKept(value)) {
    const { duplicates } = scanJson(src, new Set());
    if (duplicates.length > 0) {
      const starts = lineStarts(src);
      return {
        ok: false,
        diagnostics: duplicates.map((d) =>
          diag(
            'LW109',
            `the key ${JSON.stringify(d.key)} is written twice in one object`,
            at(file, { ...positionOf(starts, d.offset), path: d.path }),
            'keep one of the two: a JSON reader would silently keep only the last',
          ),
        ),
      };
    }
  }
  return { ok: true, value, text: src };
}

/**
 * `ds` with a line and column added to every diagnostic about `file` (or with no file, when
 * `file` is undefined) that names a JSON path but no line; `text` is the file's text.
 */
export function locateJsonPaths(text: string, ds: readonly Diagnostic[], file?: string): Diagnostic[] {
  const src = withoutBom(text);
  const needs = (d: Diagnostic): boolean =>
    d.location.path !== undefined && d.location.line === undefined && d.location.file === file;
  const todo = ds.filter(needs);
  if (todo.length === 0) return [...ds];
  const wanted = new Set(todo.flatMap((d) => pathPrefixes(d.location.path ?? '$')));
  const { offsets } = scanJson(src, wanted);
  const starts = lineStarts(src);
  return ds.map((d) => {
    if (!needs(d)) return d;
    const hit = pathPrefixes(d.location.path ?? '$').find((p) => offsets.has(p));
    if (hit === undefined) return d;
    return { ...d, location: { ...d.location, ...positionOf(starts, offsets.get(hit) ?? 0) } };
  });
}
