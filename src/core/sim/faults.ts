/**
 * Cord faults: what goes wrong with a cord of a finished machine, listed and collapsed, and a
 * compiled netlist with one of them put in.
 *
 * Fault model: the single stuck-at fault on gate outputs and fan-out branches (M. Abramovici,
 * M. A. Breuer & A. D. Friedman, *Digital Systems Testing and Testable Design*, 1990, ch. 4 —
 * from memory), read in the machine's physical terms. A cord that pulls drives 0 at every port
 * it is tied to; a slack one leaves them at 1. So:
 * - `slack`: the whole cord broken, or slipping on its capstan: every branch slack (stuck at
 *   1), the actuators it lifts left at rest;
 * - `taut`: the cord jammed pulling (stuck at 0 at every port, its actuators lifted);
 * - `untied`: one branch of a cord with several (its tie to one port or actuator) come loose:
 *   that port alone sees the cord slack (a fan-out branch stuck at 1).
 * The levers a person reads (a latch gate's Z, a flag on a Z) follow their own ports, so a
 * fault on a gate's cord never moves that gate's own Z.
 *
 * Collapsing (structural equivalence, the same source's rules, restated for cords):
 * 1. A cord with one tie: its branch fault is its `slack` fault (only `slack` is listed).
 * 2. A NAND input stuck at its controlling value (0, a `taut` cord) forces the output to 1:
 *    `taut` on a cord whose only tie is a port of gate g is `slack` on g's cord, when g drives
 *    exactly one cord and nobody reads g's Z (g is no latch gate and carries no flag).
 * 3. A one-input NAND (g's only input is that cord): `slack` on the input forces g's output
 *    to 0, so it is `taut` on g's cord, under the same conditions.
 * The representative of a class is the fault on the cord nearest the outputs. Collapsing never
 * crosses a gate whose Z is read, since there the two faults look different to the person.
 *
 * Injection: the compiled netlist (compile.ts) with the fault's entries changed — a slack
 * branch leaves its gate's input list (a port is the AND of its cords, so a cord that never
 * pulls adds nothing), a taut cord's entries read a constant source appended as the last
 * driver (a gate with no cord on any port: Z up, so its cord always pulls). The result is the
 * netlist the part-level simulator would compile from the netlist with the fault made by hand,
 * entry for entry (tests/core/sim/faults.test.ts holds it to that).
 */
import type { Cord, Netlist } from '../model/netlist.js';
import type { CompiledLatch, OutputReader, PartSim } from './compile.js';

export type FaultKind = 'slack' | 'taut' | 'untied';

/** One cord fault. */
export interface CordFault {
  /** Stable key: `slack c12`, `taut c12`, `untied c12 g4.a` (a port) or `untied c12 act1` (an actuator). */
  readonly key: string;
  readonly kind: FaultKind;
  readonly cord: string;
  /** The branch come loose (kind `untied`): the part and port, or the actuator with port ''. */
  readonly tie?: { readonly part: string; readonly port: string };
  /** Keys of the faults collapsed into this one (equivalent to it). */
  readonly same: readonly string[];
}

/** The faults of a netlist: every one, and the representatives after collapsing. */
export interface FaultList {
  /** Every fault of the model, before collapsing. */
  readonly all: number;
  /** One fault per equivalence class, in netlist order of the cords. */
  readonly faults: readonly CordFault[];
}

const tieKey = (t: { part: string; port: string }): string => (t.port === '' ? t.part : `${t.part}.${t.port}`);

/** The ties of a cord: each port, then each actuator (port ''). */
export function tiesOf(c: Cord): { part: string; port: string }[] {
  return [...c.ports.map((p) => ({ part: p.part, port: p.port })), ...c.actuators.map((a) => ({ part: a, port: '' }))];
}

/** Every fault of the model and its representatives (see the module comment for the rules). */
export function listFaults(net: Netlist): FaultList {
  const cordsOf = new Map<string, Cord[]>();
  for (const c of net.cords) cordsOf.set(c.driver, [...(cordsOf.get(c.driver) ?? []), c]);
  const read = new Set<string>();
  for (const p of net.parts) {
    if (p.kind === 'gate' && p.latch !== undefined) read.add(p.id);
    if (p.kind === 'flag' && p.fixed === undefined) read.add(p.gate);
  }
  const inputsOf = new Map<string, number>();
  for (const c of net.cords) for (const p of c.ports) inputsOf.set(p.part, (inputsOf.get(p.part) ?? 0) + 1);
  // The representative of a cord's fault: follow rules 2 and 3 forward through unread gates.
  const rep = (kind: 'slack' | 'taut', c: Cord): string => {
    let k = kind;
    let cur = c;
    for (let hops = 0; hops < net.cords.length; hops++) {
      if (cur.ports.length !== 1 || cur.actuators.length > 0) break;
      const g = cur.ports[0].part;
      const outs = cordsOf.get(g) ?? [];
      if (read.has(g) || outs.length !== 1) break;
      if (k === 'slack' && inputsOf.get(g) !== 1) break;
      k = k === 'taut' ? 'slack' : 'taut';
      cur = outs[0];
    }
    return `${k} ${cur.id}`;
  };
  const classes = new Map<string, string[]>();
  let all = 0;
  const add = (key: string, into: string): void => {
    all++;
    classes.set(into, [...(classes.get(into) ?? []), key]);
  };
  for (const c of net.cords) {
    add(`slack ${c.id}`, rep('slack', c));
    add(`taut ${c.id}`, rep('taut', c));
    const ties = tiesOf(c);
    if (ties.length > 1) for (const t of ties) add(`untied ${c.id} ${tieKey(t)}`, `untied ${c.id} ${tieKey(t)}`);
  }
  const byCord = new Map(net.cords.map((c) => [c.id, c]));
  const faults: CordFault[] = [];
  for (const [key, members] of classes) {
    const [kind, cord, tie] = key.split(' ') as [FaultKind, string, string | undefined];
    const t = tie === undefined ? undefined : tiesOf(byCord.get(cord) as Cord).find((x) => tieKey(x) === tie);
    faults.push({ key, kind, cord, ...(t ? { tie: t } : {}), same: members.filter((m) => m !== key) });
  }
  const order = new Map(net.cords.map((c, i) => [c.id, i]));
  const kindOrder: Record<FaultKind, number> = { slack: 0, taut: 1, untied: 2 };
  faults.sort(
    (a, b) =>
      (order.get(a.cord) ?? 0) - (order.get(b.cord) ?? 0) ||
      kindOrder[a.kind] - kindOrder[b.kind] ||
      (a.key < b.key ? -1 : a.key > b.key ? 1 : 0),
  );
  return { all, faults };
}

/** Lists of driver indices packed into one array (compile.ts's layout). */
function pack(lists: readonly Iterable<number>[]): { start: Int32Array; data: Int32Array } {
  const flat = lists.map((l) => [...l]);
  const start = new Int32Array(lists.length + 1);
  for (let i = 0; i < lists.length; i++) start[i + 1] = start[i] + flat[i].length;
  return { start, data: Int32Array.from(flat.flat()) };
}

/** What puts faults into one compiled netlist: where each cord's branches sit in the gates' input lists. */
export interface FaultInjector {
  readonly sim: PartSim;
  /** The compiled netlist with one fault in it. */
  inject(fault: CordFault): PartSim;
}

/** A fault injector for a compiled netlist; `stageDelayS` times the constant source of a taut cord. */
export function faultInjector(sim: PartSim, stageDelayS: number): FaultInjector {
  const net = sim.build.netlist;
  const index = new Map(sim.ids.map((id, i) => [id, i]));
  // Where each cord's port ties sit: compile.ts lists a gate's inputs cord by cord, port by port.
  const fill = new Int32Array(sim.driverCount);
  const ties = new Map<string, { gate: number; at: number; port: string; part: string }[]>();
  for (const c of net.cords) {
    ties.set(
      c.id,
      c.ports.map((p) => {
        const gate = index.get(p.part) ?? -1;
        return { gate, at: fill[gate]++, port: p.port, part: p.part };
      }),
    );
  }
  const jamUs = Math.max(1, Math.round(stageDelayS * 1e6));
  const byId = new Map(net.cords.map((c) => [c.id, c]));
  return {
    sim,
    inject: (fault) => injected(sim, byId.get(fault.cord) as Cord, fault, ties.get(fault.cord) ?? [], jamUs),
  };
}

function injected(
  sim: PartSim,
  cord: Cord,
  fault: CordFault,
  ties: readonly { gate: number; at: number; port: string; part: string }[],
  jamUs: number,
): PartSim {
  const taut = fault.kind === 'taut';
  const n = sim.driverCount + (taut ? 1 : 0);
  const jam = sim.driverCount;
  const ins: number[][] = [];
  for (let d = 0; d < sim.driverCount; d++)
    ins.push(Array.from(sim.inputs.subarray(sim.inStart[d], sim.inStart[d + 1])));
  if (taut) ins.push([]);
  const hit = (t: { part: string; port: string }): boolean =>
    fault.kind !== 'untied' || (fault.tie?.part === t.part && fault.tie.port === t.port);
  const drop = new Map<number, Set<number>>();
  for (const t of ties) {
    if (!hit(t)) continue;
    if (taut) ins[t.gate][t.at] = jam;
    else drop.set(t.gate, (drop.get(t.gate) ?? new Set()).add(t.at));
  }
  for (const [g, at] of drop) ins[g] = ins[g].filter((_, k) => !at.has(k));
  const { start: inStart, data: inputs } = pack(ins);
  const outs: Set<number>[] = ins.map(() => new Set());
  ins.forEach((list, g) => list.forEach((d) => outs[d].add(g)));
  const { start: fanStart, data: fanout } = pack(outs);
  const latches = sim.latches.map((l): CompiledLatch => ({
    ...l,
    sBar: Int32Array.from(ins[l.set].filter((d) => d !== l.reset)),
    rBar: Int32Array.from(ins[l.reset].filter((d) => d !== l.set)),
  }));
  const watchers: Set<number>[] = Array.from({ length: n }, () => new Set());
  latches.forEach((l, li) => {
    for (const d of l.sBar) watchers[d].add(li);
    for (const d of l.rBar) watchers[d].add(li);
  });
  const { start: watchStart, data: watch } = pack(watchers);
  const driverOf = new Map(sim.ids.map((id, i) => [id, i]));
  const outputs = sim.outputs.map((r, k): OutputReader => {
    if (r.kind !== 'actuator') return r;
    const id = sim.build.signals.outputs[sim.build.machine.outputs[k]] ?? '';
    const ds: number[] = [];
    for (const c of sim.build.netlist.cords) {
      if (!c.actuators.includes(id)) continue;
      if (c.id !== cord.id || !hit({ part: id, port: '' })) ds.push(driverOf.get(c.driver) ?? -1);
      else if (taut) ds.push(jam);
    }
    return { kind: 'actuator', drivers: Int32Array.from(ds) };
  });
  const delayUs = new Int32Array(n);
  delayUs.set(sim.delayUs);
  if (taut) delayUs[jam] = jamUs;
  const latchOf = new Int32Array(n).fill(-1);
  latchOf.set(sim.latchOf);
  return {
    ...sim,
    driverCount: n,
    ids: taut ? [...sim.ids, `jam:${cord.id}`] : sim.ids,
    names: taut ? [...sim.names, `jammed ${cord.id}`] : sim.names,
    inStart,
    inputs,
    fanStart,
    fanout,
    delayUs,
    latches,
    latchOf,
    watchStart,
    watch,
    outputs,
    evaluations: 0,
  };
}
