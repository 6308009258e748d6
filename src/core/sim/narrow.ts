/**
 * Narrowing the suspect cords from everything a person saw on the commissioning sheet so far.
 *
 * Method: effect–cause diagnosis by fault simulation with the full response (M. Abramovici,
 * M. A. Breuer & A. D. Friedman, *Digital Systems Testing and Testable Design*, 1990, ch. 12 —
 * from memory): every cord fault of the list (faults.ts, collapsed, the sheet's own sample) is
 * stepped through the sheet's hand actions (sheet.ts, the one list every part of the sheet
 * steps), and a fault stays a suspect while its faulty machine's look (fault-run.ts `lookAt`:
 * each latch's two Z levers, each output) agrees at every observed row with what was seen there:
 * the fault-free look where the person saw nothing differ, the values they marked where they
 * did. A faulty X (a lever that could come to rest either way) agrees with anything, and so does
 * a value the fault-free machine leaves X (the sheet shows '?'). A suspect that fits a value
 * seen differ only by leaving it X (a broken reset cord leaves every latch undetermined, and so
 * fits anything) is counted as fitting loosely (`looseness`), for the words to put it last.
 *
 * Incremental: each suspect keeps its machine at the last row observed, so one more row costs
 * one row per suspect, and a fault that disagrees is dropped for good (fault dropping, the same
 * book, ch. 5). Observations that change a row already walked start the walk again.
 *
 * Telling suspects apart: from the row reached, copies of the suspects' machines run on through
 * the rest of the sheet (the machine as it is: nothing reset), and a row whose looks differ
 * between suspects is proposed, with each outcome and the suspects it would leave (an adaptive
 * diagnostic experiment in the sense of the same chapter). Bounded by SPLIT_WORK fault-rows.
 * Preconditions: `steps` are the sheet's rows from power-up; observations name look positions
 * in `lookAt` order. Pure: no clock, no randomness.
 */
import { X, type PartSim } from './compile.js';
import { lookWidth, Stepped } from './fault-run.js';
import { faultInjector, type CordFault } from './faults.js';
import type { SheetStep } from './sheet.js';

/** A value seen differ at a row: its look position (`lookAt` order) and the position seen (1: a gate's Z down, an output showing 1). */
export interface SeenValue {
  readonly at: number;
  readonly value: 0 | 1;
}

/**
 * The rows walked: rows 0 … reached−1; `seen` lists, per row, what differed there. Rows before
 * `ticked` (default: every row walked), and every row with something listed, were ticked value by
 * value: what is not listed stood as the sheet. A row from `ticked` on with nothing listed is
 * unknown (a person who went on after a difference and named only some rows). With `onlyNamed`,
 * a row from `ticked` on tells only the values listed (the person named what they noticed).
 */
export interface Walked {
  readonly reached: number;
  readonly seen: ReadonlyMap<number, readonly SeenValue[]>;
  readonly ticked?: number;
  readonly onlyNamed?: boolean;
}

/** One outcome a row could show: the look (with X where a suspect leaves a lever undetermined) and the suspects it leaves. */
export interface RowOutcome {
  /** Per look position: 0, 1 or X (a lever that may come to rest either way). */
  readonly look: Uint8Array;
  /** The look is the fault-free one (the sheet's) wherever the sheet gives a position. */
  readonly asSheet: boolean;
  /** Indices into the suspects, of those this outcome would leave. */
  readonly leaves: readonly number[];
}

/** A row ahead that tells the suspects apart. */
export interface SplitRow {
  readonly row: number;
  readonly outcomes: readonly RowOutcome[];
}

/** Fault-rows the look-ahead for telling suspects apart may simulate. */
export const SPLIT_WORK = 8_000;

/** Rows ahead that tell the suspects apart, and the groups of suspects no row ahead does (`ended`: the look-ahead reached the sheet's end). */
export interface Ahead {
  readonly rows: readonly SplitRow[];
  readonly alike: readonly (readonly number[])[];
  readonly ended: boolean;
}

interface Suspect {
  readonly fault: CordFault;
  readonly bad: Stepped;
  /** Values the person saw differ that this fault leaves undetermined (X): it fits them only loosely. */
  loose: number;
}

/** A walk along the sheet with its suspects (see the module comment). */
export class SuspectWalk {
  /** The fault-free look after every row. */
  readonly good: readonly Uint8Array[];
  private readonly width: number;
  private live: Suspect[] = [];
  private reached = 0;
  private applied = new Map<number, string>();
  private differed = -1;
  /** The last look-ahead: from which row, for which suspects (their keys), and what it found. */
  private lastAhead:
    { readonly from: number; readonly keys: string; readonly most: number; readonly found: Ahead } | undefined;
  /** The suspects just before the last row that left none, and that row. */
  private lastFit: { readonly row: number; readonly faults: readonly CordFault[] } | undefined;

  constructor(
    readonly sim: PartSim,
    private readonly stageDelayS: number,
    readonly faults: readonly CordFault[],
    readonly steps: readonly SheetStep[],
  ) {
    this.width = lookWidth(sim);
    const g = new Stepped(sim);
    this.good = steps.map((st) => {
      g.run(st.actions);
      return g.look(new Uint8Array(this.width));
    });
    this.restart();
  }

  private restart(): void {
    const inj = faultInjector(this.sim, this.stageDelayS);
    this.live = this.faults.map((fault) => ({ fault, bad: new Stepped(inj.inject(fault)), loose: 0 }));
    this.reached = 0;
    this.applied = new Map();
    this.differed = -1;
    this.lastFit = undefined;
  }

  /** Walk to `w` (from where the walk stands when it only goes on; from power-up otherwise). */
  walk(w: Walked): this {
    const reached = Math.max(0, Math.min(w.reached, this.steps.length));
    const ticked = w.ticked ?? reached;
    const whole = (row: number): boolean => row < ticked || (w.seen.has(row) && w.onlyNamed !== true);
    const keyOf = (row: number): string => (whole(row) ? '' : '?') + seenKey(w.seen.get(row));
    let again = reached < this.reached;
    for (let r = 0; r < this.reached && !again; r++) if ((this.applied.get(r) ?? '') !== keyOf(r)) again = true;
    if (again) this.restart();
    const look = new Uint8Array(this.width);
    for (let r = this.reached; r < reached; r++) {
      const seen = w.seen.get(r) ?? [];
      const expected = this.expected(r, seen, whole(r));
      if (seen.length > 0 && this.differed < 0) this.differed = r;
      const before = this.live;
      this.live = before.filter((s) => {
        s.bad.run(this.steps[r].actions);
        if (!agrees(expected, s.bad.look(look))) return false;
        for (const v of seen) if (look[v.at] === X && this.good[r][v.at] !== X) s.loose++;
        return true;
      });
      if (this.live.length === 0 && before.length > 0) this.lastFit = { row: r, faults: before.map((s) => s.fault) };
      const k = keyOf(r);
      if (k !== '') this.applied.set(r, k);
    }
    this.reached = reached;
    return this;
  }

  /** What the person saw at row `r`: the sheet's look with what they said differed (nothing known of a row not ticked). */
  private expected(r: number, seen: readonly SeenValue[], whole: boolean): Uint8Array {
    const e = whole ? this.good[r].slice() : new Uint8Array(this.width).fill(X);
    for (const s of seen) if (s.at >= 0 && s.at < e.length) e[s.at] = s.value;
    return e;
  }

  /** Rows observed. */
  get rows(): number {
    return this.reached;
  }

  /** The first row where something was seen differ, or -1. */
  get firstDifference(): number {
    return this.differed;
  }

  /** The faults consistent with every observation, in list order. */
  suspects(): readonly CordFault[] {
    return this.live.map((s) => s.fault);
  }

  /** Per suspect (in `suspects()` order): how many values seen differ it fits only by leaving them undetermined. */
  looseness(): readonly number[] {
    return this.live.map((s) => s.loose);
  }

  /** When no suspect is left: the last row that left none, and the suspects that fitted every row before it. */
  beforeNone(): { readonly row: number; readonly faults: readonly CordFault[] } | undefined {
    return this.live.length === 0 ? this.lastFit : undefined;
  }

  /**
   * Up to `most` rows ahead, in sheet order, that tell the suspects apart (each outcome with the
   * suspects it leaves), and whether some suspects look alike to the end of the rows looked at
   * (`alike`: groups of suspect indices no row ahead tells apart, when the look-ahead reached
   * the sheet's end).
   */
  ahead(most = 3): Ahead {
    // The same suspects, the rows proposed not yet reached: the machines run on as they did, so
    // the look-ahead made from an earlier row still holds from here.
    const keys = this.live.map((s) => s.fault.key).join('|');
    const last = this.lastAhead;
    if (last && last.keys === keys && last.most === most && last.from <= this.reached) {
      const rows = last.found.rows.filter((r) => r.row >= this.reached);
      if (rows.length === last.found.rows.length) return last.found;
    }
    const found = this.lookAhead(most);
    this.lastAhead = { from: this.reached, keys, most, found };
    return found;
  }

  private lookAhead(most: number): Ahead {
    const n = this.live.length;
    if (n < 2) return { rows: [], alike: [], ended: true };
    const runs = this.live.map((s) => s.bad.copy());
    const look = runs.map(() => new Uint8Array(this.width));
    // Classes of suspects no row ahead has told apart yet (union of rows' splits).
    const cls = new Int32Array(n);
    const rows: SplitRow[] = [];
    let work = 0;
    let r = this.reached;
    for (; r < this.steps.length && rows.length < most; r++) {
      if (work + n > SPLIT_WORK) break;
      work += n;
      runs.forEach((b, i) => {
        b.run(this.steps[r].actions);
        b.look(look[i]);
      });
      // A row is proposed when it tells apart suspects no row proposed before it does.
      const classes = count(cls);
      refine(cls, look);
      const split = outcomesOf(look, this.good[r]);
      if (count(cls) > classes && split.length > 1) rows.push({ row: r, outcomes: split });
    }
    const ended = r >= this.steps.length;
    // Carry on refining (no more rows proposed) to say which suspects no row tells apart.
    for (; r < this.steps.length && work + n <= SPLIT_WORK; r++) {
      work += n;
      runs.forEach((b, i) => {
        b.run(this.steps[r].actions);
        b.look(look[i]);
      });
      refine(cls, look);
    }
    const done = r >= this.steps.length;
    const groups = new Map<number, number[]>();
    cls.forEach((c, i) => groups.set(c, [...(groups.get(c) ?? []), i]));
    return { rows, alike: done ? [...groups.values()].filter((g) => g.length > 1) : [], ended: ended && done };
  }
}

const seenKey = (seen: readonly SeenValue[] | undefined): string =>
  (seen ?? [])
    .map((s) => `${s.at}=${s.value}`)
    .sort()
    .join(',');

/** A faulty look agrees with what was expected where neither is X. */
function agrees(expected: Uint8Array, bad: Uint8Array): boolean {
  for (let k = 0; k < expected.length; k++) {
    const e = expected[k];
    const b = bad[k];
    if (e !== X && b !== X && e !== b) return false;
  }
  return true;
}

/**
 * The outcomes a row could show: the distinct looks of the suspects that settle every value the
 * sheet gives, each with the suspects it would leave (a suspect that leaves a value undetermined
 * is left by every outcome it agrees with); a suspect no such outcome leaves adds its own look.
 */
function outcomesOf(looks: readonly Uint8Array[], good: Uint8Array): RowOutcome[] {
  const settled = (l: Uint8Array): boolean => l.every((v, k) => v !== X || good[k] === X);
  const distinct = new Map<string, Uint8Array>();
  for (const l of looks) if (settled(l)) distinct.set(l.join(','), l);
  const out = [...distinct.values()].map((l) => outcome(l, looks, good));
  looks.forEach((l, i) => {
    if (!out.some((o) => o.leaves.includes(i)) && !distinct.has(l.join(','))) {
      distinct.set(l.join(','), l);
      out.push(outcome(l, looks, good));
    }
  });
  return out;
}

function outcome(l: Uint8Array, looks: readonly Uint8Array[], good: Uint8Array): RowOutcome {
  return {
    look: l.slice(),
    asSheet: l.every((v, k) => good[k] === X || v === good[k]),
    leaves: looks.flatMap((m, i) => (agrees(l, m) ? [i] : [])),
  };
}

const count = (cls: Int32Array): number => new Set(cls).size;

/** Split the classes of `cls` by the looks of one row (an X counts as a look of its own, so a class never holds two suspects a row could tell apart). */
function refine(cls: Int32Array, looks: readonly Uint8Array[]): void {
  const ids = new Map<string, number>();
  for (let i = 0; i < cls.length; i++) {
    const k = `${cls[i]}|${looks[i].join(',')}`;
    let id = ids.get(k);
    if (id === undefined) ids.set(k, (id = ids.size));
    cls[i] = id;
  }
}
