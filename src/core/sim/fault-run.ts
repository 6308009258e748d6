/**
 * Fault simulation of the commissioning sheet, and the search for clocks that show a fault the
 * sheet misses.
 *
 * Simulation: serial fault simulation on the compiled netlist with the fault put in
 * (faults.ts), one faulty machine after another, each stepped through the sheet's hand actions
 * from power-up and compared with the fault-free machine after every row; a faulty machine
 * stops at the first row that shows its fault (fault dropping; Abramovici, Breuer & Friedman,
 * ch. 5 — from memory). What is compared is what the person ticks: each latch's two Z levers
 * and each output's flag or actuator. A row *shows* a fault when a value is determinate (0 or
 * 1) in both machines and differs; a faulty X against a determinate value only *may* show it
 * (the lever could come to rest either way). The faulty machines are settled event-driven
 * (settle.ts), and so is the fault-free one here (the sheet steps it by part.ts `stepSim`,
 * which gives the same values). Not the fast pass (fast.ts): its programs rest on the netlist's
 * latches being latches, which a fault on a feedback cord undoes.
 *
 * Search: breadth-first search over the product of the fault-free and the faulty machine, one
 * node per pair of clock-level states (lever positions and latch contents of both: the
 * settled gates between latches follow from them), from a given pair of states; an edge is
 * one clock of the sheet (an optional reset, the input row, the four phase rows), every row
 * compared as above. This is the product-machine method of sequential test generation and
 * equivalence checking (e.g. the same book, ch. 8; O. Coudert, C. Berthet & J. C. Madre,
 * "Verification of synchronous sequential machines based on symbolic execution", 1989 — both
 * from memory), explicit and bounded: it ends at a shown fault (the shortest such clocks), at
 * an exhausted product (no clock sequence the moves allow ever shows the fault), or at a bound
 * (undecided).
 */
import { X, type PartSim } from './compile.js';
import type { HandAction } from './hand.js';
import { applyInPlace, powerUp, type PartEvent, type PartState } from './part.js';
import { clockSteps, type SheetClock, type SheetStep } from './sheet.js';

/** Values a person ticks per row: Z of each latch's set and reset gate (as gate outputs), then each output as compile.ts's readOutputs reads it. */
export function lookWidth(sim: PartSim): number {
  return 2 * sim.latches.length + sim.outputs.length;
}

/** What the person ticks, from a machine's values, into `out`. */
export function lookAt(sim: PartSim, values: Uint8Array, out: Uint8Array): Uint8Array {
  let k = 0;
  for (const l of sim.latches) {
    out[k++] = values[l.set];
    out[k++] = values[l.reset];
  }
  for (const r of sim.outputs) {
    if (r.kind === 'fixed') out[k++] = r.value;
    else if (r.kind === 'flag') {
      // The flag rides on Z = NOT the gate's output; an inverted flag shows the other way.
      const v = values[r.gate];
      out[k++] = v === X ? X : r.inverted ? v : 1 - v;
    } else {
      let o = 0;
      for (const d of r.drivers) {
        const v = values[d];
        if (v === 0) {
          o = 1;
          break;
        }
        if (v === X) o = X;
      }
      out[k++] = o;
    }
  }
  return out;
}

/** How a faulty look compares with the fault-free one: 2 shown, 1 may show, 0 the same. */
export function compareLooks(good: Uint8Array, bad: Uint8Array): 0 | 1 | 2 {
  let may: 0 | 1 = 0;
  for (let k = 0; k < good.length; k++) {
    const g = good[k];
    const b = bad[k];
    if (g === X || g === b) continue;
    if (b === X) may = 1;
    else return 2;
  }
  return may;
}

/** A machine stepped by hand actions, settled event-driven (settle.ts), as a row of the sheet leaves it. */
export class Stepped {
  values: Uint8Array;
  timeUs: number;
  private readonly events: PartEvent[] = [];

  constructor(
    readonly sim: PartSim,
    start: PartState = powerUp(sim)[0],
  ) {
    this.values = start.values.slice();
    this.timeUs = start.timeUs;
  }

  copy(): Stepped {
    return new Stepped(this.sim, { values: this.values, timeUs: this.timeUs });
  }

  run(actions: readonly HandAction[]): void {
    for (const a of actions) {
      this.timeUs = applyInPlace(this.sim, this.values, this.timeUs, a, this.events);
      this.events.length = 0;
    }
  }

  look(out: Uint8Array): Uint8Array {
    return lookAt(this.sim, this.values, out);
  }

  /** Lever positions and latch contents: the clock-level state. */
  key(): string {
    let k = '';
    for (let d = 0; d < this.sim.leverCount; d++) k += String.fromCharCode(48 + this.values[d]);
    for (const l of this.sim.latches) k += String.fromCharCode(48 + this.values[l.set] * 3 + this.values[l.reset]);
    return k;
  }
}

/** Where a fault first shows on a run of rows, and what was seen there. */
export interface FaultShowing {
  /** Row index (from 0) of the first row that shows it, or -1. */
  readonly shown: number;
  /** Row index of the first row that may show it (a faulty X), or -1. */
  readonly may: number;
  /** At the shown row: the look positions that differ and the faulty value seen there. */
  readonly seen: readonly { readonly at: number; readonly value: 0 | 1 }[];
}

/** The looks that differ between two determinate looks. */
export function differences(good: Uint8Array, bad: Uint8Array): { at: number; value: 0 | 1 }[] {
  const out: { at: number; value: 0 | 1 }[] = [];
  for (let k = 0; k < good.length; k++)
    if (good[k] !== X && bad[k] !== X && good[k] !== bad[k]) out.push({ at: k, value: bad[k] as 0 | 1 });
  return out;
}

/**
 * Run a faulty machine through rows, comparing with the fault-free looks; stops at the first
 * row that shows the fault. `offset` numbers the rows; `may` carries an earlier may-show row.
 */
export function runRows(
  bad: Stepped,
  steps: readonly SheetStep[],
  goodLooks: readonly Uint8Array[],
  offset = 0,
  may = -1,
): FaultShowing {
  const look = new Uint8Array(lookWidth(bad.sim));
  for (let i = 0; i < steps.length; i++) {
    bad.run(steps[i].actions);
    bad.look(look);
    const c = compareLooks(goodLooks[i], look);
    if (c === 2) return { shown: offset + i, may, seen: differences(goodLooks[i], look) };
    if (c === 1 && may < 0) may = offset + i;
  }
  return { shown: -1, may, seen: [] };
}

/** Bounds of one search. */
export interface SearchBounds {
  /** Most clocks in a sequence. */
  readonly depth: number;
  /** Most product states visited. */
  readonly nodes: number;
  /** Most clocks simulated (each in both machines). */
  readonly clocks: number;
}

/** How a search ended, with the clocks it simulated (`work`). */
export type SearchOutcome =
  | { readonly kind: 'shown'; readonly clocks: readonly SheetClock[]; readonly work: number }
  | { readonly kind: 'never'; readonly work: number }
  | { readonly kind: 'bound'; readonly work: number };

interface Node {
  readonly good: Stepped;
  readonly bad: Stepped;
  readonly levers: string;
  readonly path: readonly SheetClock[];
}

/**
 * The shortest clocks from (good, bad) that show the fault, by breadth-first search over the
 * product (see the module comment). `movesAt(code)` gives the clocks allowed with the
 * fault-free slave code `code`; `complete` says they are every clock the sheet could take
 * there, so an exhausted search means "never" (else it means "bound").
 */
export function searchShowing(
  start: { good: Stepped; bad: Stepped; levers: string },
  inputs: readonly string[],
  seq: boolean,
  movesAt: (good: Stepped) => readonly SheetClock[],
  complete: boolean,
  bounds: SearchBounds,
): SearchOutcome {
  const seen = new Set<string>([start.good.key() + '|' + start.bad.key()]);
  let queue: Node[] = [{ good: start.good, bad: start.bad, levers: start.levers, path: [] }];
  const gl = new Uint8Array(lookWidth(start.good.sim));
  const bl = new Uint8Array(lookWidth(start.bad.sim));
  let cut = false;
  let work = 0;
  for (let depth = 0; depth < bounds.depth && queue.length > 0 && !cut; depth++) {
    const next: Node[] = [];
    for (const node of queue) {
      for (const m of movesAt(node.good)) {
        if (work >= bounds.clocks) {
          cut = true;
          break;
        }
        work++;
        const good = node.good.copy();
        const bad = node.bad.copy();
        let shown = false;
        for (const st of clockSteps(inputs, seq, m, 0, node.levers)) {
          good.run(st.actions);
          bad.run(st.actions);
          if (compareLooks(good.look(gl), bad.look(bl)) === 2) {
            shown = true;
            break;
          }
        }
        const path = [...node.path, m];
        if (shown) return { kind: 'shown', clocks: path, work };
        const key = good.key() + '|' + bad.key();
        if (seen.has(key)) continue;
        if (seen.size >= bounds.nodes) {
          cut = true;
          continue;
        }
        seen.add(key);
        next.push({ good, bad, levers: m.inputs, path });
      }
    }
    queue = next;
  }
  if (queue.length > 0) cut = true;
  return !cut && complete ? { kind: 'never', work } : { kind: 'bound', work };
}
