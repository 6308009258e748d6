import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyse, buildMachine, type Analysed } from '../../src/core/index.js';
import { searchOnThreads, THREADS_FROM_STATES } from '../../src/cli/search-pool.js';
import { progressLine, searchWords } from '../../src/cli/progress.js';

function analysed(file: string): Analysed {
  const a = analyse(readFileSync(file, 'utf8'), file);
  if (!a.ok) throw new Error(`${file} did not analyse`);
  return a;
}

describe('cli/search-pool', () => {
  // bbara (LGSynth'91, 10 states → 7 after state minimisation) is searched by annealing on the sketch.
  const a = analysed('tests/fixtures/lgsynth91/bbara.json');

  it('gives the codes of the single-thread search, whatever the number of threads', async () => {
    // bbara is below the size at which a build starts threads; here they are asked for from 1 state.
    expect(a.minimised.machine.states.length).toBeLessThan(THREADS_FROM_STATES);
    const own = buildMachine(a, { checks: false });
    if (!own.ok) throw new Error('bbara did not build');
    const one = await searchOnThreads(a, {}, 1, undefined, 1);
    const two = await searchOnThreads(a, {}, 2, undefined, 1);
    const three = await searchOnThreads(a, { seed: 1 }, 3, undefined, 1);
    const usual = await searchOnThreads(a, {}, 2);
    for (const r of [one, two, three, usual]) {
      expect(r?.encoding?.codes).toEqual(own.build.encoding.codes);
      expect(r?.search?.bestCost).toBe(own.search?.bestCost);
    }
  }, 120_000);

  it('a different seed is its own search, equally reproducible on threads', async () => {
    const own = buildMachine(a, { checks: false, seed: 7 });
    if (!own.ok) throw new Error('bbara did not build');
    const two = await searchOnThreads(a, { seed: 7 }, 2, undefined, 1);
    expect(two?.encoding?.codes).toEqual(own.build.encoding.codes);
  }, 120_000);

  it('leaves builds that do not search to the build itself', async () => {
    expect(await searchOnThreads(a, { encoding: 'binary' }, 2)).toBeUndefined();
  });
});

describe('cli/progress', () => {
  it('words the search as evaluations looked at, share and best cost', () => {
    expect(searchWords({ done: 120, total: 400, best: 3077 })).toBe(
      'searching state codes: 120 of 400 looked at (30 %), best cost 3077',
    );
    expect(searchWords({ done: 5, total: null, best: Infinity })).toBe('searching state codes: 5 looked at');
  });

  it('redraws in place at most ten times a second, and erases itself when done', () => {
    const written: string[] = [];
    let t = 0;
    const line = progressLine(
      (s) => written.push(s),
      () => t,
    );
    line.phase('encode');
    line.search({ done: 1, total: 10, best: 50 }); // within 100 ms of the last draw: skipped
    t = 150;
    line.search({ done: 2, total: 10, best: 40 });
    line.done();
    expect(written).toEqual([
      '\r\x1b[Klatchwright: searching state codes…',
      '\r\x1b[Klatchwright: searching state codes: 2 of 10 looked at (20 %), best cost 40',
      '\r\x1b[K',
    ]);
  });
});
