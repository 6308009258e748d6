/**
 * The suspect cords from everything seen on the commissioning sheet so far, in the sheet's
 * words: the walk of sim/narrow.ts (effect–cause diagnosis by fault simulation with the full
 * response; Abramovici, Breuer & Friedman, 1990, ch. 12 — from memory) over the sheet's own rows
 * (`DocumentSources.tour()`, the same hand actions as the printed sheet) and its own faults
 * (`faults()`: the collapsed list, or its seeded sample, which the answer says), with each
 * suspect named as the cord finder names it (what it connects, its bays) and each row ahead that
 * tells the suspects apart said as the sheet would: its step, its hand action, and what each
 * outcome would look like and leave.
 *
 * The looks a person ticks are the sheet's columns: each latch's set and reset Z lever, then
 * each output's flag or actuator (`lookColumns`, in sim/fault-run.ts's `lookAt` order).
 */
import { partIndex } from '../model/netlist.js';
import { X } from '../sim/compile.js';
import type { CordFault } from '../sim/faults.js';
import { SuspectWalk, type SeenValue, type Walked } from '../sim/narrow.js';
import { simFor, timingOf } from '../sim/part.js';
import { sheetSteps } from '../sim/sheet.js';
import { cordWording, lookOf, positionWords, type Sight } from './cord-finder.js';

export { positionWords } from './cord-finder.js';
import { bayWords, type CommissioningRow } from './commissioning.js';
import type { DocumentSources } from './documents.js';

/** One value a person ticks on every row. */
export interface LookColumn {
  /** As the sheet heads it: `m0 set Z`, `bell (flag)`. */
  readonly what: string;
  /** Where it stands on the frame (`bay 7, drum 1`), or ''. */
  readonly bay: string;
  readonly kind: 'z' | 'flag' | 'actuator';
}

/** A suspect cord, as the person at the frame looks for it. */
export interface SuspectCord {
  readonly fault: CordFault;
  /** The cord, what it connects, and its bays. */
  readonly cord: string;
  readonly trouble: string;
  /** The faults it stands for (they look the same on the sheet), in words. */
  readonly alike: string;
}

/** One outcome of a row ahead: what would differ from the sheet there (none: as the sheet), and which suspects it leaves. */
export interface AheadOutcome {
  readonly sights: readonly Sight[];
  /** Columns a suspect would leave undetermined here. */
  readonly unsettled: readonly string[];
  readonly asSheet: boolean;
  /** Keys of the suspects it leaves. */
  readonly leaves: readonly string[];
}

/** A row ahead that tells the suspects apart. */
export interface AheadRow {
  readonly step: number;
  readonly clock: number;
  readonly action: string;
  readonly outcomes: readonly AheadOutcome[];
}

/** What the walk so far says. */
export interface Narrowed {
  /** Rows walked (steps 1 … reached). */
  readonly reached: number;
  /** The first step where something was seen differ (0: none yet). */
  readonly firstDifference: number;
  /**
   * `fine`: nothing seen differ yet; `found`: one suspect left; `suspects`: several;
   * `none`: no single cord fault explains what was seen.
   */
  readonly verdict: 'fine' | 'found' | 'suspects' | 'none';
  readonly suspects: readonly SuspectCord[];
  /**
   * Cords that fit only loosely: every value seen differ that they do not give, they leave
   * undetermined (a broken reset cord leaves every latch so). Check them when the suspects are sound.
   */
  readonly loose: readonly SuspectCord[];
  /** Rows ahead that tell the suspects apart (at most three). */
  readonly ahead: readonly AheadRow[];
  /** Groups of suspects no row left on the sheet tells apart (keys): check each by hand. */
  readonly alike: readonly (readonly string[])[];
  /** Verdict `none`: the step that left no suspect, and the suspects that fitted every row before it. */
  readonly before?: { readonly step: number; readonly suspects: readonly SuspectCord[] };
  /** The faults walked were a seeded sample: how many of how many, and the seed. */
  readonly sample?: { readonly simulated: number; readonly collapsed: number; readonly seed: number };
}

/** What a person says they saw at a step: the column (lookColumns index) and its position as a value (1: Z down, an output showing 1). */
export interface StepSight {
  readonly step: number;
  readonly at: number;
  readonly value: 0 | 1;
}

/** The columns a person ticks, from the sheet's rows and the placement. */
export function lookColumns(sources: DocumentSources): LookColumn[] {
  const first = sources.steps()[0];
  if (!first) return [];
  const where = bayWords(sources.placement());
  const parts = partIndex(sources.input.build.netlist);
  const bayOf = (...ids: string[]): string => ids.map(where).find((w) => w !== '') ?? '';
  const latchParts = (id: string): string[] => {
    const l = parts.get(id);
    return l?.kind === 'latch' ? [l.setGate, l.resetGate, id] : [id];
  };
  return [
    ...first.latches.flatMap((l): LookColumn[] => {
      const [s, r] = latchParts(l.id);
      return [
        { what: `${l.id} set Z`, bay: bayOf(s, l.id), kind: 'z' },
        { what: `${l.id} reset Z`, bay: bayOf(r ?? l.id, l.id), kind: 'z' },
      ];
    }),
    ...first.outputs.map((o): LookColumn => {
      const p = parts.get(o.part);
      return {
        what: `${o.output} (${o.kind})`,
        bay: bayOf(o.part, p?.kind === 'flag' ? p.gate : o.part),
        kind: o.kind,
      };
    }),
  ];
}

/** The value a person's words stand for in a column (`up`, `down`, `lifted`, `at rest`, `1`, `0`), or undefined. */
export function valueOfWords(column: Pick<LookColumn, 'kind'>, words: string): 0 | 1 | undefined {
  const w = words.trim().toLowerCase();
  if (column.kind === 'z') return w.startsWith('down') ? 1 : w.startsWith('up') ? 0 : undefined;
  if (/^(1|up|lifted|raised)\b/.test(w)) return 1;
  if (/^(0|down|at rest|rest|lowered)\b/.test(w)) return 0;
  return undefined;
}

/** The expected position of every column at a row, in words. */
export const expectedAt = (row: CommissioningRow, columns: readonly LookColumn[]): string[] =>
  columns.map((_, k) => lookOf(row, k).expected);

/** The value the sheet gives every column at a row (1: Z down, an output showing 1; `X` when the sheet says '?'). */
export const valuesAt = (row: CommissioningRow, columns: readonly LookColumn[]): number[] =>
  columns.map((_, k) => lookOf(row, k).value);

/** A walk along the sheet of one build, kept between questions so each row walked costs one row per suspect. */
export class CordNarrowing {
  private readonly walker: SuspectWalk;
  readonly columns: readonly LookColumn[];
  private readonly wording: ReturnType<typeof cordWording>;
  private readonly rows: readonly CommissioningRow[];

  constructor(private readonly sources: DocumentSources) {
    const { build, profile } = sources.input;
    const seq = build.encoding.bits > 0;
    const steps = sheetSteps(build.machine.inputs, seq, sources.tour());
    const faults = sources.faults().verdicts.map((v) => v.fault);
    this.walker = new SuspectWalk(simFor(build, timingOf(profile)), profile.stageDelayS, faults, steps);
    this.columns = lookColumns(sources);
    this.wording = cordWording(build, sources.placement());
    this.rows = sources.steps();
  }

  /** Steps on the sheet. */
  get steps(): number {
    return this.rows.length;
  }

  /**
   * The answer for steps 1 … `reached` walked, with `sights` (by step) the values seen differ. A
   * step with a sight, or before `ticked` (default: every step walked), was ticked whole: what is
   * not named there stood as the sheet. A step from `ticked` on with no sight is unknown; with
   * `onlyNamed`, a step from `ticked` on tells only what is named.
   */
  narrow(reached: number, sights: readonly StepSight[], ticked = reached + 1, onlyNamed = false): Narrowed {
    const seen = new Map<number, SeenValue[]>();
    for (const s of sights) {
      if (s.step < 1 || s.step > reached) continue;
      const list = seen.get(s.step - 1) ?? [];
      seen.set(s.step - 1, [...list.filter((x) => x.at !== s.at), { at: s.at, value: s.value }]);
    }
    const walked: Walked = { reached, seen, ticked: ticked - 1, onlyNamed };
    const w = this.walker.walk(walked);
    const looseness = w.looseness();
    const live = w.suspects();
    const suspects = live.flatMap((f, i) => (looseness[i] === 0 ? [this.suspect(f)] : []));
    const loose = live.flatMap((f, i) => (looseness[i] > 0 ? [this.suspect(f)] : []));
    const first = w.firstDifference;
    const verdict = first < 0 ? 'fine' : suspects.length === 0 ? 'none' : suspects.length === 1 ? 'found' : 'suspects';
    const sf = this.sources.faults();
    const sample =
      sf.simulated < sf.collapsed ? { simulated: sf.simulated, collapsed: sf.collapsed, seed: sf.seed } : undefined;
    const gone = w.beforeNone();
    const before =
      verdict === 'none' && gone
        ? { step: gone.row + 1, suspects: gone.faults.map((f) => this.suspect(f)) }
        : undefined;
    const look = first >= 0 && suspects.length > 0 && live.length > 1 ? w.ahead(3) : { rows: [], alike: [] };
    const keys = live.map((f) => f.key);
    return {
      reached: w.rows,
      firstDifference: first + 1,
      verdict,
      suspects,
      loose,
      ahead: look.rows.map((r) => this.aheadRow(r.row, r.outcomes, keys)),
      alike: look.alike.map((g) => g.map((i) => keys[i])),
      ...(before ? { before } : {}),
      ...(sample ? { sample } : {}),
    };
  }

  private suspect(f: CordFault): SuspectCord {
    return {
      fault: f,
      cord: this.wording.cordOf(f.cord),
      trouble: this.wording.trouble(f),
      alike: this.wording.alike(f),
    };
  }

  private aheadRow(
    row: number,
    outcomes: readonly { look: Uint8Array; asSheet: boolean; leaves: readonly number[] }[],
    keys: readonly string[],
  ): AheadRow {
    const r = this.rows[row];
    const good = this.walker.good[row];
    return {
      step: r.step,
      clock: r.clock,
      action: r.action,
      outcomes: outcomes.map((o) => ({
        sights: this.columns.flatMap((c, k): Sight[] =>
          o.look[k] !== X && good[k] !== X && o.look[k] !== good[k]
            ? [{ what: c.what, seen: positionWords(c, o.look[k]), expected: positionWords(c, good[k]) }]
            : [],
        ),
        unsettled: this.columns.flatMap((c, k) => (o.look[k] === X && good[k] !== X ? [c.what] : [])),
        asSheet: o.asSheet,
        leaves: o.leaves.map((i) => keys[i]),
      })),
    };
  }
}

/** A fault key (`slack c12`, `taut c12`, `untied c12 g4.a`) in a few words: `c12 broken`, `c12 jammed`, `c12 untied at g4.a`. */
export function faultShort(key: string): string {
  const [kind, cord, tie] = key.split(' ');
  if (kind === 'slack') return `${cord} broken`;
  if (kind === 'taut') return `${cord} jammed`;
  return `${cord} untied at ${tie ?? '?'}`;
}

/** What to check when no single cord fault explains the sights. */
export const NONE_WORDS =
  'No single broken, jammed or untied cord explains everything seen. Check the rows you ticked again (a lever misread, a step skipped); then look for two faults at once, a cord tied to the wrong port, a lever off its pivot, a weight fallen off, or a lever that sticks.';

/** The answer in a few sentences for the terminal (each suspect and each row ahead on a line). */
export function narrowedText(n: Narrowed): string {
  const lines: string[] = [];
  if (n.sample)
    lines.push(
      `(the faults walked are a seeded sample of ${n.sample.simulated} of ${n.sample.collapsed}, seed ${n.sample.seed}: the cord at fault may be one not simulated)`,
    );
  if (n.verdict === 'fine') lines.push(`steps 1 to ${n.reached} as the sheet: nothing points at a cord yet.`);
  else if (n.verdict === 'none') {
    lines.push(NONE_WORDS);
    if (n.loose.length > 0)
      lines.push(
        'These fit only by leaving the levers you saw differ undetermined:',
        ...n.loose.map((s) => `  ${s.cord}: ${s.trouble}`),
      );
    if (n.before && n.before.suspects.length > 0)
      lines.push(
        `Up to step ${n.before.step - 1} these fitted; what you saw at step ${n.before.step} rules out each:`,
        ...n.before.suspects.map((s) => `  ${s.cord}: ${s.trouble}`),
      );
  } else {
    lines.push(
      n.verdict === 'found'
        ? 'one cord explains everything seen; stop the drum, then check:'
        : `${n.suspects.length} cords explain everything seen; stop the drum, then check:`,
    );
    for (const s of n.suspects)
      lines.push(
        `  look at ${s.cord}: ${s.trouble}${s.alike === '' ? '' : ` (looks the same as ${s.alike})`} [${s.fault.key}]`,
      );
    if (n.loose.length > 0)
      lines.push(
        'these fit only by leaving the levers you saw differ undetermined; check them if the cords above are sound:',
        ...n.loose.map((s) => `  ${s.cord}: ${s.trouble} [${s.fault.key}]`),
      );
    for (const r of n.ahead) {
      lines.push(`to tell them apart, go on to step ${r.step} (clock ${r.clock}: ${r.action}):`);
      for (const o of r.outcomes) {
        const seen = o.asSheet
          ? 'as the sheet'
          : o.sights.map((s) => `${s.what} ${s.seen} (sheet: ${s.expected})`).join('; ') || 'a lever left unsettled';
        lines.push(`  ${seen} → leaves ${o.leaves.length}: ${o.leaves.map(faultShort).join(', ')}`);
      }
    }
    for (const g of n.alike)
      lines.push(`no row left on the sheet tells these apart; check each: ${g.map(faultShort).join(', ')}`);
  }
  return lines.join('\n') + '\n';
}
