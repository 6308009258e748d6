/**
 * Automatic encoding: the assignment that minimises the caller's cost (the finished build's
 * weighted part count), searched in three steps that share one memo and one budget:
 *
 * 1. the named strategies (binary, Gray, Johnson, one-hot; codes up to 24 bits), so the
 *    answer is never worse than the best of them — and ties go to them, being easier to read;
 * 2. at the fewest bits that fit (or the pinned codes' length): every assignment up to the
 *    cube's symmetries (symmetry.ts) when their number fits the remaining budget — all
 *    machines up to 8 states at the default budget —, else simulated annealing (anneal.ts);
 * 3. when step 2 was exhaustive and nothing is pinned: one bit more, if its classes also fit
 *    what is left of the budget (in practice up to 4 states).
 *
 * Precondition: the cost is the same for assignments that differ by a cube symmetry (true of
 * the SR build, where Q and Q̄ are both free); only one assignment per class is priced.
 * Postcondition: the best priced assignment, strategy 'auto'; the same for the same seed
 * when only the evaluation count bounds the search.
 */
import { diag } from '../../model/diagnostics.js';
import type { FlatMachine } from '../../model/flat.js';
import { seededRandom } from '../../model/random.js';
import { anneal } from './anneal.js';
import { binary } from './binary.js';
import { bitsFor, codeToInt } from './codes.js';
import { CostBook, MAX_SEARCH_BITS, type CostFn, type Progress } from './cost.js';
import { gray } from './gray.js';
import { johnson } from './johnson.js';
import { oneHot } from './one-hot.js';
import { startFirst } from './order.js';
import type { PinSet, StrategyResult } from './pinned.js';
import { assignmentClasses, MAX_SYMMETRY_BITS } from './symmetry.js';

/** How the automatic search went. */
export interface AutoReport {
  /** Cost evaluations made (distinct symmetry classes priced). */
  readonly evaluations: number;
  /** 'exhaustive' when every class at the main code length was priced, else 'annealing'. */
  readonly method: 'exhaustive' | 'annealing';
  /** Classes at the main code length, when they were counted in full. */
  readonly classes?: number;
  /** Whether assignments with one bit more were tried as well. */
  readonly extraBit: boolean;
  readonly bestCost: number;
}

export interface AutoOptions {
  readonly cost: CostFn;
  readonly seed: number;
  readonly maxEvaluations: number;
  readonly deadline?: number;
  readonly now?: () => number;
  readonly onProgress?: (p: Progress) => void;
}

/** Never enumerate more classes than this, whatever the budget (a time-bounded search would otherwise spend it listing). */
const MAX_EXHAUSTIVE = 20_000;
/** Annealing restarts: one per this many evaluations, between 1 and 4 (short restarts from random starts did worse than one long run). */
const EVALUATIONS_PER_RESTART = 1000;

/** The automatic search; pins are honoured and fix the code length. */
export function auto(f: FlatMachine, pins: PinSet, o: AutoOptions): StrategyResult & { report?: AutoReport } {
  const n = f.states.length;
  const bits = pins.bits ?? bitsFor(n);
  if (2 ** bits < n) {
    return { diagnostics: [diag('LW701', `pinned codes have ${bits} bits, too few for ${n} states (at least ${bitsFor(n)} needed)`, {}, 'pin longer codes')] };
  }
  if (bits > MAX_SEARCH_BITS) {
    return { diagnostics: [diag('LW701', `the automatic search handles codes up to ${MAX_SEARCH_BITS} bits; the pins ask for ${bits}`, {}, 'pin shorter codes, or choose a named encoding')] };
  }
  const book = new CostBook({ cost: o.cost, pins: pins.codes, maxEvaluations: o.maxEvaluations, deadline: o.deadline, now: o.now, onProgress: o.onProgress });
  const named = [binary, gray, johnson, oneHot].flatMap((strategy) => {
    const e = strategy(f, pins).encoding;
    return e && e.bits <= MAX_SEARCH_BITS ? [e] : [];
  });
  const pinned = new Map([...pins.codes].map(([s, c]) => [s, codeToInt(c)]));
  const slots = startFirst(f).filter((s) => !pinned.has(s));
  const classes = listClasses(book, bits, slots.length, pinned, named.length);
  book.total = classes ? named.length + classes.length : Number.isFinite(o.maxEvaluations) ? o.maxEvaluations : null;

  // 1. Named strategies.
  for (const e of named) {
    if (book.evaluations > 0 && book.exhausted()) break;
    book.priceCodes(e.codes, e.bits);
  }

  // 2. The main code length: every class if they fit, else annealing.
  let extraBit = false;
  if (classes) {
    priceAll(book, classes, slots, pinned, n, bits);
    // 3. One bit more, when that is cheap too.
    if (pins.codes.size === 0 && n >= 2 && bits + 1 <= MAX_SYMMETRY_BITS && !book.exhausted()) {
      const wider = listClasses(book, bits + 1, slots.length, pinned, 0);
      if (wider) {
        extraBit = true;
        priceAll(book, wider, slots, pinned, n, bits + 1);
      }
    }
  } else {
    const best = book.best;
    const start = best && best.bits === bits ? best.codes.map(codeToInt) : undefined;
    const restarts = Math.min(4, Math.max(1, Math.floor(book.remaining() / EVALUATIONS_PER_RESTART)));
    anneal(book, { n, bits, pinned, restarts, ...(start ? { start } : {}) }, seededRandom(o.seed), o.now, o.deadline);
  }

  const best = book.best;
  if (!best) return { diagnostics: [diag('LW701', 'no encoding could be priced within the budget', {}, 'raise the evaluation budget')] };
  return {
    encoding: { strategy: 'auto', bits: best.bits, codes: best.codes },
    diagnostics: [],
    report: {
      evaluations: book.evaluations,
      method: classes ? 'exhaustive' : 'annealing',
      ...(classes ? { classes: classes.length } : {}),
      extraBit,
      bestCost: best.cost,
    },
  };
}

/** Every class of assignments at this length, or undefined when there are more than the budget allows. */
function listClasses(book: CostBook, bits: number, slots: number, pinned: ReadonlyMap<number, number>, reserved: number): number[][] | undefined {
  const cap = Math.min(book.remaining() - reserved, MAX_EXHAUSTIVE);
  const taken = new Set(pinned.values());
  const group = book.group(bits);
  // Without symmetries every injective assignment is its own class, so slots + cap + 1 codes
  // already give more than cap classes: no need to list all 2^bits codes.
  const limit = group.length > 0 ? Infinity : slots + cap + 1;
  const available: number[] = [];
  for (let c = 0; c < 2 ** bits && available.length < limit; c++) if (!taken.has(c)) available.push(c);
  const out: number[][] = [];
  for (const a of assignmentClasses(slots, available, group)) {
    if (out.length >= cap) return undefined;
    out.push(a);
  }
  return out;
}

/** Price every class, first correcting the planned total for classes already priced (the named strategies' own). */
function priceAll(book: CostBook, classes: readonly number[][], slots: readonly number[], pinned: ReadonlyMap<number, number>, n: number, bits: number): void {
  const vectors = classes.map((a) => {
    const codes = new Array<number>(n);
    for (const [s, c] of pinned) codes[s] = c;
    slots.forEach((s, i) => (codes[s] = a[i]));
    return codes;
  });
  book.total = book.evaluations + vectors.filter((v) => book.known(v, bits) === undefined).length;
  for (const v of vectors) {
    if (book.exhausted()) return;
    book.price(v, bits);
  }
}
