/**
 * The interface of the two-level minimiser (multi-output sum of products).
 * Variables are positions in a cube string; functions are numbered 0..outputs-1.
 */
import type { Cube } from '../../model/cube.js';

/** A multi-output, incompletely specified function given by on-set and don't-care covers. */
export interface MultiFunction {
  /** Number of variables (length of every cube). */
  readonly vars: number;
  /** Per function: cubes where it must be 1. */
  readonly on: readonly (readonly Cube[])[];
  /** Per function: cubes where it may be either (may overlap `on`; the rest is off). */
  readonly dc: readonly (readonly Cube[])[];
}

/** One product term, feeding the functions listed in `outputs`. */
export interface Term {
  readonly cube: Cube;
  readonly outputs: readonly number[];
}

export interface SopCover {
  readonly vars: number;
  readonly functions: number;
  readonly terms: readonly Term[];
}

/** How a cover is priced: one term gate, one cord per literal, one branch per output fed. */
export interface CoverCost {
  readonly term: number;
  readonly literal: number;
  readonly connection: number;
}

export type MinimiserMethod = 'auto' | 'exact' | 'heuristic';

export interface MinimiseOptions {
  readonly method?: MinimiserMethod;
  readonly cost?: CoverCost;
  /** Share product terms across functions (default true). */
  readonly share?: boolean;
}
