/**
 * The encoding search of a build on two cores, from inside the builder worker: the core plans
 * the search as batches of independent tasks (src/core/search.ts); the builder runs tasks
 * itself and hands others to a helper worker (../search-worker.ts), one at a time, and merges
 * the results in task order — the same answer as the core's own search for the same seed.
 * Progress is reported as the tasks finish. Without Worker support it all runs here. The
 * outcome carries what the search kept of pricing the chosen codes (`EncodeResult.kept`), so the
 * builder's final build does not minimise those functions again; what the page keeps leaves it
 * out (jobs.ts `toRemember`).
 */
import {
  planBuildSearch,
  searchOutcome,
  searchTaskRunner,
  type Analysed,
  type BuildOptions,
  type EncodeResult,
  type Progress,
  type SearchTask,
  type TaskResult,
} from '../../core/index.js';
import type { FromSearchHelper, ToSearchHelper } from '../search-worker.js';

let helper: Worker | undefined;
let builds = 0;

function startHelper(): Worker | undefined {
  if (helper) return helper;
  if (typeof Worker === 'undefined') return undefined;
  try {
    helper = new Worker(new URL('../search-worker.ts', import.meta.url), { type: 'module' });
  } catch {
    helper = undefined;
  }
  return helper;
}

const turn = (): Promise<void> => new Promise((r) => setTimeout(r, 0));

/**
 * The build's automatic search on this worker and the helper; undefined when the build does
 * not search, or when `stale()` says a newer job replaced it (checked between tasks).
 */
export async function searchOnTwoCores(
  a: Analysed,
  opts: BuildOptions,
  onProgress?: (p: Progress) => void,
  stale: () => boolean = () => false,
): Promise<EncodeResult | undefined> {
  const planned = planBuildSearch(a, opts, onProgress);
  if (!planned) return undefined;
  const { setup, plan, diagnostics } = planned;
  const local = searchTaskRunner(setup);
  const h = startHelper();
  const build = ++builds;
  h?.postMessage({ kind: 'setup', build, setup } satisfies ToSearchHelper);
  for (let batch = plan.next(); batch.length > 0; batch = plan.next()) {
    const results = h
      ? await runBatch(h, build, batch, local, plan.progress, stale)
      : batch.map((t) => local(t, plan.progress.tick));
    if (!results || stale()) return undefined;
    plan.accept(results);
  }
  return searchOutcome(plan, diagnostics);
}

/** One batch: the helper takes the next task whenever it is free, this worker the rest. */
async function runBatch(
  h: Worker,
  build: number,
  batch: readonly SearchTask[],
  local: (t: SearchTask, tick: (full: boolean, value: number) => void) => TaskResult,
  progress: { add(count: number, best: number): void; tick: (full: boolean, value: number) => void },
  stale: () => boolean,
): Promise<TaskResult[] | undefined> {
  const results = new Array<TaskResult | undefined>(batch.length);
  let next = 0;
  let helperBusy = false;
  let failure: string | undefined;
  const give = (): void => {
    if (next >= batch.length) return;
    const id = next++;
    helperBusy = true;
    h.postMessage({ kind: 'task', build, id, task: batch[id] } satisfies ToSearchHelper);
  };
  const onMessage = (e: MessageEvent<FromSearchHelper>): void => {
    const m = e.data;
    if (m.build !== build) return;
    helperBusy = false;
    progress.add(m.count, m.best);
    if (m.result) results[m.id] = m.result;
    else failure = m.problem ?? 'the search helper failed';
    give();
  };
  h.addEventListener('message', onMessage);
  try {
    give();
    while (next < batch.length) {
      const id = next++;
      results[id] = local(batch[id], progress.tick);
      await turn(); // let the helper's answers (and newer jobs) in
      if (stale()) return undefined;
    }
    while (helperBusy && failure === undefined) {
      await turn();
      if (stale()) return undefined; // the helper's task may have been dropped for a newer setup
    }
  } finally {
    h.removeEventListener('message', onMessage);
  }
  if (failure !== undefined) throw new Error(failure);
  return results as TaskResult[];
}
