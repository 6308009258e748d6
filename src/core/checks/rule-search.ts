/**
 * The operating-rule search of the forbidden-input check: per operating rule, the shortest
 * sequence of hand actions from the reset machine that breaks that rule (and no other) and
 * after which a latch sees the forbidden input, is left X, or the machine oscillates — what
 * signage and interlocks are designed from.
 *
 * Method: breadth-first search over machine states (lever positions and latch contents, and
 * whether the rule has been broken yet), each action one lever move settled on the part-level
 * simulator; bounded by `maxActions` actions and `maxStates` states.
 * A lever move's outcome depends only on the state it starts from (every value, and whether
 * the fast pass may start there), not on the rule searched nor on whether the rule is broken
 * yet, so the searches of one build share a memo of moves (`MoveMemo`): a state met again,
 * with the same values, takes the outcomes of its moves from the memo instead of settling
 * them again. The searches find exactly what each would find alone.
 */
import {
  describeAction,
  describeTrace,
  OPERATING_RULES,
  RULE_WORDS,
  ruleBroken,
  resetActions,
  type HandAction,
  type OperatingRule,
} from '../sim/hand.js';
import { latchKey } from '../sim/clocking.js';
import { isReady, moverFor } from '../sim/fast.js';
import { applyFastInPlace, latchLabel, powerUp, stepSim, type PartEvent, type PartSim } from '../sim/part.js';

/** The shortest way found of breaking one operating rule, and which latches it upsets. */
export interface RuleViolation {
  readonly rule: OperatingRule;
  /** Hand actions from the reset machine (the last one shows the upset). */
  readonly violation: readonly HandAction[];
  readonly trace: readonly string[];
  /** Latch names that see the forbidden input or are left X (empty when none within the bound). */
  readonly upsets: readonly string[];
  readonly words: string;
}

const UPSETS = new Set(['forbidden-input', 'latch-x', 'oscillation']);

const NO_EVENTS: readonly PartEvent[] = [];

/** A machine state met by the searches: its values, whether the fast pass may start there, and its moves once made. */
interface MemoNode {
  /** Lever positions and latch contents (`stateKey`). */
  readonly key: string;
  readonly values: Uint8Array;
  readonly ready: boolean;
  /** Per move (in `movesOf` order): the node it leads to, -1 until made. */
  readonly next: Int32Array;
  /** Per move: the events of kinds that upset a latch (empty for most). */
  readonly upsets: (readonly PartEvent[])[];
}

/** The moves from a state, and the state each leads to; each made once per build (see the module comment). */
class MoveMemo {
  private readonly nodes: MemoNode[] = [];
  /** Node ids by lever positions and latch contents (several when other values differ). */
  private readonly byKey = new Map<string, number[]>();
  private readonly scratch: Uint8Array;
  private readonly events: PartEvent[] = [];
  private readonly moveCount: number;

  constructor(private readonly sim: PartSim) {
    this.scratch = new Uint8Array(sim.driverCount);
    this.moveCount = sim.build.machine.inputs.length + 3;
  }

  /** The node of a state (made when new). */
  node(values: Uint8Array, ready: boolean): number {
    const key = stateKey(this.sim, values);
    const ids = this.byKey.get(key);
    for (const id of ids ?? []) {
      const n = this.nodes[id];
      if (n.ready === ready && sameValues(n.values, values)) return id;
    }
    const id = this.nodes.length;
    const n = this.moveCount;
    this.nodes.push({
      key,
      values: values.slice(),
      ready,
      next: new Int32Array(n).fill(-1),
      upsets: new Array<readonly PartEvent[]>(n),
    });
    if (ids) ids.push(id);
    else this.byKey.set(key, [id]);
    return id;
  }

  values(id: number): Uint8Array {
    return this.nodes[id].values;
  }

  key(id: number): string {
    return this.nodes[id].key;
  }

  /** Move k (action `a`, the k-th of `movesOf`) from node `id`: the node it leads to and the events that upset a latch. */
  move(id: number, k: number, a: HandAction): { readonly to: number; readonly upsets: readonly PartEvent[] } {
    const n = this.nodes[id];
    if (n.next[k] < 0) {
      const { sim, scratch, events } = this;
      scratch.set(n.values);
      if (events.length > 0) events.length = 0;
      applyFastInPlace(sim, scratch, 0, a, events, n.ready);
      const ready = moverFor(sim).ready;
      const upsets = events.filter((e) => UPSETS.has(e.kind));
      n.upsets[k] = upsets.length > 0 ? upsets : NO_EVENTS;
      n.next[k] = this.node(scratch, ready);
    }
    return { to: n.next[k], upsets: n.upsets[k] };
  }
}

/** Lever positions and latch contents: the part of a state the search tells states apart by. */
function stateKey(sim: PartSim, v: Uint8Array): string {
  let k = '';
  for (let d = 0; d < sim.leverCount; d++) k += v[d] === 1 ? '1' : '0';
  return k + latchKey(sim, v);
}

/** Byte-for-byte equality, four bytes at a time where both arrays allow it. */
function sameValues(a: Uint8Array, b: Uint8Array): boolean {
  if (a.length !== b.length) return false;
  let i = 0;
  if (a.byteOffset % 4 === 0 && b.byteOffset % 4 === 0) {
    const words = a.length >>> 2;
    const wa = new Int32Array(a.buffer, a.byteOffset, words);
    const wb = new Int32Array(b.buffer, b.byteOffset, words);
    for (let w = 0; w < words; w++) if (wa[w] !== wb[w]) return false;
    i = words << 2;
  }
  for (; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

/** Every lever move from a state: each input lever to its other position, then φ1, φ2 and reset likewise. */
function movesOf(sim: PartSim, v: Uint8Array, out: HandAction[]): HandAction[] {
  out.length = 0;
  sim.build.machine.inputs.forEach((name, k) =>
    out.push({ kind: 'input', input: name, value: v[sim.inputLevers[k]] === 1 ? 0 : 1 }),
  );
  for (const l of ['phi1', 'phi2', 'reset'] as const) {
    const d = l === 'phi1' ? sim.phi1 : l === 'phi2' ? sim.phi2 : sim.reset;
    out.push({ kind: v[d] === 1 ? 'release' : 'pull', lever: l });
  }
  return out;
}

/** Per operating rule, in OPERATING_RULES order, the shortest way of breaking it that upsets a latch. */
export function searchRules(sim: PartSim, maxActions: number, maxStates: number): RuleViolation[] {
  const memo = new MoveMemo(sim);
  let [start] = powerUp(sim);
  for (const a of resetActions()) start = stepSim(sim, start, a)[0];
  const root = memo.node(start.values, isReady(sim, start.values));
  return OPERATING_RULES.map((r) => searchRule(sim, memo, root, r, maxActions, maxStates));
}

/** Breadth-first search for the shortest action sequence breaking `rule` (and only it) that upsets a latch. */
function searchRule(
  sim: PartSim,
  memo: MoveMemo,
  root: number,
  rule: OperatingRule,
  maxActions: number,
  maxStates: number,
): RuleViolation {
  const moves: HandAction[] = [];
  const nodeOf: number[] = [root];
  const broken: boolean[] = [false];
  const parent: number[] = [-1];
  const via: (HandAction | null)[] = [null];
  const depth: number[] = [0];
  const keyOf = (node: number, b: boolean): string => (b ? '1' : '0') + memo.key(node);
  const seen = new Set([keyOf(root, false)]);
  const path = (i: number, last: HandAction): HandAction[] => {
    const out = [last];
    for (let j = i; parent[j] >= 0; j = parent[j]) out.unshift(via[j] as HandAction);
    return out;
  };
  let firstBreak: HandAction[] | undefined;
  for (let i = 0; i < nodeOf.length && nodeOf.length < maxStates; i++) {
    if (depth[i] >= maxActions) continue;
    const v = memo.values(nodeOf[i]);
    movesOf(sim, v, moves);
    const at = { phi1: v[sim.phi1] === 1, phi2: v[sim.phi2] === 1, reset: v[sim.reset] === 1 };
    for (let k = 0; k < moves.length; k++) {
      const a = moves[k];
      const r = ruleBroken(a, at);
      if (r !== null && r !== rule) continue;
      const b = broken[i] || r === rule;
      if (b && !firstBreak) firstBreak = path(i, a);
      const { to, upsets: upset } = memo.move(nodeOf[i], k, a);
      if (b && upset.length > 0) {
        const actions = path(i, a);
        const latches = [...new Set(upset.flatMap((e) => (e.latch ? [e.latch] : [])))];
        const words = `${RULE_WORDS[rule]}: breaking it (${actions.map(describeAction).join(', ')}) upsets ${latches.length > 0 ? latches.map(latchLabel).join(', ') : 'the machine'}: ${upset[0].words}`;
        return { rule, violation: actions, trace: describeTrace(actions), upsets: latches, words };
      }
      const key = keyOf(to, b);
      if (seen.has(key)) continue;
      seen.add(key);
      nodeOf.push(to);
      broken.push(b);
      parent.push(i);
      via.push(a);
      depth.push(depth[i] + 1);
    }
  }
  const actions = firstBreak ?? [];
  return {
    rule,
    violation: actions,
    trace: describeTrace(actions),
    upsets: [],
    words: `${RULE_WORDS[rule]}: no way of breaking it upsets a latch within ${maxActions} hand actions from the reset machine (${nodeOf.length} machine states searched)`,
  };
}
