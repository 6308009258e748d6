/**
 * The part-level netlist of a lever machine (see docs/methods.md, "Signals and parts").
 *
 * Signal polarity is physical: a lever up = 1 (rest, held by its pull-up weight), down = 0.
 * A cord either pulls (drives 0 at every port it is tied to) or is slack (lets them rise).
 * - A port is a pull-up lever: the wired-AND of the cords tied to it (no cord → 1).
 * - A gate couples its ports to a summing lever Z (Z = AND of its ports); its capstan output
 *   cord pulls exactly when Z = 1, so the gate's output signal is NOT Z: a NAND over every
 *   cord on every port. Z can be read by a flag but drives nothing.
 * - A lever (operator input, clock φ1/φ2, reset) is worked by a person; its capstan output
 *   is 1 exactly when the lever is pulled.
 * - A latch is two gates, each with a feedback cord from the other's output: the set-side
 *   gate outputs Q and carries the active-low S̄ ports, the reset-side gate outputs Q̄ and
 *   carries R̄. Its cords and gates are ordinary parts of this netlist.
 *
 * Invariants (checked in tests): ids are unique; every cord has exactly one driver (a lever or
 * a gate) and at least one port or actuator; every port has at least one cord; every port
 * belongs to a gate; a flag reads an existing gate unless it is `fixed`.
 */

export type LeverRole = 'input' | 'phi1' | 'phi2' | 'reset';

export type GateRole =
  /** NAND(φ1, literals…) driving a master latch's S̄ or R̄ port. */
  | 'term'
  /** NAND(φ2, M or M̄) driving a slave latch's S̄ or R̄ port. */
  | 'transfer'
  /** One-port gate giving the complement of an input (or another signal). */
  | 'inverter'
  /** A gate that repeats a signal to share a driver's load (buffer tree); two in a row. */
  | 'buffer'
  /** Output decoding (Moore or Mealy), read by a flag or pulling an actuator. */
  | 'output'
  /** The set-side gate of a latch (output Q). */
  | 'latch-set'
  /** The reset-side gate of a latch (output Q̄). */
  | 'latch-reset'
  /** Inverts the reset lever so that its cord pulls while the reset lever is pulled. */
  | 'reset-driver';

export interface LeverPart {
  readonly kind: 'lever';
  readonly id: string;
  readonly name: string;
  readonly role: LeverRole;
  /** The machine input this lever stands for (role 'input'). */
  readonly input?: string;
}

export interface PortSpec {
  /** Unique within its gate, e.g. 'a', 'b', 'set1', 'fb'. */
  readonly name: string;
}

export interface GatePart {
  readonly kind: 'gate';
  readonly id: string;
  readonly name: string;
  readonly role: GateRole;
  readonly ports: readonly PortSpec[];
  /** The latch this gate belongs to (roles latch-set / latch-reset). */
  readonly latch?: string;
  /**
   * Turns of cord on the drum for this gate's capstan, where its force budget asks for more
   * than the profile's `wraps` (the capstan of an actuator); absent: the profile's `wraps`.
   */
  readonly wraps?: number;
}

export interface LatchPart {
  readonly kind: 'latch';
  readonly id: string;
  readonly name: string;
  readonly role: 'master' | 'slave';
  /** State bit index (0 = most significant bit of the code). */
  readonly bit: number;
  /** Gate whose output is Q (carries S̄ ports). */
  readonly setGate: string;
  /** Gate whose output is Q̄ (carries R̄ ports). */
  readonly resetGate: string;
}

export interface FlagPart {
  readonly kind: 'flag';
  readonly id: string;
  readonly name: string;
  /** The machine output it shows. */
  readonly output: string;
  /** The gate whose Z lever it reads (unbuffered). */
  readonly gate: string;
  /** Mounted so that it shows 1 when Z = 0. */
  readonly inverted: boolean;
  /**
   * A constant output: the flag is pinned showing this value, reads no gate, and `gate` is ''.
   * Absent for every flag that reads a gate.
   */
  readonly fixed?: 0 | 1;
}

export interface ActuatorPart {
  readonly kind: 'actuator';
  readonly id: string;
  readonly name: string;
  readonly output: string;
  /** External load the actuator cord must lift, in grams. */
  readonly loadG: number;
  /**
   * A constant output: no cord drives this actuator; the load is hung permanently lifted (1)
   * or left at rest (0). Absent for every actuator driven by a cord.
   */
  readonly fixed?: 0 | 1;
}

export type Part = LeverPart | GatePart | LatchPart | FlagPart | ActuatorPart;

export interface PortRef {
  readonly part: string;
  readonly port: string;
}

export interface Cord {
  readonly id: string;
  /** A lever or gate id: the capstan output that pulls this cord. */
  readonly driver: string;
  /** Ports it is tied to (a cord with several branches). */
  readonly ports: readonly PortRef[];
  /** Actuators it pulls. */
  readonly actuators: readonly string[];
}

export interface Netlist {
  readonly parts: readonly Part[];
  readonly cords: readonly Cord[];
}

/** Parts by id. */
export function partIndex(n: Netlist): Map<string, Part> {
  return new Map(n.parts.map((p) => [p.id, p]));
}
