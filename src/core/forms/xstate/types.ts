/**
 * Shared types of the xstate interop: the parts of an xstate v5 configuration that we write,
 * and the intermediate, already-checked reading of a flat configuration that the importer
 * turns into a Machine.
 */
import type { OutBit } from '../../model/machine.js';

/** The one event type of the clock form: one event per clock, carrying every input. */
export const CLOCK_EVENT = 'CLOCK';
/** The name of the single guard implementation of the clock form. */
export const HOLDS_GUARD = 'holds';

/** Which export form a config is written in (see docs/xstate.md). */
export type XstateForm = 'levers' | 'clock';

/** A guard reference of the clock form: the cover (cubes over the inputs, in input order) that must hold. */
export interface XstateGuardRef {
  readonly type: typeof HOLDS_GUARD;
  readonly params: { readonly cubes: readonly string[] };
}

export interface XstateTransitionConfig {
  /** Absent: stay in the state (a targetless transition). */
  readonly target?: string;
  readonly guard?: XstateGuardRef;
  readonly description?: string;
  readonly meta: { readonly outputs: Readonly<Record<string, OutBit>> };
}

export interface XstateStateConfig {
  /** A state marked final that answers to nothing (the machine stays until reset). */
  readonly type?: 'final';
  /** Moore outputs: every declared output, the values while no transition is taken. */
  readonly meta: { readonly outputs: Readonly<Record<string, OutBit>> };
  readonly on?: Readonly<Record<string, XstateTransitionConfig | readonly XstateTransitionConfig[]>>;
}

export interface XstateConfig {
  readonly id: string;
  readonly initial: string;
  readonly description?: string;
  /** What the reader needs to drive the machine: the form, the input order of the cubes, the outputs. */
  readonly meta: {
    readonly form: XstateForm;
    readonly inputs: readonly string[];
    readonly outputNames: readonly string[];
    /** The loads the outputs lift, grams (the JSON form's `loadsG`); absent when every output is a flag. */
    readonly loadsG?: Readonly<Record<string, number>>;
  };
  readonly states: Readonly<Record<string, XstateStateConfig>>;
}

/** The event of the clock form: 1 (or true) is a pulled lever; a missing input counts as released. */
export interface ClockEvent {
  readonly type: typeof CLOCK_EVENT;
  readonly inputs: Readonly<Record<string, 0 | 1 | boolean>>;
}

/** A guard implementation as xstate calls it: `(args, params) → boolean`. */
export type XstateGuardFn = (args: { readonly event: unknown }, params: unknown) => boolean;

// ----- the importer's intermediate reading (checked shapes, targets not yet resolved) -----

/** One transition candidate as written: its target text (undefined: targetless) and Mealy outputs. */
export interface RawTransition {
  readonly target?: string;
  readonly outputs: ReadonlyMap<string, OutBit>;
  /** JSON path of the candidate, and of its target text. */
  readonly path: string;
  readonly targetPath: string;
}

/** One state as written. */
export interface RawState {
  readonly name: string;
  readonly path: string;
  /** Its xstate id: the custom `id`, or `<machine id>.<name>`. */
  readonly id: string;
  readonly final: boolean;
  readonly tags: readonly string[];
  /** `meta.outputs` as written. */
  readonly outputs: ReadonlyMap<string, OutBit>;
  /** Event type → candidates, in the order of `on`. */
  readonly on: ReadonlyMap<string, readonly RawTransition[]>;
}

/** A whole flat configuration as written. */
export interface RawConfig {
  /** The xstate machine id (`id`, or xstate's default `(machine)`), for `#id` targets. */
  readonly rootId: string;
  readonly name: string;
  readonly description?: string;
  readonly initial?: string;
  readonly states: readonly RawState[];
  readonly rootOn: ReadonlyMap<string, readonly RawTransition[]>;
  readonly rootTags: readonly string[];
  /** The root's `meta.loadsG`: grams each loaded output lifts. */
  readonly loadsG?: ReadonlyMap<string, number>;
}
