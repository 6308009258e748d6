/**
 * The workshop's own technology profile in the page: the figures of its cord, drum and weights,
 * read, checked and saved as a profile file the command line takes with `--profile FILE`.
 *
 * Every value is checked by the core's own loader (`loadProfile`, diagnostics LW600–LW602 with
 * their hints), never by a copy of its rules. The form edits a draft; the build keeps the last
 * draft that loaded without errors (`good`), so a value being typed never stops the build or
 * changes it to figures nobody meant. A profile file names only what it changes
 * (docs/profile.md): what is saved is the fields that differ from the shipped defaults, with the
 * `sources` and the description.
 */
import type { ReactiveController, ReactiveControllerHost } from 'lit';
import {
  DEFAULT_PROFILE,
  DOCUMENT_UNITS,
  hasErrors,
  isJsonObject,
  loadProfile,
  readJsonText,
  type Diagnostic,
  type DocumentUnits,
} from '../../core/index.js';
import { describeRule, plausibleWords, PROFILE_RULES, type NumberRule } from '../../core/physics/index.js';
import { valueAt } from '../worker/profile-file.js';
import type { ProfileSetting } from '../worker/protocol.js';
import { isFileName, parseJson } from './keep.js';

/** The figures the workshop form offers, in its order, named in our words; `path` is the profile field. */
export const WORKSHOP_FIELDS = [
  { path: 'mu', label: 'Friction of cord on the turning drum (μ)' },
  { path: 'zWeightG', label: 'Weight on each gate’s summing lever Z' },
  { path: 'portWeightG', label: 'Weight on each port lever' },
  { path: 'leverWeightG', label: 'Weight on each operator, clock and reset lever' },
  { path: 'wraps', label: 'Turns of cord per capstan' },
  { path: 'maxWraps', label: 'Most turns one capstan may have' },
  { path: 'drumRadiusM', label: 'Drum radius (half its diameter)' },
  { path: 'frame.longestDrumM', label: 'Longest drum the frame carries' },
  { path: 'frame.drumsPerFrame', label: 'Drums one frame carries' },
  { path: 'minMargin', label: 'Design margin (available over needed tension)' },
] as const;

/** A profile field the form can edit: one of PROFILE_RULES (`mu`, `frame.longestDrumM`, `cost.gate` …). */
export type WorkshopPath = string;

/**
 * What each profile field is for, in the words of the profile reference (docs/profile.md): the
 * first sentence of the last column of its tables, by field, as a heading; a row that names several fields
 * (the cost weights) gives its words to each. Read from the reference itself, so the form and
 * the reference never disagree. Pure.
 */
export function fieldWords(reference: string): ReadonlyMap<string, string> {
  const out = new Map<string, string>();
  for (const line of reference.split('\n')) {
    if (!line.startsWith('| `')) continue;
    const cells = line.split(/(?<!\\)\|/).map((c) => c.trim());
    const names = [...(cells[1] ?? '').matchAll(/`([^`]+)`/g)].map((m) => m[1]);
    const words = (cells[cells.length - 2] ?? '').replace(/\*\*/g, '').replace(/`/g, '');
    // The first sentence, as a heading: no closing full stop, and no aside that points to
    // another part of the reference ("… from the frame, below"), which the form does not have.
    const first = (/^.*?\.(?=\s|$)/.exec(words)?.[0] ?? words)
      .replace(/\s*\([^()]*\b(?:below|above)\b[^()]*\)/g, '')
      .replace(/\.$/, '');
    // A row of several fields (the cost weights) names which one each field is.
    for (const n of names) if (!out.has(n)) out.set(n, names.length > 1 ? `${first}: ${n.split('.').pop()}` : first);
  }
  return out;
}

/** Every other figure of the profile (not in WORKSHOP_FIELDS), in the core's order, each named by the reference's words (its field name where the reference has none). */
export function otherFields(words: ReadonlyMap<string, string>): { readonly path: string; readonly label: string }[] {
  const main = new Set<string>(WORKSHOP_FIELDS.map((f) => f.path));
  return Object.keys(PROFILE_RULES)
    .filter((path) => !main.has(path))
    .map((path) => ({ path, label: words.get(path) ?? path }));
}

/** The units the workshop's documents may be written in, as the form offers them, in our words. */
export const UNITS_CHOICES: readonly {
  readonly units: DocumentUnits;
  readonly label: string;
  readonly says: string;
}[] = [
  { units: 'metric', label: 'Metric', says: 'metres and millimetres, grams, N·m' },
  { units: 'inch', label: 'Inches', says: 'feet and inches to 1/16 in, ounces and pounds, lbf·in' },
];

/**
 * The units a draft's documents are written in: its `documentUnits` where that is one the core
 * knows, else metric (a wrong value shows as its diagnostic beside the choice).
 */
export function documentUnitsOf(v: Value): DocumentUnits {
  const u = v.documentUnits;
  return DOCUMENT_UNITS.find((x) => x === u) ?? 'metric';
}

/** The raw value the form sends for a choice of units: metric is the default, so it leaves the field out. */
export const unitsRaw = (units: DocumentUnits): string => (units === 'metric' ? '' : units);

/** The name a profile started in the page is saved under (and named by on the command line). */
export const WORKSHOP_FILE = 'workshop-profile.json';

/** What the form says of one figure: its unit, allowed and plausible ranges, shipped default. */
export interface FieldFacts {
  readonly unit: string;
  readonly range: string;
  readonly plausible: string;
  readonly fallback: number;
}

type Value = Readonly<Record<string, unknown>>;

/** A copy of `v` with the field at `path` set to `x`, or removed (with its group when that empties) for undefined. */
export function withValue(v: Value, path: string, x: unknown): Value {
  const [head, ...rest] = path.split('.');
  const out: Record<string, unknown> = { ...v };
  if (rest.length === 0) {
    if (x === undefined) delete out[head];
    else out[head] = x;
    return out;
  }
  const inner = withValue(isJsonObject(v[head]) ? v[head] : {}, rest.join('.'), x);
  if (Object.keys(inner).length === 0) delete out[head];
  else out[head] = inner;
  return out;
}

/** The figures of a cord's own route the frame view sets (`cordRouting` entry fields), as typed. */
export interface CordRouteTyped {
  readonly pulleys: string;
  readonly pinAngleRad: string;
}

/**
 * A copy of `v` with the `cordRouting` entry of `cord` set to the figures typed (each left out
 * when empty, so the computed figure stays), or removed for undefined or nothing typed; the
 * group goes when it empties. Cord ids hold dots (`c.clk.phi1`), so the entry is set by key.
 */
export function withCordRoute(v: Value, cord: string, typed: CordRouteTyped | undefined): Value {
  const routes: Record<string, unknown> = isJsonObject(v.cordRouting) ? { ...v.cordRouting } : {};
  const entry = Object.fromEntries(
    Object.entries(typed ?? {})
      .map(([k, raw]) => [k, typedValue(String(raw))] as const)
      .filter(([, x]) => x !== undefined),
  );
  if (Object.keys(entry).length > 0) routes[cord] = entry;
  else delete routes[cord];
  const { cordRouting: _, ...rest } = v;
  return Object.keys(routes).length > 0 ? { ...rest, cordRouting: routes } : rest;
}

/** The unit, ranges and default of a figure, from the core's rules. */
export function fieldFacts(path: WorkshopPath): FieldFacts {
  const r: NumberRule | undefined = PROFILE_RULES[path];
  if (!r) throw new Error(`no profile field ${path}`);
  return {
    unit: r.unit,
    range: describeRule(r),
    plausible: plausibleWords(r),
    fallback: valueAt(DEFAULT_PROFILE, path) as number,
  };
}

/** The diagnostics of a profile setting, from the core's loader (as `--profile` would give them). */
export function profileDiagnostics(s: ProfileSetting): Diagnostic[] {
  return loadProfile(s.value, s.name).diagnostics;
}

/** A profile file's text as a setting, or the diagnostics that refuse it (JSON syntax, LW600, LW601 …). */
export function readProfileFile(
  text: string,
  name: string,
): { readonly setting?: ProfileSetting; readonly diagnostics: readonly Diagnostic[] } {
  const read = readJsonText(text, name, 'the profile');
  if (!read.ok) return { diagnostics: read.diagnostics };
  if (!isJsonObject(read.value)) return { diagnostics: loadProfile(read.value, name).diagnostics };
  const setting: ProfileSetting = { name, value: read.value };
  const diagnostics = profileDiagnostics(setting);
  return hasErrors(diagnostics) ? { diagnostics } : { setting, diagnostics };
}

/** A stored profile setting (keep.ts), if it has the shape of one and loads without errors. */
export function parseStoredProfile(raw: string): ProfileSetting | undefined {
  const v = parseJson(raw);
  if (!isJsonObject(v) || !isFileName(v.name) || !isJsonObject(v.value)) return undefined;
  const setting: ProfileSetting = { name: v.name, value: v.value };
  return hasErrors(profileDiagnostics(setting)) ? undefined : setting;
}

/** A number typed in the form, as the value to try: '' leaves the field to its default; text that is no number goes to the loader as typed (it says why). */
export function typedValue(raw: string): unknown {
  const t = raw.trim();
  if (t === '') return undefined;
  const n = Number(t);
  return Number.isFinite(n) ? n : t;
}

/**
 * The form's state: the draft as edited, its diagnostics, and the last good profile, which the
 * build uses. `changed` is told every new good profile (undefined: the shipped defaults).
 */
export class WorkshopController implements ReactiveController {
  /** The profile as edited (may hold a value the loader refuses). */
  draft: ProfileSetting;
  /** The diagnostics of the draft, or of a file that could not be opened. */
  problems: readonly Diagnostic[] = [];
  /** The last profile that loaded without errors; undefined: the shipped defaults. */
  good: ProfileSetting | undefined;

  constructor(
    private readonly host: ReactiveControllerHost,
    initial: ProfileSetting | undefined,
    private readonly changed: (s: ProfileSetting | undefined) => void,
  ) {
    host.addController(this);
    this.good = initial;
    this.draft = initial ?? { name: WORKSHOP_FILE, value: {} };
    if (initial) this.problems = profileDiagnostics(initial);
  }

  hostConnected(): void {
    // nothing to start: the form works on the page's thread, the builds in the workers
  }

  /** The draft's diagnostics at one field (`$.mu`, `$.frame.longestDrumM`, `$.sources.mu`). */
  problemsAt(path: string): readonly Diagnostic[] {
    return this.problems.filter((d) => d.location.path === `$.${path}`);
  }

  /** A figure typed into the form. */
  edit(path: WorkshopPath, raw: string): void {
    this.tryDraft({ ...this.draft, value: withValue(this.draft.value, path, typedValue(raw)) });
  }

  /** Where a figure comes from, typed into the form ('' removes the entry). */
  source(path: WorkshopPath, words: string): void {
    const sources = isJsonObject(this.draft.value.sources) ? this.draft.value.sources : {};
    const next: Record<string, unknown> = { ...sources };
    if (words.trim() === '') delete next[path];
    else next[path] = words;
    const value = withValue(this.draft.value, 'sources', undefined);
    this.tryDraft({ ...this.draft, value: Object.keys(next).length > 0 ? { ...value, sources: next } : value });
  }

  /** One cord's own route set from the frame view (its `cordRouting` entry), or cleared (undefined). */
  route(cord: string, typed: CordRouteTyped | undefined): void {
    this.tryDraft({ ...this.draft, value: withCordRoute(this.draft.value, cord, typed) });
  }

  /** A profile file opened: it replaces the draft when it loads; otherwise its problems show and nothing changes. */
  open(text: string, name: string): boolean {
    const r = readProfileFile(text, name);
    this.problems = r.diagnostics;
    if (r.setting) {
      this.draft = r.setting;
      this.adopt(r.setting);
    }
    this.host.requestUpdate();
    return r.setting !== undefined;
  }

  /** Back to the shipped defaults. */
  reset(): void {
    this.draft = { name: WORKSHOP_FILE, value: {} };
    this.problems = [];
    this.adopt(undefined);
    this.host.requestUpdate();
  }

  private tryDraft(d: ProfileSetting): void {
    this.draft = d;
    this.problems = profileDiagnostics(d);
    if (!hasErrors(this.problems)) this.adopt(Object.keys(d.value).length > 0 ? d : undefined);
    this.host.requestUpdate();
  }

  private adopt(s: ProfileSetting | undefined): void {
    this.good = s;
    this.changed(s);
  }
}
