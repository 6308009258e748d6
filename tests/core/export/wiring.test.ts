import { describe, expect, it } from 'vitest';
import { csvParse } from 'd3';
import { DEFAULT_PROFILE, type Profile } from '../../../src/core/physics/profile.js';
import { branchLoads, driveBudget } from '../../../src/core/physics/drive.js';
import { routingWords, wiringCsv, wiringRows } from '../../../src/core/export/wiring.js';
import { stagesOf, STAGE_RANK, STAGE_WORDS } from '../../../src/core/export/stages.js';
import { example, exampleNames } from './support.js';

describe('core/export/wiring', () => {
  it('lists every cord branch exactly once', () => {
    for (const name of exampleNames()) {
      const n = example(name).build.netlist;
      const rows = wiringRows(n, DEFAULT_PROFILE);
      const want = n.cords
        .flatMap((c) => [
          ...c.ports.map((p) => `${c.id}>${p.part}.${p.port}`),
          ...c.actuators.map((a) => `${c.id}>${a}`),
        ])
        .sort();
      // An actuator branch names the load in place of a port.
      const isActuator = (r: { target: string }): boolean =>
        n.parts.some((p) => p.id === r.target && p.kind === 'actuator');
      expect(
        rows.map((r) => (isActuator(r) ? `${r.cord}>${r.target}` : `${r.cord}>${r.target}.${r.port}`)).sort(),
        name,
      ).toEqual(want);
      for (const r of rows.filter(isActuator)) expect(r.port, name).toMatch(/^load [0-9.]+ g$/);
      expect(rows.map((r) => r.step)).toEqual(rows.map((_, i) => i + 1));
    }
  });

  it('sorts by driver in stage order, each driver finished before the next', () => {
    for (const name of exampleNames()) {
      const n = example(name).build.netlist;
      const stages = stagesOf(n);
      const rows = wiringRows(n, DEFAULT_PROFILE);
      const driverOf = new Map(n.cords.map((c) => [c.id, c.driver]));
      const drivers = rows.map((r) => driverOf.get(r.cord) as string);
      const ranks = drivers.map((d) => STAGE_RANK[stages.stage.get(d) ?? 'indicator']);
      for (let i = 1; i < ranks.length; i++) expect(ranks[i], name).toBeGreaterThanOrEqual(ranks[i - 1]);
      // Contiguous: once a driver's rows end, it never comes back.
      const done = new Set<string>();
      drivers.forEach((d, i) => {
        if (i > 0 && drivers[i - 1] !== d) done.add(drivers[i - 1]);
        expect(done.has(d), `${name}: ${d} comes back`).toBe(false);
      });
      expect(rows[0].stage).toBe(STAGE_WORDS.lever);
    }
  });

  it('gives each branch its load and each driver its margin from the capstan budget (physics/drive.ts)', () => {
    const n = example('marble-bell.lw').build.netlist;
    const rows = wiringRows(n, DEFAULT_PROFILE);
    const budgets = new Map(driveBudget(n, DEFAULT_PROFILE).map((b) => [b.driver, b]));
    const loads = branchLoads(n, DEFAULT_PROFILE);
    const driverOf = new Map(n.cords.map((c) => [c.id, c.driver]));
    for (const r of rows) {
      const d = driverOf.get(r.cord) as string;
      expect(r.margin).toBeCloseTo(budgets.get(d)?.margin ?? NaN, 2);
      const b = loads.get(d)?.find((x) => x.cord === r.cord && x.target === `${r.target}.${r.port}`);
      expect(r.loadG).toBeCloseTo(b?.loadG ?? NaN, 1);
    }
  });

  it('names a latch and its side as the driver of a latch gate’s cord', () => {
    const rows = wiringRows(example('marble-bell.lw').build.netlist, DEFAULT_PROFILE);
    const fromSet = rows.filter((r) => r.cord === 'c.s0.set');
    expect(fromSet.length).toBeGreaterThan(0);
    for (const r of fromSet) expect([r.driver, r.driverSide]).toEqual(['s0', 'Q (set side)']);
    expect(rows.find((r) => r.cord === 'c.s0.reset')?.driverSide).toBe('Q̄ (reset side)');
    expect(rows.find((r) => r.cord === 'c.clk.phi1')?.driverSide).toBe('capstan');
  });

  it('shows a routing override in words and in the load', () => {
    const n = example('marble-bell.lw').build.netlist;
    const profile: Profile = {
      ...DEFAULT_PROFILE,
      cordRouting: { 'c.clk.phi1': { pinAngleRad: Math.PI / 2, pulleys: 1 } },
    };
    const rows = wiringRows(n, profile).filter((r) => r.cord === 'c.clk.phi1');
    // Capstan equation over a pin: e^(μ·α) = e^(0.2·π/2) ≈ 1.369, divided by the pulley's 0.95.
    expect(rows[0].routingFactor).toBeCloseTo(Math.exp(0.2 * (Math.PI / 2)) / 0.95, 3);
    expect(rows[0].routing).toBe('over pins 1.57 rad (μ 0.2), 1 pulley (η 0.95)');
    expect(routingWords(DEFAULT_PROFILE.routing)).toBe('straight');
  });

  // RFC 4180 read back with d3-dsv's csvParse (an independent parser).
  it('writes CSV that parses back to the same rows (RFC 4180, read by d3 csvParse)', () => {
    const rows = wiringRows(example('crossing.lw').build.netlist, DEFAULT_PROFILE);
    const text = wiringCsv(rows);
    expect(text.endsWith('\r\n')).toBe(true);
    const parsed = csvParse(text);
    expect(parsed.columns).toEqual([
      'step',
      'stage',
      'cord',
      'driver',
      'driver name',
      'driver side',
      'turns',
      'target',
      'target name',
      'port',
      'from bay',
      'to bay',
      'length (m)',
      'routing',
      'routing factor',
      'load (g)',
      'driver margin',
    ]);
    expect(parsed).toHaveLength(rows.length);
    parsed.forEach((p, i) => {
      expect(p.cord).toBe(rows[i].cord);
      expect(p['target name']).toBe(rows[i].targetName);
      expect(Number(p['load (g)'])).toBe(rows[i].loadG);
    });
  });
});
