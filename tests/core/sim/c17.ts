/** ISCAS-85 c17 built by hand as a lever netlist, and its exhaustive input set: shared by the fault tests. */
import type { Build } from '../../../src/core/model/build.js';
import type { Cord, Netlist, Part } from '../../../src/core/model/netlist.js';
import type { HandAction } from '../../../src/core/sim/hand.js';

/**
 * ISCAS-85 c17 (F. Brglez & H. Fujiwara, "A neutral netlist of 10 combinational benchmark
 * circuits", ISCAS 1985): inputs 1, 2, 3, 6, 7; six 2-input NANDs
 * 10 = NAND(1, 3), 11 = NAND(3, 6), 16 = NAND(2, 11), 19 = NAND(11, 7), 22 = NAND(10, 16),
 * 23 = NAND(16, 19); outputs 22 and 23. Built by hand as a lever netlist: an operator lever per
 * input, a one-port gate per NAND with its two cords on the port (wired-AND), and each output
 * read by an actuator on its gate's cord (lifted while the cord pulls, i.e. while the NAND is 0).
 */
export function c17(): Build {
  const ins = ['1', '2', '3', '6', '7'];
  const gates: [string, string, string][] = [
    ['10', '1', '3'],
    ['11', '3', '6'],
    ['16', '2', '11'],
    ['19', '11', '7'],
    ['22', '10', '16'],
    ['23', '16', '19'],
  ];
  const parts: Part[] = [
    ...ins.map((i): Part => ({ kind: 'lever', id: `i${i}`, name: `i${i}`, role: 'input', input: `i${i}` })),
    ...gates.map(([g]): Part => ({ kind: 'gate', id: `g${g}`, name: `g${g}`, role: 'output', ports: [{ name: 'a' }] })),
    { kind: 'actuator', id: 'o22', name: 'o22', output: 'o22', loadG: 100 },
    { kind: 'actuator', id: 'o23', name: 'o23', output: 'o23', loadG: 100 },
  ];
  const driverId = (s: string): string => (ins.includes(s) ? `i${s}` : `g${s}`);
  const cords: Cord[] = [...ins.map((i) => `i${i}`), ...gates.map(([g]) => `g${g}`)].map((d) => ({
    id: `c${d}`,
    driver: d,
    ports: gates.flatMap(([g, a, b]) =>
      [a, b].filter((x) => driverId(x) === d).map(() => ({ part: `g${g}`, port: 'a' })),
    ),
    actuators: d === 'g22' ? ['o22'] : d === 'g23' ? ['o23'] : [],
  }));
  const netlist: Netlist = { parts, cords };
  const build = {
    netlist,
    machine: {
      name: 'c17',
      inputs: ins.map((i) => `i${i}`),
      outputs: ['o22', 'o23'],
      states: ['only'],
      start: 0,
      rows: [],
    },
    signals: {
      inputs: Object.fromEntries(ins.map((i) => [`i${i}`, `i${i}`])),
      phi1: '',
      phi2: '',
      reset: '',
      masters: [],
      slaves: [],
      outputs: { o22: 'o22', o23: 'o23' },
    },
    encoding: { strategy: 'binary', bits: 0, codes: [''] },
  };
  // A hand-made netlist with only what the part-level simulator reads.
  return build as unknown as Build;
}

export const nand = (a: number, b: number): number => 1 - (a & b);

/** The 32 input settings, one row each: move the levers to the setting from the previous one. */
export function exhaustive(): HandAction[][] {
  const names = ['i1', 'i2', 'i3', 'i6', 'i7'];
  return Array.from({ length: 32 }, (_, a) =>
    names.map((input, i): HandAction => ({ kind: 'input', input, value: ((a >> (4 - i)) & 1) as 0 | 1 })),
  );
}
