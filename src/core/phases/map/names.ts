/**
 * Stable, readable part ids. The same machine always gets the same ids, so wiring lists and
 * stored builds can be compared line by line.
 */
import type { Cube } from '../../model/cube.js';

export const ids = {
  input: (name: string): string => `in.${name}`,
  inputInverter: (name: string): string => `x.${name}.inv`,
  phi1: 'clk.phi1',
  phi2: 'clk.phi2',
  reset: 'rst',
  resetDriver: 'rst.drv',
  master: (bit: number): string => `m${bit}`,
  slave: (bit: number): string => `s${bit}`,
  setGate: (latch: string): string => `${latch}.set`,
  resetGate: (latch: string): string => `${latch}.reset`,
  transferSet: (bit: number): string => `tr${bit}.set`,
  transferReset: (bit: number): string => `tr${bit}.reset`,
  /** k-th term gate (1-based) whose first fed function is `fn` (S0, R0 …). */
  term: (fn: string, k: number): string => `t.${fn}.${k}`,
  /** k-th output term gate (1-based) whose first fed output is `out`. */
  outputTerm: (out: string, k: number): string => `o.${out}.${k}`,
  output: (out: string): string => `out.${out}`,
  /** One-port gate after an OR gate whose Z is the output, for an actuator. */
  outputDriver: (out: string): string => `out.${out}.drv`,
  flag: (out: string): string => `flag.${out}`,
  actuator: (out: string): string => `act.${out}`,
};

/** Name of set/reset function k of a cover laid out as 2j = S_j, 2j+1 = R_j. */
export function srName(k: number): string {
  return `${k % 2 === 0 ? 'S' : 'R'}${Math.floor(k / 2)}`;
}

/** A product term in words for part names: `q0 !q1 coin`, or `1` for the empty product. */
export function termText(cube: Cube, vars: readonly string[]): string {
  const lits: string[] = [];
  for (let i = 0; i < cube.length; i++) if (cube[i] !== '-') lits.push(cube[i] === '1' ? vars[i] : `!${vars[i]}`);
  return lits.length === 0 ? '1' : lits.join(' ');
}
