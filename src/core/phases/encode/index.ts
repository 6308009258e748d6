/**
 * Encode phase: give every state of the (minimised) flat machine a distinct binary code.
 *
 * Strategies, by name or as a function: binary (start state 0…0, then FlatMachine order),
 * gray (reflected Gray code along a greedy traversal from the start), johnson (twisted-ring
 * counter codes along the same traversal), one-hot, pinned (every code from the user) and
 * auto (the assignment that minimises the caller's cost: exhaustive over the classes left by
 * the cube's symmetries — McCluskey & Unger 1959 — for small machines, simulated annealing
 * beyond). Each module names its method and reference; docs/methods/encode.md explains them.
 * The named strategies are listed once, in the encodings registry (registry.ts).
 *
 * Pre: a flat machine (normally the output of state minimisation).
 * Post: n distinct codes of one length, '0'/'1' strings with bit 0 first; codes the user
 * pinned are kept by every strategy that can fit around them. Deterministic: the same
 * machine, options and seed give the same codes (a time budget is the one exception).
 * Never throws on bad input: problems come back as diagnostics (LW206, LW207, LW300,
 * LW700, LW701) and then there is no encoding.
 */
import { diag, didYouMean, hasErrors, type Diagnostic } from '../../model/diagnostics.js';
import type { FlatMachine } from '../../model/flat.js';
import type { Encoding } from '../../model/build.js';
import { AutoSearch, autoSearch, DEFAULT_SEARCH, searchContext, SKETCH_SEARCH, type AutoReport } from './auto.js';
import { adjacencyCost, type Progress } from './cost.js';
import { readPins } from './pinned.js';
import type { EncodeOptions } from './options.js';
import { encodingEntry, ENCODING_REGISTRY, ENCODING_RUNS, type EncodeResult, type EncodeStrategy } from './registry.js';

export type { EncodeOptions, EncodeResult };

/** The strategies known by name, in the order the tool offers them (the names of ENCODING_REGISTRY). */
export const ENCODINGS: readonly EncodeStrategy[] = ENCODING_REGISTRY.map((e) => e.name);

export { AutoSearch, DEFAULT_SEARCH, SKETCH_SEARCH, searchContext, type AutoReport };
export { adjacencyCost, type Progress };
export { runTask, type SearchTask, type TaskContext, type TaskResult } from './search.js';
export { sketchOf, SKETCH_WEIGHTS, type SketchWeights } from './sketch.js';
export {
  DEFAULT_ENCODING,
  encodingEntry,
  ENCODING_REGISTRY,
  ENCODING_RUNS,
  type EncodeStrategy,
  type EncodingEntry,
  type EncodingRun,
} from './registry.js';

/** Assign state codes with a named strategy or a strategy function. */
export function encode(
  f: FlatMachine,
  strategy: EncodeStrategy | ((f: FlatMachine, o: EncodeOptions) => Encoding),
  opts: EncodeOptions = {},
): EncodeResult {
  if (f.states.length === 0)
    return {
      diagnostics: [diag('LW300', `machine '${f.name}' has no states to encode`, {}, 'declare at least one state')],
    };
  const diagnostics = checkOptions(opts);
  const read = readPins(f, opts.pinned, opts.pinnedAt);
  diagnostics.push(...read.diagnostics);
  if (hasErrors(diagnostics)) return { diagnostics };

  if (typeof strategy === 'function') {
    const encoding = strategy(f, opts);
    const problem = malformed(f, encoding);
    if (problem)
      return {
        diagnostics: [
          ...diagnostics,
          diag(
            'LW701',
            `the '${encoding.strategy}' encoding ${problem}`,
            {},
            'fix the strategy function, or choose a named encoding',
          ),
        ],
      };
    return { encoding, diagnostics };
  }
  const entry = encodingEntry(String(strategy));
  if (!entry) {
    const guess = didYouMean(String(strategy), ENCODINGS);
    return {
      diagnostics: [
        ...diagnostics,
        diag(
          'LW700',
          `unknown encoding '${String(strategy)}'${guess ? ` — did you mean '${guess}'?` : ''}`,
          {},
          `choose one of ${ENCODINGS.join(', ')}`,
        ),
      ],
    };
  }
  const r = ENCODING_RUNS[entry.name](f, read.pins, opts);
  return {
    ...(r.encoding ? { encoding: r.encoding } : {}),
    diagnostics: [...diagnostics, ...r.diagnostics],
    ...(r.search ? { search: r.search } : {}),
    ...(r.kept !== undefined ? { kept: r.kept } : {}),
  };
}

/**
 * The automatic search of `encode(f, 'auto', opts)` as a plan whose tasks a shell may run on
 * other threads (AutoSearch: `next()` a batch, run every task with `runTask` in a context from
 * `searchContext`, `accept()` the results in order, until a batch is empty; then `result()`).
 * The answer is the one `encode` gives. Diagnostics as `encode` gives them; no plan on errors.
 */
export function planAuto(f: FlatMachine, opts: EncodeOptions = {}): { search?: AutoSearch; diagnostics: Diagnostic[] } {
  if (f.states.length === 0)
    return {
      diagnostics: [diag('LW300', `machine '${f.name}' has no states to encode`, {}, 'declare at least one state')],
    };
  const diagnostics = checkOptions(opts);
  const read = readPins(f, opts.pinned, opts.pinnedAt);
  diagnostics.push(...read.diagnostics);
  if (hasErrors(diagnostics)) return { diagnostics };
  return { search: autoSearch(f, read.pins, opts), diagnostics };
}

function checkOptions(o: EncodeOptions): Diagnostic[] {
  const out: Diagnostic[] = [];
  if (o.seed !== undefined && !(Number.isSafeInteger(o.seed) && o.seed >= 0)) {
    out.push(diag('LW700', `seed ${String(o.seed)} is not a whole number ≥ 0`, {}, 'give a seed such as 1 or 42'));
  }
  const e = o.budget?.evaluations;
  if (e !== undefined && !(Number.isSafeInteger(e) && e >= 1)) {
    out.push(
      diag(
        'LW700',
        `evaluation budget ${String(e)} is not a whole number ≥ 1`,
        {},
        `without one, the search prices every class up to ${DEFAULT_SEARCH.exhaustiveClasses}, else anneals for ${DEFAULT_SEARCH.annealingEvaluations} evaluations`,
      ),
    );
  }
  const ms = o.budget?.millis;
  if (ms !== undefined && !(Number.isFinite(ms) && ms >= 0)) {
    out.push(diag('LW700', `time budget ${String(ms)} ms is not a number ≥ 0`, {}, 'give milliseconds, e.g. 4000'));
  } else if (ms !== undefined && !o.now) {
    out.push(
      diag(
        'LW700',
        'a time budget was given without a clock; it is ignored and the evaluation budget bounds the search',
        {},
        'pass `now` with `budget.millis`',
        'warning',
      ),
    );
  }
  return out;
}

/** What is wrong with an encoding from a strategy function, if anything. */
function malformed(f: FlatMachine, e: Encoding): string | undefined {
  // A strategy function is the caller's code: its result is checked, not trusted. (The codes are
  // tested through an unknown, so that Array.isArray does not widen e.codes to any[].)
  const codes: unknown = e ? e.codes : undefined;
  if (!e || !Array.isArray(codes) || !Number.isSafeInteger(e.bits) || e.bits < 0)
    return 'is not an encoding (strategy, bits, codes)';
  if (e.codes.length !== f.states.length) return `gives ${e.codes.length} codes for ${f.states.length} states`;
  const seen = new Map<string, number>();
  for (let s = 0; s < e.codes.length; s++) {
    const c: unknown = e.codes[s];
    if (typeof c !== 'string' || c.length !== e.bits || !/^[01]*$/.test(c))
      return `gives state '${f.states[s]}' the code '${String(c)}', not ${e.bits} binary digits`;
    const other = seen.get(c);
    if (other !== undefined) return `gives states '${f.states[other]}' and '${f.states[s]}' the same code '${c}'`;
    seen.set(c, s);
  }
  return undefined;
}
