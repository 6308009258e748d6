/**
 * Synthesis off the page's thread. Two workers: the live one reads, builds and checks every
 * revision of the text (the diagram follows within a keystroke, the build and checks as soon
 * as they are done); the search one prices every encoding, which can take seconds, shows its
 * progress, and is cancelled by terminating it. A live worker still busy building or checking
 * a revision the page has moved past is replaced, so typing never waits for stale work.
 */
import type { ReactiveController, ReactiveControllerHost } from 'lit';
import type { Diagnostic } from '../../core/model/diagnostics.js';
import type { BuildSettings, BuildView, ChecksView, CodeRow, EncodingChoice, ExportFile, FromWorker, Reading, ToWorker } from '../worker/protocol.js';
import { keepGet, keepSet } from './keep.js';

/** Where the live work stands. */
export const Work = { idle: 'idle', reading: 'reading', building: 'building', checking: 'checking', done: 'done', refused: 'refused', failed: 'failed' } as const;
export type Work = (typeof Work)[keyof typeof Work];

/** Where the encoding comparison stands. */
export const Search = { none: 'none', running: 'running', done: 'done', cancelled: 'cancelled', failed: 'failed' } as const;
export type Search = (typeof Search)[keyof typeof Search];

export interface SearchProgress {
  readonly done: number;
  readonly total: number | null;
  readonly best: number;
}

/** Replace a live worker busy on a stale revision for longer than this. */
const STALE_MS = 60;

const makeWorker = (): Worker => new Worker(new URL('../worker.ts', import.meta.url), { type: 'module' });

export class SynthesisController implements ReactiveController {
  work: Work = Work.idle;
  search: Search = Search.none;
  reading: Reading | undefined;
  /** The last reading without errors (views keep showing it while the text has errors). */
  good: Reading | undefined;
  built: BuildView | undefined;
  checks: ChecksView | undefined;
  buildProblems: readonly Diagnostic[] = [];
  fault: string | undefined;
  progress: SearchProgress | undefined;
  rows: readonly CodeRow[] = [];
  /** The build's schematic (SVG text), or why there is none. */
  schematic: { readonly svg?: string; readonly problem?: string } | undefined;
  /** Revision of each result shown (the page marks stale views). */
  readonly shown = { reading: -1, built: -1, checks: -1, rows: -1, schematic: -1 };
  settings: BuildSettings;

  private live: Worker | undefined;
  private searcher: Worker | undefined;
  /** Job number of the latest text (answers for older jobs are dropped). */
  private rev = 0;
  private text = '';
  private file = '';
  private stageSince = 0;
  private readonly exports = new Map<string, (f: ExportFile | string) => void>();

  constructor(
    private readonly host: ReactiveControllerHost,
    /** Told of every new build (the stepper follows it). */
    private readonly onBuilt: (view: BuildView) => void = () => undefined,
  ) {
    host.addController(this);
    const kept = keepGet('encoding');
    this.settings = { encoding: kept ? (JSON.parse(kept) as EncodingChoice) : { strategy: 'binary' }, seed: 1, unusedCodes: 'dont-care' };
  }

  hostConnected(): void {
    this.live ??= this.spawnLive();
  }

  hostDisconnected(): void {
    this.live?.terminate();
    this.searcher?.terminate();
    this.live = this.searcher = undefined;
  }

  /** The job number of the latest text. */
  get job(): number {
    return this.rev;
  }

  /** True when every view shows the latest text. */
  get current(): boolean {
    return this.shown.reading === this.rev && (this.work === Work.done || this.work === Work.refused || this.work === Work.failed);
  }

  /** A new revision of the text. */
  submit(text: string, file: string): void {
    this.text = text;
    this.file = file;
    const rev = ++this.rev;
    const busyStale = (this.work === Work.building || this.work === Work.checking) && performance.now() - this.stageSince > STALE_MS;
    if (busyStale || !this.live) {
      this.live?.terminate();
      this.live = this.spawnLive();
    }
    this.stage(Work.reading);
    this.send(this.live, { kind: 'work', rev, text, file, settings: this.settings });
    if (this.search === Search.running) this.cancelSearch();
  }

  /** Build with other codes. */
  choose(choice: EncodingChoice): void {
    this.settings = { ...this.settings, encoding: choice };
    keepSet('encoding', JSON.stringify(choice));
    this.submit(this.text, this.file);
  }

  /** Price every encoding of the current revision. */
  compare(): void {
    this.searcher?.terminate();
    this.searcher = this.spawn((m) => this.fromSearch(m));
    this.search = Search.running;
    this.progress = undefined;
    this.send(this.searcher, { kind: 'compare', rev: this.rev, text: this.text, file: this.file, settings: this.settings });
    this.host.requestUpdate();
  }

  cancelSearch(): void {
    this.searcher?.terminate();
    this.searcher = undefined;
    this.search = Search.cancelled;
    this.host.requestUpdate();
  }

  /** One build document of the current, checked build. */
  exportDoc(doc: string): Promise<ExportFile> {
    return new Promise((resolve, reject) => {
      if (!this.live || this.work !== Work.done) {
        reject(new Error('the build and its checks are not finished yet'));
        return;
      }
      this.exports.set(`${this.rev}:${doc}`, (f) => (typeof f === 'string' ? reject(new Error(f)) : resolve(f)));
      this.send(this.live, { kind: 'export', rev: this.rev, doc });
    });
  }

  private spawnLive(): Worker {
    return this.spawn((m) => this.fromLive(m));
  }

  private spawn(on: (m: FromWorker) => void): Worker {
    const w = makeWorker();
    w.onmessage = (e: MessageEvent<FromWorker>) => on(e.data);
    w.onerror = (e) => {
      e.preventDefault();
      on({ kind: 'fault', rev: this.rev, message: e.message || 'the synthesis worker stopped' });
    };
    return w;
  }

  private send(w: Worker, m: ToWorker): void {
    w.postMessage(m);
  }

  private stage(w: Work): void {
    this.work = w;
    this.stageSince = performance.now();
  }

  private fromLive(m: FromWorker): void {
    if (m.kind === 'exported') {
      const key = `${m.rev}:${m.doc}`;
      this.exports.get(key)?.(m.file ?? m.problem ?? 'no document');
      this.exports.delete(key);
      return;
    }
    if (m.rev !== this.rev) return;
    switch (m.kind) {
      case 'reading':
        this.reading = m.reading;
        if (m.reading.ok) this.good = m.reading;
        this.shown.reading = m.rev;
        this.buildProblems = [];
        this.fault = undefined;
        this.stage(m.reading.ok ? Work.building : Work.refused);
        break;
      case 'built':
        this.built = m.view;
        this.shown.built = m.rev;
        this.onBuilt(m.view);
        this.stage(Work.checking);
        break;
      case 'unbuilt':
        this.buildProblems = m.diagnostics;
        this.stage(Work.refused);
        break;
      case 'checked':
        this.checks = m.view;
        this.shown.checks = m.rev;
        this.stage(Work.done);
        break;
      case 'schematic':
        this.schematic = m.svg !== undefined ? { svg: m.svg } : { problem: m.problem ?? 'no schematic' };
        this.shown.schematic = m.rev;
        break;
      case 'fault':
        this.fault = m.message;
        this.stage(Work.failed);
        break;
      default:
        return;
    }
    this.host.requestUpdate();
  }

  private fromSearch(m: FromWorker): void {
    if (m.rev !== this.rev) return;
    if (m.kind === 'progress') this.progress = { done: m.done, total: m.total, best: m.best };
    else if (m.kind === 'compared') {
      this.rows = m.rows;
      this.shown.rows = m.rev;
      this.search = Search.done;
    } else if (m.kind === 'fault') {
      this.fault = m.message;
      this.search = Search.failed;
    }
    this.host.requestUpdate();
  }
}
