/**
 * The shakedown: a person at the frame walks the commissioning sheet of the checked build row
 * by row, says for each row whether every ticked value stood as the sheet or which stood the
 * other way, and is shown the cords that explain everything seen so far. This controller holds
 * the walk (the sheet, the steps ticked, the values seen differ, the values marked on the row
 * in hand) and keeps it in the browser's storage for this machine and this sheet (entry
 * `shakedown`), so the tablet can be put down; the narrowing itself runs in the checker worker
 * (worker/walk.ts), where the build is.
 */
import type { ReactiveController, ReactiveControllerHost } from 'lit';
import type { Narrowed, StepSight } from '../../core/index.js';
import type { WalkSheet } from '../worker/protocol.js';
import { keepRead, keepSet, parseJson } from './keep.js';
import type { SynthesisController } from './synthesis.js';

/** A walk kept in storage: for one machine's sheet (its digest), the steps ticked and the values seen differ. */
export interface KeptWalk {
  readonly machine: string;
  readonly print: string;
  readonly reached: number;
  readonly sights: readonly StepSight[];
}

/** Walks kept, newest first, at most this many (one per machine). */
export const KEPT_WALKS = 8;

const isSight = (v: unknown): v is StepSight => {
  const s = v as StepSight;
  return (
    typeof v === 'object' &&
    v !== null &&
    Number.isInteger(s.step) &&
    s.step >= 1 &&
    Number.isInteger(s.at) &&
    s.at >= 0 &&
    (s.value === 0 || s.value === 1)
  );
};

/** The kept walks from storage, or undefined when the entry is not a list of walks. */
export function parseWalks(raw: string): KeptWalk[] | undefined {
  const v = parseJson(raw);
  if (!Array.isArray(v)) return undefined;
  const ok = v.every((w: unknown) => {
    const k = w as KeptWalk;
    return (
      typeof w === 'object' &&
      w !== null &&
      typeof k.machine === 'string' &&
      typeof k.print === 'string' &&
      Number.isInteger(k.reached) &&
      k.reached >= 0 &&
      Array.isArray(k.sights) &&
      k.sights.every(isSight)
    );
  });
  return ok ? (v as KeptWalk[]) : undefined;
}

/** The walks with `w` kept (replacing the same machine's), newest first, at most KEPT_WALKS. */
export function withWalk(walks: readonly KeptWalk[], w: KeptWalk): KeptWalk[] {
  return [w, ...walks.filter((x) => x.machine !== w.machine)].slice(0, KEPT_WALKS);
}

/** The walks kept, read once when the page starts (a value that does not read is set aside then, with the page's notice). */
let kept: readonly KeptWalk[] = keepRead('shakedown', parseWalks) ?? [];

export class ShakedownController implements ReactiveController {
  /** The sheet of the build walked (undefined until the checker has made it). */
  sheet: WalkSheet | undefined;
  /** Steps ticked: 1 … reached; the row in hand is step reached + 1. */
  reached = 0;
  sights: readonly StepSight[] = [];
  /** Columns marked seen the other way on the row in hand. */
  marked: ReadonlySet<number> = new Set();
  narrowed: Narrowed | undefined;
  /** The checker is working on the latest question. */
  busy = false;
  problem: string | undefined;
  /** The build revision the sheet is of. */
  private rev: number | undefined;
  private asked = 0;

  constructor(
    private readonly host: ReactiveControllerHost,
    private readonly synth: SynthesisController,
  ) {
    host.addController(this);
  }

  hostConnected(): void {}

  /** Follow the checked build: a new one (or the first) brings its sheet and the walk kept for it. */
  follow(): void {
    const rev = this.synth.walkable;
    if (rev === undefined || rev === this.rev) return;
    this.rev = rev;
    this.sheet = undefined;
    this.narrowed = undefined;
    this.problem = undefined;
    const asked = ++this.asked;
    this.busy = true;
    this.synth.walk(0, [], true).then(
      (w) => {
        if (asked !== this.asked || !w.sheet) return;
        this.sheet = w.sheet;
        const mine = kept.find((k) => k.machine === w.sheet?.machine && k.print === w.sheet.print);
        this.reached = Math.min(mine?.reached ?? 0, w.sheet.rows.length);
        this.sights = mine?.sights.filter((s) => s.step <= this.reached) ?? [];
        this.marked = new Set();
        this.ask();
      },
      (e: unknown) => this.failed(asked, e),
    );
    this.host.requestUpdate();
  }

  /** Mark (or unmark) a column of the row in hand as seen the other way. */
  mark(at: number): void {
    const m = new Set(this.marked);
    if (!m.delete(at)) m.add(at);
    this.marked = m;
    this.host.requestUpdate();
  }

  /** The row in hand is ticked: as the sheet, or with the columns marked seen the other way. */
  next(): void {
    const sheet = this.sheet;
    if (!sheet || this.reached >= sheet.rows.length) return;
    const row = sheet.rows[this.reached];
    const seen = [...this.marked]
      .filter((at) => row.values[at] !== 2)
      .sort((a, b) => a - b)
      .map((at): StepSight => ({ step: row.step, at, value: row.values[at] === 1 ? 0 : 1 }));
    this.sights = [...this.sights, ...seen];
    this.reached++;
    this.marked = new Set();
    this.changed();
  }

  /** Take the last row ticked back into hand, with what was marked on it. */
  back(): void {
    if (this.reached === 0) return;
    const step = this.reached;
    this.marked = new Set(this.sights.filter((s) => s.step === step).map((s) => s.at));
    this.sights = this.sights.filter((s) => s.step !== step);
    this.reached--;
    this.changed();
  }

  /** Start the walk again from the first step (and forget the one kept). */
  restart(): void {
    this.reached = 0;
    this.sights = [];
    this.marked = new Set();
    this.changed();
  }

  private changed(): void {
    const sheet = this.sheet;
    if (sheet) {
      kept =
        this.reached === 0 && this.sights.length === 0
          ? kept.filter((k) => k.machine !== sheet.machine)
          : withWalk(kept, { machine: sheet.machine, print: sheet.print, reached: this.reached, sights: this.sights });
      keepSet('shakedown', JSON.stringify(kept));
    }
    this.ask();
  }

  private ask(): void {
    const mine = ++this.asked;
    this.busy = true;
    this.host.requestUpdate();
    this.synth.walk(this.reached, this.sights, false).then(
      (w) => {
        if (mine !== this.asked) return;
        this.narrowed = w.narrowed;
        this.busy = false;
        this.problem = undefined;
        this.host.requestUpdate();
      },
      (e: unknown) => this.failed(mine, e),
    );
  }

  private failed(mine: number, e: unknown): void {
    if (mine !== this.asked) return;
    this.busy = false;
    this.problem = e instanceof Error ? e.message : String(e);
    this.host.requestUpdate();
  }

  /** Ask again after a failure (the view's Try again): the sheet, then the walk kept for it. */
  retry(): void {
    this.rev = undefined;
    this.follow();
  }
}
