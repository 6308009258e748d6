import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { analyse, buildMachine } from '../../../src/core/pipeline.js';
import { findCheck } from '../../../src/core/checks/registry.js';
import { drumLoad } from '../../../src/core/physics/drum.js';
import { driveSnapshots } from '../../../src/core/sim/snapshots.js';
import { buildJob, checkJob, compareJob, readJob, settle, torqueBars } from '../../../src/web/worker/jobs.js';
import { DEFAULT_SETTINGS, type BuildSettings } from '../../../src/web/worker/protocol.js';

const BELL = readFileSync(fileURLToPath(new URL('../../../examples/marble-bell.lw', import.meta.url)), 'utf8');
const binary: BuildSettings = { encoding: { strategy: 'binary' }, seed: 1, unusedCodes: 'dont-care' };
const LIGHTHOUSE = readFileSync(fileURLToPath(new URL('../../../examples/lighthouse.lw', import.meta.url)), 'utf8');

describe('src/web/worker/jobs', () => {
  it('reads a machine with the pipeline: the same diagnostics, plus the sketch', () => {
    const bad = BELL.replace('go two', 'go tow');
    const r = readJob(bad, 'b.lw');
    expect(r.reading.ok).toBe(false);
    expect(r.reading.diagnostics).toEqual(analyse(bad, 'b.lw').diagnostics);
    expect(r.analysed).toBeUndefined();
    const good = readJob(BELL, 'b.lw');
    expect(good.reading.ok).toBe(true);
    expect(good.reading.layout?.nodes).toHaveLength(4);
    expect(good.reading.reduced).toEqual(['none', 'one', 'two', 'rung']);
  });

  it('builds as the pipeline does and checks as runChecks does', () => {
    const a = readJob(BELL, 'b.lw').analysed;
    if (!a) throw new Error('must read');
    const b = buildJob(a, binary);
    if (!b.built || !b.view) throw new Error('must build');
    const ref = buildMachine(a, { encoding: 'binary', seed: 1, checks: false });
    if (!ref.ok) throw new Error('reference must build');
    expect(b.view.build.parts).toEqual(ref.build.parts);
    expect(b.view.equations.map((e) => e.name)).toEqual(['S0', 'R0', 'S1', 'R1', 'bell']);
    const c = checkJob(b.built, 1);
    expect(c.view.checks.map((x) => x.name)).toEqual([
      'forbidden-input',
      'next-state-equivalence',
      'equivalence',
      'recovery',
      'timing',
      'drive',
      'layout',
    ]);
    // The page's view carries the placement the designer's frame view reads.
    expect(b.view.placement).toEqual(ref.placement);
    expect(findCheck(c.view.checks, 'layout')?.ok).toBe(true);
    const margins = c.view.margins.map((m) => m.margin);
    expect(margins).toEqual([...margins].sort((x, y) => x - y));
    expect(c.view.torque.map((t) => t.state)).toEqual(['none', 'one', 'two', 'rung']);
    // The bars are the drive check's own figures, the same as simulating the snapshots afresh.
    const drive = findCheck(c.view.checks, 'drive');
    const drum = drumLoad(b.built.build.netlist, b.built.profile, driveSnapshots(b.built.build, b.built.profile, 1));
    expect(Math.max(...c.view.torque.map((t) => t.torqueNm))).toBeCloseTo(drum.worst.torqueNm, 12);
    expect(drive?.worstTorqueNm).toBe(drum.worst.torqueNm);
    expect(c.view.powerW).toBe(drum.worst.powerW);
    expect(c.view.rules.map((r) => r.rule)).toEqual(['clocks-apart', 'inputs-steady', 'reset-alone']);
    // The forces view's friction headroom is the drive check's, and a machine of flags has no loads.
    expect([c.view.mu, c.view.muMin, c.view.muAtMinMargin]).toEqual([0.25, drive?.muMin, drive?.muAtMinMargin]);
    expect(c.view.outputLoads).toEqual([]);
  });

  it('gives the forces view every output with a load, as the drive check found it', () => {
    const a = readJob(BELL.replace('outputs bell', 'outputs bell\nload bell 120 g'), 'b.lw').analysed;
    if (!a) throw new Error('must read');
    const b = buildJob(a, binary);
    if (!b.built) throw new Error('must build');
    const c = checkJob(b.built, 1);
    // 120 g on the two turns of the profile: 15 g · e^π = 347.1 g; routed out of the frame over two pulleys
    // (1/0.95² ≈ 1.108) the load is 133 g: margin 2.61, at most 173.5 × 0.95² = 156.6 g at margin 2.
    expect(c.view.outputLoads).toEqual([
      {
        output: 'bell',
        loadG: 120,
        maxLoadG: 156.6,
        margin: expect.closeTo((15 * Math.exp(Math.PI) * 0.95 ** 2) / 120, 12) as unknown,
      },
    ]);
  });

  it('keeps codes chosen from a comparison exactly', () => {
    const a = readJob(BELL, 'b.lw').analysed;
    if (!a) throw new Error('must read');
    const rows = compareJob(a, binary);
    expect(rows.some((r) => r.cheapest)).toBe(true);
    const best = Math.min(...rows.flatMap((r) => (r.cost === undefined ? [] : [r.cost])));
    for (const r of rows) expect(r.cheapest).toBe(r.cost === best);
    const gray = rows.find((r) => r.strategy === 'gray');
    if (!gray?.encoding) throw new Error('gray must fit');
    const kept = buildJob(a, { ...binary, encoding: { kept: gray.encoding, states: gray.states } });
    expect(kept.view?.build.encoding.codes).toEqual(gray.encoding.codes);
    expect(kept.view?.build.parts).toEqual(gray.parts);
    expect(kept.view?.dropped).toBeUndefined();
  });

  it('drops codes kept for other states, and unused codes sent to a state the machine lacks, with a plain notice', () => {
    const bell = readJob(BELL, 'b.lw').analysed;
    const other = readJob(LIGHTHOUSE, 'l.lw').analysed;
    if (!bell || !other) throw new Error('must read');
    const gray = compareJob(bell, binary).find((r) => r.strategy === 'gray');
    if (!gray?.encoding) throw new Error('gray must fit');
    const asked: BuildSettings = { ...DEFAULT_SETTINGS, encoding: { kept: gray.encoding, states: gray.states } };
    // The same machine keeps them.
    expect(settle(bell, asked)).toEqual({ settings: asked, dropped: [] });
    // Another machine drops them: the searched codes again, said in words, and the build has no error.
    const s = settle(other, { ...asked, unusedCodes: 'rung' });
    expect(s.settings).toEqual(DEFAULT_SETTINGS);
    expect(s.dropped.map((d) => d.setting)).toEqual(['encoding', 'unused']);
    expect(s.dropped[0].words).toBe(
      `the codes you picked were for ${gray.states.length} states; back to the searched codes`,
    );
    const b = buildJob(other, { ...asked, unusedCodes: 'rung' });
    expect(b.view?.dropped).toEqual(s.dropped);
    expect(b.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    expect(b.view?.build.parts).toEqual(buildJob(other, DEFAULT_SETTINGS).view?.build.parts);
  });

  it("draws one torque bar per state from the drive check's worst cases, the place in words", () => {
    const bars = torqueBars({
      worstByState: [
        { where: { state: 'a', code: '0', inputs: '1', phase: 'phi2-pulled' }, torqueNm: 3, powerW: 6 },
        { where: { state: 'b', code: '1', inputs: '', phase: 'inputs-held' }, torqueNm: 2, powerW: 4 },
      ],
    });
    expect(bars).toEqual([
      { state: 'a', torqueNm: 3, at: 'inputs 1, φ2 pulled' },
      { state: 'b', torqueNm: 2, at: 'inputs —, inputs held' },
    ]);
  });
});
