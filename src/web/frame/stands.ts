/**
 * Where every lever on the frame stands at a moment of the trial run, read off the part-level
 * simulator's values, with the one meaning the trial run's lever drawings have (elements/lever-bank.ts):
 * down = held down, up = at rest on its weight, X = undetermined.
 *
 * The signals are the netlist's (src/core/model/netlist.ts): a cord pulls exactly when its
 * driver gives 0, and pulls down every port lever it is tied to; a port is the wired-AND of its
 * cords; a gate's Z lever is the AND of its ports and its output is NOT Z. So, lever by lever:
 * - an operator, clock or reset lever is down while pulled (its value 1), as the trial run draws it;
 * - a port lever is down while some cord on it pulls (a driver at 0), undetermined while none
 *   pulls but one is undetermined, and up otherwise;
 * - a Z lever is down exactly when its gate gives 1 (the same rule as the trial run's latch
 *   sides: a latch holding 1 has its set side down); a gate with one port has one lever, both
 *   its port and its Z, and the two rules agree on it.
 * An actuator's exit has no lever. Pure.
 */
import type { Netlist, PlacedBay } from '../../core/index.js';

/** Where a lever stands. */
export type Stand = 'down' | 'up' | 'X';

/** Stands by part id, then by lever name (as the placement names the levers of a bay). */
export type Stands = ReadonlyMap<string, ReadonlyMap<string, Stand>>;

/** The simulator's value (0, 1, or 2 for X) of a lever pulled or a gate's output, as the stand of a lever down for 1. */
const downFor1 = (v: number | undefined): Stand => (v === 1 ? 'down' : v === 0 ? 'up' : 'X');

/** A port: down while any cord on it pulls (a driver at 0), X while none does but one is X, up when none pulls. */
function portStand(drivers: readonly number[], values: ArrayLike<number>): Stand {
  let x = false;
  for (const d of drivers) {
    const v = values[d];
    if (v === 0) return 'down';
    if (v !== 1) x = true;
  }
  return x ? 'X' : 'up';
}

/**
 * Every lever of every bay: `ids` are the simulator's drivers in order (PartSim.ids) and `values`
 * their values (PartState.values).
 */
export function leverStands(
  netlist: Netlist,
  bays: readonly PlacedBay[],
  ids: readonly string[],
  values: ArrayLike<number>,
): Stands {
  const index = new Map(ids.map((id, i) => [id, i]));
  const onPort = new Map<string, Map<string, number[]>>();
  for (const c of netlist.cords) {
    const d = index.get(c.driver);
    if (d === undefined) continue;
    for (const p of c.ports) {
      const ports = onPort.get(p.part) ?? new Map<string, number[]>();
      onPort.set(p.part, ports);
      const list = ports.get(p.port) ?? [];
      ports.set(p.port, list);
      list.push(d);
    }
  }
  const kinds = new Map(netlist.parts.map((p) => [p.id, p.kind]));
  const out = new Map<string, Map<string, Stand>>();
  for (const b of bays) {
    const kind = kinds.get(b.part);
    const own = index.get(b.part);
    const levers = new Map<string, Stand>();
    for (const { name } of b.levers) {
      if (kind === 'lever' || (kind === 'gate' && name === 'Z'))
        levers.set(name, downFor1(own === undefined ? undefined : values[own]));
      else if (kind === 'gate') levers.set(name, portStand(onPort.get(b.part)?.get(name) ?? [], values));
    }
    out.set(b.part, levers);
  }
  return out;
}

/** The levers held down, as `part lever` strings in bay order (for reading and for tests). */
export function leversDown(stands: Stands): string[] {
  const out: string[] = [];
  for (const [part, levers] of stands) for (const [name, s] of levers) if (s === 'down') out.push(`${part} ${name}`);
  return out;
}
