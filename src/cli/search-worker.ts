/**
 * A worker thread of the encoding search (search-pool.ts starts it): given the build's search
 * setup once, it runs the search tasks it is sent and posts back each result, and now and
 * then how far it got. It holds no state between tasks but the costs built from the setup.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { searchTaskRunner, type SearchSetup } from '../core/index.js';
import type { FromSearchWorker, ToSearchWorker } from './search-pool.js';

/** Evaluations are reported at most this often (milliseconds). */
const TICK_EVERY = 100;

const port = parentPort;
if (port) {
  const run = searchTaskRunner(workerData as SearchSetup, Date.now);
  const post = (m: FromSearchWorker): void => port.postMessage(m);
  port.on('message', (m: ToSearchWorker) => {
    let count = 0;
    let best = Infinity;
    let last = Date.now();
    const flush = (): void => {
      if (count > 0) post({ kind: 'tick', id: m.id, count, best });
      count = 0;
      best = Infinity;
      last = Date.now();
    };
    try {
      const result = run(m.task, (full, value) => {
        count++;
        if (full && value < best) best = value;
        if (Date.now() - last >= TICK_EVERY) flush();
      });
      flush();
      post({ kind: 'done', id: m.id, result });
    } catch (e) {
      post({ kind: 'failed', id: m.id, message: e instanceof Error ? e.message : String(e) });
    }
  });
}
