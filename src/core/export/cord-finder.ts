/**
 * Finding the cord: a fault dictionary of the commissioning sheet. For every cord fault the
 * sheet shows (sheet-faults.ts), the first row that shows it and what the person sees there
 * (which latch lever or output is up where the sheet says down, or the other way round), with
 * the cord named as a person at the frame finds it: what it connects, in the wiring list's
 * words, and the bays it runs between. Looked up by that first difference, it gives the
 * candidate cords; faults the sheet cannot show are listed apart, with what that means.
 *
 * A dictionary keyed by the first failing test and its response (the "fault dictionary" of
 * Abramovici, Breuer & Friedman, 1990, ch. 12 — from memory), cut to what a person sees at the
 * first row that differs: one look is enough to look a fault up, and faults that share the
 * same first sight are listed together (the person checks each).
 * Written as a section of the commissioning sheet and as cord-finder.csv (csv.ts: RFC 4180,
 * formula characters escaped), which opens with the safety cautions like commissioning.csv.
 */
import type { Build } from '../model/build.js';
import { partIndex, type Cord, type Part } from '../model/netlist.js';
import { counted } from '../model/words.js';
import type { Placement } from '../phases/place/index.js';
import { X } from '../sim/compile.js';
import { tiesOf, type CordFault } from '../sim/faults.js';
import { CAUTIONS } from './build-sheet.js';
import { bayWords, showsWords, type CommissioningRow } from './commissioning.js';
import { toCsv } from './csv.js';
import { p, table, type Section } from './doc.js';
import type { FaultVerdict, SheetFaults } from './sheet-faults.js';
import { coverageOf } from './sheet-faults.js';
import { driverSide } from './wiring.js';

/** One thing a person sees differ at a row: the lever or output, and its position. */
export interface Sight {
  /** The lever or output, as the sheet's columns name it: `m0 set Z`, `bell (flag)`. */
  readonly what: string;
  /** Its position as seen (`up`, `down`, `lifted (1)` …) and as the sheet gives it. */
  readonly seen: string;
  readonly expected: string;
}

/** One fault the sheet shows, filed under its first difference. */
export interface FinderEntry {
  /** The sheet's step (from 1) and clock of the first row that shows it. */
  readonly step: number;
  readonly clock: number;
  readonly sights: readonly Sight[];
  readonly fault: CordFault;
  /** The cord, what it connects and where. */
  readonly cord: string;
  /** What is wrong with it, in words. */
  readonly trouble: string;
  /** The faults collapsed into this one, in words (they look the same on the sheet). */
  readonly alike: string;
}

/** A fault the sheet does not show, and why. */
export interface UnshownEntry {
  readonly fault: CordFault;
  readonly cord: string;
  readonly trouble: string;
  readonly why: string;
}

/** The dictionary of one sheet. */
export interface CordFinder {
  readonly entries: readonly FinderEntry[];
  readonly unshown: readonly UnshownEntry[];
}

/** Words for cords and their faults, from the netlist and the placement. */
export function cordWording(build: Build, placement: Pick<Placement, 'bays'> | undefined) {
  const parts = partIndex(build.netlist);
  const where = bayWords(placement);
  const at = (id: string): string => (where(id) === '' ? '' : ` (${where(id)})`);
  const tieWords = (t: { part: string; port: string }): string => {
    const x: Part | undefined = parts.get(t.part);
    if (x?.kind === 'actuator') return `the ${x.output} actuator ${x.id}${at(x.id)}`;
    return `${x?.name ?? t.part} port ${t.port}${at(t.part)}`;
  };
  const cordWords = (c: Cord): string => {
    const d = driverSide(parts.get(c.driver), parts);
    const from = `${d.name} ${d.side}`;
    return `cord ${c.id} from ${from}${at(c.driver)} to ${tiesOf(c).map(tieWords).join(', ')}`;
  };
  const trouble = (f: CordFault): string =>
    f.kind === 'slack'
      ? 'broken, or slipping on its capstan (never pulls)'
      : f.kind === 'taut'
        ? 'jammed taut (always pulls)'
        : `come untied at ${f.tie ? tieWords(f.tie) : '?'} (that branch never pulls)`;
  const byId = new Map(build.netlist.cords.map((c) => [c.id, c]));
  const cordOf = (id: string): string => {
    const c = byId.get(id);
    return c ? cordWords(c) : `cord ${id}`;
  };
  const alike = (f: CordFault): string =>
    f.same
      .map((k) => {
        const [kind, cord] = k.split(' ');
        return `${cordOf(cord)}: ${kind === 'slack' ? 'broken or slipping' : 'jammed taut'}`;
      })
      .join('; ');
  return { cordOf, trouble, alike };
}

/** What a person ticks at a look position of a row (sim/fault-run.ts `lookAt` order: each latch's two Z levers, then each output). */
export interface LookAt {
  /** The lever or output, as the sheet's columns name it: `m0 set Z`, `bell (flag)`. */
  readonly what: string;
  readonly kind: 'z' | 'flag' | 'actuator';
  /** The sheet's position there, in words. */
  readonly expected: string;
  /** The sheet's value there: 1 (a Z lever down, an output showing 1), 0, or X where the sheet says '?'. */
  readonly value: number;
}

/** The look position `at` of a row. */
export function lookOf(row: CommissioningRow, at: number): LookAt {
  const nl = row.latches.length;
  if (at < 2 * nl) {
    const l = row.latches[at >> 1];
    const side = (at & 1) === 0 ? 'set' : 'reset';
    const z = side === 'set' ? l.setZ : l.resetZ;
    // A gate's output 1 has its Z down.
    return { what: `${l.id} ${side} Z`, kind: 'z', expected: z, value: z === 'down' ? 1 : z === 'up' ? 0 : X };
  }
  const o = row.outputs[at - 2 * nl];
  return {
    what: `${o.output} (${o.kind})`,
    kind: o.kind,
    expected: showsWords(o.kind, o.shows),
    value: o.shows === '1' ? 1 : o.shows === '0' ? 0 : X,
  };
}

/** A look's position in words for a value (0, 1, or X). */
export function positionWords(look: Pick<LookAt, 'kind'>, value: number): string {
  if (look.kind === 'z') return value === X ? '?' : value === 1 ? 'down' : 'up';
  return showsWords(look.kind, value === X ? 'X' : String(value));
}

/** What differs at a look position, in the sheet's words. */
function sightOf(row: CommissioningRow, at: number, value: 0 | 1): Sight {
  const look = lookOf(row, at);
  return { what: look.what, seen: positionWords(look, value), expected: look.expected };
}

const WHY: Readonly<Record<'never' | 'open' | 'may', string>> = {
  never:
    'no clock sequence from reset shows it: the cord matters only for input combinations the machine says never happen, for recovering from a code it never holds in use (after a knock), or it is redundant',
  may: 'it leaves a lever undetermined where the sheet expects a position: watch for a lever that will not settle',
  open: 'undecided: the search for clocks that show it stopped at its bound',
};

/** The dictionary of a sheet: `rows` are the sheet's rows (the extended sequence), `sf` its fault simulation. */
export function cordFinder(
  build: Build,
  rows: readonly CommissioningRow[],
  sf: SheetFaults,
  placement?: Pick<Placement, 'bays'>,
): CordFinder {
  const w = cordWording(build, placement);
  const entries: FinderEntry[] = [];
  const unshown: UnshownEntry[] = [];
  for (const v of sf.verdicts) {
    const base = { fault: v.fault, cord: w.cordOf(v.fault.cord), trouble: w.trouble(v.fault) };
    if (v.shown < 0 || v.shown >= rows.length) {
      unshown.push({ ...base, why: WHY[whyOf(v)] });
      continue;
    }
    const row = rows[v.shown];
    entries.push({
      ...base,
      step: row.step,
      clock: row.clock,
      sights: v.seen.map((s) => sightOf(row, s.at, s.value)),
      alike: w.alike(v.fault),
    });
  }
  entries.sort((a, b) => a.step - b.step || sightKey(a).localeCompare(sightKey(b)));
  return { entries, unshown };
}

function whyOf(v: FaultVerdict): 'never' | 'open' | 'may' {
  if (v.by === 'never') return 'never';
  return v.may >= 0 ? 'may' : 'open';
}

const sightKey = (e: FinderEntry): string => e.sights.map((s) => `${s.what} ${s.seen}`).join('; ');

/** The sights of an entry in words: `m0 set Z up (sheet: down); bell (flag) down (0) (sheet: up (1))`. */
export function sightWords(sights: readonly Sight[]): string {
  return sights.map((s) => `${s.what} ${s.seen} (sheet: ${s.expected})`).join('; ');
}

/**
 * The candidate cords for what a person saw: at `step`, the lever or output `what` (as the
 * sheet's columns name it) at `seen`. Every fault whose first difference is at that step and
 * includes that sight; when the sheet showed nothing different before, the cord is among them
 * (or the fault is outside the model: two cords at once, a lever off its pivot…).
 */
export function cordsFor(finder: CordFinder, step: number, what: string, seen: string): FinderEntry[] {
  const norm = (s: string): string => s.trim().toLowerCase();
  return finder.entries.filter(
    (e) => e.step === step && e.sights.some((s) => norm(s.what) === norm(what) && norm(s.seen).startsWith(norm(seen))),
  );
}

/** The coverage of the sheet in a sentence or two. */
export function coverageWords(sf: SheetFaults): string {
  const c = coverageOf(sf).total;
  const of =
    sf.simulated < sf.collapsed
      ? `Of a seeded sample of ${sf.simulated} of the ${sf.collapsed} distinct cord faults (seed ${sf.seed}; ${sf.all} before collapsing faults that look alike)`
      : `Of the ${sf.collapsed} distinct cord faults (${sf.all} before collapsing faults that look alike)`;
  const parts = [`the tour shows ${c.tour}`];
  if (sf.extra.length > 0) parts.push(`the ${counted(sf.extra.length, 'clock')} added at the end show ${c.extra} more`);
  if (c.never > 0) parts.push(`${c.never} no sequence from reset can show`);
  if (c.open > 0)
    parts.push(
      `${c.open} stay undecided${c.may > 0 ? ` (${c.may} of them may show as a lever left undetermined)` : ''}`,
    );
  return `${of}, ${parts.join('; ')}.`;
}

/** The dictionary as a section of the commissioning sheet. */
export function finderSection(finder: CordFinder, sf: SheetFaults): Section {
  const blocks = [
    p(
      "When a row does not match, stop, and find the row below by its step and by what you see differ. Check the cords it lists, one by one, with the drum stopped: a broken or slipping cord, a cord jammed taut, or one branch come untied. A cord's bays are where it leaves its capstan and where it is tied.",
    ),
    p(coverageWords(sf)),
    table(
      ['step', 'what you see', 'look at', 'what is wrong', 'looks the same as'],
      finder.entries.map((e) => [String(e.step), sightWords(e.sights), e.cord, e.trouble, e.alike]),
      { tick: true },
    ),
  ];
  if (finder.unshown.length > 0)
    blocks.push(
      p('Cords this sheet cannot show broken. Check them by eye when the machine is built.'),
      table(
        ['look at', 'what is wrong', 'why the sheet cannot show it'],
        finder.unshown.map((u) => [u.cord, u.trouble, u.why]),
        { tick: true },
      ),
    );
  return { id: 'finding', title: 'Finding the cord', blocks };
}

/** The dictionary as CSV: cautions first, then one record per fault (shown ones by step, then the rest). */
export function cordFinderCsv(finder: CordFinder): string {
  const header = ['step', 'clock', 'what you see', 'cord', 'what is wrong', 'looks the same as', 'note'];
  const cautions = CAUTIONS.map((c) => ['caution', '', c, '', '', '', '']);
  const shown = finder.entries.map((e) => [e.step, e.clock, sightWords(e.sights), e.cord, e.trouble, e.alike, '']);
  const unshown = finder.unshown.map((u) => ['none', '', '', u.cord, u.trouble, '', u.why]);
  return toCsv([header, ...cautions, ...shown, ...unshown]);
}
