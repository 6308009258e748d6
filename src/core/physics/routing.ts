/**
 * Routing: the run, length, pulleys, pins and force loss of every cord branch, from where the
 * parts sit in the frame (design §11).
 *
 * Geometry (every figure from profile.frame): x runs along the drum from its visitor end,
 * y upwards from the axis of drum 1; drum d's axis is (d − 1)·drumSpacingM higher (drums
 * stacked one above the other). A capstan sits at its bay's centre; each lever at its place
 * on the pivot rail, railAboveDrumM above its drum's axis.
 * - A branch whose cord never leaves its bay rises directly from the top of the drum to its
 *   lever: one straight run, no turn.
 * - Any other branch drops from the bottom of its driver's drum to the cord channel
 *   (channelBelowDrumM under the lower of the two drums it joins), runs along the channel to
 *   its target's lever, and rises to it (a port) or leaves the frame by an exit pulley (an
 *   actuator, actuatorRunM more). Each change of direction, a right angle, passes a pulley or a
 *   smooth pin (frame.turn).
 * - Length = the runs + a knot allowance at each end + the take-up allowance. A cord's trunk
 *   (from its hold lever down to the drum, its wraps, and a knot) is listed per cord; a cord
 *   with several branches splits at a knot where it leaves the drum.
 * Loss of a branch (factor ≥ 1 on the tension it needs): (1/η)^pulleys · e^(μ_pin·α) for a
 * total pin angle α — the capstan equation of Euler and Eytelwein for the pins (capstan.ts).
 * `routing.pulleys` and `routing.pinAngleRad` of the profile are added to every computed route;
 * a `cordRouting` entry replaces, for its cord, each figure it names (its pulleys and pin angle
 * count per branch, in all).
 * Pre: every driver and target of every cord has a bay in the layout. Post: one route per
 * branch, in netlist order (cords, then each cord's ports, then its actuators).
 */
import { partIndex, type Netlist } from '../model/netlist.js';
import { routingFactor, wrapsOf } from './capstan.js';
import { branchKey, type BranchLosses } from './drive.js';
import type { Profile, RoutingLoss } from './profile.js';

/** A bay as placed: what routing needs to know of it. */
export interface PlacedBay {
  /** The gate, lever or actuator in the bay. */
  readonly part: string;
  /** Counted from 1, the lowest drum first. */
  readonly drum: number;
  /** Counted from 1 at the visitor end of its drum. */
  readonly bay: number;
  /** Centre of the bay (its capstan), metres from the visitor end. */
  readonly xM: number;
  readonly widthM: number;
  /** Levers on the rail, left to right, with their positions in metres. */
  readonly levers: readonly { readonly name: string; readonly xM: number }[];
}

/** Where every bay sits: the part of a placement routing reads. */
export interface FrameLayout {
  readonly bays: readonly PlacedBay[];
}

export interface RoutePoint {
  readonly xM: number;
  readonly yM: number;
}

export interface CordRun {
  readonly kind: 'direct' | 'drop' | 'channel' | 'rise' | 'exit';
  readonly from: RoutePoint;
  /** For 'exit', the same as `from`: the cord leaves the frame there (its length is frame.actuatorRunM). */
  readonly to: RoutePoint;
  readonly lengthM: number;
}

export interface BranchRoute {
  readonly cord: string;
  readonly driver: string;
  /** `gate.port`, or the actuator id. */
  readonly target: string;
  /** The part tied to: the gate, or the actuator. */
  readonly part: string;
  readonly kind: 'port' | 'actuator';
  readonly runs: readonly CordRun[];
  /** Runs + a knot allowance at each end + the take-up allowance. */
  readonly lengthM: number;
  /** Length of the run along the cord channel (0 for a direct rise). */
  readonly channelM: number;
  readonly pulleys: number;
  /** Angle turned over each smooth pin, radians. */
  readonly pins: readonly number[];
  /** Factor ≥ 1 on the tension the branch needs: (1/η)^pulleys · e^(μ_pin·Σ pins). */
  readonly loss: number;
  /** The loss figures used (after the cord's override). */
  readonly routing: RoutingLoss;
  readonly crossDrum: boolean;
  /** A `cordRouting` entry set some of the figures. */
  readonly overridden: boolean;
}

export interface CordRoute {
  readonly cord: string;
  readonly driver: string;
  /** Hold end to the drum, the wraps, and a knot. */
  readonly trunkM: number;
  readonly branches: readonly BranchRoute[];
  /** trunkM + every branch: the cord to cut for this driver. */
  readonly cutM: number;
}

export interface Routing {
  readonly cords: readonly CordRoute[];
  /** Every branch, in netlist order. */
  readonly branches: readonly BranchRoute[];
  /** Every cord's cut length together. */
  readonly totalCordM: number;
  /** The branches' lengths together (what the arrangement changes, with their fixed parts). */
  readonly branchCordM: number;
  /** Along the channels: the quantity the arrangement minimises, as routed. */
  readonly channelM: number;
  readonly pulleys: number;
  readonly pins: number;
  /** Rope-rescue practice: bend radius ≥ 4 × cord diameter at every pulley and pin. */
  readonly bend: { readonly radiusM: number; readonly minRadiusM: number; readonly ok: boolean };
}

/** Smallest bend radius over a pulley or pin, in cord diameters (rope-rescue practice, common practice). */
export const MIN_BEND_DIAMETERS = 4;

/** The angle of each turn in the frame: runs meet at right angles. */
const TURN_RAD = Math.PI / 2;

interface Anchor {
  readonly bay: PlacedBay;
  readonly levelM: number;
}

/** Route every branch of every cord over a layout. */
export function route(netlist: Netlist, layout: FrameLayout, profile: Profile): Routing {
  const byPart = new Map<string, Anchor>();
  for (const b of layout.bays) byPart.set(b.part, { bay: b, levelM: (b.drum - 1) * profile.frame.drumSpacingM });
  const at = (id: string, cord: string): Anchor => {
    const a = byPart.get(id);
    if (!a) throw new Error(`cord '${cord}': '${id}' has no bay in the layout`);
    return a;
  };
  const r = profile.drumRadiusM;
  const f = profile.frame;
  const parts = partIndex(netlist);
  // The hold end down to the drum, the capstan's own turns, a knot.
  const trunkOf = (driver: string): number =>
    Math.max(0, f.railAboveDrumM - r) + 2 * Math.PI * r * wrapsOf(parts.get(driver), profile) + f.knotAllowanceM;
  const cords: CordRoute[] = [];
  for (const c of netlist.cords) {
    const driver = at(c.driver, c.id);
    const trunkM = trunkOf(c.driver);
    const targets = [
      ...c.ports.map((p) => ({ target: `${p.part}.${p.port}`, kind: 'port' as const, part: p.part, lever: p.port })),
      ...c.actuators.map((a) => ({ target: a, kind: 'actuator' as const, part: a, lever: 'exit' })),
    ];
    const leaves = targets.some((t) => at(t.part, c.id).bay !== driver.bay);
    const branches = targets.map((t) => {
      const end = at(t.part, c.id);
      const lever = end.bay.levers.find((l) => l.name === t.lever) ?? end.bay.levers[0];
      const runs = leaves ? runsVia(driver, end, lever.xM, t.kind, profile) : [direct(driver, lever.xM, r, f)];
      return branchRoute(c.id, c.driver, t, runs, driver.bay.drum !== end.bay.drum, profile);
    });
    cords.push({
      cord: c.id,
      driver: c.driver,
      trunkM,
      branches,
      cutM: trunkM + branches.reduce((s, b) => s + b.lengthM, 0),
    });
  }
  return totals(cords, profile);
}

function direct(d: Anchor, xM: number, r: number, f: Profile['frame']): CordRun {
  const from = { xM: d.bay.xM, yM: d.levelM + r };
  const to = { xM, yM: d.levelM + f.railAboveDrumM };
  return { kind: 'direct', from, to, lengthM: Math.hypot(to.xM - from.xM, to.yM - from.yM) };
}

function runsVia(d: Anchor, t: Anchor, xM: number, kind: 'port' | 'actuator', profile: Profile): CordRun[] {
  const f = profile.frame;
  const channelY = Math.min(d.levelM, t.levelM) - f.channelBelowDrumM;
  const top = { xM: d.bay.xM, yM: Math.max(channelY, d.levelM - profile.drumRadiusM) };
  const corner = { xM: d.bay.xM, yM: channelY };
  const under = { xM, yM: channelY };
  const runs: CordRun[] = [
    { kind: 'drop', from: top, to: corner, lengthM: top.yM - corner.yM },
    { kind: 'channel', from: corner, to: under, lengthM: Math.abs(under.xM - corner.xM) },
  ];
  if (kind === 'actuator') runs.push({ kind: 'exit', from: under, to: under, lengthM: f.actuatorRunM });
  else {
    const lever = { xM, yM: t.levelM + f.railAboveDrumM };
    runs.push({ kind: 'rise', from: under, to: lever, lengthM: lever.yM - under.yM });
  }
  return runs;
}

/** The loss figures of a branch of `cord` that turns `turns` times in the frame, after the cord's override. */
function lossFigures(
  profile: Profile,
  cord: string,
  turns: number,
): { routing: RoutingLoss; pins: number[]; overridden: boolean } {
  const f = profile.frame;
  const computed = {
    pulleys: (f.turn === 'pulley' ? turns : 0) + profile.routing.pulleys,
    pins: [...Array<number>(f.turn === 'pin' ? turns : 0).fill(TURN_RAD)],
  };
  if (profile.routing.pinAngleRad > 0) computed.pins.push(profile.routing.pinAngleRad);
  const override = Object.hasOwn(profile.cordRouting, cord) ? profile.cordRouting[cord] : undefined;
  const pulleys = override?.pulleys ?? computed.pulleys;
  const pins =
    override?.pinAngleRad !== undefined ? (override.pinAngleRad > 0 ? [override.pinAngleRad] : []) : computed.pins;
  const routing: RoutingLoss = {
    pulleys,
    pinAngleRad: pins.reduce((s, a) => s + a, 0),
    muPin: override?.muPin ?? profile.routing.muPin,
    pulleyEfficiency: override?.pulleyEfficiency ?? profile.routing.pulleyEfficiency,
  };
  return { routing, pins, overridden: override !== undefined && Object.keys(override).length > 0 };
}

/** Turns of a branch that leaves its bay: drop → channel, channel → rise (or exit). */
const LEAVING_TURNS = 2;

/**
 * The loss of a branch of `cord` that leaves its bay (two turns), before it is placed: the
 * most any computed route of that cord costs, so a budget planned with it holds once routed.
 */
export function leavingLoss(profile: Profile, cord = ''): number {
  return routingFactor(lossFigures(profile, cord, LEAVING_TURNS).routing);
}

function branchRoute(
  cord: string,
  driver: string,
  to: { readonly target: string; readonly part: string; readonly kind: 'port' | 'actuator' },
  runs: readonly CordRun[],
  crossDrum: boolean,
  profile: Profile,
): BranchRoute {
  const f = profile.frame;
  const { routing, pins, overridden } = lossFigures(profile, cord, runs.length - 1);
  const runM = runs.reduce((s, x) => s + x.lengthM, 0);
  return {
    cord,
    driver,
    target: to.target,
    part: to.part,
    kind: to.kind,
    runs,
    lengthM: runM + 2 * f.knotAllowanceM + f.takeUpAllowanceM,
    channelM: runs.reduce((s, x) => s + (x.kind === 'channel' ? x.lengthM : 0), 0),
    pulleys: routing.pulleys,
    pins,
    loss: routingFactor(routing),
    routing,
    crossDrum,
    overridden,
  };
}

function totals(cords: readonly CordRoute[], profile: Profile): Routing {
  const branches = cords.flatMap((c) => c.branches);
  const radiusM = profile.frame.pulleyDiameterM / 2;
  const minRadiusM = MIN_BEND_DIAMETERS * profile.frame.cordDiameterM;
  return {
    cords,
    branches,
    totalCordM: cords.reduce((s, c) => s + c.cutM, 0),
    branchCordM: branches.reduce((s, b) => s + b.lengthM, 0),
    channelM: branches.reduce((s, b) => s + b.channelM, 0),
    pulleys: branches.reduce((s, b) => s + b.pulleys, 0),
    pins: branches.reduce((s, b) => s + b.pins.length, 0),
    bend: { radiusM, minRadiusM, ok: radiusM >= minRadiusM - 1e-12 },
  };
}

/**
 * The loss each branch will have once the build is placed, before it is: every part has a bay
 * of its own, so a branch to another part leaves its driver's bay and turns twice
 * (`leavingLoss`); only a branch back to its own driver would rise straight. Exact for the
 * routes above; what the build is balanced with before it is placed, so that placing it
 * rarely has to balance it again.
 */
export function expectedLosses(netlist: Netlist, profile: Profile): BranchLosses {
  const out = new Map<string, number>();
  for (const c of netlist.cords) {
    const leaving = leavingLoss(profile, c.id);
    const straight = routingFactor(lossFigures(profile, c.id, 0).routing);
    for (const p of c.ports) out.set(branchKey(c.id, `${p.part}.${p.port}`), p.part === c.driver ? straight : leaving);
    for (const a of c.actuators) out.set(branchKey(c.id, a), leaving);
  }
  return out;
}

/** Routing loss of each branch, by `branchKey(cord, target)`: what the drive budget multiplies a load by. */
export function lossByBranch(routing: Routing): BranchLosses {
  return new Map(routing.branches.map((b) => [branchKey(b.cord, b.target), b.loss]));
}
