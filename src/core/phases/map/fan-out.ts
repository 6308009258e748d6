/**
 * Fan-out: a capstan output may pull only what its force budget allows (design §3, §4).
 * A cord that pulls too much is split by a buffer tree: the driver keeps as many of its
 * branches as it can plus one branch to a first buffer A; A's cord goes to second buffers
 * B1…Bg, and each Bi takes a share of the remaining branches. Two buffer gates in a row give
 * back the driver's own signal (each is a one-port NAND, an inverter), so every branch still
 * sees the same value, two gate delays later. New cords are checked too, so a very wide cord
 * becomes a deeper tree. Which cord is "too much" is the caller's rule: a fixed count until
 * the force-budget check supplies its own.
 */
import type { Cord, GatePart, Netlist, Part, PortRef } from '../../model/netlist.js';
import { cordId } from './builder.js';

/** A fan-out of about 10 ports per capstan (design §4: common practice). */
export const DEFAULT_FANOUT_LIMIT = 10;

/** The default rule: more than DEFAULT_FANOUT_LIMIT branches on one cord. */
export function tooManyBranches(limit = DEFAULT_FANOUT_LIMIT): (cord: Cord) => boolean {
  return (c) => c.ports.length + c.actuators.length > limit;
}

type Item = { readonly port: PortRef } | { readonly actuator: string };

/** Split every cord for which `tooMany` holds into a buffer tree; other cords are untouched. */
export function splitFanout(netlist: Netlist, tooMany: (cord: Cord) => boolean): Netlist {
  if (!netlist.cords.some((c) => c.ports.length + c.actuators.length > 1 && tooMany(c))) return netlist;
  const parts: Part[] = [...netlist.parts];
  const ids = new Set(parts.map((p) => p.id));
  const done: Cord[] = [];
  const queue: Cord[] = [...netlist.cords];
  const insertAfter = (driver: string, gates: Part[]): void => {
    let at = parts.findIndex((p) => p.id === driver);
    // Keep earlier buffers of the same driver ahead of the new ones.
    while (at + 1 < parts.length && parts[at + 1].id.startsWith(`${driver}.buf`)) at++;
    parts.splice(at + 1, 0, ...gates);
  };
  for (let qi = 0; qi < queue.length; qi++) {
    const cord = queue[qi];
    const items: Item[] = [
      ...cord.ports.map((port) => ({ port })),
      ...cord.actuators.map((actuator) => ({ actuator })),
    ];
    if (items.length < 2 || !tooMany(cord)) {
      done.push(cord);
      continue;
    }
    let k = 1;
    while (ids.has(`${cord.driver}.buf${k}`)) k++;
    const a = `${cord.driver}.buf${k}`;
    const toA: Item = { port: { part: a, port: 'p1' } };
    const kept: Item[] = [];
    let next = 0;
    while (next < items.length && !tooMany(make(cord.driver, [...kept, items[next], toA]))) kept.push(items[next++]);
    const groups: Item[][] = [];
    while (next < items.length) {
      const g: Item[] = [items[next++]];
      const bi = `${a}.${groups.length + 1}`;
      while (next < items.length && !tooMany(make(bi, [...g, items[next]]))) g.push(items[next++]);
      groups.push(g);
    }
    // Nothing gained (the driver cannot even carry A, or every branch needs its own buffer
    // and there are as many as before): leave the cord as it is for the budget check to report.
    if (tooMany(make(cord.driver, [toA])) || (kept.length === 0 && groups.length >= items.length)) {
      done.push(cord);
      continue;
    }
    const bs = groups.map((_, i) => `${a}.${i + 1}`);
    const gates: GatePart[] = [a, ...bs].map((id) => ({
      kind: 'gate',
      id,
      name: `buffer of ${cord.driver}`,
      role: 'buffer',
      ports: [{ name: 'p1' }],
    }));
    for (const g of gates) ids.add(g.id);
    insertAfter(cord.driver, gates);
    done.push({ ...make(cord.driver, [...kept, toA]), id: cord.id });
    queue.push(
      make(
        a,
        bs.map((id) => ({ port: { part: id, port: 'p1' } })),
      ),
    );
    groups.forEach((g, i) => queue.push(make(bs[i], g)));
  }
  // Cords follow their drivers' part order, as the builder emits them.
  const order = new Map(parts.map((p, i) => [p.id, i]));
  done.sort((x, y) => (order.get(x.driver) ?? 0) - (order.get(y.driver) ?? 0));
  return { parts, cords: done };
}

function make(driver: string, items: readonly Item[]): Cord {
  const ports: PortRef[] = [];
  const actuators: string[] = [];
  for (const it of items) {
    if ('port' in it) ports.push(it.port);
    else actuators.push(it.actuator);
  }
  return { id: cordId(driver), driver, ports, actuators };
}
