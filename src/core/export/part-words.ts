/**
 * What each part does, in words a person at the frame reads: "set bit 1 when !q1 & marble",
 * "master latch of q0, set side", "clock lever φ2". The frame drawing labels its bays with
 * them, and the commissioning sheet names levers by them.
 *
 * Method: from the netlist's structure alone, never from a part's name (names are for
 * people, and a name is never parsed back). A one-port gate repeats the complement of what
 * drives its port; a term gate's literals are what drives the cords on its ports (the clock
 * cord gives its phase); slave latch sides are the state bits (`q0`, `!q0`, the build's own
 * variable names), master latch sides `M0`, `!M0`. A term gate's purpose is what its output
 * cord reaches through any buffer pairs: the set or reset port of a master latch ("set bit
 * j") or an output. Output gates are named by the outputs they reach.
 */
import type { Build } from '../model/build.js';
import type { Cord, Part } from '../model/netlist.js';
import { quantitiesFor, type DocumentUnits } from '../model/units.js';

/** The literal a signal stands for, with its complement. */
const negate = (lit: string): string => (lit.startsWith('!') ? lit.slice(1) : `!${lit}`);

interface Net {
  readonly parts: ReadonlyMap<string, Part>;
  /** Cords tied to any port of a part, by part id. */
  readonly into: ReadonlyMap<string, readonly Cord[]>;
  /** Cords a part drives, by part id. */
  readonly outOf: ReadonlyMap<string, readonly Cord[]>;
  readonly vars: readonly string[];
}

function netOf(build: Build): Net {
  const into = new Map<string, Cord[]>();
  const outOf = new Map<string, Cord[]>();
  for (const c of build.netlist.cords) {
    outOf.set(c.driver, [...(outOf.get(c.driver) ?? []), c]);
    for (const p of new Set(c.ports.map((x) => x.part))) into.set(p, [...(into.get(p) ?? []), c]);
  }
  return { parts: new Map(build.netlist.parts.map((p) => [p.id, p])), into, outOf, vars: build.vars };
}

/** The signal a driver's cord carries, as a literal ('' for a signal that is not one: a term, a clock). */
function literal(net: Net, id: string, depth = 0): string {
  const p = net.parts.get(id);
  if (!p || depth > 64) return '';
  if (p.kind === 'lever') return p.role === 'input' ? (p.input ?? p.name) : '';
  if (p.kind !== 'gate') return '';
  if (p.latch !== undefined) {
    const l = net.parts.get(p.latch);
    if (l?.kind !== 'latch') return '';
    const bit = l.role === 'slave' ? (net.vars[l.bit] ?? `q${l.bit}`) : `M${l.bit}`;
    return p.role === 'latch-set' ? bit : negate(bit);
  }
  if (p.role === 'inverter' || p.role === 'buffer') {
    const source = net.into.get(id)?.[0];
    const lit = source ? literal(net, source.driver, depth + 1) : '';
    return lit === '' ? '' : negate(lit);
  }
  return '';
}

/** Literals in the order of the build's variables (state bits, then inputs), then the rest. */
function byVariable(net: Net, lits: string[]): string[] {
  const rank = (lit: string): number => {
    const k = net.vars.indexOf(lit.replace(/^!/, ''));
    return k === -1 ? net.vars.length : k;
  };
  return lits.sort((a, b) => rank(a) - rank(b));
}

/** The literals on a gate's ports (in variable order), and the clock phase among them. */
function inputsOf(net: Net, id: string): { lits: string[]; phase: string } {
  const lits: string[] = [];
  let phase = '';
  for (const c of net.into.get(id) ?? []) {
    const d = net.parts.get(c.driver);
    if (d?.kind === 'lever' && (d.role === 'phi1' || d.role === 'phi2')) phase = d.name;
    else {
      const lit = literal(net, c.driver);
      if (lit !== '' && !lits.includes(lit)) lits.push(lit);
    }
  }
  return { lits: byVariable(net, lits), phase };
}

/** What a gate's output cords reach, through buffer pairs: master latch ports and outputs. */
function reach(net: Net, id: string, seen = new Set<string>()): { sets: string[]; outputs: string[] } {
  const sets: string[] = [];
  const outputs: string[] = [];
  const add = (xs: string[], x: string): void => void (xs.includes(x) ? undefined : xs.push(x));
  seen.add(id);
  for (const p of net.parts.values())
    if (p.kind === 'flag' && p.fixed === undefined && p.gate === id) add(outputs, p.output);
  for (const c of net.outOf.get(id) ?? []) {
    for (const a of c.actuators) {
      const x = net.parts.get(a);
      if (x?.kind === 'actuator') add(outputs, x.output);
    }
    for (const port of c.ports) {
      const g = net.parts.get(port.part);
      if (g?.kind !== 'gate' || seen.has(g.id)) continue;
      const l = g.latch !== undefined ? net.parts.get(g.latch) : undefined;
      if (l?.kind === 'latch' && l.role === 'master')
        add(sets, `${g.role === 'latch-set' ? 'set' : 'reset'} bit ${l.bit}`);
      else if (g.role === 'buffer' || g.role === 'output') {
        const r = reach(net, g.id, seen);
        r.sets.forEach((x) => add(sets, x));
        r.outputs.forEach((x) => add(outputs, x));
      }
    }
  }
  return { sets, outputs };
}

const when = (lits: readonly string[]): string => (lits.length === 0 ? 'always' : `when ${lits.join(' & ')}`);

function gateWords(net: Net, p: Extract<Part, { kind: 'gate' }>): string {
  const { lits, phase } = inputsOf(net, p.id);
  const at = phase === '' ? '' : ` (at ${phase})`;
  switch (p.role) {
    case 'term': {
      const r = reach(net, p.id);
      return `${r.sets.length > 0 ? r.sets.join(' and ') : 'term'} ${when(lits)}${at}`;
    }
    case 'transfer': {
      const target = (net.outOf.get(p.id) ?? []).flatMap((c) => c.ports).map((x) => net.parts.get(x.part))[0];
      const side = target?.kind === 'gate' && target.role === 'latch-reset' ? 'reset' : 'set';
      const l = target?.kind === 'gate' && target.latch !== undefined ? net.parts.get(target.latch) : undefined;
      const bit = l?.kind === 'latch' ? (net.vars[l.bit] ?? `q${l.bit}`) : 'the slave latch';
      return `${phase || 'φ2'}: ${side} ${bit} ${when(lits)}`;
    }
    case 'output': {
      const r = reach(net, p.id);
      const out = r.outputs.join(', ') || 'output';
      const fromTerms = (net.into.get(p.id) ?? []).every((c) => {
        const d = net.parts.get(c.driver);
        return d?.kind === 'gate' && d.role === 'output';
      });
      if (fromTerms && (net.into.get(p.id)?.length ?? 0) > 0) return `${out}: any of its terms`;
      if (lits.length === 0 && (net.into.get(p.id)?.length ?? 0) > 0) return `${out}: drives its actuator`;
      return `${out} ${when(lits)}`;
    }
    case 'latch-set':
    case 'latch-reset': {
      const l = p.latch !== undefined ? net.parts.get(p.latch) : undefined;
      const side = p.role === 'latch-set' ? 'set side (Q)' : 'reset side (Q̄)';
      return l?.kind === 'latch' ? `${latchWords(net, l)}, ${side}` : side;
    }
    case 'inverter':
      return `inverter: gives ${literal(net, p.id) || 'the complement'}`;
    case 'buffer': {
      const lit = literal(net, p.id);
      return lit === '' ? `buffer: carries the ${rootOf(net, p.id)}’s signal` : `buffer: gives ${lit}`;
    }
    case 'reset-driver':
      return 'reset driver: pulls every latch to the start code';
  }
}

/** The part a chain of buffers carries the signal of, in people's words (its name). */
function rootOf(net: Net, id: string): string {
  let at = net.parts.get(id);
  for (let i = 0; i < 64 && at?.kind === 'gate' && at.role === 'buffer'; i++) {
    const source = net.into.get(at.id)?.[0];
    at = source ? net.parts.get(source.driver) : undefined;
  }
  return at?.name ?? 'driver';
}

function latchWords(net: Net, l: Extract<Part, { kind: 'latch' }>): string {
  const bit = net.vars[l.bit] ?? `q${l.bit}`;
  return l.role === 'master' ? `master latch of ${bit}` : `slave latch ${bit}`;
}

function leverWords(p: Extract<Part, { kind: 'lever' }>): string {
  switch (p.role) {
    case 'input':
      return `operator lever ‘${p.input ?? p.name}’`;
    case 'phi1':
    case 'phi2':
      return `clock lever ${p.name}`;
    case 'reset':
      return 'reset lever';
  }
}

/** What every part does, in words, by part id; an actuator's load in `units`. */
export function partWords(build: Build, units: DocumentUnits = 'metric'): ReadonlyMap<string, string> {
  const q = quantitiesFor(units);
  const net = netOf(build);
  const out = new Map<string, string>();
  for (const p of build.netlist.parts) {
    if (p.kind === 'lever') out.set(p.id, leverWords(p));
    else if (p.kind === 'gate') out.set(p.id, gateWords(net, p));
    else if (p.kind === 'latch') out.set(p.id, latchWords(net, p));
    else if (p.kind === 'flag') out.set(p.id, `flag showing ${p.output}`);
    else out.set(p.id, `exit to the ${p.output} actuator (${q.mass(p.loadG)})`);
  }
  return out;
}
