/**
 * Text a user could write by mistake: a machine of the campaign in the text form with a few
 * edits (a span deleted, a token dropped in, a line repeated or cut short), and in the JSON form
 * (or as an xstate configuration) with a value replaced by one of the wrong type, a field
 * dropped or an unknown one added. Nothing may escape as an exception; every error must be a
 * diagnostic with a stable code and a place (line and column, or a JSON path).
 */
import type { Rng } from './random.js';

const TOKENS = [
  '(',
  ')',
  '!',
  '&',
  '|',
  '^',
  'go',
  'when',
  'with',
  '=',
  ',',
  '-',
  'x=2',
  '#',
  'state',
  'code 1',
  'code 102',
  'final',
  '\t',
  'é',
  '\u0000',
  '∧',
  '0',
  '1',
  'a=1',
  'load',
  '12 g',
  'kg',
  'never',
  'start',
  'machine m',
  '\r',
  '((((',
  'with a=-',
  'go go',
  '—',
  '"',
  '{',
  '1e309',
];

/** The text with one to three edits. */
export function editText(r: Rng, text: string): string {
  let s = text;
  for (let k = r.int(1, 3); k > 0; k--) {
    const at = r.int(0, s.length);
    const roll = r.next();
    if (roll < 0.3) s = s.slice(0, at) + s.slice(at + r.int(1, 12));
    else if (roll < 0.7) s = `${s.slice(0, at)}${r.pick(['', ' '])}${r.pick(TOKENS)}${r.pick(['', ' '])}${s.slice(at)}`;
    else if (roll < 0.85) {
      const lines = s.split('\n');
      const i = r.int(0, lines.length - 1);
      lines.splice(i, 0, lines[i]);
      s = lines.join('\n');
    } else s = s.slice(0, at);
  }
  return s;
}

const WRONG: readonly unknown[] = [null, 0, -1, 1.5, true, '', 'x', '-', [], {}, ['a'], { a: 1 }, 'constructor', 1e308];

type Json = unknown;

/** The JSON value with one node replaced, dropped, or given an unknown sibling. */
export function editJson(r: Rng, value: Json): Json {
  const copy = structuredClone(value);
  const paths: (string | number)[][] = [];
  const walk = (v: Json, path: (string | number)[]): void => {
    paths.push(path);
    if (Array.isArray(v)) v.forEach((x, i) => walk(x, [...path, i]));
    else if (v !== null && typeof v === 'object') for (const [k, x] of Object.entries(v)) walk(x, [...path, k]);
  };
  walk(copy, []);
  const path = r.pick(paths.slice(1));
  if (!path) return r.pick(WRONG);
  let parent = copy as Record<string | number, Json>;
  for (const k of path.slice(0, -1)) parent = parent[k] as Record<string | number, Json>;
  const key = path[path.length - 1];
  const roll = r.next();
  if (roll < 0.6) parent[key] = r.pick(WRONG);
  else if (roll < 0.8) {
    if (Array.isArray(parent)) parent.splice(Number(key), 1);
    else delete parent[key];
  } else if (!Array.isArray(parent))
    Object.defineProperty(parent, r.pick(['__proto__', 'extra', 'when', 'to']), {
      value: r.pick(WRONG),
      enumerable: true,
      writable: true,
      configurable: true,
    });
  return copy;
}
