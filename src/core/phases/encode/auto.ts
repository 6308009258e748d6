/**
 * Automatic encoding: the assignment that minimises the caller's cost (the finished build's
 * weighted part count). The search is a plan of independent tasks (search.ts), run here one
 * after the other; a shell may run each batch on several threads with the same result.
 *
 * 1. The named strategies (binary, Gray, Johnson, one-hot) whose codes are at most three bits
 *    longer than the minimum are priced by the full cost, so the answer is never worse than
 *    the best of them and ties go to them, being easier to read.
 * 2. Screening at the fewest bits that fit (or the pinned codes' length): every assignment up
 *    to the cube's symmetries (symmetry.ts) when their number fits the budget — then, with
 *    nothing pinned, one bit more if those classes fit too — else simulated annealing
 *    (anneal.ts) in independent runs. With a sketch (sketch.ts), screening uses the sketch,
 *    which costs a fraction of a millisecond where the full cost takes tens to hundreds.
 * 3. With a sketch: the best few screened candidates of each length are priced by the full
 *    cost. Without one, the screening measure is the full cost and step 3 is not needed.
 *
 * The answer is the cheapest by the full cost; ties go to the named strategies (in order),
 * then to the better screened candidate.
 *
 * Budgets. An evaluation count (`maxEvaluations`) bounds the full-cost evaluations; a deadline
 * on the caller's clock bounds everything; by default the budget follows the size of the
 * problem (SKETCH_SEARCH, DEFAULT_SEARCH), so that the search's work grows with the machine
 * no faster than one full synthesis does.
 *
 * Precondition: the cost is the same for assignments that differ by a cube symmetry (true of
 * the SR build, where Q and Q̄ are both free); only one assignment per class is priced.
 * Postcondition: the best priced assignment, strategy 'auto'; the same for the same seed
 * when no deadline bounds the search, however its tasks were run.
 */
import { diag } from '../../model/diagnostics.js';
import type { FlatMachine } from '../../model/flat.js';
import { binary } from './binary.js';
import { bitsFor, codeToInt } from './codes.js';
import { CostBook, MAX_SEARCH_BITS, type Best, type CostFn, type Progress } from './cost.js';
import { gray } from './gray.js';
import { johnson } from './johnson.js';
import { oneHot } from './one-hot.js';
import { startFirst } from './order.js';
import { readPins, type PinSet, type StrategyResult } from './pinned.js';
import {
  mergeScreens,
  ProgressCounter,
  runTask,
  taskSeeds,
  type SearchTask,
  type TaskContext,
  type TaskResult,
} from './search.js';
import { assignmentClasses, canonicalKey, MAX_SYMMETRY_BITS, surelyMoreClasses } from './symmetry.js';
import type { Encoding } from '../../model/build.js';
import { adjacencyCost } from './cost.js';
import type { EncodeOptions } from './options.js';
import { sketchOf, type Sketch } from './sketch.js';

/** How the automatic search went. */
export interface AutoReport {
  /** Evaluations of the full cost. */
  readonly evaluations: number;
  /** Evaluations of the sketch (0 when the full cost screened). */
  readonly sketches: number;
  /** 'exhaustive' when the classes at the main code length were listed for screening, else 'annealing'. */
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
  /** Screening measure; without it the full cost screens every candidate. */
  readonly sketch?: Sketch;
  readonly seed: number;
  /** Most full-cost evaluations; undefined for the default budget (or, with a deadline, no count limit). */
  readonly maxEvaluations?: number;
  readonly deadline?: number;
  readonly now?: () => number;
  readonly onProgress?: (p: Progress) => void;
}

/**
 * The default budget without a sketch (every candidate priced by the full cost): every class
 * when there are at most `exhaustiveClasses` (all machines up to 6 states: 420 classes at most,
 * McCluskey & Unger), else `annealingEvaluations`.
 */
export const DEFAULT_SEARCH = { exhaustiveClasses: 500, annealingEvaluations: 50 } as const;

/**
 * The default budget with a sketch. Every class is screened when there are at most
 * `exhaustiveClasses` (every machine up to 8 states at the fewest bits; one bit more up to 5
 * states); else `runs` annealing runs share as many sketches as fit in `work` steps of the
 * sketch's own count (measured once, on the first named encoding), between `minSketches` and
 * `maxSketches`, so the screening takes about the same time on machines of every size. Then
 * the `finalists` best screened candidates at the main length (half as many at one bit more)
 * are priced by the full cost — `largeFinalists` when one sketch takes more than
 * `largeSketch` steps (the full cost grows with the sketch, at 100–1000 times its time).
 * When annealing screened and one sketch is at most `smallSketch` steps, `polishRuns` runs of
 * `polishEvaluations` full-cost annealing steps start from the cheapest priced codes and from
 * the cheapest named ones (the polish).
 * Past `hugeWork` (one sketch's steps times the variables of the set/reset functions, state
 * bits plus inputs: a measure of one full synthesis that grows with both), a full synthesis
 * takes seconds to tens of seconds, so the sketch alone chooses among the named encodings and
 * the annealed candidates and only its choice is priced by the full cost (one synthesis
 * instead of four). Every LGSynth'91 machine stays below it (s298, the largest, at 2.6e7).
 * Measured on the LGSynth'91 machines: see docs/methods/encode.md.
 */
export const SKETCH_SEARCH = {
  exhaustiveClasses: 2000,
  runs: 4,
  work: 2e8,
  minSketches: 40,
  maxSketches: 4000,
  smallSketch: 2e4,
  smallFinalists: 16,
  finalists: 6,
  largeSketch: 4e5,
  largeFinalists: 2,
  hugeWork: 3e7,
  polishRuns: 2,
  polishEvaluations: 10,
} as const;

/** Named strategies are priced only when their codes are at most this many bits longer than the minimum. */
const NAMED_EXTRA_BITS = 3;
/** Never enumerate more classes than this, whatever the budget (a time-bounded search would otherwise spend it listing). */
const MAX_EXHAUSTIVE = 20_000;
/** Classes per listing task. */
const LIST_SLICE = 250;
/** Without a sketch: annealing runs, one per this many evaluations, between 1 and 4. */
const EVALUATIONS_PER_RUN = 1000;

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

/** One priced candidate in the order ties are broken. */
interface Priced {
  readonly codes: readonly string[];
  readonly bits: number;
  readonly cost: number;
  /** What the cost kept of pricing them (TaskContext.kept), when a price task priced them. */
  readonly kept?: unknown;
}

/** The plan of one automatic search, stepped batch by batch (see the module comment). */
export class AutoSearch {
  /** Set when the search cannot run (LW701); then there are no tasks. */
  readonly problem?: StrategyResult;
  /** The machine as the tasks need it. */
  readonly n: number;
  readonly pins: ReadonlyMap<number, string>;
  private readonly bits: number;
  private readonly named: Encoding[] = [];
  private readonly book: CostBook;
  private readonly classes?: number[][];
  private readonly wider?: number[][];
  private readonly sketched: boolean;
  private stage = 0;
  private batch: SearchTask[] = [];
  private readonly priced: Priced[] = [];
  private finalists: Best[] = [];
  private oneSketch?: number;
  private sketches = 0;
  private evaluations = 0;
  private complete = true;
  readonly progress: ProgressCounter;

  constructor(
    private readonly f: FlatMachine,
    pins: PinSet,
    private readonly o: AutoOptions,
  ) {
    this.n = f.states.length;
    this.pins = pins.codes;
    this.bits = pins.bits ?? bitsFor(this.n);
    this.sketched = o.sketch !== undefined;
    this.book = new CostBook({ cost: o.cost, pins: pins.codes, maxEvaluations: Infinity });
    this.progress = new ProgressCounter(null, o.onProgress);
    this.problem = lengthProblem(this.n, this.bits);
    if (this.problem) return;
    const limit = Math.min(MAX_SEARCH_BITS, this.bits + NAMED_EXTRA_BITS);
    for (const strategy of [binary, gray, johnson, oneHot]) {
      const e = strategy(f, pins).encoding;
      if (e && e.bits <= limit && !this.named.some((x) => this.same(x, e))) this.named.push(e);
    }
    const cap = this.classCap();
    this.classes = this.listClasses(this.bits, cap);
    if (this.classes && pins.codes.size === 0 && this.n >= 2 && this.bits + 1 <= MAX_SYMMETRY_BITS && !this.timed)
      this.wider = this.listClasses(this.bits + 1, cap - this.classes.length);
    this.progress.total = this.plannedTotal();
  }

  /** The next batch of independent tasks; empty when the search is over. */
  next(): SearchTask[] {
    if (this.problem) return [];
    if (this.stage === 0) {
      this.stage = 1;
      const named = this.huge ? [] : this.named.map((e, i) => this.priceTask(e.codes, e.bits, i === 0));
      this.batch = [...named, ...this.screenTasks()];
      return this.batch;
    }
    if (this.stage === 1 && !this.sketched && !this.classes) {
      // Without a sketch, annealing starts from the best named encoding, so it waits for their prices.
      this.stage = 2;
      this.batch = this.annealTasks(this.annealBudget());
      return this.batch;
    }
    if (this.stage < 3 && this.sketched) {
      this.stage = 3;
      this.batch = this.finalists.map((c) => this.priceTask(c.codes, c.bits));
      return this.batch;
    }
    if (this.stage === 3 && this.polishes) {
      this.stage = 4;
      this.batch = this.polishTasks();
      if (this.batch.length > 0) return this.batch;
    }
    this.stage = 5;
    return [];
  }

  /**
   * Whether the polish runs: annealing screened, and one sketch is at most SKETCH_SEARCH.smallSketch
   * steps (where a full synthesis is cheap; on larger machines it gained 0.1–3 % for 2–5 times the time).
   */
  private get polishes(): boolean {
    return this.sketched && !this.classes && this.sketchSize() <= SKETCH_SEARCH.smallSketch;
  }

  /**
   * The polish: SKETCH_SEARCH.polishRuns annealing runs by the full cost, each of
   * `polishEvaluations`, from the cheapest priced codes at the main length (the sketch ranks
   * well but not exactly; a few full-cost steps near the best find what it misses).
   */
  private polishTasks(): SearchTask[] {
    const atLength = this.priced.filter((p) => p.bits === this.bits);
    const named = atLength.slice(0, this.named.filter((e) => e.bits === this.bits).length);
    const cheapest = (list: readonly Priced[]): Priced | undefined =>
      list.reduce<Priced | undefined>((b, p) => (!b || p.cost < b.cost ? p : b), undefined);
    // One run from the best priced codes, one from the best named ones (their neighbourhood is
    // where a full-cost search from them finds its gains); the same codes when those are named.
    const starts = [cheapest(atLength), cheapest(named) ?? cheapest(atLength)];
    if (!starts[0]) return [];
    const room = this.o.maxEvaluations !== undefined ? this.o.maxEvaluations - this.evaluations : Infinity;
    const runs = SKETCH_SEARCH.polishRuns;
    const each = Math.min(SKETCH_SEARCH.polishEvaluations, Math.floor(room / runs));
    if (each < 2) return [];
    return taskSeeds(this.o.seed + 1, runs).map((seed, r) => ({
      kind: 'anneal',
      full: true,
      bits: this.bits,
      seed,
      evaluations: each,
      start: (starts[r % starts.length] ?? (starts[0] as Priced)).codes.map(codeToInt),
      keep: 1,
      ...(this.o.deadline !== undefined ? { deadline: this.o.deadline } : {}),
    }));
  }

  /** The results of the batch just handed out, in its order. */
  accept(results: readonly TaskResult[]): void {
    const screens: TaskResult[] = [];
    results.forEach((r, i) => {
      const t = this.batch[i];
      if (r.kind === 'price') {
        if (r.priced) this.evaluations++;
        if (t.kind === 'price' && r.priced)
          this.priced.push({
            codes: t.codes,
            bits: t.bits,
            cost: r.cost,
            ...(r.kept !== undefined ? { kept: r.kept } : {}),
          });
        return;
      }
      const full = !this.sketched || (t.kind === 'anneal' && t.full === true);
      if (full) this.evaluations += r.evaluations;
      else this.sketches += r.evaluations;
      if (!r.complete) this.complete = false;
      if (full) for (const c of r.best.slice(0, 1)) this.priced.push(c);
      else screens.push(r);
    });
    if (this.sketched && screens.length > 0) this.finalists = this.chooseFinalists(screens);
  }

  /** The answer once every batch is done, with what the cost kept of pricing it (if a price task did). */
  result(): StrategyResult & { report?: AutoReport; kept?: unknown } {
    if (this.problem) return this.problem;
    let best: Priced | undefined;
    for (const p of this.priced) if (!best || p.cost < best.cost) best = p;
    if (!best)
      return {
        diagnostics: [
          diag('LW701', 'no encoding could be priced within the budget', {}, 'raise the evaluation budget'),
        ],
      };
    const report: AutoReport = {
      evaluations: this.evaluations,
      sketches: this.sketches,
      method: this.classes ? 'exhaustive' : 'annealing',
      complete: this.complete,
      ...(this.classes ? { classes: this.classes.length + this.namedClassesAt(this.bits) } : {}),
      extraBit: this.wider !== undefined,
      bestCost: best.cost,
    };
    return {
      encoding: { strategy: 'auto', bits: best.bits, codes: [...best.codes] },
      diagnostics: [],
      report,
      ...(best.kept !== undefined ? { kept: best.kept } : {}),
    };
  }

  /** The context a task runs in (the caller adds the measures' functions). */
  context(): Omit<TaskContext, 'cost' | 'sketch'> {
    return { n: this.n, pins: this.pins, ...(this.o.now ? { now: this.o.now } : {}) };
  }

  private get timed(): boolean {
    return this.o.deadline !== undefined;
  }

  private same(a: Encoding, b: Encoding): boolean {
    return a.bits === b.bits && a.codes.every((c, i) => c === b.codes[i]);
  }

  /** Most classes that may be listed for screening. */
  private classCap(): number {
    const named = this.named.length;
    if (this.sketched) return this.timed ? MAX_EXHAUSTIVE : SKETCH_SEARCH.exhaustiveClasses;
    if (this.o.maxEvaluations !== undefined) return Math.max(0, this.o.maxEvaluations - named);
    return this.timed ? MAX_EXHAUSTIVE : DEFAULT_SEARCH.exhaustiveClasses;
  }

  /** Every class at this length not already among the named strategies', or undefined past `cap`. */
  private listClasses(bits: number, cap: number): number[][] | undefined {
    if (cap < 0) return undefined;
    const pinned = new Map([...this.pins].map(([s, c]) => [s, codeToInt(c)]));
    const taken = new Set(pinned.values());
    const slots = startFirst(this.f).filter((s) => !pinned.has(s));
    const group = this.book.group(bits);
    const free = 2 ** bits - taken.size;
    const skip = this.namedKeys(bits);
    if (surelyMoreClasses(slots.length, free, group.length, cap + skip.size)) return undefined;
    const available: number[] = [];
    for (let c = 0; c < 2 ** bits; c++) if (!taken.has(c)) available.push(c);
    const out: number[][] = [];
    for (const a of assignmentClasses(slots.length, available, group)) {
      const codes = new Array<number>(this.n);
      for (const [s, c] of pinned) codes[s] = c;
      slots.forEach((s, i) => (codes[s] = a[i]));
      if (skip.has(canonicalKey(codes, group))) continue;
      if (out.length >= cap) return undefined;
      out.push(codes);
    }
    return out;
  }

  /** Canonical keys of the named strategies' codes of this length. */
  private namedKeys(bits: number): Set<string> {
    const group = this.book.group(bits);
    return new Set(this.named.filter((e) => e.bits === bits).map((e) => canonicalKey(e.codes.map(codeToInt), group)));
  }

  private namedClassesAt(bits: number): number {
    return this.namedKeys(bits).size;
  }

  /** A full price; the search's first one has no deadline, so that some encoding is always priced. */
  private priceTask(codes: readonly string[], bits: number, first = false): SearchTask {
    const deadline = this.o.deadline !== undefined && !first ? { deadline: this.o.deadline } : {};
    return { kind: 'price', bits, codes, ...deadline };
  }

  /** The first batch's screening: slices of the classes, or (with a sketch) annealing runs. */
  private screenTasks(): SearchTask[] {
    const keep = this.sketched ? this.finalistCount() : 1;
    const deadline = this.o.deadline !== undefined ? { deadline: this.o.deadline } : {};
    if (this.classes) {
      const tasks: SearchTask[] = [];
      const slice = (bits: number, list: number[][], k: number): void => {
        for (let i = 0; i < list.length; i += LIST_SLICE)
          tasks.push({ kind: 'list', bits, assignments: list.slice(i, i + LIST_SLICE), keep: k, ...deadline });
      };
      slice(this.bits, this.classes, keep);
      if (this.wider) slice(this.bits + 1, this.wider, Math.ceil(keep / 2));
      return tasks;
    }
    return this.sketched ? this.annealTasks(this.sketchBudget()) : [];
  }

  /** Independent annealing runs sharing `budget` evaluations of the screening measure (and, with a sketch, its work budget). */
  private annealTasks(budget: number): SearchTask[] {
    const runs = this.sketched
      ? SKETCH_SEARCH.runs
      : Math.min(4, Math.max(1, Math.floor(budget / EVALUATIONS_PER_RUN)));
    const seeds = taskSeeds(this.o.seed, runs);
    const starts = this.annealStarts(runs);
    const share = Number.isFinite(budget) ? Math.floor(budget / runs) : Infinity;
    return seeds.map((seed, r) => ({
      kind: 'anneal',
      bits: this.bits,
      seed,
      evaluations: Number.isFinite(share) ? share + (r < budget - share * runs ? 1 : 0) : Infinity,
      ...(starts[r] ? { start: starts[r] } : {}),
      keep: this.sketched ? this.finalistCount() : 1,
      ...(this.o.deadline !== undefined ? { deadline: this.o.deadline } : {}),
    }));
  }

  /**
   * Where each annealing run starts: without a sketch, the first from the best priced named
   * encoding; with one, the runs start from the named encodings at the main length in order
   * of their sketch (cheapest first), the rest from random assignments.
   */
  private annealStarts(runs: number): (number[] | undefined)[] {
    const atLength = this.named.filter((e) => e.bits === this.bits).map((e) => e.codes.map(codeToInt));
    if (!this.sketched) {
      const best = this.priced.filter((p) => p.bits === this.bits).sort((a, b) => a.cost - b.cost)[0];
      return [best ? best.codes.map(codeToInt) : undefined];
    }
    const sketch = this.o.sketch as Sketch;
    const ranked = atLength
      .map((codes, i) => ({ codes, i, v: sketch.estimate(codes, this.bits) }))
      .sort((a, b) => a.v - b.v || a.i - b.i);
    return Array.from({ length: runs }, (_, r) => ranked[r]?.codes);
  }

  /** Evaluations of the full cost left for annealing without a sketch. */
  private annealBudget(): number {
    if (this.o.maxEvaluations !== undefined) return Math.max(0, this.o.maxEvaluations - this.named.length);
    return this.timed ? Infinity : DEFAULT_SEARCH.annealingEvaluations;
  }

  /** Work of one sketch of the first named encoding at the main length (measured once). */
  private sketchSize(): number {
    if (this.oneSketch !== undefined) return this.oneSketch;
    const sketch = this.o.sketch;
    const first = this.named.find((e) => e.bits === this.bits);
    let w = 0;
    if (sketch && first) {
      const w0 = sketch.work;
      sketch.estimate(first.codes.map(codeToInt), this.bits);
      w = sketch.work - w0;
    }
    this.oneSketch = w;
    return w;
  }

  /** Sketches for annealing: as many as fit the work budget. */
  private sketchBudget(): number {
    const n = Math.floor(SKETCH_SEARCH.work / Math.max(1, this.sketchSize()));
    return Math.max(SKETCH_SEARCH.minSketches, Math.min(SKETCH_SEARCH.maxSketches, n));
  }

  /**
   * True when one full synthesis is too dear to price more than one candidate (SKETCH_SEARCH.hugeWork):
   * then the named encodings are screened by the sketch with the rest, and one finalist is priced.
   */
  private get huge(): boolean {
    if (!this.sketched || this.classes) return false;
    return this.sketchSize() * (this.bits + this.f.inputs.length) > SKETCH_SEARCH.hugeWork;
  }

  /** Finalists per length: fewer when one sketch is large, one when it is huge. */
  private finalistCount(): number {
    if (this.huge) return 1;
    const w = this.sketchSize();
    if (w <= SKETCH_SEARCH.smallSketch) return SKETCH_SEARCH.smallFinalists;
    return w > SKETCH_SEARCH.largeSketch ? SKETCH_SEARCH.largeFinalists : SKETCH_SEARCH.finalists;
  }

  /** The best screened candidates of each length, not already priced as a named strategy. */
  private chooseFinalists(screens: readonly TaskResult[]): Best[] {
    const keyOf = (c: Best): string => `${c.bits}|${canonicalKey(c.codes.map(codeToInt), this.book.group(c.bits))}`;
    const priced = this.huge ? [] : this.named;
    const exclude = new Set(priced.map((e) => (e.bits <= MAX_SEARCH_BITS ? keyOf({ ...e, cost: 0 }) : '')));
    const room = this.o.maxEvaluations !== undefined ? Math.max(1, this.o.maxEvaluations - priced.length) : Infinity;
    const at = (bits: number, keep: number): Best[] =>
      mergeScreens(
        screens.filter((r) => r.kind === 'screen' && r.best[0]?.bits === bits),
        keyOf,
        exclude,
        keep,
      );
    const k = this.finalistCount();
    const main = at(this.bits, Math.min(room, k));
    const wide = this.wider ? at(this.bits + 1, Math.min(room - main.length, Math.ceil(k / 2))) : [];
    return [...main, ...wide];
  }

  /** Evaluations planned, for progress (null when only a deadline bounds them). */
  private plannedTotal(): number | null {
    const named = this.named.length;
    if (this.classes) {
      const listed = this.classes.length + (this.wider?.length ?? 0);
      if (!this.sketched) return named + listed;
      const k = this.finalistCount();
      return named + listed + Math.min(listed, k + (this.wider ? Math.ceil(k / 2) : 0));
    }
    if (this.sketched) {
      const polish = this.polishes ? SKETCH_SEARCH.polishRuns * SKETCH_SEARCH.polishEvaluations : 0;
      return (this.huge ? 0 : named) + this.sketchBudget() + this.finalistCount() + polish;
    }
    const b = this.annealBudget();
    return Number.isFinite(b) ? named + b : null;
  }
}

/** The automatic search, its tasks run one after the other; pins are honoured and fix the code length. */
export function auto(
  f: FlatMachine,
  pins: PinSet,
  o: AutoOptions,
): StrategyResult & { report?: AutoReport; kept?: unknown } {
  const search = new AutoSearch(f, pins, o);
  return runPlan(search, { ...search.context(), cost: o.cost, ...(o.sketch ? { sketch: o.sketch } : {}) });
}

/** Run a plan's batches in this thread, task after task. */
export function runPlan(
  search: AutoSearch,
  ctx: TaskContext,
): StrategyResult & { report?: AutoReport; kept?: unknown } {
  if (search.problem) return search.problem;
  for (let batch = search.next(); batch.length > 0; batch = search.next())
    search.accept(batch.map((t) => runTask(ctx, t, search.progress.tick)));
  return search.result();
}

/** The plan of the automatic search for checked pins and the phase's options. */
export function autoSearch(f: FlatMachine, pins: PinSet, opts: EncodeOptions): AutoSearch {
  const millis = opts.now ? opts.budget?.millis : undefined;
  const start = millis !== undefined && opts.now ? opts.now() : undefined;
  return new AutoSearch(f, pins, {
    cost: opts.cost ?? adjacencyCost(f),
    ...(opts.sketch ? { sketch: sketchOf(f, opts.sketch) } : {}),
    seed: opts.seed ?? 1,
    ...(opts.budget?.evaluations !== undefined ? { maxEvaluations: opts.budget.evaluations } : {}),
    ...(start !== undefined && millis !== undefined ? { deadline: start + millis, now: opts.now } : {}),
    ...(opts.onProgress ? { onProgress: opts.onProgress } : {}),
  });
}

/**
 * What a thread needs to run the tasks of the plan `planAuto(f, opts)` made: the pins and the
 * measures, built again from the same machine and options (so a worker needs only those).
 */
export function searchContext(f: FlatMachine, opts: EncodeOptions): TaskContext {
  return {
    n: f.states.length,
    pins: readPins(f, opts.pinned, opts.pinnedAt).pins.codes,
    cost: opts.cost ?? adjacencyCost(f),
    ...(opts.sketch ? { sketch: sketchOf(f, opts.sketch) } : {}),
    ...(opts.now ? { now: opts.now } : {}),
    ...(opts.kept ? { kept: opts.kept } : {}),
  };
}
