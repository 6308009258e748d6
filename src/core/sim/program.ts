/**
 * Settle programs: the compiled netlist (compile.ts) cut, once per kind of lever move, into a
 * levelised program that settles the move without an event queue.
 *
 * Method: levelised compiled-code simulation (the "compiled simulation" of logic-simulation
 * texts, e.g. M. Abramovici, M. A. Breuer & A. D. Friedman, *Digital Systems Testing and
 * Testable Design*, ch. 3 — from memory), restricted to what one move can disturb. For a move
 * of lever L with the control levers (φ1, φ2, reset) held where they are:
 * 1. constants: three-valued propagation with the other control levers fixed and every input
 *    lever, L and every latch unknown (a released φ2 holds every transfer gate at 1, …);
 * 2. the cone: the gates L reaches through gates that are not constant; a latch gate brings
 *    its partner, and the latch counts as one unit;
 * 3. the order: a topological order of the cone with each latch as one unit; a cone with any
 *    other cycle gets no program;
 * 4. directions: every path from L has a parity (the number of NANDs on it). A gate reached by
 *    both parities may see its inputs move in opposite directions (a glitch). Both parities
 *    spread downstream, so such a gate that can reach a latch makes that latch's port two-way:
 *    a latch port fed by both parities gives the move no program.
 *
 * Why the result is exact (the argument the fast simulators rely on): start from a settled,
 * binary state whose latches each hold a value. In the cone's order every gate whose changes
 * reach a latch sees all of its changing inputs move in one direction, so it changes at most
 * once, towards its final value, whatever the stage delays; a latch whose S̄ and R̄ do not move
 * in opposite directions and do not end both pulled is set, reset or held exactly as its table
 * says. Then the event-driven simulator (settle.ts), with any delays, reaches the same values
 * with no forbidden input, no race and no oscillation: its chaotic iteration and the ordered
 * pass both reach the least fixed point above the start of a monotone system (the asynchronous
 * iteration argument; e.g. D. P. Bertsekas & J. N. Tsitsiklis, *Parallel and Distributed
 * Computation*, ch. 6 — from memory). Gates reached by both parities whose changes reach no
 * latch are listed in `binate`: they may glitch, which changes no settled value and raises no
 * alarm, only the time of the last change, so a simulator that reports time checks them.
 * The run-time conditions (latch ports, binate gates) are checked by the simulators that use
 * a program; when one fails they settle that move event-driven instead.
 */
import type { PartSim } from './compile.js';

/** A lever move's program: the gates to evaluate, in order, or why the move is settled event-driven. */
export interface SettleProgram {
  /** False: no program; settle this move event-driven (`why` says what stands in the way). */
  readonly fast: boolean;
  readonly why?: string;
  /** Steps in order: a gate's driver index (≥ 0), or ~li for latch li (its two gates as one unit). */
  readonly steps: Int32Array;
  /** Gates reached by both parities whose changes reach no latch (they may glitch). */
  readonly binate: Int32Array;
}

/** Control lever positions as bits: φ1 pulled = 1, φ2 pulled = 2, reset pulled = 4. */
export function controlBits(sim: PartSim, values: ArrayLike<number>): number {
  return (
    (sim.phi1 >= 0 && values[sim.phi1] === 1 ? 1 : 0) |
    (sim.phi2 >= 0 && values[sim.phi2] === 1 ? 2 : 0) |
    (sim.reset >= 0 && values[sim.reset] === 1 ? 4 : 0)
  );
}

const NONE = new Int32Array(0);
const caches = new WeakMap<Int32Array, Map<number, SettleProgram>>();

function cacheOf(sim: PartSim): Map<number, SettleProgram> {
  // Keyed by the netlist's shape (shared by retimed copies of a compiled netlist).
  let c = caches.get(sim.inStart);
  if (!c) caches.set(sim.inStart, (c = new Map<number, SettleProgram>()));
  return c;
}

/** The program of moving lever `lever` with the control levers at `ctrl` (controlBits), made once per netlist. */
export function moveProgram(sim: PartSim, lever: number, ctrl: number): SettleProgram {
  const own = lever === sim.phi1 ? 1 : lever === sim.phi2 ? 2 : lever === sim.reset ? 4 : 0;
  const key = lever * 8 + (ctrl & ~own);
  const cache = cacheOf(sim);
  let p = cache.get(key);
  if (!p) cache.set(key, (p = analyseMove(sim, lever, ctrl & ~own)));
  return p;
}

/**
 * The program that evaluates every gate but the latches' in order, from given levers and
 * latches (a state set up at some code and inputs); not fast when those gates form a cycle.
 */
export function heldProgram(sim: PartSim): SettleProgram {
  const cache = cacheOf(sim);
  let p = cache.get(-1);
  if (!p) cache.set(-1, (p = analyseHeld(sim)));
  return p;
}

function noProgram(why: string): SettleProgram {
  return { fast: false, why, steps: NONE, binate: NONE };
}

/** Three-valued constants (-1 unknown) with the control levers other than the moved one fixed. */
function constants(sim: PartSim, ctrl: number, moved: number): Int8Array {
  const k = new Int8Array(sim.driverCount).fill(-1);
  const queue: number[] = [];
  const fix = (d: number, v: 0 | 1): void => {
    if (d < 0 || d === moved) return;
    k[d] = v;
    queue.push(d);
  };
  fix(sim.phi1, ctrl & 1 ? 1 : 0);
  fix(sim.phi2, ctrl & 2 ? 1 : 0);
  fix(sim.reset, ctrl & 4 ? 1 : 0);
  for (let g = sim.leverCount; g < sim.driverCount; g++) if (sim.inStart[g] === sim.inStart[g + 1]) fix(g, 0);
  const { inStart, inputs, fanStart, fanout } = sim;
  for (let i = 0; i < queue.length; i++) {
    const d = queue[i];
    for (let e = fanStart[d]; e < fanStart[d + 1]; e++) {
      const g = fanout[e];
      if (k[g] !== -1) continue;
      let all1 = true;
      let any0 = false;
      for (let j = inStart[g]; j < inStart[g + 1]; j++) {
        const v = k[inputs[j]];
        if (v === 0) any0 = true;
        else if (v !== 1) all1 = false;
      }
      if (any0) fix(g, 1);
      else if (all1) fix(g, 0);
    }
  }
  return k;
}

/** The cone of a move: every non-constant gate the lever reaches, latch partners included. */
function cone(sim: PartSim, lever: number, k: Int8Array): { gates: number[]; inCone: Uint8Array } | string {
  const inCone = new Uint8Array(sim.driverCount);
  const gates: number[] = [];
  const add = (g: number): string | undefined => {
    if (inCone[g] === 1) return undefined;
    if (k[g] !== -1) return 'a gate of a moving latch is held constant';
    inCone[g] = 1;
    gates.push(g);
    return undefined;
  };
  const queue = [lever];
  for (let i = 0; i < queue.length; i++) {
    const d = queue[i];
    for (let e = sim.fanStart[d]; e < sim.fanStart[d + 1]; e++) {
      const g = sim.fanout[e];
      if (inCone[g] === 1 || k[g] !== -1) continue;
      add(g);
      queue.push(g);
      const li = sim.latchOf[g];
      if (li >= 0) {
        const l = sim.latches[li];
        const partner = g === l.set ? l.reset : l.set;
        if (inCone[partner] === 0) {
          const why = add(partner);
          if (why) return why;
          queue.push(partner);
        }
      }
    }
  }
  return { gates, inCone };
}

/** The inputs of a cone node: a gate's drivers, or a latch's S̄ and R̄ cords (feedback left out). */
function nodeInputs(sim: PartSim, g: number): ArrayLike<number> {
  const li = sim.latchOf[g];
  if (li < 0) return sim.inputs.subarray(sim.inStart[g], sim.inStart[g + 1]);
  const l = sim.latches[li];
  const both = new Int32Array(l.sBar.length + l.rBar.length);
  both.set(l.sBar);
  both.set(l.rBar, l.sBar.length);
  return both;
}

/** Kahn's topological order of the cone with each latch as one node (its set gate stands for it); null on a cycle. */
function order(sim: PartSim, gates: readonly number[], inCone: Uint8Array): number[] | null {
  const rep = (g: number): number => {
    const li = sim.latchOf[g];
    return li < 0 ? g : sim.latches[li].set;
  };
  const nodes = gates.filter((g) => rep(g) === g);
  const indegree = new Int32Array(sim.driverCount);
  const users = new Map<number, number[]>();
  for (const g of nodes) {
    const seen = new Set<number>();
    const ins = nodeInputs(sim, g);
    for (let j = 0; j < ins.length; j++) {
      const d = ins[j];
      if (inCone[d] === 0) continue;
      const r = rep(d);
      if (seen.has(r)) continue;
      seen.add(r);
      indegree[g]++;
      let u = users.get(r);
      if (!u) users.set(r, (u = []));
      u.push(g);
    }
  }
  const out = nodes.filter((g) => indegree[g] === 0);
  for (let i = 0; i < out.length; i++) for (const u of users.get(out[i]) ?? []) if (--indegree[u] === 0) out.push(u);
  return out.length === nodes.length ? out : null;
}

const EVEN = 1;
const ODD = 2;
const flip = (p: number): number => ((p & EVEN) << 1) | ((p & ODD) >> 1);

/** Parities along the order; the binate gates, or why the move gets no program. */
function directions(sim: PartSim, lever: number, ordered: readonly number[]): number[] | string {
  const par = new Uint8Array(sim.driverCount);
  par[lever] = EVEN;
  const orOf = (ds: ArrayLike<number>): number => {
    let p = 0;
    for (let j = 0; j < ds.length; j++) p |= par[ds[j]];
    return p;
  };
  for (const g of ordered) {
    const li = sim.latchOf[g];
    if (li < 0) {
      par[g] = flip(orOf(sim.inputs.subarray(sim.inStart[g], sim.inStart[g + 1])));
      continue;
    }
    const l = sim.latches[li];
    const ps = orOf(l.sBar);
    const pr = orOf(l.rBar);
    if (ps === 3 || pr === 3) return `a port of latch ${l.name} is reached by both directions`;
    par[l.set] = flip(ps) | pr;
    par[l.reset] = flip(par[l.set]);
  }
  // Both parities spread to everything downstream, so a gate reached by both that could reach a
  // latch would have made that latch's port two-way above: the binate gates reach no latch.
  return ordered.filter((g) => par[g] === 3 && sim.latchOf[g] < 0);
}

function analyseMove(sim: PartSim, lever: number, ctrl: number): SettleProgram {
  if (lever < 0) return noProgram('no such lever');
  const k = constants(sim, ctrl, lever);
  const c = cone(sim, lever, k);
  if (typeof c === 'string') return noProgram(c);
  const ordered = order(sim, c.gates, c.inCone);
  if (!ordered) return noProgram('the gates it moves form a loop that is not a latch');
  const binate = directions(sim, lever, ordered);
  if (typeof binate === 'string') return noProgram(binate);
  const steps = Int32Array.from(ordered, (g) => (sim.latchOf[g] >= 0 ? ~sim.latchOf[g] : g));
  return { fast: true, steps, binate: Int32Array.from(binate) };
}

function analyseHeld(sim: PartSim): SettleProgram {
  const gates: number[] = [];
  const inSet = new Uint8Array(sim.driverCount);
  for (let g = sim.leverCount; g < sim.driverCount; g++)
    if (sim.latchOf[g] < 0) {
      gates.push(g);
      inSet[g] = 1;
    }
  const ordered = order(sim, gates, inSet);
  if (!ordered) return noProgram('gates outside the latches form a loop');
  return { fast: true, steps: Int32Array.from(ordered), binate: NONE };
}
