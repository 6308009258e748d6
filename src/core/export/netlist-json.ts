/**
 * The netlist as JSON, described by schemas/netlist.schema.json (JSON Schema 2020-12).
 *
 * Made to diff well: parts are grouped by kind (levers, gates, latches, flags, actuators) and
 * sorted by id within a group in natural order (`t.S0.2` before `t.S0.10`); cords are sorted
 * by id and their branches by part then port; object keys come in a fixed order; each part
 * and each cord sits on one line. Ids are the mapper's stable, readable ids, so a small change
 * to the machine changes few lines. Strings are written by JSON.stringify.
 */
import type { Build } from '../model/build.js';
import type { Cord, Netlist, Part } from '../model/netlist.js';

/** Format tag and version written into every file (bump the version on an incompatible change). */
export const NETLIST_FORMAT = 'latchwright-netlist';
export const NETLIST_VERSION = 1;

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

/** The document as a value (what the file holds). */
export function netlistDocument(build: Build): object {
  const f = build.machine;
  const s = build.signals;
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
    parts: sortedParts(build.netlist).map(partObject),
    cords: sortedCords(build.netlist),
  };
}

/** The netlist JSON text: two-space indentation, one part or cord per line, ending in a newline. */
export function netlistJson(build: Build): string {
  const doc = netlistDocument(build) as Record<string, unknown>;
  const lines = Object.entries(doc).map(([k, v]) => {
    if (Array.isArray(v)) {
      const items = v.map((x) => `    ${JSON.stringify(x)}`);
      return `  ${JSON.stringify(k)}: ${items.length === 0 ? '[]' : `[\n${items.join(',\n')}\n  ]`}`;
    }
    return `  ${JSON.stringify(k)}: ${JSON.stringify(v)}`;
  });
  return `{\n${lines.join(',\n')}\n}\n`;
}
