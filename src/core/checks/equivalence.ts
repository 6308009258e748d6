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
 * Bound: up to `maxExhaustiveInputs` (16) inputs every combination is tried; beyond, one
 * combination per row cube of the spec states plus `samples` seeded random ones, and the
 * result says `inputs: 'sampled'` — then the check is a test, no longer a proof.
 * Preconditions: `build.machine` is the minimised machine with `build.encoding.codes` per
 * state; `spec.merged` maps every reachable original state to a minimised state by name.
 */
import { coverHolds } from '../model/cube.js';
import type { Build, CheckResult } from '../model/build.js';
import { DONT_CARE, rowFor, type FlatMachine } from '../model/flat.js';
import { seededRandom } from '../model/random.js';
import type { Profile } from '../physics/profile.js';
import { clockActions, describeTrace, resetActions, valuesOf, type HandAction } from '../sim/hand.js';
import { isAlarm, powerUp, show, simFor, slaveCode, stepSim, timingOf, type Trit } from '../sim/part.js';
import {
  clockFrom,
  describeInputs,
  EXHAUSTIVE_INPUTS,
  forEachHeld,
  grayAssignments,
  latchKey,
  sampledAssignments,
  type SpecInfo,
} from './clocking.js';

export interface EquivalenceOptions {
  /** Inputs up to which every combination is tried (default 16). */
  readonly maxExhaustiveInputs?: number;
  /** Random combinations per product state when sampling (default 64). */
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

export interface EquivalenceResult extends CheckResult {
  /** (product state, input combination) pairs explored. */
  readonly pairs: number;
  /** Distinct product states reached. */
  readonly states: number;
  readonly inputs: 'exhaustive' | 'sampled';
  /** False when `maxPairs` stopped the exploration. */
  readonly complete: boolean;
  readonly counterexample?: Counterexample;
}

export type { SpecInfo } from './clocking.js';

interface Node {
  readonly values: Uint8Array;
  readonly code: string;
  readonly outcomes: Map<string, { next: number; outputs: Trit[]; words?: string }>;
}

/** Check the build against its minimised machine and the machine as written. */
export function checkEquivalence(
  build: Build,
  spec: SpecInfo,
  profile: Pick<Profile, 'stageDelayS'>,
  opts: EquivalenceOptions = {},
): EquivalenceResult {
  const sim = simFor(build, timingOf(profile));
  const f = build.machine;
  const codes = build.encoding.codes;
  const orig = spec.original;
  const toMin = orig ? orig.states.map((s) => f.states.indexOf(spec.merged?.[s] ?? s)) : [];
  const n = f.inputs.length;
  const exhaustive = n <= (opts.maxExhaustiveInputs ?? EXHAUSTIVE_INPUTS);
  const never = [...f.never, ...(orig?.never ?? [])];
  const all = exhaustive ? grayAssignments(n).filter((a) => !coverHolds(never, a)) : [];
  const rnd = seededRandom(opts.seed ?? 1);
  const maxPairs = opts.maxPairs ?? 4_000_000;

  const nodes: Node[] = [];
  const nodeOf = new Map<string, number>();
  const addNode = (values: Uint8Array): number => {
    const key = latchKey(sim, values);
    let id = nodeOf.get(key);
    if (id === undefined) {
      id = nodes.length;
      nodeOf.set(key, id);
      nodes.push({ values, code: slaveCode(sim, values), outcomes: new Map() });
    }
    return id;
  };

  // Product states: node, minimised state, original state (-1: free), with the path back.
  const tNode: number[] = [];
  const tMin: number[] = [];
  const tOrig: number[] = [];
  const tParent: number[] = [];
  const tVia: string[] = [];
  const seen = new Set<string>();
  const add = (node: number, m: number, o: number, parent: number, via: string): void => {
    const key = `${node},${m},${o}`;
    if (seen.has(key)) return;
    seen.add(key);
    tNode.push(node);
    tMin.push(m);
    tOrig.push(o);
    tParent.push(parent);
    tVia.push(via);
  };

  let pairs = 0;
  const result = (
    ok: boolean,
    summary: string,
    counterexample?: Counterexample,
    complete = true,
  ): EquivalenceResult => ({
    name: 'equivalence',
    ok,
    summary,
    pairs,
    states: tNode.length,
    inputs: exhaustive ? 'exhaustive' : 'sampled',
    complete,
    ...(counterexample ? { counterexample } : {}),
  });

  let [s] = powerUp(sim);
  for (const a of resetActions()) {
    const [next, events] = stepSim(sim, s, a);
    s = next;
    const alarm = events.find(isAlarm);
    if (alarm)
      return result(false, `reset fails: ${alarm.words}`, trace(build, [], null, `reset fails: ${alarm.words}`));
  }
  const startCode = slaveCode(sim, s.values);
  if (startCode !== codes[f.start]) {
    const words = `reset leaves code ${startCode}, the start state '${f.states[f.start]}' has code ${codes[f.start]}`;
    return result(false, words, trace(build, [], null, words));
  }
  add(addNode(s.values), f.start, orig ? orig.start : -1, -1, '');

  const path = (t: number): string[] => {
    const out: string[] = [];
    for (let i = t; tParent[i] >= 0; i = tParent[i]) out.unshift(tVia[i]);
    return out;
  };
  const where = (t: number, a: string): string => {
    const node = nodes[tNode[t]];
    const m = tMin[t];
    const clocks = path(t).length;
    const name = m >= 0 ? `state '${f.states[m]}' (code ${node.code})` : `code ${node.code}`;
    return `after reset and ${clocks} clock${clocks === 1 ? '' : 's'}, in ${name} with ${describeInputs(f.inputs, a)}`;
  };
  const codeWords = (code: string): string => {
    const i = codes.indexOf(code);
    return i >= 0
      ? `'${f.states[i]}' (code ${code})`
      : `code ${code} (${code.includes('X') ? 'undetermined' : 'unused'})`;
  };

  for (let t = 0; t < tNode.length; t++) {
    const node = nodes[tNode[t]];
    const m = tMin[t];
    const o = tOrig[t];
    const tries = exhaustive ? all : sampled(t);
    let failure: Counterexample | undefined;
    forEachHeld(sim, node.values, tries, (held, a) => {
      if (!exhaustive && coverHolds(never, a)) return;
      pairs++;
      let out = node.outcomes.get(a);
      if (!out) {
        const c = clockFrom(sim, held);
        out = {
          next: addNode(c.values),
          outputs: c.outputs,
          ...(c.alarms.length > 0 ? { words: c.alarms.map((e) => e.words).join('; ') } : {}),
        };
        node.outcomes.set(a, out);
      }
      if (out.words) {
        failure = trace(build, path(t), a, `${where(t, a)}: ${out.words}`);
        return false;
      }
      const got = nodes[out.next].code;
      const sides: [FlatMachine, number, string, (next: number) => number][] = [[f, m, 'minimised machine', (x) => x]];
      if (orig && o >= 0) sides.push([orig, o, 'machine as written', (x) => toMin[x]]);
      const nextOf: number[] = [];
      for (const [machine, st, label, map] of sides) {
        if (st < 0) {
          nextOf.push(-1);
          continue;
        }
        const row = rowFor(machine, st, a);
        if (!row) {
          nextOf.push(-1);
          continue;
        }
        const k = row.out.findIndex((want, i) => want !== '-' && want !== out.outputs[i]);
        if (k >= 0) {
          const words = `${where(t, a)}: output '${f.outputs[k]}' shows ${show(out.outputs[k])}, the ${label} says ${row.out[k]}${label === 'machine as written' ? ` (its state '${machine.states[st]}')` : ''}`;
          failure = trace(build, path(t), a, words, true);
          return false;
        }
        if (row.next === DONT_CARE) {
          nextOf.push(-1);
          continue;
        }
        const target = map(row.next);
        if (target >= 0 && codes[target] !== got) {
          const words = `${where(t, a)}: the build goes to ${codeWords(got)}, the ${label} goes to ${codeWords(codes[target])}`;
          failure = trace(build, path(t), a, words);
          return false;
        }
        nextOf.push(row.next);
      }
      add(out.next, nextOf[0], orig && o >= 0 ? nextOf[1] : -1, t, a);
      return pairs < maxPairs;
    });
    if (failure) return result(false, failure.words, failure);
    if (pairs >= maxPairs)
      return result(
        true,
        `no difference in ${pairs} pairs, but the exploration stopped at its bound of ${maxPairs} pairs`,
        undefined,
        false,
      );
  }
  const how = exhaustive
    ? 'every input combination'
    : `one input combination per row cube plus ${opts.samples ?? 64} random ones per state (more than ${opts.maxExhaustiveInputs ?? EXHAUSTIVE_INPUTS} inputs: a test, not a proof)`;
  return result(
    true,
    `the build behaves as the ${orig ? 'minimised machine and the machine as written' : 'machine'} over ${tNode.length} reachable product states and ${how}`,
  );

  function sampled(t: number): string[] {
    const cubes = f.rows[tMin[t]]?.map((r) => r.cube) ?? [];
    const oc = orig && tOrig[t] >= 0 ? orig.rows[tOrig[t]].map((r) => r.cube) : [];
    return sampledAssignments([...cubes, ...oc], n, opts.samples ?? 64, rnd);
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
