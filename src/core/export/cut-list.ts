/**
 * cut-list.csv: what the workshop cuts and weighs, from the placed and routed build — every
 * cord piece with its cut length, every lever blank, each drum's length and diameter, the
 * pulleys or pins, the weights, and the cam discs.
 *
 * Cord pieces (physics/routing.ts): a cord is cut as its trunk — from its hold lever down to
 * the drum, its wraps, and a knot — and one piece per branch. A cord that leaves its bay runs as
 * a tree (one drop, a run each way along each channel it uses, a rise to every lever), and each
 * branch's piece is the part of the tree it owns: the row says where it is tied on (at the drum,
 * in the drop, or at a knot in the channel, each channel named by the drum the routing recorded
 * for the run) and where it goes. A piece's length is its own runs plus a knot allowance at each
 * end plus the take-up allowance. The cord's total is trunk plus pieces. Cords are listed by
 * where their capstan sits, drum by drum from the visitor end.
 * Lengths in metres to the millimetre, rounded up so that no piece is cut short. In the profile's
 * `documentUnits: "inch"` the same promise holds in inches: each length is the metric cut length
 * rounded up again to the sixteenth of an inch (model/units.ts), so an inch piece is never
 * shorter than the metric piece of the same build, and at most 1/16 in longer. The numeric
 * column is then decimal inches (exact sixteenths, which a spreadsheet sums), with the feet and
 * inches a workshop writes beside it; sizes are in inches and weights in ounces.
 * The safety cautions come first (as in every document), then the rows; every cell goes through
 * csv.ts (RFC 4180, spreadsheet formula injection escaped).
 */
import type { Build } from '../model/build.js';
import type { Netlist } from '../model/netlist.js';
import type { Placement } from '../phases/place/index.js';
import { wrapsOf } from '../physics/capstan.js';
import type { Profile } from '../physics/profile.js';
import type { BranchRoute, CordRun } from '../physics/routing.js';
import {
  cutMetres,
  cutSixteenths,
  feetInches,
  inchesOfSixteenths,
  inMillimetres,
  quantitiesFor,
  trimmed,
  type DocumentUnits,
} from '../model/units.js';
import { CAUTIONS } from './build-sheet.js';
import { toCsv, type CsvCell } from './csv.js';
import { partWords } from './part-words.js';

/** One line of the cut list. */
export interface CutRow {
  /** What kind of thing: caution, cord, lever blank, drum, pulley, pin, weight, cam. */
  readonly group: string;
  /** The cord, drum or part kind. */
  readonly item: string;
  /** Which piece: `trunk`, `branch to <target>`, `whole cord`, or a size class. */
  readonly piece: string;
  readonly count: number | '';
  /** Cut length of one piece, metres ('' where it has none); the inch list rounds it up again to the sixteenth. */
  readonly lengthM: number | '';
  /** Size in words: diameter, section, mass. */
  readonly size: string;
  /** Where it goes: `bay 7, drum 1 → bay 12, drum 1`; for a branch piece, where it is tied on and where it ends. */
  readonly where: string;
  readonly note: string;
}

const HEADER = ['group', 'item', 'piece', 'count', 'length (m)', 'size', 'where', 'note'];
const INCH_HEADER = ['group', 'item', 'piece', 'count', 'length (in)', 'length (ft in)', 'size', 'where', 'note'];

/** Metres rounded up to the millimetre (never cut short); defined with the other conversions. */
export { cutMetres };

/** How the list writes sizes, masses and heights: the workshop's Quantities (model/units.ts), sizes to 1 mm in metric. */
const wordsFor = (units: DocumentUnits) => {
  const q = quantitiesFor(units);
  return {
    /** A size: `12 mm`, or in inches `0.472 in`. */
    size: (m: number): string => q.size(m, inMillimetres(trimmed(0))),
    /** The cord's size: `3 mm cord`. */
    cord: (m: number): string => `${q.size(m, inMillimetres(trimmed(1)))} cord`,
    mass: (g: number): string => q.mass(g),
    /** A height on the frame: `0.60 m`. */
    height: (m: number): string => q.length(m),
  };
};

/** Every row of the cut list, cautions first. */
export function cutListRows(build: Build, placement: Placement, profile: Profile): CutRow[] {
  const rows: CutRow[] = CAUTIONS.map((c) => ({
    group: 'caution',
    item: '',
    piece: '',
    count: '',
    lengthM: '',
    size: '',
    where: '',
    note: c,
  }));
  rows.push(...cordRows(build, placement, profile));
  rows.push(...leverRows(build.netlist, profile));
  rows.push(...frameRows(build, placement, profile));
  return rows;
}

function cordRows(build: Build, placement: Placement, profile: Profile): CutRow[] {
  const at = new Map(placement.bays.map((b) => [b.part, b]));
  const where = (part: string): string => {
    const b = at.get(part);
    return b ? `bay ${b.bay}, drum ${b.drum}` : '';
  };
  const words = partWords(build);
  const order = [...placement.routing.cords].sort((a, b) => {
    const x = at.get(a.driver);
    const y = at.get(b.driver);
    return (x?.drum ?? 0) - (y?.drum ?? 0) || (x?.bay ?? 0) - (y?.bay ?? 0) || (a.cord < b.cord ? -1 : 1);
  });
  const parts = new Map(build.netlist.parts.map((p) => [p.id, p]));
  const rows: CutRow[] = [];
  const size = wordsFor(profile.documentUnits).cord(profile.frame.cordDiameterM);
  for (const c of order) {
    const base = { group: 'cord', item: c.cord, size };
    rows.push({
      ...base,
      piece: 'trunk',
      count: 1,
      lengthM: cutMetres(c.trunkM),
      where: where(c.driver),
      note: `hold lever down to the drum, ${wrapsOf(parts.get(c.driver), profile)} turns and a knot; capstan of ${words.get(c.driver) ?? c.driver}`,
    });
    for (const b of c.branches) {
      const turns = [
        ...(b.pulleys > 0 ? [`${b.pulleys} ${b.pulleys === 1 ? 'pulley' : 'pulleys'}`] : []),
        ...(b.pins.length > 0 ? [`${b.pins.length} ${b.pins.length === 1 ? 'pin' : 'pins'}`] : []),
      ];
      const piece = pieceWords(b, at);
      rows.push({
        ...base,
        piece: `branch to ${b.target}`,
        count: 1,
        lengthM: cutMetres(b.lengthM),
        where: `${piece.tied} → ${where(b.part)}`,
        note: [piece.runs, ...(turns.length > 0 ? [`its path passes ${turns.join(' and ')}`] : [])].join('; '),
      });
    }
    rows.push({
      ...base,
      piece: 'whole cord',
      count: '',
      lengthM: cutMetres(c.cutM),
      where: '',
      note: `trunk and ${c.branches.length} ${c.branches.length === 1 ? 'branch' : 'branches'}`,
    });
  }
  return rows;
}

/** Where a branch's piece is tied on, and its runs in words: `down to drum 1's channel, along it to bay 9, up to the lever`. */
function pieceWords(
  b: BranchRoute,
  at: ReadonlyMap<string, { readonly bay: number; readonly drum: number }>,
): { tied: string; runs: string } {
  const from = at.get(b.driver);
  const to = at.get(b.part);
  const under = (p: { bay: number; drum: number } | undefined): string => (p ? `bay ${p.bay} of drum ${p.drum}` : '');
  const first = b.own[0] as CordRun | undefined;
  if (!first || first.kind === 'direct')
    return { tied: `from the drum, ${under(from)}`, runs: 'rises straight to its lever' };
  // Each run's channel is the drum the routing recorded when it laid the run (never worked out from a height).
  const words = b.own.map((r) => {
    if (r.kind === 'drop') return `down to drum ${r.drum}'s channel`;
    if (r.kind === 'channel') return `along it to ${to ? `bay ${to.bay}` : 'its lever'}`;
    return r.kind === 'rise' ? 'up to its lever' : 'out of the frame';
  });
  const tied =
    first.kind === 'drop'
      ? first.knotDrum === undefined
        ? `from the drum, ${under(from)}`
        : `tied on in the drop under ${under(from)}, at drum ${first.knotDrum}'s channel`
      : first.kind === 'channel'
        ? `tied on at the foot of the drop under ${under(from)}, in drum ${first.drum}'s channel`
        : `tied on at the knot under ${under(to)}, in drum ${first.drum}'s channel`;
  return { tied, runs: words.join(', ') };
}

function leverRows(n: Netlist, profile: Profile): CutRow[] {
  const f = profile.frame;
  const w = wordsFor(profile.documentUnits);
  const size = `${w.size(f.leverLengthM)} × ${w.size(f.leverThicknessM)} blank`;
  const levers = n.parts.flatMap((p) => (p.kind === 'lever' ? [p] : []));
  const gates = n.parts.flatMap((p) => (p.kind === 'gate' ? [p] : []));
  const kinds: [string, number, string][] = [
    ['operator lever', levers.filter((l) => l.role === 'input').length, 'one per machine input'],
    ['clock lever', levers.filter((l) => l.role === 'phi1' || l.role === 'phi2').length, 'φ1 and φ2'],
    ['reset lever', levers.filter((l) => l.role === 'reset').length, ''],
    ['summing lever Z', gates.length, 'one per gate'],
    [
      'port lever',
      gates.reduce((s, g) => s + (g.ports.length > 1 ? g.ports.length : 0), 0),
      'gates with two or more ports',
    ],
  ];
  return kinds
    .filter(([, count]) => count > 0)
    .map(([piece, count, note]) => ({
      group: 'lever blank',
      item: 'lever',
      piece,
      count,
      lengthM: f.leverLengthM,
      size,
      where: 'the frame drawing and the commissioning sheet give each one’s bay',
      note,
    }));
}

function frameRows(build: Build, placement: Placement, profile: Profile): CutRow[] {
  const f = profile.frame;
  const w = wordsFor(profile.documentUnits);
  const mm = w.size;
  const rows: CutRow[] = placement.drums.map((d) => ({
    group: 'drum',
    item: `drum ${d.drum}`,
    piece: '',
    count: 1,
    lengthM: cutMetres(d.lengthM),
    size: `Ø ${mm(2 * profile.drumRadiusM)}`,
    where: d.drum === 1 ? 'lowest' : `axis ${w.height(d.levelM)} above drum 1's`,
    note: `${d.bays.length} bays; add bearings and the drive beyond this length`,
  }));
  const r = placement.routing;
  if (r.pulleys > 0)
    rows.push({
      group: 'pulley',
      item: 'pulley',
      piece: '',
      count: r.pulleys,
      lengthM: '',
      size: `Ø ${mm(f.pulleyDiameterM)}`,
      where:
        'one where each cord’s drop turns into a side of a channel (its branches share it), one where each branch rises or leaves the frame',
      note: `bend radius ${r.bend.ok ? 'at least' : 'LESS than'} 4 × the cord diameter`,
    });
  if (r.pins > 0)
    rows.push({
      group: 'pin',
      item: 'redirect pin',
      piece: '',
      count: r.pins,
      lengthM: '',
      size: `Ø ${mm(f.pulleyDiameterM)}`,
      where: 'as the pulleys: one at each shared corner, one where each branch rises or leaves',
      note: 'smooth and fixed',
    });
  const gates = build.netlist.parts.filter((p) => p.kind === 'gate');
  const ports = gates.reduce((s, g) => s + (g.kind === 'gate' && g.ports.length > 1 ? g.ports.length : 0), 0);
  const levers = build.netlist.parts.filter((p) => p.kind === 'lever').length;
  const weights: [string, number, number][] = [
    ['port pull-up weight', ports, profile.portWeightG],
    ['Z weight', gates.length, profile.zWeightG],
    ['lever pull-up weight', levers, profile.leverWeightG],
  ];
  for (const [piece, count, g] of weights)
    if (count > 0)
      rows.push({ group: 'weight', item: 'weight', piece, count, lengthM: '', size: w.mass(g), where: '', note: '' });
  if (build.encoding.bits > 0)
    rows.push({
      group: 'cam',
      item: 'cam disc',
      piece: 'φ1 and φ2',
      count: 2,
      lengthM: '',
      size: `Ø ${mm(2 * (f.camBaseRadiusM + f.camLiftM))}`,
      where: 'on the cam shaft at the crank end',
      note: 'cut from cams.svg printed at 100 %',
    });
  return rows;
}

/**
 * The cut list as CSV with a header line. In inches, each length is the row's metric cut length
 * rounded up to the sixteenth: decimal inches, then feet and inches.
 */
export function cutListCsv(rows: readonly CutRow[], units: DocumentUnits = 'metric'): string {
  const cells: CsvCell[][] = [units === 'inch' ? INCH_HEADER : HEADER];
  for (const r of rows) {
    const sixteenths = r.lengthM === '' ? undefined : cutSixteenths(r.lengthM);
    const length: CsvCell[] =
      units === 'metric'
        ? [r.lengthM]
        : sixteenths === undefined
          ? ['', '']
          : [inchesOfSixteenths(sixteenths), feetInches(sixteenths)];
    cells.push([r.group, r.item, r.piece, r.count, ...length, r.size, r.where, r.note]);
  }
  return toCsv(cells);
}
