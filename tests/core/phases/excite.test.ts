import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { assignments, coverHolds, intersectCovers, isTautology, type Cube } from '../../../src/core/model/cube.js';
import { DONT_CARE, type FlatMachine } from '../../../src/core/model/flat.js';
import { excite } from '../../../src/core/phases/excite.js';
import { binaryEncoding, randomEncoding, randomMachine } from '../support/synthesis.js';

/** Two states A (code 0) and B (code 1), input x: x = 1 goes to B, x = 0 goes to A. */
const toggleable: FlatMachine = {
  name: 'two',
  inputs: ['x'],
  outputs: [],
  states: ['A', 'B'],
  start: 0,
  rows: [
    [
      { cube: '0', next: 0, out: [], transition: 0 },
      { cube: '1', next: 1, out: [], transition: 1 },
    ],
    [
      { cube: '0', next: 0, out: [], transition: 0 },
      { cube: '1', next: 1, out: [], transition: 1 },
    ],
  ],
  never: [],
};

/** Value of an SR function at a point: 1 on, '-' don't-care, 0 elsewhere. */
function valueAt(fn: { on: readonly Cube[]; dc: readonly Cube[] }, point: string): 0 | 1 | '-' {
  if (coverHolds(fn.on, point)) return 1;
  return coverHolds(fn.dc, point) ? '-' : 0;
}

describe('core/phases/excite', () => {
  it('follows the SR excitation table (Mano & Ciletti, Digital Design, flip-flop excitation tables, sequential-circuits chapter)', () => {
    const ex = excite(toggleable, { strategy: 'binary', bits: 1, codes: ['0', '1'] });
    // Q → Q⁺ : S R  —  0→0: 0 –   0→1: 1 0   1→0: 0 1   1→1: – 0
    const table: [string, 0 | 1 | '-', 0 | 1 | '-'][] = [
      ['00', 0, '-'], // q = 0, x = 0 → stays 0
      ['01', 1, 0], // q = 0, x = 1 → goes to 1
      ['10', 0, 1], // q = 1, x = 0 → goes to 0
      ['11', '-', 0], // q = 1, x = 1 → stays 1
    ];
    for (const [point, s, r] of table) {
      expect(valueAt(ex.set[0], point), `S at ${point}`).toBe(s);
      expect(valueAt(ex.reset[0], point), `R at ${point}`).toBe(r);
    }
    expect(ex.vars).toEqual(['q0', 'x']);
    expect(ex.globalDc).toEqual([]);
  });

  it("makes unused codes, never inputs and free next states global don't-cares", () => {
    const f: FlatMachine = {
      name: 'three',
      inputs: ['a', 'b'],
      outputs: ['z'],
      states: ['P', 'Q', 'R'],
      start: 0,
      rows: [
        [{ cube: '0-', next: 1, out: [1], transition: 0 }],
        [{ cube: '0-', next: DONT_CARE, out: ['-'], transition: -1 }],
        [{ cube: '0-', next: 0, out: [0], transition: 0 }],
      ],
      never: ['1-'],
    };
    const ex = excite(f, { strategy: 'binary', bits: 2, codes: ['00', '01', '10'] });
    expect(ex.unusedCodes).toEqual(['11']);
    expect([...ex.globalDc].sort()).toEqual(['--1-', '010-', '11--']);
    // Outputs: don't-care under never, at the unused code, and where the row says '-'.
    expect([...ex.outputs[0].dc].sort()).toEqual(['--1-', '010-', '11--']);
    expect(ex.outputs[0].on).toEqual(['000-']);
    expect(ex.outputs[0].off).toEqual(['100-']);
  });

  it("sends unused codes to a chosen state when asked, so they are no longer don't-cares", () => {
    const f = randomMachine(7, { maxStates: 3, maxInputs: 2, maxOutputs: 1, incomplete: false });
    const enc = randomEncoding(f, 3, 1);
    const ex = excite(f, enc, { unusedCodes: f.start });
    const target = enc.codes[f.start];
    for (const u of ex.unusedCodes)
      for (const x of assignments(f.inputs.length)) {
        const point = u.replaceAll('-', '0') + x;
        for (let j = 0; j < enc.bits; j++) {
          const next = coverHolds(ex.set[j].on, point) ? '1' : coverHolds(ex.reset[j].on, point) ? '0' : point[j];
          expect(next).toBe(target[j]);
        }
      }
    expect(ex.globalDc.some((c) => ex.unusedCodes.some((u) => c.startsWith(u)))).toBe(false);
  });

  it('tells Moore from Mealy outputs by the function, not by where they were written', () => {
    const f: FlatMachine = {
      name: 'mix',
      inputs: ['a'],
      outputs: ['same', 'differs', 'partly'],
      states: ['P', 'Q'],
      start: 0,
      rows: [
        // Written per transition, but equal on both rows: a Moore output.
        [
          { cube: '0', next: 1, out: [1, 0, 1], transition: 0 },
          { cube: '1', next: 0, out: [1, 1, '-'], transition: 1 },
        ],
        [
          { cube: '0', next: 0, out: [0, 0, 0], transition: 0 },
          { cube: '1', next: 1, out: [0, 0, '-'], transition: 1 },
        ],
      ],
      never: [],
    };
    const ex = excite(f, binaryEncoding(f));
    expect(ex.outputs.map((o) => o.moore)).toEqual([true, false, true]);
  });

  it('classifies every point of every bit exactly once (random machines, cube operations)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 1e9 }), (seed) => {
        const f = randomMachine(seed, { maxStates: 6, maxInputs: 3, maxOutputs: 2, incomplete: true });
        const bits = Math.max(1, Math.ceil(Math.log2(f.states.length))) + (seed % 2);
        const ex = excite(f, randomEncoding(f, bits, seed));
        const n = bits + f.inputs.length;
        for (let j = 0; j < bits; j++) {
          const parts = [ex.set[j].on, ex.set[j].tableDc, ex.reset[j].on, ex.reset[j].tableDc, ex.globalDc];
          for (let a = 0; a < parts.length; a++)
            for (let b = a + 1; b < parts.length; b++) expect(intersectCovers(parts[a], parts[b])).toEqual([]);
          expect(isTautology(parts.flat(), n)).toBe(true);
          // The table's own don't-cares lie on opposite sides of q_j.
          expect(ex.set[j].tableDc.every((c) => c[j] === '1')).toBe(true);
          expect(ex.reset[j].tableDc.every((c) => c[j] === '0')).toBe(true);
        }
      }),
      { seed: 42, numRuns: 60 },
    );
  });
});
