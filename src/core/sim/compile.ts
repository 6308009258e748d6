/**
 * Compile a Build's netlist once into flat index arrays for the part-level simulator.
 *
 * Contract: every lever and every gate becomes one *driver* (levers first, in netlist order,
 * then gates). A gate's inputs are the drivers of every cord on every one of its ports, in
 * one flat list: a port is the wired-AND of its cords and Z the AND of its ports, so the
 * gate's output is NAND over that list (a port with no cord is 1 and adds nothing). A latch
 * is its two gates; its S̄ is the AND of the cords on the set-side gate except the feedback
 * cord from its partner (and R̄ likewise), which is what "both ports pulled" means.
 * Preconditions: the netlist invariants of model/netlist.ts (unique ids, one driver per
 * cord, ports only on gates). Postconditions: the arrays below never change afterwards.
 */
import type { Build } from '../model/build.js';
import type { LatchPart, Netlist, Part } from '../model/netlist.js';

/** Three-valued signal: 0, 1, or X (unknown: a latch released from the forbidden input, a race, an oscillation). */
export type Trit = 0 | 1 | 2;
/** The X value of a Trit. */
export const X = 2;

/** Per-part stage delays (seconds): the profile's stage delay, with overrides by gate or latch id. */
export interface PartTiming {
  readonly stageDelayS: number;
  /** Overrides by gate id (a latch id sets both its gates). */
  readonly delays?: Readonly<Record<string, number>>;
}

export interface CompiledLatch {
  readonly id: string;
  readonly name: string;
  readonly role: 'master' | 'slave';
  readonly bit: number;
  /** Driver index of the set-side gate (output Q) and the reset-side gate (output Q̄). */
  readonly set: number;
  readonly reset: number;
  /** Drivers whose cords make up S̄ and R̄ (the feedback cords left out). */
  readonly sBar: Int32Array;
  readonly rBar: Int32Array;
}

/** How a machine output is read: a flag on a gate's Z lever, an actuator on cords, or a part pinned at a constant. */
export type OutputReader =
  | { readonly kind: 'flag'; readonly gate: number; readonly inverted: boolean }
  | { readonly kind: 'actuator'; readonly drivers: Int32Array }
  | { readonly kind: 'fixed'; readonly value: 0 | 1 };

/**
 * The machine's outputs, each read as its reader says from `value` (a driver's output, X when
 * undetermined): a flag shows 1 while its gate's Z is up (0), the other way round when
 * inverted; an actuator is pulled (1) while any of its drivers is 0. The one reading of
 * outputs, for a scalar state (part.ts) and for a lane of a batch (lanes.ts, sweep.ts).
 */
export function readOutputs(sim: PartSim, value: (driver: number) => Trit): Trit[] {
  return sim.outputs.map((r): Trit => {
    if (r.kind === 'fixed') return r.value;
    if (r.kind === 'flag') {
      const out = value(r.gate);
      if (out === X) return X;
      const z = out === 1 ? 0 : 1;
      return (r.inverted ? 1 - z : z) as Trit;
    }
    let unknown = false;
    for (const d of r.drivers) {
      const v = value(d);
      if (v === 0) return 1;
      if (v === X) unknown = true;
    }
    return unknown ? X : 0;
  });
}

/** The netlist as index arrays (see the module comment). */
export interface PartSim {
  readonly build: Build;
  readonly leverCount: number;
  readonly driverCount: number;
  readonly ids: readonly string[];
  readonly names: readonly string[];
  /** Gate inputs: driver d's inputs are inputs[inStart[d] .. inStart[d+1]). Levers have none. */
  readonly inStart: Int32Array;
  readonly inputs: Int32Array;
  /** Gates that read driver d: fanout[fanStart[d] .. fanStart[d+1]), each listed once. */
  readonly fanStart: Int32Array;
  readonly fanout: Int32Array;
  /** Stage delay per driver in whole microseconds (levers 0). */
  readonly delayUs: Int32Array;
  readonly latches: readonly CompiledLatch[];
  /** Latch index per driver for latch gates, else -1. */
  readonly latchOf: Int32Array;
  /** Latches whose S̄ or R̄ reads driver d: watch[watchStart[d] .. watchStart[d+1]). */
  readonly watchStart: Int32Array;
  readonly watch: Int32Array;
  /** Driver index of each control lever; -1 when the build has none (a one-state machine). */
  readonly phi1: number;
  readonly phi2: number;
  readonly reset: number;
  /** Lever driver per machine input, in the machine's input order. */
  readonly inputLevers: Int32Array;
  /** Latch index per state bit. */
  readonly masters: Int32Array;
  readonly slaves: Int32Array;
  /** Reader per machine output, in the machine's output order. */
  readonly outputs: readonly OutputReader[];
  /** Running count of gate evaluations (for benchmarks). */
  evaluations: number;
}

/** The driver index of a part id; throws (naming `what`) when the part is not a lever or gate. */
type NeedDriver = (id: string, what: string) => number;

/** Lists of driver indices packed into one array: list d is data[start[d] .. start[d+1]). */
function packLists(lists: readonly Iterable<number>[]): { start: Int32Array; data: Int32Array } {
  const flat = lists.map((l) => [...l]);
  const start = new Int32Array(lists.length + 1);
  for (let i = 0; i < lists.length; i++) start[i + 1] = start[i] + flat[i].length;
  return { start, data: Int32Array.from(flat.flat()) };
}

/** Each latch with its two gates and the cords of S̄ and R̄; latchOf marks the latch gates. */
function compileLatches(
  latchParts: readonly LatchPart[],
  need: NeedDriver,
  ins: readonly (readonly number[])[],
): { latches: CompiledLatch[]; latchOf: Int32Array } {
  const latchOf = new Int32Array(ins.length).fill(-1);
  const latches = latchParts.map((l, li): CompiledLatch => {
    const set = need(l.setGate, `set gate of latch ${l.name}`);
    const reset = need(l.resetGate, `reset gate of latch ${l.name}`);
    latchOf[set] = li;
    latchOf[reset] = li;
    const sBar = Int32Array.from(ins[set].filter((d) => d !== reset));
    const rBar = Int32Array.from(ins[reset].filter((d) => d !== set));
    return { id: l.id, name: l.name, role: l.role, bit: l.bit, set, reset, sBar, rBar };
  });
  return { latches, latchOf };
}

/** Per driver, the latches whose S̄ or R̄ reads it. */
function latchWatchers(latches: readonly CompiledLatch[], driverCount: number): Set<number>[] {
  const watchers: Set<number>[] = Array.from({ length: driverCount }, () => new Set());
  latches.forEach((l, li) => {
    for (const d of l.sBar) watchers[d].add(li);
    for (const d of l.rBar) watchers[d].add(li);
  });
  return watchers;
}

/** How each machine output is read, in the machine's output order. */
function outputReaders(build: Build, need: NeedDriver): OutputReader[] {
  const net = build.netlist;
  const byId = new Map(net.parts.map((p) => [p.id, p]));
  return build.machine.outputs.map((o): OutputReader => {
    const id = build.signals.outputs[o];
    const part = id === undefined ? undefined : byId.get(id);
    if ((part?.kind === 'flag' || part?.kind === 'actuator') && part.fixed !== undefined)
      return { kind: 'fixed', value: part.fixed };
    if (part?.kind === 'flag')
      return { kind: 'flag', gate: need(part.gate, `gate of flag ${part.name}`), inverted: part.inverted };
    if (part?.kind === 'actuator') {
      const ds = net.cords
        .filter((c) => c.actuators.includes(part.id))
        .map((c) => need(c.driver, `driver of actuator ${part.name}`));
      return { kind: 'actuator', drivers: Int32Array.from(ds) };
    }
    throw new Error(`netlist: output '${o}' has no flag or actuator`);
  });
}

type SignalIndices = Pick<PartSim, 'phi1' | 'phi2' | 'reset' | 'inputLevers' | 'masters' | 'slaves'>;

/** The control levers, the input levers and the master and slave latches, by driver or latch index. */
function signalIndices(build: Build, need: NeedDriver, latchParts: readonly LatchPart[]): SignalIndices {
  const sig = build.signals;
  const latchIndex = new Map(latchParts.map((l, i) => [l.id, i]));
  const latchAt = (id: string): number => {
    const i = latchIndex.get(id);
    if (i === undefined) throw new Error(`netlist: latch '${id}' named by the signal map does not exist`);
    return i;
  };
  return {
    phi1: sig.phi1 === '' ? -1 : need(sig.phi1, 'φ1 lever'),
    phi2: sig.phi2 === '' ? -1 : need(sig.phi2, 'φ2 lever'),
    reset: sig.reset === '' ? -1 : need(sig.reset, 'reset lever'),
    inputLevers: Int32Array.from(build.machine.inputs.map((i) => need(sig.inputs[i] ?? '', `lever of input ${i}`))),
    masters: Int32Array.from(sig.masters.map(latchAt)),
    slaves: Int32Array.from(sig.slaves.map(latchAt)),
  };
}

/** Compile a build's netlist with the given stage delays. Throws on a netlist that breaks the model's invariants. */
export function compilePart(build: Build, timing: PartTiming): PartSim {
  const net: Netlist = build.netlist;
  const levers = net.parts.filter((p) => p.kind === 'lever');
  const gates = net.parts.filter((p) => p.kind === 'gate');
  const drivers: Part[] = [...levers, ...gates];
  const index = new Map(drivers.map((p, i) => [p.id, i]));
  const need: NeedDriver = (id, what) => {
    const i = index.get(id);
    if (i === undefined) throw new Error(`netlist: ${what} '${id}' is not a lever or gate`);
    return i;
  };

  const ins: number[][] = drivers.map(() => []);
  for (const c of net.cords) {
    const d = need(c.driver, `driver of cord ${c.id}`);
    for (const p of c.ports) ins[need(p.part, `port owner on cord ${c.id}`)].push(d);
  }
  const n = drivers.length;
  const { start: inStart, data: inputs } = packLists(ins);
  const outs: Set<number>[] = drivers.map(() => new Set());
  ins.forEach((list, g) => list.forEach((d) => outs[d].add(g)));
  const { start: fanStart, data: fanout } = packLists(outs);

  const delayUs = stageDelays(net, drivers, timing);
  const latchParts = net.parts.filter((p) => p.kind === 'latch');
  const { latches, latchOf } = compileLatches(latchParts, need, ins);
  const { start: watchStart, data: watch } = packLists(latchWatchers(latches, n));
  const outputs = outputReaders(build, need);

  return {
    build,
    leverCount: levers.length,
    driverCount: n,
    ids: drivers.map((p) => p.id),
    names: drivers.map((p) => p.name),
    inStart,
    inputs,
    fanStart,
    fanout,
    delayUs,
    latches,
    latchOf,
    watchStart,
    watch,
    ...signalIndices(build, need, latchParts),
    outputs,
    evaluations: 0,
  };
}

/** Stage delay per driver in whole microseconds (levers 0): overrides by gate id, then by latch id, then the default. */
function stageDelays(net: Netlist, drivers: readonly Part[], timing: PartTiming): Int32Array {
  const override = timing.delays ?? {};
  const latchDelay = new Map<string, number>();
  for (const l of net.parts) {
    const d = l.kind === 'latch' ? override[l.id] : undefined;
    if (l.kind === 'latch' && d !== undefined) for (const g of [l.setGate, l.resetGate]) latchDelay.set(g, d);
  }
  const delayUs = new Int32Array(drivers.length);
  drivers.forEach((p, i) => {
    if (p.kind !== 'gate') return;
    const s = override[p.id] ?? latchDelay.get(p.id) ?? timing.stageDelayS;
    delayUs[i] = Math.max(1, Math.round(s * 1e6));
  });
  return delayUs;
}

/**
 * The same compiled netlist with other stage delays, given per driver in whole microseconds
 * (levers 0; the Monte Carlo runs), without compiling again.
 */
export function retimed(sim: PartSim, delayUs: Int32Array): PartSim {
  return { ...sim, delayUs, evaluations: 0 };
}
