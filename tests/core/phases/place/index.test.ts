import { readFileSync, readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { auditPlacement, place, type Placement } from '../../../../src/core/phases/place/index.js';
import { frameUnits } from '../../../../src/core/phases/place/units.js';
import type { Netlist } from '../../../../src/core/model/netlist.js';
import { DEFAULT_PROFILE, type Profile } from '../../../../src/core/physics/profile.js';
import { buildNetlist, netlistOrderChannel } from './support.js';

const F = DEFAULT_PROFILE.frame;

/** The example exhibits (our own scenarios), built as `latchwright build` builds them, checks skipped. */
const EXAMPLES = readdirSync('examples')
  .filter((f) => f.endsWith('.lw'))
  .sort();
const built = new Map<string, Netlist>();
function netlistOf(file: string): Netlist {
  const cached = built.get(file);
  if (cached) return cached;
  const n = buildNetlist(readFileSync(`examples/${file}`, 'utf8'), file);
  built.set(file, n);
  return n;
}

/** The layout rules of design §11, checked on a placement from the outside. */
function expectLayoutRules(n: Netlist, p: Placement, profile: Profile): void {
  const placeable = n.parts.filter(
    (x) => x.kind === 'gate' || x.kind === 'lever' || (x.kind === 'actuator' && x.fixed === undefined),
  );
  // Every part has exactly one bay, and no two parts share one.
  expect(p.bays.map((b) => b.part).sort()).toEqual(placeable.map((x) => x.id).sort());
  expect(new Set(p.bays.map((b) => `${b.drum}:${b.bay}`)).size).toBe(p.bays.length);
  for (const d of p.drums) {
    const on = p.bays.filter((b) => b.drum === d.drum).sort((a, b) => a.bay - b.bay);
    expect(on.map((b) => b.bay)).toEqual(on.map((_, i) => i + 1));
    expect(d.lengthM).toBeCloseTo(
      on.reduce((s, b) => s + b.widthM, 0),
      12,
    );
    let x = 0;
    for (const b of on) {
      expect(b.leftM).toBeCloseTo(x, 12);
      expect(b.xM).toBeCloseTo(x + b.widthM / 2, 12);
      x += b.widthM;
    }
  }
  const at = new Map(p.bays.map((b) => [b.part, b]));
  for (const l of n.parts.filter((x) => x.kind === 'latch')) {
    const s = at.get(l.setGate);
    const r = at.get(l.resetGate);
    expect(s?.drum).toBe(r?.drum);
    expect(Math.abs((s?.bay ?? 0) - (r?.bay ?? 0))).toBe(1);
  }
  // Operator levers at the visitor end, clock and reset levers at the crank end, of drum 1.
  const drum1 = p.bays.filter((b) => b.drum === 1).sort((a, b) => a.bay - b.bay);
  const zone = (part: string): number => {
    const x = n.parts.find((q) => q.id === part);
    if (x?.kind === 'lever') return x.role === 'input' ? 0 : 2;
    return x?.kind === 'actuator' ? 0 : 1;
  };
  const zones = drum1.map((b) => zone(b.part));
  expect([...zones].sort((a, b) => a - b)).toEqual(zones);
  for (const b of p.bays) if (zone(b.part) !== 1) expect(b.drum).toBe(1);
  // Bay widths: max(levers × pitch, wraps × wrap pitch + clearance) — design §11 — with the
  // capstan's own turns; a part that pulls no cord has no capstan.
  const drivers = new Set(n.cords.map((c) => c.driver));
  for (const b of p.bays) {
    const part = n.parts.find((q) => q.id === b.part);
    if (part?.kind === 'actuator') continue;
    const levers = part?.kind === 'gate' && part.ports.length > 1 ? part.ports.length + 1 : 1;
    const wraps = part?.kind === 'gate' && part.wraps !== undefined ? part.wraps : profile.wraps;
    const capstan = drivers.has(b.part) ? wraps * profile.wrapPitchM + profile.frame.bayClearanceM : 0;
    expect(b.widthM).toBeCloseTo(Math.max(levers * profile.frame.leverPitchM, capstan), 12);
  }
}

describe('core/phases/place', () => {
  it.each(EXAMPLES)('places %s by the layout rules, never longer in cord than the netlist order', (file) => {
    const n = netlistOf(file);
    const p = place(n, DEFAULT_PROFILE);
    expectLayoutRules(n, p, DEFAULT_PROFILE);
    expect(p.totalCordM).toBeLessThanOrEqual(p.baselineCordM + 1e-9);
    expect(p.channelM).toBeCloseTo(p.routing.channelM, 12);
    expect(p.totalCordM).toBeCloseTo(p.routing.totalCordM, 12);
    for (const d of p.drums) expect(d.lengthM).toBeLessThanOrEqual(F.longestDrumM + 1e-9);
    expect(p.problems).toEqual([]);
    expect(auditPlacement(n, p, DEFAULT_PROFILE)).toEqual([]);
    if (p.drums.length === 1) expect(p.baselineChannelM).toBeCloseTo(netlistOrderChannel(n, DEFAULT_PROFILE), 9);
  });

  it('places an empty netlist on one empty drum, and a lone lever in bay 1', () => {
    const empty = place({ parts: [], cords: [] }, DEFAULT_PROFILE);
    expect(empty).toMatchObject({
      method: 'exact',
      exact: true,
      bays: [],
      totalCordM: 0,
      baselineCordM: 0,
      problems: [],
    });
    expect(empty.drums).toEqual([{ drum: 1, lengthM: 0, levelM: 0, bays: [], method: 'exact' }]);
    const lone = place(
      { parts: [{ kind: 'lever', id: 'in.a', name: 'a', role: 'input' }], cords: [] },
      DEFAULT_PROFILE,
    );
    expect(lone.bays).toMatchObject([{ part: 'in.a', drum: 1, bay: 1 }]);
  });

  it('is deterministic for a given seed', () => {
    const n = netlistOf('sequence-lock.lw');
    expect(place(n, DEFAULT_PROFILE, { seed: 4 })).toEqual(place(n, DEFAULT_PROFILE, { seed: 4 }));
  });

  it('splits a machine over two drums when one would be too long, and routes the cords between them', () => {
    const n = netlistOf('marble-bell.lw');
    const short: Profile = { ...DEFAULT_PROFILE, frame: { ...F, longestDrumM: 0.8 } };
    const p = place(n, short);
    expect(p.drums.length).toBe(2);
    expectLayoutRules(n, p, short);
    for (const d of p.drums) expect(d.lengthM).toBeLessThanOrEqual(0.8);
    expect(p.drums[1].levelM).toBeCloseTo(F.drumSpacingM, 12);
    expect(p.crossDrumBranches).toBeGreaterThan(0);
    expect(p.routing.branches.filter((b) => b.crossDrum).length).toBe(p.crossDrumBranches);
    expect(p.totalCordM).toBeLessThanOrEqual(p.baselineCordM + 1e-9);
    expect(p.problems).toEqual([]);
    // With one drum allowed the same machine is over the frame's limit, and the placement says what to change.
    const one = place(n, { ...short, frame: { ...short.frame, drumsPerFrame: 1 } });
    expect(one.problems).toEqual([expect.objectContaining({ kind: 'too-many-drums', drums: 2, allowed: 1 })]);
    expect(one.problems[0].hint).toMatch(/frame\.drumsPerFrame|frame\.longestDrumM/);
  });

  it('reports a part wider than the longest drum', () => {
    const n = netlistOf('odd-lever.lw');
    const p = place(n, { ...DEFAULT_PROFILE, frame: { ...F, longestDrumM: 0.025 } });
    const wide = p.problems.filter((x) => x.kind === 'bay-too-wide');
    expect(wide.length).toBe(p.bays.length);
    expect(wide[0].hint).toMatch(/frame\.longestDrumM/);
    expect(p.problems.some((x) => x.kind === 'drum-too-long')).toBe(true);
  });

  it('keeps pinned parts in their bays: a gate, and a latch (set side first)', () => {
    const n = netlistOf('marble-bell.lw');
    const p = place(n, DEFAULT_PROFILE, { pins: { 't.S0.1': { bay: 5 }, m1: { bay: 9, drum: 1 } } });
    expect(p.problems).toEqual([]);
    const at = new Map(p.bays.map((b) => [b.part, b]));
    expect(at.get('t.S0.1')?.bay).toBe(5);
    expect(at.get('m1.set')?.bay).toBe(9);
    expect(at.get('m1.reset')?.bay).toBe(10);
    expectLayoutRules(n, p, DEFAULT_PROFILE);
    expect(p.channelM).toBeGreaterThanOrEqual(place(n, DEFAULT_PROFILE).channelM - 1e-9);
  });

  it('reports every pin it cannot keep, with what to change', () => {
    const n = netlistOf('marble-bell.lw');
    const p = place(n, DEFAULT_PROFILE, {
      pins: {
        't.S0.l': { bay: 3 },
        'flag.bell': { bay: 2 },
        'm0.set': { bay: 4 },
        'm0.reset': { bay: 4 },
        'o.bell.1': { bay: 200 },
        'tr0.set': { bay: 1, drum: 3 },
      },
    });
    const kinds = Object.fromEntries(p.problems.map((x) => [x.kind, x]));
    expect(kinds['pin-unknown-part']).toMatchObject({ part: 't.S0.l', hint: "did you mean 't.S0.1'?" });
    expect(kinds['pin-not-placeable']).toMatchObject({
      part: 'flag.bell',
      hint: "a flag rides on its gate: pin 'o.bell.1' instead",
    });
    expect(kinds['pin-clash']).toMatchObject({ part: 'm0.reset', other: 'm0.set', bay: 4 });
    expect(kinds['pin-out-of-range']).toMatchObject({ part: 'tr0.set', drum: 3 });
    expect(kinds['pin-beyond-drum']).toMatchObject({ part: 'o.bell.1', bay: 200, bays: p.drums[0].bays.length });
    expect(p.bays.find((b) => b.part === 'm0.set')?.bay).toBe(4);
    expectLayoutRules(n, p, DEFAULT_PROFILE);
  });

  it('drops pins that no order can meet together, and says so', () => {
    const n = netlistOf('marble-bell.lw');
    // A one-bay gate between two pinned bays one apart leaves a single free bay: no latch fits there,
    // and the latch's own pin needs both.
    const p = place(n, DEFAULT_PROFILE, {
      pins: { 'm0.set': { bay: 6 }, 't.S0.1': { bay: 7 }, 'm0.reset': { bay: 8 } },
    });
    expect(
      p.problems
        .filter((x) => x.kind === 'pin-unmet')
        .map((x) => x.part)
        .sort(),
    ).toEqual(['m0.reset', 'm0.set', 't.S0.1']);
    expectLayoutRules(n, p, DEFAULT_PROFILE);
  });

  it('gives a flag its gate’s bay and a latch its two bays', () => {
    const n = netlistOf('marble-bell.lw');
    const p = place(n, DEFAULT_PROFILE);
    const at = new Map(p.bays.map((b) => [b.part, b]));
    expect(p.flags).toEqual([{ flag: 'flag.bell', gate: 'o.bell.1', drum: 1, bay: at.get('o.bell.1')?.bay }]);
    expect(p.latches.map((l) => l.latch).sort()).toEqual(['m0', 'm1', 's0', 's1']);
    for (const l of p.latches) expect(l.bays).toEqual([at.get(`${l.latch}.set`)?.bay, at.get(`${l.latch}.reset`)?.bay]);
  });
});

describe('core/phases/place/audit', () => {
  it('finds every rule a tampered placement breaks', () => {
    const n = netlistOf('marble-bell.lw');
    const p = place(n, DEFAULT_PROFILE);
    const rules = (q: Placement, profile: Profile = DEFAULT_PROFILE) =>
      auditPlacement(n, q, profile).map((f) => f.rule);
    const at = (part: string) => p.bays.findIndex((b) => b.part === part);
    // A latch's reset side moved onto another part's bay.
    const moved = p.bays.map((b, i) => (i === at('m0.reset') ? { ...b, bay: p.bays[at('t.S0.1')].bay } : b));
    expect(rules({ ...p, bays: moved })).toEqual(expect.arrayContaining(['shared-bay', 'bay-order', 'latch-apart']));
    // A part dropped.
    expect(rules({ ...p, bays: p.bays.filter((b) => b.part !== 'clk.phi1') })).toContain('no-bay');
    // A clock lever at the visitor end.
    const first = p.bays.find((b) => b.bay === 1);
    const phi = p.bays.find((b) => b.part === 'clk.phi1');
    const swapped = p.bays.map((b) =>
      b === first ? { ...b, part: 'clk.phi1' } : b === phi ? { ...b, part: first?.part ?? '' } : b,
    );
    expect(rules({ ...p, bays: swapped })).toContain('end-rule');
    // A branch cut short, a drum too long, too many drums.
    const [b0, ...rest] = p.routing.branches;
    expect(
      rules({ ...p, routing: { ...p.routing, branches: [{ ...b0, lengthM: b0.lengthM - 0.1 }, ...rest] } }),
    ).toEqual(['branch-length']);
    expect(rules(p, { ...DEFAULT_PROFILE, frame: { ...F, longestDrumM: 1, drumsPerFrame: 1 } })).toEqual([
      'drum-too-long',
    ]);
    expect(
      rules(
        { ...p, drums: [...p.drums, { ...p.drums[0], drum: 2, bays: [], lengthM: 0 }] },
        {
          ...DEFAULT_PROFILE,
          frame: { ...F, drumsPerFrame: 1 },
        },
      ),
    ).toEqual(['too-many-drums']);
  });
});

describe('core/phases/place/units', () => {
  it('makes one bay per gate, lever and actuator exit, latches as one unit of two bays', () => {
    const n = netlistOf('marble-bell.lw');
    const fu = frameUnits(n, DEFAULT_PROFILE);
    expect(fu.bays.length).toBe(n.parts.filter((p) => p.kind === 'gate' || p.kind === 'lever').length);
    const m0 = fu.units[fu.unitOf.get('m0') as number];
    expect(m0.kind).toBe('latch');
    expect(m0.bays.map((b) => fu.bays[b].part)).toEqual(['m0.set', 'm0.reset']);
    expect(fu.unitOf.get('m0.reset')).toBe(fu.unitOf.get('m0'));
    expect(fu.bays[fu.bayOf.get('m0.set') as number].levers).toEqual(['s1', 'fb', 'Z']);
    expect(fu.bays[fu.bayOf.get('t.S0.1') as number].levers).toEqual(['p1']);
    expect(fu.branches.length).toBe(n.cords.reduce((s, c) => s + c.ports.length + c.actuators.length, 0));
    expect(fu.units.find((u) => u.id === 'in.marble')?.zone).toBe(0);
    expect(fu.units.find((u) => u.id === 'clk.phi1')?.zone).toBe(2);
    expect(fu.units.find((u) => u.id === 'rst')?.zone).toBe(2);
  });
});
