/**
 * Bill of materials of a netlist under a technology profile.
 *
 * What it counts: levers by kind (operator, clock, reset, summing lever Z of each gate, port
 * levers of gates with two or more ports — a one-port gate's port is Z itself), flags,
 * actuators (each with its load and the capstan that lifts it), weights (one per port lever,
 * per Z, per operator lever), capstans and their wraps (one row per number of turns: an
 * actuator's capstan may have more than the profile's `wraps`), drums, cord, and the pins and
 * pulleys the cords pass.
 * - A placed build (`frame`: its routing and drums, phases/place) is measured: each drum at its
 *   length, the cord as the sum of every cut length (physics/routing.ts: runs, knots, take-up,
 *   trunks and wraps), pulleys and pins as routed.
 * - Otherwise, estimates: one drum as long as every capstan's turns × wrapPitchM, each branch at
 *   profile.cordBranchM plus the cord wrapped on the drum, and each branch's routing allowance
 *   in the profile (one pin per quarter turn of redirection, an estimate: a pin rarely turns a
 *   cord further).
 * Postcondition: rows with a count of zero are left out; numbers are rounded to what a
 * builder can cut or weigh (0.1 g, 1 mm), in SI; the notes' sizes (drum radius, wrap pitch,
 * pulley) are words in the profile's `documentUnits` (model/units.ts). The CSV form of the rows
 * is export/bom-csv.ts.
 */
import type { Netlist } from '../model/netlist.js';
import { routingFor, wrapsOf } from './capstan.js';
import type { Profile } from './profile.js';
import type { Routing } from './routing.js';
import { inMetres, inMillimetres, plain, quantitiesFor, trimmed } from '../model/units.js';

/** What a placed build adds: its routing and its drums (a Placement of phases/place fits). */
export interface FrameFigures {
  readonly routing: Routing;
  readonly drums: readonly { readonly drum: number; readonly lengthM: number }[];
}

/** One line of the bill of materials. */
export interface BomRow {
  readonly item: string;
  readonly kind: 'lever' | 'indicator' | 'actuator' | 'weight' | 'capstan' | 'drum' | 'cord' | 'routing';
  readonly count: number;
  /** Amount per piece, in `unit`. */
  readonly each: number;
  readonly unit: string;
  /** count × each. */
  readonly total: number;
  readonly note: string;
}

const r1 = (x: number): number => Math.round(x * 10) / 10;
const r3 = (x: number): number => Math.round(x * 1000) / 1000;

/** Adds a row when its count is above zero, rounding the amounts with `round` (default 0.1). */
type AddRow = (
  item: string,
  kind: BomRow['kind'],
  count: number,
  each: number,
  unit: string,
  note: string,
  round?: (x: number) => number,
) => void;

/** Parts, weights, capstans, cord and routing hardware, in that order; measured from `frame` when given. */
export function billOfMaterials(netlist: Netlist, profile: Profile, frame?: FrameFigures): BomRow[] {
  const rows: BomRow[] = [];
  const add: AddRow = (item, kind, count, each, unit, note, round = r1) => {
    if (count > 0) rows.push({ item, kind, count, each: round(each), unit, total: round(count * each), note });
  };
  addLeversAndWeights(netlist, profile, add);
  const turns = capstanTurns(netlist, profile);
  for (const [w, n] of turns)
    add(
      w === profile.wraps ? 'capstan' : `capstan, ${w} turns`,
      'capstan',
      n,
      w,
      'turns',
      w === profile.wraps
        ? `μ = ${profile.mu} cord on drum`
        : `μ = ${profile.mu}; an actuator's capstan, turns sized by its load`,
    );
  const capstans = [...turns.values()].reduce((a, n) => a + n, 0);
  const totalTurns = [...turns].reduce((a, [w, n]) => a + w * n, 0);
  // The notes' sizes in the workshop's units (model/units.ts); the rows' amounts stay SI.
  const q = quantitiesFor(profile.documentUnits);
  const drumNote = `radius ${q.size(profile.drumRadiusM, inMetres(plain))} at ${profile.drumRpm} rev/min; ${q.size(profile.wrapPitchM, inMetres(trimmed(3)))} per wrap`;
  if (frame) {
    for (const d of frame.drums) add(`drum ${d.drum}`, 'drum', 1, d.lengthM, 'm length', `${drumNote}; as placed`, r3);
    addMeasuredCord(netlist, frame.routing, profile, add);
  } else {
    add('drum', 'drum', capstans > 0 ? 1 : 0, totalTurns * profile.wrapPitchM, 'm length', drumNote, r3);
    addCordAndRouting(netlist, profile, turns, add);
  }
  return rows;
}

/** Cord, pins and pulleys as routed in the frame. */
function addMeasuredCord(netlist: Netlist, routing: Routing, profile: Profile, add: AddRow): void {
  const branches = routing.branches.length;
  add(
    'cord, cut to length',
    'cord',
    1,
    routing.totalCordM,
    'm',
    `${netlist.cords.length} cords, ${branches} branches (each length in cut-list.csv); knots, take-up and the wraps on the drum included`,
    r3,
  );
  add(
    'redirect pin',
    'routing',
    routing.pins,
    1,
    'piece',
    'one at each corner of a cord’s tree (shared by its branches) and one where each branch rises or leaves',
  );
  add(
    'pulley',
    'routing',
    routing.pulleys,
    1,
    'piece',
    `${quantitiesFor(profile.documentUnits).size(profile.frame.pulleyDiameterM, inMillimetres(plain))}, efficiency ${profile.routing.pulleyEfficiency} each; one at each corner of a cord’s tree (shared by its branches) and one where each branch rises or leaves`,
  );
}

/** Capstans by their turns (every lever or gate with an output cord), the profile's `wraps` first. */
export function capstanTurns(netlist: Netlist, profile: Profile): Map<number, number> {
  const drivers = new Set(netlist.cords.map((c) => c.driver));
  const turns = new Map<number, number>();
  for (const p of netlist.parts)
    if ((p.kind === 'lever' || p.kind === 'gate') && drivers.has(p.id)) {
      const w = wrapsOf(p, profile);
      turns.set(w, (turns.get(w) ?? 0) + 1);
    }
  const sorted = [...turns].sort(([a], [b]) => (a === profile.wraps ? -1 : b === profile.wraps ? 1 : a - b));
  return new Map(sorted);
}

/** Levers by kind, flags, actuators, then the weights that hang on them. */
function addLeversAndWeights(netlist: Netlist, profile: Profile, add: AddRow): void {
  const levers = netlist.parts.flatMap((p) => (p.kind === 'lever' ? [p] : []));
  const gates = netlist.parts.flatMap((p) => (p.kind === 'gate' ? [p] : []));
  const portLevers = gates.reduce((n, g) => n + (g.ports.length > 1 ? g.ports.length : 0), 0);
  const byRole = (...roles: string[]): number => levers.filter((l) => roles.includes(l.role)).length;

  add('operator lever', 'lever', byRole('input'), 1, 'piece', 'one per machine input; pulled = 1');
  add('clock lever', 'lever', byRole('phi1', 'phi2'), 1, 'piece', 'φ1 then φ2, never together');
  add('reset lever', 'lever', byRole('reset'), 1, 'piece', 'pull only with both clock levers released');
  add('summing lever Z', 'lever', gates.length, 1, 'piece', 'one per gate; the hold end of its capstan');
  add('port lever', 'lever', portLevers, 1, 'piece', "gates with two or more ports (a one-port gate's port is its Z)");
  const flags = netlist.parts.filter((p) => p.kind === 'flag').length;
  add(
    'flag',
    'indicator',
    flags,
    1,
    'piece',
    "mounted on a gate's Z lever; moves only its own swing, no external load",
  );
  const pulledBy = new Map(netlist.cords.flatMap((c) => c.actuators.map((a): [string, string] => [a, c.driver])));
  const byId = new Map(netlist.parts.map((p) => [p.id, p]));
  for (const p of netlist.parts) {
    if (p.kind !== 'actuator') continue;
    const driver = pulledBy.get(p.id);
    const how =
      driver === undefined
        ? `held ${p.fixed === 1 ? 'lifted' : 'at rest'} (a constant output)`
        : `lifted by the capstan of ${driver}, ${wrapsOf(byId.get(driver), profile)} turns`;
    add(`actuator ${p.output}`, 'actuator', 1, p.loadG, 'g load', `shows output ${p.output}; ${how}`);
  }

  add('port pull-up weight', 'weight', portLevers, profile.portWeightG, 'g', 'one per port lever');
  add('Z weight', 'weight', gates.length, profile.zWeightG, 'g', 'one per gate; sets the capstan hold tension');
  const leverNote = 'one per operator, clock or reset lever';
  add('lever pull-up weight', 'weight', levers.length, profile.leverWeightG, 'g', leverNote);
}

/** Cord (branches and the wraps on the drum), redirect pins and pulleys. */
function addCordAndRouting(netlist: Netlist, profile: Profile, turns: ReadonlyMap<number, number>, add: AddRow): void {
  let branches = 0;
  let pins = 0;
  let pulleys = 0;
  for (const c of netlist.cords) {
    const n = c.ports.length + c.actuators.length;
    const r = routingFor(profile, c.id);
    branches += n;
    pins += n * Math.ceil(r.pinAngleRad / (Math.PI / 2) - 1e-9);
    pulleys += n * r.pulleys;
  }
  const branchNote = `${netlist.cords.length} cords; length per branch is an allowance`;
  add('cord branch', 'cord', branches, profile.cordBranchM, 'm', branchNote, r3);
  for (const [w, n] of turns) {
    const item = w === profile.wraps ? 'capstan wrap cord' : `capstan wrap cord, ${w} turns`;
    add(item, 'cord', n, w * 2 * Math.PI * profile.drumRadiusM, 'm', 'cord wrapped on the drum per capstan', r3);
  }
  add('redirect pin', 'routing', pins, 1, 'piece', 'one per quarter turn of redirection per branch (estimate)');
  add('pulley', 'routing', pulleys, 1, 'piece', `efficiency ${profile.routing.pulleyEfficiency} each`);
}
