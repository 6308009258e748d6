/**
 * The options of the encode phase (index.ts `encode`), which every strategy run takes
 * (registry.ts) and the automatic search reads (auto.ts).
 */
import type { SourceLoc } from '../../model/machine.js';
import type { Progress } from './cost.js';
import type { SketchWeights } from './sketch.js';

export interface EncodeOptions {
  /** Codes pinned by the user, by state name (some or all); honoured by every strategy where possible, required by 'pinned'. */
  readonly pinned?: Readonly<Record<string, string>>;
  /** Where each pinned code was written, by state name, for diagnostics. */
  readonly pinnedAt?: Readonly<Record<string, SourceLoc>>;
  /** Cost of a candidate encoding (the finished build's weighted part count); used by 'auto', which falls back to `adjacencyCost` without it. */
  readonly cost?: (codes: readonly string[], bits: number) => number;
  /**
   * Screen candidates with the sketch (sketch.ts) in these weights, and price only the best
   * few by `cost`; without it, 'auto' prices every candidate by `cost`.
   */
  readonly sketch?: SketchWeights;
  /** Seed of the automatic search's generator (default 1). */
  readonly seed?: number;
  /** Bounds of the automatic search: cost evaluations and/or milliseconds on `now` (default DEFAULT_SEARCH, or SKETCH_SEARCH with a sketch). */
  readonly budget?: { readonly evaluations?: number; readonly millis?: number };
  /** Clock in milliseconds for `budget.millis` (the core reads no clock of its own). */
  readonly now?: () => number;
  /** Called after every evaluation (of the sketch or the cost) of the automatic search. */
  readonly onProgress?: (p: Progress) => void;
  /** What `cost` kept of pricing some codes ('auto'; see TaskContext.kept); the winner's comes back as `kept`. */
  readonly kept?: (codes: readonly string[], bits: number) => unknown;
}
