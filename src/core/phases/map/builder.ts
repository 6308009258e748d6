/**
 * A small accumulator for netlists: parts in the order they are added, and ties from a
 * driver (lever or gate) to gate ports and actuators. Each driver gets exactly one cord,
 * `c.<driver>`, carrying every tie as a branch; a driver with no tie gets no cord.
 */
import type {
  ActuatorPart,
  Cord,
  FlagPart,
  GatePart,
  GateRole,
  LatchPart,
  LeverPart,
  LeverRole,
  Netlist,
  Part,
  PortRef,
  PortSpec,
} from '../../model/netlist.js';
import type { Profile } from '../../physics/profile.js';

/** Cords to spread over a gate's ports: at most maxCordsPerPort per port. */
export interface PortGroup {
  /** Port names are `<prefix>1`, `<prefix>2` …, or exactly `single` when one port suffices. */
  readonly prefix: string;
  readonly single?: string;
  /** Driver ids whose cords tie here. */
  readonly drivers: readonly string[];
}

/** Cord id of a driver. */
export function cordId(driver: string): string {
  return `c.${driver}`;
}

export class NetBuilder {
  private readonly parts: Part[] = [];
  private readonly ids = new Set<string>();
  private readonly ties = new Map<string, { ports: PortRef[]; actuators: string[] }>();

  constructor(readonly profile: Profile) {}

  has(id: string): boolean {
    return this.ids.has(id);
  }

  lever(id: string, name: string, role: LeverRole, input?: string): string {
    const p: LeverPart = { kind: 'lever', id, name, role, ...(input !== undefined ? { input } : {}) };
    return this.add(p);
  }

  latch(id: string, name: string, role: 'master' | 'slave', bit: number, setGate: string, resetGate: string): string {
    const p: LatchPart = { kind: 'latch', id, name, role, bit, setGate, resetGate };
    return this.add(p);
  }

  /** A gate whose ports take the given groups of cords, in order. */
  gate(id: string, name: string, role: GateRole, groups: readonly PortGroup[], latch?: string): string {
    const ports: PortSpec[] = [];
    const per = this.profile.maxCordsPerPort;
    for (const g of groups) {
      const chunks = Math.ceil(g.drivers.length / per);
      for (let k = 0; k < chunks; k++) {
        const port = chunks === 1 && g.single ? g.single : `${g.prefix}${k + 1}`;
        ports.push({ name: port });
        for (const d of g.drivers.slice(k * per, (k + 1) * per)) this.tie(d, { part: id, port });
      }
    }
    if (ports.length > this.profile.maxPortsPerGate)
      throw new Error(`gate ${id}: ${ports.length} ports exceed the fan-in limit`);
    const p: GatePart = { kind: 'gate', id, name, role, ports, ...(latch !== undefined ? { latch } : {}) };
    return this.add(p);
  }

  flag(id: string, name: string, output: string, gate: string, inverted: boolean): string {
    const p: FlagPart = { kind: 'flag', id, name, output, gate, inverted };
    return this.add(p);
  }

  /** A flag that never moves: an output that is constant. */
  fixedFlag(id: string, name: string, output: string, value: 0 | 1): string {
    const p: FlagPart = { kind: 'flag', id, name, output, gate: '', inverted: false, fixed: value };
    return this.add(p);
  }

  actuator(id: string, name: string, output: string, loadG: number, driver?: string, fixed?: 0 | 1): string {
    const p: ActuatorPart = { kind: 'actuator', id, name, output, loadG, ...(fixed !== undefined ? { fixed } : {}) };
    this.add(p);
    if (driver !== undefined) this.tieActuator(driver, id);
    return id;
  }

  tie(driver: string, port: PortRef): void {
    this.tiesOf(driver).ports.push(port);
  }

  tieActuator(driver: string, actuator: string): void {
    this.tiesOf(driver).actuators.push(actuator);
  }

  /** The netlist: parts in insertion order, one cord per driver in the drivers' order. */
  build(): Netlist {
    const cords: Cord[] = [];
    for (const p of this.parts) {
      const t = this.ties.get(p.id);
      if (t && (t.ports.length > 0 || t.actuators.length > 0))
        cords.push({ id: cordId(p.id), driver: p.id, ports: t.ports, actuators: t.actuators });
    }
    for (const d of this.ties.keys()) if (!this.ids.has(d)) throw new Error(`cord from unknown driver ${d}`);
    return { parts: [...this.parts], cords };
  }

  private tiesOf(driver: string): { ports: PortRef[]; actuators: string[] } {
    let t = this.ties.get(driver);
    if (!t) this.ties.set(driver, (t = { ports: [], actuators: [] }));
    return t;
  }

  private add(p: Part): string {
    if (this.ids.has(p.id)) throw new Error(`duplicate part id ${p.id}`);
    this.ids.add(p.id);
    this.parts.push(p);
    return p.id;
  }
}
