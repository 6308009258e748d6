/**
 * The stable key of a search setup (src/core/search.ts, `searchSetupKey`): equal setups give
 * equal keys however they were assembled, and a change of any build option the search reads
 * gives another key. The outside reference for "equal as data" is Node's own deep equality
 * (`node:util` isDeepStrictEqual), checked beside the key on seeded random setups (fast-check).
 * What the search keeps of pricing (`searchPricing`, `EncodeResult.kept`): a build seeded with
 * it is the build made without it, on LGSynth'91 machines (the open dataset in
 * tests/fixtures/lgsynth91).
 */
import { readFileSync } from 'node:fs';
import { isDeepStrictEqual } from 'node:util';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyse, buildMachine, buildSearchSetup, type Analysed } from '../../src/core/pipeline.js';
import { searchOptions, searchPricing, searchSetupKey, type SearchSetup } from '../../src/core/search.js';
import { encode } from '../../src/core/phases/encode/index.js';
import { synthesisMemo } from '../../src/core/synthesise.js';
import { DEFAULT_PROFILE } from '../../src/core/physics/profile.js';

function analysed(text: string): Analysed {
  const a = analyse(text, 'lighthouse.lw');
  if (!a.ok) throw new Error('lighthouse must analyse');
  return a;
}

function setup(a: Analysed, opts: Parameters<typeof buildSearchSetup>[1] = {}): SearchSetup {
  const s = buildSearchSetup(a, opts);
  if (!('machine' in s)) throw new Error(s.message);
  return s;
}

const LIGHTHOUSE = readFileSync('examples/lighthouse.lw', 'utf8');

describe('core/search (searchSetupKey)', () => {
  it('gives one key to a machine whatever its comments and blank lines', () => {
    const plain = setup(analysed(LIGHTHOUSE));
    const commented = setup(analysed(`# a note typed on top\n\n${LIGHTHOUSE}\n# and one below\n`));
    expect(searchSetupKey(commented)).toBe(searchSetupKey(plain));
  });

  it('does not depend on the order an object was assembled in', () => {
    const s = setup(analysed(LIGHTHOUSE));
    const reversed = Object.fromEntries(Object.entries(s).reverse()) as unknown as SearchSetup;
    const profile = Object.fromEntries(Object.entries(s.profile).reverse()) as unknown as SearchSetup['profile'];
    expect(searchSetupKey({ ...reversed, profile })).toBe(searchSetupKey(s));
  });

  it('changes with every option the search reads: seed, profile, unused codes, budget', () => {
    const a = analysed(LIGHTHOUSE);
    const base = searchSetupKey(setup(a));
    const others = [
      setup(a, { seed: 2 }),
      setup(a, { profile: { ...DEFAULT_PROFILE, mu: DEFAULT_PROFILE.mu + 0.01 } }),
      setup(a, { unusedCodes: 'dont-care' }),
      setup(a, { budget: { evaluations: 10 } }),
    ].map(searchSetupKey);
    for (const k of others) expect(k).not.toBe(base);
    expect(new Set(others).size).toBe(others.length);
  });

  it('changes when one transition of the machine changes', () => {
    const s = setup(analysed(LIGHTHOUSE));
    const rows = s.machine.rows.map((r, i) =>
      i === 0 ? r.map((x, j) => (j === 0 ? { ...x, next: 1 - x.next } : x)) : r,
    );
    expect(searchSetupKey({ ...s, machine: { ...s.machine, rows } })).not.toBe(searchSetupKey(s));
  });

  it('equal keys exactly when the setups are deeply equal as plain data (node:util isDeepStrictEqual after structuredClone), fast-check seed 7', () => {
    const value = fc.letrec((tie) => ({
      leaf: fc.oneof(
        fc.integer(),
        fc.double({ noNaN: true }).map((d) => (Object.is(d, -0) ? 0 : d)),
        fc.string({ maxLength: 3 }),
        fc.boolean(),
        fc.constant(null),
      ),
      node: fc.oneof(
        { depthSize: 'small' },
        tie('leaf'),
        fc.array(tie('node'), { maxLength: 3 }),
        fc.dictionary(fc.string({ maxLength: 2 }), tie('node'), { maxKeys: 3 }),
      ),
    })).node;
    fc.assert(
      fc.property(value, value, (x, y) => {
        expect(searchSetupKey(x as SearchSetup) === searchSetupKey(y as SearchSetup)).toBe(
          isDeepStrictEqual(structuredClone(x), structuredClone(y)),
        );
        // The key of a copy made by structured clone (how a setup reaches a worker) is the same.
        expect(searchSetupKey(structuredClone(x) as SearchSetup)).toBe(searchSetupKey(x as SearchSetup));
      }),
      { seed: 7, numRuns: 300 },
    );
  });
});

describe('core/search (searchPricing)', () => {
  // LGSynth'91 machines (open dataset, tests/fixtures/lgsynth91): small enough to build quickly,
  // and one that sends unused codes to the start state (two syntheses per price).
  const MACHINES = ['dk15', 'bbtas', 'lion9', 'ex5'];

  it("hands back the chosen codes' minimisations; a build seeded with them (after structuredClone, as from a worker) equals the build without them (LGSynth'91)", () => {
    let carried = 0;
    for (const name of MACHINES) {
      const text = readFileSync(`tests/fixtures/lgsynth91/${name}.json`, 'utf8');
      const a = analyse(text, `${name}.json`);
      if (!a.ok) throw new Error(`${name} must analyse`);
      const s = setup(a);
      const r = encode(s.machine, 'auto', searchOptions(s));
      if (r.kept !== undefined) carried++;
      const { kept: _kept, ...bare } = r;
      const seeded = buildMachine(a, { searched: structuredClone(r), checks: false });
      const fresh = buildMachine(a, { searched: bare, checks: false });
      if (!seeded.ok || !fresh.ok) throw new Error(`${name} must build`);
      expect(seeded.build, name).toEqual(fresh.build);
      expect(seeded.placement, name).toEqual(fresh.placement);
    }
    expect(carried).toBeGreaterThan(0);
  });

  it('keeps what it priced last, for those codes only, as key and cover pairs', () => {
    const text = readFileSync('tests/fixtures/lgsynth91/dk15.json', 'utf8');
    const a = analyse(text, 'dk15.json');
    if (!a.ok) throw new Error('dk15 must analyse');
    const s = setup(a);
    const { cost, kept } = searchPricing(s);
    const codes = s.machine.states.map((_, i) => i.toString(2).padStart(2, '0'));
    expect(cost(codes, 2)).toBeGreaterThan(0);
    const pairs = kept(codes);
    expect(Array.isArray(pairs) && pairs.length > 0).toBe(true);
    for (const [key, cover] of pairs as [string, { terms: unknown[] }][]) {
      expect(typeof key).toBe('string');
      expect(Array.isArray(cover.terms)).toBe(true);
    }
    expect(kept([...codes])).toBeUndefined();
  });

  it('a memo seeded with anything but key and cover pairs holds none of it', () => {
    expect(synthesisMemo([['k', { vars: 1, functions: 1, terms: [] }]]).minimised.size).toBe(1);
    for (const bad of [undefined, 3, 'x', [1], [['k']], [['k', null]], [[1, { vars: 1, functions: 1, terms: [] }]]])
      expect(synthesisMemo(bad).minimised.size).toBe(0);
  });
});
