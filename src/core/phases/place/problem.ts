/**
 * The arrangement problem of one drum: units in a row, each one or more bays wide, and the
 * quantity every placement method minimises.
 *
 * A unit is a gate, a lever, an actuator's exit, or a latch (its two gates, in either order).
 * Bays have widths; a bay's centre is the sum of the widths before it plus half its own.
 * A cord that leaves its bay runs as a tree in the cord channel (design §11; physics/routing.ts):
 * one drop from its capstan, a run along the channel that reaches every lever it pulls, and a
 * rise at each. Its length along the channel is the span of its points: the capstan (a pin at
 * the driver bay's centre, d = 0) and each lever (a pin d from its bay's centre, strictly inside
 * the bay), with the points of the same cord on another drum that share this drum's channel
 * fixed where they already are (`fixed`). So
 *   Cost = Σ over nets w · (max − min of the net's pin positions c_bay + d and fixed points),
 * the length along the cord channel of every cord: a minimum linear arrangement of the cords'
 * nets (hypergraph edges) with unequal widths (Garey & Johnson, "Computers and Intractability",
 * 1979: NP-hard already for two-point nets with unit widths and no offsets).
 *
 * Rules every arrangement keeps: unpinned units run front zone, then middle, then crank zone
 * (operator levers at the visitor end, clock and reset levers at the crank end); a pinned bay
 * sits at its bay index.
 */

/** 0 = visitor (front) end, 1 = anywhere, 2 = crank end. */
export type Zone = 0 | 1 | 2;

export interface ArrangeUnit {
  /** Bay indices of the problem, in the unit's own order (reversed when the unit is flipped). */
  readonly bays: readonly number[];
  /** Both internal orders allowed (a latch's two gates). */
  readonly flippable: boolean;
  readonly zone: Zone;
}

/** A point of a net in one of the problem's bays. */
export interface NetPin {
  readonly bay: number;
  /** Where the net meets the bay, from its centre (|d| < half its width). */
  readonly d: number;
}

/** One cord's run along the channel: the points it must reach. */
export interface Net {
  /** Points in this drum's bays (at least one). */
  readonly pins: readonly NetPin[];
  /** The leftmost and rightmost of its points fixed elsewhere (metres from the visitor end), if any. */
  readonly fixed?: { readonly loM: number; readonly hiM: number };
  readonly w: number;
}

export interface ArrangeProblem {
  readonly units: readonly ArrangeUnit[];
  readonly bayWidthM: readonly number[];
  readonly nets: readonly Net[];
  /** Bay → required bay index (0-based, from the visitor end). */
  readonly pins: ReadonlyMap<number, number>;
}

/** Length along the channel of one net with the bays' centres at `centreM`. */
export function netSpan(net: Net, centreM: ArrayLike<number>): number {
  let lo = net.fixed ? net.fixed.loM : Infinity;
  let hi = net.fixed ? net.fixed.hiM : -Infinity;
  for (const p of net.pins) {
    const x = centreM[p.bay] + p.d;
    if (x < lo) lo = x;
    if (x > hi) hi = x;
  }
  return hi > lo ? hi - lo : 0;
}

/** Units in order from the visitor end, and which of them are flipped (by unit index). */
export interface Arrangement {
  readonly order: readonly number[];
  readonly flipped: readonly boolean[];
}

/** The bays of unit `u` in the order they sit. */
export function baysInOrder(p: ArrangeProblem, u: number, flipped: boolean): readonly number[] {
  const bays = p.units[u].bays;
  return flipped ? [...bays].reverse() : bays;
}

/** Centre of every bay (metres from the visitor end) and its index along the drum. */
export function bayCentres(p: ArrangeProblem, a: Arrangement): { centreM: Float64Array; index: Int32Array } {
  const centreM = new Float64Array(p.bayWidthM.length);
  const index = new Int32Array(p.bayWidthM.length);
  let x = 0;
  let k = 0;
  for (const u of a.order)
    for (const b of baysInOrder(p, u, a.flipped[u])) {
      centreM[b] = x + p.bayWidthM[b] / 2;
      index[b] = k++;
      x += p.bayWidthM[b];
    }
  return { centreM, index };
}

/** The channel length of an arrangement (the quantity minimised). */
export function arrangementCost(p: ArrangeProblem, a: Arrangement): number {
  const { centreM } = bayCentres(p, a);
  let cost = 0;
  for (const n of p.nets) cost += n.w * netSpan(n, centreM);
  return cost;
}

/** Whether an arrangement keeps every rule: each unit once, zones in order, pins met. */
export function isFeasible(p: ArrangeProblem, a: Arrangement): boolean {
  if (a.order.length !== p.units.length || new Set(a.order).size !== p.units.length) return false;
  const pinned = pinnedUnits(p);
  let zone = 0;
  for (const u of a.order) {
    if (pinned.has(u)) continue;
    if (p.units[u].zone < zone) return false;
    zone = p.units[u].zone;
  }
  const { index } = bayCentres(p, a);
  for (const [bay, k] of p.pins) if (index[bay] !== k) return false;
  return true;
}

/** Units with at least one pinned bay. */
export function pinnedUnits(p: ArrangeProblem): Set<number> {
  const out = new Set<number>();
  p.units.forEach((u, i) => {
    if (u.bays.some((b) => p.pins.has(b))) out.add(i);
  });
  return out;
}

/** Total bays of the problem. */
export function bayCount(p: ArrangeProblem): number {
  return p.bayWidthM.length;
}
