/**
 * The commissioning sheet: a person at the bench steps the finished machine through an input
 * sequence (by default the transition tour of tour.ts) and ticks off, after every hand action,
 * the position of every latch lever and flag — so a wrong cord shows up at the first action
 * whose expected positions differ, part by part.
 *
 * Expected positions come from the part-level simulator (sim/part.ts) run through the same
 * hand actions from power-up: reset; then per clock, set the input levers, pull φ1, release
 * φ1, pull φ2, release φ2. A latch's gates have summing levers Z; a gate whose output is 1 has
 * Z down, so a latch holding Q = 1 has its set-side Z down and its reset-side Z up. A flag is
 * "up" when it shows 1. After each clock the slave code is compared with the state table; a
 * difference, or any simulator alarm, is written in the row's note (it should never happen
 * for a build whose checks passed).
 * The outputs shown once the inputs are set are compared with the state table too.
 * A one-state machine has no latches, clock or reset levers: one row per input setting.
 * With a placement, every lever an action names is named by its bay as well ("φ1 (bay 20,
 * drum 1)"), so a person at the frame can find it.
 * The CSV opens with the safety cautions (DESIGN §9): after the header line, one record per
 * caution (step `caution`, the text under `action`), so the file stays one table a spreadsheet
 * reads, and whoever opens it meets the cautions before the first hand action.
 */
import type { Build } from '../model/build.js';
import type { OutBit } from '../model/machine.js';
import type { Placement } from '../phases/place/index.js';
import type { Profile } from '../physics/profile.js';
import { type HandAction } from '../sim/hand.js';
import {
  isAlarm,
  outputValues,
  powerUp,
  readPart,
  show,
  simFor,
  stepSim,
  timingOf,
  X,
  type PartSim,
  type PartState,
} from '../sim/part.js';
import { CAUTIONS } from './build-sheet.js';
import { toCsv } from './csv.js';
import { sheetSteps } from '../sim/sheet.js';
import type { TourClock } from './tour.js';

/** Position of a lever: Z down when its gate's output is 1; '?' when the simulator cannot tell. */
export type Position = 'up' | 'down' | '?';

export interface CommissioningRow {
  readonly step: number;
  /** Clock number from 1 (0 for the reset before the first clock). */
  readonly clock: number;
  readonly action: string;
  /** Per latch, its two Z levers after the action, and Q. */
  readonly latches: readonly {
    readonly id: string;
    readonly name: string;
    readonly setZ: Position;
    readonly resetZ: Position;
    readonly q: string;
  }[];
  /** Per machine output, what its flag or actuator shows after the action ('0', '1' or 'X'). */
  readonly outputs: readonly {
    readonly output: string;
    readonly part: string;
    readonly kind: 'flag' | 'actuator';
    readonly shows: string;
  }[];
  /** State and slave code after the action ('' for a one-state machine). */
  readonly state: string;
  readonly code: string;
  /** Alarms, or a difference from the state table; empty when all is as it should be. */
  readonly note: string;
}

const zOf = (v: number): Position => (v === X ? '?' : v === 1 ? 'down' : 'up');

/** Where a part sits, as a person at the frame reads it: `bay 7, drum 1` (empty without a placement). */
export function bayWords(placement: Pick<Placement, 'bays'> | undefined): (part: string) => string {
  const at = new Map(placement?.bays.map((b) => [b.part, `bay ${b.bay}, drum ${b.drum}`]));
  return (part) => at.get(part) ?? '';
}

/** The words of each hand action, naming each lever's bay when there is a placement. */
function actionWords(build: Build, placement: Pick<Placement, 'bays'> | undefined) {
  const where = bayWords(placement);
  const at = (part: string): string => (where(part) === '' ? '' : ` (${where(part)})`);
  const sg = build.signals;
  return {
    reset: (first: boolean): string =>
      `Reset: pull the reset lever${at(sg.reset)}, then release it${first ? ' (both clock levers released)' : ''}.`,
    inputs: (inputs: readonly string[], assignment: string, unchanged: boolean): string =>
      `Set the input levers: ${inputWords(inputs, assignment, (i) => at(sg.inputs[i] ?? ''))}${unchanged ? ' (no change)' : ''}.`,
    clock: (verb: 'Pull' | 'Release', lever: 'phi1' | 'phi2'): string =>
      `${verb} ${lever === 'phi1' ? 'φ1' : 'φ2'}${at(lever === 'phi1' ? sg.phi1 : sg.phi2)}.`,
  };
}

/** The hand actions of the sheet, from power-up, and what the machine shows after each; `placement` names the levers' bays. */
export function commissioningRows(
  build: Build,
  profile: Pick<Profile, 'stageDelayS'>,
  tour: readonly TourClock[],
  placement?: Pick<Placement, 'bays'>,
): CommissioningRow[] {
  const words = actionWords(build, placement);
  const sim = simFor(build, timingOf(profile));
  const f = build.machine;
  const seq = build.encoding.bits > 0;
  let [state] = powerUp(sim);
  const rows: CommissioningRow[] = [];
  // `out`: the outputs the state table gives, compared after the action — or before it, with
  // `outBefore`, for a machine without inputs whose clock starts at φ1.
  const run = (
    clock: number,
    action: string,
    actions: readonly HandAction[],
    check: { next?: number; out?: readonly OutBit[]; outBefore?: boolean } = {},
  ): void => {
    const notes: string[] = [];
    const before = outputValues(sim, state.values);
    for (const a of actions) {
      const [next, events] = stepSim(sim, state, a);
      state = next;
      notes.push(...events.filter(isAlarm).map((e) => e.words));
    }
    const reading = readPart(sim, state);
    if (check.next !== undefined && reading.code !== build.encoding.codes[check.next]) {
      notes.push(`the state table says ${f.states[check.next]} (code ${build.encoding.codes[check.next]}) here`);
    }
    const shown = check.outBefore ? before : outputValues(sim, state.values);
    const wrong = f.outputs.filter(
      (_, k) => check.out && check.out[k] !== '-' && String(check.out[k]) !== show(shown[k]),
    );
    if (wrong.length > 0 && check.out)
      notes.push(
        `the state table gives ${wrong.map((o) => `${o}=${check.out?.[f.outputs.indexOf(o)]}`).join(', ')} here`,
      );
    rows.push(
      rowOf(
        sim,
        state,
        rows.length + 1,
        clock,
        action,
        notes,
        seq ? (reading.state ?? '(unused code)') : f.states[0],
        reading.code,
      ),
    );
  };
  for (const st of sheetSteps(f.inputs, seq, tour)) {
    const c = st.at >= 0 ? tour[st.at] : undefined;
    const out = c ? f.rows[c.state][c.row].out : undefined;
    if (st.kind === 'reset') run(st.clock, words.reset(st.at < 0), st.actions, { next: f.start });
    else if (st.kind === 'inputs' && c)
      run(st.clock, words.inputs(f.inputs, c.inputs, st.actions.length === 0), st.actions, { out });
    else if (st.kind === 'look') run(st.clock, 'Look at the flags.', st.actions, { out });
    else if (st.kind === 'pull-phi1')
      run(st.clock, words.clock('Pull', 'phi1'), st.actions, f.inputs.length === 0 ? { out, outBefore: true } : {});
    else if (st.kind === 'release-phi1') run(st.clock, words.clock('Release', 'phi1'), st.actions);
    else if (st.kind === 'pull-phi2') run(st.clock, words.clock('Pull', 'phi2'), st.actions);
    else if (st.kind === 'release-phi2')
      run(st.clock, words.clock('Release', 'phi2'), st.actions, c ? { next: c.next } : {});
  }
  return rows;
}

/** `marble pulled, coin released` (`where` adds a lever's place after its name). */
export function inputWords(
  inputs: readonly string[],
  assignment: string,
  where: (input: string) => string = () => '',
): string {
  return inputs.map((n, i) => `${n}${where(n)} ${assignment[i] === '1' ? 'pulled' : 'released'}`).join(', ');
}

function rowOf(
  sim: PartSim,
  state: PartState,
  step: number,
  clock: number,
  action: string,
  alarms: string[],
  stateName: string,
  code: string,
): CommissioningRow {
  const v = state.values;
  const outs = outputValues(sim, v);
  return {
    step,
    clock,
    action,
    latches: sim.latches.map((l) => ({
      id: l.id,
      name: l.name,
      setZ: zOf(v[l.set]),
      resetZ: zOf(v[l.reset]),
      q: show(v[l.set]),
    })),
    outputs: sim.build.machine.outputs.map((o, k) => {
      const part = sim.build.signals.outputs[o] ?? '';
      const kind = sim.build.netlist.parts.find((q) => q.id === part)?.kind === 'actuator' ? 'actuator' : 'flag';
      return { output: o, part, kind, shows: show(outs[k]) };
    }),
    state: stateName,
    code,
    note: alarms.join('; '),
  };
}

/** What an output part shows, in words. */
export function showsWords(kind: 'flag' | 'actuator', shows: string): string {
  if (shows === 'X') return '? (undetermined)';
  if (kind === 'actuator') return shows === '1' ? 'lifted (1)' : 'at rest (0)';
  return shows === '1' ? 'up (1)' : 'down (0)';
}

/** The sheet as CSV: one row per hand action, one column per latch lever and output, and an empty `done` column. */
export function commissioningCsv(rows: readonly CommissioningRow[]): string {
  const first = rows[0];
  const header = [
    'step',
    'clock',
    'action',
    ...(first?.latches ?? []).flatMap((l) => [`${l.id} set Z`, `${l.id} reset Z`]),
    ...(first?.outputs ?? []).map((o) => `${o.output} (${o.part})`),
    'state after',
    'code after',
    'note',
    'done',
  ];
  const cautions = CAUTIONS.map((c) => ['caution', '', c, ...header.slice(3).map(() => '')]);
  const body = rows.map((r) => [
    r.step,
    r.clock,
    r.action,
    ...r.latches.flatMap((l) => [l.setZ, l.resetZ]),
    ...r.outputs.map((o) => showsWords(o.kind, o.shows)),
    r.state,
    r.code,
    r.note,
    '',
  ]);
  return toCsv([header, ...cautions, ...body]);
}
