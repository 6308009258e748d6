/**
 * Automatic encoding: the assignment that minimises the caller's cost (the finished build's
 * weighted part count), searched in three steps that share one memo and one budget:
 *
 * 1. the named strategies (binary, Gray, Johnson, one-hot) whose codes are at most three
 *    bits longer than the minimum, so the answer is never worse than the best of them and
 *    ties go to them, being easier to read (longer codes are slow to price and never won in
 *    our measurements);
 * 2. at the fewest bits that fit (or the pinned codes' length): every assignment up to the
 *    cube's symmetries (symmetry.ts) when their number fits the budget, else simulated
 *    annealing (anneal.ts);
 * 3. when step 2 was exhaustive and nothing is pinned: one bit more, if its classes also fit
 *    what is left of the budget (in practice up to 4 states).
 *
 * The budget is an evaluation count, a deadline on the caller's clock, or (by default)
 * DEFAULT_SEARCH: exhaustive when there are at most 500 classes (every machine up to 6
 * states), else 50 annealing evaluations.
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
  /** 'exhaustive' when the classes at the main code length were listed for pricing, else 'annealing'. */
  readonly method: 'exhaustive' | 'annealing';
  /** False when a deadline cut an exhaustive search short. */
  readonly complete: boolean;
  /** Classes at the main code length, when they were counted in full. */
  readonly classes?: number;
  /** Whether assignments with one bit more were tried as well. */
  readonly extraBit: boolean;
  readonly bestCost: number;
}

export interface AutoOptions {
  readonly cost: CostFn;
  readonly seed: number;
  /** Most cost evaluations; undefined for DEFAULT_SEARCH (or, with a deadline, no count limit). */
  readonly maxEvaluations?: number;
  readonly deadline?: number;
  readonly now?: () => number;
  readonly onProgress?: (p: Progress) => void;
}

/**
 * The default budget: price every class when there are at most `exhaustiveClasses` (all
 * machines up to 6 states: 420 classes at most, McCluskey & Unger), else anneal for
 * `annealingEvaluations`. Sized for the goal of about 5 s on the benchmark's random 16-state,
 * 4-input machine, where one evaluation (the pipeline's pricing synthesis) measured 70–100 ms
 * of CPU time: 50 evaluations took 3.8 s; an exhaustive 6-state search (bbtas) took 2.6 s.
 */
export const DEFAULT_SEARCH = { exhaustiveClasses: 500, annealingEvaluations: 50 } as const;

/** Named strategies are priced only when their codes are at most this many bits longer than the minimum. */
const NAMED_EXTRA_BITS = 3;
/** Never enumerate more classes than this, whatever the budget (a time-bounded search would otherwise spend it listing). */
const MAX_EXHAUSTIVE = 20_000;
/** Annealing restarts: one per this many evaluations, between 1 and 4 (short restarts from random starts did worse than one long run). */
const EVALUATIONS_PER_RESTART = 1000;

/** LW701 when the code length cannot be searched: too short for the states, or longer than the search handles. */
function lengthProblem(n: number, bits: number): StrategyResult | undefined {
  if (2 ** bits < n) {
    return {
      diagnostics: [
        diag(
          'LW701',
          `pinned codes have ${bits} bits, too few for ${n} states (at least ${bitsFor(n)} needed)`,
          {},
          'pin longer codes',
        ),
      ],
    };
  }
  if (bits > MAX_SEARCH_BITS) {
    return {
      diagnostics: [
        diag(
          'LW701',
          `the automatic search handles codes up to ${MAX_SEARCH_BITS} bits; the pins ask for ${bits}`,
          {},
          'pin shorter codes, or choose a named encoding',
        ),
      ],
    };
  }
  return undefined;
}

/** The search space at the main code length: the states still to place and the pinned codes. */
interface Space {
  readonly n: number;
  readonly bits: number;
  readonly slots: readonly number[];
  readonly pinned: ReadonlyMap<number, number>;
  readonly pinCount: number;
}

/**
 * Steps 2 and 3: every class at the main length (then one bit more, when that is cheap too),
 * or annealing when the classes did not fit the budget.
 */
function searchCodes(
  book: CostBook,
  space: Space,
  classes: readonly number[][] | undefined,
  o: AutoOptions,
): { complete: boolean; extraBit: boolean } {
  const { n, bits, slots, pinned } = space;
  if (!classes) {
    const best = book.best;
    const start = best && best.bits === bits ? best.codes.map(codeToInt) : undefined;
    const restarts = Math.min(4, Math.max(1, Math.floor(book.remaining() / EVALUATIONS_PER_RESTART)));
    anneal(book, { n, bits, pinned, restarts, ...(start ? { start } : {}) }, seededRandom(o.seed), o.now, o.deadline);
    return { complete: true, extraBit: false };
  }
  const complete = priceAll(book, classes, slots, pinned, n, bits);
  if (complete && space.pinCount === 0 && n >= 2 && bits + 1 <= MAX_SYMMETRY_BITS && !book.exhausted()) {
    const wider = listClasses(book, bits + 1, slots.length, pinned, Math.min(book.remaining(), MAX_EXHAUSTIVE));
    if (wider) {
      priceAll(book, wider, slots, pinned, n, bits + 1);
      return { complete, extraBit: true };
    }
  }
  return { complete, extraBit: false };
}

/** The automatic search; pins are honoured and fix the code length. */
export function auto(f: FlatMachine, pins: PinSet, o: AutoOptions): StrategyResult & { report?: AutoReport } {
  const n = f.states.length;
  const bits = pins.bits ?? bitsFor(n);
  const problem = lengthProblem(n, bits);
  if (problem) return problem;
  const timed = o.deadline !== undefined;
  const book = new CostBook({
    cost: o.cost,
    pins: pins.codes,
    maxEvaluations: Infinity,
    deadline: o.deadline,
    now: o.now,
    onProgress: o.onProgress,
  });
  const named = [binary, gray, johnson, oneHot].flatMap((strategy) => {
    const e = strategy(f, pins).encoding;
    return e && e.bits <= Math.min(MAX_SEARCH_BITS, bits + NAMED_EXTRA_BITS) ? [e] : [];
  });
  const pinned = new Map([...pins.codes].map(([s, c]) => [s, codeToInt(c)]));
  const slots = startFirst(f).filter((s) => !pinned.has(s));

  // Settle the budget now that the size of the space is known.
  const cap =
    o.maxEvaluations !== undefined
      ? o.maxEvaluations - named.length
      : timed
        ? MAX_EXHAUSTIVE
        : DEFAULT_SEARCH.exhaustiveClasses;
  const classes = listClasses(book, bits, slots.length, pinned, cap);
  book.limit =
    o.maxEvaluations ??
    (timed
      ? Infinity
      : named.length + (classes ? DEFAULT_SEARCH.exhaustiveClasses : DEFAULT_SEARCH.annealingEvaluations));
  book.total = classes ? named.length + classes.length : Number.isFinite(book.limit) ? book.limit : null;

  // 1. Named strategies.
  for (const e of named) {
    if (book.evaluations > 0 && book.exhausted()) break;
    book.priceCodes(e.codes, e.bits);
  }
  // 2. and 3.
  const { complete, extraBit } = searchCodes(book, { n, bits, slots, pinned, pinCount: pins.codes.size }, classes, o);

  const best = book.best;
  if (!best)
    return {
      diagnostics: [diag('LW701', 'no encoding could be priced within the budget', {}, 'raise the evaluation budget')],
    };
  const method = classes ? 'exhaustive' : 'annealing';
  const report: AutoReport = {
    evaluations: book.evaluations,
    method,
    complete,
    ...(classes ? { classes: classes.length } : {}),
    extraBit,
    bestCost: best.cost,
  };
  return { encoding: { strategy: 'auto', bits: best.bits, codes: best.codes }, diagnostics: [], report };
}

/** Every class of assignments at this length, or undefined when there are more than the budget allows. */
function listClasses(
  book: CostBook,
  bits: number,
  slots: number,
  pinned: ReadonlyMap<number, number>,
  cap: number,
): number[][] | undefined {
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

/** Price every class (false when the budget ran out first), first correcting the planned total for classes already priced (the named strategies' own). */
function priceAll(
  book: CostBook,
  classes: readonly number[][],
  slots: readonly number[],
  pinned: ReadonlyMap<number, number>,
  n: number,
  bits: number,
): boolean {
  const vectors = classes.map((a) => {
    const codes = new Array<number>(n);
    for (const [s, c] of pinned) codes[s] = c;
    slots.forEach((s, i) => (codes[s] = a[i]));
    return codes;
  });
  book.total = book.evaluations + vectors.filter((v) => book.known(v, bits) === undefined).length;
  for (const v of vectors) {
    if (book.known(v, bits) !== undefined) continue;
    if (book.exhausted()) return false;
    book.price(v, bits);
  }
  return true;
}
