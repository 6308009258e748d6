/**
 * Excite: from the flat table and the state codes to the set/reset functions of every state
 * bit's master latch and to the output functions, as on-set and don't-care covers over the
 * variables q0…q(b−1) (bit 0 = first character of a code) followed by the machine's inputs.
 *
 * Method: the SR flip-flop excitation table (M. Morris Mano & M. Ciletti, Digital Design,
 * the flip-flop excitation tables of the sequential-circuits chapter):
 *   Q → Q⁺ : S R     0→0: 0 –    0→1: 1 0    1→0: 0 1    1→1: – 0
 * applied row by row of the flat table, so the work is per cube, never per input combination.
 *
 * Don't-cares come from two places and are kept apart, because the guard treats them apart:
 * - the table's own ("–" above), which lie at q_j = 0 for R_j and at q_j = 1 for S_j;
 * - the global ones, free for every bit: unused codes (unless sent to a state), `never` input
 *   cubes under every code, and rows whose next state is DONT_CARE.
 * Outputs are don't-care at unused codes, under `never` and where the row says '-'.
 *
 * Preconditions: `enc.codes` has one distinct code of `enc.bits` characters per state; a
 * numeric `unusedCodes` is a state index (synthesise checks it).
 * Postconditions: for every bit, on(S), on(R), tableDc(S), tableDc(R) and the global
 * don't-cares are pairwise disjoint; an output is flagged Moore exactly when, at every used
 * code, it is not 1 under one input combination and 0 under another.
 */
import { complement, type Cube } from '../model/cube.js';
import { DONT_CARE, type FlatMachine } from '../model/flat.js';
import type { Encoding } from '../model/build.js';

/** The set or reset function of one master latch. */
export interface SrFunction {
  /** Where the latch input must be active. */
  readonly on: readonly Cube[];
  /** Every don't-care: the table's own plus the global ones (the unguarded view). */
  readonly dc: readonly Cube[];
  /** The excitation table's own don't-cares only (0→0 for R, 1→1 for S). */
  readonly tableDc: readonly Cube[];
}

/** One output as an incompletely specified function of state bits and inputs. */
export interface OutputFunction {
  readonly name: string;
  readonly on: readonly Cube[];
  readonly dc: readonly Cube[];
  readonly off: readonly Cube[];
  /** True when some completion depends on state bits only (a Moore output). */
  readonly moore: boolean;
}

export interface Excitation {
  readonly bits: number;
  readonly inputs: number;
  /** Variable names: `q0…` then the machine's inputs. */
  readonly vars: readonly string[];
  /** Per state bit j: S_j and R_j. */
  readonly set: readonly SrFunction[];
  readonly reset: readonly SrFunction[];
  /** Don't-cares shared by every bit (unused codes, never inputs, free next states). */
  readonly globalDc: readonly Cube[];
  /** Codes that no state uses, as cubes over the state bits. */
  readonly unusedCodes: readonly Cube[];
  readonly outputs: readonly OutputFunction[];
}

export interface ExciteOptions {
  /** Unused codes are don't-cares (default), or go to this state index on every input. */
  readonly unusedCodes?: 'dont-care' | number;
}

/** Set/reset and output functions of a flat machine under an encoding. */
export function excite(f: FlatMachine, enc: Encoding, opts: ExciteOptions = {}): Excitation {
  const b = enc.bits;
  const n = f.inputs.length;
  const freeInputs = '-'.repeat(n);
  const setOn: Cube[][] = [],
    setDc: Cube[][] = [],
    resetOn: Cube[][] = [],
    resetDc: Cube[][] = [];
  for (let j = 0; j < b; j++) {
    setOn.push([]);
    setDc.push([]);
    resetOn.push([]);
    resetDc.push([]);
  }
  const globalDc: Cube[] = [];
  const outOn: Cube[][] = f.outputs.map(() => []);
  const outDc: Cube[][] = f.outputs.map(() => []);
  const outOff: Cube[][] = f.outputs.map(() => []);
  const moore = f.outputs.map(() => true);

  // One specified region: the row cube under a code (or an unused code cube, whose bits may
  // be '-' and are then split by value) going to a known next code.
  const excitePair = (cube: Cube, from: string, to: string): void => {
    for (let j = 0; j < b; j++) {
      const q1 = to[j];
      for (const q of from[j] === '-' ? ['0', '1'] : [from[j]]) {
        const c = from[j] === '-' ? cube.slice(0, j) + q + cube.slice(j + 1) : cube;
        if (q === '0') (q1 === '0' ? resetDc : setOn)[j].push(c);
        else (q1 === '0' ? resetOn : setDc)[j].push(c);
      }
    }
  };

  f.rows.forEach((rows, s) => {
    const code = enc.codes[s];
    const seen = f.outputs.map(() => ({ one: false, zero: false }));
    for (const r of rows) {
      const cube = code + r.cube;
      if (r.next === DONT_CARE) globalDc.push(cube);
      else excitePair(cube, code, enc.codes[r.next]);
      r.out.forEach((v, k) => {
        if (v === 1) {
          outOn[k].push(cube);
          seen[k].one = true;
        } else if (v === 0) {
          outOff[k].push(cube);
          seen[k].zero = true;
        } else outDc[k].push(cube);
      });
    }
    seen.forEach((x, k) => {
      if (x.one && x.zero) moore[k] = false;
    });
  });

  const anyCode = '-'.repeat(b);
  for (const c of f.never) globalDc.push(anyCode + c);
  const unused = b === 0 ? [] : complement(enc.codes, b);
  const target = opts.unusedCodes;
  for (const u of unused) {
    // Sent to a state: every bit is specified there (never inputs stay free, added above).
    if (typeof target === 'number') for (const c of notNever(f, n)) excitePair(u + c, u, enc.codes[target]);
    else globalDc.push(u + freeInputs);
  }
  for (let k = 0; k < f.outputs.length; k++) {
    for (const c of f.never) outDc[k].push(anyCode + c);
    for (const u of unused) outDc[k].push(u + freeInputs);
  }
  const srFn = (on: Cube[], table: Cube[]): SrFunction => ({ on, tableDc: table, dc: [...table, ...globalDc] });
  return {
    bits: b,
    inputs: n,
    vars: [...Array.from({ length: b }, (_, j) => `q${j}`), ...f.inputs],
    set: setOn.map((on, j) => srFn(on, setDc[j])),
    reset: resetOn.map((on, j) => srFn(on, resetDc[j])),
    globalDc,
    unusedCodes: unused,
    outputs: f.outputs.map((name, k) => ({ name, on: outOn[k], dc: outDc[k], off: outOff[k], moore: moore[k] })),
  };
}

/** The input space minus `never`, as disjoint cubes. */
function notNever(f: FlatMachine, n: number): Cube[] {
  return complement(f.never, n);
}
