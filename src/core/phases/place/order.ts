/**
 * Feasible orders from a preferred order: the netlist's own order (the baseline) or the
 * spectral order (the heuristic's start), with the end rules and the pins laid over them.
 *
 * Method: the unpinned units are sorted by zone, keeping the preferred order within each
 * zone; then the bays are filled from the visitor end: a pinned unit goes in at its bay, and
 * otherwise the next unpinned unit that fits before the next pinned bay (a latch needs two
 * free bays) goes in. Greedy, so it can miss an order that meets awkward pins (a latch and a
 * pin one bay apart); the caller then asks the exact method, or drops those pins.
 */
import type { Random } from '../../model/random.js';
import { arrangementCost, baysInOrder, pinnedUnits, type ArrangeProblem, type Arrangement } from './problem.js';
import { spectralValues, type WeightedEdge } from './spectral.js';

/** Where a pinned unit starts and which way round it sits. */
interface PinnedStart {
  readonly unit: number;
  readonly flipped: boolean;
}

/** Start index and orientation of every pinned unit, or undefined when a unit's own pins disagree. */
function pinnedStarts(p: ArrangeProblem): Map<number, PinnedStart> | undefined {
  const out = new Map<number, PinnedStart>();
  for (const u of pinnedUnits(p)) {
    const unit = p.units[u];
    let found: { start: number; flipped: boolean } | undefined;
    for (const flipped of unit.flippable ? [false, true] : [false]) {
      const bays = baysInOrder(p, u, flipped);
      const starts = new Set<number>();
      bays.forEach((b, i) => {
        const k = p.pins.get(b);
        if (k !== undefined) starts.add(k - i);
      });
      const [start] = [...starts];
      if (starts.size === 1 && start >= 0) {
        found = { start, flipped };
        break;
      }
    }
    if (!found || out.has(found.start)) return undefined;
    out.set(found.start, { unit: u, flipped: found.flipped });
  }
  return out;
}

/** A feasible arrangement following `preferred` (every unit once), or undefined when the greedy fill fails. */
export function fillOrder(p: ArrangeProblem, preferred: readonly number[]): Arrangement | undefined {
  const starts = pinnedStarts(p);
  if (!starts) return undefined;
  const pinned = pinnedUnits(p);
  const queue = preferred.filter((u) => !pinned.has(u)).sort((a, b) => p.units[a].zone - p.units[b].zone);
  const covered = new Set<number>();
  for (const [k, s] of starts) for (let i = 0; i < p.units[s.unit].bays.length; i++) covered.add(k + i);
  const order: number[] = [];
  const flipped = new Array<boolean>(p.units.length).fill(false);
  let k = 0;
  while (order.length < p.units.length) {
    const pin = starts.get(k);
    if (pin) {
      order.push(pin.unit);
      flipped[pin.unit] = pin.flipped;
      k += p.units[pin.unit].bays.length;
      continue;
    }
    const fits = (u: number): boolean => p.units[u].bays.every((_, i) => !covered.has(k + i));
    const i = queue.findIndex(fits);
    // Only the first unit of the lowest zone left may go next; a later one would break the end rules.
    if (i === -1 || p.units[queue[i]].zone !== p.units[queue[0]].zone) return undefined;
    const [u] = queue.splice(i, 1);
    order.push(u);
    k += p.units[u].bays.length;
  }
  return { order, flipped };
}

/**
 * Unit-level edges of a problem for the spectral order: each net as a star from its first
 * point (the capstan, where the cord's driver is on this drum) to each of its other points —
 * the cord's branches — summed between units.
 */
export function unitEdges(p: ArrangeProblem): WeightedEdge[] {
  const unitOf = new Int32Array(p.bayWidthM.length);
  p.units.forEach((u, i) => u.bays.forEach((b) => (unitOf[b] = i)));
  const sum = new Map<number, number>();
  const n = p.units.length;
  for (const net of p.nets) {
    const a = unitOf[net.pins[0].bay];
    for (const pin of net.pins.slice(1)) {
      const b = unitOf[pin.bay];
      if (a === b) continue;
      const key = Math.min(a, b) * n + Math.max(a, b);
      sum.set(key, (sum.get(key) ?? 0) + net.w);
    }
  }
  return [...sum].map(([key, w]) => ({ a: Math.floor(key / n), b: key % n, w }));
}

/** The spectral starting orders (both directions of the Fiedler order), feasible ones only. */
export function spectralStarts(p: ArrangeProblem, rng: Random): Arrangement[] {
  const n = p.units.length;
  const value = spectralValues(n, unitEdges(p), rng);
  const byValue = Array.from({ length: n }, (_, i) => i).sort((a, b) => value[a] - value[b] || a - b);
  const out: Arrangement[] = [];
  for (const o of [byValue, [...byValue].reverse()]) {
    const a = fillOrder(p, o);
    if (a) out.push(a);
  }
  return out;
}

/** The cheapest of some arrangements (the first on ties). */
export function cheapest(p: ArrangeProblem, as: readonly Arrangement[]): Arrangement | undefined {
  let best: { a: Arrangement; cost: number } | undefined;
  for (const a of as) {
    const cost = arrangementCost(p, a);
    if (!best || cost < best.cost) best = { a, cost };
  }
  return best?.a;
}
