/**
 * cut-list.csv against an independent reading of the frame: every branch piece and every
 * cord's cut length worked out again, by a function of this test alone, from nothing but the
 * positions and the frame geometry that netlist.json publishes — the geometry of design §11
 * ("Cord runs": drop from the drum to the channel, along it, rise to the lever, a knot
 * allowance at each end and the take-up; a branch that stays in its bay rises straight; "a
 * driver with several branches splits them at a knot in the channel") — and compared with what
 * the cut list says to cut. The tree and the pieces follow the rule of docs/methods/place.md,
 * "Routing": one drop to the lowest channel used, a run each way along each channel, each
 * segment cut once as part of one branch's piece.
 */
import { readFileSync } from 'node:fs';
import { csvParse } from 'd3';
import { describe, expect, it } from 'vitest';
import { analyse, buildMachine, type Built } from '../../../src/core/pipeline.js';
import { buildDocuments } from '../../../src/core/export/index.js';
import { CAUTIONS } from '../../../src/core/export/build-sheet.js';
import { cutListCsv, cutMetres } from '../../../src/core/export/cut-list.js';
import { DEFAULT_PROFILE, type Profile } from '../../../src/core/physics/profile.js';
import { example, exampleNames } from './support.js';

interface Placed {
  id: string;
  kind: string;
  drum?: number;
  bay?: number;
  xM?: number;
  levers?: { name: string; xM: number }[];
  /** A gate's own turns on the drum, where it has them (else the frame's). */
  wraps?: number;
}
interface NetDoc {
  frame: {
    drumRadiusM: number;
    wraps: number;
    railAboveDrumM: number;
    channelBelowDrumM: number;
    knotAllowanceM: number;
    takeUpAllowanceM: number;
    actuatorRunM: number;
    drums: { drum: number; levelM: number }[];
  };
  parts: Placed[];
  cords: {
    id: string;
    driver: string;
    ports: { part: string; port: string }[];
    actuators: string[];
    /** As routed, in the order of `ports` then `actuators`: the runs each branch owns, each with its channel's drum. */
    branches: { own: { kind: string; drum: number }[] }[];
  }[];
}

/** One branch's end, as this test reads it: its channel's height, its lever's x, its rise (or exit). */
interface End {
  readonly target: string;
  readonly index: number;
  readonly x: number;
  readonly channel: number;
  readonly rise: number;
}

/**
 * Each branch's own tree length (without allowances) for a cord that leaves its bay: levels from
 * the highest channel down; at each, left side, right side, then under the capstan; the farthest
 * on a side owns the run out to it, the first served at a level the drop down to it.
 */
function treePieces(ends: readonly End[], xD: number, dropTop: number): number[] {
  const own = ends.map((e) => e.rise);
  const side = (x: number): number => (x < xD - 1e-9 ? 0 : x > xD + 1e-9 ? 1 : 2);
  const levels = [...new Set(ends.map((e) => e.channel))].sort((a, b) => b - a);
  let above = dropTop;
  for (const y of levels) {
    const here = ends.filter((e) => e.channel === y);
    // Equally far levers (one above another on different drums) by target name, as the routing's contract says.
    const far = (e: End): number => Math.round(Math.abs(e.x - xD) * 1e4);
    const order = [...here].sort(
      (a, b) => side(a.x) - side(b.x) || far(b) - far(a) || (a.target < b.target ? -1 : a.target > b.target ? 1 : 0),
    );
    own[order[0].index] += Math.max(0, Math.min(dropTop, above) - y);
    above = y;
    for (const s of [0, 1]) {
      const far = order.find((e) => side(e.x) === s);
      if (far) own[far.index] += Math.abs(far.x - xD);
    }
  }
  return own;
}

/** Every piece of every cord, worked out from netlist.json alone: `cord|trunk`, `cord|branch to <target>`, `cord|whole cord`. */
function piecesFromNetlist(doc: NetDoc): Map<string, number> {
  const f = doc.frame;
  const r = f.drumRadiusM;
  const part = new Map(doc.parts.map((p) => [p.id, p]));
  const level = (d: number | undefined): number => doc.frame.drums.find((x) => x.drum === d)?.levelM ?? NaN;
  const out = new Map<string, number>();
  for (const c of doc.cords) {
    const d = part.get(c.driver);
    if (d?.xM === undefined) throw new Error(`${c.driver} has no position`);
    const tied = [
      ...c.ports.map((p) => ({ target: `${p.part}.${p.port}`, to: part.get(p.part), lever: p.port, exit: false })),
      ...c.actuators.map((a) => ({ target: a, to: part.get(a), lever: 'exit', exit: true })),
    ];
    const leaves = tied.some((e) => e.to?.drum !== d.drum || e.to?.bay !== d.bay);
    const trunk = Math.max(0, f.railAboveDrumM - r) + 2 * Math.PI * r * (d.wraps ?? f.wraps) + f.knotAllowanceM;
    out.set(`${c.id}|trunk`, trunk);
    const ld = level(d.drum);
    const ends: End[] = tied.map((e, index) => {
      const x = e.to?.levers?.find((l) => l.name === e.lever)?.xM ?? e.to?.levers?.[0]?.xM ?? NaN;
      const lt = level(e.to?.drum);
      // Design §11: a branch between two drums runs in the lower drum's channel. netlist.json records that
      // drum on the branch's last run (its rise or exit); it must be the one the rule gives.
      const lower = Math.min(d.drum ?? NaN, e.to?.drum ?? NaN);
      const recorded = c.branches[index]?.own.at(-1);
      if (leaves && recorded?.drum !== lower) throw new Error(`${c.id} → ${e.target}: recorded drum ${recorded?.drum}`);
      const channel = level(lower) - f.channelBelowDrumM;
      return { target: e.target, index, x, channel, rise: e.exit ? f.actuatorRunM : lt + f.railAboveDrumM - channel };
    });
    const runs = leaves
      ? treePieces(ends, d.xM, ld - r)
      : ends.map((e) => Math.hypot(e.x - (d.xM ?? NaN), f.railAboveDrumM - r));
    let total = trunk;
    ends.forEach((e, i) => {
      const length = runs[i] + 2 * f.knotAllowanceM + f.takeUpAllowanceM;
      out.set(`${c.id}|branch to ${e.target}`, length);
      total += length;
    });
    out.set(`${c.id}|whole cord`, total);
  }
  return out;
}

function checkAgainstCutList(b: Built, tag: string): number {
  const docs = buildDocuments(b);
  const want = piecesFromNetlist(JSON.parse(docs.get('netlist.json') ?? '') as NetDoc);
  const rows = csvParse(docs.get('cut-list.csv') ?? '').filter((r) => r.group === 'cord');
  const got = new Map(rows.map((r) => [`${r.item}|${r.piece}`, Number(r['length (m)'])]));
  expect([...got.keys()].sort(), tag).toEqual([...want.keys()].sort());
  for (const [key, m] of want) {
    const cut = got.get(key) ?? NaN;
    // The cut list rounds up to the millimetre, never short; netlist.json gives positions to 0.1 mm.
    expect(cut, `${tag} ${key}`).toBeGreaterThanOrEqual(m - 0.0005);
    expect(cut, `${tag} ${key}`).toBeLessThanOrEqual(m + 0.0015);
  }
  return want.size;
}

function build(name: string, profile: Profile = DEFAULT_PROFILE, actuators?: Record<string, number>): Built {
  const a = analyse(readFileSync(`examples/${name}`, 'utf8'), name);
  if (!a.ok) throw new Error(name);
  const b = buildMachine(a, { encoding: 'binary', profile, ...(actuators ? { actuators } : {}) });
  if (!b.ok) throw new Error(b.diagnostics.map((d) => d.message).join('; '));
  return b;
}

describe('core/export/cut-list', () => {
  it('every cord piece of every example matches the lengths worked out again from netlist.json (design §11 geometry)', () => {
    for (const name of exampleNames()) expect(checkAgainstCutList(example(name, 'auto'), name)).toBeGreaterThan(0);
  });

  it('matches them too across two drums and for an actuator’s run out of the frame', () => {
    const split: Profile = { ...DEFAULT_PROFILE, frame: { ...DEFAULT_PROFILE.frame, longestDrumM: 0.8 } };
    const twoDrums = build('marble-bell.lw', split);
    expect(twoDrums.placement.drums.length).toBe(2);
    expect(twoDrums.placement.crossDrumBranches).toBeGreaterThan(0);
    checkAgainstCutList(twoDrums, 'marble bell on two drums');
    const bell = build('marble-bell.lw', DEFAULT_PROFILE, { bell: 120 });
    expect(bell.placement.routing.branches.some((x) => x.kind === 'actuator')).toBe(true);
    checkAgainstCutList(bell, 'marble bell with a bell actuator');
  });

  it('names the channel of every piece by the drum the routing recorded, with a channel deeper than half the drum spacing', () => {
    // 0.45 m of channel under 0.6 m between drums (each inside the plausible ranges of docs/profile.md): drum 2's
    // channel runs below drum 1's rail. A drum worked out from a channel's height, round((y + depth) / spacing) + 1,
    // still gives the right drum here (every channel lies at (d − 1) · spacing − depth, so the rule is exact for
    // stacked drums whatever the depth); what is checked is that the words name the drum design §11 gives:
    // a branch runs in the lower drum's channel, and a drop from a knot leaves the next channel up that its cord uses.
    const deep: Profile = {
      ...DEFAULT_PROFILE,
      frame: { ...DEFAULT_PROFILE.frame, channelBelowDrumM: 0.45, longestDrumM: 0.5, drumsPerFrame: 6 },
    };
    const b = build('marble-bell.lw', deep);
    expect(b.placement.drums.length).toBeGreaterThanOrEqual(3);
    checkAgainstCutList(b, 'marble bell, deep channel');
    const drum = new Map(b.placement.bays.map((x) => [x.part, x.drum]));
    const rows = csvParse(buildDocuments(b).get('cut-list.csv') ?? '').filter((r) => r.piece.startsWith('branch to '));
    const seen = new Set<string>();
    for (const c of b.build.netlist.cords) {
      const from = drum.get(c.driver) ?? NaN;
      const targets = [
        ...c.ports.map((p) => ({ target: `${p.part}.${p.port}`, part: p.part })),
        ...c.actuators.map((a) => ({ target: a, part: a })),
      ];
      const lowers = targets.map((t) => Math.min(from, drum.get(t.part) ?? NaN));
      if (targets.every((t) => t.part === c.driver)) continue;
      targets.forEach((t, i) => {
        const row = rows.find((r) => r.item === c.id && r.piece === `branch to ${t.target}`);
        const where = row?.where ?? '';
        const tag = `${c.id} → ${t.target}: ${where}`;
        const inChannel = /in drum (\d+)'s channel/.exec(where);
        if (inChannel) expect(Number(inChannel[1]), tag).toBe(lowers[i]);
        const inDrop = /tied on in the drop under .*, at drum (\d+)'s channel/.exec(where);
        if (inDrop) expect(Number(inDrop[1]), tag).toBe(Math.min(...lowers.filter((l) => l > lowers[i])));
        const down = /down to drum (\d+)'s channel/.exec(row?.note ?? '');
        if (down) expect(Number(down[1]), tag).toBe(lowers[i]);
        seen.add(inChannel ? 'channel' : inDrop ? 'drop' : down ? 'from the drum, down' : 'other');
      });
    }
    expect([...seen].sort()).toEqual(['channel', 'drop', 'from the drum, down']);
  });

  it('says where each piece is tied on, and cuts a shared run once: a cord of several branches takes less than their paths', () => {
    const b = example('marble-bell.lw', 'auto');
    const docs = buildDocuments(b);
    const rows = csvParse(docs.get('cut-list.csv') ?? '').filter((r) => r.group === 'cord');
    const pieces = rows.filter((r) => r.piece.startsWith('branch to '));
    expect(
      pieces.every((r) => /^(from the drum,|tied on (at the knot|at the foot of the drop|in the drop) )/.test(r.where)),
    ).toBe(true);
    expect(pieces.some((r) => r.where.startsWith('tied on at the knot under '))).toBe(true);
    const doc = JSON.parse(docs.get('netlist.json') ?? '') as {
      frame: { knotAllowanceM: number; takeUpAllowanceM: number };
      cords: { id: string; branches: { lengthM: number; pathM: number }[] }[];
    };
    const allow = 2 * doc.frame.knotAllowanceM + doc.frame.takeUpAllowanceM;
    const shared = doc.cords.filter((c) => c.branches.length > 1 && c.branches.some((x) => x.pathM > 0.3));
    expect(shared.length).toBeGreaterThan(0);
    for (const c of shared) {
      const cut = c.branches.reduce((s, x) => s + x.lengthM, 0);
      const paths = c.branches.reduce((s, x) => s + x.pathM + allow, 0);
      expect(cut, c.id).toBeLessThan(paths - 0.01);
    }
  });

  it('opens with the safety cautions, then cords, lever blanks, drums, pulleys, weights and cams', () => {
    const b = example('marble-bell.lw', 'auto');
    const text = buildDocuments(b).get('cut-list.csv') ?? '';
    const rows = csvParse(text);
    expect(rows.columns).toEqual(['group', 'item', 'piece', 'count', 'length (m)', 'size', 'where', 'note']);
    expect(rows.slice(0, CAUTIONS.length).map((r) => [r.group, r.note])).toEqual(CAUTIONS.map((c) => ['caution', c]));
    const groups = [...new Set(rows.map((r) => r.group))];
    expect(groups).toEqual(['caution', 'cord', 'lever blank', 'drum', 'pulley', 'weight', 'cam']);
    // Lever blanks: one per lever of the build (operator, clock, reset, every Z and port lever).
    const p = b.build.parts;
    const blanks = rows.filter((r) => r.group === 'lever blank').reduce((s, r) => s + Number(r.count), 0);
    expect(blanks).toBe(
      p.levers +
        b.build.netlist.parts
          .filter((q) => q.kind === 'gate')
          .reduce((s, g) => s + (g.kind === 'gate' && g.ports.length > 1 ? g.ports.length + 1 : 1), 0),
    );
    // Weights: one per port lever, per Z and per hand lever (as the bill of materials counts them).
    expect(rows.filter((r) => r.group === 'weight').reduce((s, r) => s + Number(r.count), 0)).toBe(p.weights);
    const drum = rows.find((r) => r.group === 'drum');
    expect(Number(drum?.['length (m)'])).toBe(cutMetres(b.placement.drums[0].lengthM));
    expect(drum?.size).toBe('Ø 80 mm');
    expect(Number(rows.find((r) => r.group === 'pulley')?.count)).toBe(b.placement.pulleys);
  });

  it('escapes a cell that a spreadsheet would run as a formula (OWASP, CSV Injection)', () => {
    const text = cutListCsv([
      { group: 'cord', item: '=HYPERLINK("x")', piece: '+1', count: 1, lengthM: 0.5, size: '-', where: '@a', note: '' },
    ]);
    const [row] = csvParse(text);
    expect([row.item, row.piece, row.size, row.where]).toEqual(['\'=HYPERLINK("x")', "'+1", "'-", "'@a"]);
    expect(row['length (m)']).toBe('0.5');
  });

  it('rounds every length up to the millimetre, so that no piece is cut short', () => {
    expect(cutMetres(0.6361)).toBe(0.637);
    expect(cutMetres(0.636)).toBe(0.636);
    expect(cutMetres(1.0000000001)).toBe(1);
  });
});

describe('core/export/cut-list', () => {
  /** Feet and inches as the cut list writes them, read back by this test alone, in inches. */
  const readFeetInches = (t: string): number => {
    const m = /^(?:(\d+) ft)?(?: ?(\d+))?(?: ?(\d+)\/(\d+))?(?: in)?$/.exec(t);
    if (!m || t === '') throw new Error(`not feet and inches: ${t}`);
    return Number(m[1] ?? 0) * 12 + Number(m[2] ?? 0) + (m[3] ? Number(m[3]) / Number(m[4]) : 0);
  };

  it('cuts every piece in inches at least as long as its metric piece and within 1/16 in of it (1 in = 0.0254 m exactly, NIST SP 811 B.8)', () => {
    for (const name of exampleNames()) {
      const b = example(name);
      const metric = csvParse(buildDocuments(b).get('cut-list.csv') ?? '');
      const inch = csvParse(
        buildDocuments({ ...b, profile: { ...b.profile, documentUnits: 'inch' } }).get('cut-list.csv') ?? '',
      );
      expect(inch.columns, name).toEqual([
        'group',
        'item',
        'piece',
        'count',
        'length (in)',
        'length (ft in)',
        'size',
        'where',
        'note',
      ]);
      expect(inch, name).toHaveLength(metric.length);
      let pieces = 0;
      metric.forEach((row, i) => {
        const other = inch[i];
        expect([other.group, other.item, other.piece, other.count], name).toEqual([
          row.group,
          row.item,
          row.piece,
          row.count,
        ]);
        if (row['length (m)'] === '') {
          expect(other['length (in)'], name).toBe('');
          return;
        }
        const m = Number(row['length (m)']);
        const inches = Number(other['length (in)']);
        // The workshop's form says the same length as the spreadsheet's column.
        expect(readFeetInches(other['length (ft in)']), `${name} ${row.item} ${row.piece}`).toBe(inches);
        // A whole number of sixteenths …
        expect(Number.isInteger(inches * 16), `${name} ${row.item}`).toBe(true);
        // … never shorter than the metric piece, and less than a sixteenth longer.
        expect(inches * 0.0254, `${name} ${row.item} ${row.piece}`).toBeGreaterThanOrEqual(m - 1e-9);
        expect(inches * 0.0254, `${name} ${row.item} ${row.piece}`).toBeLessThan(m + 0.0254 / 16);
        if (row.group === 'cord') pieces++;
      });
      expect(pieces, name).toBeGreaterThan(0);
    }
  });

  it('sums in the spreadsheet column: the cord pieces of a cord add up to its whole-cord row within a sixteenth per piece', () => {
    const b = example('crossing.lw');
    const rows = csvParse(
      buildDocuments({ ...b, profile: { ...b.profile, documentUnits: 'inch' } }).get('cut-list.csv') ?? '',
    );
    const cords = new Map<string, { pieces: number; n: number; whole: number }>();
    for (const r of rows.filter((x) => x.group === 'cord')) {
      const c = cords.get(r.item) ?? { pieces: 0, n: 0, whole: 0 };
      if (r.piece === 'whole cord') c.whole = Number(r['length (in)']);
      else {
        c.pieces += Number(r['length (in)']);
        c.n++;
      }
      cords.set(r.item, c);
    }
    for (const [cord, c] of cords) {
      // Each length, the whole cord's too, is rounded up by at most 1 mm (metric) and then 1/16 in.
      expect(Math.abs(c.pieces - c.whole), cord).toBeLessThanOrEqual((c.n + 1) * (1 / 25.4 + 1 / 16));
    }
  });

  it('writes sizes in inches and weights in ounces where the profile asks for inches (1 oz = 28.349523125 g, NIST Handbook 44 C)', () => {
    const b = example('marble-bell.lw');
    const text = buildDocuments({ ...b, profile: { ...b.profile, documentUnits: 'inch' } }).get('cut-list.csv') ?? '';
    const rows = csvParse(text);
    // 15 g = 0.529 oz, to 0.1 oz.
    for (const w of rows.filter((r) => r.group === 'weight')) expect(w.size).toBe('0.5 oz');
    // 3 mm cord is 0.118 in (decimal: 1/8 in would be another cord).
    for (const c of rows.filter((r) => r.group === 'cord')) expect(c.size).toBe('0.118 in cord');
    expect(text).not.toMatch(/\d mm\b| g,/);
  });
});
