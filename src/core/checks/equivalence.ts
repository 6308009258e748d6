/**
 * The build behaves as the machine as written: from the start, on every input sequence, the
 * build shows every output the machine as written specifies, and its state code always stands
 * for a state compatible with the written one.
 *
 * Method: explicit exploration of pairs (a state of the machine as written, a content of the
 * build's latches) — the product machine of a specification and an implementation run side by
 * side (e.g. Z. Kohavi & N. K. Jha, *Switching and Finite Automata Theory*, 3rd ed., the
 * machine-equivalence chapter — from memory), taken for an incompletely specified
 * specification. From the pair (start state, the latches after reset), every input combination
 * not in `never` is applied by the two-phase hand procedure on the part-level simulator. Where
 * the written row specifies an output, the build's output (read while the inputs are held,
 * before φ1) must agree. Where it specifies a next state, the build's next code must be the
 * code of a state of the minimised machine that is compatible with that next state
 * (compatibility.ts: Paull and Unger's relation), and the exploration goes on from the new
 * pair; where it leaves the next state free nothing later is specified, so that branch ends.
 * A compatible-state reduction may send the machine to any compatible state, which is why the
 * pairs are explored rather than a fixed map from written states to reduced ones. Any alarm
 * (forbidden input, X, oscillation) also fails the check. Without a machine as written the
 * build is checked against its own (minimised) machine in the same way.
 *
 * The clocks run 32 at a time on the bit-parallel simulator (sim/sweep.ts), each clock the
 * lanes cannot vouch for again on the event-driven one; a build's clocks from one latch content
 * are simulated once (up to 64 MB of kept results) and shared by every pair that holds it.
 * Bound: the input combinations are sim/assignments.ts's rule: up to `maxExhaustiveInputs`
 * (16) inputs every combination is tried; beyond, per pair one combination per row cube of
 * its written state plus `samples` (256) seeded random ones, and the result says
 * `inputs: 'sampled'` — then the check is a test, no longer a proof.
 * Preconditions: `build.machine` is the minimised machine with `build.encoding.codes` per
 * state; `spec.original`, when given, is the machine it was minimised from.
 */
import type { Build, CheckBase } from '../model/build.js';
import { DONT_CARE, rowFor, type FlatMachine, type FlatRow } from '../model/flat.js';
import { seededRandom, type Random } from '../model/random.js';
import { counted } from '../model/words.js';
import type { Profile } from '../physics/profile.js';
import {
  describeInputs,
  inputAssignments,
  isExhaustive,
  SAMPLED_INPUTS,
  EXHAUSTIVE_INPUTS,
  type InputSpace,
} from '../sim/assignments.js';
import { clockFrom } from '../sim/clocking.js';
import { clockActions, describeTrace, resetActions, valuesOf, type HandAction } from '../sim/hand.js';
import {
  isAlarm,
  latchesOf,
  powerUp,
  show,
  simFor,
  slaveCode,
  stateAtLatches,
  stepSim,
  timingOf,
  X,
  type PartSim,
  type Trit,
} from '../sim/part.js';
import { LaneBatch } from '../sim/lanes.js';
import { batchKey, sweep } from '../sim/sweep.js';
import { Compatibility } from './compatibility.js';
import type { SpecInfo } from './spec.js';

export interface EquivalenceOptions {
  /** Inputs up to which every combination is tried (default 16). */
  readonly maxExhaustiveInputs?: number;
  /** Random combinations per pair when sampling (default 256). */
  readonly samples?: number;
  readonly seed?: number;
  /** Stop after this many (pair, input) steps (default 4 000 000). */
  readonly maxPairs?: number;
}

/** A hand-action trace from power-up that shows a failure, and what went wrong in words. */
export interface Counterexample {
  readonly actions: readonly HandAction[];
  readonly trace: readonly string[];
  readonly words: string;
}

export interface EquivalenceResult extends CheckBase<'equivalence'> {
  /** (pair, input combination) steps explored. */
  readonly pairs: number;
  /** Distinct pairs (state as written, build latch content) reached. */
  readonly states: number;
  readonly inputs: 'exhaustive' | 'sampled';
  /** False when `maxPairs` stopped the exploration. */
  readonly complete: boolean;
  readonly counterexample?: Counterexample;
}

export type { SpecInfo } from './spec.js';

/** Check the build against the machine as written (or, without one, its own machine). */
export function checkEquivalence(
  build: Build,
  spec: SpecInfo,
  profile: Pick<Profile, 'stageDelayS'>,
  opts: EquivalenceOptions = {},
): EquivalenceResult {
  const x = new Explorer(build, spec, simFor(build, timingOf(profile)), opts);
  const resetFailure = x.start();
  if (resetFailure) return x.result(false, resetFailure.words, resetFailure);
  const maxPairs = opts.maxPairs ?? 4_000_000;
  for (let t = 0; t < x.size; t++) {
    const failure = x.exploreFrom(t, maxPairs);
    if (failure) return x.result(false, failure.words, failure);
    if (x.pairs >= maxPairs)
      return x.result(
        true,
        `no difference in ${x.pairs} steps, but the exploration stopped at its bound of ${maxPairs}`,
        undefined,
        false,
      );
  }
  const how = x.exhaustive
    ? 'every input combination'
    : `one input combination per row cube plus ${opts.samples ?? SAMPLED_INPUTS} random ones per pair (more than ${opts.maxExhaustiveInputs ?? EXHAUSTIVE_INPUTS} inputs: a test, not a proof)`;
  const what = spec.original ? 'machine as written, wherever it is specified,' : 'machine';
  return x.result(
    true,
    `the build behaves as the ${what} over ${counted(x.size, 'reachable pair')} (state, build code) and ${how}`,
  );
}

/** A distinct content of the build's latches. */
interface Node {
  /** Q and Q̄ of every latch (part.ts's latchesOf layout). */
  readonly latches: Uint8Array;
  readonly code: string;
  /** Its clocks, once simulated for every combination of the exhaustive list (null until then). */
  clocks: Clocks | null;
}

/** The clocks from one node, one per input combination of a list. */
interface Clocks {
  /** The node each clock leads to. */
  readonly next: Int32Array;
  /** The outputs shown while the inputs are held (before φ1), outputs.length per clock. */
  readonly outputs: Uint8Array;
  /** The alarms of the clocks that raised one, in words. */
  readonly alarms: Map<number, string>;
}

/** Bound on the bytes of clock results kept for sharing between pairs (node × combination × (4 + outputs)). */
const KEPT_BYTES = 1 << 26;

/** The pair exploration: nodes of the build, pairs with the path back to reset. */
class Explorer {
  readonly exhaustive: boolean;
  pairs = 0;
  private readonly f: FlatMachine;
  /** The machine the build is checked against: as written, or the build's own. */
  private readonly spec: FlatMachine;
  private readonly label: 'minimised machine' | 'machine as written';
  private readonly compat: Compatibility;
  private readonly stateOfCode: Map<string, number>;
  private readonly never: readonly string[];
  private readonly all: readonly string[];
  private readonly rnd: Random;
  private readonly nodes: Node[] = [];
  private readonly nodeOf = new Map<string, number>();
  private kept = 0;
  // Pairs: spec state, node, with the path back.
  private readonly pState: number[] = [];
  private readonly pNode: number[] = [];
  private readonly pParent: number[] = [];
  private readonly pVia: string[] = [];
  private readonly seen = new Set<string>();
  /** One batch of lanes for every sweep (its words are as long as the netlist). */
  private readonly batch: LaneBatch;

  constructor(
    private readonly build: Build,
    spec: SpecInfo,
    private readonly sim: PartSim,
    private readonly opts: EquivalenceOptions,
  ) {
    this.f = build.machine;
    this.spec = spec.original ?? this.f;
    this.label = spec.original ? 'machine as written' : 'minimised machine';
    this.compat = new Compatibility(this.spec, this.f);
    this.stateOfCode = new Map(build.encoding.codes.map((c, i) => [c, i]));
    this.never = [...this.f.never, ...(spec.original?.never ?? [])];
    this.exhaustive = isExhaustive(this.f.inputs.length, opts);
    this.rnd = seededRandom(opts.seed ?? 1);
    this.all = this.exhaustive ? this.assignments([]) : [];
    this.batch = new LaneBatch(sim);
  }

  /** Pairs reached so far. */
  get size(): number {
    return this.pState.length;
  }

  result(ok: boolean, summary: string, counterexample?: Counterexample, complete = true): EquivalenceResult {
    return {
      name: 'equivalence',
      ok,
      summary,
      pairs: this.pairs,
      states: this.pState.length,
      inputs: this.exhaustive ? 'exhaustive' : 'sampled',
      complete,
      ...(counterexample ? { counterexample } : {}),
    };
  }

  /** Reset from power-up; the start pair, or why reset fails. */
  start(): Counterexample | undefined {
    const { sim, f } = this;
    let [s] = powerUp(sim);
    for (const a of resetActions()) {
      const [next, events] = stepSim(sim, s, a);
      s = next;
      const alarm = events.find(isAlarm);
      if (alarm) return trace(this.build, [], null, `reset fails: ${alarm.words}`);
    }
    const startCode = slaveCode(sim, s.values);
    const codes = this.build.encoding.codes;
    if (startCode !== codes[f.start])
      return trace(
        this.build,
        [],
        null,
        `reset leaves code ${startCode}, the start state '${f.states[f.start]}' has code ${codes[f.start]}`,
      );
    if (!this.compat.compatible(this.spec.start, f.start))
      return trace(
        this.build,
        [],
        null,
        `reset leaves '${f.states[f.start]}' (code ${startCode}), which cannot stand for the start state '${this.spec.states[this.spec.start]}' of the ${this.label}${this.why(this.spec.start, f.start)}`,
      );
    this.add(this.spec.start, this.addNode(latchesOf(sim, s.values)), -1, '');
    return undefined;
  }

  /** Every input combination from pair t; the first difference, if any. */
  exploreFrom(t: number, maxPairs: number): Counterexample | undefined {
    const node = this.pNode[t];
    const list = this.exhaustive ? this.all : this.sampled(t);
    const clocks = this.exhaustive ? this.sharedClocks(node) : this.simulate(node, list);
    for (let i = 0; i < list.length && this.pairs < maxPairs; i++) {
      this.pairs++;
      const failure = this.compare(t, list[i], clocks, i);
      if (failure) return failure;
    }
    return undefined;
  }

  /** Compare one clock with the spec state's row; add the next pair when they agree. */
  private compare(t: number, a: string, clocks: Clocks, i: number): Counterexample | undefined {
    const row = rowFor(this.spec, this.pState[t], a);
    if (!row) return undefined; // in the spec's `never` set
    const alarm = clocks.alarms.get(i);
    if (alarm !== undefined) return trace(this.build, this.path(t), a, `${this.where(t, a)}: ${alarm}`);
    const n = this.f.outputs.length;
    for (let k = 0; k < n; k++) {
      const want = row.out[k];
      const got = clocks.outputs[i * n + k];
      if (want !== '-' && want !== got) {
        const its = this.label === 'machine as written' ? ` (its state '${this.spec.states[this.pState[t]]}')` : '';
        const words = `${this.where(t, a)}: output '${this.f.outputs[k]}' shows ${show(got)}, the ${this.label} says ${want}${its}`;
        return trace(this.build, this.path(t), a, words, true);
      }
    }
    if (row.next === DONT_CARE) return undefined;
    const next = clocks.next[i];
    const m = this.stateOfCode.get(this.nodes[next].code) ?? -1;
    if (m < 0 || !this.compat.compatible(row.next, m)) return this.nextFailure(t, a, row, next, m);
    this.add(row.next, next, t, a);
    return undefined;
  }

  /** The build's next node (the state m of its code, -1 for an unused or undetermined one) cannot stand for the row's next state. */
  private nextFailure(t: number, a: string, row: FlatRow, next: number, m: number): Counterexample {
    const got = this.nodes[next].code;
    const target =
      this.label === 'minimised machine'
        ? this.codeWords(this.build.encoding.codes[row.next])
        : `'${this.spec.states[row.next]}'`;
    const why =
      m >= 0 && this.label === 'machine as written'
        ? `, which '${this.f.states[m]}' cannot stand for${this.why(row.next, m)}`
        : '';
    const words = `${this.where(t, a)}: the build goes to ${this.codeWords(got)}, the ${this.label} goes to ${target}${why}`;
    return trace(this.build, this.path(t), a, words);
  }

  /** ": from there, inputs … make the machine as written show z=1 where 'm' shows 0" — why m cannot stand for spec state o. */
  private why(o: number, m: number): string {
    const w = this.compat.witness(o, m);
    if (!w) return '';
    const steps = w.inputs.map((a) => describeInputs(this.f.inputs, a)).join(', then ');
    const out = this.f.outputs[w.output];
    return `: from there, ${steps} make${w.inputs.length === 1 ? 's' : ''} the ${this.label} show ${out}=${w.a} where '${this.f.states[m]}' shows ${w.b}`;
  }

  /** The clocks from a node for the exhaustive list, simulated once and kept while memory allows. */
  private sharedClocks(node: number): Clocks {
    const n = this.nodes[node];
    if (n.clocks) return n.clocks;
    const clocks = this.simulate(node, this.all);
    const bytes = this.all.length * (4 + this.f.outputs.length);
    if (this.kept + bytes <= KEPT_BYTES) {
      n.clocks = clocks;
      this.kept += bytes;
    }
    return clocks;
  }

  /** One clock from `node` with each input combination of `list`. */
  private simulate(node: number, list: readonly string[]): Clocks {
    const sim = this.sim;
    const start = this.nodes[node].latches;
    const outs = this.f.outputs.length;
    const clocks: Clocks = {
      next: new Int32Array(list.length),
      outputs: new Uint8Array(list.length * outs),
      alarms: new Map(),
    };
    sweep<Trit[]>(
      sim,
      list.length,
      {
        setUp: (b, lane, i) => {
          b.setLatches(lane, start);
          b.setInputs(lane, list[i]);
        },
        // The exhaustive list's clocks are the same as other checks' from the same latches (sim/sweep.ts).
        recordKey: (first, n) => (list === this.all ? batchKey(start, list, first, n) : undefined),
        held: (b, lane) => b.outputs(lane),
        done: (i, b, lane, shown) => {
          clocks.outputs.set(shown ?? [], i * outs);
          clocks.next[i] = this.addNode(b.latchesOf(lane));
        },
        slow: (i) => {
          const c = clockFrom(sim, stateAtLatches(sim, start, list[i]).values);
          clocks.outputs.set(c.outputs, i * outs);
          clocks.next[i] = this.addNode(latchesOf(sim, c.values));
          if (c.alarms.length > 0) clocks.alarms.set(i, c.alarms.map((e) => e.words).join('; '));
        },
      },
      this.batch,
    );
    return clocks;
  }

  private assignments(cubes: readonly string[]): readonly string[] {
    const space: InputSpace = { inputs: this.f.inputs.length, cubes, never: this.never };
    return inputAssignments(space, this.rnd, this.opts).list;
  }

  /** Sampled combinations for pair t: one per row cube of its spec state, plus random ones. */
  private sampled(t: number): readonly string[] {
    return this.assignments(this.spec.rows[this.pState[t]].map((r) => r.cube));
  }

  private addNode(latches: Uint8Array): number {
    let key = '';
    for (let i = 0; i < latches.length; i += 2) key += String.fromCharCode(48 + latches[i] * 3 + latches[i + 1]);
    let id = this.nodeOf.get(key);
    if (id === undefined) {
      id = this.nodes.length;
      this.nodeOf.set(key, id);
      const sim = this.sim;
      let code = '';
      for (let b = 0; b < sim.slaves.length; b++) {
        const li = sim.slaves[b];
        const q = latches[2 * li];
        code += q === X || q === latches[2 * li + 1] ? 'X' : String(q);
      }
      this.nodes.push({ latches, code, clocks: null });
    }
    return id;
  }

  private add(state: number, node: number, parent: number, via: string): void {
    const key = `${state},${node}`;
    if (this.seen.has(key)) return;
    this.seen.add(key);
    this.pState.push(state);
    this.pNode.push(node);
    this.pParent.push(parent);
    this.pVia.push(via);
  }

  /** Input combinations of the clocks from reset to pair t. */
  private path(t: number): string[] {
    const out: string[] = [];
    for (let i = t; this.pParent[i] >= 0; i = this.pParent[i]) out.unshift(this.pVia[i]);
    return out;
  }

  private where(t: number, a: string): string {
    const code = this.nodes[this.pNode[t]].code;
    const clocks = this.path(t).length;
    const name = `state '${this.spec.states[this.pState[t]]}' (code ${code})`;
    return `after reset and ${clocks} clock${clocks === 1 ? '' : 's'}, in ${name} with ${describeInputs(this.f.inputs, a)}`;
  }

  private codeWords(code: string): string {
    const i = this.stateOfCode.get(code) ?? -1;
    return i >= 0
      ? `'${this.f.states[i]}' (code ${code})`
      : `code ${code} (${code.includes('X') ? 'undetermined' : 'unused'})`;
  }
}

/** The hand-action trace from power-up: reset, the clocks of `path`, then the failing clock (inputs only when an output was wrong). */
function trace(
  build: Build,
  path: readonly string[],
  failing: string | null,
  words: string,
  inputsOnly = false,
): Counterexample {
  const inputs = build.machine.inputs;
  const actions: HandAction[] = resetActions();
  let current = valuesOf(inputs, '0'.repeat(inputs.length));
  for (const a of failing === null ? path : [...path, failing]) {
    const values = valuesOf(inputs, a);
    actions.push(...clockActions(inputs, values, current));
    current = values;
  }
  if (inputsOnly) actions.splice(actions.length - 4, 4);
  return { actions, trace: describeTrace(actions), words };
}
