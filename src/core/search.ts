/**
 * The encoding search of a build: the costs it prices candidates by, and the same search as a
 * plan of tasks for a shell that spreads them over threads (the CLI's worker pool, the
 * designer's search worker). Part of the pipeline layer, beside pipeline.ts.
 *
 * - The full cost of a candidate is the weighted part count (the profile's cost weights) of
 *   the build `buildMachine` would make from it, with the cheaper of its two guard methods
 *   left out (the split-by-bit guard only, and no unguarded baseline: two minimisations
 *   instead of five) — including, when unused codes are left free by default, the rebuild
 *   that sends them to the start state if the build could lock up in them.
 * - The sketch (phases/encode/sketch.ts) screens candidates; its weights come from the same
 *   cost weights.
 *
 * A `SearchSetup` is plain data: a worker given it builds the same costs and runs any task of
 * the plan with `searchTaskRunner`; `searchOutcome` turns the finished plan into what
 * `encode` would have returned, which `buildMachine` takes as `searched`. The answer is the
 * same whatever the number of threads (see phases/encode/search.ts). A price hands back the
 * minimisations it made (`searchPricing`); the outcome carries the chosen codes' as `kept`, and
 * `buildMachine` seeds its synthesis memo with them instead of minimising those functions again.
 */
import type { Diagnostic } from './model/diagnostics.js';
import type { Encoding } from './model/build.js';
import type { Build } from './model/build.js';
import type { FlatMachine } from './model/flat.js';
import type { SourceLoc } from './model/machine.js';
import {
  planAuto,
  runTask,
  searchContext,
  type AutoSearch,
  type EncodeOptions,
  type EncodeResult,
  type SearchTask,
  type SketchWeights,
  type TaskResult,
} from './phases/encode/index.js';
import { partsCost } from './phases/map/index.js';
import type { Profile } from './physics/profile.js';
import { availableTension, routingFactor } from './physics/capstan.js';
import { checkRecovery } from './checks/recovery.js';
import {
  balanced,
  keptMinimisations,
  synthesise,
  synthesisMemo,
  type SynthesisMemo,
  type SynthesisOptions,
} from './synthesise.js';
import type { GuardMethod } from './phases/guard.js';

/** Everything the search's costs depend on, as plain data (it can be posted to a worker). */
export interface SearchSetup {
  /** The state-minimised machine. */
  readonly machine: FlatMachine;
  readonly profile: Profile;
  /** Unused codes: free, or sent to this state index. */
  readonly unusedCodes: 'dont-care' | number;
  /** When unused codes are free by default: the build sends them to the start state if it could lock up. */
  readonly recover: boolean;
  readonly actuators?: Readonly<Record<string, number>>;
  readonly seed: number;
  readonly pinned?: Readonly<Record<string, string>>;
  readonly pinnedAt?: Readonly<Record<string, SourceLoc>>;
  /** Most full-cost evaluations (the build option `budget.evaluations`). */
  readonly evaluations?: number;
}

/**
 * A stable text key of a setup: its plain data as JSON with every object's keys in sorted
 * order, so two setups that are equal as data (however they were assembled) get the same key
 * and any difference in a field (machine, profile, unused codes, seed, pins, budget) gives
 * another. The search is deterministic for a setup, so a shell may keep outcomes under it.
 */
export function searchSetupKey(s: SearchSetup): string {
  return stableJson(s);
}

function stableJson(v: unknown): string {
  if (Array.isArray(v)) return `[${v.map((x) => (x === undefined ? 'null' : stableJson(x))).join(',')}]`;
  if (typeof v === 'object' && v !== null) {
    const o = v as Record<string, unknown>;
    const fields = Object.keys(o)
      .filter((k) => o[k] !== undefined)
      .sort()
      .map((k) => `${JSON.stringify(k)}:${stableJson(o[k])}`);
    return `{${fields.join(',')}}`;
  }
  // JSON would write Infinity and NaN as null; bare, they differ from every other value.
  if (typeof v === 'number' && !Number.isFinite(v)) return String(v);
  return JSON.stringify(v) ?? 'null';
}

/** What the shell adds on its own thread: the clock for a time budget, and progress. */
export type SearchExtras = Pick<EncodeOptions, 'now' | 'onProgress'> & { readonly millis?: number };

/** The mapper splits no cord by count: buffer trees come from the force budget (balanced). One function, so a synthesis memo sees one rule. */
const NO_FANOUT_LIMIT = (): boolean => false;

/** The synthesis options of a build under this setup (unused codes as given, or sent to a state). */
export function synthesisOptions(s: SearchSetup, unusedCodes: 'dont-care' | number = s.unusedCodes): SynthesisOptions {
  return { profile: s.profile, unusedCodes, actuators: s.actuators, tooMany: NO_FANOUT_LIMIT };
}

/** Whether a build with free unused codes is rebuilt with them sent to the start state: it has unused codes and could lock up in them. */
export function needsRecovery(b: Build, profile: Profile, seed: number): boolean {
  return b.encoding.codes.length !== 2 ** b.encoding.bits && !checkRecovery(b, profile, { seed }).ok;
}

/**
 * The build a candidate ends as when unused codes are free by default: `first` (guard method
 * chosen by price) when it cannot lock up; else the split-by-bit guard's build if that one
 * cannot (its global don't-cares leave the next state free, where set-first holds bits); else
 * the build with unused codes sent to the start state. `make(unused, guard)` builds the others.
 */
export function recovered(
  first: Build,
  s: SearchSetup,
  make: (unused: 'dont-care' | number, guard?: GuardMethod) => Build,
): { build: Build; toStart: boolean } {
  if (!s.recover || !needsRecovery(first, s.profile, s.seed)) return { build: first, toStart: false };
  if (first.guard.method !== 'split-by-bit') {
    const split = make(s.unusedCodes, 'split-by-bit');
    if (!needsRecovery(split, s.profile, s.seed)) return { build: split, toStart: false };
  }
  return { build: make(s.machine.start), toStart: true };
}

/** The full cost of a candidate encoding (see the module comment). */
export function searchCost(s: SearchSetup): (codes: readonly string[], bits: number) => number {
  return searchPricing(s).cost;
}

/**
 * The full cost, and what it kept of the codes it priced last: the minimisations of their
 * syntheses (one memo per candidate, so its two syntheses share the output cover), as plain
 * data. The search hands the chosen codes' back (`EncodeResult.kept`), and the build seeds its
 * own memo with them (`synthesisMemo`), so it does not minimise those functions again.
 */
export function searchPricing(s: SearchSetup): {
  cost: (codes: readonly string[], bits: number) => number;
  kept: (codes: readonly string[]) => unknown;
} {
  let last: { codes: readonly string[]; memo: SynthesisMemo } | undefined;
  const price = (enc: Encoding, unused: 'dont-care' | number, memo: SynthesisMemo): Build =>
    balanced(
      synthesise(s.machine, enc, { ...synthesisOptions(s, unused), guard: 'split-by-bit', guardBaseline: false, memo }),
      s.profile,
      memo,
    );
  const cost = (codes: readonly string[], bits: number): number => {
    const enc: Encoding = { strategy: 'candidate', bits, codes };
    const memo = synthesisMemo();
    last = { codes, memo };
    let b = price(enc, s.unusedCodes, memo);
    if (s.recover && needsRecovery(b, s.profile, s.seed)) b = price(enc, s.machine.start, memo);
    return partsCost(b.parts, s.profile.cost);
  };
  const kept = (codes: readonly string[]): unknown =>
    last && last.codes === codes ? keptMinimisations(last.memo) : undefined;
  return { cost, kept };
}

/**
 * The sketch's weights in the profile's cost units: a term is a gate and its capstan; a literal
 * or a connection one cord; a buffer pair two one-port gates with their capstans, weights and
 * cords; a driver carries as many branches as its capstan lifts with the design margin, each
 * one port and its summing lever (physics/drive.ts).
 */
export function sketchWeights(profile: Profile): SketchWeights {
  const w = profile.cost;
  const branch = (profile.portWeightG + profile.zWeightG) * routingFactor(profile.routing);
  const fanout = Math.max(2, Math.floor(availableTension(profile).availableG / profile.minMargin / branch));
  return {
    term: w.gate + w.capstan,
    literal: w.cord,
    connection: w.cord,
    fanout,
    buffer: 2 * (w.gate + w.capstan + w.weight + w.cord),
  };
}

/** The encode phase's options for this setup: its costs, pins, seed and budget, and the shell's extras. */
export function searchOptions(s: SearchSetup, extras: SearchExtras = {}): EncodeOptions {
  const budget = {
    ...(s.evaluations !== undefined ? { evaluations: s.evaluations } : {}),
    ...(extras.millis !== undefined ? { millis: extras.millis } : {}),
  };
  return {
    ...(s.pinned ? { pinned: s.pinned } : {}),
    ...(s.pinnedAt ? { pinnedAt: s.pinnedAt } : {}),
    seed: s.seed,
    ...(Object.keys(budget).length > 0 ? { budget } : {}),
    ...(extras.now ? { now: extras.now } : {}),
    ...(extras.onProgress ? { onProgress: extras.onProgress } : {}),
    ...searchPricing(s),
    sketch: sketchWeights(s.profile),
  };
}

/** The plan of the automatic search of a setup, with the diagnostics `encode` would give (no plan on errors). */
export function planSearch(
  s: SearchSetup,
  extras: SearchExtras = {},
): { plan?: AutoSearch; diagnostics: Diagnostic[] } {
  const r = planAuto(s.machine, searchOptions(s, extras));
  return { ...(r.search ? { plan: r.search } : {}), diagnostics: r.diagnostics };
}

/** A worker's side: runs any task of the plan of this setup (the costs are built once). */
export function searchTaskRunner(
  s: SearchSetup,
  now?: () => number,
): (task: SearchTask, tick?: (full: boolean, value: number) => void) => TaskResult {
  const ctx = searchContext(s.machine, searchOptions(s, now ? { now } : {}));
  return (task, tick) => runTask(ctx, task, tick);
}

/** What `encode` returns, from a finished plan and the diagnostics of planning it. */
export function searchOutcome(plan: AutoSearch, diagnostics: readonly Diagnostic[]): EncodeResult {
  const r = plan.result();
  return {
    ...(r.encoding ? { encoding: r.encoding } : {}),
    diagnostics: [...diagnostics, ...r.diagnostics],
    ...(r.report ? { search: r.report } : {}),
    ...(r.kept !== undefined ? { kept: r.kept } : {}),
  };
}
