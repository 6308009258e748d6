/**
 * Part counts of a netlist, for the bill of materials and the encoding search's cost.
 * - gates: every gate part, latch gates included (a latch is two gates);
 * - latches: latch parts (masters and slaves);
 * - levers: operator, clock and reset levers;
 * - capstans: one per gate or lever that drives a cord. A gate whose output pulls nothing (its
 *   Z is only read by a flag) needs no capstan, nor does a lever no cord is tied to; the bill of
 *   materials, the drum length, the drum torque and the cost all use this one count;
 * - weights: one pull-up per lever; per gate one for its summing lever Z plus one per port,
 *   except that a one-port gate's port IS its Z (design §4), so it carries one weight;
 * - cords: cord branches — one per tie of a driver's cord to a port or an actuator (a cord
 *   with k ties counts k), as each branch is cut, routed and tied on its own.
 * Flags and actuators are not counted: they are the machine's face, not its logic.
 */
import type { PartCounts } from '../../model/build.js';
import type { Netlist } from '../../model/netlist.js';
import type { CostWeights } from '../../physics/profile.js';

/** Count gates, latches, levers, capstans, weights and cord branches. */
export function countParts(n: Netlist): PartCounts {
  let gates = 0,
    latches = 0,
    levers = 0,
    weights = 0,
    cords = 0;
  const drivers = new Set(n.cords.map((c) => c.driver));
  let capstans = 0;
  for (const p of n.parts) {
    if ((p.kind === 'gate' || p.kind === 'lever') && drivers.has(p.id)) capstans++;
    if (p.kind === 'gate') {
      gates++;
      weights += p.ports.length <= 1 ? 1 : p.ports.length + 1;
    } else if (p.kind === 'latch') latches++;
    else if (p.kind === 'lever') {
      levers++;
      weights++;
    }
  }
  for (const c of n.cords) cords += c.ports.length + c.actuators.length;
  return { gates, latches, levers, capstans, weights, cords };
}

/** Gates and levers without a capstan: a gate whose output pulls nothing (a flag reads its Z), a lever no cord is tied to. */
export function withoutCapstan(n: Netlist): { readonly gates: number; readonly levers: number } {
  const drivers = new Set(n.cords.map((c) => c.driver));
  let gates = 0,
    levers = 0;
  for (const p of n.parts)
    if (p.kind === 'gate' && !drivers.has(p.id)) gates++;
    else if (p.kind === 'lever' && !drivers.has(p.id)) levers++;
  return { gates, levers };
}

/** "2 gates that only show a flag have no capstan" (or '' when every gate and lever has one). */
export function withoutCapstanWords(n: Netlist): string {
  const w = withoutCapstan(n);
  const parts: string[] = [];
  if (w.gates > 0)
    parts.push(
      `${w.gates} ${w.gates === 1 ? 'gate that only shows a flag has' : 'gates that only show a flag have'} no capstan`,
    );
  if (w.levers > 0)
    parts.push(
      `${w.levers} ${w.levers === 1 ? 'lever that pulls nothing has' : 'levers that pull nothing have'} no capstan`,
    );
  return parts.join('; ');
}

/** The weighted cost of a part count (the profile's cost weights). */
export function partsCost(c: PartCounts, w: CostWeights): number {
  return (
    c.gates * w.gate +
    c.latches * w.latch +
    c.levers * w.lever +
    c.capstans * w.capstan +
    c.weights * w.weight +
    c.cords * w.cord
  );
}
