import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { FlatMachine } from '../../../../src/core/model/flat.js';
import type { Cord, Netlist } from '../../../../src/core/model/netlist.js';
import { DEFAULT_PROFILE, type Profile } from '../../../../src/core/physics/profile.js';
import {
  countParts,
  mapToParts,
  splitFanout,
  tooManyBranches,
  withoutCapstan,
  withoutCapstanWords,
} from '../../../../src/core/phases/map/index.js';
import { synthesise } from '../../../../src/core/synthesise.js';
import { binaryEncoding, netlistViolations, polarityMismatch, randomMachine, settle } from '../../support/synthesis.js';

/** One state, inputs a and b, one Mealy output y = a xor b. */
const xor: FlatMachine = {
  name: 'xor',
  inputs: ['a', 'b'],
  outputs: ['y'],
  states: ['only'],
  start: 0,
  rows: [
    [
      { cube: '00', next: 0, out: [0], transition: 0 },
      { cube: '01', next: 0, out: [1], transition: 1 },
      { cube: '10', next: 0, out: [1], transition: 2 },
      { cube: '11', next: 0, out: [0], transition: 3 },
    ],
  ],
  never: [],
};

/** A coin-counting exhibit of our own: the bell rings on every second coin; `lamp` is always lit. */
const coins: FlatMachine = {
  name: 'coins',
  inputs: ['coin'],
  outputs: ['bell', 'lamp'],
  states: ['even', 'odd'],
  start: 0,
  rows: [
    [
      { cube: '0', next: 0, out: [0, 1], transition: 0 },
      { cube: '1', next: 1, out: [0, 1], transition: 1 },
    ],
    [
      { cube: '0', next: 1, out: [0, 1], transition: 0 },
      { cube: '1', next: 0, out: [1, 1], transition: 1 },
    ],
  ],
  never: [],
};

const small: Profile = { ...DEFAULT_PROFILE, maxPortsPerGate: 2, maxCordsPerPort: 2 };

describe('core/phases/map', () => {
  it('builds a two-input exclusive-OR from at most 5 gates besides its two levers (common practice: three NAND gates and two inverters, unbuffered output)', () => {
    const b = synthesise(xor, { strategy: 'binary', bits: 0, codes: [''] }, { profile: DEFAULT_PROFILE });
    expect(b.parts.levers).toBe(2);
    expect(b.parts.latches).toBe(0);
    expect(b.parts.gates).toBeLessThanOrEqual(5);
    const flag = b.signals.outputs.y;
    for (const [a, c, y] of [
      [0, 0, 0],
      [0, 1, 1],
      [1, 0, 1],
      [1, 1, 0],
    ] as const) {
      expect(settle(b.netlist, { 'in.a': a, 'in.b': c }, {}).shows(flag), `a=${a} b=${c}`).toBe(y);
    }
    expect(netlistViolations(b.netlist, DEFAULT_PROFILE)).toEqual([]);
  });

  it('keeps clock and reset levers out of a one-state (combinational) build', () => {
    const b = synthesise(xor, { strategy: 'binary', bits: 1, codes: ['0'] }, { profile: DEFAULT_PROFILE });
    expect(b.encoding.bits).toBe(0);
    expect(b.netlist.parts.filter((p) => p.kind === 'lever').map((p) => p.id)).toEqual(['in.a', 'in.b']);
    expect([b.signals.phi1, b.signals.phi2, b.signals.reset]).toEqual(['', '', '']);
  });

  it('gives stable, readable ids and the same netlist every time', () => {
    const b = synthesise(coins, binaryEncoding(coins), { profile: DEFAULT_PROFILE });
    const ids = b.netlist.parts.map((p) => p.id);
    for (const id of [
      'in.coin',
      'clk.phi1',
      'clk.phi2',
      'rst',
      'rst.drv',
      'm0',
      'm0.set',
      'm0.reset',
      's0',
      's0.set',
      's0.reset',
      'tr0.set',
      'tr0.reset',
      'flag.bell',
      'flag.lamp',
    ])
      expect(ids).toContain(id);
    expect(ids.some((id) => /^t\.S0\.1$/.test(id))).toBe(true);
    expect(ids.some((id) => /^t\.R0\.1$/.test(id))).toBe(true);
    expect(b.netlist.cords.every((c) => c.id === `c.${c.driver}`)).toBe(true);
    expect(synthesise(coins, binaryEncoding(coins), { profile: DEFAULT_PROFILE })).toEqual(b);
  });

  it('shows a constant output with a pinned flag and no gate', () => {
    const b = synthesise(coins, binaryEncoding(coins), { profile: DEFAULT_PROFILE });
    const lamp = b.netlist.parts.find((p) => p.id === b.signals.outputs.lamp);
    expect(lamp).toMatchObject({ kind: 'flag', fixed: 1, gate: '' });
  });

  it('ties the reset cord to S̄ where the start code has a 1 and to R̄ where it has a 0', () => {
    const b = synthesise(coins, { strategy: 'pinned', bits: 2, codes: ['10', '01'] }, { profile: DEFAULT_PROFILE });
    const rst = b.netlist.cords.find((c) => c.driver === 'rst.drv');
    const sides = (rst?.ports ?? []).map((p) => `${p.part}.${p.port}`).sort();
    expect(sides).toEqual(['m0.set.s1', 'm1.reset.r1', 's0.set.s1', 's1.reset.r1']);
  });

  it('pulls an actuator exactly when its output is 1, for a literal, a product and a sum', () => {
    // gong = coin (a literal), horn = odd xor coin (a sum of products), bell = odd·coin (a product).
    const m: FlatMachine = {
      ...coins,
      outputs: ['bell', 'lamp', 'gong', 'horn'],
      rows: coins.rows.map((rs, s) =>
        rs.map((r) => ({ ...r, out: [...r.out, r.cube === '1' ? 1 : 0, (r.cube === '1') !== (s === 1) ? 1 : 0] })),
      ),
    };
    // Unshared minimisation, so that each output keeps its own shape.
    const b = synthesise(m, binaryEncoding(m), {
      profile: DEFAULT_PROFILE,
      actuators: { bell: 200, lamp: 50, gong: 120, horn: 80 },
      minimiseOptions: { share: false },
    });
    expect(b.equations.slice(2).map((e) => [...e.terms].sort())).toEqual([['11'], ['--'], ['-1'], ['01', '10']]);
    expect(b.netlist.parts.find((p) => p.id === 'act.lamp')).toMatchObject({ kind: 'actuator', fixed: 1, loadG: 50 });
    expect(b.netlist.cords.find((c) => c.actuators.includes('act.horn'))?.driver).toBe('out.horn.drv');
    expect(polarityMismatch(b)).toBeNull();
    expect(netlistViolations(b.netlist, DEFAULT_PROFILE)).toEqual([]);
  });

  it('maps with the physical polarity: ports, flags and actuators agree with the equations (random machines)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 1e9 }), fc.boolean(), (seed, tight) => {
        const f = randomMachine(seed, { maxStates: 5, maxInputs: 3, maxOutputs: 3, incomplete: true });
        const profile = tight ? small : DEFAULT_PROFILE;
        const actuators = f.outputs.length > 1 && seed % 3 === 0 ? { [f.outputs[0]]: 100 } : {};
        const b = synthesise(f, binaryEncoding(f), { profile, actuators });
        expect(netlistViolations(b.netlist, profile)).toEqual([]);
        expect(polarityMismatch(b)).toBeNull();
      }),
      { seed: 42, numRuns: 40 },
    );
  });

  it('spreads a wide AND over a NAND + inverter tree within the port limits', () => {
    const sr = {
      vars: 6,
      functions: 2,
      terms: [
        { cube: '011011', outputs: [0] },
        { cube: '1-----', outputs: [1] },
      ],
    };
    const out = {
      vars: 6,
      functions: 1,
      terms: [
        { cube: '-11111', outputs: [0] },
        { cube: '-00000', outputs: [0] },
      ],
    };
    const m = mapToParts({
      bits: 1,
      inputs: ['a', 'b', 'c', 'd', 'e'],
      outputs: ['z'],
      startCode: '0',
      sr,
      out,
      profile: small,
    });
    expect(netlistViolations(m.netlist, small)).toEqual([]);
    const ids = m.netlist.parts.map((p) => p.id);
    expect(ids).toContain('t.S0.1.and1');
    expect(ids).toContain('t.S0.1.and1.inv');
    // φ1 stays on the top gate of the tree.
    expect(m.netlist.cords.find((c) => c.driver === 'clk.phi1')?.ports.map((p) => p.part)).toContain('t.S0.1');
  });

  it('counts gates, latches, levers, capstans, weights and cord branches', () => {
    const n: Netlist = {
      parts: [
        { kind: 'lever', id: 'in.a', name: 'a', role: 'input', input: 'a' },
        { kind: 'gate', id: 'g1', name: 'g1', role: 'inverter', ports: [{ name: 'p1' }] },
        { kind: 'gate', id: 'g2', name: 'g2', role: 'output', ports: [{ name: 'p1' }, { name: 'p2' }] },
        { kind: 'flag', id: 'flag.z', name: 'z', output: 'z', gate: 'g2', inverted: false },
      ],
      cords: [
        {
          id: 'c.in.a',
          driver: 'in.a',
          ports: [
            { part: 'g1', port: 'p1' },
            { part: 'g2', port: 'p1' },
          ],
          actuators: [],
        },
        { id: 'c.g1', driver: 'g1', ports: [{ part: 'g2', port: 'p2' }], actuators: [] },
      ],
    };
    // Weights: lever 1; one-port gate 1 (its port is Z); two-port gate 2 ports + Z = 3.
    // Capstans: the lever and g1 drive cords; g2 only shows a flag, so it has no capstan.
    expect(countParts(n)).toEqual({ gates: 2, latches: 0, levers: 1, capstans: 2, weights: 5, cords: 3 });
    expect(withoutCapstan(n)).toEqual({ gates: 1, levers: 0 });
    expect(withoutCapstanWords(n)).toBe('1 gate that only shows a flag has no capstan');
  });
});

describe('core/phases/map/fan-out', () => {
  const wide = (k: number): Netlist => ({
    parts: [
      { kind: 'lever', id: 'in.a', name: 'a', role: 'input', input: 'a' },
      ...Array.from({ length: k }, (_, i) => ({
        kind: 'gate' as const,
        id: `g${i}`,
        name: `g${i}`,
        role: 'inverter' as const,
        ports: [{ name: 'p1' }],
      })),
    ],
    cords: [
      {
        id: 'c.in.a',
        driver: 'in.a',
        ports: Array.from({ length: k }, (_, i) => ({ part: `g${i}`, port: 'p1' })),
        actuators: [],
      },
    ],
  });

  it('splits a cord with too many branches into buffer pairs that pass the same signal', () => {
    for (const k of [11, 25, 130]) {
      const n = splitFanout(wide(k), tooManyBranches(10));
      expect(n.cords.every((c) => c.ports.length + c.actuators.length <= 10)).toBe(true);
      expect(netlistViolations(n, DEFAULT_PROFILE)).toEqual([]);
      for (const a of [0, 1] as const) {
        const s = settle(n, { 'in.a': a }, {});
        for (let i = 0; i < k; i++) expect(s.signal.get(`g${i}`)).toBe(a === 1 ? 0 : 1);
      }
      expect(n.parts.filter((p) => p.kind === 'gate' && p.role === 'buffer').length).toBeGreaterThan(0);
    }
  });

  it('leaves cords alone when splitting cannot help, and stops', () => {
    const n = splitFanout(wide(5), () => true);
    expect(n).toEqual(wide(5));
    const never = (c: Cord): boolean => c.ports.length > 100;
    expect(splitFanout(wide(30), never)).toEqual(wide(30));
  });
});
