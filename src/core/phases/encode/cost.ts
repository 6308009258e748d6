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

/** The best candidate priced so far. */
export interface Best {
  readonly codes: readonly string[];
  readonly bits: number;
  readonly cost: number;
}

export interface BookOptions {
  readonly cost: CostFn;
  /** Pinned codes by state index (they fix the symmetry group at their length). */
  readonly pins: ReadonlyMap<number, string>;
  /** Most cost evaluations allowed (Infinity when only the deadline bounds the search). */
  readonly maxEvaluations: number;
  readonly deadline?: number;
  readonly now?: () => number;
  readonly onProgress?: (p: Progress) => void;
}

/** The memo and budget shared by every part of one automatic search. */
export class CostBook {
  evaluations = 0;
  /** Most cost evaluations allowed; the search may settle it once it knows the size of the space. */
  limit: number;
  /** Planned number of evaluations, for progress reports. */
  total: number | null = null;
  best: Best | undefined;
  private readonly memo = new Map<string, number>();
  private readonly groups = new Map<number, CubeMap[]>();

  constructor(private readonly o: BookOptions) {
    this.limit = o.maxEvaluations;
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
    return this.evaluate(
      key,
      codes.map((c) => binaryCode(c, bits)),
      bits,
    );
  }

  /** Cost of an assignment given as code strings (the named strategies, any length). */
  priceCodes(codes: readonly string[], bits: number): number {
    const key = bits <= MAX_SEARCH_BITS ? this.key(codes.map(codeToInt), bits) : `${bits}|${codes.join(',')}`;
    const hit = this.memo.get(key);
    if (hit !== undefined) return hit;
    return this.evaluate(key, codes, bits);
  }

  private key(codes: readonly number[], bits: number): string {
    return `${bits}|${canonicalKey(codes, this.group(bits))}`;
  }

  private evaluate(key: string, codes: readonly string[], bits: number): number {
    const raw = this.o.cost(codes, bits);
    const cost = Number.isNaN(raw) ? Infinity : raw;
    this.evaluations++;
    this.memo.set(key, cost);
    if (!this.best || cost < this.best.cost) this.best = { codes: [...codes], bits, cost };
    this.o.onProgress?.({ done: this.evaluations, total: this.total, best: this.best.cost });
    return cost;
  }
}
