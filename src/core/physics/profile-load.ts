/**
 * Loading a technology profile: a JSON value that overrides any subset of DEFAULT_PROFILE.
 *
 * Contract: `loadProfile(value)` accepts any parsed JSON value. Nested objects (`routing`,
 * `cost`, `frame`) merge field by field with the defaults; `cordRouting` entries are partial routing
 * losses merged with `routing` where they are used. Unknown fields give LW601 (with a
 * did-you-mean hint), values outside their allowed range LW600 naming the field and the range —
 * a range outside which a check means nothing (a weight of 0 lifts nothing; a stage delay that
 * allows less than one clock a minute). Every numeric field also has a plausible range, with
 * its source ("estimate" where it is our reasoned guess): a value inside the allowed range but
 * outside the plausible one is warning LW602, which names the likely slip of units when the
 * value times a usual factor (1000 for millimetres as metres or kilograms as grams, π/180 for
 * degrees as radians …) lands in the plausible range. LW600 names the slip too when it fits.
 * Whether each `cordRouting` key names a cord needs the build: `cordRoutingDiagnostics` (LW603).
 * Postcondition: a profile is returned exactly when there are no errors, and every number in
 * it satisfies PROFILE_RULES (the same ranges schemas/profile.schema.json states; a test keeps
 * the two equal). A profile read from a file carries `about`: the file, its description and
 * its sources, for the build sheet.
 */
import { diag, didYouMean, type Diagnostic } from '../model/diagnostics.js';
import type { SourceLoc } from '../model/machine.js';
import type { Netlist } from '../model/netlist.js';
import {
  DEFAULT_PROFILE,
  type CostWeights,
  type FrameGeometry,
  type FrameTurn,
  type Profile,
  type ProfileAbout,
  type RoutingLoss,
} from './profile.js';
import { isJsonObject } from '../model/records.js';
import { DOCUMENT_UNITS, documentUnitsGuess, type DocumentUnits } from '../model/units.js';

/** Where a value is believable: outside it, warning LW602. `source` says where the range comes from. */
export interface Plausible {
  readonly min: number;
  readonly max: number;
  /** A named source, "common practice …" or "estimate …". */
  readonly source: string;
}

/** The allowed range of one numeric profile field, and its plausible range. */
export interface NumberRule {
  readonly min?: number;
  /** `min` itself is not allowed. */
  readonly exclusiveMin?: boolean;
  readonly max?: number;
  readonly exclusiveMax?: boolean;
  readonly integer?: boolean;
  readonly unit: string;
  /** Why the range is what it is, shown as the hint. */
  readonly why: string;
  readonly plausible: Plausible;
}

/** A plausible range. */
const pl = (min: number, max: number, source: string): Plausible => ({ min, max, source });
const mass = (why: string, plausible: Plausible): NumberRule => ({
  min: 0,
  exclusiveMin: true,
  unit: 'g',
  why,
  plausible,
});
const positive = (unit: string, why: string, plausible: Plausible): NumberRule => ({
  min: 0,
  exclusiveMin: true,
  unit,
  why,
  plausible,
});

/** Ranges of the routing-loss fields (also used for each `cordRouting` entry). */
export const ROUTING_RULES: Readonly<Record<keyof RoutingLoss, NumberRule>> = {
  pinAngleRad: {
    min: 0,
    unit: 'rad',
    why: 'an angle of redirection cannot be negative',
    plausible: pl(0, 4 * Math.PI, 'estimate — up to two full turns of a branch over pins'),
  },
  muPin: {
    min: 0,
    max: 1.5,
    unit: '',
    why: 'friction coefficients of cord on a pin lie between 0 and 1.5',
    plausible: pl(
      0.02,
      0.6,
      'estimate — smooth metal to rough wood, around the 0.28–0.31 of cord on a pine roller (design §4)',
    ),
  },
  pulleys: {
    min: 0,
    integer: true,
    unit: 'count',
    why: 'a whole number of pulleys, 0 or more',
    plausible: pl(0, 8, 'estimate — a branch inside one cabinet'),
  },
  pulleyEfficiency: {
    min: 0,
    exclusiveMin: true,
    max: 1,
    unit: '',
    why: 'an efficiency lies above 0 and at most 1',
    plausible: pl(0.7, 1, 'estimate — a plain-bearing pulley loses a few percent, a poor one up to a third'),
  },
};

const costRule: NumberRule = {
  min: 0,
  unit: '',
  why: 'cost weights are 0 or more',
  plausible: pl(0, 1000, 'estimate — relative weights of the order of the defaults'),
};
const COST_RULES: Readonly<Record<keyof CostWeights, NumberRule>> = {
  gate: costRule,
  latch: costRule,
  lever: costRule,
  capstan: costRule,
  weight: costRule,
  cord: costRule,
};

const length = (why: string, plausible: Plausible): NumberRule => positive('m', why, plausible);
const allowance = (why: string, plausible: Plausible): NumberRule => ({ min: 0, unit: 'm', why, plausible });

/** Ranges of the frame geometry (every numeric field of FrameGeometry). */
const FRAME_RULES: Readonly<Record<Exclude<keyof FrameGeometry, 'turn'>, NumberRule>> = {
  leverThicknessM: length('a lever blank has a thickness', pl(0.003, 0.05, 'estimate — 3 mm plywood to 50 mm timber')),
  leverPitchM: length(
    'levers side by side take some rail length each',
    pl(0.008, 0.2, 'estimate — a thin blank with washers to a wide lever with room for a hand'),
  ),
  leverLengthM: length('a lever has a length', pl(0.05, 1.5, 'estimate — a bench model to a lever a visitor swings')),
  railAboveDrumM: length('the lever rail sits above the drum', pl(0.03, 2, 'estimate — one cabinet')),
  channelBelowDrumM: length('the cord channel runs below the drum', pl(0.02, 2, 'estimate — one cabinet')),
  drumSpacingM: length('stacked drums are some distance apart', pl(0.1, 3, 'estimate — one cabinet')),
  cordDiameterM: length('a cord has a diameter', pl(0.0005, 0.012, 'estimate — thread-thin cord to 12 mm rope')),
  pulleyDiameterM: length('a pulley or pin has a diameter', pl(0.004, 0.3, 'estimate — a small pin to a large sheave')),
  knotAllowanceM: allowance('a knot allowance is 0 or more', pl(0, 0.3, 'estimate — a hitch and its tail')),
  takeUpAllowanceM: allowance('a take-up allowance is 0 or more', pl(0, 0.5, 'estimate — lever travel and adjustment')),
  actuatorRunM: allowance('the run to an actuator is 0 or more', pl(0, 30, 'estimate — an exhibit hall')),
  bayClearanceM: allowance('a clearance is 0 or more', pl(0, 0.2, 'estimate — a gap between neighbouring capstans')),
  longestDrumM: length('a drum has a length', pl(0.1, 5, 'estimate — a bench model to a long gallery drum')),
  drumsPerFrame: {
    min: 1,
    integer: true,
    unit: 'count',
    why: 'a whole number of drums, at least 1',
    plausible: pl(1, 8, 'estimate — drums geared together in one frame'),
  },
  camBaseRadiusM: length('a cam disc has a radius', pl(0.01, 0.3, 'estimate — a bench model to a large hand-cut disc')),
  camLiftM: length(
    'a cam lobe rises above the base circle',
    pl(0.002, 0.1, 'estimate — a few millimetres to a long lever throw'),
  ),
};

/** The values `frame.turn` may take. */
export const FRAME_TURNS: readonly FrameTurn[] = ['pulley', 'pin'];

type ScalarKey = Exclude<keyof Profile, 'routing' | 'cordRouting' | 'cost' | 'frame' | 'about' | 'documentUnits'>;

/** Weights a builder hangs: a few grams of lead shot to a half-kilo block. */
const WEIGHT_RANGE = pl(2, 500, 'estimate — a few grams of lead shot to a half-kilo steel block; design §4 uses 15 g');

const SCALAR_RULES: Readonly<Record<ScalarKey, NumberRule>> = {
  portWeightG: mass('a pull-up weight must be heavier than nothing', WEIGHT_RANGE),
  zWeightG: mass('the Z weight sets the hold tension and must be heavier than nothing', WEIGHT_RANGE),
  leverRatio: positive('', 'a lever ratio is above 0', pl(0.2, 5, 'estimate — a lever a hand can make')),
  leverWeightG: mass('a lever pull-up weight must be heavier than nothing', WEIGHT_RANGE),
  operatorExtraG: {
    min: 0,
    unit: 'g',
    why: 'a friction allowance is 0 or more',
    plausible: pl(0, 200, 'estimate — pivot friction and cord stiffness at a handle'),
  },
  wraps: positive('turns', 'a capstan needs some cord on the drum', pl(0.5, 6, 'estimate — half a turn to six turns')),
  maxWraps: positive(
    'turns',
    'a capstan needs some cord on the drum',
    pl(1, 10, 'estimate — a capstan of up to ten turns still fits a bay'),
  ),
  mu: {
    min: 0,
    exclusiveMin: true,
    max: 1.5,
    unit: '',
    why: 'μ of cord on a drum lies above 0 and well below 1.5 (0.25 is usual)',
    plausible: pl(
      0.05,
      0.8,
      'estimate — glazed cord on a varnished drum to rough cord on raw wood; 0.24–0.31 measured (design §4)',
    ),
  },
  maxPortsPerGate: {
    min: 1,
    integer: true,
    unit: 'count',
    why: 'a whole number, at least 1',
    plausible: pl(1, 12, 'estimate — port levers side by side on one summing lever'),
  },
  maxCordsPerPort: {
    min: 1,
    integer: true,
    unit: 'count',
    why: 'a whole number, at least 1',
    plausible: pl(1, 12, 'estimate — cords tied to one lever without tangling'),
  },
  minMargin: {
    min: 1,
    unit: '',
    why: 'a margin below 1 would accept a capstan that cannot lift its load',
    plausible: pl(1.2, 5, 'estimate — little headroom to a very cautious design; 2 is common practice'),
  },
  drumRadiusM: positive('m', 'the drum has a size', pl(0.01, 0.3, 'estimate — a 20 mm dowel to a 600 mm barrel')),
  drumRpm: positive('rev/min', 'the drum must turn', pl(1, 120, 'estimate — a slow hand crank to a geared motor')),
  wrapPitchM: positive(
    'm',
    'each wrap takes some drum length',
    pl(0.001, 0.03, 'estimate — thin cord to 12 mm rope with a gap'),
  ),
  cordBranchM: positive('m', 'a cord branch has a length', pl(0.05, 10, 'estimate — a bench model to an exhibit hall')),
  stageDelayS: {
    min: 0,
    exclusiveMin: true,
    max: 7.5,
    exclusiveMax: true,
    unit: 's',
    why: 'a clock takes about eight gate stages even in the smallest machine (a term gate and the master latch, a transfer gate and the slave latch, a dead band after each phase), so a stage of 7.5 s or more allows less than one clock a minute and the timing check would mean nothing',
    plausible: pl(0.02, 3, 'estimate — a quick light lever to a slow heavy one'),
  },
  stageDelaySpread: {
    min: 0,
    max: 1,
    exclusiveMax: true,
    unit: '',
    why: 'a relative spread from 0 up to (not including) 1 keeps every delay positive',
    plausible: pl(0, 0.6, 'estimate — hand-built stages vary by tens of percent'),
  },
};

/** Slips of units: a factor that turns the value written into the value meant, and the words for the slip. */
const SLIPS: Readonly<Record<string, readonly { readonly factor: number; readonly words: string }[]>> = {
  g: [
    { factor: 1000, words: 'kilograms given as grams' },
    { factor: 0.001, words: 'milligrams given as grams' },
  ],
  m: [
    { factor: 0.001, words: 'millimetres given as metres' },
    { factor: 0.01, words: 'centimetres given as metres' },
  ],
  s: [{ factor: 0.001, words: 'milliseconds given as seconds' }],
  rad: [{ factor: Math.PI / 180, words: 'degrees given as radians' }],
  'rev/min': [{ factor: 60, words: 'revolutions per second given as per minute' }],
  turns: [
    { factor: 1 / (2 * Math.PI), words: 'radians given as turns' },
    { factor: 1 / 360, words: 'degrees given as turns' },
  ],
  '': [{ factor: 0.01, words: 'a percentage given as a fraction' }],
};

/** A number as a person writes it: up to four significant figures. */
function shortNumber(v: number): string {
  return String(Number(v.toPrecision(4)));
}

/** "did you mean 0.04 (millimetres given as metres)?" when a usual slip of units lands `v` in the plausible range. */
export function likelySlip(v: number, r: NumberRule): string | undefined {
  for (const s of SLIPS[r.unit] ?? []) {
    const meant = v * s.factor;
    if (meant >= r.plausible.min && meant <= r.plausible.max && fits(meant, r))
      return `did you mean ${shortNumber(meant)} (${s.words})?`;
  }
  return undefined;
}

/** The plausible range in words, with its unit: "0.01–0.3 m". */
export function plausibleWords(r: NumberRule): string {
  const unit = r.unit && r.unit !== 'count' ? ` ${r.unit}` : '';
  return `${shortNumber(r.plausible.min)}–${shortNumber(r.plausible.max)}${unit}`;
}

/** Every numeric field by its dotted path (`mu`, `routing.muPin`, `cost.gate`). */
export const PROFILE_RULES: Readonly<Record<string, NumberRule>> = {
  ...SCALAR_RULES,
  ...prefixed('routing', ROUTING_RULES),
  ...prefixed('cost', COST_RULES),
  ...prefixed('frame', FRAME_RULES),
};

/** Top-level keys a profile file may carry besides the fields of Profile. */
export const PROFILE_META_KEYS = ['$schema', 'description', 'sources'] as const;

function prefixed(prefix: string, rules: Readonly<Record<string, NumberRule>>): Record<string, NumberRule> {
  return Object.fromEntries(Object.entries(rules).map(([k, r]) => [`${prefix}.${k}`, r]));
}

/** The range of a rule in words, e.g. "greater than 0 and at most 1.5". */
export function describeRule(r: NumberRule): string {
  const parts: string[] = [];
  if (r.integer) parts.push('a whole number');
  if (r.min !== undefined) parts.push(`${r.exclusiveMin ? 'greater than' : 'at least'} ${r.min}`);
  if (r.max !== undefined) parts.push(`${r.exclusiveMax ? 'less than' : 'at most'} ${r.max}`);
  return parts.join(', ');
}

function fits(v: number, r: NumberRule): boolean {
  if (!Number.isFinite(v)) return false;
  if (r.integer && !Number.isInteger(v)) return false;
  if (r.min !== undefined && (r.exclusiveMin ? v <= r.min : v < r.min)) return false;
  if (r.max !== undefined && (r.exclusiveMax ? v >= r.max : v > r.max)) return false;
  return true;
}

/** The diagnostics of one profile reading, and the checks that add to them. */
class ProfileReader {
  readonly ds: Diagnostic[] = [];

  constructor(private readonly where: string | undefined) {}

  loc(path: string): SourceLoc {
    return this.where !== undefined ? { file: this.where, path } : { path };
  }

  /** The number at `path` when it fits its rule (LW602 when it is not plausible); LW600 otherwise. */
  checkNumber(path: string, v: unknown, r: NumberRule): number | undefined {
    const label = path.replace(/^\$\./, '');
    if (typeof v === 'number' && fits(v, r)) {
      if (v < r.plausible.min || v > r.plausible.max) {
        const slip = likelySlip(v, r);
        const unit = r.unit && r.unit !== 'count' ? ` ${r.unit}` : '';
        const msg = `profile field '${label}' is ${v}${unit}, outside the plausible ${plausibleWords(r)}${slip ? `: ${slip}` : ''}`;
        this.ds.push(diag('LW602', msg, this.loc(path), `plausible range: ${r.plausible.source}`));
      }
      return v;
    }
    const got = typeof v === 'number' ? String(v) : (JSON.stringify(v) ?? String(v));
    const unit = r.unit && r.unit !== 'count' ? ` (${r.unit})` : '';
    const slip = typeof v === 'number' ? likelySlip(v, r) : undefined;
    this.ds.push(
      diag(
        'LW600',
        `profile field '${label}' must be ${describeRule(r)}${unit}; got ${got}`,
        this.loc(path),
        slip ? `${slip} (${r.why})` : r.why,
      ),
    );
    return undefined;
  }

  /** LW601: field `key` of the object at `path` is not a profile field. */
  unknown(path: string, key: string, known: readonly string[]): void {
    const guess = didYouMean(key, known);
    const label = path === '$' ? key : `${path.slice(2)}.${key}`;
    const hint = guess ? `did you mean '${guess}'?` : `known fields: ${known.join(', ')}`;
    this.ds.push(diag('LW601', `profile has no field '${label}'`, this.loc(`${path}.${key}`), hint));
  }

  /** The object at `path` merged field by field over `base` (`base` itself when it is not an object). */
  mergeGroup<T extends object>(path: string, v: unknown, rules: Readonly<Record<string, NumberRule>>, base: T): T {
    if (!isJsonObject(v)) {
      const hint = `fields: ${Object.keys(rules).join(', ')}`;
      this.ds.push(diag('LW600', `profile field '${path.slice(2)}' must be an object`, this.loc(path), hint));
      return base;
    }
    const out: Record<string, unknown> = { ...(base as Record<string, unknown>) };
    for (const [k, x] of Object.entries(v)) {
      const r = Object.hasOwn(rules, k) ? rules[k] : undefined;
      if (!r) this.unknown(path, k, Object.keys(rules));
      else {
        const n = this.checkNumber(`${path}.${k}`, x, r);
        if (n !== undefined) out[k] = n;
      }
    }
    return out as T;
  }

  /** `cordRouting`: cord id → partial routing loss. */
  cordRouting(path: string, v: unknown): Record<string, Partial<RoutingLoss>> | undefined {
    if (!isJsonObject(v)) {
      const msg = "profile field 'cordRouting' must be an object of cord id → routing loss";
      this.ds.push(diag('LW600', msg, this.loc(path)));
      return undefined;
    }
    // fromEntries keeps a cord named like an Object.prototype key as a plain own field.
    return Object.fromEntries(
      Object.entries(v).map(([cord, r]): [string, Partial<RoutingLoss>] => [
        cord,
        this.mergeGroup(`${path}.${cord}`, r, ROUTING_RULES, {}),
      ]),
    );
  }

  /** `documentUnits`: one of DOCUMENT_UNITS; anything else LW600 with a did-you-mean hint. */
  documentUnits(path: string, v: unknown): DocumentUnits | undefined {
    if (typeof v === 'string' && (DOCUMENT_UNITS as readonly string[]).includes(v)) return v as DocumentUnits;
    const got = typeof v === 'string' ? JSON.stringify(v) : (JSON.stringify(v) ?? String(v));
    const guess = typeof v === 'string' ? (didYouMean(v, DOCUMENT_UNITS) ?? documentUnitsGuess(v)) : undefined;
    this.ds.push(
      diag(
        'LW600',
        `profile field 'documentUnits' must be ${DOCUMENT_UNITS.map((u) => `"${u}"`).join(' or ')}; got ${got}`,
        this.loc(path),
        guess
          ? `did you mean '${guess}'?`
          : 'the units the documents show lengths and masses in: "metric" (metres, millimetres, grams) or "inch" (feet, inches, ounces, pounds)',
      ),
    );
    return undefined;
  }

  /** Read top-level field `k` into `out` (the merged profile so far) and `about` (what the file says of itself). */
  field(
    k: string,
    v: unknown,
    out: Record<string, unknown>,
    about: { -readonly [K in keyof ProfileAbout]: ProfileAbout[K] },
  ): void {
    const path = `$.${k}`;
    if (k === '$schema' || k === 'description') {
      if (typeof v !== 'string') this.ds.push(diag('LW600', `profile field '${k}' must be a string`, this.loc(path)));
      else if (k === 'description') about.description = v;
    } else if (k === 'sources') {
      if (checkSources(v, path, this.ds, (p) => this.loc(p)))
        about.sources = Object.fromEntries(Object.entries(v as Record<string, string>));
    } else if (k === 'routing') {
      out.routing = this.mergeGroup(path, v, ROUTING_RULES, DEFAULT_PROFILE.routing);
    } else if (k === 'cost') {
      out.cost = this.mergeGroup(path, v, COST_RULES, DEFAULT_PROFILE.cost);
    } else if (k === 'frame') {
      out.frame = mergeFrame(
        path,
        v,
        (...a) => this.mergeGroup(...a),
        this.ds,
        (q) => this.loc(q),
      );
    } else if (k === 'cordRouting') {
      const routes = this.cordRouting(path, v);
      if (routes) out.cordRouting = routes;
    } else if (k === 'documentUnits') {
      const units = this.documentUnits(path, v);
      if (units) out.documentUnits = units;
    } else if (Object.hasOwn(SCALAR_RULES, k)) {
      const n = this.checkNumber(path, v, SCALAR_RULES[k as ScalarKey]);
      if (n !== undefined) out[k] = n;
    } else {
      this.unknown('$', k, [...Object.keys(DEFAULT_PROFILE), ...PROFILE_META_KEYS]);
    }
  }
}

/** Validate `value` as a profile override and merge it over DEFAULT_PROFILE. */
export function loadProfile(value: unknown, where?: string): { profile?: Profile; diagnostics: Diagnostic[] } {
  const r = new ProfileReader(where);
  if (!isJsonObject(value)) {
    const hint = 'write { "mu": 0.25, … } with only the fields you change';
    r.ds.push(diag('LW100', 'a technology profile must be a JSON object', r.loc('$'), hint));
    return { diagnostics: r.ds };
  }
  const out: Record<string, unknown> = { ...DEFAULT_PROFILE };
  const about: { -readonly [K in keyof ProfileAbout]: ProfileAbout[K] } = where !== undefined ? { file: where } : {};
  for (const [k, v] of Object.entries(value)) r.field(k, v, out, about);
  if (Object.keys(about).length > 0) out.about = about;
  return r.ds.some((d) => d.severity === 'error')
    ? { diagnostics: r.ds }
    : { profile: out as unknown as Profile, diagnostics: r.ds };
}

type MergeGroup = <T extends object>(
  path: string,
  v: unknown,
  rules: Readonly<Record<string, NumberRule>>,
  base: T,
) => T;

/** The `frame` group: its numbers through the common merge, its one word field (`turn`) checked here. */
function mergeFrame(
  path: string,
  v: unknown,
  mergeGroup: MergeGroup,
  ds: Diagnostic[],
  loc: (p: string) => SourceLoc,
): FrameGeometry {
  if (!isJsonObject(v) || !Object.hasOwn(v, 'turn')) return mergeGroup(path, v, FRAME_RULES, DEFAULT_PROFILE.frame);
  const { turn, ...numbers } = v;
  const merged = mergeGroup(path, numbers, FRAME_RULES, DEFAULT_PROFILE.frame);
  if (typeof turn === 'string' && (FRAME_TURNS as readonly string[]).includes(turn))
    return { ...merged, turn: turn as FrameTurn };
  const got = typeof turn === 'string' ? turn : (JSON.stringify(turn) ?? String(turn));
  const guess = typeof turn === 'string' ? didYouMean(turn, FRAME_TURNS) : undefined;
  ds.push(
    diag(
      'LW600',
      `profile field 'frame.turn' must be ${FRAME_TURNS.map((t) => `"${t}"`).join(' or ')}; got ${got}`,
      loc(`${path}.turn`),
      guess ? `did you mean '${guess}'?` : 'a cord turns over a pulley or over a smooth fixed pin',
    ),
  );
  return merged;
}

/** Dotted paths a `sources` entry may name: every numeric field, `frame.turn`, `cordRouting` and `documentUnits`. */
export const SOURCE_KEYS: readonly string[] = [
  ...Object.keys(PROFILE_RULES),
  'frame.turn',
  'cordRouting',
  'documentUnits',
];

/** True when `sources` is an object (its entries are checked one by one). */
function checkSources(v: unknown, path: string, ds: Diagnostic[], loc: (p: string) => SourceLoc): boolean {
  if (!isJsonObject(v)) {
    ds.push(diag('LW600', "profile field 'sources' must be an object of field → source", loc(path)));
    return false;
  }
  for (const [k, s] of Object.entries(v)) {
    if (!SOURCE_KEYS.includes(k)) {
      const guess = didYouMean(k, SOURCE_KEYS);
      ds.push(
        diag(
          'LW601',
          `profile 'sources' names no field '${k}'`,
          loc(`${path}.${k}`),
          guess ? `did you mean '${guess}'?` : undefined,
        ),
      );
    } else if (typeof s !== 'string' || s.trim() === '') {
      ds.push(
        diag(
          'LW600',
          `profile 'sources.${k}' must be a non-empty string`,
          loc(`${path}.${k}`),
          'a named source, "common practice" or "estimate"',
        ),
      );
    }
  }
  return true;
}

/** One value of a profile that differs from the shipped default, with the source the profile gives for it. */
export interface ProfileChange {
  /** Dotted path: `mu`, `routing.muPin`, `frame.turn`, `cordRouting.c.clk.phi1`. */
  readonly field: string;
  /** The value in words (a number, a word, or a cordRouting entry as JSON). */
  readonly value: string;
  /** The shipped default in words ('—' for a cordRouting entry, which has none). */
  readonly fallback: string;
  /** What the profile's `sources` says of it; undefined when it says nothing. */
  readonly source?: string;
}

/** Every value of `profile` that differs from DEFAULT_PROFILE, in the order of PROFILE_RULES (then frame.turn, documentUnits, then cordRouting). */
export function profileChanges(profile: Profile): ProfileChange[] {
  const sources = profile.about?.sources ?? {};
  const at = (o: unknown, path: string): unknown =>
    path.split('.').reduce<unknown>((x, k) => (isJsonObject(x) ? x[k] : undefined), o);
  const out: ProfileChange[] = [];
  for (const field of [...Object.keys(PROFILE_RULES), 'frame.turn', 'documentUnits']) {
    const v = at(profile, field);
    const d = at(DEFAULT_PROFILE, field);
    if (v !== d) out.push({ field, value: String(v), fallback: String(d), source: sources[field] });
  }
  for (const [cord, r] of Object.entries(profile.cordRouting))
    out.push({ field: `cordRouting.${cord}`, value: JSON.stringify(r), fallback: '—', source: sources.cordRouting });
  return out;
}

/**
 * LW603 for every `cordRouting` key that names no cord of the netlist (its routing would be
 * silently ignored), with the closest cord id as a did-you-mean hint. Needs the build, so the
 * pipeline calls it after mapping.
 */
export function cordRoutingDiagnostics(profile: Profile, netlist: Netlist): Diagnostic[] {
  const cords = netlist.cords.map((c) => c.id);
  const known = new Set(cords);
  const file = profile.about?.file;
  return Object.keys(profile.cordRouting)
    .filter((k) => !known.has(k))
    .map((k) => {
      const guess = didYouMean(k, cords) ?? cords.find((c) => c.endsWith(k.replace(/^c\./, '.')));
      const path = `$.cordRouting[${JSON.stringify(k)}]`;
      return diag(
        'LW603',
        `profile 'cordRouting' names the cord '${k}', which this build does not have; its routing would be ignored`,
        file !== undefined ? { file, path } : { path },
        guess
          ? `did you mean '${guess}'?`
          : `cords of this build: ${cords.slice(0, 8).join(', ')}${cords.length > 8 ? ', …' : ''}`,
      );
    });
}
