/**
 * The staged bring-up of a build: in what order a workshop mounts the parts and ties the
 * cords, and what to check after each stage, so a wrong tie is found in the stage that made
 * it, among a handful of cords, before more are tied over it. This is the incremental
 * "build a little, test a little" practice of assembly and commissioning (common practice);
 * the checks are found by the search of bring-up-search.ts, and bring-up.ts puts the two together.
 *
 * Method (the stages): stage 1 is the frame, drums and drive with nothing tied; stage 2 every
 * operator, clock and reset lever with its capstan; then the gates in signal-flow order from
 * the levers toward the latches and outputs. The gates are grouped into units that are never
 * split: a latch's two gates (with their feedback cords), a slave latch with the transfer
 * gates that set it, and every other gate alone. Units go in the stage order of stages.ts
 * (levers → input inverters and the reset driver → φ1 term gates → master latches → transfer
 * gates and slaves → output gates), within one stage rank drivers before the gates they feed
 * (Kahn's topological order, ties by netlist position; a cord from a later rank back to an
 * earlier one, a slave's output into a term gate, is the machine's state loop and ignored),
 * and are packed greedily into stages of at most GATES_PER_STAGE gates (a larger unit is a
 * stage alone). A flag is mounted with the gate whose Z lever it rides, an actuator with the
 * part whose cord lifts it; a part pinned at a constant with the frame.
 * A cord branch (one cord to one port or actuator) is tied in the stage that mounts the later
 * of its two ends.
 *
 * Preconditions: a build whose netlist keeps the invariants of model/netlist.ts.
 * Postconditions: every part is mounted in exactly one stage; every branch is tied in exactly
 * one stage, never before both its ends are mounted; after the last stage the partial machine
 * is the whole build. Deterministic: the same build gives the same stages.
 */
import type { GatePart, Netlist, Part } from '../model/netlist.js';
import { stagesOf, STAGE_RANK } from './stages.js';

/** The most gates a stage mounts (a latch with its two transfer gates is four): few enough that a wrong tie is found among a handful of cords. */
export const GATES_PER_STAGE = 4;

/** One cord branch: a cord from its driver to one port of a gate, or to an actuator (`port` ''). */
export interface Branch {
  readonly cord: string;
  readonly driver: string;
  readonly target: string;
  readonly port: string;
}

/** What a stage is for. */
export type StageKind = 'frame' | 'levers' | 'gates';

/** One stage of the bring-up: what to mount and what to tie (the checks are in `BringUpStage`). */
export interface MountStage {
  /** Counted from 1. */
  readonly number: number;
  readonly kind: StageKind;
  /** Part ids to mount, in order (a latch part with its two gates, a flag after its gate). */
  readonly parts: readonly string[];
  /** The gates among them, in order. */
  readonly gates: readonly string[];
  /** Every branch whose two ends are mounted by the end of this stage and not before. */
  readonly ties: readonly Branch[];
}

/** Every branch of a netlist, in netlist order (ports, then actuators, per cord). */
export function branchesOf(net: Netlist): Branch[] {
  return net.cords.flatMap((c) => [
    ...c.ports.map((p) => ({ cord: c.id, driver: c.driver, target: p.part, port: p.port })),
    ...c.actuators.map((a) => ({ cord: c.id, driver: c.driver, target: a, port: '' })),
  ]);
}

/** A stable key of a branch. */
export const branchId = (b: Branch): string => `${b.cord}\u0000${b.target}\u0000${b.port}`;

interface Unit {
  readonly gates: string[];
  readonly rank: number;
  readonly position: number;
}

/** The unit key of every gate: its latch, the slave latch a transfer gate sets, or itself. */
function unitKeys(net: Netlist): Map<string, string> {
  const parts = new Map(net.parts.map((p) => [p.id, p]));
  const key = new Map<string, string>();
  for (const p of net.parts) if (p.kind === 'gate') key.set(p.id, p.latch ?? p.id);
  for (const c of net.cords) {
    const d = parts.get(c.driver);
    if (d?.kind !== 'gate' || d.role !== 'transfer') continue;
    const slave = c.ports.map((r) => parts.get(r.part)).find((g): g is GatePart => g?.kind === 'gate' && !!g.latch);
    if (slave?.latch !== undefined) key.set(d.id, slave.latch);
  }
  return key;
}

/** The gate units in mounting order (see the module comment). */
function orderedUnits(net: Netlist): Unit[] {
  const info = stagesOf(net);
  const keys = unitKeys(net);
  const units = new Map<string, Unit>();
  for (const p of net.parts) {
    if (p.kind !== 'gate') continue;
    const k = keys.get(p.id) ?? p.id;
    const rank = STAGE_RANK[info.stage.get(p.id) ?? 'output'];
    const pos = info.position.get(p.id) ?? 0;
    const u = units.get(k);
    if (u) units.set(k, { gates: [...u.gates, p.id], rank: Math.min(u.rank, rank), position: u.position });
    else units.set(k, { gates: [p.id], rank, position: pos });
  }
  const unitOf = (gate: string): string => keys.get(gate) ?? gate;
  const feeds = new Map<string, Set<string>>();
  for (const c of net.cords) {
    if (!keys.has(c.driver)) continue;
    const from = unitOf(c.driver);
    for (const r of c.ports) {
      const to = unitOf(r.part);
      const a = units.get(from);
      const b = units.get(to);
      if (to !== from && a && b && a.rank === b.rank) feeds.set(to, (feeds.get(to) ?? new Set()).add(from));
    }
  }
  return topological([...units.entries()], feeds);
}

/** Units by rank, then drivers before readers within a rank, ties (and any loop) by netlist position. */
function topological(entries: [string, Unit][], feeds: ReadonlyMap<string, ReadonlySet<string>>): Unit[] {
  const remaining = new Map(entries);
  const done = new Set<string>();
  const out: Unit[] = [];
  const byOrder = (a: [string, Unit], b: [string, Unit]): number =>
    a[1].rank - b[1].rank || a[1].position - b[1].position;
  while (remaining.size > 0) {
    const rest = [...remaining.entries()].sort(byOrder);
    const lowest = rest[0][1].rank;
    const ready = rest.find(
      ([k, u]) => u.rank === lowest && [...(feeds.get(k) ?? [])].every((f) => done.has(f) || !remaining.has(f)),
    );
    const [k, u] = ready ?? rest[0];
    remaining.delete(k);
    done.add(k);
    out.push(u);
  }
  return out;
}

/** Gate units packed into stages of at most GATES_PER_STAGE gates, in order. */
function packed(units: readonly Unit[]): string[][] {
  const stages: string[][] = [];
  let current: string[] = [];
  for (const u of units) {
    if (current.length > 0 && current.length + u.gates.length > GATES_PER_STAGE) {
      stages.push(current);
      current = [];
    }
    current.push(...u.gates);
  }
  if (current.length > 0) stages.push(current);
  return stages;
}

/** The parts each stage mounts: the frame's constants, the levers, then the gates with their latches, flags and actuators. */
function partsByStage(net: Netlist, gateStages: readonly string[][]): { kind: StageKind; parts: string[] }[] {
  const stageOfGate = new Map(gateStages.flatMap((gs, i) => gs.map((g) => [g, i + 2] as const)));
  const parts: Part[] = [...net.parts];
  const levers = parts.filter((p) => p.kind === 'lever').map((p) => p.id);
  const frame: string[] = [];
  const withGate = new Map<string, string[]>();
  const attach = (gate: string, id: string): void => void withGate.set(gate, [...(withGate.get(gate) ?? []), id]);
  const lifter = new Map<string, string>();
  for (const c of net.cords) for (const a of c.actuators) if (!lifter.has(a)) lifter.set(a, c.driver);
  for (const p of parts) {
    if (p.kind === 'latch') attach(p.resetGate, p.id);
    else if (p.kind === 'flag' && p.fixed === undefined && stageOfGate.has(p.gate)) attach(p.gate, p.id);
    else if (p.kind === 'flag') frame.push(p.id);
    else if (p.kind === 'actuator') {
      const by = lifter.get(p.id);
      if (by !== undefined && stageOfGate.has(by)) attach(by, p.id);
      else if (by !== undefined && levers.includes(by)) levers.push(p.id);
      else frame.push(p.id);
    }
  }
  return [
    { kind: 'frame', parts: frame },
    { kind: 'levers', parts: levers },
    ...gateStages.map((gs) => ({ kind: 'gates' as const, parts: gs.flatMap((g) => [g, ...(withGate.get(g) ?? [])]) })),
  ];
}

/** The stages of a build's bring-up: what to mount and what to tie, without the checks. */
export function mountStages(net: Netlist): MountStage[] {
  const gateStages = packed(orderedUnits(net));
  const layout = partsByStage(net, gateStages);
  const mountedIn = new Map(layout.flatMap((s, i) => s.parts.map((p) => [p, i] as const)));
  const ties: Branch[][] = layout.map(() => []);
  for (const b of branchesOf(net)) {
    const at = Math.max(mountedIn.get(b.driver) ?? 0, mountedIn.get(b.target) ?? 0);
    ties[at].push(b);
  }
  const gates = new Set(net.parts.filter((p) => p.kind === 'gate').map((p) => p.id));
  return layout.map((s, i) => ({
    number: i + 1,
    kind: s.kind,
    parts: s.parts,
    gates: s.parts.filter((p) => gates.has(p)),
    ties: ties[i],
  }));
}
