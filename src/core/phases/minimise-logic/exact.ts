/**
 * Exact multi-output minimisation: every multi-output prime implicant (primes.ts), then a
 * minimum-cost choice of (prime, function) connections covering every on-set point of every
 * function (cover-exact.ts). The covering table is the Quine–McCluskey prime implicant chart
 * (E. J. McCluskey, Bell System Technical Journal 35(6), 1956) with one row per on-set
 * minterm per function, so this path enumerates minterms and is kept to small functions.
 *
 * Why primes suffice under our cost: a term feeding the functions T can be widened to a prime
 * of ∏_{j∈T} f_j without adding a literal or a connection, so some cheapest cover uses only
 * multi-output primes (each possibly feeding only part of its tag).
 *
 * Postcondition: the terms cover every on-set point and stay inside on ∪ dc; when `optimal`
 * is true no cheaper cover exists under the given cost.
 */
import { type BCube, type Space, SLOT, literals, scratch } from './bitcube.js';
import { multiOutputPrimes } from './primes.js';
import { solveCover, type CoverColumn, type CoverProblem } from './cover-exact.js';
import type { CoverCost } from './types.js';

/** Hard limit on variables for the minterm-based table. */
export const EXACT_MAX_VARS = 20;

export interface ExactLimits {
  /** Give up (return null) when there are more multi-output primes than this. */
  readonly maxPrimes: number;
  /** Give up (return null) when there are more (minterm, function) rows than this. */
  readonly maxRows: number;
  /** Branch-and-bound node limit; past it the best cover found is returned, not optimal. */
  readonly nodeLimit: number;
  /** Only covers cheaper than this count (return null when none is found). */
  readonly upperBound?: number;
}

export interface ExactResult {
  readonly terms: readonly { readonly cube: BCube; readonly outputs: readonly number[] }[];
  readonly cost: number;
  readonly optimal: boolean;
}

/** Minterm index bits of an input cube: [care mask, value mask], variable i ↔ bit i. */
function careValue(sp: Space, c: BCube): [number, number] {
  let care = 0;
  let val = 0;
  for (let i = 0; i < sp.n; i++) {
    const f = (c[(i / 15) | 0] >>> (2 * (i % 15))) & 3;
    if (f === 1) care |= 1 << i;
    else if (f === 2) {
      care |= 1 << i;
      val |= 1 << i;
    }
  }
  return [care, val];
}

/** Count of minterms of a cube. */
function size(sp: Space, c: BCube): number {
  return 2 ** (sp.n - literals(sp, c));
}

/**
 * Exact minimisation of on[j] with allowed[j] = on[j] ∪ dc[j]; null when over the limits or
 * when nothing cheaper than `limits.upperBound` was found.
 */
export function exactMinimise(
  sp: Space,
  on: readonly (readonly BCube[])[],
  allowed: readonly (readonly BCube[])[],
  cost: CoverCost,
  limits: ExactLimits,
): ExactResult | null {
  if (sp.n > EXACT_MAX_VARS) return null;
  const m = on.length;
  const all = (1 << sp.n) - 1 || 0;
  // Rows: distinct on-set minterms per function.
  let rowEstimate = 0;
  for (const cs of on) for (const c of cs) rowEstimate += size(sp, c);
  if (rowEstimate > limits.maxRows * 4) return null;
  const rowId: RowIndex[] = [];
  const rowsOf: number[][] = [];
  let rowCount = 0;
  for (let j = 0; j < m; j++) {
    const ids = rowIndex(sp.n, j, m);
    const list: number[] = [];
    for (const c of on[j]) {
      const [care, val] = careValue(sp, c);
      const free = all & ~care;
      for (let s = free; ; s = (s - 1) & free) {
        const x = val | s;
        if (ids.get(x) < 0) {
          ids.set(x, rowCount++);
          list.push(x);
        }
        if (s === 0) break;
      }
    }
    if (rowCount > limits.maxRows) return null;
    rowId.push(ids);
    rowsOf.push(list);
  }
  if (rowCount === 0) return { terms: [], cost: 0, optimal: true };
  const primes = multiOutputPrimes(sp, allowed, limits.maxPrimes);
  if (primes === null) return null;
  // Each prime's links: the functions it may feed and the rows each would cover.
  const links: Link[] = [];
  for (const p of primes) {
    const [care, val] = careValue(sp, p.cube);
    const free = all & ~care;
    const link = { cube: p.cube, lits: literals(sp, p.cube), outs: [] as number[], rows: [] as number[][] };
    for (const j of p.tag) {
      const rows: number[] = [];
      const ids = rowId[j];
      if (2 ** (sp.n - literals(sp, p.cube)) <= rowsOf[j].length) {
        for (let s = free; ; s = (s - 1) & free) {
          const r = ids.get(val | s);
          if (r >= 0) rows.push(r);
          if (s === 0) break;
        }
      } else for (const x of rowsOf[j]) if ((x & care) === val) rows.push(ids.get(x));
      if (rows.length > 0) {
        link.outs.push(j);
        link.rows.push(rows);
      }
    }
    if (link.outs.length > 0) links.push(link);
  }
  const problem = subsetColumns(links, cost, rowCount) ?? fixedCharge(links, cost, rowCount);
  const sol = solveCover(problem.cover, limits.nodeLimit, limits.upperBound ?? Infinity);
  if (sol === null) return null;
  const outs = new Map<number, number[]>();
  for (const ci of sol.columns) {
    const [li, js] = problem.meaning[ci];
    outs.set(li, [...(outs.get(li) ?? []), ...js]);
  }
  const terms = [...outs.entries()]
    .sort((a, b) => a[0] - b[0])
    .map(([li, js]) => ({ cube: links[li].cube, outputs: [...new Set(js)].sort((a, b) => a - b) }));
  return { terms, cost: sol.cost, optimal: sol.optimal };
}

interface Link {
  readonly cube: BCube;
  readonly lits: number;
  readonly outs: readonly number[];
  readonly rows: readonly (readonly number[])[];
}

/** A covering problem and, per column, which prime (link index) it feeds to which functions. */
interface Table {
  readonly cover: CoverProblem;
  readonly meaning: readonly (readonly [number, readonly number[]])[];
}

/** Most columns the subset form may have before the fixed-charge form is used instead. */
const SUBSET_COLUMN_LIMIT = 4096;

/**
 * The plain unate form: one column per prime and per non-empty set S of functions it feeds,
 * costing term + literals + |S|·connection. Exact (feeding one prime through two columns is
 * never cheaper than through their union) and gives the solver full column dominance and a
 * sharper bound; its size is exponential in the tag, so null past SUBSET_COLUMN_LIMIT.
 */
function subsetColumns(links: readonly Link[], cost: CoverCost, rowCount: number): Table | null {
  let count = 0;
  for (const l of links) {
    if (l.outs.length > 12) return null;
    count += 2 ** l.outs.length - 1;
  }
  if (count > SUBSET_COLUMN_LIMIT) return null;
  const columns: CoverColumn[] = [];
  const groupCost: number[] = [];
  const meaning: [number, number[]][] = [];
  links.forEach((l, li) => {
    const base = cost.term + cost.literal * l.lits;
    for (let mask = 1; mask < 1 << l.outs.length; mask++) {
      const outs: number[] = [];
      const rows: number[] = [];
      l.outs.forEach((j, q) => {
        if (mask & (1 << q)) {
          outs.push(j);
          rows.push(...l.rows[q]);
        }
      });
      columns.push({ group: groupCost.length, cost: 0, rows });
      groupCost.push(base + cost.connection * outs.length);
      meaning.push([li, outs]);
    }
  });
  return { cover: { rowCount, columns, groupCost }, meaning };
}

/** The fixed-charge form: a group per prime (term + literals), a column per function fed. */
function fixedCharge(links: readonly Link[], cost: CoverCost, rowCount: number): Table {
  const columns: CoverColumn[] = [];
  const groupCost: number[] = [];
  const meaning: [number, number[]][] = [];
  links.forEach((l, li) => {
    l.outs.forEach((j, q) => {
      columns.push({ group: li, cost: cost.connection, rows: l.rows[q] });
      meaning.push([li, [j]]);
    });
    groupCost.push(cost.term + cost.literal * l.lits);
  });
  return { cover: { rowCount, columns, groupCost }, meaning };
}

/** Row number of each minterm of one function: a flat table for small n, else a map. */
interface RowIndex {
  get(x: number): number;
  set(x: number, r: number): void;
}

function rowIndex(n: number, j: number, m: number): RowIndex {
  if (n <= 14 && m << n <= 1 << 22) {
    // One scratch table for all functions (function j at offset j·2^n), stamped per call so
    // it never needs clearing.
    const size = m << n;
    const stamp = scratch(SLOT.rowStamp, size);
    const value = scratch(SLOT.rowValue, size);
    if (j === 0) rowGeneration = rowGeneration >= 0x3fffffff ? (stamp.fill(0), 1) : rowGeneration + 1;
    const gen = rowGeneration;
    const base = j << n;
    return {
      get: (x) => (stamp[base + x] === gen ? value[base + x] : -1),
      set: (x, r) => {
        stamp[base + x] = gen;
        value[base + x] = r;
      },
    };
  }
  const map = new Map<number, number>();
  return {
    get: (x) => map.get(x) ?? -1,
    set: (x, r) => {
      map.set(x, r);
    },
  };
}

let rowGeneration = 0;
