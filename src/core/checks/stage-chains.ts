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
  const { sources, fixed } = leversOf(sim, action);
  const crossLatches = action === 'phi1' || action === 'phi2' || action === 'reset';
  const paths = longestPaths(sim, heldConstant(sim, fixed), sources, crossLatches);
  if (paths.loop) return { timeS: Infinity, parts: [], loop: paths.loop };
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
  readonly loop?: string[];
}

/** Arrival times from the sources over the gates that can still change (the longest path of a DAG, by depth-first search). */
function longestPaths(sim: PartSim, values: Uint8Array, sources: readonly number[], crossLatches: boolean): Paths {
  const isSource = new Uint8Array(sim.driverCount);
  for (const s of sources) isSource[s] = 1;
  const arrival = new Float64Array(sim.driverCount).fill(NaN);
  const pred = new Int32Array(sim.driverCount).fill(-1);
  const state = new Uint8Array(sim.driverCount); // 0 new, 1 on stack, 2 done
  const stack: number[] = [];
  let loop: string[] | undefined;
  const finish = (d: number, a: number, from: number): number => {
    state[d] = 2;
    arrival[d] = a;
    pred[d] = from;
    return a;
  };
  const visit = (d: number): number => {
    if (state[d] === 2) return arrival[d];
    if (isSource[d]) return finish(d, 0, -1);
    if (d < sim.leverCount || values[d] !== X) return finish(d, NEG, -1);
    const li = sim.latchOf[d];
    if (li >= 0 && !crossLatches) return finish(d, NEG, -1);
    if (state[d] === 1) {
      loop ??= stack.slice(stack.indexOf(d)).map((g) => sim.names[g]);
      return NEG;
    }
    state[d] = 1;
    stack.push(d);
    let best = NEG;
    let from = -1;
    for (const i of inputsOf(sim, d)) {
      const a = visit(i);
      if (a > best) {
        best = a;
        from = i;
      }
    }
    stack.pop();
    const own = li >= 0 ? sim.delayUs[sim.latches[li].set] + sim.delayUs[sim.latches[li].reset] : sim.delayUs[d];
    return finish(d, best === NEG ? NEG : best + own, from);
  };
  let end = -1;
  for (let d = 0; d < sim.driverCount; d++) {
    const a = visit(d);
    if (a > 0 && (end < 0 || a > arrival[end])) end = d;
  }
  return loop ? { arrival, pred, end, isSource, loop } : { arrival, pred, end, isSource };
}

/** A gate's input drivers; for a latch, the drivers of its S̄ and R̄ ports (it counts as one two-stage part). */
function inputsOf(sim: PartSim, d: number): number[] {
  const li = sim.latchOf[d];
  if (li < 0) return Array.from(sim.inputs.subarray(sim.inStart[d], sim.inStart[d + 1]));
  const l = sim.latches[li];
  return [...l.sBar, ...l.rBar];
}
