/**
 * Which broken cords the commissioning sheet shows, and the clocks added to show the rest.
 *
 * Every fault of sim/faults.ts's model (collapsed) is simulated through the sheet's hand
 * actions from power-up (sim/fault-run.ts) and compared, row by row, with the fault-free
 * machine on what the person ticks. Faults the sequence does not show are searched for, one
 * after another, by a breadth-first search over the product of the fault-free and the faulty
 * machine from where the sequence ends; the clocks found are appended to the sequence (the
 * second part of the sheet, "clocks that catch the remaining cords") and every fault still
 * open is run on through them, so one appended run often shows several. A search that
 * exhausts the product both from the end of the sequence and from a fresh reset declares the
 * fault never showable: no clock sequence the state table specifies shows it, from reset or
 * from where the sheet ends (the cord matters only for inputs declared never to happen, for
 * recovery from unused codes, or it is redundant).
 *
 * Clocks the search may take: from the fault-free machine's state, every input setting in a
 * row of the state table with a specified next state (so `never` inputs and clocks the table
 * leaves free are not taken, and the testbench can still check each clock against the table),
 * with or without a reset before it. With more than SEARCH_INPUTS inputs the search takes one
 * setting per row (free inputs released, as the tour does) and then never declares a fault
 * never showable, only undecided.
 *
 * Bounds: the simulation takes at most FAULT_WORK fault-rows (faults × rows of the sheet);
 * past it, a seeded sample of FAULT_WORK / rows faults (at least FAULT_FLOOR) is simulated, and
 * every figure says so. Each search takes at most SEARCH_BOUNDS; all searches together at most
 * SEARCH_BUDGET clocks; no search starts once EXTRA_CLOCKS_LIMIT clocks are appended. A fault
 * past a bound is "undecided".
 * Deterministic: faults in netlist order, samples from the seed.
 */
import type { Build } from '../model/build.js';
import { DONT_CARE } from '../model/flat.js';
import { seededRandom } from '../model/random.js';
import { counted } from '../model/words.js';
import type { Profile } from '../physics/profile.js';
import { resetActions } from '../sim/hand.js';
import { faultInjector, listFaults, type CordFault, type FaultKind } from '../sim/faults.js';
import { runRows, searchShowing, Stepped, lookWidth, type SearchBounds } from '../sim/fault-run.js';
import { simFor, slaveCode, timingOf } from '../sim/part.js';
import { clockSteps, sheetSteps, type SheetClock, type SheetStep } from '../sim/sheet.js';
import { assignmentFor, type TourClock } from './tour.js';

/** Fault-rows (faults × rows of the sheet) simulated at most; past it, a seeded sample of faults. */
export const FAULT_WORK = 500_000;
/** The smallest sample. */
export const FAULT_FLOOR = 50;
/** Bounds of one search for clocks that show a fault: clocks in a sequence, product states, clocks simulated. */
export const SEARCH_BOUNDS: SearchBounds = { depth: 6, nodes: 300, clocks: 3000 };
/** Clocks all searches of one sheet may simulate together. */
export const SEARCH_BUDGET = 20_000;
/** No search starts once this many clocks are appended (a search adds at most SEARCH_BOUNDS.depth). */
export const EXTRA_CLOCKS_LIMIT = 200;
/** Most inputs for which the search tries every input setting (2^6 = 64 per state). */
export const SEARCH_INPUTS = 6;

/** What became of one fault. */
export interface FaultVerdict {
  readonly fault: CordFault;
  /** Row index (from 0) of the first row of the extended sheet that shows it; -1 when none does. */
  readonly shown: number;
  /** First row that may show it (a faulty X against a determinate value), -1 when none. */
  readonly may: number;
  /** Shown by the tour, by the appended clocks, never showable, or undecided (a bound, or a faulty X only). */
  readonly by: 'tour' | 'extra' | 'never' | 'open';
  /** At the shown row: what differs (look positions, sim/fault-run.ts's lookAt order) and the value seen. */
  readonly seen: readonly { readonly at: number; readonly value: 0 | 1 }[];
}

/** The fault simulation of one sheet. */
export interface SheetFaults {
  /** Faults of the model before collapsing, after collapsing, and simulated (a sample when fewer). */
  readonly all: number;
  readonly collapsed: number;
  readonly simulated: number;
  /** The seed of the sample (when `simulated` < `collapsed`). */
  readonly seed: number;
  readonly verdicts: readonly FaultVerdict[];
  /** The clocks appended to the sequence, each marked `extra`. */
  readonly extra: readonly TourClock[];
  /** Rows and clocks of the sheet before the appended clocks. */
  readonly tourRows: number;
  readonly tourClocks: number;
}

interface Open {
  readonly fault: CordFault;
  readonly bad: Stepped;
  may: number;
  shown: number;
  seen: FaultVerdict['seen'];
  by: FaultVerdict['by'];
}

/** The fault simulation of the sheet of `tour` and its appended clocks (see the module comment); `extend: false` appends none. */
export function sheetFaults(
  build: Build,
  profile: Pick<Profile, 'stageDelayS'>,
  tour: readonly TourClock[],
  opts: { readonly seed?: number; readonly extend?: boolean } = {},
): SheetFaults {
  const seed = opts.seed ?? 1;
  const f = build.machine;
  const seq = build.encoding.bits > 0;
  const sim = simFor(build, timingOf(profile));
  const injector = faultInjector(sim, profile.stageDelayS);
  const list = listFaults(build.netlist);
  const steps = sheetSteps(f.inputs, seq, tour);
  const faults = sampled(list.faults, Math.max(FAULT_FLOOR, Math.floor(FAULT_WORK / Math.max(1, steps.length))), seed);
  const good = new Stepped(sim);
  const looks = lookThrough(good, steps);
  const all: Open[] = faults.map((fault) => {
    const bad = new Stepped(injector.inject(fault));
    const r = runRows(bad, steps, looks);
    return { fault, bad, may: r.may, shown: r.shown, seen: r.seen, by: r.shown >= 0 ? 'tour' : 'open' };
  });
  const extra = opts.extend === false ? [] : extend(build, all, good, tour, steps.length, seq);
  return {
    all: list.all,
    collapsed: list.faults.length,
    simulated: faults.length,
    seed,
    verdicts: all.map((o) => ({ fault: o.fault, shown: o.shown, may: o.may, by: o.by, seen: o.seen })),
    extra,
    tourRows: steps.length,
    tourClocks: tour.length,
  };
}

/** At most `limit` faults: all of them, or a seeded sample kept in netlist order. */
function sampled(faults: readonly CordFault[], limit: number, seed: number): readonly CordFault[] {
  if (faults.length <= limit) return faults;
  const rnd = seededRandom(seed);
  const idx = faults.map((_, i) => i);
  for (let i = 0; i < limit; i++) {
    const j = i + rnd.int(idx.length - i);
    [idx[i], idx[j]] = [idx[j], idx[i]];
  }
  return idx
    .slice(0, limit)
    .sort((a, b) => a - b)
    .map((i) => faults[i]);
}

/** The fault-free looks after every row, stepping `good` through them. */
function lookThrough(good: Stepped, steps: readonly SheetStep[]): Uint8Array[] {
  return steps.map((st) => {
    good.run(st.actions);
    return good.look(new Uint8Array(lookWidth(good.sim)));
  });
}

/** Every input assignment (in counting order) that falls in a row of `s` with a specified next state, with its row. */
function settingsOf(build: Build, s: number): { inputs: string; row: number }[] {
  const f = build.machine;
  const rows = f.rows[s];
  const n = f.inputs.length;
  const specified = rows.flatMap((r, k) => (r.next === DONT_CARE ? [] : [k]));
  if (n > SEARCH_INPUTS) return specified.map((k) => ({ inputs: assignmentFor(rows[k].cube), row: k }));
  const out: { inputs: string; row: number }[] = [];
  for (let a = 0; a < 1 << n; a++) {
    const bits = n === 0 ? '' : a.toString(2).padStart(n, '0');
    const k = specified.find((j) => [...rows[j].cube].every((ch, i) => ch === '-' || ch === bits[i]));
    if (k !== undefined) out.push({ inputs: bits, row: k });
  }
  return out;
}

function extend(
  build: Build,
  open: Open[],
  good: Stepped,
  tour: readonly TourClock[],
  tourRows: number,
  seq: boolean,
): TourClock[] {
  const f = build.machine;
  const inputs = f.inputs;
  const codes = build.encoding.codes;
  const settings = f.states.map((_, s) => settingsOf(build, s));
  const stateOf = (g: Stepped): number => (seq ? codes.indexOf(slaveCode(g.sim, g.values)) : 0);
  const movesAt = (g: Stepped): SheetClock[] => {
    const s = stateOf(g);
    const here = s < 0 ? [] : settings[s].map((x) => ({ reset: false, inputs: x.inputs }));
    return seq ? [...here, ...settings[f.start].map((x) => ({ reset: true, inputs: x.inputs }))] : here;
  };
  const complete = inputs.length <= SEARCH_INPUTS;
  const extra: TourClock[] = [];
  let levers = tour.length > 0 ? tour[tour.length - 1].inputs : '0'.repeat(inputs.length);
  let rows = tourRows;
  let budget = SEARCH_BUDGET;
  const fresh = (o: Open): { good: Stepped; bad: Stepped; levers: string } => {
    const g = new Stepped(good.sim);
    const b = new Stepped(o.bad.sim);
    if (seq) {
      g.run(resetActions());
      b.run(resetActions());
    }
    return { good: g, bad: b, levers: '0'.repeat(inputs.length) };
  };
  for (const o of open) {
    if (o.shown >= 0) continue;
    if (extra.length >= EXTRA_CLOCKS_LIMIT || budget <= 0) continue;
    const bounds = { ...SEARCH_BOUNDS, clocks: Math.min(SEARCH_BOUNDS.clocks, budget) };
    const r = searchShowing({ good: good.copy(), bad: o.bad.copy(), levers }, inputs, seq, movesAt, complete, bounds);
    budget -= r.work;
    if (r.kind === 'never') {
      const again = searchShowing(fresh(o), inputs, seq, movesAt, complete, bounds);
      budget -= again.work;
      if (again.kind === 'never') o.by = 'never';
      continue;
    }
    if (r.kind !== 'shown') continue;
    // The clocks found, as tour clocks (state before, row, state after), then run by every open fault.
    let s = stateOf(good);
    const clocks = r.clocks.map((m): TourClock => {
      const from = m.reset ? f.start : s;
      const row = settings[from].find((x) => x.inputs === m.inputs)?.row ?? 0;
      s = f.rows[from][row].next;
      return { reset: m.reset, inputs: m.inputs, state: from, row, next: s, extra: true };
    });
    const steps = clocks.flatMap((c, i) => {
      const st = clockSteps(inputs, seq, c, tour.length + extra.length + i, levers);
      levers = c.inputs;
      return st;
    });
    const looks = lookThrough(good, steps);
    for (const p of open) {
      if (p.shown >= 0 || p.by === 'never') continue;
      const run = runRows(p.bad, steps, looks, rows, p.may);
      p.may = run.may;
      if (run.shown >= 0) Object.assign(p, { shown: run.shown, seen: run.seen, by: 'extra' });
    }
    extra.push(...clocks);
    rows += steps.length;
  }
  return extra;
}

/** Coverage by fault kind: faults simulated, shown by the tour, shown by the appended clocks, may show, never showable, undecided. */
export interface KindCoverage {
  readonly faults: number;
  readonly tour: number;
  readonly extra: number;
  readonly may: number;
  readonly never: number;
  readonly open: number;
}

/** The coverage figures of a fault simulation, by kind and in total. */
export function coverageOf(sf: SheetFaults): { total: KindCoverage; byKind: Record<FaultKind, KindCoverage> } {
  const count = (keep: (v: FaultVerdict) => boolean): KindCoverage => {
    const vs = sf.verdicts.filter(keep);
    return {
      faults: vs.length,
      tour: vs.filter((v) => v.by === 'tour').length,
      extra: vs.filter((v) => v.by === 'extra').length,
      may: vs.filter((v) => v.shown < 0 && v.may >= 0).length,
      never: vs.filter((v) => v.by === 'never').length,
      open: vs.filter((v) => v.by === 'open').length,
    };
  };
  return {
    total: count(() => true),
    byKind: {
      slack: count((v) => v.fault.kind === 'slack'),
      taut: count((v) => v.fault.kind === 'taut'),
      untied: count((v) => v.fault.kind === 'untied'),
    },
  };
}

/** The coverage of the commissioning sheet as report data (`build --json`'s `commissioning` block). */
export function coverageBlock(sf: SheetFaults) {
  const c = coverageOf(sf);
  return {
    faults: sf.all,
    collapsed: sf.collapsed,
    simulated: sf.simulated,
    sampled: sf.simulated < sf.collapsed,
    ...(sf.simulated < sf.collapsed ? { seed: sf.seed } : {}),
    tourClocks: sf.tourClocks,
    extraClocks: sf.extra.length,
    shown: c.total.tour + c.total.extra,
    ...c,
  };
}

/** The coverage in one line of the terminal report. */
export function coverageLine(sf: SheetFaults): string {
  const c = coverageOf(sf).total;
  const sample = sf.simulated < sf.collapsed ? ` (a seeded sample of ${sf.simulated} of ${sf.collapsed})` : '';
  const extra = sf.extra.length > 0 ? `, ${c.extra} more by ${counted(sf.extra.length, 'clock')} added at the end` : '';
  const never = c.never > 0 ? `; ${c.never} no sequence from reset can show` : '';
  const open = c.open > 0 ? `; ${c.open} undecided` : '';
  return `commissioning sheet: shows ${c.tour + c.extra} of ${c.faults} cord faults${sample} (${c.tour} by the tour${extra})${never}${open}`;
}
