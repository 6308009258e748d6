/**
 * Placement units from a netlist (design §11).
 *
 * Every gate, lever and actuator gets a bay along the drum axis:
 * - a gate's bay holds its levers side by side on the pivot rail — one per port and its Z
 *   lever, or a single lever for a one-port gate (its port is its Z) — and its capstan's wraps
 *   on the drum below;
 * - an operator, clock or reset lever's bay holds the lever and its capstan;
 * - an actuator's bay holds the exit pulley its cord leaves the frame by.
 * Bay width = max(levers × lever pitch, wraps × wrap pitch + clearance), with the capstan's own
 * turns (a gate's `wraps` where it has them, physics/capstan.ts); a part that pulls no cord has
 * no capstan, and its bay is as wide as its levers. An exit bay is max(lever pitch, pulley
 * diameter + clearance). A latch is one unit: its two gates in
 * neighbouring bays, in either order. Operator levers and actuator exits belong at the visitor
 * end (zone 0), clock and reset levers at the crank end (zone 2), the rest anywhere (zone 1).
 * Flags ride on their gate's Z lever and take no bay.
 *
 * The cords are the nets: each branch (a cord's tie to one port or actuator) joins its
 * driver's bay to its target's bay. Units are listed in the order their first part appears
 * in the netlist: that order is the baseline every method is measured against.
 */
import type { Netlist, Part } from '../../model/netlist.js';
import { wrapsOf } from '../../physics/capstan.js';
import type { Profile } from '../../physics/profile.js';
import type { Zone } from './problem.js';

export interface Bay {
  /** The gate, lever or actuator in this bay. */
  readonly part: string;
  readonly kind: 'gate' | 'lever' | 'actuator';
  readonly widthM: number;
  /** Levers on the rail, left to right: port names (and 'Z' after them on a gate with two or more ports), 'lever', or 'exit'. */
  readonly levers: readonly string[];
  readonly unit: number;
}

export interface Unit {
  /** The part id: a lever, gate, actuator or latch. */
  readonly id: string;
  readonly kind: 'gate' | 'lever' | 'latch' | 'actuator';
  /** Bay indices, in order (a latch: set-side gate, then reset-side gate). */
  readonly bays: readonly number[];
  readonly zone: Zone;
  readonly widthM: number;
}

export interface Branch {
  readonly cord: string;
  readonly driver: string;
  readonly driverBay: number;
  /** `gate.port` for a port, the actuator id for an actuator (as in the drive budget). */
  readonly target: string;
  readonly kind: 'port' | 'actuator';
  readonly targetBay: number;
  /** The lever tied to: the port's name, or 'exit' for an actuator. */
  readonly lever: string;
}

export interface FrameUnits {
  readonly bays: readonly Bay[];
  readonly units: readonly Unit[];
  readonly branches: readonly Branch[];
  /** Bay index by part id (gates, levers, actuators). */
  readonly bayOf: ReadonlyMap<string, number>;
  /** Unit index by part id (also latches, and each latch gate → its latch's unit). */
  readonly unitOf: ReadonlyMap<string, number>;
}

/** Levers a gate puts on the rail: its ports, and Z unless its one port is Z. */
export function gateLevers(ports: readonly { readonly name: string }[]): string[] {
  if (ports.length === 0) return ['Z'];
  if (ports.length === 1) return [ports[0].name];
  return [...ports.map((p) => p.name), 'Z'];
}

function zoneOf(p: Part): Zone {
  if (p.kind === 'lever') return p.role === 'input' ? 0 : 2;
  return p.kind === 'actuator' ? 0 : 1;
}

/** Bays, units and branches of a netlist under a profile's geometry. */
export function frameUnits(netlist: Netlist, profile: Profile): FrameUnits {
  const f = profile.frame;
  const drivers = new Set(netlist.cords.map((c) => c.driver));
  const capstan = (part: Part): number =>
    drivers.has(part.id) ? wrapsOf(part, profile) * profile.wrapPitchM + f.bayClearanceM : 0;
  const bays: Bay[] = [];
  const units: Unit[] = [];
  const bayOf = new Map<string, number>();
  const unitOf = new Map<string, number>();
  const parts = new Map(netlist.parts.map((p) => [p.id, p]));
  const addBay = (part: Part, unit: number): number => {
    const levers = part.kind === 'gate' ? gateLevers(part.ports) : part.kind === 'lever' ? ['lever'] : ['exit'];
    const widthM =
      part.kind === 'actuator'
        ? Math.max(f.leverPitchM, f.pulleyDiameterM + f.bayClearanceM)
        : Math.max(levers.length * f.leverPitchM, capstan(part));
    const kind = part.kind === 'gate' ? 'gate' : part.kind === 'lever' ? 'lever' : 'actuator';
    bays.push({ part: part.id, kind, widthM, levers, unit });
    bayOf.set(part.id, bays.length - 1);
    return bays.length - 1;
  };
  for (const part of netlist.parts) {
    if (unitOf.has(part.id) || part.kind === 'flag') continue;
    if (part.kind === 'actuator' && part.fixed !== undefined) continue;
    const latch = part.kind === 'gate' && part.latch !== undefined ? parts.get(part.latch) : part;
    if (latch?.kind === 'latch') {
      const u = units.length;
      const gates = [latch.setGate, latch.resetGate].map((id) => parts.get(id));
      const ids = gates.map((g) => {
        if (g?.kind !== 'gate') throw new Error(`latch '${latch.id}' names a gate that is not in the netlist`);
        unitOf.set(g.id, u);
        return addBay(g, u);
      });
      unitOf.set(latch.id, u);
      units.push({ id: latch.id, kind: 'latch', bays: ids, zone: 1, widthM: sumWidths(bays, ids) });
      continue;
    }
    const u = units.length;
    const b = addBay(part, u);
    unitOf.set(part.id, u);
    units.push({ id: part.id, kind: bays[b].kind, bays: [b], zone: zoneOf(part), widthM: bays[b].widthM });
  }
  return { bays, units, branches: branchesOf(netlist, bayOf), bayOf, unitOf };
}

function sumWidths(bays: readonly Bay[], ids: readonly number[]): number {
  return ids.reduce((s, b) => s + bays[b].widthM, 0);
}

function branchesOf(netlist: Netlist, bayOf: ReadonlyMap<string, number>): Branch[] {
  const out: Branch[] = [];
  const bay = (id: string, cord: string): number => {
    const b = bayOf.get(id);
    if (b === undefined) throw new Error(`cord '${cord}' names '${id}', which has no bay`);
    return b;
  };
  for (const c of netlist.cords) {
    const driverBay = bay(c.driver, c.id);
    for (const p of c.ports)
      out.push({
        cord: c.id,
        driver: c.driver,
        driverBay,
        target: `${p.part}.${p.port}`,
        kind: 'port',
        targetBay: bay(p.part, c.id),
        lever: p.port,
      });
    for (const a of c.actuators)
      out.push({
        cord: c.id,
        driver: c.driver,
        driverBay,
        target: a,
        kind: 'actuator',
        targetBay: bay(a, c.id),
        lever: 'exit',
      });
  }
  return out;
}
