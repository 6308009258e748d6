/**
 * Whether a state of one machine can stand for a state of another: the compatibility relation
 * of M. C. Paull and S. H. Unger ("Minimizing the number of states in incompletely specified
 * sequential switching functions", IRE Trans. Electronic Computers EC-8, 1959), taken between
 * two machines over the same inputs and outputs. States x (of A) and y (of B) are compatible
 * when no input sequence that both specify makes them show different specified outputs: in
 * every input combination both rows cover, the outputs both specify agree, and where both
 * specify a next state the pair of next states is compatible again.
 *
 * Computed here on demand, independently of the state minimisation: a query explores the pairs
 * its pair implies, breadth-first, and stops at the first clash. When none is found, every
 * pair explored is compatible (its implications lie inside the explored set), and is kept so.
 */
import { DONT_CARE, type FlatMachine, type FlatRow } from '../model/flat.js';

/** Do two cubes overlap (no position where one has 0 and the other 1)? */
function overlap(a: string, b: string): boolean {
  for (let i = 0; i < a.length; i++) {
    const x = a.charCodeAt(i);
    const y = b.charCodeAt(i);
    if (x !== y && x !== 45 && y !== 45) return false;
  }
  return true;
}

/** Do two rows show different values of an output both specify? */
function clash(r: FlatRow, s: FlatRow): boolean {
  for (let k = 0; k < r.out.length; k++) {
    const a = r.out[k];
    const b = s.out[k];
    if (a !== '-' && b !== '-' && a !== b) return true;
  }
  return false;
}

/** One combination inside both cubes, free inputs released. */
function meet(a: string, b: string): string {
  let s = '';
  for (let i = 0; i < a.length; i++) s += a[i] === '-' ? (b[i] === '-' ? '0' : b[i]) : a[i];
  return s;
}

/** An input sequence after which two states show different values of one output. */
export interface Witness {
  /** One input combination per clock ('0'/'1' per input); the outputs differ while the last is held. */
  readonly inputs: readonly string[];
  readonly output: number;
  /** The value each machine shows. */
  readonly a: 0 | 1;
  readonly b: 0 | 1;
}

/** The compatibility relation between the states of `a` and those of `b`, answered on demand and remembered. */
export class Compatibility {
  /** Per pair x·|b|+y: 0 unknown, 1 compatible, 2 not. */
  private readonly known: Uint8Array;

  constructor(
    private readonly a: FlatMachine,
    private readonly b: FlatMachine,
  ) {
    this.known = new Uint8Array(a.states.length * b.states.length);
  }

  /** Can state y of b stand for state x of a? */
  compatible(x: number, y: number): boolean {
    const nb = this.b.states.length;
    const start = x * nb + y;
    if (this.known[start] !== 0) return this.known[start] === 1;
    const seen = new Set<number>([start]);
    const queue = [start];
    for (let i = 0; i < queue.length; i++) {
      const p = queue[i];
      const implied = this.implied(Math.floor(p / nb), p % nb);
      if (implied === null) {
        this.known[start] = 2;
        return false;
      }
      for (const q of implied) {
        if (this.known[q] === 2) {
          this.known[start] = 2;
          return false;
        }
        if (this.known[q] === 1 || seen.has(q)) continue;
        seen.add(q);
        queue.push(q);
      }
    }
    for (const p of seen) this.known[p] = 1;
    return true;
  }

  /**
   * Why state y of b cannot stand for state x of a: the shortest input sequence (one
   * combination per clock, free inputs released) after which both specify an output and
   * disagree; null when they are compatible.
   */
  witness(x: number, y: number): Witness | null {
    if (this.compatible(x, y)) return null;
    const nb = this.b.states.length;
    const start = x * nb + y;
    const parent = new Map<number, { from: number; inputs: string }>([[start, { from: -1, inputs: '' }]]);
    const queue = [start];
    for (let i = 0; i < queue.length; i++) {
      const p = queue[i];
      for (const r of this.a.rows[Math.floor(p / nb)])
        for (const s of this.b.rows[p % nb]) {
          if (!overlap(r.cube, s.cube)) continue;
          const at = meet(r.cube, s.cube);
          const k = r.out.findIndex((v, j) => v !== '-' && s.out[j] !== '-' && v !== s.out[j]);
          if (k >= 0) {
            const inputs = [at];
            for (let q = p; parent.get(q)?.from !== -1; q = parent.get(q)?.from ?? -1)
              inputs.unshift(parent.get(q)?.inputs ?? '');
            return { inputs, output: k, a: r.out[k] as 0 | 1, b: s.out[k] as 0 | 1 };
          }
          if (r.next === DONT_CARE || s.next === DONT_CARE) continue;
          const q = r.next * nb + s.next;
          if (parent.has(q)) continue;
          parent.set(q, { from: p, inputs: at });
          queue.push(q);
        }
    }
    return null;
  }

  /** The pairs of next states that pair (x, y) implies, or null when their rows clash. */
  private implied(x: number, y: number): number[] | null {
    const nb = this.b.states.length;
    const out: number[] = [];
    for (const r of this.a.rows[x])
      for (const s of this.b.rows[y]) {
        if (!overlap(r.cube, s.cube)) continue;
        if (clash(r, s)) return null;
        if (r.next !== DONT_CARE && s.next !== DONT_CARE) out.push(r.next * nb + s.next);
      }
    return out;
  }
}
