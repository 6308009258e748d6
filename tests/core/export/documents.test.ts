/**
 * export/documents: the documents follow the profile's `documentUnits`. Metric is what the
 * documents have always been (byte for byte, whether the field is left out or written); inch
 * changes only the documents a workshop measures from, and netlist.json stays SI.
 */
import { describe, expect, it } from 'vitest';
import { buildDocuments } from '../../../src/core/export/index.js';
import { loadProfile } from '../../../src/core/physics/profile-load.js';
import { example, exampleNames } from './support.js';

/** The documents whose words carry lengths or masses the workshop reads (the commissioning sheet embeds frame.svg). */
const FOLLOWING = [
  'build-sheet.html',
  'build-sheet.md',
  'bom.csv',
  'cut-list.csv',
  'bring-up.html',
  'bring-up.md',
  'frame.svg',
  'cams.svg',
  'commissioning.html',
  'wiring.csv',
];

describe('core/export/documents', () => {
  it('writes every example byte for byte the same with documentUnits left out or written "metric"', () => {
    const metric = loadProfile({ documentUnits: 'metric' });
    expect(metric.diagnostics).toEqual([]);
    for (const name of exampleNames()) {
      const b = example(name);
      const plain = buildDocuments(b);
      const written = buildDocuments({ ...b, profile: { ...b.profile, ...metric.profile, about: b.profile.about } });
      expect([...written.keys()], name).toEqual([...plain.keys()]);
      for (const [file, text] of plain) expect(written.get(file) === text, `${name} ${file}`).toBe(true);
    }
  });

  it('changes only the documents a workshop measures from in inches; netlist.json stays SI', () => {
    for (const name of ['marble-bell.lw', 'crossing.lw']) {
      const b = example(name);
      const plain = buildDocuments(b);
      const inch = buildDocuments({ ...b, profile: { ...b.profile, documentUnits: 'inch' } });
      for (const [file, text] of plain) {
        const changed = inch.get(file) !== text;
        expect(changed, `${name} ${file}`).toBe(FOLLOWING.includes(file));
      }
    }
  });
});
