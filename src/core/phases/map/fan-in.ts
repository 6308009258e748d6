/**
 * Fan-in: a gate takes at most maxPortsPerGate ports of at most maxCordsPerPort cords, so at
 * most P×C cords in all (every cord on every port joins the same AND, design §3). A wider AND
 * is narrowed by a tree: a group of cords goes to a NAND gate whose inverter gives back
 * AND(group) as ONE cord, which takes the group's place. Each stage costs two gates and two
 * gate delays; groups are taken from the end of the list so the leading cords (φ1 of a term
 * gate) stay on the top gate and keep their timing. The replacement cords are put right after
 * the kept leading ones, so fresh cords are grouped before combined ones and the tree stays
 * shallow.
 */
import type { GateRole } from '../../model/netlist.js';
import { DiagnosticError, diag } from '../../model/diagnostics.js';
import type { NetBuilder } from './builder.js';

/** Cords one gate can take on `ports` ports. */
export function capacity(b: NetBuilder, ports = b.profile.maxPortsPerGate): number {
  return ports * b.profile.maxCordsPerPort;
}

/**
 * Narrow `drivers` to at most `slots` cords with NAND + inverter stages named
 * `<owner>.and<k>` and `<owner>.and<k>.inv`; the first `keep` drivers are never grouped.
 */
export function fitAnd(
  b: NetBuilder,
  owner: string,
  role: GateRole,
  drivers: readonly string[],
  slots: number,
  keep = 0,
): string[] {
  const list = [...drivers];
  const cap = capacity(b);
  if (list.length > slots && (cap < 2 || slots < keep + 1)) {
    throw new DiagnosticError([
      diag(
        'LW600',
        `the fan-in limits (${b.profile.maxPortsPerGate} ports × ${b.profile.maxCordsPerPort} cords) are too small to build gate ${owner}`,
        { path: '$.maxPortsPerGate' },
        'allow at least 2 ports per gate and 1 cord per port',
      ),
    ]);
  }
  let k = 0;
  while (list.length > slots) {
    const g = Math.min(cap, list.length - slots + 1, list.length - keep);
    const group = list.splice(list.length - g, g);
    k++;
    const nand = b.gate(`${owner}.and${k}`, `${owner} AND stage ${k}`, role, [{ prefix: 'p', drivers: group }]);
    const inv = b.gate(`${nand}.inv`, `${owner} AND stage ${k} inverter`, 'inverter', [
      { prefix: 'p', drivers: [nand] },
    ]);
    list.splice(keep, 0, inv);
  }
  return list;
}
