/**
 * The shakedown's worker job (src/web/worker/walk.ts) answers as the command line does: the same
 * sights at the same steps of the same build give the same suspects and steps ahead as
 * `latchwright build --saw … --json` run in-process, and its sheet is the commissioning sheet's
 * own rows, named by the same columns the command line reads.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { analyse, buildMachine, documentSources, valueOfWords, type Narrowed } from '../../../src/core/index.js';
import { digest, walkJob, walkSheet } from '../../../src/web/worker/walk.js';
import { examplePath, runJson } from '../../cli/support.js';

function built(file: string) {
  const a = analyse(readFileSync(examplePath(file), 'utf8'), `${file}.lw`);
  if (!a.ok) throw new Error('must read');
  const b = buildMachine(a, { encoding: 'binary' });
  if (!b.ok) throw new Error('must build');
  return b;
}

describe('src/web/worker/walk', () => {
  it('gives the suspects the command line gives for the same sights', async () => {
    const b = built('ferry-gate');
    const sheet = walkSheet(b);
    const said = [
      ['s0 set Z', 'down'],
      ['s0 reset Z', 'up'],
    ] as const;
    const sights = said.map(([what, seen]) => {
      const at = sheet.columns.findIndex((c) => c.what === what);
      const value = valueOfWords(sheet.columns[at], seen);
      if (value === undefined) throw new Error('a position');
      return { step: 87, at, value };
    });
    const page = walkJob(b, 87, sights, false).narrowed;
    const cli = await runJson<{ saw: { narrowed: Narrowed } }>([
      'build',
      examplePath('ferry-gate'),
      '--encoding',
      'binary',
      '--json',
      ...said.flatMap(([what, seen]) => ['--saw', `87:${what}=${seen}`]),
    ]);
    expect(page).toEqual(cli.json.saw.narrowed);
    expect(page.verdict).not.toBe('fine');
  });

  it('shows the commissioning sheet’s own rows, and tells one sheet from another by its digest', () => {
    const b = built('marble-bell');
    const sheet = walkSheet(b);
    const rows = documentSources(b).steps();
    expect(sheet.rows.map((r) => [r.step, r.clock, r.action])).toEqual(rows.map((r) => [r.step, r.clock, r.action]));
    // Each value as the sheet gives it: a Z lever down is 1; a flag up (1) is 1.
    sheet.rows.forEach((r) =>
      r.expected.forEach((words, k) => {
        const v = valueOfWords(sheet.columns[k], words);
        expect(r.values[k], `${r.step} ${sheet.columns[k].what}`).toBe(v ?? 2);
      }),
    );
    expect(walkSheet(b).print).toBe(sheet.print);
    expect(walkSheet(built('ferry-gate')).print).not.toBe(sheet.print);
    // FNV-1a, 32 bits: the published test vector "a" → e40c292c (from memory).
    expect(digest('a')).toBe('e40c292c');
  });
});
