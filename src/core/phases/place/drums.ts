/**
 * Splitting a machine over several drums when one would be longer than the profile allows.
 *
 * Method: recursive min-cut bisection (partition.ts, Fiduccia–Mattheyses): the drums are
 * split into a first half and a second half, the units into two sides whose widths are in
 * the same proportion (within one unit's width, and never more than the drums of a side can
 * carry), cutting as few cord branches as possible; then each side again, until every side is
 * one drum. Each bisection starts from the spectral order's prefix and from the netlist
 * order's prefix, and keeps the better cut. Units at the visitor and crank ends, and units
 * pinned to a drum, stay on theirs. Because the halves are contiguous runs of drums, branches
 * that must cross mostly cross to a neighbouring drum.
 *
 * The baseline split (`fillDrums`) fills the drums in the netlist's own order, each up to the
 * longest drum, as a builder would without a plan.
 */
import type { Random } from '../../model/random.js';
import { cutWeight, fmBipartition, type Bipartition, type PartitionGraph } from './partition.js';
import { spectralValues } from './spectral.js';
import type { FrameUnits } from './units.js';

/**
 * Width that k drums can be expected to take: units do not divide evenly, so each drum after
 * the first is allowed to lose half the widest unit's width at its end (FM balances finer
 * than that when most units are narrow; the caller adds a drum when a split still overflows).
 */
function capacity(k: number, longestM: number, widestM: number): number {
  return k * longestM - ((k - 1) * widestM) / 2;
}

const widest = (fu: FrameUnits): number => Math.max(0, ...fu.units.map((u) => u.widthM));

/** Drums needed by total width alone. */
export function drumsNeeded(fu: FrameUnits, longestM: number): number {
  const w = fu.units.reduce((s, u) => s + u.widthM, 0);
  const wide = widest(fu);
  if (wide >= longestM) return Math.max(1, Math.ceil(w / longestM));
  let k = 1;
  while (capacity(k, longestM, wide) < w) k++;
  return k;
}

/** Unit-level graph of a subset of units, branch counts as weights. */
function subgraph(fu: FrameUnits, units: readonly number[], fixed: (u: number) => number): PartitionGraph {
  const local = new Map(units.map((u, i) => [u, i]));
  const unitOfBay = fu.bays.map((b) => b.unit);
  const sum = new Map<number, number>();
  const n = units.length;
  for (const br of fu.branches) {
    const a = local.get(unitOfBay[br.driverBay]);
    const b = local.get(unitOfBay[br.targetBay]);
    if (a === undefined || b === undefined || a === b) continue;
    const key = Math.min(a, b) * n + Math.max(a, b);
    sum.set(key, (sum.get(key) ?? 0) + 1);
  }
  return {
    widthM: units.map((u) => fu.units[u].widthM),
    edges: [...sum].map(([key, w]) => ({ a: Math.floor(key / n), b: key % n, w })),
    fixed: units.map(fixed),
  };
}

/** Side 0 takes free nodes in `order` until its width reaches `target`. */
function prefixSplit(g: PartitionGraph, order: readonly number[], target: number): number[] {
  const side = g.fixed.map((f) => (f === -1 ? 1 : f));
  let width0 = 0;
  g.fixed.forEach((f, v) => {
    if (f === 0) width0 += g.widthM[v];
  });
  for (const v of order) {
    if (g.fixed[v] !== -1) continue;
    if (width0 + g.widthM[v] / 2 > target) break;
    side[v] = 0;
    width0 += g.widthM[v];
  }
  return side;
}

function bisect(
  fu: FrameUnits,
  units: readonly number[],
  first: number,
  k: number,
  fixedDrum: Int32Array,
  longestM: number,
  widestM: number,
  rng: Random,
  drumOf: Int32Array,
): void {
  if (k === 1 || units.length === 0) {
    for (const u of units) drumOf[u] = first;
    return;
  }
  const kA = Math.ceil(k / 2);
  const g = subgraph(fu, units, (u) => (fixedDrum[u] === -1 ? -1 : fixedDrum[u] < first + kA ? 0 : 1));
  const total = g.widthM.reduce((s, w) => s + w, 0);
  const target = (total * kA) / k;
  const tol = Math.max(Math.max(...g.widthM), 0.02 * total);
  let lo = Math.max(target - tol, total - capacity(k - kA, longestM, widestM));
  let hi = Math.min(target + tol, capacity(kA, longestM, widestM));
  if (lo > hi) [lo, hi] = [Math.min(lo, hi), Math.max(lo, hi)];
  const value = spectralValues(units.length, g.edges, rng);
  const spectral = units.map((_, i) => i).sort((a, b) => value[a] - value[b] || a - b);
  const candidates: Bipartition[] = [spectral, units.map((_, i) => i)].map((order) =>
    fmBipartition(g, prefixSplit(g, order, target), { lo, hi }),
  );
  const off = (b: Bipartition): number => {
    const w0 = b.side.reduce((s, x, v) => s + (x === 0 ? g.widthM[v] : 0), 0);
    return w0 < lo ? lo - w0 : w0 > hi ? w0 - hi : 0;
  };
  const best = candidates.reduce((a, b) =>
    off(b) < off(a) - 1e-12 || (off(b) <= off(a) + 1e-12 && b.cut < a.cut) ? b : a,
  );
  const sideA = units.filter((_, i) => best.side[i] === 0);
  const sideB = units.filter((_, i) => best.side[i] === 1);
  bisect(fu, sideA, first, kA, fixedDrum, longestM, widestM, rng, drumOf);
  bisect(fu, sideB, first + kA, k - kA, fixedDrum, longestM, widestM, rng, drumOf);
}

/** Split the units over `drums` drums (fixedDrum: −1 free, else the drum a unit must be on). */
export function splitDrums(
  fu: FrameUnits,
  drums: number,
  fixedDrum: Int32Array,
  longestM: number,
  rng: Random,
): Int32Array {
  const drumOf = new Int32Array(fu.units.length);
  bisect(
    fu,
    fu.units.map((_, u) => u),
    0,
    drums,
    fixedDrum,
    longestM,
    widest(fu),
    rng,
    drumOf,
  );
  return drumOf;
}

/** Fill drums in the netlist's order, each up to `longestM` (fixed units stay on their drums). */
export function fillDrums(
  fu: FrameUnits,
  fixedDrum: Int32Array,
  longestM: number,
): { drumOf: Int32Array; drums: number } {
  const drumOf = new Int32Array(fu.units.length);
  const width: number[] = [];
  const widthOf = (d: number): number => width[d] ?? 0;
  fu.units.forEach((u, i) => {
    if (fixedDrum[i] === -1) return;
    drumOf[i] = fixedDrum[i];
    width[fixedDrum[i]] = widthOf(fixedDrum[i]) + u.widthM;
  });
  let d = 0;
  fu.units.forEach((u, i) => {
    if (fixedDrum[i] !== -1) return;
    while (widthOf(d) > 0 && widthOf(d) + u.widthM > longestM) d++;
    drumOf[i] = d;
    width[d] = widthOf(d) + u.widthM;
  });
  let drums = 1;
  for (let i = 0; i < fu.units.length; i++) drums = Math.max(drums, drumOf[i] + 1);
  return { drumOf, drums };
}

/** Cord branches between units on different drums. */
export function crossings(fu: FrameUnits, drumOf: Int32Array): number {
  const g = subgraph(
    fu,
    fu.units.map((_, u) => u),
    () => -1,
  );
  return cutWeight(g, Array.from(drumOf));
}
