/**
 * The designer's search helper: a second worker the builder worker starts (worker/search.ts)
 * so the encoding search uses two cores. Given the build's search setup, it runs the search
 * tasks it is sent and posts each result back; it keeps nothing between builds but the costs
 * of the current setup.
 */
import { searchTaskRunner, type SearchSetup, type SearchTask, type TaskResult } from '../core/index.js';

/** What the builder sends: a setup (once per build), or a task of that build. */
export type ToSearchHelper =
  | { readonly kind: 'setup'; readonly build: number; readonly setup: SearchSetup }
  | { readonly kind: 'task'; readonly build: number; readonly id: number; readonly task: SearchTask };

/** What the helper sends back: a task's result with how many evaluations it made and its best full price. */
export interface FromSearchHelper {
  readonly build: number;
  readonly id: number;
  readonly result?: TaskResult;
  readonly problem?: string;
  readonly count: number;
  readonly best: number;
}

const scope = self as unknown as {
  postMessage(m: FromSearchHelper): void;
  onmessage: ((e: MessageEvent<ToSearchHelper>) => void) | null;
};

let current: { build: number; run: ReturnType<typeof searchTaskRunner> } | undefined;

scope.onmessage = (e) => {
  const m = e.data;
  if (m.kind === 'setup') {
    current = { build: m.build, run: searchTaskRunner(m.setup) };
    return;
  }
  if (!current || current.build !== m.build) return; // a task of a build that was replaced
  let count = 0;
  let best = Infinity;
  try {
    const result = current.run(m.task, (full, value) => {
      count++;
      if (full && value < best) best = value;
    });
    scope.postMessage({ build: m.build, id: m.id, result, count, best });
  } catch (err) {
    scope.postMessage({
      build: m.build,
      id: m.id,
      problem: err instanceof Error ? err.message : String(err),
      count,
      best,
    });
  }
};
