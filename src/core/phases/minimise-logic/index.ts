/**
 * Minimise logic: multi-output two-level minimisation of an incompletely specified function.
 *
 * Input: per function j an on-set cover and a don't-care cover (cube strings); the off-set is
 * the rest. A point in both on_j and dc_j must be covered (the on-set wins).
 * Output: a sum-of-products cover whose terms may feed several functions (shared term gates),
 * cheapest under `opts.cost` that the chosen method finds.
 *
 * Methods (see docs/methods/minimise-logic.md):
 * - 'exact': all multi-output prime implicants (the tagged Quine–McCluskey method, on cubes;
 *   E. J. McCluskey, BSTJ 35(6), 1956) and a minimum-cost covering by branch and bound.
 * - 'heuristic': the Espresso-II loop (Brayton, Hachtel, McMullen, Sangiovanni-Vincentelli,
 *   "Logic Minimization Algorithms for VLSI Synthesis", Kluwer 1984) on packed cubes, never
 *   enumerating minterms.
 * - 'auto' (default): the heuristic, then, when the function is small (AUTO_LIMITS), the
 *   exact search bounded by the heuristic's cost; the cheaper cover is returned.
 * With several functions and sharing on, the heuristic starts from the per-function covers
 * (see `shared`), so a shared cover never costs more than the `share: false` one.
 *
 * Preconditions: every cube has `vars` positions of '0', '1', '-'; `on` and `dc` have one
 * list per function (a bad shape is a programming error: RangeError).
 * Postcondition: verifyCover(f, result).ok; deterministic for a given input.
 */
import type { Cube } from '../../model/cube.js';
import {
  type BCube,
  type Space,
  makeSpace,
  parseInput,
  formatInput,
  withOutputs,
  outputsOf,
  inDisjoint,
  key,
  absorbFull,
} from './bitcube.js';
import { boundary } from './offset.js';
import { compact, subtractCover } from './tidy.js';
import { espresso } from './espresso.js';
import { exactMinimise, EXACT_MAX_VARS, type ExactLimits } from './exact.js';
import { DEFAULT_COST, coverCost } from './cost.js';
import type { CoverCost, MinimiseOptions, MinimiserMethod, MultiFunction, SopCover, Term } from './types.js';

export type { CoverCost, MinimiseOptions, MinimiserMethod, MultiFunction, SopCover, Term } from './types.js';
export { coverCost, coverStats, DEFAULT_COST, type CoverStats } from './cost.js';
export { verifyCover } from './verify.js';

/**
 * When 'auto' also tries the exact method, after the heuristic: at most `maxVars` variables
 * and `maxRows` on-set (minterm, function) rows; prime generation gives up past `maxPrimes`
 * and the covering search stops after `nodeLimit` nodes. The exact search only accepts
 * covers cheaper than the heuristic's, so 'auto' is never worse than 'heuristic'.
 * One function: a plain covering table, cheap to search, so the limits are wider.
 */
export const AUTO_LIMITS: { readonly single: AutoLimits; readonly multi: AutoLimits } = {
  single: { maxVars: 10, maxRows: 512, maxPrimes: 400, nodeLimit: 2000 },
  multi: { maxVars: 8, maxRows: 128, maxPrimes: 100, nodeLimit: 1000 },
};

/** Limits of the exact attempt inside 'auto'. */
export type AutoLimits = ExactLimits & { readonly maxVars: number };

/** Multi-output minimisation; terms shared across functions unless `share: false`. */
export function minimiseCover(f: MultiFunction, opts: MinimiseOptions = {}): SopCover {
  checkShape(f);
  const cost = opts.cost ?? DEFAULT_COST;
  const method = opts.method ?? 'auto';
  const m = f.on.length;
  if (opts.share === false && m > 1) {
    const terms: Term[] = [];
    for (let j = 0; j < m; j++) {
      const one = solve({ vars: f.vars, on: [f.on[j]], dc: [f.dc[j]] }, method, cost);
      for (const t of one) terms.push({ cube: t.cube, outputs: [j] });
    }
    return { vars: f.vars, functions: m, terms };
  }
  return { vars: f.vars, functions: m, terms: solve(f, method, cost) };
}

/** Single-function convenience: the minimised sum of products as a list of cubes. */
export function minimiseSop(
  on: readonly Cube[],
  dc: readonly Cube[],
  vars: number,
  opts: MinimiseOptions = {},
): Cube[] {
  return minimiseCover({ vars, on: [on], dc: [dc] }, opts).terms.map((t) => t.cube);
}

function checkShape(f: MultiFunction): void {
  if (!Number.isInteger(f.vars) || f.vars < 0)
    throw new RangeError(`minimiseCover: vars must be a non-negative integer, got ${f.vars}`);
  if (f.dc.length !== f.on.length)
    throw new RangeError(`minimiseCover: ${f.on.length} on-set lists but ${f.dc.length} don't-care lists`);
  for (const list of [...f.on, ...f.dc])
    for (const c of list)
      if (c.length !== f.vars)
        throw new RangeError(`minimiseCover: cube '${c}' has ${c.length} positions, expected ${f.vars}`);
}

/** The function in packed form: on-sets, don't-cares minus on-sets, and on ∪ dc. */
interface Packed {
  readonly sp: Space;
  readonly on: BCube[][];
  readonly dc: BCube[][];
  readonly allowed: BCube[][];
}

/**
 * Most pieces a don't-care cube may be cut into when the on-set is taken out of it; past
 * that the cube is left out of D (see pack).
 */
const DC_PIECES = 8;

function pack(f: MultiFunction): Packed {
  const sp = makeSpace(f.vars, f.on.length);
  const on = f.on.map((cs) => cs.map((c) => parseInput(sp, c)));
  const dc = f.dc.map((cs, j) => {
    // The on-set wins where the lists overlap: D keeps only don't-care points outside it.
    // A cube that would shatter into many pieces is left out of D instead: D only lets
    // IRREDUNDANT and REDUCE drop coverage, so a smaller D is safe (the boundary of EXPAND
    // still uses the whole of on ∪ dc).
    const out: BCube[] = [];
    for (const d of cs.map((c) => parseInput(sp, c))) {
      if (on[j].every((o) => inDisjoint(sp, d, o))) {
        out.push(d);
        continue;
      }
      const pieces = subtractCover(sp, [d], on[j], DC_PIECES);
      if (pieces !== null) out.push(...pieces);
    }
    return compact(sp, out);
  });
  const allowed = f.on.map((_, j) => compact(sp, [...on[j], ...f.dc[j].map((c) => parseInput(sp, c))]));
  return { sp, on, dc, allowed };
}

interface Found {
  readonly cube: Cube;
  readonly outputs: readonly number[];
}

function solve(f: MultiFunction, method: MinimiseOptions['method'], cost: CoverCost): Found[] {
  const p = pack(f);
  const m = f.on.length;
  if (method === 'exact') {
    if (f.vars > EXACT_MAX_VARS)
      throw new RangeError(
        `minimiseCover: the exact method handles at most ${EXACT_MAX_VARS} variables, got ${f.vars}`,
      );
    // The heuristic's cover bounds the search; without limits the result is a minimum.
    const h = m === 1 ? heuristic(p, cost) : shared(f, p, 'heuristic', cost);
    const r = exactMinimise(p.sp, p.on, p.allowed, cost, {
      maxPrimes: Infinity,
      maxRows: Infinity,
      nodeLimit: Infinity,
      upperBound: price(f, h, cost),
    });
    return r === null ? h : toFound(p.sp, r.terms);
  }
  const h = m === 1 ? heuristic(p, cost) : shared(f, p, method ?? 'auto', cost);
  if (method === 'heuristic') return h;
  const limits = m === 1 ? AUTO_LIMITS.single : AUTO_LIMITS.multi;
  if (f.vars <= limits.maxVars) {
    const r = exactMinimise(p.sp, p.on, p.allowed, cost, { ...limits, upperBound: price(f, h, cost) });
    if (r !== null) return toFound(p.sp, r.terms);
  }
  return h;
}

/**
 * Several functions, terms shared: minimise each function alone (the `share: false` answer,
 * by the same method), merge equal terms, and let the multi-output Espresso loop improve that
 * cover — sharing terms, dropping the ones sharing makes redundant. Starting from the
 * per-function cover and keeping it when nothing cheaper turns up makes sharing never cost
 * more than not sharing, whatever the price of a connection.
 */
function shared(f: MultiFunction, p: Packed, method: MinimiserMethod, cost: CoverCost): Found[] {
  const { sp } = p;
  const byCube = new Map<string, number[]>();
  f.on.forEach((_, j) => {
    for (const t of solve({ vars: f.vars, on: [f.on[j]], dc: [f.dc[j]] }, method, cost)) {
      const outs = byCube.get(t.cube);
      if (outs) outs.push(j);
      else byCube.set(t.cube, [j]);
    }
  });
  const start = [...byCube.entries()].map(([c, js]) => withOutputs(sp, parseInput(sp, c), js));
  const D = mergeOutputs(sp, p.dc);
  return espresso(sp, start, D, boundary(sp, p.allowed), cost, true).map((c) => ({
    cube: formatInput(sp, c),
    outputs: outputsOf(sp, c),
  }));
}

function price(f: MultiFunction, terms: readonly Found[], cost: CoverCost): number {
  return coverCost({ vars: f.vars, functions: f.on.length, terms }, cost);
}

function toFound(sp: Space, terms: readonly { cube: BCube; outputs: readonly number[] }[]): Found[] {
  return terms.map((t) => ({ cube: formatInput(sp, t.cube), outputs: t.outputs.slice() }));
}

/** Espresso-II on the packed function. */
function heuristic(p: Packed, cost: CoverCost): Found[] {
  const { sp } = p;
  const F = mergeOutputs(sp, p.on);
  const D = mergeOutputs(sp, p.dc);
  return espresso(sp, F, D, boundary(sp, p.allowed), cost).map((c) => ({
    cube: formatInput(sp, c),
    outputs: outputsOf(sp, c),
  }));
}

/** One multi-output cube per distinct input cube, feeding every function that lists it. */
function mergeOutputs(sp: Space, lists: readonly (readonly BCube[])[]): BCube[] {
  const byKey = new Map<string, { cube: BCube; outs: number[] }>();
  lists.forEach((cs, j) => {
    for (const c of cs) {
      const id = key(c.slice(0, sp.wi));
      const e = byKey.get(id);
      if (e) {
        if (!e.outs.includes(j)) e.outs.push(j);
      } else byKey.set(id, { cube: c, outs: [j] });
    }
  });
  return absorbFull(
    sp,
    [...byKey.values()].map((e) => withOutputs(sp, e.cube, e.outs)),
  );
}
