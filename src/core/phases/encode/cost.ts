/**
 * Pricing candidate encodings for the automatic search: a memo of costs keyed by symmetry
 * class (an assignment and its images under the cube's symmetries cost the same, so each
 * class is priced once), the evaluation and time budget, progress reports, and the best
 * candidate so far. Also the stand-in cost used when the caller gives none.
 */
import type { FlatMachine } from '../../model/flat.js';
import { binaryCode, codeToInt, hamming } from './codes.js';
import { transitionWeights } from './order.js';
import { canonicalKey, cubeSymmetries, fixing, type CubeMap } from './symmetry.js';
import type { Sketch } from './sketch.js';

/** Cost of a candidate encoding (lower is better). */
export type CostFn = (codes: readonly string[], bits: number) => number;

/** Progress of a search: evaluations done, the planned total (null when only time bounds it), best cost so far. */
export interface Progress {
  readonly done: number;
  readonly total: number | null;
  readonly best: number;
}

/** Longest code the search handles as integers. */
export const MAX_SEARCH_BITS = 24;

/**
 * Stand-in cost when none is given: the transition weights (share of the input space,
 * order.ts) times the Hamming distance they span, summed, plus n/2 per state bit. It rewards
 * the adjacency that keeps next-state logic small (De Micheli 1994, state-encoding chapter);
 * the per-bit charge is an estimate that keeps one-hot from winning by default. The real
 * search gets the finished build's weighted part count from the caller instead.
 */
export function adjacencyCost(f: FlatMachine): CostFn {
  const w = transitionWeights(f);
  const n = f.states.length;
  return (codes, bits) => {
    let c = (bits * n) / 2;
    for (let i = 0; i < n; i++)
      for (let j = i + 1; j < n; j++) if (w[i][j] > 0) c += w[i][j] * hamming(codes[i], codes[j]);
    return c;
  };
}

/** A priced candidate: its codes, their length and the value the book's measure gave it. */
export interface Best {
  readonly codes: readonly string[];
  readonly bits: number;
  readonly cost: number;
}

export interface BookOptions {
  readonly cost: CostFn;
  /** The measure on integer codes, used instead of `cost` when given (the search's sketch). */
  readonly measure?: Sketch;
  /** Pinned codes by state index (they fix the symmetry group at their length). */
  readonly pins: ReadonlyMap<number, string>;
  /** Most evaluations allowed (Infinity when only the deadline bounds the search). */
  readonly maxEvaluations: number;
  readonly deadline?: number;
  readonly now?: () => number;
  readonly onProgress?: (p: Progress) => void;
  /** Told the value of every evaluation as it is made. */
  readonly onEvaluate?: (value: number) => void;
  /** How many of the best distinct candidates to remember (default 1). */
  readonly keep?: number;
}

/** The memo and budget shared by every part of one automatic search (or one task of it). */
export class CostBook {
  evaluations = 0;
  /** Most evaluations allowed; the search may settle it once it knows the size of the space. */
  limit: number;
  /** Planned number of evaluations, for progress reports. */
  total: number | null = null;
  /** The best distinct candidates so far, cheapest first (the first found wins a tie). */
  readonly top: Best[] = [];
  private readonly memo = new Map<string, number>();
  private readonly groups = new Map<number, CubeMap[]>();
  private readonly keep: number;

  constructor(private readonly o: BookOptions) {
    this.limit = o.maxEvaluations;
    this.keep = Math.max(1, o.keep ?? 1);
  }

  /** The best candidate so far. */
  get best(): Best | undefined {
    return this.top[0];
  }

  /** True when no further evaluation may start. */
  exhausted(): boolean {
    if (this.evaluations >= this.limit) return true;
    return this.o.deadline !== undefined && this.o.now !== undefined && this.o.now() >= this.o.deadline;
  }

  /** Evaluations still allowed. */
  remaining(): number {
    return Math.max(0, this.limit - this.evaluations);
  }

  /** The symmetries that may relabel codes of this length without moving a pin. */
  group(bits: number): CubeMap[] {
    let g = this.groups.get(bits);
    if (!g) {
      const all = cubeSymmetries(bits);
      const pinned = [...this.o.pins.values()].filter((c) => c.length === bits).map(codeToInt);
      g = fixing(all, pinned);
      this.groups.set(bits, g);
    }
    return g;
  }

  /** Has an assignment (as integers) of this class been priced? Its cost, if so. */
  known(codes: readonly number[], bits: number): number | undefined {
    return this.memo.get(this.key(codes, bits));
  }

  /** Cost of an assignment given as integers; priced once per class. */
  price(codes: readonly number[], bits: number): number {
    const key = this.key(codes, bits);
    const hit = this.memo.get(key);
    if (hit !== undefined) return hit;
    const raw = this.o.measure
      ? this.o.measure.estimate(codes, bits)
      : this.o.cost(
          codes.map((c) => binaryCode(c, bits)),
          bits,
        );
    return this.record(key, raw, bits, codes);
  }

  /** Cost of an assignment given as code strings (the named strategies, any length). */
  priceCodes(codes: readonly string[], bits: number): number {
    const key = bits <= MAX_SEARCH_BITS ? this.key(codes.map(codeToInt), bits) : `${bits}|${codes.join(',')}`;
    const hit = this.memo.get(key);
    if (hit !== undefined) return hit;
    const raw =
      this.o.measure && bits <= MAX_SEARCH_BITS
        ? this.o.measure.estimate(codes.map(codeToInt), bits)
        : this.o.cost(codes, bits);
    return this.record(key, raw, bits, codes);
  }

  private key(codes: readonly number[], bits: number): string {
    return `${bits}|${canonicalKey(codes, this.group(bits))}`;
  }

  private record(key: string, raw: number, bits: number, codes: readonly (number | string)[]): number {
    const cost = Number.isNaN(raw) ? Infinity : raw;
    this.evaluations++;
    this.memo.set(key, cost);
    this.remember(cost, bits, codes);
    this.o.onEvaluate?.(cost);
    this.o.onProgress?.({ done: this.evaluations, total: this.total, best: this.top[0].cost });
    return cost;
  }

  /** Keep the candidate if it is among the `keep` best (ties: the earlier stays ahead). */
  private remember(cost: number, bits: number, codes: readonly (number | string)[]): void {
    const top = this.top;
    if (top.length >= this.keep && !(cost < top[top.length - 1].cost)) return;
    let at = top.length;
    while (at > 0 && cost < top[at - 1].cost) at--;
    const strings = codes.map((c) => (typeof c === 'string' ? c : binaryCode(c, bits)));
    top.splice(at, 0, { codes: strings, bits, cost });
    if (top.length > this.keep) top.pop();
  }
}
