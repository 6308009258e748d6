/**
 * Place phase: give every gate, latch, lever and actuator exit a bay along the drum, split the
 * machine over drums when one would be too long, and route every cord (design §11).
 *
 * Method (docs/methods/place.md):
 * - units and bays from the netlist and the profile's geometry (units.ts);
 * - drums: as many as the total width needs under frame.longestDrumM, the units split between
 *   them by recursive Fiduccia–Mattheyses min-cut bisection (drums.ts, partition.ts);
 * - each drum's order minimises the length of cord along the channel, a minimum linear
 *   arrangement (NP-hard: Garey & Johnson 1979): exactly by dynamic programming over subsets
 *   (exact.ts, the Held–Karp idea) while the subsets to visit stay within `exactLimit`, and
 *   otherwise from the spectral order (Fiedler vector; Juvan & Mohar 1992) and the netlist's
 *   order, improved by seeded local search (spectral.ts, improve.ts);
 * - routing of every branch over the result (physics/routing.ts).
 * The baseline is the netlist's own order (drums filled in that order), routed the same way in
 * the same run; the answer is never longer in total cord than the baseline.
 *
 * Pre: a netlist satisfying its invariants. Post: every gate, lever and unfixed actuator has
 * exactly one (drum, bay); latch gates are neighbours; operator levers and actuator exits
 * come first on drum 1 and clock and reset levers last (unless pinned elsewhere); pins are
 * met or reported in `problems`. Deterministic for a given seed. Never throws on a bad pin:
 * the problem is reported and the pin dropped.
 */
import { seededRandom, type Random } from '../../model/random.js';
import type { Netlist } from '../../model/netlist.js';
import type { Profile } from '../../physics/profile.js';
import { route, type Routing } from '../../physics/routing.js';
import { arrangeDrums, leverOffset, type ArrangeSettings, type Positions } from './arrange.js';
import { crossings, drumsNeeded, fillDrums, splitDrums } from './drums.js';
import { refineDrums } from './refine.js';
import { DEFAULT_IMPROVE, type ImproveOptions } from './improve.js';
import { checkPins, type CheckedPins, type Pin, type PlacementProblem } from './pins.js';
import type { PlacedBayInfo, PlacedDrum, Placement } from './placement.js';
import { frameUnits, type FrameUnits } from './units.js';

export { pinDiagnostics, type Pin, type PlacementProblem } from './pins.js';
export { frameUnits, type FrameUnits } from './units.js';
export { auditPlacement, type AuditFinding } from './audit.js';
export type { PlacedBayInfo, PlacedDrum, Placement } from './placement.js';

/** Most subsets the exact method visits on one drum (measured: about 0.1 s at this size; bench/place.ts). */
export const EXACT_LIMIT = 2 ** 16;

export interface PlaceOptions {
  /** Seed of the one seeded generator (default 1). */
  readonly seed?: number;
  /** Parts pinned to a bay, by part id (a latch id pins its set side to the bay and its reset side to the next). */
  readonly pins?: Readonly<Record<string, Pin>>;
  /** Most subsets the exact method may visit on one drum (default EXACT_LIMIT; 0 = heuristic only). */
  readonly exactLimit?: number;
  /** Local search bounds (default DEFAULT_IMPROVE). */
  readonly improve?: Partial<ImproveOptions>;
}

interface Candidate {
  readonly at: Positions;
  readonly drums: number;
  readonly drumOf: Int32Array;
  readonly routing: Routing;
  readonly method: Placement['method'];
  readonly unmet: readonly number[];
  readonly pinProblems: readonly PlacementProblem[];
}

/** Place every part of a netlist and route every cord. */
export function place(netlist: Netlist, profile: Profile, opts: PlaceOptions = {}): Placement {
  const seed = opts.seed ?? 1;
  const rng = seededRandom(seed);
  const fu = frameUnits(netlist, profile);
  const f = profile.frame;
  const pins = checkPins(netlist, fu, opts.pins ?? {}, f.drumsPerFrame);
  const problems: PlacementProblem[] = [...pins.problems];
  const settings: ArrangeSettings = {
    mode: 'optimise',
    exactLimit: opts.exactLimit ?? EXACT_LIMIT,
    improve: { ...DEFAULT_IMPROVE, ...opts.improve },
  };
  const evaluate = (drumOf: Int32Array, drums: number, s: ArrangeSettings, r: Random): Candidate => {
    const bayPins = pins.inRange(drumOf, drums);
    const { at, unmet } = arrangeDrums(fu, drumOf, drums, bayPins.pins, s, r);
    const method: Placement['method'] =
      s.mode === 'netlist' ? 'netlist' : at.methods.every((m) => m === 'exact') ? 'exact' : 'heuristic';
    const routing = route(netlist, layoutOf(fu, at), profile);
    return { at, drums, drumOf, routing, method, unmet, pinProblems: bayPins.problems };
  };
  const base = fillDrums(fu, pins.fixedDrum, f.longestDrumM);
  const baseline = evaluate(base.drumOf, base.drums, { ...settings, mode: 'netlist' }, rng.fork());
  const split = chooseSplit(fu, pins, f.longestDrumM, rng.fork());
  const candidates = [evaluate(split.drumOf, split.drums, settings, rng.fork()), baseline];
  const rank = (c: Candidate): [number, number] => [overLimits(fu, c, f), c.routing.totalCordM];
  const best = candidates.reduce((a, b) => {
    const [ra, rb] = [rank(a), rank(b)];
    return rb[0] < ra[0] || (rb[0] === ra[0] && rb[1] < ra[1] - 1e-9) ? b : a;
  });
  problems.push(...best.pinProblems);
  for (const d of best.unmet) problems.push(...pins.unmetOn(d));
  problems.push(...limitProblems(fu, best, profile));
  const pinned = keptPins(netlist, opts.pins ?? {}, problems);
  return { ...output(netlist, fu, best, baseline, profile, seed, problems), pinned };
}

/** The bays' parts of every pin that came through without a problem. */
function keptPins(
  netlist: Netlist,
  pins: Readonly<Record<string, Pin>>,
  problems: readonly PlacementProblem[],
): string[] {
  const dropped = new Set(problems.flatMap((p) => ('part' in p ? [p.part] : [])));
  const parts = new Map(netlist.parts.map((p) => [p.id, p]));
  return Object.keys(pins)
    .filter((id) => !dropped.has(id))
    .flatMap((id) => {
      const p = parts.get(id);
      return p?.kind === 'latch' ? [p.setGate, p.resetGate] : [id];
    });
}

/**
 * Drums by width and pins; the split (bisection, then refined by the cord between drums), retried
 * with one more drum while a drum is still too long.
 */
function chooseSplit(
  fu: FrameUnits,
  pins: CheckedPins,
  longestM: number,
  rng: Random,
): { drumOf: Int32Array; drums: number } {
  const { fixedDrum, baysNeeded } = pins;
  let drums = Math.max(drumsNeeded(fu, longestM), 1 + Math.max(0, ...fixedDrum));
  const widest = Math.max(0, ...fu.units.map((u) => u.widthM));
  for (let attempt = 0; ; attempt++) {
    const drumOf =
      drums === 1
        ? new Int32Array(fu.units.length)
        : refineDrums(
            fu,
            splitDrums(fu, drums, fixedDrum, longestM, rng.fork()),
            drums,
            fixedDrum,
            longestM,
            baysNeeded,
          );
    const fits = drumLengths(fu, drumOf, drums).every((w) => w <= longestM + 1e-9);
    if (fits || attempt >= 3 || widest > longestM) return { drumOf, drums };
    drums++;
  }
}

function drumLengths(fu: FrameUnits, drumOf: Int32Array, drums: number): number[] {
  const w = new Array<number>(drums).fill(0);
  fu.units.forEach((u, i) => (w[drumOf[i]] += u.widthM));
  return w;
}

/** Drums longer than allowed, plus one when there are more drums than the frame carries. */
function overLimits(fu: FrameUnits, c: Candidate, f: Profile['frame']): number {
  const long = drumLengths(fu, c.drumOf, c.drums).filter((w) => w > f.longestDrumM + 1e-9).length;
  return long + (c.drums > f.drumsPerFrame ? 1 : 0);
}

function limitProblems(fu: FrameUnits, c: Candidate, profile: Profile): PlacementProblem[] {
  const f = profile.frame;
  const out: PlacementProblem[] = [];
  for (const u of fu.units)
    if (u.widthM > f.longestDrumM)
      out.push({
        kind: 'bay-too-wide',
        part: u.id,
        widthM: u.widthM,
        longestM: f.longestDrumM,
        message: `'${u.id}' needs ${u.widthM.toFixed(3)} m of drum, more than the longest drum (${f.longestDrumM} m)`,
        hint: 'allow a longer drum (frame.longestDrumM) or narrower levers (frame.leverPitchM)',
      });
  drumLengths(fu, c.drumOf, c.drums).forEach((w, d) => {
    if (w > f.longestDrumM + 1e-9)
      out.push({
        kind: 'drum-too-long',
        drum: d + 1,
        lengthM: w,
        longestM: f.longestDrumM,
        message: `drum ${d + 1} is ${w.toFixed(2)} m long, more than the longest allowed (${f.longestDrumM} m)`,
        hint: 'allow a longer drum (frame.longestDrumM) or more drums per frame (frame.drumsPerFrame)',
      });
  });
  if (c.drums > f.drumsPerFrame)
    out.push({
      kind: 'too-many-drums',
      drums: c.drums,
      allowed: f.drumsPerFrame,
      message: `the machine needs ${c.drums} drums of at most ${f.longestDrumM} m; the frame carries ${f.drumsPerFrame}`,
      hint: `allow ${c.drums} drums per frame (frame.drumsPerFrame) or a drum of about ${(drumLengths(fu, c.drumOf, c.drums).reduce((s, w) => s + w, 0) / f.drumsPerFrame).toFixed(2)} m (frame.longestDrumM)`,
    });
  return out;
}

/** The positions as a layout routing can read. */
function layoutOf(fu: FrameUnits, at: Positions): { bays: PlacedBayInfo[] } {
  const bays: PlacedBayInfo[] = fu.bays.map((b, i) => ({
    part: b.part,
    kind: b.kind,
    drum: at.drumOfBay[i] + 1,
    bay: at.indexOfBay[i] + 1,
    xM: at.centreM[i],
    leftM: at.centreM[i] - b.widthM / 2,
    widthM: b.widthM,
    levers: b.levers.map((name) => ({ name, xM: at.centreM[i] + leverOffset(b, name) })),
    unit: fu.units[b.unit].id,
  }));
  bays.sort((a, b) => a.drum - b.drum || a.bay - b.bay);
  return { bays };
}

function output(
  netlist: Netlist,
  fu: FrameUnits,
  best: Candidate,
  baseline: Candidate,
  profile: Profile,
  seed: number,
  problems: readonly PlacementProblem[],
): Omit<Placement, 'pinned'> {
  const f = profile.frame;
  const { bays } = layoutOf(fu, best.at);
  const byPart = new Map(bays.map((b) => [b.part, b]));
  const drums: PlacedDrum[] = Array.from({ length: best.drums }, (_, d) => {
    const on = bays.filter((b) => b.drum === d + 1);
    return {
      drum: d + 1,
      lengthM: on.reduce((s, b) => s + b.widthM, 0),
      levelM: d * f.drumSpacingM,
      bays: on.map((b) => b.part),
      method: best.at.methods[d],
    };
  });
  const latches: Placement['latches'][number][] = [];
  const flags: Placement['flags'][number][] = [];
  for (const p of netlist.parts) {
    if (p.kind === 'latch') {
      const s = byPart.get(p.setGate);
      const r = byPart.get(p.resetGate);
      if (s && r) latches.push({ latch: p.id, drum: s.drum, bays: [s.bay, r.bay] });
    } else if (p.kind === 'flag' && p.fixed === undefined) {
      const g = byPart.get(p.gate);
      if (g) flags.push({ flag: p.id, gate: p.gate, drum: g.drum, bay: g.bay });
    }
  }
  return {
    method: best.method,
    exact: best.method === 'exact' && best.drums === 1,
    drums,
    bays,
    latches,
    flags,
    routing: best.routing,
    totalCordM: best.routing.totalCordM,
    baselineCordM: baseline.routing.totalCordM,
    channelM: best.routing.channelM,
    baselineChannelM: baseline.routing.channelM,
    pulleys: best.routing.pulleys,
    crossDrumBranches: crossings(fu, best.drumOf),
    longestDrumM: f.longestDrumM,
    drumsAllowed: f.drumsPerFrame,
    seed,
    problems,
  };
}
