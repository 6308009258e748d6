/**
 * What each part of a build does, in words, read from the netlist's structure (which cords
 * drive which ports), never parsed back from a part's name or id. The schematic labels its
 * boxes with these words and the designer's force-margin chart names its capstans by them, so
 * a reader sees "resets M1 when q0 · marble" where the wiring list says `t.R1.1`.
 *
 * Signals are named as the equations name them: `q0` for slave bit 0 (the state), `M0` for
 * master bit 0, inputs by their own names, `!x` for a complement. Every gate is a NAND over
 * its cords (model/netlist.ts), so a one-cord gate gives the complement of its cord's signal
 * (an inverter; a buffer pair gives the signal back). A product is written `a · b`.
 *
 * Postcondition: one entry per part, bounded in length (long products are shortened with
 * "…", the full words stay in the part's own name and in the wiring list).
 */
import type { GatePart, LatchPart, Netlist, Part } from '../model/netlist.js';
import { quantitiesFor, type DocumentUnits } from '../model/units.js';

/** Longest role words kept whole (characters); longer ones end in "…". */
const MAX_WORDS = 72;
/** How deep a signal is described through other gates before it is named by its gate. */
const MAX_DEPTH = 3;

/** A part's role: a kind in a few words and what this one does. */
export interface PartRole {
  /** The kind of part, e.g. "φ1 term", "master latch", "operator lever". */
  readonly kind: string;
  /** What it does, e.g. "resets M1 when q0 · marble". */
  readonly does: string;
}

const cut = (s: string): string => (s.length > MAX_WORDS ? `${s.slice(0, MAX_WORDS - 1)}…` : s);

/** The complement of a signal's words: `x` ↔ `!x`, a product in parentheses. */
function not(words: string): string {
  if (words.startsWith('!') && !words.includes(' ')) return words.slice(1);
  return words.includes(' ') ? `!(${words})` : `!${words}`;
}

/** Reads the netlist once: which drivers feed each gate, and where each driver's cords go. */
class RoleReader {
  private readonly byId: ReadonlyMap<string, Part>;
  private readonly feeds = new Map<string, string[]>();
  private readonly targets = new Map<string, { part: string; port: string }[]>();
  private readonly signals = new Map<string, string>();

  constructor(
    private readonly net: Netlist,
    private readonly units: DocumentUnits,
  ) {
    this.byId = new Map(net.parts.map((p) => [p.id, p]));
    for (const c of net.cords) {
      const out = this.targets.get(c.driver) ?? [];
      for (const r of c.ports) {
        out.push(r);
        const into = this.feeds.get(r.part) ?? [];
        if (!into.includes(c.driver)) into.push(c.driver);
        this.feeds.set(r.part, into);
      }
      this.targets.set(c.driver, out);
    }
  }

  /** The latch a gate belongs to, when it is one of a latch's two gates. */
  private latchOf(g: GatePart): LatchPart | undefined {
    const l = g.latch === undefined ? undefined : this.byId.get(g.latch);
    return l?.kind === 'latch' ? l : undefined;
  }

  /** The latch's own output name: `q0` for a slave (a state bit), `M0` for a master. */
  private latchSignal(l: LatchPart): string {
    return l.role === 'slave' ? `q${l.bit}` : `M${l.bit}`;
  }

  /** The signal a driver's output cord carries, in words (1 while the cord is slack). */
  signal(id: string, depth = 0): string {
    const known = this.signals.get(id);
    if (known !== undefined) return known;
    const words = this.signalOf(id, depth);
    this.signals.set(id, words);
    return words;
  }

  private signalOf(id: string, depth: number): string {
    const p = this.byId.get(id);
    if (!p) return id;
    if (p.kind === 'lever')
      return p.role === 'input' ? (p.input ?? p.name) : p.role === 'phi1' ? 'φ1' : p.role === 'phi2' ? 'φ2' : 'reset';
    if (p.kind !== 'gate') return p.name;
    const l = this.latchOf(p);
    if (l && p.role === 'latch-set') return this.latchSignal(l);
    if (l && p.role === 'latch-reset') return `!${this.latchSignal(l)}`;
    if (depth >= MAX_DEPTH) return p.id;
    const ins = (this.feeds.get(id) ?? []).map((d) => this.signal(d, depth + 1));
    if (ins.length === 0) return '1';
    return ins.length === 1 ? not(ins[0]) : not(ins.join(' · '));
  }

  /** The literals of a gate: the signals on its cords, without the clock lever that times it. */
  private literals(g: GatePart): string {
    const ins = (this.feeds.get(g.id) ?? []).filter((d) => {
      const p = this.byId.get(d);
      return !(p?.kind === 'lever' && (p.role === 'phi1' || p.role === 'phi2'));
    });
    return ins.map((d) => this.signal(d)).join(' · ') || 'always';
  }

  /** The latches a gate's cords set and reset, in words ("sets M1", "resets M0, M2"). */
  private drives(g: GatePart): string {
    const sets: string[] = [];
    const resets: string[] = [];
    for (const t of this.targets.get(g.id) ?? []) {
      const p = this.byId.get(t.part);
      const l = p?.kind === 'gate' ? this.latchOf(p) : undefined;
      if (!l || p?.kind !== 'gate') continue;
      const name = l.role === 'slave' ? `q${l.bit}` : `M${l.bit}`;
      const list = p.role === 'latch-set' ? sets : resets;
      if (!list.includes(name)) list.push(name);
    }
    const words = [
      ...(sets.length > 0 ? [`sets ${sets.join(', ')}`] : []),
      ...(resets.length > 0 ? [`resets ${resets.join(', ')}`] : []),
    ];
    return words.join(' and ') || 'drives no latch';
  }

  private gateRole(g: GatePart): PartRole {
    switch (g.role) {
      case 'term':
        return { kind: 'φ1 term', does: `${this.drives(g)} when ${this.literals(g)}` };
      case 'transfer':
        return { kind: 'φ2 transfer', does: `${this.drives(g)} from ${this.literals(g)}` };
      case 'inverter':
        return { kind: 'inverter', does: `gives ${this.signal(g.id)}` };
      case 'buffer':
        return { kind: 'buffer', does: `passes on ${this.signal(g.id)} (shares the load)` };
      case 'reset-driver':
        return { kind: 'reset driver', does: 'pulls the latches to the start code while reset is pulled' };
      case 'output':
        return { kind: 'output gate', does: this.outputWords(g) };
      case 'latch-set':
      case 'latch-reset': {
        const l = this.latchOf(g);
        const side = g.role === 'latch-set' ? 'set' : 'reset';
        return l
          ? { kind: `${l.role} latch, ${side} side`, does: `gives ${this.signal(g.id)}` }
          : { kind: 'latch gate', does: `gives ${this.signal(g.id)}` };
      }
    }
  }

  /**
   * The output a flag or an actuator shows from this gate, if one does, and whether it shows
   * the complement (a flag mounted to show 1 when the gate's Z lever is down).
   */
  private shownBy(id: string): { output: string; inverted: boolean } | undefined {
    for (const p of this.net.parts) {
      if (p.kind === 'flag' && p.gate === id) return { output: p.output, inverted: p.inverted };
      if (p.kind === 'actuator' && this.net.cords.some((c) => c.driver === id && c.actuators.includes(p.id)))
        return { output: p.output, inverted: false };
    }
    return undefined;
  }

  /** An output gate: the output it shows and when (Z is the product of its cords), or the output whose term it is. */
  private outputWords(g: GatePart): string {
    const isOutputGate = (id: string): boolean => {
      const p = this.byId.get(id);
      return p?.kind === 'gate' && p.role === 'output';
    };
    const feeders = this.feeds.get(g.id) ?? [];
    const shown = this.shownBy(g.id);
    const name = shown?.output ?? 'output';
    if (feeders.length > 0 && feeders.every(isOutputGate)) return `${name}: 1 when any of its terms holds`;
    const into = (this.targets.get(g.id) ?? []).map((t) => t.part).find(isOutputGate);
    if (into !== undefined) return `term of ${this.shownBy(into)?.output ?? 'an output'}: ${this.literals(g)}`;
    return `${name} ${shown?.inverted ? 'unless' : 'when'} ${this.literals(g)}`;
  }

  role(p: Part): PartRole {
    switch (p.kind) {
      case 'lever':
        return p.role === 'input'
          ? { kind: 'operator lever', does: `input ${p.input ?? p.name}, 1 while pulled` }
          : p.role === 'reset'
            ? { kind: 'reset lever', does: 'returns every latch to the start code' }
            : p.role === 'phi1'
              ? { kind: 'clock lever', does: 'φ1: the masters take the next state' }
              : { kind: 'clock lever', does: 'φ2: the slaves copy the masters' };
      case 'latch':
        return p.role === 'master'
          ? { kind: 'master latch', does: `M${p.bit}: bit ${p.bit} of the next state` }
          : { kind: 'slave latch', does: `q${p.bit}: bit ${p.bit} of the state` };
      case 'flag':
        return p.fixed !== undefined
          ? { kind: 'flag', does: `${p.output}, pinned at ${p.fixed}` }
          : { kind: 'flag', does: `shows ${p.output}` };
      case 'actuator':
        return { kind: 'actuator', does: `moves ${p.output} (${quantitiesFor(this.units).mass(p.loadG)})` };
      case 'gate':
        return this.gateRole(p);
    }
  }
}

/** The role of every part of a netlist, by part id (see the module comment); an actuator's load in `units`. */
export function partRoles(net: Netlist, units: DocumentUnits = 'metric'): ReadonlyMap<string, PartRole> {
  const reader = new RoleReader(net, units);
  return new Map(net.parts.map((p) => [p.id, (({ kind, does }) => ({ kind, does: cut(does) }))(reader.role(p))]));
}
