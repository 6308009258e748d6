/**
 * The settled outputs of a build without latches (a one-state machine is built as a plain
 * NAND network of input levers, inverters and output gates, with no clock or reset levers).
 *
 * Method: three-valued fixpoint evaluation (every gate starts unknown; a gate is NAND over the
 * drivers of every cord on every port: any 0 gives 1, all 1 give 0, else unknown), repeated
 * until nothing changes. A network without loops settles within one pass per gate. The values
 * follow the part model of model/netlist.ts: an input lever's output is 1 exactly when it is
 * pulled; a flag reads its gate's Z = NOT(output), mounted inverted or not; an actuator shows 1
 * while a cord on it pulls (its driver's output is 0).
 */
import type { Build } from '../model/build.js';

const U = 2;

/** What each output part shows for one input setting ('0'/'1' per input, 1 = pulled). */
export function combinationalOutputs(build: Build, assignment: string): { output: string; part: string; kind: 'flag' | 'actuator'; shows: string }[] {
  const n = build.netlist;
  const value = new Map<string, number>();
  const inputsOf = new Map<string, string[]>();
  for (const c of n.cords) for (const r of c.ports) inputsOf.set(r.part, [...(inputsOf.get(r.part) ?? []), c.driver]);
  for (const p of n.parts) {
    if (p.kind === 'lever') value.set(p.id, p.role === 'input' && assignment[build.machine.inputs.indexOf(p.input ?? '')] === '1' ? 1 : 0);
    else if (p.kind === 'gate') value.set(p.id, U);
  }
  const gates = n.parts.filter((p) => p.kind === 'gate');
  for (let pass = 0, again = true; again && pass <= gates.length; pass++) {
    again = false;
    for (const g of gates) {
      const ins = (inputsOf.get(g.id) ?? []).map((d) => value.get(d) ?? U);
      const v = ins.includes(0) ? 1 : ins.includes(U) ? U : 0;
      if (v !== value.get(g.id)) {
        value.set(g.id, v);
        again = true;
      }
    }
  }
  const parts = new Map(n.parts.map((p) => [p.id, p]));
  const text = (v: number): string => (v === U ? 'X' : String(v));
  return build.machine.outputs.map((o) => {
    const id = build.signals.outputs[o] ?? '';
    const part = parts.get(id);
    if (part?.kind === 'actuator') {
      if (part.fixed !== undefined) return { output: o, part: id, kind: 'actuator' as const, shows: String(part.fixed) };
      const ds = n.cords.filter((c) => c.actuators.includes(id)).map((c) => value.get(c.driver) ?? U);
      return { output: o, part: id, kind: 'actuator' as const, shows: ds.includes(0) ? '1' : ds.includes(U) ? 'X' : '0' };
    }
    if (part?.kind === 'flag' && part.fixed !== undefined) return { output: o, part: id, kind: 'flag' as const, shows: String(part.fixed) };
    const out = part?.kind === 'flag' ? value.get(part.gate) ?? U : U;
    const z = out === U ? U : 1 - out;
    const shown = z === U || part?.kind !== 'flag' ? z : part.inverted ? 1 - z : z;
    return { output: o, part: id, kind: 'flag' as const, shows: text(shown) };
  });
}
