/**
 * Forbidden latch input, at part level: no latch ever sees S̄ = R̄ = 0 while the operating
 * rules are kept — and, for each rule, the shortest way of breaking it that does upset a latch.
 *
 * Method: exhaustive part-level simulation. For every state code (used and unused; the
 * masters too, free of the slaves, while that stays within the bound) and every input
 * combination (the `never` ones included: a visitor will try them), the hand procedure is
 * run — inputs set, φ1 pulled and released, φ2 pulled and released — and so is the reset
 * procedure; the simulator reports every instant at which a latch's two ports are pulled at
 * once, so transient overlaps count too. The start points run 32 at a time on the
 * bit-parallel simulator (sim/sweep.ts); one whose latches the settle programs cannot vouch
 * for (a port pulled both ways, both pulled, no program) runs again event-driven, with its
 * input levers moved from released, and gives the alarm. Then, per operating rule, a breadth-first search
 * over hand actions from the reset machine, where actions may break that rule (and no
 * other), finds the shortest sequence after which a latch sees the forbidden input, is left
 * X, or the machine oscillates — what signage and interlocks are designed from (rule-search.ts).
 * Bounds: inputs beyond `maxExhaustiveInputs` (16) are sampled (one combination per row and
 * `never` cube plus seeded random ones); codes beyond `maxClocks` simulated clocks are
 * the used codes plus a seeded sample of unused ones; master codes are free of the slaves'
 * only within `maxFreeMasterClocks`; the rule search stops at `maxActions` actions or
 * `maxStates` machine states. The result says which applied.
 */
import type { Build, CheckBase } from '../model/build.js';
import { seededRandom, type Random } from '../model/random.js';
import { counted } from '../model/words.js';
import type { Profile } from '../physics/profile.js';
import { allCodes, describeInputs, inputAssignments, machineInputs, randomCodes } from '../sim/assignments.js';
import { clockFrom } from '../sim/clocking.js';
import { LANES, LaneBatch } from '../sim/lanes.js';
import { codesBatchKey, sweep as sweepLanes } from '../sim/sweep.js';
import { clockActions, describeTrace, resetActions, valuesOf, type HandAction } from '../sim/hand.js';
import {
  applyInPlace,
  isAlarm,
  setLeversInPlace,
  simFor,
  stateAtCode,
  timingOf,
  type PartEvent,
  type PartSim,
} from '../sim/part.js';
import { checkForbiddenInput as checkForbiddenLogic, type LogicForbiddenResult } from './logic.js';
import { searchRules, type RuleViolation } from './rule-search.js';

export type { RuleViolation } from './rule-search.js';

export interface ForbiddenInputOptions {
  readonly maxExhaustiveInputs?: number;
  /** Random input combinations when sampling (default 256). */
  readonly samples?: number;
  readonly seed?: number;
  /** Bound on simulated clocks over codes × inputs (default 262 144). */
  readonly maxClocks?: number;
  /** Bound on simulated clocks with every master code free of the slaves' (default 32 768). */
  readonly maxFreeMasterClocks?: number;
  /** Rule search bounds: hand actions (default 8) and machine states (default 20 000). */
  readonly maxActions?: number;
  readonly maxStates?: number;
}

export interface ForbiddenCounterexample {
  readonly code: string;
  readonly masterCode: string;
  readonly inputs: string;
  /** Hand actions from a machine at that code with the levers released. */
  readonly actions: readonly HandAction[];
  readonly trace: readonly string[];
  readonly latch?: string;
  readonly words: string;
}

/** The part-level sweep and the rule search. */
export interface ForbiddenInputResult extends CheckBase<'forbidden-input'> {
  readonly level: 'part';
  /** (slave code, master code, input combination) start points simulated through a clock and a reset. */
  readonly states: number;
  readonly codes: 'all' | 'sampled';
  readonly masters: 'free' | 'equal to slaves';
  readonly inputs: 'exhaustive' | 'sampled';
  readonly rules: readonly RuleViolation[];
  readonly counterexample?: ForbiddenCounterexample;
}

/** The `forbidden-input` check as the pipeline runs it: the part-level result with the logic-level proof inside. */
export interface ForbiddenInputCheck extends ForbiddenInputResult {
  readonly logic: LogicForbiddenResult;
}

/** Both levels of the forbidden-input check: passes when the logic-level proof and the part-level sweep both do. */
export function forbiddenInputCheck(
  build: Build,
  profile: Pick<Profile, 'stageDelayS'>,
  opts: ForbiddenInputOptions = {},
): ForbiddenInputCheck {
  const logic = checkForbiddenLogic(build);
  const part = checkForbiddenInput(build, profile, opts);
  return { ...part, ok: logic.ok && part.ok, summary: `${logic.summary}; ${part.summary}`, logic };
}

/** Which start points the sweep covers: slave codes, master codes, input combinations. */
interface Scope {
  readonly tries: readonly string[];
  readonly exhaustive: boolean;
  readonly codes: readonly string[];
  readonly allFit: boolean;
  readonly freeMasters: boolean;
}

function scopeOf(build: Build, bits: number, opts: ForbiddenInputOptions, rnd: Random): Scope {
  const maxClocks = opts.maxClocks ?? 1 << 18;
  const { list: tries, exhaustive } = inputAssignments(machineInputs(build.machine), rnd, {
    ...opts,
    includeNever: true,
  });
  const allFit = 2 ** bits * tries.length <= maxClocks;
  const used = build.encoding.codes;
  const codes = allFit
    ? allCodes(bits)
    : [...used, ...randomCodes(bits, Math.floor(maxClocks / tries.length) - used.length, rnd, new Set(used))];
  const freeMasters = 4 ** bits * tries.length <= Math.min(maxClocks, opts.maxFreeMasterClocks ?? 1 << 15);
  return { tries, exhaustive, codes, allFit, freeMasters };
}

/** Prove that no latch sees S̄ = R̄ = 0 under the operating rules, and find what breaking each rule upsets. */
export function checkForbiddenInput(
  build: Build,
  profile: Pick<Profile, 'stageDelayS'>,
  opts: ForbiddenInputOptions = {},
): ForbiddenInputResult {
  const sim = simFor(build, timingOf(profile));
  const scope = scopeOf(build, sim.slaves.length, opts, seededRandom(opts.seed ?? 1));
  const { states, failure } = sweep(sim, scope);
  const rules = searchRules(sim, opts.maxActions ?? 8, opts.maxStates ?? 20_000);
  const { allFit, freeMasters, exhaustive } = scope;
  const scopeWords = `${allFit ? 'every code' : `${scope.codes.length} sampled codes`}${freeMasters ? ' (masters free)' : ''} × ${exhaustive ? 'every input combination' : `${scope.tries.length} sampled input combinations`} × both phases and reset`;
  return {
    name: 'forbidden-input',
    level: 'part',
    ok: failure === undefined,
    summary: failure ? failure.words : `no latch sees S̄ = R̄ = 0 over ${scopeWords} (${counted(states, 'start point')})`,
    states,
    codes: allFit ? 'all' : 'sampled',
    masters: freeMasters ? 'free' : 'equal to slaves',
    inputs: exhaustive ? 'exhaustive' : 'sampled',
    rules,
    ...(failure ? { counterexample: failure } : {}),
  };
}

/** Reset and one clock from every start point of the scope; the start points simulated and the first failure. */
function sweep(sim: PartSim, scope: Scope): { states: number; failure?: ForbiddenCounterexample } {
  const bits = sim.slaves.length;
  const groups: [string, string][] = [];
  for (const c of scope.codes)
    // The masters equal to the slaves first (as every clock leaves them), then every other master code.
    for (const m of scope.freeMasters ? [c, ...allCodes(bits).filter((x) => x !== c)] : [c]) groups.push([c, m]);
  const batch = new LaneBatch(sim);
  const resets = new ResetSweep(sim, groups);
  let states = 0;
  let failure: ForbiddenCounterexample | undefined;
  for (let g = 0; g < groups.length && !failure; g++) {
    const [c, m] = groups[g];
    failure = resets.failure(g);
    if (failure) break;
    sweepLanes(
      sim,
      scope.tries.length,
      {
        setUp: (b, lane, i) => {
          b.setCodes(lane, c, m);
          b.setInputs(lane, scope.tries[i]);
        },
        // Other checks run clocks from codes with the masters equal to the slaves (as every clock leaves them): keep those.
        recordKey: (first, n) => (m === c ? codesBatchKey(sim, c, m, scope.tries, first, n) : undefined),
        done: () => void states++,
        slow: (i) => {
          states++;
          failure = slowClock(sim, c, m, scope.tries[i]);
          return failure === undefined;
        },
      },
      batch,
    );
  }
  return failure ? { states, failure } : { states };
}

/** The reset procedure from every (slave code, master code) group, 32 groups at a time; the failure of a group, if any. */
class ResetSweep {
  private readonly alarms: (PartEvent[] | undefined)[] = [];
  private done = 0;
  private readonly batch: LaneBatch;
  constructor(
    private readonly sim: PartSim,
    private readonly groups: readonly (readonly [string, string])[],
  ) {
    this.batch = new LaneBatch(sim);
  }

  failure(g: number): ForbiddenCounterexample | undefined {
    while (this.done <= g) this.next();
    const alarms = this.alarms[g];
    if (!alarms || alarms.length === 0) return undefined;
    const [c, m] = this.groups[g];
    const zero = '0'.repeat(this.sim.build.machine.inputs.length);
    return counterexample(this.sim.build.machine.inputs, c, m, zero, resetActions(), alarms);
  }

  private next(): void {
    const { sim, groups } = this;
    const first = this.done;
    const zero = '0'.repeat(sim.build.machine.inputs.length);
    sweepLanes(
      sim,
      Math.min(LANES, groups.length - first),
      {
        setUp: (b, lane, i) => {
          b.setCodes(lane, groups[first + i][0], groups[first + i][1]);
          b.setInputs(lane, zero);
        },
        moves: (b) => {
          b.move(sim.reset, 1);
          b.move(sim.reset, 0);
        },
        done: (i) => void (this.alarms[first + i] = undefined),
        slow: (i) => {
          const [c, m] = groups[first + i];
          this.alarms[first + i] = runActions(sim, stateAtCode(sim, c, zero, m).values, resetActions());
        },
      },
      this.batch,
    );
    this.done = Math.min(groups.length, first + LANES);
  }
}

/** One start point, event-driven: the levers moved from released to `a`, then one clock; the failure, if any. */
function slowClock(sim: PartSim, c: string, m: string, a: string): ForbiddenCounterexample | undefined {
  const inputs = sim.build.machine.inputs;
  const zero = '0'.repeat(inputs.length);
  const clockFromZero = (): HandAction[] => clockActions(inputs, valuesOf(inputs, a), valuesOf(inputs, zero));
  const held = stateAtCode(sim, c, zero, m).values;
  const events: PartEvent[] = [];
  const to = [...a].map((x) => (x === '1' ? 1 : 0));
  setLeversInPlace(sim, held, 0, Array.from(sim.inputLevers), to, events);
  const moving = events.filter(isAlarm);
  if (moving.length > 0) return counterexample(inputs, c, m, a, clockFromZero().slice(0, -4), moving);
  const out = clockFrom(sim, held);
  return out.alarms.length > 0 ? counterexample(inputs, c, m, a, clockFromZero(), out.alarms) : undefined;
}

function counterexample(
  inputs: readonly string[],
  code: string,
  m: string,
  a: string,
  actions: HandAction[],
  alarms: PartEvent[],
): ForbiddenCounterexample {
  const where = `with the slaves at code ${code}${m !== code ? `, the masters at ${m}` : ''} and inputs ${describeInputs(inputs, a)}`;
  return {
    code,
    masterCode: m,
    inputs: a,
    actions,
    trace: describeTrace(actions),
    ...(alarms[0].latch ? { latch: alarms[0].latch } : {}),
    words: `${where}: ${alarms[0].words}`,
  };
}

/** Run actions on a copy of `values`; return the alarms. */
function runActions(sim: PartSim, values: Uint8Array, actions: readonly HandAction[]): PartEvent[] {
  const v = values.slice();
  const events: PartEvent[] = [];
  for (const a of actions) applyInPlace(sim, v, 0, a, events);
  return events.filter(isAlarm);
}
