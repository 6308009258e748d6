/**
 * The worker's jobs as plain functions (testable without a worker): read a machine, build it,
 * check it, compare encodings. Each returns a view for the page (protocol.ts); the pipeline
 * in src/core/pipeline.ts does the work.
 */
import {
  analyse,
  type Analysed,
  billOfMaterials,
  BUILD_DEFAULTS,
  buildMachine,
  buildSearchSetup,
  hasErrors,
  loadProfile,
  type Profile,
  type BuildOptions,
  type Built,
  compareEncodings,
  type DriveResult,
  type EncodeResult,
  equationTexts,
  findCheck,
  momentWords,
  operatorForces,
  partRoles,
  type Progress,
  readMachine,
  runChecks,
  searchSetupKey,
  type Encoding,
  type SearchSetup,
} from '../../core/index.js';
import { layoutDiagram } from '../diagram/layout.js';
import type {
  BuildSettings,
  BuildView,
  BuiltForChecks,
  ChecksView,
  CodeRow,
  CodesFrom,
  DroppedSetting,
  MarginBar,
  ProfileSetting,
  Reading,
  RememberedSearch,
  StandIn,
  TorqueBar,
} from './protocol.js';

/** Parse, validate and minimise; lay out the diagram when the machine is sound. */
export function readJob(text: string, file: string): { reading: Reading; analysed?: Analysed } {
  const a = analyse(text, file);
  if (!a.ok) {
    // The name, when the machine parsed but did not validate: the file name follows it all the same.
    const name = readMachine(text, file).machine?.name;
    return { reading: { ok: false, form: a.form, diagnostics: a.diagnostics, ...(name ? { name } : {}) } };
  }
  const m = a.minimised;
  const reading: Reading = {
    ok: true,
    form: a.form,
    name: a.machine.name,
    diagnostics: a.diagnostics,
    machine: a.machine,
    merged: m.merged,
    reduced: m.machine.states,
    unreachable: m.unreachable,
    method: m.method,
    layout: layoutDiagram(a.machine, m.merged, m.unreachable),
  };
  return { reading, analysed: a };
}

/** Profiles read, by the setting they were read from (a job asks for its profile several times). */
const loaded = new WeakMap<ProfileSetting, Profile>();

/**
 * The profile of a setting, read by the core's loader over the defaults as the command line's
 * `--profile NAME` reads the file. The page sends only a profile that loaded without errors, so
 * one that does not is a fault, never a build with other figures.
 */
export function settingProfile(p: ProfileSetting | undefined): Profile {
  if (!p) return BUILD_DEFAULTS.profile;
  let profile = loaded.get(p);
  if (!profile) {
    const r = loadProfile(p.value, p.name);
    if (!r.profile || hasErrors(r.diagnostics))
      throw new Error(`the profile ${p.name} did not load: ${r.diagnostics.map((d) => d.message).join('; ')}`);
    loaded.set(p, (profile = r.profile));
  }
  return profile;
}

/** Build options from the page's settings (with the command line's defaults for all the page leaves out). */
export function buildOptions(s: BuildSettings, onProgress?: (p: Progress) => void): BuildOptions {
  const e = s.encoding;
  return {
    encoding: 'kept' in e ? () => e.kept : e.strategy,
    seed: s.seed,
    ...(s.unusedCodes !== undefined ? { unusedCodes: s.unusedCodes } : {}),
    profile: settingProfile(s.profile),
    ...(s.pins !== undefined ? { pins: s.pins } : {}),
    ...(onProgress ? { onProgress } : {}),
  };
}

const same = (a: readonly string[], b: readonly string[]): boolean =>
  a.length === b.length && a.every((x, i) => x === b[i]);

/**
 * The settings as this machine can use them: codes kept for other states, and unused codes
 * sent to a state this machine does not have, are dropped (back to the defaults), with why.
 */
export function settle(a: Analysed, s: BuildSettings): { settings: BuildSettings; dropped: DroppedSetting[] } {
  const dropped: DroppedSetting[] = [];
  let settings = s;
  const e = s.encoding;
  const states = a.minimised.machine.states;
  if ('kept' in e && !same(e.states, states)) {
    const were = e.states.length === states.length ? `the states ${e.states.join(', ')}` : `${e.states.length} states`;
    dropped.push({ setting: 'encoding', words: `the codes you picked were for ${were}; back to the searched codes` });
    settings = { ...settings, encoding: { strategy: BUILD_DEFAULTS.encoding } };
  }
  const to = s.unusedCodes;
  if (
    to !== undefined &&
    to !== 'dont-care' &&
    !(to in a.minimised.merged && states.includes(a.minimised.merged[to]))
  ) {
    dropped.push({
      setting: 'unused',
      words: `unused codes were sent to '${to}', which this machine does not reach; back to the automatic choice`,
    });
    const { unusedCodes: _, ...rest } = settings;
    settings = rest;
  }
  return { settings, dropped };
}

/** How a build gets its codes: no search (named codes), a remembered search outcome, or a search to run. */
export type CodesPlan =
  | { readonly kind: 'named' }
  | { readonly kind: 'remembered'; readonly key: string; readonly outcome: EncodeResult }
  | { readonly kind: 'search'; readonly key: string; readonly setup: SearchSetup };

/**
 * The plan of a build's codes: a build that searches (the settings, as this machine can use
 * them, name the automatic search) looks the key of its search setup up among the outcomes the
 * page keeps; a setup the build will refuse is left to the build to report.
 */
export function codesPlan(a: Analysed, asked: BuildSettings, known: readonly RememberedSearch[] = []): CodesPlan {
  const s = settle(a, asked).settings;
  if (!('strategy' in s.encoding) || s.encoding.strategy !== 'auto') return { kind: 'named' };
  const setup = buildSearchSetup(a, buildOptions(s));
  if (!('machine' in setup)) return { kind: 'named' };
  const key = searchSetupKey(setup);
  const hit = known.find((k) => k.key === key);
  return hit ? { kind: 'remembered', key, outcome: hit.outcome } : { kind: 'search', key, setup };
}

/**
 * The key of everything a build view depends on but the reading's diagnostics: the codes as
 * the settings choose them for this machine, the parts kept in a bay (in their order: it orders
 * their problems), and the search setup (the minimised machine, profile, unused codes, seed,
 * pinned codes). Undefined when the build will refuse the setup.
 */
export function buildKey(a: Analysed, asked: BuildSettings): string | undefined {
  const s = settle(a, asked).settings;
  const setup = buildSearchSetup(a, buildOptions(s));
  const pins = JSON.stringify(Object.entries(s.pins ?? {}));
  return 'machine' in setup ? `${JSON.stringify(s.encoding)}\n${pins}\n${searchSetupKey(setup)}` : undefined;
}

/**
 * A view built for an equal build key, for a newer reading (a comment typed): the same build,
 * with this reading's diagnostics in front of the build's own (their lines may have moved) and
 * the settings this machine drops. `read`: how many of the view's diagnostics were its reading's.
 */
export function againFor(
  view: BuildView,
  read: number,
  a: Analysed,
  asked: BuildSettings,
  codesFrom: CodesFrom,
): BuildView {
  const { dropped: _, ...rest } = view;
  const dropped = settle(a, asked).dropped;
  return {
    ...rest,
    diagnostics: [...a.diagnostics, ...view.diagnostics.slice(read)],
    ...(dropped.length > 0 ? { dropped } : {}),
    codesFrom,
  };
}

/**
 * The key of everything a check job's result depends on but the reading's diagnostics and
 * source: the build (`buildKey`) and the specification the checks compare it with (the flat
 * machine as written, and which states merged).
 */
export function checkKey(a: Analysed, asked: BuildSettings): string | undefined {
  const build = buildKey(a, asked);
  return build === undefined ? undefined : `${build}\n${JSON.stringify(a.flat)}\n${JSON.stringify(a.minimised.merged)}`;
}

/**
 * A checked build of an equal check key, for a newer reading (a comment typed): the same build
 * and checks, with this reading's machine (the build sheet quotes it) and its diagnostics in
 * front of the build's own. `read`: how many of the build's diagnostics were its reading's.
 */
export function checkedAgain(b: Built, read: number, a: Analysed): Built {
  return { ...b, analysed: a, diagnostics: [...a.diagnostics, ...b.diagnostics.slice(read)] };
}

/**
 * A search outcome as the page keeps it, under its setup's key: without the minimisations the
 * search kept of pricing the chosen codes (`EncodeResult.kept`, a hundred kilobytes for a large
 * machine), since the page posts what it keeps with every build job. A build from it is the same
 * build; it only minimises those functions itself.
 */
export function toRemember(key: string, outcome: EncodeResult): RememberedSearch {
  const { kept: _kept, ...rest } = outcome;
  return { key, outcome: rest };
}

/**
 * The settings of a draft build while the search runs: the codes of the build shown before
 * when they are for the same states and keep every pinned code, else counting order (which
 * keeps pins itself).
 */
export function standInSettings(
  a: Analysed,
  asked: BuildSettings,
  setup: SearchSetup,
  previous?: { readonly encoding: Encoding; readonly states: readonly string[] },
): { settings: BuildSettings; standIn: StandIn } {
  const s = settle(a, asked).settings;
  const states = a.minimised.machine.states;
  const pinned = setup.pinned ?? {};
  const fits =
    previous !== undefined &&
    same(previous.states, states) &&
    Object.entries(pinned).every(([st, code]) => previous.encoding.codes[states.indexOf(st)] === code);
  return fits
    ? { settings: { ...s, encoding: { kept: previous.encoding, states } }, standIn: 'previous' }
    : { settings: { ...s, encoding: { strategy: 'binary' } }, standIn: 'binary' };
}

/**
 * How hard a draft's place phase works: the spectral order alone, no exact arrangement and no
 * local search (a rough frame, in a fraction of the time; the final build places in full).
 */
export const DRAFT_PLACE_EFFORT = { exactLimit: 0, improve: { kicks: 0, work: 0 } } as const;

/**
 * Encode and synthesise, without the checks (they follow in checkJob); `searched`: the search
 * already run on two cores (worker/search.ts) or remembered; `from`: where the codes came from
 * (default: 'searched' when the settings search, else 'named'; a 'stand-in' draft is placed
 * with DRAFT_PLACE_EFFORT).
 */
export function buildJob(
  a: Analysed,
  asked: BuildSettings,
  onProgress?: (p: Progress) => void,
  searched?: EncodeResult,
  from?: CodesFrom,
): { view?: BuildView; built?: Built; diagnostics: Built['diagnostics'] } {
  const { settings: s, dropped } = settle(a, asked);
  const codesFrom = from ?? ('strategy' in s.encoding && s.encoding.strategy === 'auto' ? 'searched' : 'named');
  const b = buildMachine(a, {
    ...buildOptions(s, onProgress),
    checks: false,
    ...(searched ? { searched } : {}),
    ...(from === 'stand-in' ? { placeEffort: DRAFT_PLACE_EFFORT } : {}),
  });
  if (!b.ok) return { diagnostics: b.diagnostics };
  const view: BuildView = {
    build: b.build,
    profile: b.profile,
    placement: b.placement,
    equations: equationTexts(b),
    guard: b.build.guard,
    bom: billOfMaterials(b.build.netlist, b.profile, b.placement),
    forces: operatorForces(b.build.netlist, b.profile),
    ...(b.search ? { search: b.search } : {}),
    diagnostics: b.diagnostics,
    ...(dropped.length > 0 ? { dropped } : {}),
    codesFrom,
  };
  return { view, built: b, diagnostics: b.diagnostics };
}

/**
 * The build the checker checks: the builder's (as the page received it) with the checker's own
 * reading of the same text, which the checks compare it with. The search report is left out,
 * as a build with kept codes has none.
 */
export function builtForChecks(a: Analysed, made: BuiltForChecks): Built {
  return {
    ok: true,
    analysed: a,
    build: made.build,
    placement: made.placement,
    profile: made.profile,
    checks: [],
    diagnostics: made.diagnostics,
  };
}

/** Run every check of a build; returns the checked build and the page's view of it. */
export function checkJob(b: Built, seed: number): { built: Built; view: ChecksView } {
  const checks = runChecks(b.build, b.analysed, b.profile, seed, b.placement);
  const built: Built = { ...b, checks };
  const drive = findCheck(checks, 'drive');
  const roles = partRoles(b.build.netlist, b.profile.documentUnits);
  const margins: MarginBar[] = (drive?.drivers ?? [])
    .filter((d) => Number.isFinite(d.margin))
    .map((d) => {
      const r = roles.get(d.driver);
      return { driver: d.driver, kind: r?.kind ?? 'part', does: r?.does ?? d.driver, margin: d.margin, ok: d.ok };
    })
    .sort((x, y) => x.margin - y.margin);
  const forbidden = findCheck(checks, 'forbidden-input');
  const timing = findCheck(checks, 'timing');
  return {
    built,
    view: {
      checks,
      margins,
      minMargin: b.profile.minMargin,
      mu: b.profile.mu,
      muMin: drive?.muMin ?? null,
      muAtMinMargin: drive?.muAtMinMargin ?? null,
      outputLoads: Object.entries(drive?.outputs ?? {}).map(([output, o]) => ({ output, ...o })),
      torque: drive ? torqueBars(drive) : [],
      powerW: drive?.worstPowerW ?? 0,
      ...(timing ? { timing } : {}),
      rules: forbidden?.rules ?? [],
    },
  };
}

/** The worst drum torque of each state, as the drive check found it (no snapshot is simulated again here). */
export function torqueBars(drive: Pick<DriveResult, 'worstByState'>): TorqueBar[] {
  return drive.worstByState.map((w) => ({ state: w.where.state, torqueNm: w.torqueNm, at: momentWords(w.where) }));
}

/**
 * Every encoding side by side, priced by the finished build's part count. The parts kept in a bay
 * are left out, as `latchwright compare` takes none: the comparison is of codes, priced for the
 * text and the profile (the page prices it again when either changes, not when a part moves).
 */
export function compareJob(a: Analysed, s: BuildSettings, onProgress?: (p: Progress) => void): CodeRow[] {
  const states = a.minimised.machine.states;
  const { pins: _, ...settings } = settle(a, s).settings;
  return compareEncodings(a, buildOptions(settings, onProgress)).map((r) => ({
    strategy: r.strategy,
    ok: r.ok,
    states,
    ...(r.encoding ? { encoding: r.encoding } : {}),
    ...(r.parts ? { parts: r.parts } : {}),
    ...(r.termGates !== undefined ? { termGates: r.termGates } : {}),
    ...(r.guard ? { guard: r.guard } : {}),
    ...(r.cost !== undefined ? { cost: r.cost } : {}),
    cheapest: r.cheapest,
    ...(r.ok ? {} : { problem: r.diagnostics[0]?.message ?? 'does not fit this machine' }),
  }));
}
