import { describe, expect, it } from 'vitest';
import { csvParse } from 'd3';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { CAUTIONS } from '../../../src/core/export/build-sheet.js';
import { cordFinderCsv, cordsFor, coverageWords } from '../../../src/core/export/cord-finder.js';
import { coverageLine } from '../../../src/core/export/sheet-faults.js';
import { DOCUMENT_MAKERS, documentSources } from '../../../src/core/export/documents.js';
import { example, exampleNames } from './support.js';

const sourcesOf = (name: string) => {
  const b = example(name);
  return documentSources({ build: b.build, checks: b.checks, profile: DEFAULT_PROFILE, analysed: b.analysed });
};

describe('core/export/cord-finder', () => {
  it('lists every shown fault under its own first difference (round trip), and nothing shown under none', () => {
    for (const name of exampleNames()) {
      const d = sourcesOf(name);
      const finder = d.finder();
      const shown = d.faults().verdicts.filter((v) => v.shown >= 0);
      expect(finder.entries, name).toHaveLength(shown.length);
      expect(finder.unshown.length + finder.entries.length, name).toBe(d.faults().verdicts.length);
      for (const e of finder.entries) {
        expect(e.sights.length, name).toBeGreaterThan(0);
        for (const s of e.sights) {
          expect(s.seen, `${name} ${e.fault.key}`).not.toBe(s.expected);
          expect(cordsFor(finder, e.step, s.what, s.seen), `${name} ${e.fault.key}`).toContain(e);
        }
        // The step is the sheet's own: the row there names the same lever or output.
        const row = d.steps()[e.step - 1];
        expect(row.step).toBe(e.step);
      }
    }
  });

  it('says the expected position the commissioning sheet gives at that step', () => {
    const d = sourcesOf('ferry-gate.lw');
    for (const e of d.finder().entries) {
      const row = d.steps()[e.step - 1];
      for (const s of e.sights) {
        const l = row.latches.find((x) => s.what === `${x.id} set Z` || s.what === `${x.id} reset Z`);
        if (l) expect(s.expected).toBe(s.what.endsWith('reset Z') ? l.resetZ : l.setZ);
      }
    }
  });

  // RFC 4180 read back by d3-dsv; formula characters escaped by csv.ts (OWASP "CSV Injection").
  it('says when its figures are of a seeded sample', () => {
    const d = sourcesOf('marble-bell.lw');
    const sf = { ...d.faults(), simulated: d.faults().simulated - 1, seed: 7 };
    expect(coverageWords(sf)).toMatch(/^Of a seeded sample of \d+ of the \d+ distinct cord faults \(seed 7;/);
    expect(coverageLine(sf)).toContain('(a seeded sample of');
    expect(coverageWords(d.faults())).toMatch(/^Of the \d+ distinct cord faults/);
  });

  it('writes a CSV that opens with the cautions and reads back one record per fault', () => {
    const d = sourcesOf('crossing.lw');
    const text = cordFinderCsv(d.finder());
    const records = csvParse(text.replace(/\r\n/g, '\n'));
    expect(records.slice(0, CAUTIONS.length).map((r) => r['what you see'])).toEqual(CAUTIONS);
    expect(records.length - CAUTIONS.length).toBe(d.faults().verdicts.length);
    expect(records.filter((r) => r.step === 'none').length).toBe(d.finder().unshown.length);
  });

  it('puts the section on finding the cord and the clocks that catch the remaining cords on the sheet', () => {
    for (const name of exampleNames()) {
      const d = sourcesOf(name);
      const extra = d.faults().extra.length;
      expect(d.tour().length, name).toBe(d.faults().tourClocks + extra);
      for (const doc of ['commissioning-html', 'commissioning-md'] as const) {
        const text = DOCUMENT_MAKERS[doc](d);
        expect(text, `${name} ${doc}`).toContain('Finding the cord');
        expect(text.includes('Clocks that catch the remaining cords'), `${name} ${doc}`).toBe(extra > 0);
      }
    }
  });
});
