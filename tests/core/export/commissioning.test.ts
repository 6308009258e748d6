import { describe, expect, it } from 'vitest';
import { csvParse } from 'd3';
import type { Build } from '../../../src/core/model/build.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { commissioningCsv, commissioningRows, inputWords, showsWords } from '../../../src/core/export/commissioning.js';
import { commissioningHtml } from '../../../src/core/export/commissioning-html.js';
import { commissioningTour } from '../../../src/core/export/tour.js';
import { CAUTIONS } from '../../../src/core/export/build-sheet.js';
import { example, exampleNames, xmlProblems } from './support.js';

describe('core/export/commissioning', () => {
  it('steps every example through its tour with no alarm and no difference from the state table', () => {
    for (const name of exampleNames()) {
      const b = example(name).build;
      const f = b.machine;
      const tour = commissioningTour(f);
      const rows = commissioningRows(b, DEFAULT_PROFILE, tour);
      expect(
        rows.filter((r) => r.note !== '').map((r) => `${r.step}: ${r.note}`),
        name,
      ).toEqual([]);
      if (b.encoding.bits === 0) {
        expect(rows).toHaveLength(tour.length);
        continue;
      }
      // Reset, then per clock: inputs (when there are any), φ1 pulled/released, φ2 pulled/released.
      const perClock = f.inputs.length > 0 ? 5 : 4;
      expect(rows).toHaveLength(1 + tour.filter((c) => c.reset).length + perClock * tour.length);
      expect(rows[0].action).toMatch(/^Reset/);
      expect(rows[0].state).toBe(f.states[f.start]);
      const afterPhi2 = rows.filter((r) => r.action === 'Release φ2.');
      expect(afterPhi2.map((r) => r.state)).toEqual(tour.map((c) => f.states[c.next]));
      expect(afterPhi2.map((r) => r.code)).toEqual(tour.map((c) => b.encoding.codes[c.next]));
    }
  });

  // NAND latch table (Mano & Ciletti, Digital Design, sequential-circuits chapter): a latch holding
  // Q = 1 has Q̄ = 0, i.e. its set-side gate outputs 1 (Z down) and its reset-side gate 0 (Z up).
  it('gives the two Z levers of a settled latch opposite positions matching Q (NAND latch table)', () => {
    const b = example('marble-bell.lw').build;
    for (const r of commissioningRows(b, DEFAULT_PROFILE, commissioningTour(b.machine))) {
      for (const l of r.latches) {
        expect(l.setZ === 'down' ? '1' : '0').toBe(l.q);
        expect(l.resetZ).toBe(l.setZ === 'down' ? 'up' : 'down');
      }
    }
  });

  it('shows the outputs the state table gives while the inputs are held', () => {
    const b = example('sequence-lock.lw').build;
    const f = b.machine;
    const tour = commissioningTour(f);
    const rows = commissioningRows(b, DEFAULT_PROFILE, tour).filter((r) => r.action.startsWith('Set the input levers'));
    expect(rows).toHaveLength(tour.length);
    rows.forEach((r, i) => {
      const want = f.rows[tour[i].state][tour[i].row].out;
      r.outputs.forEach((o, k) => {
        if (want[k] !== '-') expect(o.shows).toBe(String(want[k]));
      });
      expect(r.action).toBe(
        `Set the input levers: ${inputWords(f.inputs, tour[i].inputs)}${i > 0 && tour[i - 1].inputs === tour[i].inputs ? ' (no change)' : ''}.`,
      );
    });
  });

  it('points at a miswired build: a latch left off the reset cord shows up at the first row', () => {
    const b = example('marble-bell.lw').build;
    const cut: Build = {
      ...b,
      netlist: {
        ...b.netlist,
        cords: b.netlist.cords.map((c) =>
          c.driver === 'rst.drv' ? { ...c, ports: c.ports.filter((p) => p.part !== 's1.reset') } : c,
        ),
      },
    };
    const rows = commissioningRows(cut, DEFAULT_PROFILE, commissioningTour(b.machine));
    expect(rows[0].note).toContain('the state table says');
    expect(rows[0].latches.find((l) => l.id === 's1')).toMatchObject({ setZ: '?', resetZ: '?' });
  });

  it('writes a one-state machine as input settings and flags only', () => {
    const b = example('odd-lever.lw').build;
    const rows = commissioningRows(b, DEFAULT_PROFILE, commissioningTour(b.machine));
    expect(rows.every((r) => r.latches.length === 0 && r.action.startsWith('Set the input levers'))).toBe(true);
    expect(rows.map((r) => r.outputs[0].shows).sort()).toEqual(['0', '0', '1', '1']);
  });

  // Read back with d3-dsv's csvParse (RFC 4180).
  it('writes CSV with one row per hand action, a column per latch lever and output, and an empty done column', () => {
    const b = example('marble-bell.lw').build;
    const rows = commissioningRows(b, DEFAULT_PROFILE, commissioningTour(b.machine));
    const all = csvParse(commissioningCsv(rows));
    // It opens with the safety cautions (DESIGN §9), one record each, before the first hand action.
    expect(all.slice(0, CAUTIONS.length).map((r) => [r.step, r.action])).toEqual(CAUTIONS.map((c) => ['caution', c]));
    const parsed = all.slice(CAUTIONS.length);
    expect(parsed).toHaveLength(rows.length);
    expect(all.columns).toEqual([
      'step',
      'clock',
      'action',
      ...rows[0].latches.flatMap((l) => [`${l.id} set Z`, `${l.id} reset Z`]),
      'bell (flag.bell)',
      'state after',
      'code after',
      'note',
      'done',
    ]);
    expect(parsed.every((p) => p.done === '')).toBe(true);
    expect(parsed[0]['s0 set Z']).toBe(rows[0].latches.find((l) => l.id === 's0')?.setZ);
    expect(parsed[0]['bell (flag.bell)']).toBe(showsWords('flag', rows[0].outputs[0].shows));
  });

  it('prints a well-formed page with a tick box per action, the legend and the cautions', () => {
    const b = example('crossing.lw').build;
    const tour = commissioningTour(b.machine);
    const rows = commissioningRows(b, DEFAULT_PROFILE, tour);
    const html = commissioningHtml(b, rows, tour);
    expect(xmlProblems(html)).toEqual([]);
    expect(html.match(/<td class="tick">☐<\/td>/g)).toHaveLength(rows.length);
    for (const c of CAUTIONS) expect(html).toContain(c.replace(/'/g, '&#39;'));
    expect(html).toContain('takes every one of the');
    expect(html).toContain('size: landscape');
  });

  it('names every hand lever by its bay ("bay 7, drum 1") in the actions, and every bay in its own table', () => {
    const b = example('crossing.lw');
    const where = new Map(b.placement.bays.map((x) => [x.part, `bay ${x.bay}, drum ${x.drum}`]));
    const s = b.build.signals;
    const rows = commissioningRows(b.build, DEFAULT_PROFILE, commissioningTour(b.build.machine), b.placement);
    expect(rows[0].action).toBe(
      `Reset: pull the reset lever (${where.get(s.reset)}), then release it (both clock levers released).`,
    );
    expect(rows.some((r) => r.action === `Pull φ1 (${where.get(s.phi1)}).`)).toBe(true);
    expect(rows.some((r) => r.action === `Release φ2 (${where.get(s.phi2)}).`)).toBe(true);
    const set = rows.find((r) => r.action.startsWith('Set the input levers'))?.action ?? '';
    for (const [input, lever] of Object.entries(s.inputs)) expect(set).toContain(`${input} (${where.get(lever)}) `);
    // The sheet: a table of every bay and its levers, and each latch's columns with its two bays.
    const html = commissioningHtml(b.build, rows, commissioningTour(b.build.machine), b.placement);
    expect(xmlProblems(html)).toEqual([]);
    expect(html).toContain('<h2>Where the levers are</h2>');
    for (const bay of b.placement.bays) expect(html).toContain(`<td>bay ${bay.bay}, drum ${bay.drum}</td>`);
    for (const l of b.placement.latches)
      expect(html).toContain(`${l.latch} (bays ${l.bays[0]} and ${l.bays[1]}, drum ${l.drum}): set Z`);
  });
});
