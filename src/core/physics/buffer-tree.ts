/**
 * Buffer trees sized by force budget (design §3 "Fan-out", §4).
 *
 * What it does: for every driver whose margin fails, moves the branches it cannot carry onto
 * buffer pairs. A pair is two one-port gates in a row (role 'buffer'): `a` is tied to the
 * driver's cord and inverts, `b` is driven by `a` and inverts back, so `b`'s output cord pulls
 * exactly when the driver's does and the logic is unchanged. The driver then lifts only the
 * one-port `a` levers (the Z weight each) in place of the groups of ports.
 * Method: greedy bin packing in cord order (next-fit; D. S. Johnson, "Near-optimal bin packing
 * algorithms", MIT thesis, 1973 — from memory): the driver keeps as many of its first branches
 * as fit beside the `a` ports of the groups; each group fills one `b` capstan up to its budget
 * (available / minMargin). If the `a` ports still overload the driver, the step repeats on
 * them, giving a deeper tree; every step lightens the driver or removes branches, or stops.
 * Preconditions: a netlist meeting the netlist invariants.
 * A latch's feedback cord branch is never moved (it would slow the latch).
 * Postconditions: every driver that can be balanced passes; a driver that cannot (a single
 * branch heavier than any capstan can lift, or buffers that cannot help at this μ) is left
 * exactly as it was, so the drive check names its cord. Ids are stable: the k-th pair made
 * for cord X is gates `X.buf<k>a`, `X.buf<k>b` with output cords `X.buf<k>a.out`,
 * `X.buf<k>b.out` (k skips ids already in use); new parts and cords are appended in order.
 */
import type { Cord, GatePart, Netlist, Part, PortRef } from '../model/netlist.js';
import { availableTension, routingFactor, routingFor } from './capstan.js';
import { driveBudget, holdWeightG, portLoadG } from './drive.js';
import type { Profile } from './profile.js';

interface Branch {
  readonly port?: PortRef;
  readonly actuator?: string;
  /** Load before routing loss, grams-force. */
  readonly baseG: number;
}

interface WorkCord {
  readonly id: string;
  readonly driver: string;
  branches: Branch[];
}

/** Insert buffer pairs wherever a driver's margin fails, so that every budget that can pass does. */
export function balanceDrive(netlist: Netlist, profile: Profile): Netlist {
  const failing = driveBudget(netlist, profile).filter((b) => !b.ok);
  if (failing.length === 0) return netlist;
  const parts = new Map(netlist.parts.map((p) => [p.id, p]));
  const used = new Set<string>([...parts.keys(), ...netlist.cords.map((c) => c.id)]);
  const replaced = new Map<string, Cord>();
  const newParts: Part[] = [];
  const newCords: Cord[] = [];
  for (const f of failing) {
    const own = netlist.cords.filter((c) => c.driver === f.driver);
    const plan = planDriver(f.driver, f.driverKind, own, parts, used, profile);
    if (!plan) continue;
    const trial: Netlist = {
      parts: [...netlist.parts, ...plan.parts],
      cords: [...netlist.cords.map((c) => plan.cords.get(c.id) ?? c), ...plan.newCords],
    };
    const mine = new Set([f.driver, ...plan.parts.map((p) => p.id)]);
    if (!driveBudget(trial, profile).every((b) => !mine.has(b.driver) || b.ok)) continue;
    for (const [id, c] of plan.cords) replaced.set(id, c);
    newParts.push(...plan.parts);
    newCords.push(...plan.newCords);
    for (const p of plan.parts) used.add(p.id);
    for (const c of plan.newCords) used.add(c.id);
  }
  if (newParts.length === 0) return netlist;
  return {
    parts: [...netlist.parts, ...newParts],
    cords: [...netlist.cords.map((c) => replaced.get(c.id) ?? c), ...newCords],
  };
}

interface Plan {
  readonly parts: GatePart[];
  /** The driver's own cords, rewritten. */
  readonly cords: Map<string, Cord>;
  readonly newCords: Cord[];
}

function planDriver(
  driver: string,
  kind: 'lever' | 'gate',
  own: readonly Cord[],
  parts: ReadonlyMap<string, Part>,
  usedIds: ReadonlySet<string>,
  profile: Profile,
): Plan | undefined {
  const driverBudget = availableTension(profile, holdWeightG(profile, kind)).availableG / profile.minMargin;
  const gateBudget = availableTension(profile, profile.zWeightG).availableG / profile.minMargin;
  const f = (cordId: string): number => routingFactor(routingFor(profile, cordId));
  const used = new Set(usedIds);
  const work: WorkCord[] = own.map((c) => ({
    id: c.id,
    driver: c.driver,
    branches: [
      ...c.ports.map((p) => ({ port: p, baseG: portLoadG(profile, parts.get(p.part)) })),
      ...c.actuators.map((a) => {
        const x = parts.get(a);
        return { actuator: a, baseG: x?.kind === 'actuator' ? x.loadG : 0 };
      }),
    ],
  }));
  const newParts: GatePart[] = [];
  const newCords: WorkCord[] = [];
  const counters = new Map<string, number>();
  const driverLoad = (): number => work.reduce((s, c) => s + c.branches.reduce((t, b) => t + b.baseG * f(c.id), 0), 0);
  // New cords are planned with the default routing loss; the trial budget in balanceDrive
  // catches a per-cord override on a new cord id.
  const fNew = routingFactor(profile.routing);
  // A latch's feedback branch stays on its driver: a buffer pair in the loop would add two
  // stage delays to the latch's settling. So does a branch a buffer `b` could never carry.
  const driverPart = parts.get(driver);
  const latch = driverPart?.kind === 'gate' ? driverPart.latch : undefined;
  const feedback = (b: Branch): boolean => {
    const g = b.port ? parts.get(b.port.part) : undefined;
    return latch !== undefined && g?.kind === 'gate' && g.latch === latch;
  };
  const movable = (b: Branch): boolean => !feedback(b) && b.baseG * fNew <= gateBudget;

  for (let round = 0; driverLoad() > driverBudget; round++) {
    const all = work.flatMap((c) => c.branches.map((b) => ({ cord: c.id, b })));
    const fixed = all.filter((x) => !movable(x.b));
    const mov = all.filter((x) => movable(x.b));
    const fixedLoad = fixed.reduce((s, x) => s + x.b.baseG * f(x.cord), 0);
    let chosen: { k: number; groups: (typeof mov)[] } | undefined;
    for (let k = mov.length - 1; k >= 0; k--) {
      const groups = nextFit(mov.slice(k), gateBudget, fNew);
      const cost =
        fixedLoad +
        mov.slice(0, k).reduce((s, x) => s + x.b.baseG * f(x.cord), 0) +
        groups.reduce((s, g) => s + profile.zWeightG * f(g[0].cord), 0);
      if (cost <= driverBudget) {
        chosen = { k, groups };
        break;
      }
    }
    if (!chosen) {
      // Nothing fits yet: buffer everything and go a level deeper, as long as the step makes
      // progress — a lighter driver (heavy ports become one-port `a` levers) or fewer
      // branches at no more load. Otherwise a deeper tree would never end.
      const groups = nextFit(mov, gateBudget, fNew);
      const before = mov.reduce((s, x) => s + x.b.baseG * f(x.cord), 0);
      const after = groups.reduce((s, g) => s + profile.zWeightG * f(g[0].cord), 0);
      const progress = after < before || (groups.length < mov.length && after <= before);
      if (!progress || round >= 64) return undefined;
      chosen = { k: 0, groups };
    }
    for (const g of chosen.groups) {
      const x = g[0].cord;
      let k = counters.get(x) ?? 1;
      while (
        used.has(`${x}.buf${k}a`) ||
        used.has(`${x}.buf${k}b`) ||
        used.has(`${x}.buf${k}a.out`) ||
        used.has(`${x}.buf${k}b.out`)
      )
        k++;
      counters.set(x, k + 1);
      const a = `${x}.buf${k}a`;
      const b = `${x}.buf${k}b`;
      for (const id of [a, b, `${a}.out`, `${b}.out`]) used.add(id);
      newParts.push(bufferGate(a), bufferGate(b));
      newCords.push({
        id: `${a}.out`,
        driver: a,
        branches: [{ port: { part: b, port: 'in' }, baseG: profile.zWeightG }],
      });
      newCords.push({ id: `${b}.out`, driver: b, branches: g.map((y) => y.b) });
      const moved = new Set(g.map((y) => y.b));
      const home = work.find((c) => c.id === x);
      if (home)
        home.branches = [
          ...home.branches.filter((y) => !moved.has(y)),
          { port: { part: a, port: 'in' }, baseG: profile.zWeightG },
        ];
    }
  }
  if (newParts.length === 0) return undefined;
  return {
    parts: newParts,
    cords: new Map(work.map((c) => [c.id, toCord(c)])),
    newCords: newCords.map(toCord),
  };
}

/** Groups of consecutive branches of one cord, each group's load within `capacity`. */
function nextFit<T extends { cord: string; b: Branch }>(items: readonly T[], capacity: number, factor: number): T[][] {
  const groups: T[][] = [];
  let load = 0;
  for (const it of items) {
    const l = it.b.baseG * factor;
    const cur = groups[groups.length - 1];
    if (cur && cur[0].cord === it.cord && load + l <= capacity) {
      cur.push(it);
      load += l;
    } else {
      groups.push([it]);
      load = l;
    }
  }
  return groups;
}

function bufferGate(id: string): GatePart {
  return { kind: 'gate', id, name: id, role: 'buffer', ports: [{ name: 'in' }] };
}

function toCord(c: WorkCord): Cord {
  return {
    id: c.id,
    driver: c.driver,
    ports: c.branches.flatMap((b) => (b.port ? [b.port] : [])),
    actuators: c.branches.flatMap((b) => (b.actuator ? [b.actuator] : [])),
  };
}
