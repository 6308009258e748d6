import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { CHECK_NAMES, findCheck } from '../../src/core/checks/registry.js';
import { analyse, buildMachine } from '../../src/core/pipeline.js';
import { buildReport } from '../../src/core/report.js';
import { placeWords } from '../../src/core/sim/snapshots.js';

function built(file: string) {
  const a = analyse(readFileSync(file, 'utf8'), file);
  if (!a.ok) throw new Error(`${file} must analyse`);
  const b = buildMachine(a);
  if (!b.ok) throw new Error(`${file} must build`);
  return b;
}

describe('core/report', () => {
  it('carries every check in registry order, and the drive figures as the drive check found them', () => {
    const b = built('examples/crossing.lw');
    const report = buildReport(b);
    expect(report.checks.map((c) => c.name)).toEqual(CHECK_NAMES);
    const d = findCheck(report.checks, 'drive');
    if (!d?.worstAt) throw new Error('the drive check must have run over the snapshots');
    // The worst case overall is the worst of the per-state worst cases, and the summary names its place.
    const worst = d.worstByState.reduce((w, x) => (x.torqueNm > w.torqueNm ? x : w));
    expect(worst.torqueNm).toBe(d.worstTorqueNm);
    expect(worst.where).toEqual(d.worstAt);
    expect(d.summary).toContain(`in '${placeWords(d.worstAt)}'`);
    expect(d.worstByState.map((w) => w.where.state)).toEqual(b.build.machine.states);
  });

  it("keeps the drive check's places as plain data: the JSON text reads back the same", () => {
    const d = findCheck(buildReport(built('examples/marble-bell.lw')).checks, 'drive');
    const places = { worstAt: d?.worstAt, worstByState: d?.worstByState };
    expect(JSON.parse(JSON.stringify(places))).toEqual(places);
  });

  it('gives the layout block: method, each drum, the cord against the netlist order measured in the same run, pulleys', () => {
    const b = built('examples/crossing.lw');
    const { layout } = buildReport(b);
    expect(Object.keys(layout)).toEqual([
      'method',
      'exact',
      'drums',
      'totalCordM',
      'baselineCordM',
      'channelM',
      'baselineChannelM',
      'pulleys',
    ]);
    expect(layout.drums).toEqual(
      b.placement.drums.map((d) => ({ lengthM: Math.round(d.lengthM * 1000) / 1000, bays: d.bays.length })),
    );
    expect(layout.drums).toHaveLength(2); // our crossing example needs two drums of at most 1.5 m
    expect(layout.totalCordM).toBeLessThanOrEqual(layout.baselineCordM);
    expect(layout.channelM).toBeLessThanOrEqual(layout.baselineChannelM);
    // Pulleys in the frame: a corner a cord's branches share is one pulley, so never more than the branches pass.
    expect(layout.pulleys).toBe(b.placement.routing.cords.reduce((s, c) => s + c.pulleys, 0));
    expect(layout.pulleys).toBeLessThan(b.placement.routing.branches.reduce((s, x) => s + x.pulleys, 0));
    // The bill of materials measures the cord from the frame.
    const cord = buildReport(b).bom.find((r) => r.kind === 'cord');
    expect(cord?.total).toBeCloseTo(b.placement.totalCordM, 3);
  });

  it('carries the profile used: the shipped defaults say no more than that no value changed', () => {
    expect(buildReport(built('examples/marble-bell.lw')).profile).toEqual({ changes: [] });
  });
});
