/**
 * export/bring-up-doc: the bring-up sheet in HTML and Markdown. Every stage's parts and cord
 * branches are on it, in that stage's own section; the HTML is well-formed XML (W3C XML 1.0,
 * the checker of support.ts); both carry the safety cautions first; user names are escaped;
 * the drum's length follows the profile's units (model/units.ts).
 */
import { describe, expect, it } from 'vitest';
import { bringUpPlan } from '../../../src/core/export/bring-up.js';
import { BRING_UP_CAUTIONS } from '../../../src/core/export/bring-up-doc.js';
import { CAUTIONS } from '../../../src/core/export/build-sheet.js';
import { escapeXml } from '../../../src/core/export/escape.js';
import { buildDocuments, DOCUMENT_FILES } from '../../../src/core/export/index.js';
import { lengthFeetInches } from '../../../src/core/model/units.js';
import { evilBuild, example, exampleNames, EVIL, xmlProblems } from './support.js';

/** The text of each stage's section, by stage number. */
function htmlStages(html: string): Map<number, string> {
  const out = new Map<number, string>();
  for (const m of html.matchAll(/<section id="stage-(\d+)">([\s\S]*?)<\/section>/g)) out.set(Number(m[1]), m[2]);
  return out;
}

function mdStages(md: string): Map<number, string> {
  const out = new Map<number, string>();
  const parts = md.split(/^## Stage (\d+):/m);
  for (let i = 1; i < parts.length; i += 2) out.set(Number(parts[i]), parts[i + 1].split(/^## /m)[0]);
  return out;
}

describe('core/export/bring-up-doc', () => {
  it('is a document of the registry, written by build --out (bring-up.html and bring-up.md)', () => {
    expect(DOCUMENT_FILES).toContain('bring-up.html');
    expect(DOCUMENT_FILES).toContain('bring-up.md');
  });

  it('puts every stage’s parts and cord branches in its own section, in well-formed HTML and in Markdown, on every example', () => {
    for (const name of exampleNames()) {
      const b = example(name);
      const docs = buildDocuments(b);
      const html = docs.get('bring-up.html') ?? '';
      const md = docs.get('bring-up.md') ?? '';
      expect(xmlProblems(html), name).toEqual([]);
      const plan = bringUpPlan(b.build, b.profile);
      const hs = htmlStages(html);
      const ms = mdStages(md);
      expect(hs.size, name).toBe(plan.stages.length);
      expect(ms.size, name).toBe(plan.stages.length);
      for (const s of plan.stages) {
        const h = hs.get(s.number) ?? '';
        const m = ms.get(s.number) ?? '';
        for (const p of s.parts) {
          expect(h, `${name} stage ${s.number} ${p}`).toContain(escapeXml(p));
          expect(m, `${name} stage ${s.number} ${p}`).toContain(`\`${p}\``);
        }
        for (const t of s.ties) {
          const to = t.port === '' ? `${t.target} (actuator)` : `${t.target} port ${t.port}`;
          expect(h, `${name} stage ${s.number} ${t.cord}`).toContain(escapeXml(to));
          expect(m, `${name} stage ${s.number} ${t.cord}`).toContain(`\`${to}\``);
        }
        // A tick box for every part, branch and trial.
        const ticks = (m.match(/☐/g) ?? []).length;
        expect(ticks, `${name} stage ${s.number}`).toBe(s.parts.length + s.ties.length + s.trials.length);
      }
    }
  });

  it('carries the bring-up cautions and every sheet’s cautions, before the first stage', () => {
    const docs = buildDocuments(example('ferry-gate.lw'));
    const html = docs.get('bring-up.html') ?? '';
    const md = docs.get('bring-up.md') ?? '';
    expect(BRING_UP_CAUTIONS).toEqual(expect.arrayContaining([...CAUTIONS]));
    expect(BRING_UP_CAUTIONS.some((c) => c.startsWith('Stop the drum before reaching in'))).toBe(true);
    for (const c of BRING_UP_CAUTIONS) {
      expect(html.indexOf(escapeXml(c))).toBeGreaterThan(0);
      expect(html.indexOf(escapeXml(c))).toBeLessThan(html.indexOf('id="stage-1"'));
      expect(md.indexOf(c.replace(/'/g, "\\'"))).toBeLessThan(md.indexOf('## Stage 1:'));
    }
    expect(md).toContain('Stop the drum before reaching in');
  });

  it('says plainly where a gate’s position is seen only at a later stage', () => {
    const md = buildDocuments(example('marble-bell.lw')).get('bring-up.md') ?? '';
    expect(md).toMatch(/not seen within 24 hand actions here; seen only once stage \d+ is mounted \(after \d+\.\d+\)/);
  });

  it('escapes the names a user gave', () => {
    const docs = buildDocuments(evilBuild());
    const html = docs.get('bring-up.html') ?? '';
    expect(xmlProblems(html)).toEqual([]);
    expect(html).not.toContain(EVIL.input);
    expect(html).toContain(escapeXml(EVIL.input));
  });

  it('writes the drums’ lengths in the profile’s units (feet and inches for an inch workshop)', () => {
    const b = example('marble-bell.lw');
    const inch = buildDocuments({ ...b, profile: { ...b.profile, documentUnits: 'inch' } }).get('bring-up.md') ?? '';
    const metric = buildDocuments(b).get('bring-up.md') ?? '';
    const drum = b.placement.drums[0];
    expect(metric).toContain(`drum 1, ${drum.lengthM.toFixed(2)} m long`);
    expect(inch).toContain(`drum 1, ${lengthFeetInches(drum.lengthM)} long`);
  });
});
