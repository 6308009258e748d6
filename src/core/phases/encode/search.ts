/**
 * The automatic search as independent tasks: a plan (AutoSearch) hands out batches of tasks
 * that depend only on the plan, never on each other or on who runs them, and merges their
 * results in task order. The phase runs them one after the other (auto.ts); a shell may run
 * one batch on several threads and gets the same answer for the same seed, whatever the
 * number of threads, because
 * - each task has its own seed, drawn from the search's seed when the plan is made;
 * - each task has its own memo and budget, fixed by the plan;
 * - merging sorts by value and breaks ties by task order, then by the order inside a task.
 *
 * Batches:
 * 1. the named strategies' codes, priced by the full cost, and the screening tasks: either the
 *    classes of assignments in fixed-size slices, or independent annealing runs;
 * 2. (when a sketch screens) the best few screened candidates, priced by the full cost;
 * 3. (when a sketch screens) short annealing runs by the full cost from the best priced codes.
 *
 * A task is plain data (it can be posted to a worker); its result too.
 */
import type { CostFn, Best, Progress } from './cost.js';
import { CostBook } from './cost.js';
import { anneal } from './anneal.js';
import { codeToInt } from './codes.js';
import { seededRandom } from '../../model/random.js';
import type { Sketch } from './sketch.js';

/** What runs a task: the measures, the pins and the clock (only the deadline reads it). */
export interface TaskContext {
  readonly n: number;
  /** Pinned codes by state index. */
  readonly pins: ReadonlyMap<number, string>;
  /** The full cost (the finished build's weighted part count). */
  readonly cost: CostFn;
  /** The screening measure; without it the full cost screens. */
  readonly sketch?: Sketch;
  readonly now?: () => number;
  /**
   * What the full cost kept of pricing these codes, asked right after it priced them and handed
   * back with the price (plain data; the caller's own, e.g. the covers a build can reuse).
   */
  readonly kept?: (codes: readonly string[], bits: number) => unknown;
}

/** Price one assignment by the full cost. */
export interface PriceTask {
  readonly kind: 'price';
  readonly bits: number;
  readonly codes: readonly string[];
  readonly deadline?: number;
}

/** Screen a slice of the listed classes (full assignments as integers). */
export interface ListTask {
  readonly kind: 'list';
  readonly bits: number;
  readonly assignments: readonly (readonly number[])[];
  /** How many of the best to return. */
  readonly keep: number;
  readonly deadline?: number;
}

/** One annealing run over the assignments of one length. */
export interface AnnealTask {
  readonly kind: 'anneal';
  readonly bits: number;
  readonly seed: number;
  readonly evaluations: number;
  readonly start?: readonly number[];
  readonly keep: number;
  readonly deadline?: number;
  /** Anneal by the full cost even when a sketch screens (the search's last, polishing step). */
  readonly full?: boolean;
}

export type SearchTask = PriceTask | ListTask | AnnealTask;

export type TaskResult =
  | { readonly kind: 'price'; readonly cost: number; readonly priced: boolean; readonly kept?: unknown }
  | {
      readonly kind: 'screen';
      readonly evaluations: number;
      /** The best candidates, cheapest first, by the screening measure. */
      readonly best: readonly Best[];
      /** False when the deadline stopped a list before its end. */
      readonly complete: boolean;
    };

/** Told after each evaluation: whether it was by the full cost, and its value. */
export type Tick = (full: boolean, value: number) => void;

/** Run one task. Pure apart from the context's clock; the same task gives the same result. */
export function runTask(ctx: TaskContext, task: SearchTask, tick?: Tick): TaskResult {
  const late = (): boolean => task.deadline !== undefined && ctx.now !== undefined && ctx.now() >= task.deadline;
  if (task.kind === 'price') {
    // A price past the deadline is skipped, unless nothing else could be the answer (the plan decides).
    if (late()) return { kind: 'price', cost: Infinity, priced: false };
    const raw = ctx.cost(task.codes, task.bits);
    const cost = Number.isNaN(raw) ? Infinity : raw;
    const kept = ctx.kept?.(task.codes, task.bits);
    tick?.(true, cost);
    return { kind: 'price', cost, priced: true, ...(kept !== undefined ? { kept } : {}) };
  }
  const sketch = task.kind === 'anneal' && task.full ? undefined : ctx.sketch;
  const full = !sketch;
  const book = new CostBook({
    cost: ctx.cost,
    ...(sketch ? { measure: sketch } : {}),
    pins: ctx.pins,
    maxEvaluations: task.kind === 'list' ? Infinity : task.evaluations,
    ...(task.deadline !== undefined ? { deadline: task.deadline } : {}),
    ...(ctx.now ? { now: ctx.now } : {}),
    keep: task.keep,
    ...(tick ? { onEvaluate: (v: number) => tick(full, v) } : {}),
  });
  let complete = true;
  if (task.kind === 'list') {
    for (const a of task.assignments) {
      if (book.known(a, task.bits) !== undefined) continue;
      if (book.exhausted()) {
        complete = false;
        break;
      }
      book.price(a, task.bits);
    }
  } else {
    const pinned = new Map([...ctx.pins].map(([s, c]) => [s, codeToInt(c)]));
    anneal(
      book,
      { n: ctx.n, bits: task.bits, pinned, restarts: 1, ...(task.start ? { start: task.start } : {}) },
      seededRandom(task.seed),
      ctx.now,
      task.deadline,
    );
  }
  return { kind: 'screen', evaluations: book.evaluations, best: book.top, complete };
}

/** Draw the seeds of `count` independent tasks from the search's seed. */
export function taskSeeds(seed: number, count: number): number[] {
  const rng = seededRandom(seed);
  return Array.from({ length: count }, () => Math.floor(rng.next() * 4294967296));
}

/** Merged screening results: the best distinct candidates over every task, in a fixed order. */
export function mergeScreens(
  results: readonly TaskResult[],
  keyOf: (c: Best) => string,
  exclude: ReadonlySet<string>,
  keep: number,
): Best[] {
  const all: { c: Best; task: number; rank: number }[] = [];
  results.forEach((r, task) => {
    if (r.kind === 'screen') r.best.forEach((c, rank) => all.push({ c, task, rank }));
  });
  all.sort((x, y) => x.c.cost - y.c.cost || x.task - y.task || x.rank - y.rank);
  const seen = new Set(exclude);
  const out: Best[] = [];
  for (const { c } of all) {
    if (out.length >= keep) break;
    const key = keyOf(c);
    if (seen.has(key)) continue;
    seen.add(key);
    out.push(c);
  }
  return out;
}

/** Progress of a search from ticks: evaluations of either measure done, the planned total, the best full cost. */
export class ProgressCounter {
  done = 0;
  best = Infinity;

  constructor(
    public total: number | null,
    private readonly report?: (p: Progress) => void,
  ) {}

  readonly tick: Tick = (full, value) => this.add(1, full ? value : Infinity);

  /** Several evaluations at once (from another thread), with the best full cost among them. */
  add(count: number, best: number): void {
    this.done += count;
    if (best < this.best) this.best = best;
    this.report?.({ done: this.done, total: this.total, best: this.best });
  }
}
