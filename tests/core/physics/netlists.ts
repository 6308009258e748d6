/** Small hand-built netlists and a tiny combinational evaluator for the physics tests. */
import type {
  ActuatorPart,
  Cord,
  GatePart,
  GateRole,
  LeverPart,
  LeverRole,
  Netlist,
  Part,
} from '../../../src/core/model/netlist.js';

export const lever = (id: string, role: LeverRole = 'input'): LeverPart => ({ kind: 'lever', id, name: id, role });

export const gate = (id: string, ports: number | string[], role: GateRole = 'inverter'): GatePart => ({
  kind: 'gate',
  id,
  name: id,
  role,
  ports: (typeof ports === 'number' ? Array.from({ length: ports }, (_, i) => String.fromCharCode(97 + i)) : ports).map(
    (name) => ({ name }),
  ),
});

export const actuator = (id: string, loadG: number): ActuatorPart => ({
  kind: 'actuator',
  id,
  name: id,
  output: id,
  loadG,
});

/** A cord from `driver` to ports written `gate.port` and to actuators. */
export const cord = (id: string, driver: string, ports: string[], actuators: string[] = []): Cord => ({
  id,
  driver,
  ports: ports.map((p) => {
    const [part, port] = p.split('.');
    return { part, port };
  }),
  actuators,
});

/**
 * Lever `L` whose cord `c.L` pulls port `a` of `n` gates `g1…gn`, each with `portsPerGate`
 * ports (the other ports are tied to lever `K` by cord `c.K`).
 */
export function fanOut(n: number, portsPerGate = 1, driver: 'lever' | 'gate' = 'lever'): Netlist {
  const parts: Part[] = [lever('L')];
  const cords: Cord[] = [];
  let src = 'L';
  if (driver === 'gate') {
    parts.push(gate('d', 1));
    cords.push(cord('c.L', 'L', ['d.a']));
    src = 'd';
  }
  const gates = Array.from({ length: n }, (_, i) => gate(`g${i + 1}`, portsPerGate, 'term'));
  parts.push(...gates);
  cords.push(
    cord(
      `c.${src}`,
      src,
      gates.map((g) => `${g.id}.a`),
    ),
  );
  if (portsPerGate > 1) {
    parts.push(lever('K'));
    cords.push(
      cord(
        'c.K',
        'K',
        gates.flatMap((g) => g.ports.slice(1).map((p) => `${g.id}.${p.name}`)),
      ),
    );
  }
  return { parts, cords };
}

/**
 * Output signal of every lever and gate of a combinational netlist (no feedback) for the
 * given pulled levers: a cord pulls when its driver's output is 0; a port is the AND of its
 * cords' signals (1 with no cord); a gate is the NAND of its ports; a lever is 1 when pulled.
 */
export function evaluate(n: Netlist, pulled: ReadonlySet<string>): Map<string, 0 | 1> {
  const out = new Map<string, 0 | 1>();
  for (const p of n.parts) if (p.kind === 'lever') out.set(p.id, pulled.has(p.id) ? 1 : 0);
  const gates = n.parts.filter((p): p is GatePart => p.kind === 'gate');
  for (let pass = 0; pass <= gates.length; pass++) {
    let changed = false;
    for (const g of gates) {
      let allPortsUp = true;
      let known = true;
      for (const p of g.ports) {
        for (const c of n.cords) {
          if (!c.ports.some((r) => r.part === g.id && r.port === p.name)) continue;
          const v = out.get(c.driver);
          if (v === undefined) known = false;
          else if (v === 0) allPortsUp = false;
        }
      }
      if (!known) continue;
      const v: 0 | 1 = allPortsUp ? 0 : 1;
      if (out.get(g.id) !== v) {
        out.set(g.id, v);
        changed = true;
      }
    }
    if (!changed) break;
  }
  return out;
}
