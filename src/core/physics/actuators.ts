/**
 * Actuators sized by their force budget (design §3 "Output", §4): an output with a load is
 * pulled by a capstan output, and that capstan must lift the load with the design margin.
 *
 * What it does, for every actuator whose capstan is over budget:
 * - When the capstan pulls other branches too (ports, other actuators), or is a lever's or a
 *   latch's, and the actuator is heavier than a buffer could carry at the profile's `wraps`
 *   (so the buffer trees of buffer-tree.ts cannot help), the actuator moves onto a buffer
 *   pair of its own: `<actuator>.a`, a one-port gate tied to the old cord (it inverts), drives
 *   `<actuator>.b` (it inverts back), whose cord pulls only the actuator — the same signal, two
 *   gate stages later. A lighter actuator stays where it is: balanceDrive moves it onto a
 *   buffer pair if its driver still fails.
 * - The capstan that now pulls only the actuator gets the fewest quarter turns, at least the
 *   profile's `wraps` and at most `maxWraps`, that lift it with margin ≥ minMargin: by the
 *   capstan equation, minMargin · load = T_hold · e^(μθ), θ = 2π · turns, so
 *   turns = ln(minMargin · load / T_hold) / (2πμ) (capstan.ts `wrapsNeeded`). Its gate part
 *   carries them as `wraps`.
 * Where even `maxWraps` turns fall short, the capstan keeps `maxWraps` and the drive check
 * fails naming the output, how far short it is, and what to change.
 * Routing loss of an actuator's branch: its cord's routing in the profile, or with `losses`
 * (the frame's, physics/routing.ts) its entry there — and for a branch the sizing moves, the
 * loss of a branch that leaves its bay (`leavingLoss`).
 * Preconditions: a netlist meeting the netlist invariants.
 * Postconditions: the logic is unchanged (every actuator sees the same signal); new parts come
 * just before the actuator they drive, cords in their drivers' order; a netlist with no
 * actuator over budget is returned as it is.
 */
import type { Cord, GatePart, Netlist, Part } from '../model/netlist.js';
import { availableTension, routingFactor, routingFor, wrapsNeeded } from './capstan.js';
import { branchKey, driveBudget, type BranchLosses } from './drive.js';
import type { Profile } from './profile.js';
import { leavingLoss } from './routing.js';

/** Give every actuator over budget a capstan of its own, with the turns its load needs; `losses` from the frame. */
export function sizeActuators(netlist: Netlist, profile: Profile, losses?: BranchLosses): Netlist {
  const failing = new Set(
    driveBudget(netlist, profile, losses)
      .filter((b) => !b.ok)
      .map((b) => b.driver),
  );
  if (!netlist.cords.some((c) => c.actuators.length > 0 && failing.has(c.driver))) return netlist;
  const loss = (cordId: string, actuator: string): number =>
    losses
      ? (losses.get(branchKey(cordId, actuator)) ?? leavingLoss(profile, cordId))
      : routingFactor(routingFor(profile, cordId));
  const s = new Sizer(netlist, profile, loss);
  for (const c of netlist.cords) if (failing.has(c.driver)) for (const a of c.actuators) s.size(c.id, a);
  return s.result();
}

/** The netlist being changed: parts by id in order, cords by id. */
class Sizer {
  private readonly parts: Part[];
  private readonly cords: Map<string, Cord>;
  private readonly used: Set<string>;
  /** What a buffer can carry at the profile's turns and the design margin, grams. */
  private readonly bufferBudgetG: number;

  constructor(
    netlist: Netlist,
    private readonly profile: Profile,
    /** The routing loss of an actuator's branch on a cord. */
    private readonly loss: (cordId: string, actuator: string) => number,
  ) {
    this.parts = [...netlist.parts];
    this.cords = new Map(netlist.cords.map((c) => [c.id, c]));
    this.used = new Set([...this.parts.map((p) => p.id), ...this.cords.keys()]);
    this.bufferBudgetG = availableTension(profile, profile.zWeightG).availableG / profile.minMargin;
  }

  private part(id: string): Part | undefined {
    return this.parts.find((p) => p.id === id);
  }

  /** Actuator `a` on cord `cordId`: a capstan of its own, then its turns. */
  size(cordId: string, a: string): void {
    const act = this.part(a);
    const cord = this.cords.get(cordId);
    if (act?.kind !== 'actuator' || !cord) return;
    const driver = this.part(cord.driver);
    const alone =
      driver?.kind === 'gate' &&
      driver.latch === undefined &&
      cord.ports.length === 0 &&
      cord.actuators.length === 1 &&
      [...this.cords.values()].filter((c) => c.driver === driver.id).length === 1;
    if (alone) return this.turns(driver, cord.id, a, act.loadG);
    if (act.loadG * this.loss(cord.id, a) <= this.bufferBudgetG) return;
    const b = this.pair(cord, a);
    this.turns(b, `c.${b.id}`, a, act.loadG);
  }

  /** Move actuator `a` off `cord` onto a new buffer pair; returns the pair's second gate. */
  private pair(cord: Cord, a: string): GatePart {
    const ida = this.fresh(`${a}.a`);
    const idb = this.fresh(`${a}.b`);
    const out = a.replace(/^act\./, '');
    const ga: GatePart = {
      kind: 'gate',
      id: ida,
      name: `actuator ${out} buffer`,
      role: 'buffer',
      ports: [{ name: 'in' }],
    };
    const gb: GatePart = {
      kind: 'gate',
      id: idb,
      name: `actuator ${out} driver`,
      role: 'buffer',
      ports: [{ name: 'in' }],
    };
    this.parts.splice(
      this.parts.findIndex((p) => p.id === a),
      0,
      ga,
      gb,
    );
    this.cords.set(cord.id, {
      ...cord,
      ports: [...cord.ports, { part: ida, port: 'in' }],
      actuators: cord.actuators.filter((x) => x !== a),
    });
    this.cords.set(`c.${ida}`, { id: `c.${ida}`, driver: ida, ports: [{ part: idb, port: 'in' }], actuators: [] });
    this.cords.set(`c.${idb}`, { id: `c.${idb}`, driver: idb, ports: [], actuators: [a] });
    return gb;
  }

  /** The fewest quarter turns (from `wraps` up to `maxWraps`) that lift `loadG` on `cordId` with the design margin. */
  private turns(gate: GatePart, cordId: string, actuator: string, loadG: number): void {
    const p = this.profile;
    const load = loadG * this.loss(cordId, actuator);
    const hold = p.zWeightG * p.leverRatio;
    const wraps = Math.max(p.wraps, Math.min(p.maxWraps, wrapsNeeded(load, hold, p.mu, p.minMargin, p.wraps)));
    if (wraps === p.wraps) return;
    const at = this.parts.findIndex((x) => x.id === gate.id);
    this.parts[at] = { ...gate, wraps };
  }

  /** `id`, or `id2`, `id3` … when taken. */
  private fresh(id: string): string {
    let k = 1;
    let out = id;
    while (this.used.has(out) || this.used.has(`c.${out}`)) out = `${id}${++k}`;
    this.used.add(out);
    this.used.add(`c.${out}`);
    return out;
  }

  /** The netlist: parts in order, cords in their drivers' order. */
  result(): Netlist {
    const order = new Map(this.parts.map((p, i) => [p.id, i]));
    const cords = [...this.cords.values()].sort((x, y) => (order.get(x.driver) ?? 0) - (order.get(y.driver) ?? 0));
    return { parts: this.parts, cords };
  }
}
