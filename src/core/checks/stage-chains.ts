/**
 * Longest stage chains of the compiled netlist, per hand action (static timing analysis).
 *
 * Method: for each action, the levers it leaves still are fixed at their positions and a
 * three-valued evaluation without delays finds the gates they hold constant (a released φ2
 * holds every transfer gate at 1, and so on through buffer trees); the moving lever starts at
 * time 0 and the arrival time of every gate that can still change is the largest arrival of
 * its inputs plus its own stage delay — the longest path of a DAG (e.g. Cormen et al.,
 * *Introduction to Algorithms*, 3rd ed., §24.2, from memory). A latch counts as two stages
 * (its two gates in turn) after its last S̄/R̄ input; on a release the chain stops at the
 * latches, since ports rising never flip one. A loop of gates that no latch closes is
 * reported instead of a time. The result is an upper bound on the settling time.
 * Only the arrival times depend on the stage delays: the constant gates, the depth-first
 * order (a topological order of the gates that can change) and the loop do not, so a plan
 * (`chainPlan`) finds them once per netlist and action and puts each set of delays on them in
 * one pass, with the same times and the same chain as a fresh search (the Monte Carlo runs of
 * timing.ts vary the delays of one netlist).
 */
import { X, type PartSim } from '../sim/compile.js';
import { evalGate } from '../sim/settle.js';

/** The hand actions whose settling time the clock needs. */
export type TimedAction = 'phi1' | 'phi1-release' | 'phi2' | 'phi2-release' | 'inputs' | 'reset';

export interface StageChain {
  /** Settling time in seconds (0 when nothing moves). */
  readonly timeS: number;
  /** Parts along the longest chain, first to last ("latch M0 (2 stages)" for a latch). */
  readonly parts: readonly string[];
  /** Gates on a loop that no latch closes, when there is one (then timeS is Infinity). */
  readonly loop?: readonly string[];
}

const NEG = -Infinity;

/** The longest stage chain after one action, with the sim's delays. */
export function stageChain(sim: PartSim, action: TimedAction): StageChain {
  return chainPlan(sim, action).chain(sim);
}

/**
 * What the chains of one action need that does not depend on the stage delays, found once:
 * the gates the still levers hold constant and the order in which the depth-first search
 * finishes the others, with each one's inputs. `chain` puts any stage delays of the same
 * netlist on it (a retimed copy: the Monte Carlo runs) in one pass over that order.
 */
export interface ChainPlan {
  readonly action: TimedAction;
  /** The longest chain with `sim`'s stage delays (`sim`: the netlist planned, or a retimed copy of it). */
  chain(sim: PartSim): StageChain;
}

/** The plan of one action's chains (see ChainPlan). */
export function chainPlan(sim: PartSim, action: TimedAction): ChainPlan {
  const { sources, fixed } = leversOf(sim, action);
  const crossLatches = action === 'phi1' || action === 'phi2' || action === 'reset';
  const order = searchOrder(sim, heldConstant(sim, fixed), sources, crossLatches);
  return {
    action,
    chain: (timed) => {
      if (order.loop) return { timeS: Infinity, parts: [], loop: order.loop };
      return chainOf(timed, longestPaths(timed, order));
    },
  };
}

/** The chain from the driver that settles last back to its source, in part names. */
function chainOf(sim: PartSim, paths: Paths): StageChain {
  const { arrival, pred, end, isSource } = paths;
  const parts: string[] = [];
  for (let d = end; d >= 0 && !isSource[d]; d = pred[d]) {
    const li = sim.latchOf[d];
    const label = li >= 0 ? `latch ${sim.latches[li].name} (2 stages)` : sim.names[d];
    if (parts[0] !== label) parts.unshift(label);
  }
  return { timeS: end < 0 ? 0 : arrival[end] / 1e6, parts };
}

/** The levers an action moves (the sources of its chains), and the control levers it leaves released. */
function leversOf(sim: PartSim, action: TimedAction): { sources: number[]; fixed: Map<number, 0 | 1> } {
  const fixed = new Map<number, 0 | 1>();
  if (action === 'phi1' || action === 'phi1-release') {
    fixed.set(sim.phi2, 0).set(sim.reset, 0);
    return { sources: [sim.phi1], fixed };
  }
  if (action === 'phi2' || action === 'phi2-release') {
    fixed.set(sim.phi1, 0).set(sim.reset, 0);
    return { sources: [sim.phi2], fixed };
  }
  if (action === 'reset') {
    fixed.set(sim.phi1, 0).set(sim.phi2, 0);
    return { sources: [sim.reset], fixed };
  }
  fixed.set(sim.phi1, 0).set(sim.phi2, 0).set(sim.reset, 0);
  return { sources: Array.from(sim.inputLevers), fixed };
}

/** Delay-free three-valued evaluation with the `fixed` levers set and every other driver X: the gates they hold constant. */
function heldConstant(sim: PartSim, fixed: ReadonlyMap<number, 0 | 1>): Uint8Array {
  const values = new Uint8Array(sim.driverCount).fill(X);
  for (const [d, v] of fixed) values[d] = v;
  for (let pass = 0, again = true; again && pass <= sim.driverCount; pass++) {
    again = false;
    for (let g = sim.leverCount; g < sim.driverCount; g++) {
      if (sim.latchOf[g] >= 0 || values[g] !== X) continue;
      const v = evalGate(sim, values, g);
      if (v !== X) {
        values[g] = v;
        again = true;
      }
    }
  }
  return values;
}

interface Paths {
  /** Arrival time per driver in microseconds (-Infinity: never changes). */
  readonly arrival: Float64Array;
  /** The input each driver's latest arrival comes through (-1: none). */
  readonly pred: Int32Array;
  /** The driver that settles last (-1: nothing moves). */
  readonly end: number;
  readonly isSource: Uint8Array;
}

/** The depth-first search over the gates that can still change, which needs no delays. */
interface SearchOrder {
  readonly isSource: Uint8Array;
  /** The gates whose arrival the delays decide, in the order the search finishes them (each after its inputs). */
  readonly timed: Int32Array;
  /** Their inputs, in the order the search visits them: timed[k]'s are ins[insStart[k] .. insStart[k+1]). */
  readonly insStart: Int32Array;
  readonly ins: Int32Array;
  readonly loop?: string[];
}

/**
 * The depth-first search from every driver in index order over the gates that can still
 * change: sources, levers, gates held constant and (on a release) latches end a path; a gate
 * met again while it is on the stack closes a loop.
 */
function searchOrder(sim: PartSim, values: Uint8Array, sources: readonly number[], crossLatches: boolean): SearchOrder {
  const isSource = new Uint8Array(sim.driverCount);
  for (const s of sources) isSource[s] = 1;
  const state = new Uint8Array(sim.driverCount); // 0 new, 1 on stack, 2 done
  const stack: number[] = [];
  const timed: number[] = [];
  const insStart: number[] = [0];
  const ins: number[] = [];
  let loop: string[] | undefined;
  const visit = (d: number): void => {
    if (state[d] === 2) return;
    const fixed = isSource[d] || d < sim.leverCount || values[d] !== X || (sim.latchOf[d] >= 0 && !crossLatches);
    if (fixed) {
      state[d] = 2;
      return;
    }
    if (state[d] === 1) {
      loop ??= stack.slice(stack.indexOf(d)).map((g) => sim.names[g]);
      return;
    }
    state[d] = 1;
    stack.push(d);
    const inputs = inputsOf(sim, d);
    for (const i of inputs) visit(i);
    stack.pop();
    state[d] = 2;
    timed.push(d);
    for (const i of inputs) ins.push(i);
    insStart.push(ins.length);
  };
  for (let d = 0; d < sim.driverCount; d++) visit(d);
  const order = {
    isSource,
    timed: Int32Array.from(timed),
    insStart: Int32Array.from(insStart),
    ins: Int32Array.from(ins),
  };
  return loop ? { ...order, loop } : order;
}

/**
 * Arrival times from the sources (the longest path of a DAG), over a loop-free search order:
 * each gate after its inputs, its latest input the first of equals in the order visited.
 */
function longestPaths(sim: PartSim, o: SearchOrder): Paths {
  const { delayUs, latchOf, latches } = sim;
  const arrival = new Float64Array(sim.driverCount).fill(NEG);
  const pred = new Int32Array(sim.driverCount).fill(-1);
  for (let d = 0; d < sim.driverCount; d++) if (o.isSource[d]) arrival[d] = 0;
  const { timed, insStart, ins } = o;
  for (let k = 0; k < timed.length; k++) {
    const d = timed[k];
    let best = NEG;
    let from = -1;
    for (let j = insStart[k]; j < insStart[k + 1]; j++) {
      const a = arrival[ins[j]];
      if (a > best) {
        best = a;
        from = ins[j];
      }
    }
    const li = latchOf[d];
    const own = li >= 0 ? delayUs[latches[li].set] + delayUs[latches[li].reset] : delayUs[d];
    arrival[d] = best === NEG ? NEG : best + own;
    pred[d] = from;
  }
  let end = -1;
  for (let d = 0; d < sim.driverCount; d++) {
    const a = arrival[d];
    if (a > 0 && (end < 0 || a > arrival[end])) end = d;
  }
  return { arrival, pred, end, isSource: o.isSource };
}

/** A gate's input drivers; for a latch, the drivers of its S̄ and R̄ ports (it counts as one two-stage part). */
function inputsOf(sim: PartSim, d: number): number[] {
  const li = sim.latchOf[d];
  if (li < 0) return Array.from(sim.inputs.subarray(sim.inStart[d], sim.inStart[d + 1]));
  const l = sim.latches[li];
  return [...l.sBar, ...l.rBar];
}
