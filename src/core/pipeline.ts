/**
 * The pipeline: the one place that lists the phases, in order. Reading this file tells a
 * newcomer how the product works; each phase is a pure function in src/core/phases/ with its
 * own output type and a contract comment naming its method.
 *
 *   parse → validate → minimise states → encode → excite → guard → minimise logic → map
 *         → size actuators → balance drive → place (and route; balance again with the routed
 *         losses) → check
 *
 * The loads the machine gives its outputs (`loadsG`, and any `actuators` option over them) make
 * those outputs actuators. A profile's `cordRouting` is checked against the cords of the build
 * once it is made (LW603: an entry naming no cord would be ignored).
 *
 * `onPhase` (optional) is told how long each phase took; the benchmarks use it.
 */
import { DiagnosticError, diag, didYouMean, hasErrors, type Diagnostic } from './model/diagnostics.js';
import type { Machine, SourceLoc } from './model/machine.js';
import { nameRecord, ownValue } from './model/records.js';
import { BUILD_LIMITS } from './model/limits.js';
import type { Build, Encoding } from './model/build.js';
import {
  DEFAULT_ENCODING,
  encode,
  ENCODINGS,
  type EncodeOptions,
  type EncodeResult,
  type EncodeStrategy,
} from './phases/encode/index.js';
import { balanced, synthesise, synthesisMemo } from './synthesise.js';
import { countParts, partsCost } from './phases/map/index.js';
import { DEFAULT_PROFILE, type Profile } from './physics/profile.js';
import { cordRoutingDiagnostics } from './physics/profile-load.js';
import { lossByBranch } from './physics/routing.js';
import { balanceDrive } from './physics/buffer-tree.js';
import { pinDiagnostics, place, type Pin, type Placement, type PlaceOptions } from './phases/place/index.js';
import { CHECKS, type CheckInput, type CheckResult } from './checks/registry.js';
import { planSearch, recovered, searchOptions, synthesisOptions, type SearchSetup } from './search.js';
import type { AutoSearch, Progress } from './phases/encode/index.js';
import type { GuardMethod } from './phases/guard.js';
import type { FlatMachine } from './model/flat.js';
import { readMachine, type MachineForm } from './forms/detect.js';
import { validate } from './phases/validate.js';
import { minimiseStates, type StateMinimisation } from './phases/minimise-states/index.js';

export type PhaseHook = (phase: string, millis: number) => void;

export interface AnalyseOptions {
  readonly onPhase?: PhaseHook;
  /** Told when a phase starts (a shell's progress line). */
  readonly onPhaseStart?: (phase: string) => void;
  /** A clock for the phase hook (the core itself never reads the time). */
  readonly now?: () => number;
}

/** A machine that parsed and validated, with its minimised form. */
export interface Analysed {
  readonly ok: true;
  readonly form: MachineForm;
  readonly machine: Machine;
  readonly flat: FlatMachine;
  readonly minimised: StateMinimisation;
  readonly diagnostics: readonly Diagnostic[];
}

/** A machine that did not get through parse and validate. */
export interface Rejected {
  readonly ok: false;
  readonly form: MachineForm;
  readonly diagnostics: readonly Diagnostic[];
}

export function timed<T>(opts: AnalyseOptions, phase: string, run: () => T): T {
  opts.onPhaseStart?.(phase);
  if (!opts.onPhase || !opts.now) return run();
  const t0 = opts.now();
  const out = run();
  opts.onPhase(phase, opts.now() - t0);
  return out;
}

/** parse → validate → minimise states. */
export function analyse(text: string, file?: string, opts: AnalyseOptions = {}): Analysed | Rejected {
  const parsed = timed(opts, 'parse', () => readMachine(text, file));
  if (!parsed.machine || hasErrors(parsed.diagnostics))
    return { ok: false, form: parsed.form, diagnostics: parsed.diagnostics };
  const machine = parsed.machine;
  const valid = timed(opts, 'validate', () => validate(machine));
  const diagnostics = [...parsed.diagnostics, ...valid.diagnostics];
  if (!valid.flat || hasErrors(diagnostics)) return { ok: false, form: parsed.form, diagnostics };
  const flat = valid.flat;
  const minimised = timed(opts, 'minimise-states', () => minimiseStates(flat));
  return { ok: true, form: parsed.form, machine, flat, minimised, diagnostics };
}

/**
 * What a build uses when its caller says nothing: the one set of defaults of every shell (the
 * CLI's options and the designer's settings both start from here, so one file builds the
 * same machine in both). `unusedCodes` is absent on purpose: left out, unused codes are
 * don't-cares unless that lets the build lock up, and then they go to the start state.
 */
export const BUILD_DEFAULTS: {
  readonly encoding: EncodeStrategy;
  readonly seed: number;
  readonly profile: Profile;
} = { encoding: DEFAULT_ENCODING, seed: 1, profile: DEFAULT_PROFILE };

export interface BuildOptions extends AnalyseOptions {
  /** A named encoding or a strategy function (default BUILD_DEFAULTS.encoding, the searched codes). */
  readonly encoding?: EncodeStrategy | ((f: FlatMachine, o: EncodeOptions) => Encoding);
  /** The technology profile (default BUILD_DEFAULTS.profile). */
  readonly profile?: Profile;
  /** Seed of every seeded step: the encoding search and the checks (default BUILD_DEFAULTS.seed). */
  readonly seed?: number;
  /**
   * Unused state codes: 'dont-care', or the name of a state every unused code is sent to.
   * Default: don't-care, unless that lets the build lock up in unused codes; then the start state.
   */
  readonly unusedCodes?: string;
  /** Outputs shown by an actuator: output name → load in grams, over the machine's own `loadsG`. */
  readonly actuators?: Readonly<Record<string, number>>;
  readonly budget?: EncodeOptions['budget'];
  readonly onProgress?: EncodeOptions['onProgress'];
  /**
   * The outcome of this build's automatic search, already run elsewhere (a shell that spreads
   * it over threads: search.ts); used instead of searching again when the encoding is 'auto'.
   */
  readonly searched?: EncodeResult;
  /** Run the checks (default true); a comparison of encodings skips them. */
  readonly checks?: boolean;
  /** Parts pinned to a bay along the drum, by part id (a latch id pins its set side; its reset side takes the next bay). */
  readonly pins?: Readonly<Record<string, Pin>>;
  /**
   * How hard the place phase works (default: PlaceOptions' defaults). Less effort gives a
   * rougher arrangement sooner: a shell's draft build while the final one is still coming.
   */
  readonly placeEffort?: Pick<PlaceOptions, 'exactLimit' | 'improve'>;
}

/** A machine that was built, with every check's result. */
export interface Built {
  readonly ok: true;
  readonly analysed: Analysed;
  readonly build: Build;
  readonly search?: EncodeResult['search'];
  /** Where every part sits in the frame and how every cord runs (phases/place). */
  readonly placement: Placement;
  readonly checks: readonly CheckResult[];
  readonly profile: Profile;
  readonly diagnostics: readonly Diagnostic[];
}

/** encode → synthesise (excite → guard → minimise logic → map) → balance drive → place → check. */
export function buildMachine(a: Analysed, opts: BuildOptions = {}): Built | Rejected {
  const profile = opts.profile ?? BUILD_DEFAULTS.profile;
  const seed = opts.seed ?? BUILD_DEFAULTS.seed;
  const f = a.minimised.machine;
  const setup = buildSearchSetup(a, opts);
  if (!('machine' in setup)) return { ok: false, form: a.form, diagnostics: [...a.diagnostics, setup] };
  const strategy = opts.encoding ?? BUILD_DEFAULTS.encoding;
  try {
    const encoded =
      opts.searched && strategy === 'auto'
        ? opts.searched
        : timed(opts, 'encode', () =>
            encode(
              f,
              strategy,
              searchOptions(setup, { now: opts.now, onProgress: opts.onProgress, millis: opts.budget?.millis }),
            ),
          );
    const diagnostics = [...a.diagnostics, ...encoded.diagnostics];
    if (!encoded.encoding || hasErrors(diagnostics)) return { ok: false, form: a.form, diagnostics };
    const encoding = encoded.encoding;
    const { build, toStart } = synthesised(f, encoding, setup, profile, opts, encoded.kept);
    if (toStart)
      diagnostics.push(
        diag(
          'LW703',
          `unused codes left free could lock ${f.name} up, so they are sent to the start state '${f.states[f.start]}'`,
          {},
        ),
      );
    const routes = cordRoutingDiagnostics(profile, build.netlist);
    if (routes.length > 0) return { ok: false, form: a.form, diagnostics: [...diagnostics, ...routes] };
    const placed = timed(opts, 'place', () =>
      placeWithDrive(build, profile, { ...opts.placeEffort, seed, pins: opts.pins ?? {} }),
    );
    diagnostics.push(...pinDiagnostics(placed.placement.problems));
    if (hasErrors(diagnostics)) return { ok: false, form: a.form, diagnostics };
    const { placement } = placed;
    const checks =
      opts.checks === false ? [] : timed(opts, 'check', () => runChecks(placed.build, a, profile, seed, placement));
    return {
      ok: true,
      analysed: a,
      build: placed.build,
      search: encoded.search,
      placement,
      checks,
      profile,
      diagnostics,
    };
  } catch (e) {
    if (e instanceof DiagnosticError)
      return { ok: false, form: a.form, diagnostics: [...a.diagnostics, ...e.diagnostics] };
    throw e;
  }
}

/**
 * The build of these codes: synthesise → balance drive, and when unused codes are free by
 * default and the build could lock up in them, again with the split-by-bit guard or with
 * unused codes sent to the start state (`recovered`). The syntheses share one memo
 * (synthesise.ts), seeded with the minimisations the search made pricing these codes
 * (`kept`, when it priced them; search.ts `searchPricing`). The guard's cost against an
 * unguarded minimisation (`GuardReport`) is measured only for the build that is kept: the
 * others are made without it (it changes nothing but the report) and the kept one made again
 * with it, its covers and mappings from the memo. The result is the build the steps would
 * give one by one.
 */
function synthesised(
  f: FlatMachine,
  encoding: Encoding,
  setup: SearchSetup,
  profile: Profile,
  opts: AnalyseOptions,
  kept: unknown,
): { build: Build; toStart: boolean } {
  const memo = synthesisMemo(kept);
  const make = (unused: 'dont-care' | number, guard: GuardMethod | undefined, guardBaseline: boolean): Build =>
    balanced(
      synthesise(f, encoding, { ...synthesisOptions(setup, unused), ...(guard ? { guard } : {}), guardBaseline, memo }),
      profile,
      memo,
    );
  const how = new Map<Build, { unused: 'dont-care' | number; guard?: GuardMethod }>();
  const draft = (unused: 'dont-care' | number, guard?: GuardMethod): Build => {
    const b = make(unused, guard, false);
    how.set(b, { unused, ...(guard ? { guard } : {}) });
    return b;
  };
  return timed(opts, 'synthesise', () => {
    const chosen = recovered(draft(setup.unusedCodes), setup, draft);
    const made = how.get(chosen.build) ?? { unused: setup.unusedCodes };
    return { build: make(made.unused, made.guard, true), toStart: chosen.toStart };
  });
}

/**
 * What the encoding search of this build depends on, as plain data (search.ts): a shell that
 * runs the search on several threads plans it from this and passes the outcome back to
 * `buildMachine` as `searched`. A bad unused-code target, or a machine past the size a build
 * takes (LW407, refused before any work), comes back as its diagnostic.
 */
export function buildSearchSetup(a: Analysed, opts: BuildOptions = {}): SearchSetup | Diagnostic {
  const n = a.minimised.machine.states.length;
  if (n > BUILD_LIMITS.states)
    return diag(
      'LW407',
      `${a.machine.name} has ${n} states after state minimisation; a build takes at most ${BUILD_LIMITS.states}`,
      {},
      'split the machine into smaller ones, or merge states that behave alike',
    );
  const unused = resolveUnused(a, opts.unusedCodes);
  if (typeof unused === 'object') return unused;
  const actuators = { ...a.machine.loadsG, ...opts.actuators };
  return {
    machine: a.minimised.machine,
    profile: opts.profile ?? BUILD_DEFAULTS.profile,
    unusedCodes: unused,
    recover: opts.unusedCodes === undefined,
    ...(Object.keys(actuators).length > 0 ? { actuators } : {}),
    seed: opts.seed ?? BUILD_DEFAULTS.seed,
    ...pinnedCodes(a),
    ...(opts.budget?.evaluations !== undefined ? { evaluations: opts.budget.evaluations } : {}),
  };
}

/**
 * The build's automatic search as a plan a shell can run in pieces (on threads or workers), with
 * the setup it was planned from and the diagnostics of planning; undefined when this build does
 * not search (another encoding, or options the build itself will reject), so the shell builds
 * as usual.
 */
export function planBuildSearch(
  a: Analysed,
  opts: BuildOptions = {},
  onProgress?: (p: Progress) => void,
): { setup: SearchSetup; plan: AutoSearch; diagnostics: Diagnostic[] } | undefined {
  if ((opts.encoding ?? BUILD_DEFAULTS.encoding) !== 'auto') return undefined;
  const setup = buildSearchSetup(a, opts);
  if (!('machine' in setup)) return undefined;
  const { plan, diagnostics } = planSearch(setup, onProgress ? { onProgress } : {});
  return plan ? { setup, plan, diagnostics } : undefined;
}

/** Rounds of placing and balancing again at most: each round only adds buffers, so a few settle it. */
export const PLACE_ROUNDS = 4;

/**
 * Place the build and route its cords; when a routed branch costs more than the budget allowed
 * for, buffer trees are added with the routed losses (balanceDrive) and the build placed again,
 * at most PLACE_ROUNDS times. A budget that still fails is the drive check's to report. (The
 * build was balanced with the losses its routes will have, so this rarely has work to do: a
 * `cordRouting` entry that names a buffer's cord, or a profile changed between the two.)
 */
export function placeWithDrive(
  b: Build,
  profile: Profile,
  opts: PlaceOptions & { readonly seed: number; readonly pins: Readonly<Record<string, Pin>> },
): { build: Build; placement: Placement } {
  let build = b;
  let placement = place(build.netlist, profile, opts);
  for (let round = 0; round < PLACE_ROUNDS; round++) {
    const netlist = balanceDrive(build.netlist, profile, lossByBranch(placement.routing));
    if (netlist === build.netlist) break;
    build = { ...build, netlist, parts: countParts(netlist) };
    placement = place(netlist, profile, opts);
  }
  return { build, placement };
}

/**
 * Every check of the registry (checks/registry.ts), in the order reports show them, all with one
 * seed. `placement`: the build's place in the frame (default: placed here with the same seed).
 */
export function runChecks(
  build: Build,
  a: Analysed,
  profile: Profile,
  seed: number,
  placement: Placement = place(build.netlist, profile, { seed }),
): CheckResult[] {
  const input: CheckInput = {
    build,
    spec: { original: a.flat, merged: a.minimised.merged },
    profile,
    seed,
    placement,
  };
  return CHECKS.map((c) => c.run(input));
}

function resolveUnused(a: Analysed, unused: string | undefined): 'dont-care' | number | Diagnostic {
  if (unused === undefined || unused === 'dont-care') return 'dont-care';
  const target = ownValue(a.minimised.merged, unused);
  const index = target === undefined ? -1 : a.minimised.machine.states.indexOf(target);
  if (index >= 0) return index;
  const reachable = a.machine.states.map((s) => s.name).filter((n) => ownValue(a.minimised.merged, n) !== undefined);
  // A state of the machine that cannot be reached is not in the build: say so, never "did you mean" itself.
  if (a.machine.states.some((s) => s.name === unused))
    return diag(
      'LW700',
      `unused codes are sent to '${unused}', which cannot be reached from the start state, so the build has no such state`,
      { path: '--unused' },
      `name a reachable state (${reachable
        .slice(0, 8)
        .map((n) => `'${n}'`)
        .join(', ')}${reachable.length > 8 ? ', …' : ''}), or 'dont-care'`,
    );
  const guess = didYouMean(unused, reachable);
  return diag(
    'LW700',
    `unused codes are sent to '${unused}', which is not a reachable state`,
    { path: '--unused' },
    guess ? `did you mean '${guess}'?` : "name a reachable state, or 'dont-care'",
  );
}

/** Codes pinned on original states, carried to the states they merged into. */
function pinnedCodes(a: Analysed): Pick<EncodeOptions, 'pinned' | 'pinnedAt'> {
  const pinned = nameRecord<string>();
  const pinnedAt = nameRecord<SourceLoc>();
  for (const s of a.machine.states) {
    const target = ownValue(a.minimised.merged, s.name);
    if (s.code === undefined || target === undefined || ownValue(pinned, target) !== undefined) continue;
    pinned[target] = s.code;
    if (s.loc) pinnedAt[target] = s.loc;
  }
  return Object.keys(pinned).length > 0 ? { pinned, pinnedAt } : {};
}

/** One encoding's line in a comparison. */
export interface EncodingRow {
  readonly strategy: EncodeStrategy;
  readonly ok: boolean;
  readonly encoding?: Encoding;
  readonly parts?: Build['parts'];
  /** Gates that compute set/reset product terms (role 'term'). */
  readonly termGates?: number;
  readonly guard?: Build['guard'];
  readonly cost?: number;
  readonly cheapest: boolean;
  readonly diagnostics: readonly Diagnostic[];
}

/** Every named encoding side by side (encode → synthesise → balance drive, no checks); the cheapest marked. */
export function compareEncodings(a: Analysed, opts: BuildOptions = {}): EncodingRow[] {
  const strategies = ENCODINGS.filter((s) => s !== 'pinned' || a.machine.states.some((st) => st.code !== undefined));
  const rows = strategies.map((strategy) => {
    const b = buildMachine(a, { ...opts, encoding: strategy, checks: false });
    if (!b.ok) return { strategy, ok: false, diagnostics: b.diagnostics.filter((d) => d.severity === 'error') };
    const profile = opts.profile ?? BUILD_DEFAULTS.profile;
    const termGates = b.build.netlist.parts.filter((p) => p.kind === 'gate' && p.role === 'term').length;
    return {
      strategy,
      ok: true,
      encoding: b.build.encoding,
      parts: b.build.parts,
      termGates,
      guard: b.build.guard,
      cost: partsCost(b.build.parts, profile.cost),
      diagnostics: [],
    };
  });
  const best = Math.min(...rows.map((r) => r.cost ?? Infinity));
  return rows.map((r) => ({ ...r, cheapest: r.cost === best }));
}
