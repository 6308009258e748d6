/**
 * Routing: the run, length, pulleys, pins and force loss of every cord branch, from where the
 * parts sit in the frame (design §11), and the pieces each cord is cut as.
 *
 * Geometry (every figure from profile.frame): x runs along the drum from its visitor end,
 * y upwards from the axis of drum 1; drum d's axis is (d − 1)·drumSpacingM higher (drums
 * stacked one above the other). A capstan sits at its bay's centre; each lever at its place
 * on the pivot rail, railAboveDrumM above its drum's axis. The channel of drum L runs
 * channelBelowDrumM under its axis.
 * - A cord none of whose targets leaves its driver's bay: every branch rises directly from the
 *   top of the drum to its lever: one straight run, no turn.
 * - Any other cord runs as a tree (design §11: "a driver with several branches splits them at
 *   a knot in the channel"): ONE drop from the bottom of its driver's drum down to the lowest
 *   channel any branch uses, a knot where it meets each channel used. A branch to drum d_i runs
 *   in the channel of the lower drum, L_i = min(driver's drum, d_i). Along channel L the cord
 *   covers [min, max] of the capstan's x and its targets' x there: one run from the capstan
 *   towards the leftmost target, one towards the rightmost; each branch peels off at a knot
 *   under its lever and rises to it (a port) or leaves the frame by an exit pulley (an
 *   actuator, actuatorRunM). So the cord along the channels is, summed over every cord that
 *   leaves its bay and every channel it uses, max − min of those x: `Routing.channelM`, the
 *   quantity the arrangement minimises (a minimum linear arrangement over the cords' nets).
 * - A branch's `runs` are its whole path, drum to lever: drop to its channel, along it from the
 *   capstan to its lever, rise (or exit). Its loss is taken over that path: two right-angle
 *   turns, each at a pulley or a smooth pin (frame.turn).
 * - The pieces to cut: each segment of the tree belongs to exactly one branch (`own`), by this
 *   rule: levels from the highest channel down; within a level the left side (targets with
 *   x < the capstan's), then the right side, then targets right under the capstan; on each side
 *   the target farthest from the capstan owns the channel run out to it, the others only their
 *   rise; the first branch served at a level also owns the drop from the previous level (or the
 *   drum) down to it. Equally far levers (one above another on different drums) go by target
 *   name (`gate.port`, code-point order). A branch's length is its own runs + a knot
 *   allowance at each end + the take-up allowance, so a cord of one branch is as
 *   long as its path. A cord's trunk (from its hold lever down to the drum, its wraps, and a
 *   knot) is listed per cord; cutM = trunk + every branch's piece.
 * - Pulleys and pins in the frame: the corner where the drop turns into one side of a channel
 *   is one pulley (or pin) shared by every branch turning there; each branch has its own at its
 *   rise or exit. A cord with a `cordRouting` entry is counted per branch, as its entry says.
 * Loss of a branch (factor ≥ 1 on the tension it needs): (1/η)^pulleys · e^(μ_pin·α) for a
 * total pin angle α — the capstan equation of Euler and Eytelwein for the pins (capstan.ts).
 * `routing.pulleys` and `routing.pinAngleRad` of the profile are added to every computed route;
 * a `cordRouting` entry replaces, for its cord, each figure it names (its pulleys and pin angle
 * count per branch, in all).
 * Every run records the drum whose channel it belongs to (`CordRun.drum`), and a drop from a knot
 * the drum of the channel it leaves (`knotDrum`): readers take them from here, never from a height.
 * Pre: every driver and target of every cord has a bay in the layout. Post: one route per
 * branch, in netlist order (cords, then each cord's ports, then its actuators); the `own` runs
 * of a cord's branches cover its tree, each segment once.
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
  /**
   * The drum whose cord channel the run belongs to, as laid: a channel run lies in it, a drop falls
   * to it, a rise or exit leaves it; a direct rise rises from the top of this drum.
   */
  readonly drum: number;
  /** A drop that starts at a knot in a higher channel (not at the drum): that channel's drum. */
  readonly knotDrum?: number;
}

export interface BranchRoute {
  readonly cord: string;
  readonly driver: string;
  /** `gate.port`, or the actuator id. */
  readonly target: string;
  /** The part tied to: the gate, or the actuator. */
  readonly part: string;
  readonly kind: 'port' | 'actuator';
  /** Its whole path, from the drum to its lever (or out of the frame): what its loss is taken over. */
  readonly runs: readonly CordRun[];
  /** The segments of the cord's tree this branch is cut as (each segment of a tree belongs to one branch), in path order. */
  readonly own: readonly CordRun[];
  /** The piece to cut: its own runs + a knot allowance at each end + the take-up allowance. */
  readonly lengthM: number;
  /** Length of its own run along the cord channel (0 for a direct rise, or a branch that only rises from the channel). */
  readonly channelM: number;
  /** Pulleys on its path (each turn it passes, shared or not, and the profile's own allowance). */
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
  /** trunkM + every branch's piece: the cord to cut for this driver. */
  readonly cutM: number;
  /** Pulleys in the frame for this cord: a corner shared by its branches counts once. */
  readonly pulleys: number;
  /** Pins in the frame for this cord, counted as `pulleys` is. */
  readonly pins: number;
}

export interface Routing {
  readonly cords: readonly CordRoute[];
  /** Every branch, in netlist order. */
  readonly branches: readonly BranchRoute[];
  /** Every cord's cut length together. */
  readonly totalCordM: number;
  /** The branches' pieces together (what the arrangement changes, with their fixed parts). */
  readonly branchCordM: number;
  /** Along the channels, each cord's run once (its span on every channel it uses): the quantity the arrangement minimises. */
  readonly channelM: number;
  /** Pulleys in the frame (every cord's `pulleys`). */
  readonly pulleys: number;
  /** Pins in the frame (every cord's `pins`). */
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
    const targets = [
      ...c.ports.map((p) => ({ target: `${p.part}.${p.port}`, kind: 'port' as const, part: p.part, lever: p.port })),
      ...c.actuators.map((a) => ({ target: a, kind: 'actuator' as const, part: a, lever: 'exit' })),
    ];
    const ends = targets.map((t) => {
      const end = at(t.part, c.id);
      const lever = end.bay.levers.find((l) => l.name === t.lever) ?? end.bay.levers[0];
      return { end, xM: lever.xM };
    });
    const leaves = ends.some((e) => e.end.bay !== driver.bay);
    const paths = ends.map((e, i) =>
      leaves ? runsVia(driver, e.end, e.xM, targets[i].kind, profile) : [direct(driver, e.xM, r, f)],
    );
    const names = targets.map((t) => t.target);
    const tree = leaves ? treeOf(driver, paths, names, profile.drumRadiusM) : { own: paths, corners: 0 };
    const branches = targets.map((t, i) =>
      branchRoute(c.id, c.driver, t, paths[i], tree.own[i], driver.bay.drum !== ends[i].end.bay.drum, profile),
    );
    const trunkM = trunkOf(c.driver);
    cords.push({
      cord: c.id,
      driver: c.driver,
      trunkM,
      branches,
      cutM: trunkM + branches.reduce((s, b) => s + b.lengthM, 0),
      ...inFrame(branches, leaves ? tree.corners : 0, profile),
    });
  }
  return totals(cords, profile);
}

function direct(d: Anchor, xM: number, r: number, f: Profile['frame']): CordRun {
  const from = { xM: d.bay.xM, yM: d.levelM + r };
  const to = { xM, yM: d.levelM + f.railAboveDrumM };
  return { kind: 'direct', from, to, lengthM: Math.hypot(to.xM - from.xM, to.yM - from.yM), drum: d.bay.drum };
}

function runsVia(d: Anchor, t: Anchor, xM: number, kind: 'port' | 'actuator', profile: Profile): CordRun[] {
  const f = profile.frame;
  // The branch runs in the channel of the lower of its two drums.
  const drum = Math.min(d.bay.drum, t.bay.drum);
  const channelY = Math.min(d.levelM, t.levelM) - f.channelBelowDrumM;
  const top = { xM: d.bay.xM, yM: Math.max(channelY, d.levelM - profile.drumRadiusM) };
  const corner = { xM: d.bay.xM, yM: channelY };
  const under = { xM, yM: channelY };
  const runs: CordRun[] = [
    { kind: 'drop', from: top, to: corner, lengthM: top.yM - corner.yM, drum },
    { kind: 'channel', from: corner, to: under, lengthM: Math.abs(under.xM - corner.xM), drum },
  ];
  if (kind === 'actuator') runs.push({ kind: 'exit', from: under, to: under, lengthM: f.actuatorRunM, drum });
  else {
    const lever = { xM, yM: t.levelM + f.railAboveDrumM };
    runs.push({ kind: 'rise', from: under, to: lever, lengthM: lever.yM - under.yM, drum });
  }
  return runs;
}

/** Which side of the capstan a target's rise is on, along the channel. */
const sideOf = (x: number, xD: number): 0 | 1 | 2 => (x < xD - 1e-9 ? 0 : x > xD + 1e-9 ? 1 : 2);

/**
 * The tree of a cord that leaves its bay, from its branches' whole paths (runsVia): which runs
 * each branch is cut as, by the ownership rule of the contract, and how many corners (drop into
 * a side of a channel) it turns.
 */
function treeOf(
  d: Anchor,
  paths: readonly CordRun[][],
  names: readonly string[],
  r: number,
): { own: CordRun[][]; corners: number } {
  const xD = d.bay.xM;
  const yTop = d.levelM - r;
  const info = paths.map((runs, i) => {
    const end = runs[runs.length - 1];
    const y = end.from.yM;
    const x = end.from.xM;
    return { i, y, x, side: sideOf(x, xD), far: Math.abs(x - xD), end, drum: end.drum };
  });
  const own: CordRun[][] = paths.map(() => []);
  const drops: (CordRun | undefined)[] = paths.map(() => undefined);
  const channels: (CordRun | undefined)[] = paths.map(() => undefined);
  const levels = [...new Set(info.map((t) => t.y))].sort((a, b) => b - a);
  let above = yTop;
  let aboveDrum: number | undefined;
  let corners = 0;
  for (const y of levels) {
    const here = info.filter((t) => t.y === y);
    // Served in order: left side, right side, under the capstan; farthest first on a side; levers equally far
    // (above one another on different drums) by target name, so the rule does not hang on any listing order.
    const served = [...here].sort(
      (a, b) =>
        a.side - b.side ||
        (Math.abs(b.far - a.far) > 1e-9 ? b.far - a.far : 0) ||
        (names[a.i] < names[b.i] ? -1 : names[a.i] > names[b.i] ? 1 : 0),
    );
    const first = served[0];
    const drum = first.drum;
    // From the knot where the drop meets the channel above, or from the drum itself.
    const fromKnot = aboveDrum !== undefined && above < yTop;
    const from = { xM: xD, yM: Math.max(y, Math.min(yTop, above)) };
    drops[first.i] = {
      kind: 'drop',
      from,
      to: { xM: xD, yM: y },
      lengthM: from.yM - y,
      drum,
      ...(fromKnot && from.yM > y ? { knotDrum: aboveDrum } : {}),
    };
    above = y;
    aboveDrum = drum;
    for (const side of [0, 1, 2] as const) {
      const owner = served.find((t) => t.side === side);
      if (!owner) continue;
      corners++;
      if (side !== 2)
        channels[owner.i] = {
          kind: 'channel',
          from: { xM: xD, yM: y },
          to: { xM: owner.x, yM: y },
          lengthM: owner.far,
          drum,
        };
    }
  }
  for (const t of info) {
    const drop = drops[t.i];
    const channel = channels[t.i];
    if (drop) own[t.i].push(drop);
    if (channel) own[t.i].push(channel);
    own[t.i].push(t.end);
  }
  return { own, corners };
}

/**
 * Pulleys and pins of one cord in the frame: each corner of its tree once, each branch's rise or
 * exit, and the profile's allowance per branch; a cord with a `cordRouting` entry, per branch.
 */
function inFrame(
  branches: readonly BranchRoute[],
  corners: number,
  profile: Profile,
): { pulleys: number; pins: number } {
  const perBranch = {
    pulleys: branches.reduce((s, b) => s + b.pulleys, 0),
    pins: branches.reduce((s, b) => s + b.pins.length, 0),
  };
  if (corners === 0 || branches.some((b) => b.overridden)) return perBranch;
  const turns = corners + branches.length;
  return {
    pulleys: (profile.frame.turn === 'pulley' ? turns : 0) + branches.length * profile.routing.pulleys,
    pins: (profile.frame.turn === 'pin' ? turns : 0) + (profile.routing.pinAngleRad > 0 ? branches.length : 0),
  };
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
  own: readonly CordRun[],
  crossDrum: boolean,
  profile: Profile,
): BranchRoute {
  const f = profile.frame;
  const { routing, pins, overridden } = lossFigures(profile, cord, runs.length - 1);
  const ownM = own.reduce((s, x) => s + x.lengthM, 0);
  return {
    cord,
    driver,
    target: to.target,
    part: to.part,
    kind: to.kind,
    runs,
    own,
    lengthM: ownM + 2 * f.knotAllowanceM + f.takeUpAllowanceM,
    channelM: own.reduce((s, x) => s + (x.kind === 'channel' ? x.lengthM : 0), 0),
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
    pulleys: cords.reduce((s, c) => s + c.pulleys, 0),
    pins: cords.reduce((s, c) => s + c.pins, 0),
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
