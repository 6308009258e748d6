/**
 * Hand-made builds for the simulator and check tests: small netlists wired by hand from
 * given set/reset and output equations, following DESIGN §5 literally (term gates
 * NAND(φ1, literals) on the master's S̄/R̄, transfer gates NAND(φ2, M) and NAND(φ2, M̄) on the
 * slave, one reset-driver gate, output gates read by inverted flags). No minimisation: the
 * equations are taken as written. The machines are scenarios invented for these tests.
 */
import type { Build, Encoding, Equation } from '../../../src/core/model/build.js';
import type { FlatMachine, FlatRow } from '../../../src/core/model/flat.js';
import type { Cord, GateRole, Part, PortRef } from '../../../src/core/model/netlist.js';

export interface HandSpec {
  readonly machine: FlatMachine;
  readonly codes: readonly string[];
  /** `S0`, `R0`, … per bit and one per output name; cubes over q-bits then inputs. */
  readonly equations: readonly Equation[];
}

/** Wire a build by hand from equations. */
export function handBuild(spec: HandSpec): Build {
  const m = spec.machine;
  const bits = spec.codes[0]?.length ?? 0;
  const parts: Part[] = [];
  const cords: Cord[] = [];
  let cordNo = 0;
  const cord = (driver: string, ports: PortRef[], actuators: string[] = []): void => {
    cords.push({ id: `c${++cordNo}`, driver, ports, actuators });
  };
  const gate = (id: string, role: GateRole, ports: string[], latch?: string): void => {
    parts.push({
      kind: 'gate',
      id,
      name: id,
      role,
      ports: ports.map((name) => ({ name })),
      ...(latch ? { latch } : {}),
    });
  };
  const lever = (id: string, role: 'input' | 'phi1' | 'phi2' | 'reset', input?: string): void => {
    parts.push({ kind: 'lever', id, name: id, role, ...(input ? { input } : {}) });
  };
  m.inputs.forEach((i) => lever(`in_${i}`, 'input', i));
  lever('phi1', 'phi1');
  lever('phi2', 'phi2');
  lever('reset', 'reset');

  const latch = (id: string, role: 'master' | 'slave', bit: number): void => {
    gate(`${id}.set`, 'latch-set', ['s', 'fb'], id);
    gate(`${id}.reset`, 'latch-reset', ['r', 'fb'], id);
    parts.push({ kind: 'latch', id, name: id, role, bit, setGate: `${id}.set`, resetGate: `${id}.reset` });
    cord(`${id}.set`, [{ part: `${id}.reset`, port: 'fb' }]);
    cord(`${id}.reset`, [{ part: `${id}.set`, port: 'fb' }]);
  };
  for (let b = 0; b < bits; b++) {
    latch(`M${b}`, 'master', b);
    latch(`Q${b}`, 'slave', b);
    gate(`T${b}.s`, 'transfer', ['a', 'b']);
    gate(`T${b}.r`, 'transfer', ['a', 'b']);
    cord('phi2', [
      { part: `T${b}.s`, port: 'a' },
      { part: `T${b}.r`, port: 'a' },
    ]);
    cord(`M${b}.set`, [{ part: `T${b}.s`, port: 'b' }]);
    cord(`M${b}.reset`, [{ part: `T${b}.r`, port: 'b' }]);
    cord(`T${b}.s`, [{ part: `Q${b}.set`, port: 's' }]);
    cord(`T${b}.r`, [{ part: `Q${b}.reset`, port: 'r' }]);
  }
  if (bits > 0) {
    gate('rd', 'reset-driver', ['a']);
    cord('reset', [{ part: 'rd', port: 'a' }]);
    const start = spec.codes[m.start];
    const ports: PortRef[] = [];
    for (let b = 0; b < bits; b++)
      for (const l of [`M${b}`, `Q${b}`])
        ports.push(start[b] === '1' ? { part: `${l}.set`, port: 's' } : { part: `${l}.reset`, port: 'r' });
    cord('rd', ports);
  }

  const inverted = new Set<string>();
  const literal = (v: number, c: string): string => {
    if (v < bits) return c === '1' ? `Q${v}.set` : `Q${v}.reset`;
    const name = m.inputs[v - bits];
    if (c === '1') return `in_${name}`;
    if (!inverted.has(name)) {
      inverted.add(name);
      gate(`inv_${name}`, 'inverter', ['a']);
      cord(`in_${name}`, [{ part: `inv_${name}`, port: 'a' }]);
    }
    return `inv_${name}`;
  };
  const termGate = (id: string, cube: string, clocked: boolean): void => {
    const drivers: string[] = clocked ? ['phi1'] : [];
    for (let v = 0; v < cube.length; v++) if (cube[v] !== '-') drivers.push(literal(v, cube[v]));
    gate(
      id,
      'term',
      drivers.map((_, k) => `p${k}`),
    );
    drivers.forEach((d, k) => cord(d, [{ part: id, port: `p${k}` }]));
  };
  const outputs: Record<string, string> = {};
  for (const eq of spec.equations) {
    const sr = /^([SR])(\d+)$/.exec(eq.name);
    if (sr) {
      const target = sr[1] === 'S' ? { part: `M${sr[2]}.set`, port: 's' } : { part: `M${sr[2]}.reset`, port: 'r' };
      eq.terms.forEach((t, k) => {
        termGate(`${eq.name}.t${k}`, t, true);
        cord(`${eq.name}.t${k}`, [target]);
      });
    } else {
      gate(`out_${eq.name}`, 'output', eq.terms.length > 0 ? ['a'] : []);
      eq.terms.forEach((t, k) => {
        termGate(`${eq.name}.t${k}`, t, false);
        cord(`${eq.name}.t${k}`, [{ part: `out_${eq.name}`, port: 'a' }]);
      });
      parts.push({
        kind: 'flag',
        id: `flag_${eq.name}`,
        name: `flag_${eq.name}`,
        output: eq.name,
        gate: `out_${eq.name}`,
        inverted: true,
      });
      outputs[eq.name] = `flag_${eq.name}`;
    }
  }
  const encoding: Encoding = { strategy: 'pinned', bits, codes: spec.codes };
  const gates = parts.filter((p) => p.kind === 'gate').length;
  const levers = parts.filter((p) => p.kind === 'lever').length;
  return {
    machine: m,
    encoding,
    vars: [...Array.from({ length: bits }, (_, b) => `q${b}`), ...m.inputs],
    equations: spec.equations,
    guard: { ok: true, extraGates: 0, extraCords: 0, method: 'by hand' },
    netlist: { parts, cords },
    signals: {
      inputs: Object.fromEntries(m.inputs.map((i) => [i, `in_${i}`])),
      phi1: 'phi1',
      phi2: 'phi2',
      reset: 'reset',
      masters: Array.from({ length: bits }, (_, b) => `M${b}`),
      slaves: Array.from({ length: bits }, (_, b) => `Q${b}`),
      outputs,
    },
    parts: { gates, latches: bits * 2, levers, capstans: gates + levers, weights: gates * 2, cords: cords.length },
  };
}

const row = (cube: string, next: number, out: (0 | 1 | '-')[], transition = 0): FlatRow => ({
  cube,
  next,
  out,
  transition,
});

/** A one-bit toggle: input `t` flips between `off` and `on`; output `lit` shows `on` (Moore). */
export function toggleMachine(): FlatMachine {
  return {
    name: 'toggle',
    inputs: ['t'],
    outputs: ['lit'],
    states: ['off', 'on'],
    start: 0,
    rows: [
      [row('1', 1, [0]), row('0', 0, [0], -1)],
      [row('1', 0, [1]), row('0', 1, [1], -1)],
    ],
    never: [],
  };
}

export function toggleBuild(): Build {
  return handBuild({
    machine: toggleMachine(),
    codes: ['0', '1'],
    equations: [
      { name: 'S0', terms: ['01'] },
      { name: 'R0', terms: ['11'] },
      { name: 'lit', terms: ['1-'] },
    ],
  });
}

/**
 * A three-step counter in two bits: `go` steps a (00) → b (01) → c (10) → a; output `top`
 * in c. Code 11 is unused. With `recovering`, 11 goes to 00 on every clock; without, the
 * equations leave 11 alone (a lock-up).
 */
export function counterMachine(): FlatMachine {
  return {
    name: 'counter',
    inputs: ['go'],
    outputs: ['top'],
    states: ['a', 'b', 'c'],
    start: 0,
    rows: [
      [row('1', 1, [0]), row('0', 0, [0], -1)],
      [row('1', 2, [0]), row('0', 1, [0], -1)],
      [row('1', 0, [1]), row('0', 2, [1], -1)],
    ],
    never: [],
  };
}

export function counterBuild(recovering: boolean): Build {
  return handBuild({
    machine: counterMachine(),
    codes: ['00', '01', '10'],
    equations: [
      { name: 'S0', terms: ['011'] },
      { name: 'R0', terms: recovering ? ['101', '11-'] : ['101'] },
      { name: 'S1', terms: ['001'] },
      { name: 'R1', terms: recovering ? ['011', '11-'] : ['011'] },
      { name: 'top', terms: ['10-'] },
    ],
  });
}

/** A bare NAND latch worked by two input levers through inverters (lever pulled → its port pulled). */
export function latchBuild(): Build {
  const m: FlatMachine = {
    name: 'latch',
    inputs: ['s', 'r'],
    outputs: [],
    states: ['clear', 'set'],
    start: 0,
    rows: [[], []],
    never: [],
  };
  const b = handBuild({ machine: m, codes: [], equations: [] });
  const parts: Part[] = [
    ...b.netlist.parts,
    { kind: 'gate', id: 'inv_s', name: 'inv_s', role: 'inverter', ports: [{ name: 'a' }] },
    { kind: 'gate', id: 'inv_r', name: 'inv_r', role: 'inverter', ports: [{ name: 'a' }] },
    { kind: 'gate', id: 'L.set', name: 'L.set', role: 'latch-set', ports: [{ name: 's' }, { name: 'fb' }], latch: 'L' },
    {
      kind: 'gate',
      id: 'L.reset',
      name: 'L.reset',
      role: 'latch-reset',
      ports: [{ name: 'r' }, { name: 'fb' }],
      latch: 'L',
    },
    { kind: 'latch', id: 'L', name: 'L', role: 'slave', bit: 0, setGate: 'L.set', resetGate: 'L.reset' },
  ];
  const cords: Cord[] = [
    { id: 'c1', driver: 'in_s', ports: [{ part: 'inv_s', port: 'a' }], actuators: [] },
    { id: 'c2', driver: 'in_r', ports: [{ part: 'inv_r', port: 'a' }], actuators: [] },
    { id: 'c3', driver: 'inv_s', ports: [{ part: 'L.set', port: 's' }], actuators: [] },
    { id: 'c4', driver: 'inv_r', ports: [{ part: 'L.reset', port: 'r' }], actuators: [] },
    { id: 'c5', driver: 'L.set', ports: [{ part: 'L.reset', port: 'fb' }], actuators: [] },
    { id: 'c6', driver: 'L.reset', ports: [{ part: 'L.set', port: 'fb' }], actuators: [] },
  ];
  return {
    ...b,
    encoding: { strategy: 'pinned', bits: 1, codes: ['0', '1'] },
    netlist: { parts, cords },
    signals: { ...b.signals, slaves: ['L'] },
  };
}
