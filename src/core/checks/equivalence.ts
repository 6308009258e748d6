/**
 * Equivalence of the built lever machine with its spec, at part level.
 *
 * Method: explicit product-machine exploration (the reachability check of two machines run
 * side by side; e.g. Z. Kohavi & N. K. Jha, *Switching and Finite Automata Theory*, 3rd ed.,
 * the machine-equivalence chapter — from memory). A product state is (the build's latch
 * contents, the minimised machine's state, the original machine's state); from each one,
 * every input combination not in `never` is applied by the two-phase hand procedure on the
 * part-level simulator. Outputs are compared while the inputs are held, before φ1, and the
 * slave code after φ2 with the code of the spec's next state, wherever the spec specifies
 * them (an unspecified next state frees that side of the product from then on). Any alarm
 * (forbidden input, X, oscillation) also fails the check.
 *
 * Bound: the input combinations are sim/assignments.ts's rule: up to `maxExhaustiveInputs`
 * (16) inputs every combination is tried; beyond, per product state one combination per row
 * cube of its two spec states plus `samples` (256) seeded random ones, and the result says
 * `inputs: 'sampled'` — then the check is a test, no longer a proof.
 * Preconditions: `build.machine` is the minimised machine with `build.encoding.codes` per
 * state; `spec.merged` maps every reachable original state to a minimised state by name.
 */
import type { Build, CheckBase } from '../model/build.js';
import { DONT_CARE, rowFor, type FlatMachine } from '../model/flat.js';
import { seededRandom, type Random } from '../model/random.js';
import type { Profile } from '../physics/profile.js';
import {
  describeInputs,
  inputAssignments,
  isExhaustive,
  SAMPLED_INPUTS,
  EXHAUSTIVE_INPUTS,
  type InputSpace,
} from '../sim/assignments.js';
import { clockFrom, forEachHeld, latchKey } from '../sim/clocking.js';
import { clockActions, describeTrace, resetActions, valuesOf, type HandAction } from '../sim/hand.js';
import { isAlarm, powerUp, show, simFor, slaveCode, stepSim, timingOf, type PartSim, type Trit } from '../sim/part.js';
import type { SpecInfo } from './spec.js';

export interface EquivalenceOptions {
  /** Inputs up to which every combination is tried (default 16). */
  readonly maxExhaustiveInputs?: number;
  /** Random combinations per product state when sampling (default 256). */
  readonly samples?: number;
  readonly seed?: number;
  /** Stop after this many (product state, input) pairs (default 4 000 000). */
  readonly maxPairs?: number;
}

/** A hand-action trace from power-up that shows a failure, and what went wrong in words. */
export interface Counterexample {
  readonly actions: readonly HandAction[];
  readonly trace: readonly string[];
  readonly words: string;
}

export interface EquivalenceResult extends CheckBase<'equivalence'> {
  /** (product state, input combination) pairs explored. */
  readonly pairs: number;
  /** Distinct product states reached. */
  readonly states: number;
  readonly inputs: 'exhaustive' | 'sampled';
  /** False when `maxPairs` stopped the exploration. */
  readonly complete: boolean;
  readonly counterexample?: Counterexample;
}

export type { SpecInfo } from './spec.js';

/** Check the build against its minimised machine and the machine as written. */
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
        `no difference in ${x.pairs} pairs, but the exploration stopped at its bound of ${maxPairs} pairs`,
        undefined,
        false,
      );
  }
  const how = x.exhaustive
    ? 'every input combination'
    : `one input combination per row cube plus ${opts.samples ?? SAMPLED_INPUTS} random ones per state (more than ${opts.maxExhaustiveInputs ?? EXHAUSTIVE_INPUTS} inputs: a test, not a proof)`;
  return x.result(
    true,
    `the build behaves as the ${spec.original ? 'minimised machine and the machine as written' : 'machine'} over ${x.size} reachable product states and ${how}`,
  );
}

/** A distinct latch content of the build, with the clocks already simulated from it. */
interface Node {
  readonly values: Uint8Array;
  readonly code: string;
  readonly outcomes: Map<string, Outcome>;
}

/** One clock from a node with some inputs: the node it leads to, the outputs shown, the alarms in words. */
interface Outcome {
  readonly next: number;
  readonly outputs: Trit[];
  readonly words?: string;
}

/** One side of the product: a spec machine, its state, and how its states map onto the minimised machine's. */
interface Side {
  readonly machine: FlatMachine;
  readonly state: number;
  readonly label: 'minimised machine' | 'machine as written';
  readonly toMin: (next: number) => number;
}

/** The product-machine exploration: nodes of the build, product states with the path back to reset. */
class Explorer {
  readonly exhaustive: boolean;
  pairs = 0;
  private readonly f: FlatMachine;
  private readonly orig?: FlatMachine;
  private readonly toMin: number[];
  private readonly codes: readonly string[];
  private readonly never: readonly string[];
  private readonly all: readonly string[];
  private readonly rnd: Random;
  private readonly nodes: Node[] = [];
  private readonly nodeOf = new Map<string, number>();
  // Product states: node, minimised state, original state (-1: free), with the path back.
  private readonly tNode: number[] = [];
  private readonly tMin: number[] = [];
  private readonly tOrig: number[] = [];
  private readonly tParent: number[] = [];
  private readonly tVia: string[] = [];
  private readonly seen = new Set<string>();

  constructor(
    private readonly build: Build,
    spec: SpecInfo,
    private readonly sim: PartSim,
    private readonly opts: EquivalenceOptions,
  ) {
    this.f = build.machine;
    this.orig = spec.original;
    this.toMin = this.orig ? this.orig.states.map((s) => this.f.states.indexOf(spec.merged?.[s] ?? s)) : [];
    this.codes = build.encoding.codes;
    this.never = [...this.f.never, ...(this.orig?.never ?? [])];
    this.exhaustive = isExhaustive(this.f.inputs.length, opts);
    this.rnd = seededRandom(opts.seed ?? 1);
    this.all = this.exhaustive ? this.assignments([]) : [];
  }

  /** Product states reached so far. */
  get size(): number {
    return this.tNode.length;
  }

  result(ok: boolean, summary: string, counterexample?: Counterexample, complete = true): EquivalenceResult {
    return {
      name: 'equivalence',
      ok,
      summary,
      pairs: this.pairs,
      states: this.tNode.length,
      inputs: this.exhaustive ? 'exhaustive' : 'sampled',
      complete,
      ...(counterexample ? { counterexample } : {}),
    };
  }

  /** Reset from power-up; the start product state, or why reset fails. */
  start(): Counterexample | undefined {
    const { sim, f, codes } = this;
    let [s] = powerUp(sim);
    for (const a of resetActions()) {
      const [next, events] = stepSim(sim, s, a);
      s = next;
      const alarm = events.find(isAlarm);
      if (alarm) return trace(this.build, [], null, `reset fails: ${alarm.words}`);
    }
    const startCode = slaveCode(sim, s.values);
    if (startCode !== codes[f.start])
      return trace(
        this.build,
        [],
        null,
        `reset leaves code ${startCode}, the start state '${f.states[f.start]}' has code ${codes[f.start]}`,
      );
    this.add(this.addNode(s.values), f.start, this.orig ? this.orig.start : -1, -1, '');
    return undefined;
  }

  /** Every input combination from product state t; the first difference, if any. */
  exploreFrom(t: number, maxPairs: number): Counterexample | undefined {
    const node = this.nodes[this.tNode[t]];
    let failure: Counterexample | undefined;
    forEachHeld(this.sim, node.values, this.exhaustive ? this.all : this.sampled(t), (held, a) => {
      this.pairs++;
      const out = this.outcome(node, held, a);
      failure = out.words
        ? trace(this.build, this.path(t), a, `${this.where(t, a)}: ${out.words}`)
        : this.compare(t, a, out);
      return failure === undefined && this.pairs < maxPairs;
    });
    return failure;
  }

  /** The clock from `node` with inputs `a` (simulated once per node and inputs). */
  private outcome(node: Node, held: Uint8Array, a: string): Outcome {
    let out = node.outcomes.get(a);
    if (!out) {
      const c = clockFrom(this.sim, held);
      out = {
        next: this.addNode(c.values),
        outputs: c.outputs,
        ...(c.alarms.length > 0 ? { words: c.alarms.map((e) => e.words).join('; ') } : {}),
      };
      node.outcomes.set(a, out);
    }
    return out;
  }

  /** Compare a clock's outputs and next code with each spec side; add the next product state when they agree. */
  private compare(t: number, a: string, out: Outcome): Counterexample | undefined {
    const got = this.nodes[out.next].code;
    const nextOf: number[] = [];
    for (const side of this.sides(t)) {
      const row = side.state < 0 ? undefined : rowFor(side.machine, side.state, a);
      if (!row) {
        nextOf.push(-1);
        continue;
      }
      const k = row.out.findIndex((want, i) => want !== '-' && want !== out.outputs[i]);
      if (k >= 0) {
        const its = side.label === 'machine as written' ? ` (its state '${side.machine.states[side.state]}')` : '';
        const words = `${this.where(t, a)}: output '${this.f.outputs[k]}' shows ${show(out.outputs[k])}, the ${side.label} says ${row.out[k]}${its}`;
        return trace(this.build, this.path(t), a, words, true);
      }
      if (row.next === DONT_CARE) {
        nextOf.push(-1);
        continue;
      }
      const target = side.toMin(row.next);
      if (target >= 0 && this.codes[target] !== got) {
        const words = `${this.where(t, a)}: the build goes to ${this.codeWords(got)}, the ${side.label} goes to ${this.codeWords(this.codes[target])}`;
        return trace(this.build, this.path(t), a, words);
      }
      nextOf.push(row.next);
    }
    const o = this.tOrig[t];
    this.add(out.next, nextOf[0], this.orig && o >= 0 ? nextOf[1] : -1, t, a);
    return undefined;
  }

  /** The spec sides of product state t: the minimised machine, and the machine as written while it is bound. */
  private sides(t: number): Side[] {
    const sides: Side[] = [{ machine: this.f, state: this.tMin[t], label: 'minimised machine', toMin: (x) => x }];
    const o = this.tOrig[t];
    if (this.orig && o >= 0)
      sides.push({ machine: this.orig, state: o, label: 'machine as written', toMin: (x) => this.toMin[x] });
    return sides;
  }

  private assignments(cubes: readonly string[]): readonly string[] {
    const space: InputSpace = { inputs: this.f.inputs.length, cubes, never: this.never };
    return inputAssignments(space, this.rnd, this.opts).list;
  }

  /** Sampled combinations for product state t: one per row cube of its two spec states, plus random ones. */
  private sampled(t: number): readonly string[] {
    const cubes = this.f.rows[this.tMin[t]]?.map((r) => r.cube) ?? [];
    const o = this.tOrig[t];
    const oc = this.orig && o >= 0 ? this.orig.rows[o].map((r) => r.cube) : [];
    return this.assignments([...cubes, ...oc]);
  }

  private addNode(values: Uint8Array): number {
    const key = latchKey(this.sim, values);
    let id = this.nodeOf.get(key);
    if (id === undefined) {
      id = this.nodes.length;
      this.nodeOf.set(key, id);
      this.nodes.push({ values, code: slaveCode(this.sim, values), outcomes: new Map() });
    }
    return id;
  }

  private add(node: number, m: number, o: number, parent: number, via: string): void {
    const key = `${node},${m},${o}`;
    if (this.seen.has(key)) return;
    this.seen.add(key);
    this.tNode.push(node);
    this.tMin.push(m);
    this.tOrig.push(o);
    this.tParent.push(parent);
    this.tVia.push(via);
  }

  /** Input combinations of the clocks from reset to product state t. */
  private path(t: number): string[] {
    const out: string[] = [];
    for (let i = t; this.tParent[i] >= 0; i = this.tParent[i]) out.unshift(this.tVia[i]);
    return out;
  }

  private where(t: number, a: string): string {
    const node = this.nodes[this.tNode[t]];
    const m = this.tMin[t];
    const clocks = this.path(t).length;
    const name = m >= 0 ? `state '${this.f.states[m]}' (code ${node.code})` : `code ${node.code}`;
    return `after reset and ${clocks} clock${clocks === 1 ? '' : 's'}, in ${name} with ${describeInputs(this.f.inputs, a)}`;
  }

  private codeWords(code: string): string {
    const i = this.codes.indexOf(code);
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
