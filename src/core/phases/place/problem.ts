/**
 * The arrangement problem of one drum: units in a row, each one or more bays wide, and the
 * quantity every placement method minimises.
 *
 * A unit is a gate, a lever, an actuator's exit, or a latch (its two gates, in either order).
 * Bays have widths; a bay's centre is the sum of the widths before it plus half its own.
 * Cost = Σ over edges w·|(c_a + d_a) − (c_b + d_b)| + Σ over anchors w·|c_bay + d − x|: the
 * length along the cord channel of every branch. An edge joins a driver bay (its capstan, at
 * the centre: d = 0) and a target bay (the port lever, d from the bay's centre, strictly
 * inside the bay); an anchor is a branch to a part on another drum, whose position there is
 * fixed. Because both ends lie strictly inside their bays, an edge's length is
 * |c_a − c_b| + (d_later − d_earlier): the centre-to-centre distance plus a term that depends
 * only on which of the two comes first. That is a minimum linear arrangement with unequal
 * widths (Garey & Johnson, "Computers and Intractability", 1979: NP-hard already with unit
 * widths and no offsets).
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

export interface Edge {
  readonly a: number;
  readonly b: number;
  readonly w: number;
  /** Where the edge meets bay a, from its centre (|da| < half its width). */
  readonly da: number;
  readonly db: number;
}

export interface Anchor {
  readonly bay: number;
  /** Where the branch meets the bay, from its centre. */
  readonly d: number;
  readonly xM: number;
  readonly w: number;
}

export interface ArrangeProblem {
  readonly units: readonly ArrangeUnit[];
  readonly bayWidthM: readonly number[];
  /** Between two different bays, w > 0. */
  readonly edges: readonly Edge[];
  readonly anchors: readonly Anchor[];
  /** Bay → required bay index (0-based, from the visitor end). */
  readonly pins: ReadonlyMap<number, number>;
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
  for (const e of p.edges) cost += e.w * Math.abs(centreM[e.a] + e.da - centreM[e.b] - e.db);
  for (const h of p.anchors) cost += h.w * Math.abs(centreM[h.bay] + h.d - h.xM);
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
