/**
 * The order of the bays on every drum, once each unit has its drum.
 *
 * Each drum is one arrangement problem (problem.ts): its units, and a net for every cord's run
 * along a channel (design §11: a cord that leaves its bay runs as a tree in the channel of the
 * lower of the two drums each branch joins, so a cord has one run per channel it uses), with
 * that run's points on other drums fixed where they already are. A drum is solved exactly
 * (exact.ts) when the subsets the exact method would visit are within the limit, and otherwise
 * by the heuristic: the spectral order both ways round and the netlist's own order, each
 * improved by local search (improve.ts), the cheapest kept. With more than one drum the drums
 * are solved in turn, each against the others' positions, for a few rounds (block coordinate
 * descent; after the first round a drum's search starts from its own last order); the best
 * round is kept.
 */
import type { Random } from '../../model/random.js';
import { arrangeExact, EXACT_MAX_UNITS, exactStates } from './exact.js';
import { improve, type ImproveOptions } from './improve.js';
import { cheapest, fillOrder, spectralStarts } from './order.js';
import { isFeasible, netSpan, type ArrangeProblem, type Arrangement, type Net } from './problem.js';
import type { Bay, Branch, FrameUnits } from './units.js';

/** Rounds of solving the drums in turn against each other (all but the last without kicks). */
const ROUNDS = 2;
/**
 * Fewest kicks a drum's local search gets however many drums there are. Measured on s298
 * (84 drums): 3 rather than 8 saves a sixth of the placement's time and costs 0.01 % of cord.
 */
const MIN_KICKS = 3;

export type DrumMethod = 'exact' | 'heuristic' | 'netlist';

export interface ArrangeSettings {
  /** 'optimise' searches; 'netlist' keeps the netlist's own order (the baseline). */
  readonly mode: 'optimise' | 'netlist';
  /** Most subsets the exact method may visit on one drum; 0 never uses it. */
  readonly exactLimit: number;
  /** Use the heuristic even where the exact method fits (for comparisons). */
  readonly forceHeuristic?: boolean;
  readonly improve: ImproveOptions;
}

/** Every bay's drum (0-based), index on it, and centre. */
export interface Positions {
  readonly drumOfBay: Int32Array;
  readonly indexOfBay: Int32Array;
  readonly centreM: Float64Array;
  /** Units of each drum from the visitor end, with which are flipped (by global unit index). */
  readonly orders: readonly (readonly number[])[];
  readonly flipped: readonly boolean[];
  readonly methods: readonly DrumMethod[];
}

/** Where the lever `name` of a bay sits, from the bay's centre: levers share the bay's width evenly. */
export function leverOffset(bay: Bay, name: string): number {
  const i = Math.max(0, bay.levers.indexOf(name));
  return ((i + 0.5) * bay.widthM) / bay.levers.length - bay.widthM / 2;
}

interface DrumProblem {
  readonly problem: ArrangeProblem;
  /** Local unit → global unit. */
  readonly units: readonly number[];
  /** Local bay → global bay. */
  readonly bays: readonly number[];
}

/** A cord's run along one channel: its points, each a bay and where the run meets it. */
interface CordNet {
  readonly points: readonly { readonly bay: number; readonly d: number }[];
}

/**
 * The runs along the channels of every cord that leaves its bay, for bays on drums `drumOfBay`:
 * each branch runs in the channel of the lower of its two drums, and a cord's run in one channel
 * reaches its capstan and every lever tied to it there (physics/routing.ts).
 */
function cordNets(fu: FrameUnits, drumOfBay: (bay: number) => number): CordNet[] {
  const byCord = new Map<string, Branch[]>();
  for (const br of fu.branches) {
    const list = byCord.get(br.cord) ?? [];
    list.push(br);
    byCord.set(br.cord, list);
  }
  const out: CordNet[] = [];
  for (const list of byCord.values()) {
    const driver = list[0].driverBay;
    if (list.every((br) => br.targetBay === driver)) continue;
    const levels = new Map<number, { bay: number; d: number }[]>();
    for (const br of list) {
      const level = Math.min(drumOfBay(driver), drumOfBay(br.targetBay));
      const points = levels.get(level) ?? [{ bay: driver, d: 0 }];
      points.push({ bay: br.targetBay, d: leverOffset(fu.bays[br.targetBay], br.lever) });
      levels.set(level, points);
    }
    for (const points of levels.values()) out.push({ points });
  }
  return out;
}

function drumProblem(
  fu: FrameUnits,
  drumOf: Int32Array,
  d: number,
  cords: readonly CordNet[],
  pins: ReadonlyMap<number, { drum: number; index: number }>,
  at: Pick<Positions, 'drumOfBay' | 'centreM'>,
  solved: ReadonlySet<number>,
): DrumProblem {
  const units = fu.units.map((_, u) => u).filter((u) => drumOf[u] === d);
  const bays = units.flatMap((u) => fu.units[u].bays);
  const localBay = new Map(bays.map((b, i) => [b, i]));
  const nets: Net[] = [];
  for (const cn of cords) {
    const here: { bay: number; d: number }[] = [];
    let lo = Infinity;
    let hi = -Infinity;
    for (const pt of cn.points) {
      const lb = localBay.get(pt.bay);
      if (lb !== undefined) here.push({ bay: lb, d: pt.d });
      else if (solved.has(at.drumOfBay[pt.bay])) {
        const x = at.centreM[pt.bay] + pt.d;
        lo = Math.min(lo, x);
        hi = Math.max(hi, x);
      }
    }
    if (here.length === 0 || (here.length === 1 && lo > hi)) continue;
    nets.push({ pins: here, ...(lo <= hi ? { fixed: { loM: lo, hiM: hi } } : {}), w: 1 });
  }
  const pinMap = new Map<number, number>();
  for (const [b, pin] of pins) {
    const lb = localBay.get(b);
    if (lb !== undefined && pin.drum === d) pinMap.set(lb, pin.index);
  }
  const problem: ArrangeProblem = {
    units: units.map((u) => ({
      bays: fu.units[u].bays.map((b) => localBay.get(b) as number),
      flippable: fu.units[u].kind === 'latch',
      zone: fu.units[u].zone,
    })),
    bayWidthM: bays.map((b) => fu.bays[b].widthM),
    nets,
    pins: pinMap,
  };
  return { problem, units, bays };
}

/**
 * How much more work than its subsets the exact method may do on one drum before the drum is
 * left to the heuristic: at each subset it sorts the nets with points on other drums by those
 * fixed points, so its work grows with its subsets times (1 + those nets). Measured on s298 and s1488 (many drums): solved exactly, the
 * drums past 2^16 × 4 took an eighth and a quarter of their placement's time, and the heuristic
 * found the same cord within 0.01 %.
 */
const EXACT_WORK_PER_STATE = 4;

/** The exact method's work on a problem: its states, times one plus its nets with fixed points. */
function exactWork(p: ArrangeProblem): number {
  return exactStates(p) * (1 + p.nets.filter((net) => net.fixed).length);
}

/** Solve one drum's problem; undefined when no order meets its pins. */
function solve(
  p: ArrangeProblem,
  s: ArrangeSettings,
  rng: Random,
  quick: boolean,
  previous?: Arrangement,
): { a: Arrangement; method: DrumMethod } | undefined {
  const netlistOrder = p.units.map((_, i) => i);
  const own = fillOrder(p, netlistOrder);
  const exactFits =
    p.units.length <= EXACT_MAX_UNITS &&
    exactStates(p) <= s.exactLimit &&
    exactWork(p) <= s.exactLimit * EXACT_WORK_PER_STATE;
  if (s.mode === 'netlist') {
    const a = own ?? (exactFits ? arrangeExact(p) : undefined);
    return a && { a, method: 'netlist' };
  }
  if (exactFits && !s.forceHeuristic) {
    const a = arrangeExact(p);
    return a && { a, method: 'exact' };
  }
  // A drum solved in an earlier round starts from its own order there (block coordinate descent goes on).
  const starts =
    previous && isFeasible(p, previous) ? [previous] : [...spectralStarts(p, rng.fork()), ...(own ? [own] : [])];
  if (starts.length === 0) {
    const a = exactFits ? arrangeExact(p) : undefined;
    return a && { a, method: 'exact' };
  }
  // Screen every start with a plain descent on a share of the work, then spend the rest on kicks from the best.
  const share = { ...s.improve, kicks: 0, work: s.improve.work / (2 * starts.length) };
  const screened = starts.map((a) => improve(p, a, rng.fork(), share));
  const best = cheapest(p, screened) ?? screened[0];
  if (quick) return { a: best, method: 'heuristic' };
  return { a: improve(p, best, rng.fork(), { ...s.improve, work: s.improve.work / 2 }), method: 'heuristic' };
}

/** Set the drum and centre of every bay of the units `order` on drum `d`, from its visitor end. */
function layDrum(
  fu: FrameUnits,
  d: number,
  order: readonly number[],
  flipped: readonly boolean[],
  at: { readonly drumOfBay: Int32Array; readonly centreM: Float64Array; readonly indexOfBay?: Int32Array },
): void {
  let x = 0;
  let k = 0;
  for (const u of order) {
    const bays = flipped[u] ? [...fu.units[u].bays].reverse() : fu.units[u].bays;
    for (const b of bays) {
      at.drumOfBay[b] = d;
      if (at.indexOfBay) at.indexOfBay[b] = k;
      k++;
      at.centreM[b] = x + fu.bays[b].widthM / 2;
      x += fu.bays[b].widthM;
    }
  }
}

function positionsOf(
  fu: FrameUnits,
  drums: number,
  orders: number[][],
  flipped: boolean[],
  methods: DrumMethod[],
): Positions {
  const nb = fu.bays.length;
  const at = { drumOfBay: new Int32Array(nb), indexOfBay: new Int32Array(nb), centreM: new Float64Array(nb) };
  for (let d = 0; d < drums; d++) layDrum(fu, d, orders[d], flipped, at);
  return {
    ...at,
    orders: orders.map((o) => [...o]),
    flipped: [...flipped],
    methods: [...methods],
  };
}

/** The total channel length over every drum: every cord's run along each channel it uses, once. */
function channelLength(cords: readonly CordNet[], at: Positions): number {
  let s = 0;
  for (const cn of cords) s += netSpan({ pins: cn.points, w: 1 }, at.centreM);
  return s;
}

/**
 * Order every drum's bays. `pins` maps a bay to its drum and 0-based index; a drum whose pins
 * cannot be met is returned in `unmet` and solved without them.
 */
export function arrangeDrums(
  fu: FrameUnits,
  drumOf: Int32Array,
  drums: number,
  pins: ReadonlyMap<number, { drum: number; index: number }>,
  s: ArrangeSettings,
  rng: Random,
): { at: Positions; unmet: number[] } {
  const orders: number[][] = Array.from({ length: drums }, () => []);
  const flipped = new Array<boolean>(fu.units.length).fill(false);
  const methods = new Array<DrumMethod>(drums).fill(s.mode === 'netlist' ? 'netlist' : 'exact');
  const unmet: number[] = [];
  let best: { at: Positions; cost: number } | undefined;
  const rounds = drums > 1 && s.mode === 'optimise' ? ROUNDS : 1;
  // Many drums share the kicks of about three, so the work grows with the machine, not with drums × kicks.
  const kicks = Math.min(s.improve.kicks, Math.max(MIN_KICKS, Math.ceil((3 * s.improve.kicks) / drums)));
  const each: ArrangeSettings = { ...s, improve: { ...s.improve, kicks } };
  const done = new Set<number>();
  // Each drum's runs along the channels: they depend on the drums, not on the orders.
  const cords = cordNets(fu, (b) => drumOf[fu.bays[b].unit]);
  const onDrum = Array.from({ length: drums }, () => [] as CordNet[]);
  for (const cn of cords)
    for (const d of new Set(cn.points.map((pt) => drumOf[fu.bays[pt.bay].unit]))) onDrum[d].push(cn);
  // Where the bays of the drums solved so far sit, kept up to date drum by drum (−1: not yet).
  const live = { drumOfBay: new Int32Array(fu.bays.length).fill(-1), centreM: new Float64Array(fu.bays.length) };
  for (let round = 0; round < rounds; round++) {
    for (let d = 0; d < drums; d++) {
      const dp = drumProblem(fu, drumOf, d, onDrum[d], unmet.includes(d) ? new Map() : pins, live, done);
      const quick = round < rounds - 1;
      const local = new Map(dp.units.map((u, i) => [u, i]));
      const previous: Arrangement | undefined =
        round > 0
          ? { order: orders[d].map((u) => local.get(u) ?? -1), flipped: dp.units.map((u) => flipped[u]) }
          : undefined;
      let solved = solve(dp.problem, each, rng.fork(), quick, previous);
      if (!solved) {
        unmet.push(d);
        solved = solve({ ...dp.problem, pins: new Map() }, each, rng.fork(), quick);
      }
      if (!solved) throw new Error('an arrangement without pins always exists');
      orders[d] = solved.a.order.map((u) => dp.units[u]);
      solved.a.flipped.forEach((f, u) => (flipped[dp.units[u]] = f));
      methods[d] = solved.method;
      layDrum(fu, d, orders[d], flipped, live);
      done.add(d);
    }
    const at = positionsOf(fu, drums, orders, flipped, methods);
    const cost = channelLength(cords, at);
    if (!best || cost < best.cost - 1e-12) best = { at, cost };
  }
  return { at: best?.at ?? positionsOf(fu, drums, orders, flipped, methods), unmet };
}
