/**
 * The wiring list: one row per cord branch (a cord tied to one port or actuator), with what
 * a builder needs to tie it and to know it will hold — the driver and the side of it the cord
 * leaves from, the turns of its capstan on the drum, the target part and port (for an
 * actuator, its load), the routing allowance, the branch's load and the driver's force margin
 * (physics/drive.ts, the capstan equation). With a placement, also the bays the branch runs
 * between (drum·bay) and the length of the piece it is cut as (its part of the cord's tree;
 * cut-list.csv says where it is tied on), and the routing, load and margin are those of the
 * branch's whole path as routed in the frame (physics/routing.ts).
 *
 * Order: by driver in stage order (stages.ts: levers first, flags last; netlist order within
 * a stage), then by target in the same order, then port name — so a builder works along the
 * machine once, finishing every cord of one capstan before the next.
 * Postcondition: every branch of every cord appears exactly once; every cell goes through
 * csv.ts (RFC 4180 with formula-injection escaping).
 */
import { partIndex, type Netlist, type Part } from '../model/netlist.js';
import type { Placement } from '../phases/place/index.js';
import { branchKey, branchLoads, driveBudget } from '../physics/drive.js';
import { routingFor, wrapsOf } from '../physics/capstan.js';
import type { Profile, RoutingLoss } from '../physics/profile.js';
import { lossByBranch, type BranchRoute } from '../physics/routing.js';
import { recordsToCsv } from './csv.js';
import { num } from './readable.js';
import { stagesOf, STAGE_WORDS } from './stages.js';
import { quantitiesFor, trimmed, type DocumentUnits } from '../model/units.js';

/** One cord branch, ready to tie. */
export interface WiringRow {
  /** Running number, from 1, in tying order. */
  readonly step: number;
  readonly stage: string;
  readonly cord: string;
  /** The part the cord leaves: a lever, a gate, or the latch a latch gate belongs to. */
  readonly driver: string;
  readonly driverName: string;
  /** Which output: `capstan` of a lever or gate, `Q (set side)` or `Q̄ (reset side)` of a latch. */
  readonly driverSide: string;
  /** Turns of the driver's capstan on the drum. */
  readonly turns: number;
  /** The gate (or actuator) the branch is tied to. */
  readonly target: string;
  readonly targetName: string;
  /** Port name on the target gate; for an actuator, the load it lifts (`load 300 g`). */
  readonly port: string;
  /** Where the cord leaves and where it is tied, as drum·bay (empty without a placement). */
  readonly fromBay: string;
  readonly toBay: string;
  /** The length of the branch's piece (its part of the cord's tree), metres (empty without a placement). */
  readonly lengthM: number | '';
  /** Routing allowance in words. */
  readonly routing: string;
  readonly routingFactor: number;
  /** Tension this branch needs, grams-force, routing included. */
  readonly loadG: number;
  /** The driver's margin (available / load of all its branches); Infinity for a driver with no load. */
  readonly margin: number;
}

/** The routing allowance of a branch in words. */
export function routingWords(r: RoutingLoss): string {
  const bits: string[] = [];
  if (r.pinAngleRad > 0) bits.push(`over pins ${num(r.pinAngleRad)} rad (μ ${num(r.muPin)})`);
  if (r.pulleys > 0) bits.push(`${r.pulleys} ${r.pulleys === 1 ? 'pulley' : 'pulleys'} (η ${num(r.pulleyEfficiency)})`);
  return bits.length === 0 ? 'straight' : bits.join(', ');
}

/** The driver a builder sees for a driving part, and the side the cord leaves from. */
export function driverSide(
  p: Part | undefined,
  parts: ReadonlyMap<string, Part>,
): { driver: string; name: string; side: string } {
  if (p?.kind === 'gate' && p.latch !== undefined && (p.role === 'latch-set' || p.role === 'latch-reset')) {
    const l = parts.get(p.latch);
    return {
      driver: p.latch,
      name: l?.name ?? p.latch,
      side: p.role === 'latch-set' ? 'Q (set side)' : 'Q̄ (reset side)',
    };
  }
  return { driver: p?.id ?? '', name: p?.name ?? '', side: 'capstan' };
}

/** Every cord branch in tying order; with `placement`, its bays, length and routed loss. */
export function wiringRows(netlist: Netlist, profile: Profile, placement?: Placement): WiringRow[] {
  const parts = partIndex(netlist);
  const stages = stagesOf(netlist);
  const q = quantitiesFor(profile.documentUnits);
  const losses = placement ? lossByBranch(placement.routing) : undefined;
  const margins = new Map(driveBudget(netlist, profile, losses).map((b) => [b.driver, b.margin]));
  const loads = branchLoads(netlist, profile, losses);
  const routes = new Map(placement?.routing.branches.map((b) => [branchKey(b.cord, b.target), b]));
  const bays = new Map(placement?.bays.map((b) => [b.part, `${b.drum}·${b.bay}`]));
  type Draft = Omit<WiringRow, 'step'> & { readonly driverPart: string; readonly targetPart: string };
  const drafts: Draft[] = [];
  for (const c of netlist.cords) {
    const d = parts.get(c.driver);
    const ds = driverSide(d, parts);
    const r = routingFor(profile, c.id);
    const branches = (loads.get(c.driver) ?? []).filter((b) => b.cord === c.id);
    const targets = [
      ...c.ports.map((p) => ({ part: p.part, port: p.port, key: `${p.part}.${p.port}` })),
      ...c.actuators.map((a) => {
        const x = parts.get(a);
        return { part: a, port: x?.kind === 'actuator' ? `load ${q.mass(x.loadG, trimmed(1))}` : '', key: a };
      }),
    ];
    targets.forEach((t, i) => {
      const b = branches[i];
      const route = routes.get(branchKey(c.id, t.key));
      drafts.push({
        stage: STAGE_WORDS[stages.stage.get(c.driver) ?? 'lever'],
        cord: c.id,
        driver: ds.driver,
        driverName: ds.name,
        driverSide: ds.side,
        turns: wrapsOf(d, profile),
        target: t.part,
        targetName: parts.get(t.part)?.name ?? '',
        port: t.port,
        fromBay: bays.get(c.driver) ?? '',
        toBay: bays.get(t.part) ?? '',
        lengthM: route ? Math.round(route.lengthM * 1000) / 1000 : '',
        routing: route ? routeWords(route) : routingWords(r),
        routingFactor: Math.round((b?.routingFactor ?? 1) * 1000) / 1000,
        loadG: Math.round((b?.loadG ?? 0) * 10) / 10,
        margin: Math.round((margins.get(c.driver) ?? Infinity) * 100) / 100,
        driverPart: c.driver,
        targetPart: t.part,
      });
    });
  }
  drafts.sort(
    (a, b) =>
      stages.compare(a.driverPart, b.driverPart) ||
      cmp(a.cord, b.cord) ||
      stages.compare(a.targetPart, b.targetPart) ||
      cmp(a.port, b.port),
  );
  return drafts.map(({ driverPart: _d, targetPart: _t, ...row }, i) => ({ step: i + 1, ...row }));
}

const cmp = (a: string, b: string): number => (a < b ? -1 : a > b ? 1 : 0);

/** A routed branch's turns in words: `2 pulleys (η 0.95)`, or `rises straight` with none. */
function routeWords(b: BranchRoute): string {
  const words = routingWords(b.routing);
  return words === 'straight' && b.runs.length === 1 ? 'rises straight' : words;
}

const HEADER: Readonly<Record<keyof WiringRow, string>> = {
  step: 'step',
  stage: 'stage',
  cord: 'cord',
  driver: 'driver',
  driverName: 'driver name',
  driverSide: 'driver side',
  turns: 'turns',
  target: 'target',
  targetName: 'target name',
  port: 'port',
  fromBay: 'from bay',
  toBay: 'to bay',
  lengthM: 'length (m)',
  routing: 'routing',
  routingFactor: 'routing factor',
  loadG: 'load (g)',
  margin: 'driver margin',
};

/**
 * The wiring list as CSV with a header line. In `units` "inch" the length and load columns are
 * inches (the cut, rounded up to 1/16 in) and ounces (to 0.1 oz), their heads say so, and the
 * cells stay plain numbers (model/units.ts); the rows themselves are SI.
 */
export function wiringCsv(rows: readonly WiringRow[], units: DocumentUnits = 'metric'): string {
  const q = quantitiesFor(units);
  const head = { ...HEADER, lengthM: `length (${q.cutUnit})`, loadG: `load (${q.massUnit})` };
  const cols = Object.keys(HEADER) as (keyof WiringRow)[];
  const cell = (r: WiringRow, c: keyof WiringRow): string | number => {
    // A driver with no load has an infinite margin: written as text (∞), every other cell as it is.
    if (c === 'margin' && !Number.isFinite(r.margin)) return num(r.margin);
    if (q.units === 'metric') return r[c];
    if (c === 'lengthM') return r.lengthM === '' ? '' : Number(q.cutCell(r.lengthM));
    if (c === 'loadG') return Number(q.massCell(r.loadG));
    return r[c];
  };
  const named = rows.map((r) => Object.fromEntries(cols.map((c) => [head[c], cell(r, c)])));
  return recordsToCsv<Record<string, string | number>>(
    cols.map((c) => head[c]),
    named,
  );
}
