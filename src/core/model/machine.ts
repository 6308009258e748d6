/**
 * The canonical machine model. Both the text form and the JSON form (and the xstate import)
 * produce exactly this, with defaults filled in; nothing downstream reads raw text or JSON.
 */
import type { Cube } from './cube.js';

/** An output value: 0, 1 or don't-care. */
export type OutBit = 0 | 1 | '-';

/** Where something came from: a text position and/or a JSON path. */
export interface SourceLoc {
  readonly file?: string;
  /** 1-based line and column in the text form. */
  readonly line?: number;
  readonly column?: number;
  /** JSON path such as `$.states[2].transitions[0].when`. */
  readonly path?: string;
}

/** Guard expression tree; `!` binds tighter than `&`, then `^`, then `|`. */
export type Expr =
  | { readonly kind: 'const'; readonly value: 0 | 1 }
  | { readonly kind: 'input'; readonly name: string; readonly index: number }
  | { readonly kind: 'not'; readonly arg: Expr }
  | { readonly kind: 'and' | 'or' | 'xor'; readonly args: readonly Expr[] };

/** A guard: its source text, its tree, and its cover (cubes over the machine's inputs). */
export interface Guard {
  readonly text: string;
  readonly expr: Expr;
  /** Sum of products over the inputs, in input order; [] is never, ['--…'] is always. */
  readonly cubes: readonly Cube[];
  readonly loc?: SourceLoc;
}

export interface Transition {
  /** Absent `when` in the source: the guard is the constant 1 (text '1'). */
  readonly when: Guard;
  readonly to: string;
  /** Mealy outputs: overrides of the state's outputs while this transition is taken. */
  readonly outputs: Readonly<Record<string, OutBit>>;
  readonly loc?: SourceLoc;
  /** Where parts were written, by key ('to', 'code', 'start', 'input:0', 'out:bell' …), when the form knows. */
  readonly partLocs?: Readonly<Record<string, SourceLoc>>;
}

export interface State {
  readonly name: string;
  /** Moore outputs as written on the state. */
  readonly outputs: Readonly<Record<string, OutBit>>;
  /** Tried in order; the first whose guard holds fires. */
  readonly transitions: readonly Transition[];
  /** A state code pinned by the user ('0'/'1' string, most significant bit first). */
  readonly code?: string;
  /**
   * Marked final: the machine is meant to stay here until the reset lever is pulled, so a state
   * with no way out is intended (no LW306 warning, no LW302 note).
   */
  readonly final?: boolean;
  readonly loc?: SourceLoc;
  /** Where parts were written, by key ('to', 'code', 'start', 'input:0', 'out:bell' …), when the form knows. */
  readonly partLocs?: Readonly<Record<string, SourceLoc>>;
}

export type Unspecified = 'hold' | 'dont-care';

export interface Machine {
  readonly name: string;
  readonly inputs: readonly string[];
  readonly outputs: readonly string[];
  readonly start: string;
  readonly unspecified: Unspecified;
  /** Input combinations that cannot occur. */
  readonly never: readonly Guard[];
  readonly states: readonly State[];
  /**
   * External loads the outputs lift, grams, by output name: an output named here is an actuator
   * (a capstan output pulling that load), every other output a flag. Absent: every output a flag.
   */
  readonly loadsG?: Readonly<Record<string, number>>;
  /** Free text carried from the source (the header comment of a text file). */
  readonly description?: string;
  readonly loc?: SourceLoc;
  /** Where parts were written, by key ('to', 'code', 'start', 'input:0', 'out:bell', 'load:bell' …), when the form knows. */
  readonly partLocs?: Readonly<Record<string, SourceLoc>>;
}

/** The outputs while `t` is taken from `s`: the state's, overridden by the transition's; unnamed → 0. */
export function transitionOutputs(m: Machine, s: State, t: Transition | null): OutBit[] {
  return m.outputs.map((o) => t?.outputs[o] ?? s.outputs[o] ?? 0);
}

/** Index of each state by name. */
export function stateIndex(m: Machine): Map<string, number> {
  return new Map(m.states.map((s, i) => [s.name, i]));
}
