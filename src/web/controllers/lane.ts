/**
 * One synthesis worker and the job it is on. A lane can be restarted — its worker terminated
 * and a fresh one started on the next job — which is how work that has gone stale is cancelled
 * (a worker cannot be interrupted in the middle of a computation).
 */
import type { FromWorker, ToWorker } from '../worker/protocol.js';

const makeWorker = (): Worker => new Worker(new URL('../worker.ts', import.meta.url), { type: 'module' });

export class Lane {
  private worker: Worker | undefined;
  /** The newest job sent and when; cleared when an answer for it (or a newer one) arrives. */
  private busy: { rev: number; since: number } | undefined;
  /** When the worker last said anything (progress and drafts included). */
  private heard = 0;

  constructor(private readonly answer: (m: FromWorker) => void) {}

  /** Start the worker now, so its code is loaded before the first job. */
  warm(): void {
    this.ensure();
  }

  send(m: ToWorker): void {
    this.ensure().postMessage(m);
    if (m.kind !== 'export' && m.kind !== 'walk') this.busy = { rev: m.rev, since: performance.now() };
  }

  /**
   * How long the lane has been busy on a job older than `rev` without a word from its worker (0
   * when it is not): a worker that reports progress is between tasks, where it gives stale work
   * up by itself.
   */
  staleFor(rev: number): number {
    return this.busy && this.busy.rev < rev ? performance.now() - Math.max(this.busy.since, this.heard) : 0;
  }

  get idle(): boolean {
    return this.busy === undefined;
  }

  restart(): void {
    this.worker?.terminate();
    this.worker = undefined;
    this.busy = undefined;
  }

  private ensure(): Worker {
    if (this.worker) return this.worker;
    const w = makeWorker();
    w.onmessage = (e: MessageEvent<FromWorker>) => {
      const m = e.data;
      this.heard = performance.now();
      // A draft is followed by its final build: the job is not done yet.
      if (
        this.busy &&
        m.kind !== 'progress' &&
        m.kind !== 'exported' &&
        m.kind !== 'walked' &&
        m.kind !== 'draft' &&
        m.rev >= this.busy.rev
      )
        this.busy = undefined;
      this.answer(m);
    };
    w.onerror = (e) => {
      e.preventDefault();
      const rev = this.busy?.rev ?? 0;
      this.restart();
      this.answer({ kind: 'fault', rev, message: e.message || 'a synthesis worker stopped' });
    };
    this.worker = w;
    return w;
  }
}
