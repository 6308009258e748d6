/**
 * Hand-made flat machines for the encode tests (invented; no outside source).
 */
import type { FlatMachine, FlatRow } from '../../../../src/core/model/flat.js';
import { mintermString } from '../../../../src/core/model/cube.js';

/** A machine from per-state next-state lists over every input minterm (rows[s][m] = next state of s under minterm m). */
export function tableMachine(
  name: string,
  inputs: number,
  next: readonly (readonly number[])[],
  start = 0,
): FlatMachine {
  return {
    name,
    inputs: Array.from({ length: inputs }, (_, i) => `x${i}`),
    outputs: [],
    states: next.map((_, s) => `s${s}`),
    start,
    rows: next.map((row) =>
      row.map((to, m): FlatRow => ({ cube: mintermString(m, inputs), next: to, out: [], transition: m })),
    ),
    never: [],
  };
}

/** A ring of n states: input x0 steps to the next state, !x0 holds. */
export function ring(n: number): FlatMachine {
  return tableMachine(
    `ring${n}`,
    1,
    Array.from({ length: n }, (_, s) => [s, (s + 1) % n]),
  );
}

/** Hamming distance of two equal-length codes. */
export function distance(a: string, b: string): number {
  let d = 0;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) d++;
  return d;
}

/**
 * A synthetic cost that is the same for assignments related by a bit permutation or
 * complementation: 100 per state bit, plus the Hamming distance spanned by each
 * transition row (self-loops span 0), plus 3 for every row whose distance exceeds 1.
 */
export function syntheticCost(f: FlatMachine): (codes: readonly string[], bits: number) => number {
  return (codes, bits) => {
    let c = 100 * bits;
    f.rows.forEach((rows, s) => {
      for (const r of rows) {
        if (r.next < 0) continue;
        const d = distance(codes[s], codes[r.next]);
        c += d + (d > 1 ? 3 : 0);
      }
    });
    return c;
  };
}

/** Every injective assignment of n states to codes of `bits` bits (brute force, for small n). */
export function* allAssignments(n: number, bits: number): Generator<string[]> {
  const codes = Array.from({ length: 2 ** bits }, (_, m) => mintermString(m, bits));
  const used = new Array<boolean>(codes.length).fill(false);
  const cur: string[] = [];
  function* go(): Generator<string[]> {
    if (cur.length === n) {
      yield cur.slice();
      return;
    }
    for (let i = 0; i < codes.length; i++) {
      if (used[i]) continue;
      used[i] = true;
      cur.push(codes[i]);
      yield* go();
      cur.pop();
      used[i] = false;
    }
  }
  yield* go();
}

/** Checks every encoding must pass: n codes, one length, 0/1 only, all different. */
export function wellFormed(f: FlatMachine, e: { bits: number; codes: readonly string[] }): boolean {
  return (
    e.codes.length === f.states.length &&
    new Set(e.codes).size === e.codes.length &&
    e.codes.every((c) => c.length === e.bits && /^[01]*$/.test(c))
  );
}
