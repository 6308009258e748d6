/**
 * What the synthesis produces and what the simulator, the checks and the exports consume.
 */
import type { FlatMachine } from './flat.js';
import type { Netlist } from './netlist.js';
import type { Cube } from './cube.js';
import { wordsIn, type DocumentUnits, type Words } from './units.js';

/** State codes of the minimised machine. */
export interface Encoding {
  /** Strategy name: 'binary' | 'gray' | 'johnson' | 'one-hot' | 'pinned' | 'auto' (or a custom name). */
  readonly strategy: string;
  readonly bits: number;
  /** Code per state of the minimised machine, '0'/'1' strings, bit 0 first (most significant). */
  readonly codes: readonly string[];
}

/** A set or reset equation of one latch, or an output equation, as product terms. */
export interface Equation {
  /** What it drives: `S0`, `R0` (set/reset of master latch for bit 0) or an output name. */
  readonly name: string;
  /**
   * Product terms over the variables `vars` of the Build (state bits then inputs);
   * positional cube strings.
   */
  readonly terms: readonly Cube[];
}

/** Where the simulator finds the machine's signals in the netlist. */
export interface SignalMap {
  /** Lever id per machine input. */
  readonly inputs: Readonly<Record<string, string>>;
  readonly phi1: string;
  readonly phi2: string;
  readonly reset: string;
  /** Master and slave latch ids per state bit (none for a one-state machine). */
  readonly masters: readonly string[];
  readonly slaves: readonly string[];
  /** Per machine output: the flag or actuator showing it. */
  readonly outputs: Readonly<Record<string, string>>;
}

/** Cost of the forbidden-input guard against an unguarded minimisation of the same functions. */
export interface GuardReport {
  /** S·R = 0 proven over all codes × all input combinations for every latch. */
  readonly ok: boolean;
  readonly extraGates: number;
  readonly extraCords: number;
  readonly method: string;
  /**
   * False when the unguarded baseline was skipped to save time (a search run): extraGates and
   * extraCords are then 0 and say nothing. Absent or true: they are measured.
   */
  readonly compared?: boolean;
}

export interface PartCounts {
  readonly gates: number;
  readonly latches: number;
  readonly levers: number;
  readonly capstans: number;
  readonly weights: number;
  readonly cords: number;
}

export interface Build {
  /** The minimised machine that was built. */
  readonly machine: FlatMachine;
  readonly encoding: Encoding;
  /** Names of the cube variables of the equations: state bits `q0…` then inputs. */
  readonly vars: readonly string[];
  /** Set/reset equations per bit (`S0`, `R0`, …) and output equations. */
  readonly equations: readonly Equation[];
  readonly guard: GuardReport;
  readonly netlist: Netlist;
  readonly signals: SignalMap;
  readonly parts: PartCounts;
}

/**
 * The fields every check's result has. Each check's result type extends it with its own
 * figures; the results together are the union `CheckResult` of src/core/checks/registry.ts,
 * told apart by `name`.
 */
export interface CheckBase<N extends string = string> {
  readonly name: N;
  readonly ok: boolean;
  /** One line in words, its figures in metric (SI). */
  readonly summary: string;
  /**
   * The same line with its lengths, masses and torques as typed figures (model/units.ts), for a
   * check whose summary has any: `summaryIn` writes it in the workshop's units. Left out of
   * `build --json`, whose summary stays SI.
   */
  readonly says?: Words;
}

/** A check's summary in `units`: its typed words where it has them, else its summary as it is. */
export const summaryIn = (check: CheckBase, units: DocumentUnits): string =>
  check.says ? wordsIn(check.says, units) : check.summary;
