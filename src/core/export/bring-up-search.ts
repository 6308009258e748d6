/**
 * The check of each bring-up stage: for every gate the stage mounts, a short hand sequence
 * after which its Z lever stands up and one after which it stands down, found on the partial
 * machine (only the parts mounted and the branches tied so far: a port whose cords are not all
 * tied sees only the tied ones, so with none pulling it rests up).
 *
 * Method: breadth-first search over the partial machine's hand actions from power-up (every
 * lever released, every latch undetermined), stepped by the part-level simulator
 * (sim/part.ts); the same product-of-states justification as sequential test generation
 * (M. Abramovici, M. A. Breuer & A. D. Friedman, *Digital Systems Testing and Testable
 * Design*, 1990, ch. 8 — from memory). A move is one lever pulled or released (an operator
 * lever, φ1, φ2, reset); a move that breaks an operating rule (sim/hand.ts), raises any
 * alarm of the simulator (a forbidden latch input, a latch left undetermined, an oscillation)
 * or leaves a latch whose two ports may both be pulled (each 0 or undetermined) is never
 * taken, so every sequence is one a person may make and gives one outcome. Positions
 * are told apart by every lever and gate value, so a search is exhaustive within its bound:
 * at most SEARCH_ACTIONS moves and SEARCH_POSITIONS positions per stage. Starting from the
 * undetermined latches of power-up makes each sequence hold whatever the latches held before.
 * A position not seen at a gate's own stage is looked for again at every later stage, and
 * reported there ("seen only once stage N is mounted") or, at the end, as not seen.
 * Beside the sound machine, one machine per tie of the stage come loose (the untied fault of
 * sim/faults.ts) is stepped along the same paths, and a position is new when any of them stands
 * differently (the product of their states), so the trials also show each tie that can be shown
 * come loose; the first trial after which a loose machine's Z levers differ from the sound one's
 * (both determined) is reported per tie.
 *
 * Postconditions: every sighting names a sequence that, stepped from power-up on that stage's
 * partial machine, leaves the gate's Z lever where it says; nothing is reported that the
 * search did not reach. Deterministic (the moves are tried in a fixed order: the input levers
 * in the machine's order, then φ1, φ2, reset).
 */
import type { Build } from '../model/build.js';
import type { Cord } from '../model/netlist.js';
import type { Profile } from '../physics/profile.js';
import { faultInjector, type CordFault } from '../sim/faults.js';
import { ruleBroken, type HandAction } from '../sim/hand.js';
import { andOf } from '../sim/settle.js';
import { applyInPlace, compilePart, isAlarm, powerUp, timingOf, X, type PartEvent, type PartSim } from '../sim/part.js';
import { branchId, type Branch, type MountStage } from './bring-up-stages.js';

/** The most hand actions in a check's sequence. */
export const SEARCH_ACTIONS = 24;
/** The most machine positions one stage's search visits. */
export const SEARCH_POSITIONS = 4000;
/**
 * The work the searches of all stages do together, in lever-or-gate steps: a build of D levers
 * and gates tries at most PLAN_WORK / D moves of the simulator (each move of the sound machine
 * and of each loose one counts), shared out among the stages still to search, so a large build
 * gets a shorter search per stage rather than a long wait for its documents.
 */
export const PLAN_WORK = 6_000_000;
/**
 * The work of reading every stage's trials on the machine with each of its ties come loose, in
 * lever-or-gate steps: at most LOOSE_WORK / D steps (a power-up or a hand action) for a build of
 * D levers and gates; past it a tie is left not simulated, and the sheet says so.
 */
export const LOOSE_WORK = 3_000_000;

/** Where a Z lever stands: down when its gate's output is 1; '?' when the machine cannot tell. */
export type ZPosition = 'up' | 'down' | '?';

/** A hand sequence from power-up and where every Z lever mounted so far stands after it. */
export interface Trial {
  readonly actions: readonly HandAction[];
  /** Every gate mounted so far, in mounting order, and its Z lever after the actions. */
  readonly positions: readonly { readonly gate: string; readonly z: ZPosition }[];
}

/** Where a position is shown: the stage whose check shows it and the trial there (from 0). */
export interface Sighting {
  readonly stage: number;
  readonly trial: number;
}

/** The check of one gate: the trial that shows its Z up and the one that shows it down (null: not seen). */
export interface GateCheck {
  readonly gate: string;
  readonly up: Sighting | null;
  readonly down: Sighting | null;
}

/** How far a stage's search went. */
export interface SearchReach {
  /** Positions visited. */
  readonly positions: number;
  /** Moves tried. */
  readonly moves: number;
  /** The bound on moves. */
  readonly actions: number;
  /** Every position within the bound on moves was visited (not cut by SEARCH_POSITIONS or the stage's share of PLAN_WORK, nor stopped once all was found). */
  readonly complete: boolean;
}

/**
 * Whether the stage's check shows one of its ties come loose: the first trial after which some Z
 * lever mounted so far stands otherwise than the trial says (both positions determined), null
 * when none does; `simulated` false when LOOSE_WORK ran out before this tie.
 */
export interface LooseTie {
  readonly tie: Branch;
  readonly shownBy: number | null;
  readonly simulated: boolean;
}

/** The check of a stage: its trials, per gate it mounts where each Z position is seen, and per tie whether a trial shows it loose. */
export interface StageChecks {
  readonly trials: readonly Trial[];
  readonly checks: readonly GateCheck[];
  /** One per tie of the stage, in its order (empty for the frame and lever stages). */
  readonly loose: readonly LooseTie[];
  /** The search (null for the frame and lever stages, which have no gate). */
  readonly search: SearchReach | null;
}

/** The partial machine: the build with only the given branches tied (every other part stands alone, untied). */
export function partialBuild(build: Build, tied: ReadonlySet<string>): Build {
  const cords = build.netlist.cords.map((c): Cord => ({
    ...c,
    ports: c.ports.filter((p) => tied.has(branchId({ cord: c.id, driver: c.driver, target: p.part, port: p.port }))),
    actuators: c.actuators.filter((a) => tied.has(branchId({ cord: c.id, driver: c.driver, target: a, port: '' }))),
  }));
  return { ...build, netlist: { parts: build.netlist.parts, cords } };
}

/** One position wanted: a gate's driver index and the output value that puts its Z there (1: down). */
interface Want {
  readonly gate: string;
  readonly driver: number;
  readonly out: 0 | 1;
}

const zOf = (v: number): ZPosition => (v === X ? '?' : v === 1 ? 'down' : 'up');

/** The move on lever driver `d` from where it stands. */
function moveOf(sim: PartSim, d: number, values: Uint8Array): HandAction {
  const k = sim.inputLevers.indexOf(d);
  if (k >= 0) return { kind: 'input', input: sim.build.machine.inputs[k], value: values[d] === 1 ? 0 : 1 };
  const lever = d === sim.phi1 ? 'phi1' : d === sim.phi2 ? 'phi2' : 'reset';
  return { kind: values[d] === 1 ? 'release' : 'pull', lever };
}

/**
 * Whether some latch may see both of its ports pulled: S̄ and R̄ each 0 or undetermined. A latch
 * undetermined since power-up can hide a forbidden input the simulator does not raise (it might
 * hold either value); such a position is never entered, so no sequence risks one.
 */
function mayBeForbidden(sim: PartSim, values: Uint8Array): boolean {
  return sim.latches.some((l) => andOf(values, l.sBar) !== 1 && andOf(values, l.rBar) !== 1);
}

/** Positions told apart by every value (a key of the sound machine's values and the loose machines' still followed): a hash to a bucket of node indices, compared value by value. */
class Seen {
  private readonly buckets = new Map<number, number[]>();
  constructor(private readonly nodes: readonly { readonly key: Uint8Array }[]) {}

  private static hash(values: Uint8Array): number {
    let a = 0x811c9dc5;
    let b = 0x9e3779b9;
    for (let i = 0; i < values.length; i++) {
      a = Math.imul(a ^ values[i], 0x01000193);
      b = Math.imul(b ^ (values[i] + i), 0x85ebca6b);
    }
    return (a >>> 0) * 0x200000 + (b >>> 11);
  }

  /** Whether a node already has this key. */
  has(key: Uint8Array): boolean {
    const same = (n: number): boolean => {
      const k = this.nodes[n].key;
      return k.length === key.length && k.every((v, i) => v === key[i]);
    };
    return this.buckets.get(Seen.hash(key))?.some(same) ?? false;
  }

  /** Remember the node at `index` (with `key`). */
  add(key: Uint8Array, index: number): void {
    const h = Seen.hash(key);
    const bucket = this.buckets.get(h);
    if (bucket) bucket.push(index);
    else this.buckets.set(h, [index]);
  }
}

/** The key of a position: the sound values, then each loose machine's still followed. */
function keyOf(values: Uint8Array, bad: readonly (Uint8Array | null)[]): Uint8Array {
  const parts = [values, ...bad.filter((b): b is Uint8Array => b !== null)];
  if (parts.length === 1) return values;
  const key = new Uint8Array(parts.reduce((n, x) => n + x.length, 0));
  let at = 0;
  for (const x of parts) {
    key.set(x, at);
    at += x.length;
  }
  return key;
}

interface Found {
  readonly nodes: readonly { readonly values: Uint8Array; readonly parent: number; readonly action?: HandAction }[];
  /** Node index per want, or -1. */
  readonly at: readonly number[];
  /** Node index per loose tie, the first whose Z levers differ from the sound machine's, or -1. */
  readonly loose: readonly number[];
  readonly reach: SearchReach;
}

/** What a stage's search looks for: positions of gates, and (with their own machines) each tie come loose. */
interface Targets {
  readonly wants: readonly Want[];
  /** The machine with each tie of the stage come loose (null: not simulated, the work bound reached). */
  readonly faults: readonly (PartSim | null)[];
  /** Driver indices of the Z levers read (every gate mounted so far). */
  readonly look: readonly number[];
}

interface Node {
  readonly values: Uint8Array;
  readonly key: Uint8Array;
  readonly parent: number;
  readonly action?: HandAction;
  readonly depth: number;
  /** Each loose machine's values along the same path (null: shown already, or released once expanded). */
  bad: (Uint8Array | null)[];
}

/** Whether a loose machine's Z levers differ from the sound one's where both are determined. */
function differs(look: readonly number[], good: Uint8Array, bad: Uint8Array): boolean {
  return look.some((d) => good[d] !== X && bad[d] !== X && good[d] !== bad[d]);
}

/**
 * Breadth-first search from power-up for every wanted position, and for a position that shows
 * each tie come loose: the sound machine and each loose one stepped side by side along every
 * path (the product of their states, ch. 8 of the source above), positions told apart by the
 * sound machine's values (see the module comment).
 */
function breadthFirst(sim: PartSim, targets: Targets, maxMoves: number): Found {
  const { wants, faults, look } = targets;
  const levers = [...sim.inputLevers, sim.phi1, sim.phi2, sim.reset].filter((d) => d >= 0);
  const [start] = powerUp(sim);
  const startBad = faults.map((f) => (f ? powerUp(f)[0].values : null));
  const nodes: Node[] = [
    { values: start.values, key: keyOf(start.values, startBad), parent: -1, depth: 0, bad: startBad },
  ];
  const seen = new Seen(nodes);
  seen.add(nodes[0].key, 0);
  const at = wants.map(() => -1);
  const loose = faults.map(() => -1);
  let left = wants.length + faults.filter((f) => f !== null).length;
  let cut = false;
  let moves = 0;
  for (let n = 0; n < nodes.length && left > 0 && !cut; n++) {
    const node = nodes[n];
    wants.forEach((w, i) => {
      if (at[i] >= 0 || node.values[w.driver] !== w.out) return;
      at[i] = n;
      left--;
    });
    node.bad.forEach((b, i) => {
      if (loose[i] >= 0 || !b || !differs(look, node.values, b)) return;
      loose[i] = n;
      left--;
    });
    if (left === 0 || node.depth >= SEARCH_ACTIONS) continue;
    const controls = {
      phi1: node.values[sim.phi1] === 1,
      phi2: node.values[sim.phi2] === 1,
      reset: node.values[sim.reset] === 1,
    };
    for (const d of levers) {
      const action = moveOf(sim, d, node.values);
      if (ruleBroken(action, controls)) continue;
      if (moves >= maxMoves) {
        cut = true;
        break;
      }
      moves++;
      const values = node.values.slice();
      const events: PartEvent[] = [];
      applyInPlace(sim, values, 0, action, events);
      if (events.some(isAlarm) || mayBeForbidden(sim, values)) continue;
      const bad = node.bad.map((b, i) => {
        if (!b || loose[i] >= 0) return null;
        moves++;
        const next = b.slice();
        const f = faults[i];
        if (f) applyInPlace(f, next, 0, action, []);
        return next;
      });
      const key = keyOf(values, bad);
      if (seen.has(key)) continue;
      if (nodes.length >= SEARCH_POSITIONS) {
        cut = true;
        break;
      }
      seen.add(key, nodes.length);
      nodes.push({ values, key, parent: n, action, depth: node.depth + 1, bad });
    }
    node.bad = [];
  }
  return {
    nodes,
    at,
    loose,
    reach: { positions: nodes.length, moves, actions: SEARCH_ACTIONS, complete: !cut && left > 0 },
  };
}

/** The hand actions from power-up to node `n`. */
function pathTo(found: Found, n: number): HandAction[] {
  const out: HandAction[] = [];
  for (let k = n; k > 0; k = found.nodes[k].parent) {
    const a = found.nodes[k].action;
    if (a) out.unshift(a);
  }
  return out;
}

/** A position still wanted: a gate and the output value that puts its Z there (1: down). */
interface Pending {
  readonly gate: string;
  readonly out: 0 | 1;
}

/** The checks of every stage, in order (see the module comment). */
export function searchStages(
  build: Build,
  profile: Pick<Profile, 'stageDelayS'>,
  stages: readonly MountStage[],
): StageChecks[] {
  const tied = new Set<string>();
  const mounted: string[] = [];
  const seen = new Map<string, { up: Sighting | null; down: Sighting | null }>();
  let pending: Pending[] = [];
  const timing = timingOf(profile);
  const drivers = build.netlist.parts.filter((p) => p.kind === 'lever' || p.kind === 'gate').length;
  let budget = Math.floor(PLAN_WORK / Math.max(1, drivers));
  let toSearch = stages.filter((s) => s.gates.length > 0).length;
  let steps = Math.floor(LOOSE_WORK / Math.max(1, drivers));
  const searched = stages.map((stage): Omit<StageChecks, 'checks'> => {
    stage.ties.forEach((b: Branch) => tied.add(branchId(b)));
    mounted.push(...stage.gates);
    for (const g of stage.gates) seen.set(g, { up: null, down: null });
    if (stage.gates.length === 0 && pending.length === 0) return { trials: [], loose: [], search: null };
    pending = [...stage.gates.flatMap((gate) => [up(gate), down(gate)]), ...pending];
    const sim = compilePart(partialBuild(build, tied), timing);
    const driver = new Map(sim.ids.map((id, i) => [id, i]));
    const injector = faultInjector(sim, timing.stageDelayS);
    // One loose machine per tie while the bound on that work lasts (making one counts as a step).
    const faults = stage.ties.map((tie) => (steps-- > 0 ? injector.inject(looseFault(tie)) : null));
    const found = breadthFirst(
      sim,
      {
        wants: pending.map((p) => ({ ...p, driver: driver.get(p.gate) ?? -1 })),
        faults,
        look: mounted.map((g) => driver.get(g) ?? -1),
      },
      Math.floor(budget / Math.max(1, toSearch)),
    );
    budget -= found.reach.moves;
    toSearch--;
    const trialNodes = [...new Set([...found.at, ...found.loose].filter((n) => n >= 0))].sort((a, b) => a - b);
    pending.forEach((p, i) => {
      const n = found.at[i];
      const s = seen.get(p.gate);
      if (n < 0 || !s) return;
      const sighting = { stage: stage.number, trial: trialNodes.indexOf(n) };
      if (p.out === 0) s.up = sighting;
      else s.down = sighting;
    });
    pending = pending.filter((_, i) => found.at[i] < 0);
    const trials = trialNodes.map((n) => ({
      actions: pathTo(found, n),
      positions: mounted.map((gate) => ({ gate, z: zOf(found.nodes[n].values[driver.get(gate) ?? -1]) })),
    }));
    const shown = looseTies(sim, stage.ties, faults, trials, Math.max(0, steps));
    steps -= shown.steps;
    return { trials, loose: shown.loose, search: found.reach };
  });
  return searched.map((s, i) => ({
    ...s,
    checks: stages[i].gates.map((gate) => ({ gate, ...(seen.get(gate) ?? { up: null, down: null }) })),
  }));
}

const up = (gate: string): Pending => ({ gate, out: 0 });
const down = (gate: string): Pending => ({ gate, out: 1 });

/** A tie come loose: the untied fault of sim/faults.ts on that branch (for a cord of one tie, the same as the cord slack). */
function looseFault(tie: Branch): CordFault {
  return {
    key: `untied ${tie.cord} ${tie.target}.${tie.port}`,
    kind: 'untied',
    cord: tie.cord,
    tie: { part: tie.target, port: tie.port },
    same: [],
  };
}

/** Each tie of a stage come loose in turn (the untied fault of sim/faults.ts), the stage's trials stepped on it and read. */
function looseTies(
  sim: PartSim,
  ties: readonly Branch[],
  faults: readonly (PartSim | null)[],
  trials: readonly Trial[],
  budget: number,
): { loose: LooseTie[]; steps: number } {
  const index = new Map(sim.ids.map((id, i) => [id, i]));
  const perTie = trials.reduce((n, t) => n + t.actions.length, 1);
  let steps = 0;
  const loose = ties.map((tie, i): LooseTie => {
    const bad = faults[i];
    if (!bad || steps + perTie > budget) return { tie, shownBy: null, simulated: false };
    steps += perTie;
    const [start] = powerUp(bad);
    const shownBy = trials.findIndex((t) => {
      const values = start.values.slice();
      for (const a of t.actions) applyInPlace(bad, values, 0, a, []);
      return t.positions.some((x) => {
        const v = values[index.get(x.gate) ?? -1];
        return v !== X && x.z !== '?' && zOf(v) !== x.z;
      });
    });
    return { tie, shownBy: shownBy < 0 ? null : shownBy, simulated: true };
  });
  return { loose, steps };
}
