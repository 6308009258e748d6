/**
 * Reading JSON files (RFC 8259): byte order mark, syntax errors, numbers too large to hold,
 * nesting, and the line and column of the value a JSON path names.
 */
import { describe, expect, it } from 'vitest';
import { JSON_DEPTH_MAX, locateJsonPaths, readJsonText, withoutBom } from '../../../src/core/forms/json-file.js';
import { pathPrefixes, scanJson, tooDeep } from '../../../src/core/forms/json-positions.js';
import { diag } from '../../../src/core/model/diagnostics.js';

const DOC = [
  '{',
  '  "name": "m",',
  '  "states": [',
  '    { "name": "s", "transitions": [ { "to": "t" } ] },',
  '    { "name": "odd key", "x.y": [1, 2e3, true, null] }',
  '  ],',
  '  "weird \\"key\\"": { "a\\\\b": -0.5 }',
  '}',
].join('\n');

/** The text at 1-based line and column. */
const at = (text: string, line: number, column: number): string => text.split('\n')[line - 1].slice(column - 1);

describe('core/forms/json-file', () => {
  it('finds where every value starts, by the path the readers write', () => {
    const { offsets } = scanJson(DOC);
    const show = (p: string): string => DOC.slice(offsets.get(p), (offsets.get(p) ?? 0) + 12);
    expect(show('$')).toMatch(/^\{\n/);
    expect(show('$.name')).toBe('"m",\n  "stat');
    expect(show('$.states[0].transitions[0].to')).toMatch(/^"t"/);
    expect(show('$.states[1]["x.y"][1]')).toMatch(/^2e3,/);
    expect(show('$.states[1]["x.y"][3]')).toMatch(/^null\]/);
    expect(show('$["weird \\"key\\""]["a\\\\b"]')).toMatch(/^-0\.5/);
    expect(offsets.size).toBe(17);
  });

  it('walks nesting of any depth without recursion', () => {
    const deep = '['.repeat(200_000) + '7' + ']'.repeat(200_000);
    const { offsets } = scanJson(deep, new Set(['$' + '[0]'.repeat(200_000)]));
    expect(offsets.get('$' + '[0]'.repeat(200_000))).toBe(200_000);
    expect(tooDeep(deep, JSON_DEPTH_MAX)).toBe(JSON_DEPTH_MAX);
    expect(tooDeep('{"a": "[[[[[[["}', 2)).toBe(-1);
  });

  it('adds line and column to diagnostics by path, falling back to the nearest enclosing value', () => {
    const ds = [
      diag('LW103', 'x', { file: 'f.json', path: '$.states[0].transitions[0].to' }),
      diag('LW104', 'missing', { file: 'f.json', path: '$.states[1].transitions' }),
      diag('LW105', 'other file', { file: 'g.json', path: '$.name' }),
      diag('LW101', 'text', { file: 'f.json', line: 2, column: 3 }),
    ];
    const out = locateJsonPaths(DOC, ds, 'f.json');
    expect(out[0].location).toEqual({ file: 'f.json', path: '$.states[0].transitions[0].to', line: 4, column: 45 });
    expect(at(DOC, 4, 45)).toMatch(/^"t"/);
    expect(out[1].location).toMatchObject({ line: 5, column: 5 });
    expect(at(DOC, 5, 5)).toMatch(/^\{ "name": "odd key"/);
    expect(out[2]).toBe(ds[2]);
    expect(out[3]).toBe(ds[3]);
    expect(pathPrefixes('$.a[2]["b.c"]')).toEqual(['$.a[2]["b.c"]', '$.a[2]["b', '$.a[2]', '$.a', '$']);
  });

  it('reads with a byte order mark; reports syntax, overflow and nesting at line and column', () => {
    expect(withoutBom('\ufeff{}')).toBe('{}');
    expect(readJsonText('\ufeff{"a": 1}')).toEqual({ ok: true, value: { a: 1 }, text: '{"a": 1}' });
    const bad = readJsonText('{\n  "a": 1,\n}', 'f.json', 'the profile');
    expect(bad.ok ? [] : bad.diagnostics).toEqual([
      expect.objectContaining({
        code: 'LW100',
        message: expect.stringMatching(/^the profile is not valid JSON: /) as unknown,
        location: { file: 'f.json', line: 3, column: 1 },
      }),
    ]);
    const big = readJsonText('[1,\n 1E+400, 1e308, "1e999"]', 'f.json');
    expect(big.ok ? [] : big.diagnostics).toEqual([
      expect.objectContaining({ code: 'LW108', location: { file: 'f.json', line: 2, column: 2, path: '$[1]' } }),
    ]);
    const nested = readJsonText(`{"a": ${'['.repeat(70)}${']'.repeat(70)}}`, 'f.json');
    expect(nested.ok ? [] : nested.diagnostics.map((d) => [d.code, d.location.column])).toEqual([['LW406', 70]]);
  });

  // RFC 8259 §4: the names within an object SHOULD be unique; where they are not, readers
  // differ, and JSON.parse keeps the last. A key written twice in a machine (a second "when"
  // on a transition, a second "start") changed the machine without a word; now it is LW109.
  it('reports a key written twice in one object at the second, with its path (LW109)', () => {
    const text =
      '{"name": "m", "start": "s",\n "states": [{"name": "s", "transitions": [{"to": "s", "when": "a", "when": "!a"}]}],\n "start": "t"}';
    const r = readJsonText(text, 'f.json');
    expect(r.ok ? [] : r.diagnostics.map((d) => [d.code, d.location])).toEqual([
      ['LW109', { file: 'f.json', line: 2, column: 68, path: '$.states[0].transitions[0].when' }],
      ['LW109', { file: 'f.json', line: 3, column: 2, path: '$.start' }],
    ]);
    expect(r.ok ? '' : r.diagnostics[0].hint).toBeTruthy();
    expect(at(text, 2, 68)).toMatch(/^"when": "!a"/);
  });

  it('takes the same key in different objects, and a colon inside a string, as written once', () => {
    const r = readJsonText('{"a": {"b": 1}, "c": {"b": "x:y", "__proto__": 2}, "d": [{"b": 1}, {"b": 2}]}');
    expect(r.ok).toBe(true);
  });
});
