/**
 * The encoding search of a large build on worker threads (node:worker_threads), so it uses
 * every core (a smaller one runs here: THREADS_FROM_STATES says why). The core plans the search as batches of independent tasks and merges their
 * results in task order (src/core/search.ts, src/core/phases/encode/search.ts); here each
 * batch is handed out to a pool of workers (search-worker.ts), one task at a time to whichever
 * is free. The answer is the one the core's own search gives for the same seed, whatever the
 * number of threads; with none (or when a worker cannot start) the tasks run on this thread.
 *
 * Under the TypeScript sources (tests, `tsx`) the worker is the .ts file, loaded through tsx's
 * loader. A worker that fails hands its batch back to this thread, which finishes the search.
 */
import { Worker } from 'node:worker_threads';
import {
  planBuildSearch,
  searchOutcome,
  searchTaskRunner,
  type Analysed,
  type BuildOptions,
  type EncodeResult,
  type Progress,
  type SearchSetup,
  type SearchTask,
  type TaskResult,
} from '../core/index.js';

/** What the pool sends a worker. */
export interface ToSearchWorker {
  readonly id: number;
  readonly task: SearchTask;
}

/** What a worker sends back. */
export type FromSearchWorker =
  | { readonly kind: 'tick'; readonly id: number; readonly count: number; readonly best: number }
  | { readonly kind: 'done'; readonly id: number; readonly result: TaskResult }
  | { readonly kind: 'failed'; readonly id: number; readonly message: string };

/**
 * Below this many states (after state minimisation) the search runs on this thread alone. A
 * worker takes about half a second to start and build its search context, and the search's
 * batches are few and uneven, so on two cores the pool paid off on only one machine of those
 * measured (median of 3–5 interleaved runs of the search alone, compiled CLI, 2 cores, one
 * thread against two workers): bbara (7 states) 0.23 s against 0.78 s, ex4 (14) 0.92 s against
 * 1.67 s, tbk (16) 1.12 s against 1.90 s, s1488 (48) 2.04 s against 2.66 s, scf (94) 3.77 s
 * against 4.07 s, random machines of 64, 96 and 128 states (src/core/sim/random-machine.ts,
 * 4 inputs, seed 1) 1.72 / 2.76 / 1.91 s against 2.57 / 3.14 / 2.56 s — and s298 (135)
 * 5.77 s against 5.07 s.
 */
export const THREADS_FROM_STATES = 130;

/**
 * The outcome of the build's automatic search, run on up to `threads` worker threads when the
 * machine has at least `fromStates` states (else here); undefined when the build does not search (another encoding, or options the build itself will reject),
 * so the caller builds as usual.
 */
export async function searchOnThreads(
  a: Analysed,
  opts: BuildOptions,
  threads: number,
  onProgress?: (p: Progress) => void,
  fromStates = THREADS_FROM_STATES,
): Promise<EncodeResult | undefined> {
  const planned = planBuildSearch(a, opts, onProgress);
  if (!planned) return undefined;
  const { setup, plan, diagnostics } = planned;
  const pool = threads >= 2 && setup.machine.states.length >= fromStates ? startPool(setup, threads) : [];
  const local = searchTaskRunner(setup);
  try {
    for (let batch = plan.next(); batch.length > 0; batch = plan.next()) {
      let results: TaskResult[] | undefined;
      if (pool.length > 0)
        results = await runBatch(pool, batch, (count, best) => plan.progress.add(count, best)).catch(() => undefined);
      // A worker that failed (it could not start, or it broke) leaves the batch to this thread: same answer.
      if (!results) {
        await Promise.all(pool.splice(0).map((w) => w.terminate()));
        results = batch.map((t) => local(t, plan.progress.tick));
      }
      plan.accept(results);
    }
  } finally {
    await Promise.all(pool.map((w) => w.terminate()));
  }
  return searchOutcome(plan, diagnostics);
}

/** Start the workers; none when the worker file cannot be started here. */
function startPool(setup: SearchSetup, threads: number): Worker[] {
  const here = import.meta.url;
  const typescript = here.endsWith('.ts');
  const file = new URL(typescript ? './search-worker.ts' : './search-worker.js', here);
  // Under the TypeScript sources the worker registers tsx's loader before it loads the .ts file.
  const boot = `import('tsx/esm/api').then((t) => { t.register(); return import(${JSON.stringify(file.href)}); });`;
  const pool: Worker[] = [];
  try {
    for (let i = 0; i < threads; i++)
      pool.push(
        typescript ? new Worker(boot, { eval: true, workerData: setup }) : new Worker(file, { workerData: setup }),
      );
  } catch {
    for (const w of pool) void w.terminate();
    return [];
  }
  return pool;
}

/** Run a batch on the pool: each worker takes the next task when it finishes one; results in task order. */
function runBatch(
  pool: readonly Worker[],
  batch: readonly SearchTask[],
  tick: (count: number, best: number) => void,
): Promise<TaskResult[]> {
  return new Promise((resolve, reject) => {
    const results = new Array<TaskResult>(batch.length);
    let next = 0;
    let left = batch.length;
    const give = (w: Worker): void => {
      if (next < batch.length) {
        const id = next++;
        w.postMessage({ id, task: batch[id] } satisfies ToSearchWorker);
      }
    };
    const listeners = pool.map((w) => {
      const onMessage = (m: FromSearchWorker): void => {
        if (m.kind === 'tick') {
          tick(m.count, m.best);
          return;
        }
        if (m.kind === 'failed') {
          reject(new Error(`search worker: ${m.message}`));
          return;
        }
        results[m.id] = m.result;
        if (--left === 0) {
          detach();
          resolve(results);
        } else give(w);
      };
      const onError = (e: Error): void => reject(e);
      w.on('message', onMessage);
      w.on('error', onError);
      return { w, onMessage, onError };
    });
    const detach = (): void => {
      for (const l of listeners) {
        l.w.off('message', l.onMessage);
        l.w.off('error', l.onError);
      }
    };
    for (const w of pool) give(w);
  });
}
