/**
 * The netlist as JSON, described by schemas/netlist.schema.json (JSON Schema 2020-12).
 *
 * Made to diff well: parts are grouped by kind (levers, gates, latches, flags, actuators) and
 * sorted by id within a group in natural order (`t.S0.2` before `t.S0.10`); cords are sorted
 * by id and their branches by part then port; object keys come in a fixed order; each part
 * and each cord sits on one line. Ids are the mapper's stable, readable ids, so a small change
 * to the machine changes few lines. Strings are written by JSON.stringify.
 *
 * With a placement (phases/place), the document says where everything is: `frame` gives the
 * geometry the routing used and each drum; each gate, lever and actuator its drum, bay
 * (counted from 1 at the visitor end), centre `xM` and its levers' positions (metres from the
 * visitor end); a latch its drum and two bays; a flag the place of the Z lever it rides on;
 * each cord its trunk, cut length, the pulleys and pins it takes in the frame, and every
 * branch's piece to cut (`lengthM`, the runs it owns in the cord's tree, `own`, each with the
 * drum whose channel it belongs to), its whole path from the drum (`pathM`), pulleys, pins and
 * loss, in the order of its ports and then its actuators. Lengths to 0.1 mm. From positions and `frame` alone, anyone can work every piece
 * out again (docs/methods/place.md, "Routing").
 */
import type { Build } from '../model/build.js';
import type { Cord, Netlist, Part } from '../model/netlist.js';
import type { PlacedBayInfo, Placement } from '../phases/place/index.js';
import type { Profile } from '../physics/profile.js';
import type { BranchRoute, CordRoute } from '../physics/routing.js';

/** Format tag and version written into every file (bump the version on an incompatible change). */
export const NETLIST_FORMAT = 'latchwright-netlist';
/**
 * 4: each run a branch owns names the drum whose channel it belongs to (`own[].drum`), as the
 * routing laid it. (3: cords run as trees; a branch's `lengthM` is its own piece (`own`), `pathM`
 * its whole path.)
 */
export const NETLIST_VERSION = 4;

/** A length in metres to 0.1 mm. */
const m4 = (x: number): number => Math.round(x * 10000) / 10000;

const KIND_ORDER: Readonly<Record<Part['kind'], number>> = { lever: 0, gate: 1, latch: 2, flag: 3, actuator: 4 };

const collator = new Intl.Collator('en', { numeric: true, sensitivity: 'variant' });
const byText = (a: string, b: string): number => collator.compare(a, b) || (a < b ? -1 : a > b ? 1 : 0);

/** Parts grouped by kind, natural id order within a kind. */
export function sortedParts(n: Netlist): Part[] {
  return [...n.parts].sort((a, b) => KIND_ORDER[a.kind] - KIND_ORDER[b.kind] || byText(a.id, b.id));
}

/** Cords by id, each with its branches sorted. */
export function sortedCords(n: Netlist): Cord[] {
  return [...n.cords]
    .sort((a, b) => byText(a.id, b.id))
    .map((c) => ({
      id: c.id,
      driver: c.driver,
      ports: [...c.ports]
        .sort((a, b) => byText(a.part, b.part) || byText(a.port, b.port))
        .map((p) => ({ part: p.part, port: p.port })),
      actuators: [...c.actuators].sort(byText),
    }));
}

/** A part with its keys in a fixed order. */
function partObject(p: Part): object {
  switch (p.kind) {
    case 'lever':
      return {
        kind: p.kind,
        id: p.id,
        name: p.name,
        role: p.role,
        ...(p.input !== undefined ? { input: p.input } : {}),
      };
    case 'gate':
      return {
        kind: p.kind,
        id: p.id,
        name: p.name,
        role: p.role,
        ports: p.ports.map((q) => ({ name: q.name })),
        ...(p.latch !== undefined ? { latch: p.latch } : {}),
        ...(p.wraps !== undefined ? { wraps: p.wraps } : {}),
      };
    case 'latch':
      return {
        kind: p.kind,
        id: p.id,
        name: p.name,
        role: p.role,
        bit: p.bit,
        setGate: p.setGate,
        resetGate: p.resetGate,
      };
    case 'flag':
      return {
        kind: p.kind,
        id: p.id,
        name: p.name,
        output: p.output,
        gate: p.gate,
        inverted: p.inverted,
        ...(p.fixed !== undefined ? { fixed: p.fixed } : {}),
      };
    case 'actuator':
      return {
        kind: p.kind,
        id: p.id,
        name: p.name,
        output: p.output,
        loadG: p.loadG,
        ...(p.fixed !== undefined ? { fixed: p.fixed } : {}),
      };
  }
}

/** Where a part sits, as the document gives it (nothing for a part without a place). */
function placeOf(p: Part, bays: ReadonlyMap<string, PlacedBayInfo>): object {
  const own = bays.get(p.id);
  if (own)
    return {
      drum: own.drum,
      bay: own.bay,
      xM: m4(own.xM),
      levers: own.levers.map((l) => ({ name: l.name, xM: m4(l.xM) })),
    };
  if (p.kind === 'latch') {
    const s = bays.get(p.setGate);
    const r = bays.get(p.resetGate);
    return s && r ? { drum: s.drum, bays: [s.bay, r.bay], xM: m4((s.xM + r.xM) / 2) } : {};
  }
  if (p.kind === 'flag' && p.fixed === undefined) {
    const g = bays.get(p.gate);
    const z = g?.levers.find((l) => l.name === 'Z') ?? g?.levers[0];
    return g && z ? { drum: g.drum, bay: g.bay, xM: m4(z.xM) } : {};
  }
  return {};
}

function branchObject(b: BranchRoute, port?: string): object {
  return {
    part: b.part,
    ...(port !== undefined ? { port } : {}),
    lengthM: m4(b.lengthM),
    channelM: m4(b.channelM),
    own: b.own.map((r) => ({ kind: r.kind, drum: r.drum, lengthM: m4(r.lengthM) })),
    pathM: m4(b.runs.reduce((s, r) => s + r.lengthM, 0)),
    pulleys: b.pulleys,
    pins: b.pins.map(m4),
    loss: m4(b.loss),
  };
}

/** A cord with its routing: trunk, cut length, and its branches in the order of its ports and actuators. */
function routedCord(c: Cord, routes: ReadonlyMap<string, CordRoute>): object {
  const route = routes.get(c.id);
  if (!route) return c;
  const branch = (target: string): BranchRoute | undefined => route.branches.find((b) => b.target === target);
  const branches = [
    ...c.ports.map((p) => ({ b: branch(`${p.part}.${p.port}`), port: p.port })),
    ...c.actuators.map((a) => ({ b: branch(a), port: undefined })),
  ].flatMap(({ b, port }) => (b ? [branchObject(b, port)] : []));
  return {
    ...c,
    trunkM: m4(route.trunkM),
    cutM: m4(route.cutM),
    pulleys: route.pulleys,
    pins: route.pins,
    branches,
  };
}

/** The frame block: the geometry the routing used, each drum, the totals. */
function frameObject(placement: Placement, profile: Profile): object {
  const f = profile.frame;
  return {
    method: placement.method,
    exact: placement.exact,
    seed: placement.seed,
    drumRadiusM: profile.drumRadiusM,
    wraps: profile.wraps,
    railAboveDrumM: f.railAboveDrumM,
    channelBelowDrumM: f.channelBelowDrumM,
    drumSpacingM: f.drumSpacingM,
    knotAllowanceM: f.knotAllowanceM,
    takeUpAllowanceM: f.takeUpAllowanceM,
    actuatorRunM: f.actuatorRunM,
    drums: placement.drums.map((d) => ({
      drum: d.drum,
      lengthM: m4(d.lengthM),
      levelM: m4(d.levelM),
      bays: d.bays.length,
    })),
    totalCordM: m4(placement.totalCordM),
    baselineCordM: m4(placement.baselineCordM),
    channelM: m4(placement.channelM),
    pulleys: placement.pulleys,
  };
}

/** The document as a value (what the file holds); `frame`, when given, places every part and routes every cord. */
export function netlistDocument(
  build: Build,
  frame?: { readonly placement: Placement; readonly profile: Profile },
): object {
  const f = build.machine;
  const s = build.signals;
  const bays = new Map(frame?.placement.bays.map((b) => [b.part, b]));
  const routes = new Map(frame?.placement.routing.cords.map((c) => [c.cord, c]));
  return {
    format: NETLIST_FORMAT,
    version: NETLIST_VERSION,
    machine: {
      name: f.name,
      inputs: [...f.inputs],
      outputs: [...f.outputs],
      states: f.states.map((name, i) => ({ name, code: build.encoding.codes[i] ?? '' })),
      start: f.states[f.start],
      encoding: build.encoding.strategy,
      bits: build.encoding.bits,
    },
    signals: {
      inputs: Object.fromEntries(f.inputs.map((i) => [i, s.inputs[i] ?? ''])),
      phi1: s.phi1,
      phi2: s.phi2,
      reset: s.reset,
      masters: [...s.masters],
      slaves: [...s.slaves],
      outputs: Object.fromEntries(f.outputs.map((o) => [o, s.outputs[o] ?? ''])),
    },
    counts: { ...build.parts },
    ...(frame ? { frame: frameObject(frame.placement, frame.profile) } : {}),
    parts: sortedParts(build.netlist).map((p) => (frame ? { ...partObject(p), ...placeOf(p, bays) } : partObject(p))),
    cords: sortedCords(build.netlist).map((c) => (frame ? routedCord(c, routes) : c)),
  };
}

/** The netlist JSON text: two-space indentation, one part or cord per line, ending in a newline. */
export function netlistJson(
  build: Build,
  frame?: { readonly placement: Placement; readonly profile: Profile },
): string {
  const doc = netlistDocument(build, frame) as Record<string, unknown>;
  const lines = Object.entries(doc).map(([k, v]) => {
    if (Array.isArray(v)) {
      const items = v.map((x) => `    ${JSON.stringify(x)}`);
      return `  ${JSON.stringify(k)}: ${items.length === 0 ? '[]' : `[\n${items.join(',\n')}\n  ]`}`;
    }
    return `  ${JSON.stringify(k)}: ${JSON.stringify(v)}`;
  });
  return `{\n${lines.join(',\n')}\n}\n`;
}
