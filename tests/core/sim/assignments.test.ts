import { describe, expect, it } from 'vitest';
import { holds } from '../../../src/core/model/cube.js';
import { seededRandom } from '../../../src/core/model/random.js';
import {
  allCodes,
  describeInputs,
  EXHAUSTIVE_INPUTS,
  grayAssignments,
  inputAssignments,
  machineInputs,
  randomCodes,
  SAMPLED_INPUTS,
  type InputSpace,
} from '../../../src/core/sim/assignments.js';
import { toggleMachine } from './handmade.js';

const space = (inputs: number, cubes: string[] = [], never: string[] = []): InputSpace => ({ inputs, cubes, never });
const differIn = (a: string, b: string): number => [...a].filter((c, i) => c !== b[i]).length;

describe('core/sim/assignments', () => {
  it('tries every combination in reflected Gray-code order up to the bound (the 3-bit table of Knuth, TAOCP 4A §7.2.1.1, from memory)', () => {
    // Reflected binary Gray code for 3 bits, as tabulated in the textbooks: 000 001 011 010 110 111 101 100.
    expect(grayAssignments(3)).toEqual(['000', '001', '011', '010', '110', '111', '101', '100']);
    const r = inputAssignments(space(3), seededRandom(1));
    expect(r).toEqual({ list: grayAssignments(3), exhaustive: true });
    const n = EXHAUSTIVE_INPUTS;
    const at = inputAssignments(space(n), seededRandom(1));
    expect(at.exhaustive).toBe(true);
    expect(at.list).toHaveLength(2 ** n);
    expect(new Set(at.list).size).toBe(2 ** n);
    // One lever moves between neighbours.
    for (let i = 1; i < 64; i++) expect(differIn(at.list[i - 1], at.list[i])).toBe(1);
    expect(inputAssignments(space(0), seededRandom(1)).list).toEqual(['']);
  });

  it("leaves out the machine's never combinations unless told to include them", () => {
    const s = space(3, [], ['1-1']);
    expect(inputAssignments(s, seededRandom(1)).list).toEqual(['000', '001', '011', '010', '110', '100']);
    expect(inputAssignments(s, seededRandom(1), { includeNever: true }).list).toEqual(grayAssignments(3));
  });

  it('samples beyond the bound: one combination inside each cube, then seeded random ones, deterministic per seed', () => {
    const n = EXHAUSTIVE_INPUTS + 4;
    const cubes = ['1'.repeat(n), '-'.repeat(n - 1) + '1', '0' + '-'.repeat(n - 1)];
    const a = inputAssignments(space(n, cubes), seededRandom(7));
    const b = inputAssignments(space(n, cubes), seededRandom(7));
    const c = inputAssignments(space(n, cubes), seededRandom(8));
    expect(a.exhaustive).toBe(false);
    expect(a.list).toEqual(b.list);
    expect(a.list).not.toEqual(c.list);
    // The cubes' combinations come first (free inputs released), in order.
    expect(a.list.slice(0, 3)).toEqual(['1'.repeat(n), '0'.repeat(n - 1) + '1', '0'.repeat(n)]);
    expect(new Set(a.list).size).toBe(a.list.length);
    expect(a.list.length).toBeGreaterThan(SAMPLED_INPUTS - 2); // 2^20 combinations: duplicates are rare
    expect(a.list.length).toBeLessThanOrEqual(cubes.length + SAMPLED_INPUTS);
    for (const x of a.list) expect(x).toMatch(new RegExp(`^[01]{${n}}$`));
    expect(inputAssignments(space(n, cubes), seededRandom(7), { samples: 5 }).list.length).toBeLessThanOrEqual(8);
  });

  it('keeps never out of the samples too, and adds a combination inside each never cube when it includes them', () => {
    const n = EXHAUSTIVE_INPUTS + 1;
    const never = ['1' + '-'.repeat(n - 1)];
    const skip = inputAssignments(space(n, [], never), seededRandom(3));
    expect(skip.list.length).toBeGreaterThan(0);
    for (const x of skip.list) expect(holds(never[0], x)).toBe(false);
    const keep = inputAssignments(space(n, [], never), seededRandom(3), { includeNever: true });
    expect(keep.list[0]).toBe('1' + '0'.repeat(n - 1));
    expect(keep.list.some((x) => x.startsWith('1'))).toBe(true);
  });

  it('moves the bound when told', () => {
    const r = inputAssignments(space(4, ['1-1-']), seededRandom(1), { maxExhaustiveInputs: 3, samples: 2 });
    expect(r.exhaustive).toBe(false);
    expect(r.list[0]).toBe('1010');
    expect(r.list.length).toBeLessThanOrEqual(3);
  });

  it('collects every row cube of a flat machine and its never cubes', () => {
    const f = { ...toggleMachine(), never: ['1'] };
    expect(machineInputs(f)).toEqual({ inputs: 1, cubes: f.rows.flatMap((rs) => rs.map((r) => r.cube)), never: ['1'] });
  });

  it('lists codes in counting order, samples distinct unused ones, and words an assignment', () => {
    expect(allCodes(2)).toEqual(['00', '01', '10', '11']);
    const used = new Set(['000', '111']);
    const codes = randomCodes(3, 4, seededRandom(2), used);
    expect(codes).toEqual(randomCodes(3, 4, seededRandom(2), used));
    expect(new Set(codes).size).toBe(codes.length);
    for (const c of codes) expect(used.has(c)).toBe(false);
    expect(describeInputs(['a', 'b'], '10')).toBe('a=1 b=0');
    expect(describeInputs([], '')).toBe('(no inputs)');
  });
});
