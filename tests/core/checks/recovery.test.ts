import { describe, expect, it } from 'vitest';
import { checkRecovery } from '../../../src/core/checks/recovery.js';
import type { Build } from '../../../src/core/model/build.js';
import type { Cord, Part } from '../../../src/core/model/netlist.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { counterBuild, counterMachine, handBuild } from '../sim/handmade.js';
import { brokenBuild, exampleBuild } from './builds.js';

/**
 * Gate the φ1 lever of a build so that its term gates never see φ1 while the slaves hold
 * `code`: the masters then keep that code, and φ2 copies it back — a lock-up at `code`.
 */
function lockAt(b: Build, code: string): Build {
  const latch = (id: string) => b.netlist.parts.find((p) => p.id === id);
  const literal = b.signals.slaves.map((id, j) => {
    const l = latch(id);
    if (l?.kind !== 'latch') throw new Error(`no slave ${id}`);
    return code[j] === '1' ? l.setGate : l.resetGate;
  });
  const parts: Part[] = [
    { kind: 'gate', id: 'lock.detect', name: 'lock detect', role: 'buffer', ports: [{ name: 'a' }] },
    { kind: 'gate', id: 'lock.g1', name: 'lock gate 1', role: 'buffer', ports: [{ name: 'a' }] },
    { kind: 'gate', id: 'lock.g2', name: 'lock gate 2', role: 'buffer', ports: [{ name: 'a' }] },
  ];
  const added: Cord[] = [
    ...literal.map((d, j) => ({
      id: `lock.l${j}`,
      driver: d,
      ports: [{ part: 'lock.detect', port: 'a' }],
      actuators: [],
    })),
    { id: 'lock.phi1', driver: b.signals.phi1, ports: [{ part: 'lock.g1', port: 'a' }], actuators: [] },
    { id: 'lock.d', driver: 'lock.detect', ports: [{ part: 'lock.g1', port: 'a' }], actuators: [] },
    { id: 'lock.g', driver: 'lock.g1', ports: [{ part: 'lock.g2', port: 'a' }], actuators: [] },
  ];
  const cords = b.netlist.cords.map((c) => (c.driver === b.signals.phi1 ? { ...c, driver: 'lock.g2' } : c));
  return { ...b, netlist: { parts: [...b.netlist.parts, ...parts], cords: [...cords, ...added] } };
}

describe('core/checks/recovery', () => {
  it('gives k per unused code for a counter whose unused code goes home', () => {
    const r = checkRecovery(counterBuild(true), DEFAULT_PROFILE);
    expect(r).toMatchObject({ name: 'recovery', ok: true, codes: [{ code: '11', k: 1 }], worstK: 1, checked: 'all' });
    expect(r.summary).toBe('every unused code (1) reaches a used code within 1 clock');
  });

  it('finds the lock-up loop of the broken counter and gives the hint', () => {
    const r = checkRecovery(brokenBuild('counter-lock-up'), DEFAULT_PROFILE);
    expect(r.ok).toBe(false);
    expect(r.codes).toEqual([{ code: '11', k: null }]);
    expect(r.worstK).toBeNull();
    expect(r.loop).toEqual({
      codes: ['11'],
      inputs: ['0'],
      words: 'lock-up loop among unused codes: 11 —go=0→ 11, for ever',
    });
    expect(r.hint).toMatch(/unusedCodes/);
    expect(r.summary).toBe(
      '1 unused code can stay unused for ever: lock-up loop among unused codes: 11 —go=0→ 11, for ever',
    );
  });

  it('leaves out never inputs unless told to include them', () => {
    // 11 goes home only when go is pulled; go released is declared never to happen.
    const m = counterMachine();
    const busy = { ...m, never: ['0'], rows: m.rows.map((rs) => rs.filter((r) => r.cube === '1')) };
    const b = handBuild({
      machine: busy,
      codes: ['00', '01', '10'],
      equations: [
        { name: 'S0', terms: ['011'] },
        { name: 'R0', terms: ['1-1'] },
        { name: 'S1', terms: ['001'] },
        { name: 'R1', terms: ['-11'] },
        { name: 'top', terms: ['10-'] },
      ],
    });
    expect(checkRecovery(b, DEFAULT_PROFILE)).toMatchObject({ ok: true, worstK: 1 });
    expect(checkRecovery(b, DEFAULT_PROFILE, { includeNever: true })).toMatchObject({
      ok: false,
      loop: { codes: ['11'], inputs: ['0'] },
    });
  });

  it('proves a real build whose unused codes are sent to the start state', () => {
    const { build } = exampleBuild('crossing', { unusedCodes: 'road_open' });
    const r = checkRecovery(build, DEFAULT_PROFILE);
    expect(r.ok).toBe(true);
    expect(r.codes.map((c) => c.code)).toEqual(['101', '110', '111']);
    expect(r.worstK).toBe(1);
  });

  it('finds a lock-up put into a real build', () => {
    const { build } = exampleBuild('crossing', { unusedCodes: 'road_open' });
    const r = checkRecovery(lockAt(build, '110'), DEFAULT_PROFILE);
    expect(r.ok).toBe(false);
    expect(r.loop?.codes).toEqual(['110']);
    expect(r.codes.find((c) => c.code === '101')?.k).toBe(1);
  });
});
