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
 * Routing loss: without `losses`, every branch takes its cord's routing in the profile (the
 * build before it is placed). With `losses` (the routed frame, physics/routing.ts), a branch
 * takes its routed loss, and every branch the plan moves or adds — whose route is not known
 * until the build is placed again — the loss of a branch that leaves its bay (`leavingLoss`,
 * the most a computed route costs), so a budget planned here holds once the build is routed.
 * Postconditions: every driver that can be balanced passes; a driver that cannot (a single
 * branch heavier than any capstan can lift, or buffers that cannot help at this μ) is left
 * exactly as it was, so the drive check names its cord. Ids are stable: the k-th pair made
 * for cord X is gates `X.buf<k>a`, `X.buf<k>b` with output cords `X.buf<k>a.out`,
 * `X.buf<k>b.out` (k skips ids already in use); new parts and cords are appended in order.
 */
import type { Cord, GatePart, Netlist, Part, PortRef } from '../model/netlist.js';
import { availableTension, routingFactor, routingFor } from './capstan.js';
import { branchKey, driveBudget, holdWeightG, portLoadG, type BranchLosses } from './drive.js';
import type { Profile } from './profile.js';
import { leavingLoss } from './routing.js';

interface Branch {
  readonly port?: PortRef;
  readonly actuator?: string;
  /** Load before routing loss, grams-force. */
  readonly baseG: number;
  /** Routing loss where the branch is now. */
  readonly loss: number;
}

/** How the plan prices routing: a branch of the netlist, and a branch the plan moves or adds. */
interface LossModel {
  existing(cord: string, target: string): number;
  /** On cord `cord` (default: a new cord). */
  planned(cord?: string): number;
  /** Every branch of a trial netlist's cords, for its budget (undefined: the profile's routing). */
  complete(n: Netlist): BranchLosses | undefined;
}

function lossModel(profile: Profile, losses: BranchLosses | undefined): LossModel {
  const straight = (cord: string): number => routingFactor(routingFor(profile, cord));
  if (!losses)
    return {
      existing: straight,
      planned: (cord) => (cord === undefined ? routingFactor(profile.routing) : straight(cord)),
      complete: () => undefined,
    };
  const leaving = (cord?: string): number => leavingLoss(profile, cord);
  return {
    // A cord the plan gives a new branch leaves its bay, so its branches cost at least that.
    existing: (cord, target) => Math.max(losses.get(branchKey(cord, target)) ?? 0, leaving(cord)),
    planned: leaving,
    complete: (n) => {
      const out = new Map<string, number>();
      for (const c of n.cords)
        for (const t of [...c.ports.map((p) => `${p.part}.${p.port}`), ...c.actuators]) {
          const k = branchKey(c.id, t);
          out.set(k, losses.get(k) ?? leaving(c.id));
        }
      return out;
    },
  };
}

interface WorkCord {
  readonly id: string;
  readonly driver: string;
  branches: Branch[];
}

/** Insert buffer pairs wherever a driver's margin fails, so that every budget that can pass does; `losses` from the routed frame. */
export function balanceDrive(netlist: Netlist, profile: Profile, losses?: BranchLosses): Netlist {
  const failing = driveBudget(netlist, profile, losses).filter((b) => !b.ok);
  if (failing.length === 0) return netlist;
  const parts = new Map(netlist.parts.map((p) => [p.id, p]));
  const used = new Set<string>([...parts.keys(), ...netlist.cords.map((c) => c.id)]);
  const replaced = new Map<string, Cord>();
  const newParts: Part[] = [];
  const newCords: Cord[] = [];
  const model = lossModel(profile, losses);
  const byDriver = cordsByDriver(netlist.cords);
  for (const f of failing) {
    const own = byDriver.get(f.driver) ?? [];
    const plan = planDriver(f.driver, f.driverKind, own, parts, used, profile, model);
    if (!plan || !planHolds(f.driver, own, plan, parts, profile, model)) continue;
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

/** The cords of each driver, in netlist order. */
function cordsByDriver(cords: readonly Cord[]): Map<string, Cord[]> {
  const out = new Map<string, Cord[]>();
  for (const c of cords) {
    const list = out.get(c.driver);
    if (list) list.push(c);
    else out.set(c.driver, [c]);
  }
  return out;
}

/**
 * Whether every budget the plan touches passes once it is made: the driver's and each new
 * buffer's, at their losses (model.complete). A budget depends only on its driver's own cords
 * and the parts they pull, so the trial holds just those, not the whole netlist; every cord in
 * it is the driver's or a new buffer's, so every budget it gives is one the plan touches.
 */
function planHolds(
  driver: string,
  own: readonly Cord[],
  plan: Plan,
  parts: ReadonlyMap<string, Part>,
  profile: Profile,
  model: LossModel,
): boolean {
  const cords = [...own.map((c) => plan.cords.get(c.id) ?? c), ...plan.newCords];
  const involved = new Map<string, Part>(plan.parts.map((p) => [p.id, p]));
  const take = (id: string): void => {
    const p = parts.get(id);
    if (p && !involved.has(id)) involved.set(id, p);
  };
  take(driver);
  for (const c of cords) {
    for (const p of c.ports) take(p.part);
    for (const a of c.actuators) take(a);
  }
  const trial: Netlist = { parts: [...involved.values()], cords };
  return driveBudget(trial, profile, model.complete(trial)).every((b) => b.ok);
}

interface Plan {
  readonly parts: GatePart[];
  /** The driver's own cords, rewritten. */
  readonly cords: Map<string, Cord>;
  readonly newCords: Cord[];
}

/** A branch with the cord it hangs on. */
type Placed = { readonly cord: string; readonly b: Branch };

function planDriver(
  driver: string,
  kind: 'lever' | 'gate',
  own: readonly Cord[],
  parts: ReadonlyMap<string, Part>,
  usedIds: ReadonlySet<string>,
  profile: Profile,
  model: LossModel,
): Plan | undefined {
  return new DriverPlanner(driver, kind, own, parts, usedIds, profile, model).plan();
}

/** The rounds of buffering for one driver (see the module comment); the driver's cords are rewritten in `work`. */
class DriverPlanner {
  private readonly driverBudget: number;
  private readonly gateBudget: number;
  /** The routing loss of a new cord's branch (model.planned; the trial budget in balanceDrive catches a per-cord override). */
  private readonly fNew: number;
  private readonly latch: string | undefined;
  /** Ids taken in the netlist (`usedIds`, read only) or by this plan (`taken`). */
  private readonly taken = new Set<string>();
  private readonly work: WorkCord[];
  private readonly newParts: GatePart[] = [];
  private readonly newCords: WorkCord[] = [];
  private readonly counters = new Map<string, number>();

  constructor(
    driver: string,
    kind: 'lever' | 'gate',
    own: readonly Cord[],
    private readonly parts: ReadonlyMap<string, Part>,
    private readonly usedIds: ReadonlySet<string>,
    private readonly profile: Profile,
    private readonly model: LossModel,
  ) {
    this.driverBudget = availableTension(profile, holdWeightG(profile, kind)).availableG / profile.minMargin;
    this.gateBudget = availableTension(profile, profile.zWeightG).availableG / profile.minMargin;
    this.fNew = model.planned();
    this.work = own.map((c) => ({
      id: c.id,
      driver: c.driver,
      branches: [
        ...c.ports.map((p) => ({
          port: p,
          baseG: portLoadG(profile, parts.get(p.part)),
          loss: model.existing(c.id, `${p.part}.${p.port}`),
        })),
        ...c.actuators.map((a) => {
          const x = parts.get(a);
          return { actuator: a, baseG: x?.kind === 'actuator' ? x.loadG : 0, loss: model.existing(c.id, a) };
        }),
      ],
    }));
    const driverPart = parts.get(driver);
    this.latch = driverPart?.kind === 'gate' ? driverPart.latch : undefined;
  }

  plan(): Plan | undefined {
    for (let round = 0; this.driverLoad() > this.driverBudget; round++) {
      const groups = this.choose(round);
      if (!groups) return undefined;
      for (const g of groups) this.addPair(g);
    }
    if (this.newParts.length === 0) return undefined;
    return {
      parts: this.newParts,
      cords: new Map(this.work.map((c) => [c.id, toCord(c)])),
      newCords: this.newCords.map(toCord),
    };
  }

  private driverLoad(): number {
    return this.work.reduce((s, c) => s + c.branches.reduce((t, b) => t + b.baseG * b.loss, 0), 0);
  }

  /**
   * A latch's feedback branch stays on its driver: a buffer pair in the loop would add two
   * stage delays to the latch's settling. So does a branch a buffer `b` could never carry.
   */
  private movable(b: Branch): boolean {
    const g = b.port ? this.parts.get(b.port.part) : undefined;
    const feedback = this.latch !== undefined && g?.kind === 'gate' && g.latch === this.latch;
    return !feedback && b.baseG * this.fNew <= this.gateBudget;
  }

  /**
   * The groups to move onto buffer pairs this round: the fewest trailing movable branches whose
   * groups fit beside what stays; undefined when no step makes progress.
   */
  private choose(round: number): Placed[][] | undefined {
    const { profile, gateBudget, fNew } = this;
    const all = this.work.flatMap((c) => c.branches.map((b): Placed => ({ cord: c.id, b })));
    const fixed = all.filter((x) => !this.movable(x.b));
    const mov = all.filter((x) => this.movable(x.b));
    const loadOf = (xs: readonly Placed[]): number => xs.reduce((s, x) => s + x.b.baseG * x.b.loss, 0);
    const pairsLoad = (groups: readonly Placed[][]): number =>
      groups.reduce((s, g) => s + profile.zWeightG * this.model.planned(g[0].cord), 0);
    const fixedLoad = loadOf(fixed);
    for (let k = mov.length - 1; k >= 0; k--) {
      const groups = nextFit(mov.slice(k), gateBudget, fNew);
      if (fixedLoad + loadOf(mov.slice(0, k)) + pairsLoad(groups) <= this.driverBudget) return groups;
    }
    // Nothing fits yet: buffer everything and go a level deeper, as long as the step makes
    // progress — a lighter driver (heavy ports become one-port `a` levers) or fewer
    // branches at no more load. Otherwise a deeper tree would never end.
    const groups = nextFit(mov, gateBudget, fNew);
    const before = loadOf(mov);
    const after = pairsLoad(groups);
    const progress = after < before || (groups.length < mov.length && after <= before);
    return !progress || round >= 64 ? undefined : groups;
  }

  /** Move one group of branches of cord x onto a new buffer pair `x.buf<k>a` → `x.buf<k>b`. */
  private addPair(g: readonly Placed[]): void {
    const { profile, model } = this;
    const used = (id: string): boolean => this.usedIds.has(id) || this.taken.has(id);
    const x = g[0].cord;
    let k = this.counters.get(x) ?? 1;
    while (used(`${x}.buf${k}a`) || used(`${x}.buf${k}b`) || used(`${x}.buf${k}a.out`) || used(`${x}.buf${k}b.out`))
      k++;
    this.counters.set(x, k + 1);
    const a = `${x}.buf${k}a`;
    const b = `${x}.buf${k}b`;
    for (const id of [a, b, `${a}.out`, `${b}.out`]) this.taken.add(id);
    this.newParts.push(bufferGate(a), bufferGate(b));
    this.newCords.push({
      id: `${a}.out`,
      driver: a,
      branches: [{ port: { part: b, port: 'in' }, baseG: profile.zWeightG, loss: model.planned(`${a}.out`) }],
    });
    this.newCords.push({
      id: `${b}.out`,
      driver: b,
      branches: g.map((y) => ({ ...y.b, loss: model.planned(`${b}.out`) })),
    });
    const moved = new Set(g.map((y) => y.b));
    const home = this.work.find((c) => c.id === x);
    if (home)
      home.branches = [
        ...home.branches.filter((y) => !moved.has(y)),
        { port: { part: a, port: 'in' }, baseG: profile.zWeightG, loss: model.planned(x) },
      ];
  }
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
