/**
 * The encodings registry: every named encoding strategy, once, with everything a shell needs —
 * the name given to `--encoding` and stored in a build, a label and a short label for the
 * designer, the figures the docs table shows (docs/methods/encode.md is generated from it) —
 * and, beside it, how to run each one. The phase (`encode`), the CLI usage, the designer's
 * code book and the docs all read this file, so adding an encoding is one strategy module
 * plus one entry in ENCODING_REGISTRY and one line in ENCODING_RUNS (the compiler asks for it).
 *
 * The entries are plain data and the runs a separate table so that the designer's page, which
 * lists the encodings but never runs one, does not bundle the strategies (its worker does).
 *
 * Order: the order the tool offers them, `auto` last (it prices the others' codes first).
 */
import type { Diagnostic } from '../../model/diagnostics.js';
import type { Encoding } from '../../model/build.js';
import type { FlatMachine } from '../../model/flat.js';
import { autoSearch, runPlan, searchContext, type AutoReport } from './auto.js';
import { binary } from './binary.js';
import { gray } from './gray.js';
import type { EncodeOptions } from './options.js';
import { johnson } from './johnson.js';
import { oneHot } from './one-hot.js';
import { pinnedStrategy, type PinSet } from './pinned.js';

/** What the encode phase gives: the codes (absent when it refused), why not, and how the search went. */
export interface EncodeResult {
  readonly encoding?: Encoding;
  readonly diagnostics: Diagnostic[];
  /** How the automatic search went (strategy 'auto' only). */
  readonly search?: AutoReport;
  /** What the cost kept of pricing the chosen codes (strategy 'auto' with `kept`, when a price task priced them). */
  readonly kept?: unknown;
}

/** One entry of the encodings registry (plain data; its run is ENCODING_RUNS[name]). */
export interface EncodingEntry {
  /** The name on the command line (`--encoding NAME`), in JSON and in a build's `encoding.strategy`. */
  readonly name: string;
  /** What the codes are, in a few words (the designer's picker, and the docs). */
  readonly label: string;
  /** One word or two, for a table column. */
  readonly short: string;
  /** Bits for n states (the docs table). */
  readonly bits: string;
  /** How the codes are handed out (the docs table). */
  readonly codes: string;
  /** True when it works only from codes pinned in the machine: not offered as a free choice. */
  readonly needsPins: boolean;
}

/** How an encoding runs: codes for the states of `f`; the pins have passed their checks already. */
export type EncodingRun = (f: FlatMachine, pins: PinSet, opts: EncodeOptions) => EncodeResult;

/** Every named encoding, in the order the tool offers them. */
export const ENCODING_REGISTRY = [
  {
    name: 'binary',
    label: 'counting order',
    short: 'counting',
    bits: '⌈log₂ n⌉',
    codes: 'counting order; the start state gets 0…0',
    needsPins: false,
  },
  {
    name: 'gray',
    label: 'one bit per step (Gray)',
    short: 'Gray',
    bits: '⌈log₂ n⌉',
    codes: 'reflected Gray code along a walk from the start state',
    needsPins: false,
  },
  {
    name: 'johnson',
    label: 'twisted ring (Johnson)',
    short: 'Johnson',
    bits: '⌈n/2⌉',
    codes: 'twisted-ring counter codes along the same walk',
    needsPins: false,
  },
  {
    name: 'one-hot',
    label: 'one latch per state',
    short: 'one-hot',
    bits: 'n',
    codes: 'a single 1; the start state has it in bit 0',
    needsPins: false,
  },
  {
    name: 'pinned',
    label: 'pinned in the text',
    short: 'pinned',
    bits: 'as pinned',
    codes: 'every code from the user',
    needsPins: true,
  },
  {
    name: 'auto',
    label: 'searched for fewest parts',
    short: 'searched',
    bits: 'searched',
    codes: 'the codes that make the cheapest build',
    needsPins: false,
  },
] as const satisfies readonly EncodingEntry[];

/** The name of a registered encoding. */
export type EncodeStrategy = (typeof ENCODING_REGISTRY)[number]['name'];

/** How each registered encoding runs, by name. */
export const ENCODING_RUNS: { readonly [N in EncodeStrategy]: EncodingRun } = {
  binary: (f, pins) => binary(f, pins),
  gray: (f, pins) => gray(f, pins),
  johnson: (f, pins) => johnson(f, pins),
  'one-hot': (f, pins) => oneHot(f, pins),
  pinned: (f, pins) => pinnedStrategy(f, pins),
  auto: runAuto,
};

/** The encoding a build uses when none is named. */
export const DEFAULT_ENCODING: EncodeStrategy = 'auto';

/** The registry entry of a name, if it names one. */
export function encodingEntry(name: string): (typeof ENCODING_REGISTRY)[number] | undefined {
  return ENCODING_REGISTRY.find((e) => e.name === name);
}

/** The automatic search, bounded by the options' evaluation budget and (with a clock) time budget. */
function runAuto(f: FlatMachine, pins: PinSet, opts: EncodeOptions): EncodeResult {
  const search = autoSearch(f, pins, opts);
  const r = runPlan(search, searchContext(f, opts));
  return {
    ...(r.encoding ? { encoding: r.encoding } : {}),
    diagnostics: r.diagnostics,
    ...(r.report ? { search: r.report } : {}),
    ...(r.kept !== undefined ? { kept: r.kept } : {}),
  };
}
