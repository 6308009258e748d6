/**
 * Force budget of every capstan driver (design §4).
 *
 * Method: the capstan equation (see capstan.ts). A driver is a lever or gate with at least one
 * output cord; all its cords leave the same capstan, so its load is the sum over every branch
 * of every cord: (port load or actuator load) × routing loss of that cord.
 * - A branch to a port of a gate with two or more ports lifts the port's pull-up weight and
 *   the Z weight the port drags down with it (sized as if this cord pulled alone, so Z is
 *   still up: the worst case, whatever other cords on the port or the gate are doing).
 * - A branch to a one-port gate lifts Z itself (that port is Z): the Z weight alone.
 * - A branch to an actuator lifts the actuator's load; its routing loss applies too.
 * The hold tension is Z's weight (a gate) or the lever's pull-up weight (a lever), times the
 * lever ratio; the gain is e^(μθ) with θ = 2π × the capstan's turns (a gate's own `wraps`, the
 * capstan of an actuator, else the profile's). Margin = available / load; ok when margin ≥
 * profile.minMargin. A failing budget that pulls an actuator names the output, how far its
 * load is over what the capstan can move at the design margin, and what to change.
 * Routing loss of a branch: its entry in `losses` (the routed frame: physics/routing.ts, keyed
 * by `branchKey`), else its cord's routing in the profile (the default with the cord's
 * `cordRouting` entry) — "straight" unless the profile says otherwise.
 * Precondition: a netlist whose cords name existing parts (the netlist invariants).
 * Postcondition: one budget per driver, in the netlist's part order.
 */
import { partIndex, type Netlist, type Part } from '../model/netlist.js';
import { availableTension, gramsToNewtons, routingFactor, routingFor, wrapsNeeded, wrapsOf } from './capstan.js';
import type { Profile } from './profile.js';
import { joinWords, massFigure, say, trimmed, wordsIn, type Figure, type Words } from '../model/units.js';

/** Routing loss (factor ≥ 1) of each branch, by `branchKey(cord, target)`: what the routed frame gives. */
export type BranchLosses = ReadonlyMap<string, number>;

/** The key of one branch in `BranchLosses`: cord id and target (`gate.port` or actuator id). */
export function branchKey(cord: string, target: string): string {
  return `${cord}→${target}`;
}

/** One branch of a cord and what it costs the capstan. */
export interface BranchLoad {
  readonly cord: string;
  /** `gate.port` for a port, the actuator id for an actuator. */
  readonly target: string;
  readonly kind: 'port' | 'actuator';
  /** Load before routing loss, grams-force. */
  readonly baseG: number;
  readonly routingFactor: number;
  /** baseG × routingFactor. */
  readonly loadG: number;
  /** The machine output an actuator branch shows. */
  readonly output?: string;
}

/** The budget of one capstan driver. */
export interface DriverBudget {
  readonly driver: string;
  readonly driverKind: 'lever' | 'gate';
  readonly cords: readonly string[];
  /** Turns of cord on the drum of this capstan. */
  readonly wraps: number;
  readonly holdG: number;
  readonly gain: number;
  readonly availableG: number;
  readonly availableN: number;
  readonly loadG: number;
  readonly loadN: number;
  /** available / load (Infinity for a cord that pulls nothing). */
  readonly margin: number;
  readonly ok: boolean;
  readonly branches: readonly BranchLoad[];
  /** The driver's heaviest cord: the one to name when the budget fails. */
  readonly weakestCord: string;
  /** For a failing budget: what fails, in words, naming the cord and its loads. */
  readonly message?: string;
  /** For a failing budget: the ways out, each with the figure that would pass. */
  readonly fixes?: readonly string[];
}

/** Load of one port branch before routing: port + Z weight, or Z alone for a one-port gate. */
export function portLoadG(profile: Profile, gate: Part | undefined): number {
  if (gate?.kind === 'gate' && gate.ports.length === 1) return profile.zWeightG;
  return profile.portWeightG + profile.zWeightG;
}

/** Hold weight (before the lever ratio) of a driver's capstan: the lever's pull-up or Z's weight. */
export function holdWeightG(profile: Profile, driverKind: 'lever' | 'gate'): number {
  return driverKind === 'lever' ? profile.leverWeightG : profile.zWeightG;
}

/** Every branch load of the cords driven by each driver, keyed by driver id; `losses` from the routed frame. */
export function branchLoads(netlist: Netlist, profile: Profile, losses?: BranchLosses): Map<string, BranchLoad[]> {
  const parts = partIndex(netlist);
  const byDriver = new Map<string, BranchLoad[]>();
  for (const c of netlist.cords) {
    const straight = routingFactor(routingFor(profile, c.id));
    const f = (target: string): number => losses?.get(branchKey(c.id, target)) ?? straight;
    const list = byDriver.get(c.driver) ?? [];
    for (const p of c.ports) {
      const baseG = portLoadG(profile, parts.get(p.part));
      const target = `${p.part}.${p.port}`;
      list.push({ cord: c.id, target, kind: 'port', baseG, routingFactor: f(target), loadG: baseG * f(target) });
    }
    for (const a of c.actuators) {
      const part = parts.get(a);
      const baseG = part?.kind === 'actuator' ? part.loadG : 0;
      const output = part?.kind === 'actuator' ? { output: part.output } : {};
      list.push({
        cord: c.id,
        target: a,
        kind: 'actuator',
        baseG,
        routingFactor: f(a),
        loadG: baseG * f(a),
        ...output,
      });
    }
    byDriver.set(c.driver, list);
  }
  return byDriver;
}

/** Force budget of every capstan driver, in part order; `losses` from the routed frame. */
export function driveBudget(netlist: Netlist, profile: Profile, losses?: BranchLosses): DriverBudget[] {
  const loads = branchLoads(netlist, profile, losses);
  const out: DriverBudget[] = [];
  for (const part of netlist.parts) {
    const branches = loads.get(part.id);
    if (!branches || (part.kind !== 'lever' && part.kind !== 'gate')) continue;
    out.push(budgetOf(part.id, part.kind, branches, profile, wrapsOf(part, profile)));
  }
  return out;
}

function budgetOf(
  driver: string,
  driverKind: 'lever' | 'gate',
  branches: readonly BranchLoad[],
  profile: Profile,
  wraps: number,
): DriverBudget {
  const t = availableTension(profile, holdWeightG(profile, driverKind), wraps);
  const cords = [...new Set(branches.map((b) => b.cord))];
  const perCord = new Map<string, number>();
  for (const b of branches) perCord.set(b.cord, (perCord.get(b.cord) ?? 0) + b.loadG);
  const weakestCord = cords.reduce((a, c) => ((perCord.get(c) ?? 0) > (perCord.get(a) ?? 0) ? c : a), cords[0]);
  const loadG = branches.reduce((s, b) => s + b.loadG, 0);
  const margin = loadG > 0 ? t.availableG / loadG : Infinity;
  const ok = margin >= profile.minMargin;
  const base = {
    driver,
    driverKind,
    cords,
    wraps,
    holdG: t.holdG,
    gain: t.gain,
    availableG: t.availableG,
    availableN: t.availableN,
    loadG,
    loadN: gramsToNewtons(loadG),
    margin,
    ok,
    branches,
    weakestCord,
  };
  if (ok) return base;
  const w = budgetWords(base, profile);
  return { ...base, message: wordsIn(w.message, 'metric'), fixes: w.fixes.map((f) => wordsIn(f, 'metric')) };
}

/** A load in a message: in metric whole grams from 100 g, to 0.1 g below. */
const grams = (g: number): Figure => massFigure(g, trimmed(g >= 100 ? 0 : 1));

/**
 * What is wrong with an over-budget driver and what to change, as Words (model/units.ts): the
 * budget's `message` and `fixes` are these in metric; a document writes them in its own units.
 */
export function budgetWords(
  b: Omit<DriverBudget, 'message' | 'fixes'>,
  profile: Profile,
): { readonly message: Words; readonly fixes: readonly Words[] } {
  return { message: failWords(b, profile), fixes: fixWords(b, profile) };
}

/**
 * The largest load an actuator branch `a` of budget `b` could have, grams before routing loss,
 * with the capstan keeping `margin`: what the capstan holds at that margin, less its other
 * branches, divided by the branch's routing loss. 0 when the others already use it all.
 */
export function maxActuatorLoadG(b: Pick<DriverBudget, 'availableG' | 'loadG'>, a: BranchLoad, margin: number): number {
  return Math.max(0, (b.availableG / margin - (b.loadG - a.loadG)) / a.routingFactor);
}

function failWords(b: Omit<DriverBudget, 'message' | 'fixes'>, profile: Profile): Words {
  const act = b.branches.find((x) => x.kind === 'actuator' && x.output !== undefined);
  if (act) {
    const most = maxActuatorLoadG(b, act, profile.minMargin);
    const turns = `${b.wraps} ${b.wraps === 1 ? 'turn' : 'turns'}${b.wraps >= profile.maxWraps ? ', the most maxWraps allows' : ''}`;
    return say`output '${act.output ?? ''}' lifts ${grams(act.baseG)} (actuator ${act.target}, cord '${act.cord}'), but its capstan (${b.driverKind} '${b.driver}', ${turns}) can move at most ${grams(most)} at margin ${profile.minMargin}: ${grams(act.baseG - most)} short (margin ${b.margin.toFixed(2)})`;
  }
  const shown = joinWords(
    b.branches.slice(0, 8).map((x) => say`${x.target} ${grams(x.loadG)}`),
    ', ',
  );
  const more = b.branches.length > 8 ? `, … ${b.branches.length - 8} more` : '';
  const cordWord = b.cords.length === 1 ? `cord '${b.cords[0]}'` : `cords ${b.cords.map((c) => `'${c}'`).join(', ')}`;
  return say`${cordWord} (capstan of ${b.driverKind} '${b.driver}') must lift ${grams(b.loadG)} (${shown}${more}) but its capstan holds ${grams(b.availableG)}: margin ${b.margin.toFixed(2)}`;
}

function fixWords(b: Omit<DriverBudget, 'message' | 'fixes'>, profile: Profile): Words[] {
  const fixes: Words[] = [];
  const budgetG = b.availableG / profile.minMargin;
  const heaviest = Math.max(...b.branches.map((x) => x.loadG));
  const act = b.branches.find((x) => x.kind === 'actuator' && x.output !== undefined);
  if (act) {
    const most = Math.floor(maxActuatorLoadG(b, act, profile.minMargin));
    fixes.push(
      say`a lighter load on '${act.output ?? ''}': at most ${massFigure(most)} (counterweight the load, or hang it from a 2:1 pulley block, which halves it)`,
    );
  } else if (b.branches.length > 1 && heaviest <= budgetG) {
    const each = b.loadG / b.branches.length;
    fixes.push(
      say`fewer branches: this capstan carries about ${Math.max(1, Math.floor(budgetG / each))} of them at margin ${profile.minMargin}; spread the rest over a buffer tree`,
    );
  }
  const turns = wrapsNeeded(b.loadG, b.holdG, profile.mu, profile.minMargin, 0);
  if (turns > b.wraps)
    fixes.push(
      act
        ? say`more wraps: ${turns} turns on this capstan (μ = ${profile.mu}); raise maxWraps to ${turns} (now ${profile.maxWraps})`
        : say`more wraps: ${turns} turns on the drum (μ = ${profile.mu})`,
    );
  const needG = Math.ceil((profile.minMargin * b.loadG) / (profile.leverRatio * b.gain));
  fixes.push(
    b.driverKind === 'lever'
      ? say`a heavier lever pull-up weight: ${massFigure(needG)} (leverWeightG; the lever gets harder to pull)`
      : say`a heavier Z weight on this gate alone: ${massFigure(needG)} (a heavier zWeightG for every gate also adds to the load of each port it hangs on)`,
  );
  return fixes;
}
