import { describe, expect, it } from 'vitest';
import { OPERATING_RULES, RULE_WORDS } from '../../../src/core/sim/hand.js';
import { findCheck } from '../../../src/core/checks/registry.js';
import { PHASE_WORDS } from '../../../src/core/sim/clocking.js';
import { buildSheet, CAUTIONS } from '../../../src/core/export/build-sheet.js';
import { buildSheetHtml, renderDocHtml } from '../../../src/core/export/build-sheet-html.js';
import { buildSheetMd, renderDocMd } from '../../../src/core/export/build-sheet-md.js';
import { coverExpr } from '../../../src/core/export/readable.js';
import { escapeXml } from '../../../src/core/export/escape.js';
import { table, type Doc } from '../../../src/core/export/doc.js';
import { buildDocuments } from '../../../src/core/export/documents.js';
import { billOfMaterials } from '../../../src/core/physics/bom.js';
import { example, exampleNames, xmlProblems } from './support.js';

const SECTIONS = [
  'Machine',
  'Safety',
  'Technology profile',
  'State table',
  'Set and reset equations',
  'Forbidden-input guard',
  'Parts and bill of materials',
  'Frame: bays, drums and cords',
  'Drive margins',
  'Timing and clock rate',
  'Wiring list',
  'Operating rules',
];

/** Cells of a Markdown table row, split at pipes that are not escaped. */
const mdCells = (row: string): string[] =>
  row
    .trim()
    .replace(/^\|/, '')
    .replace(/\|$/, '')
    .split(/(?<!\\)\|/);

describe('core/export/build-sheet', () => {
  it('prints every example as one well-formed, self-contained HTML page with every section', () => {
    for (const name of exampleNames()) {
      const html = buildSheetHtml(example(name));
      expect(xmlProblems(html), name).toEqual([]);
      expect(html.startsWith('<!DOCTYPE html>')).toBe(true);
      // Self-contained: nothing is fetched from anywhere (a drawing is an image whose source is the SVG itself).
      expect(html).not.toMatch(/<script|<link|url\(|@import|href="(?!#)/);
      expect(html.match(/src="(?!data:image\/svg\+xml;base64,)/g), name).toBeNull();
      for (const s of SECTIONS) expect(html, `${name}: ${s}`).toContain(`<h2>${escapeXml(s)}</h2>`);
    }
  });

  it('has a print stylesheet that starts each section on a new page', () => {
    const html = buildSheetHtml(example('marble-bell.lw'));
    expect(html).toContain('@media print');
    expect(html).toMatch(/section \{ break-before: page; \}/);
    expect(html).toMatch(/thead \{ display: table-header-group; \}/);
    expect(html.match(/<section id=/g)).toHaveLength(SECTIONS.length);
  });

  it('carries the safety cautions in full (DESIGN §9), in both formats', () => {
    const b = example('sequence-lock.lw');
    const html = buildSheetHtml(b);
    const md = buildSheetMd(b);
    expect(CAUTIONS.join(' ')).toContain("ISO 12100's risk-assessment method is a common starting point");
    expect(CAUTIONS.join(' ')).toContain('Defer to local codes and licensed practice.');
    for (const c of CAUTIONS) {
      expect(html).toContain(escapeXml(c));
      expect(md.replace(/\\/g, '')).toContain(c);
    }
  });

  it('writes the set/reset equations of every latch as readable expressions over q-bits and inputs', () => {
    const b = example('marble-bell.lw');
    const md = buildSheetMd(b);
    const bits = b.build.encoding.bits;
    for (let j = 0; j < bits; j++) {
      const row = md.split('\n').find((l) => l.startsWith(`| \`q${j}\` |`)) ?? '';
      const cells = mdCells(row).map((c) => c.trim().replace(/^`|`$/g, '').replace(/\\\|/g, '|'));
      expect(cells[3]).toBe(coverExpr(b.build.equations[2 * j].terms, b.build.vars, { widen: false }));
      expect(cells[4]).toBe(coverExpr(b.build.equations[2 * j + 1].terms, b.build.vars, { widen: false }));
    }
    expect(md).toContain('| bell | `flag.bell` | Moore (state only) | `q0 & q1` |');
  });

  it('reports the operating rules with what breaking each one does, and the timing figures', () => {
    const b = example('marble-bell.lw');
    const html = buildSheetHtml(b);
    for (const r of OPERATING_RULES) expect(html).toContain(escapeXml(RULE_WORDS[r]));
    const fi = findCheck(b.checks, 'forbidden-input');
    for (const r of fi?.rules ?? []) if (r.upsets.length > 0) expect(html).toContain(escapeXml(r.words));
    const t = findCheck(b.checks, 'timing');
    if (!t) throw new Error('the timing check must have run');
    expect(html).toContain(`${Math.round(t.clocksPerMinute * 10) / 10} clocks per minute`);
  });

  it('says where the drum torque is worst, from the drive check', () => {
    const b = example('marble-bell.lw');
    const d = findCheck(b.checks, 'drive');
    if (!d?.worstAt) throw new Error('the drive check must have run over the snapshots');
    const { state, code, inputs, phase } = d.worstAt;
    expect(buildSheetMd(b)).toContain(
      `| worst drum torque at | state ${state} (code ${code}), inputs ${inputs}, ${PHASE_WORDS[phase]} |`,
    );
  });

  it('says a check was not run rather than guessing, and flags failed checks at the top', () => {
    const b = example('marble-bell.lw');
    const bare = buildSheetMd({ build: b.build, checks: [], profile: b.profile });
    expect(bare).toContain('The timing check was not run for this sheet.');
    expect(bare).toContain('No checks were run for this sheet.');
    const eq = findCheck(b.checks, 'equivalence');
    if (!eq) throw new Error('the equivalence check must have run');
    const failed = buildSheet({
      ...b,
      checks: [{ ...eq, ok: false, summary: 'outputs differ in state two' }],
    });
    const note = failed.sections[0].blocks.find((x) => x.kind === 'note');
    expect(note).toMatchObject({ tone: 'fail', items: ['equivalence: outputs differ in state two'] });
  });

  it('says what each output moves: an actuator its load and the most it can lift, a flag only its own swing', () => {
    const lock = buildSheetMd(example('canal-lock.lw'));
    // 450 g on 2.75 turns: 15 g · e^(0.25·2π·2.75) = 1127.5 g (capstan equation); routed out of the frame over
    // two pulleys (1/0.95² ≈ 1.108) the load is 498.6 g: margin 2.26, and at margin 2 at most 563.7 × 0.95² = 508.7 g.
    expect(lock).toContain('| lower_gate | actuator | 450 | 508.7 | 2.26 | its load, by its own capstan |');
    expect(lock).toContain(
      '| outputs | lower_gate (actuator, 450 g), upper_gate (actuator, 450 g), fill (actuator, 300 g)',
    );
    const bell = buildSheetMd(example('marble-bell.lw'));
    expect(bell).toContain(
      "| bell | flag | — | — | — | the Z lever's own swing: no external load (give the output a load to drive one) |",
    );
    const d = findCheck(example('canal-lock.lw').checks, 'drive');
    expect(lock).toContain(
      `every capstan still holds its load down to μ = ${Math.round((d?.muMin ?? 0) * 1000) / 1000}`,
    );
  });

  it('names the profile used, its description, and the source of every value that differs from the defaults', () => {
    const b = example('marble-bell.lw');
    expect(buildSheetMd(b)).toContain('| technology profile | the shipped defaults (profiles/default.json) |');
    expect(buildSheetMd(b)).toContain('Every value is the shipped default');
    const profile = {
      ...b.profile,
      mu: 0.22,
      zWeightG: 20,
      about: { file: 'shop.json', description: 'beech drum', sources: { mu: 'measured, lowest of five' } },
    };
    const md = buildSheetMd({ ...b, profile });
    expect(md).toContain('| technology profile | shop.json — beech drum |');
    expect(md).toContain('| `mu` | `0.22` | `0.25` | measured, lowest of five |');
    expect(md).toContain('| `zWeightG` | `20` | `15` | NOT GIVEN — add it under "sources" |');
  });

  it('counts the capstans as the bill of materials does, naming the gates that have none', () => {
    const b = example('ferry-gate.lw');
    const md = buildSheetMd(b);
    const bomCapstans = billOfMaterials(b.build.netlist, b.profile)
      .filter((r) => r.kind === 'capstan')
      .reduce((n, r) => n + r.count, 0);
    expect(b.build.parts.capstans).toBe(bomCapstans);
    expect(md).toContain(`on ${bomCapstans} capstans`);
    expect(md).toContain('2 gates that only show a flag have no capstan');
  });

  it('keeps every Markdown table rectangular, whatever the cells hold', () => {
    const doc: Doc = {
      title: 'T|t',
      sections: [
        {
          id: 'x',
          title: 'x',
          blocks: [
            table(
              ['a', 'b|c'],
              [
                ['x | y', '`q|r`'],
                ['back\\', 'new\nline'],
              ],
              { mono: [1], tick: true },
            ),
          ],
        },
      ],
    };
    const md = renderDocMd(doc);
    const rows = md.split('\n').filter((l) => l.startsWith('|'));
    expect(rows).toHaveLength(4);
    for (const r of rows) expect(mdCells(r)).toHaveLength(3);
    expect(xmlProblems(renderDocHtml(doc))).toEqual([]);
    for (const name of exampleNames()) {
      const lines = buildSheetMd(example(name)).split('\n');
      let width = 0;
      for (const l of lines) {
        if (!l.startsWith('|')) width = 0;
        else if (width === 0) width = mdCells(l).length;
        else expect(mdCells(l), `${name}: ${l}`).toHaveLength(width);
      }
    }
  });

  it('embeds the frame drawing, the state diagram and the schematic, each fitted to a printed page', () => {
    const docs = buildDocuments(example('lighthouse.lw'));
    for (const file of ['build-sheet.html', 'commissioning.html'] as const) {
      const html = docs.get(file) ?? '';
      expect(xmlProblems(html), file).toEqual([]);
      const images = [...html.matchAll(/<img src="data:image\/svg\+xml;base64,([A-Za-z0-9+/=]+)" alt="([^"]*)" \/>/g)];
      expect(images, file).toHaveLength(3);
      // Each image is the very file written beside the sheet (RFC 2397 data URL, base64 of its UTF-8).
      const svgs = images.map((m) => new TextDecoder().decode(Uint8Array.from(atob(m[1]), (c) => c.charCodeAt(0))));
      expect(svgs, file).toEqual([docs.get('frame.svg'), docs.get('state-diagram.svg'), docs.get('schematic.svg')]);
      // Printed, a drawing never breaks across pages and is never taller than the page.
      expect(html, file).toMatch(
        /figure\.drawing \{ break-inside: avoid; \}|tr, \.note, pre, figure\.drawing \{ break-inside: avoid; \}/,
      );
      expect(html, file).toMatch(/figure\.drawing img \{ max-height: \d+mm;/);
    }
    const md = docs.get('build-sheet.md') ?? '';
    for (const f of ['frame.svg', 'state-diagram.svg', 'schematic.svg'])
      expect(md).toMatch(new RegExp(`!\\[[^\\]]+\\]\\(${f.replace('.', '\\.')}\\)`));
    expect(md).toContain('## Frame: bays, drums and cords');
  });

  it('writes masses in ounces and lengths in feet and inches where the profile asks for inches (NIST Handbook 44 appendix C: 1 oz = 28.349523125 g)', () => {
    const b = example('canal-lock.lw');
    const lock = buildSheetMd({ ...b, profile: { ...b.profile, documentUnits: 'inch' } });
    // 450 g = 15.87 oz and 508.7 g = 17.94 oz, to 0.1 oz (the same capstan figures as in grams above).
    expect(lock).toContain('| lower_gate | actuator | 15.9 | 17.9 | 2.26 | its load, by its own capstan |');
    expect(lock).toContain(
      '| outputs | lower_gate (actuator, 15.9 oz), upper_gate (actuator, 15.9 oz), fill (actuator, 10.6 oz)',
    );
    expect(lock).toContain(
      '| output | shown by | load (oz) | most it can lift at margin 2 (oz) | margin | what it moves |',
    );
    expect(lock).toContain('from visitor end (in)');
    expect(lock).toContain('check its 4 in bar first');
    expect(lock).toContain(
      '| ✓ | step | cord | from | side | turns | to | port | bays | length to cut | routing | load (oz) | margin |',
    );
    // Each drum's length in feet and inches, to the nearest sixteenth (1 in = 25.4 mm exactly, NIST SP 811 B.8).
    for (const d of b.placement.drums) {
      const words = new RegExp(`drum ${d.drum}: ([^,]+), ${d.bays.length} bays`).exec(lock)?.[1] ?? '';
      expect(words, `drum ${d.drum}`).toMatch(/^(\d+ ft)?( ?\d+)?( \d+\/\d+)? in$|^\d+ ft$/);
    }
    // The choice of units is listed with the profile's changes, as a choice rather than a figure wanting a source.
    expect(lock).toContain(
      '| `documentUnits` | `inch` | `metric` | the workshop’s choice of units (no figure to source) |',
    );
    // Torque in pound-force inches to 0.01 (NIST SP 811 B.8: 1 lbf = 4.4482216152605 N, 1 in = 0.0254 m).
    const drive = findCheck(b.checks, 'drive');
    const lbfIn = (drive?.worstTorqueNm ?? NaN) / (4.4482216152605 * 0.0254);
    const said = Number(/\| worst drum torque \| ([\d.]+) lbf·in \|/.exec(lock)?.[1]);
    expect(Math.abs(said - lbfIn)).toBeLessThanOrEqual(0.005 + 1e-9);
  });
});
