/**
 * Guard: make the forbidden latch input (S̄ = R̄ = 0, i.e. S = R = 1) impossible by
 * construction, then prove it on the minimised covers (design §5).
 *
 * The minimiser may set any don't-care to 1. A cover F of an incompletely specified function
 * (on, dc) satisfies on ⊆ F ⊆ on ∪ dc, so S_j·R_j = 0 holds for EVERY choice the minimiser
 * makes exactly when (on(S) ∪ dc(S)) ∩ (on(R) ∪ dc(R)) = ∅. The excitation table's own
 * don't-cares already satisfy this (S's lie at q_j = 1, R's at q_j = 0, and each lies on
 * cells where the other is 0); only the global don't-cares G (unused codes, never inputs,
 * free next states) are offered to both. Two safe ways to share G:
 *
 * - `split-by-bit`: S_j gets G where q_j = 0, R_j gets G where q_j = 1. There S_j alone
 *   decides the next value of bit j (R_j = 0 holds it at 0 or S_j sets it), and at q_j = 1
 *   R_j alone decides it, so the next state stays completely free on G. (The opposite split
 *   — S where q_j = 1, R where q_j = 0 — is safe too but pins every bit to "hold" on G,
 *   which makes every unused code a trap the machine can never leave; we do not use it.)
 *   One joint minimisation of all S_j and R_j, sharing terms across latches.
 * - `set-first`: minimise every S_j with all of G, move S_j's cover into R_j's off-set (take
 *   it out of R_j's don't-cares), then minimise every R_j (design §5's sequential method).
 *   S and R terms are minimised apart; identical cubes still share one gate.
 *
 * 'auto' builds both and keeps the cheaper by the caller's price (ties go to split-by-bit).
 * The unguarded minimisation (every don't-care free to both) is priced too, for the report:
 * extraGates/extraCords = guarded − unguarded (negative when the guarded cover happens to map
 * smaller — the minimiser is heuristic on large functions). A search may skip it (`baseline`).
 *
 * Proof: S_j·R_j = 0 over the whole space (all 2^bits codes × all input combinations, never
 * ones included) holds when every pair of cubes (s ∈ S_j, r ∈ R_j) is disjoint, a cube
 * operation with no enumeration.
 *
 * Cover layout everywhere here: function 2j is S_j, function 2j+1 is R_j.
 */
import { intersect, subtract, type Cube } from '../model/cube.js';
import type { GuardReport } from '../model/build.js';
import type { MinimiseOptions, MultiFunction, SopCover, Term } from './minimise-logic/types.js';
import type { Excitation } from './excite.js';

/** A two-level minimiser (the real one lives in phases/minimise-logic). */
export type Minimiser = (f: MultiFunction, opts?: MinimiseOptions) => SopCover;

export type GuardMethod = 'split-by-bit' | 'set-first';

/** What a set/reset cover costs once mapped onto parts. */
export interface Price {
  readonly gates: number;
  readonly cords: number;
  /** Weighted total used to choose between safe methods. */
  readonly cost: number;
}

export interface GuardOptions {
  readonly method?: GuardMethod | 'auto';
  readonly minimise: Minimiser;
  readonly minimiseOptions?: MinimiseOptions;
  /** Prices a set/reset cover (function 2j = S_j, 2j+1 = R_j). */
  readonly price: (cover: SopCover) => Price;
  /** Minimise the unguarded functions too, to measure the guard's cost (default true). */
  readonly baseline?: boolean;
}

/** A failed proof: a point where S_j and R_j are both 1. */
export interface Overlap {
  readonly bit: number;
  /** A full assignment of state bits then inputs ('0'/'1'). */
  readonly point: string;
}

export interface ExclusionProof {
  readonly ok: boolean;
  readonly latchesChecked: number;
  readonly overlap?: Overlap;
}

export interface Guarded {
  /** The minimised set/reset cover that was chosen. */
  readonly cover: SopCover;
  /** The guarded function(s) handed to the minimiser for the chosen method, in call order. */
  readonly functions: readonly MultiFunction[];
  readonly report: GuardReport;
  readonly proof: ExclusionProof;
}

/** Every set/reset function with all don't-cares free to both (unsafe: for pricing only). */
export function unguardedFunction(ex: Excitation): MultiFunction {
  const on: Cube[][] = [],
    dc: Cube[][] = [];
  for (let j = 0; j < ex.bits; j++) {
    on.push([...ex.set[j].on], [...ex.reset[j].on]);
    dc.push([...ex.set[j].dc], [...ex.reset[j].dc]);
  }
  return { vars: ex.bits + ex.inputs, on, dc };
}

/** The split-by-bit guarded function: G to S_j where q_j = 0, to R_j where q_j = 1. */
export function splitFunction(ex: Excitation): MultiFunction {
  const on: Cube[][] = [],
    dc: Cube[][] = [];
  for (let j = 0; j < ex.bits; j++) {
    on.push([...ex.set[j].on], [...ex.reset[j].on]);
    dc.push(
      [...ex.set[j].tableDc, ...restrict(ex.globalDc, j, '0')],
      [...ex.reset[j].tableDc, ...restrict(ex.globalDc, j, '1')],
    );
  }
  return { vars: ex.bits + ex.inputs, on, dc };
}

/** The set-first method: S_j with all of G, then R_j without S_j's cover. */
export function setFirst(
  ex: Excitation,
  minimise: Minimiser,
  mopts?: MinimiseOptions,
): { cover: SopCover; functions: MultiFunction[] } {
  const vars = ex.bits + ex.inputs;
  const sFn: MultiFunction = { vars, on: ex.set.map((s) => s.on), dc: ex.set.map((s) => s.dc) };
  const sCover = minimise(sFn, mopts);
  const rFn: MultiFunction = {
    vars,
    on: ex.reset.map((r) => r.on),
    dc: ex.reset.map((r, j) => subtract(r.dc, termsOf(sCover, j))),
  };
  const rCover = minimise(rFn, mopts);
  const terms = mergeTerms([
    ...sCover.terms.map((t) => ({ cube: t.cube, outputs: t.outputs.map((j) => 2 * j) })),
    ...rCover.terms.map((t) => ({ cube: t.cube, outputs: t.outputs.map((j) => 2 * j + 1) })),
  ]);
  return { cover: { vars, functions: 2 * ex.bits, terms }, functions: [sFn, rFn] };
}

/** Prove S_j·R_j = 0 for every bit of a set/reset cover, with cube intersections. */
export function proveExclusive(cover: SopCover, bits: number): ExclusionProof {
  for (let j = 0; j < bits; j++) {
    const s = termsOf(cover, 2 * j),
      r = termsOf(cover, 2 * j + 1);
    for (const a of s)
      for (const b of r) {
        const x = intersect(a, b);
        if (x !== null) return { ok: false, latchesChecked: j + 1, overlap: { bit: j, point: x.replaceAll('-', '0') } };
      }
  }
  return { ok: true, latchesChecked: bits };
}

/** Guard, minimise and prove the set/reset functions; report the guard's cost. */
export function guard(ex: Excitation, opts: GuardOptions): Guarded {
  if (ex.bits === 0) {
    const empty: SopCover = { vars: ex.inputs, functions: 0, terms: [] };
    return {
      cover: empty,
      functions: [],
      report: { ok: true, extraGates: 0, extraCords: 0, method: 'none (no latches)' },
      proof: { ok: true, latchesChecked: 0 },
    };
  }
  const mopts = opts.minimiseOptions;
  const method = opts.method ?? 'auto';
  const candidates: { method: GuardMethod; cover: SopCover; functions: MultiFunction[] }[] = [];
  if (method !== 'set-first') {
    const fn = splitFunction(ex);
    candidates.push({ method: 'split-by-bit', cover: opts.minimise(fn, mopts), functions: [fn] });
  }
  if (method !== 'split-by-bit') candidates.push({ method: 'set-first', ...setFirst(ex, opts.minimise, mopts) });
  const priced = candidates.map((c) => ({ ...c, price: opts.price(c.cover), proof: proveExclusive(c.cover, ex.bits) }));
  // The cheapest proven candidate; a failed proof (a minimiser that left its don't-cares)
  // is kept only when nothing was proven, and then reported as not ok.
  priced.sort((a, b) => Number(b.proof.ok) - Number(a.proof.ok) || a.price.cost - b.price.cost);
  const best = priced[0];
  const report: GuardReport =
    opts.baseline === false
      ? { ok: best.proof.ok, extraGates: 0, extraCords: 0, method: best.method, compared: false }
      : (() => {
          const base = opts.price(opts.minimise(unguardedFunction(ex), mopts));
          return {
            ok: best.proof.ok,
            extraGates: best.price.gates - base.gates,
            extraCords: best.price.cords - base.cords,
            method: best.method,
          };
        })();
  return { cover: best.cover, functions: best.functions, proof: best.proof, report };
}

/** The cubes of a cover that feed function `k`. */
export function termsOf(cover: SopCover, k: number): Cube[] {
  const out: Cube[] = [];
  for (const t of cover.terms) if (t.outputs.includes(k)) out.push(t.cube);
  return out;
}

/** Cubes restricted to q_j = v (cubes fixed to the other value drop out). */
function restrict(cubes: readonly Cube[], j: number, v: '0' | '1'): Cube[] {
  const out: Cube[] = [];
  for (const c of cubes) {
    if (c[j] === v) out.push(c);
    else if (c[j] === '-') out.push(c.slice(0, j) + v + c.slice(j + 1));
  }
  return out;
}

/** Merge terms with the same cube (one gate feeding every function either fed). */
export function mergeTerms(terms: readonly Term[]): Term[] {
  const by = new Map<Cube, Set<number>>();
  for (const t of terms) {
    const s = by.get(t.cube) ?? new Set<number>();
    for (const o of t.outputs) s.add(o);
    by.set(t.cube, s);
  }
  return [...by].map(([cube, s]) => ({ cube, outputs: [...s].sort((a, b) => a - b) }));
}
