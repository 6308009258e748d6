/**
 * Loading a technology profile: a JSON value that overrides any subset of DEFAULT_PROFILE.
 *
 * Contract: `loadProfile(value)` accepts any parsed JSON value. Nested objects (`routing`,
 * `cost`, `frame`) merge field by field with the defaults; `cordRouting` entries are partial routing
 * losses merged with `routing` where they are used. Unknown fields give LW601 (with a
 * did-you-mean hint), values outside their range LW600 naming the field and the range.
 * Postcondition: a profile is returned exactly when there are no errors, and every number in
 * it satisfies PROFILE_RULES (the same ranges schemas/profile.schema.json states; a test keeps
 * the two equal).
 */
import { diag, didYouMean, type Diagnostic } from '../model/diagnostics.js';
import type { SourceLoc } from '../model/machine.js';
import {
  DEFAULT_PROFILE,
  type CostWeights,
  type FrameGeometry,
  type FrameTurn,
  type Profile,
  type RoutingLoss,
} from './profile.js';

/** The allowed range of one numeric profile field. */
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
}

const mass = (why: string): NumberRule => ({ min: 0, exclusiveMin: true, unit: 'g', why });
const positive = (unit: string, why: string): NumberRule => ({ min: 0, exclusiveMin: true, unit, why });

/** Ranges of the routing-loss fields (also used for each `cordRouting` entry). */
export const ROUTING_RULES: Readonly<Record<keyof RoutingLoss, NumberRule>> = {
  pinAngleRad: { min: 0, unit: 'rad', why: 'an angle of redirection cannot be negative' },
  muPin: { min: 0, max: 1.5, unit: '', why: 'friction coefficients of cord on a pin lie between 0 and 1.5' },
  pulleys: { min: 0, integer: true, unit: 'count', why: 'a whole number of pulleys, 0 or more' },
  pulleyEfficiency: { min: 0, exclusiveMin: true, max: 1, unit: '', why: 'an efficiency lies above 0 and at most 1' },
};

const COST_RULES: Readonly<Record<keyof CostWeights, NumberRule>> = {
  gate: { min: 0, unit: '', why: 'cost weights are 0 or more' },
  latch: { min: 0, unit: '', why: 'cost weights are 0 or more' },
  lever: { min: 0, unit: '', why: 'cost weights are 0 or more' },
  capstan: { min: 0, unit: '', why: 'cost weights are 0 or more' },
  weight: { min: 0, unit: '', why: 'cost weights are 0 or more' },
  cord: { min: 0, unit: '', why: 'cost weights are 0 or more' },
};

const length = (why: string): NumberRule => positive('m', why);

/** Ranges of the frame geometry (every numeric field of FrameGeometry). */
const FRAME_RULES: Readonly<Record<Exclude<keyof FrameGeometry, 'turn'>, NumberRule>> = {
  leverThicknessM: length('a lever blank has a thickness'),
  leverPitchM: length('levers side by side take some rail length each'),
  leverLengthM: length('a lever has a length'),
  railAboveDrumM: length('the lever rail sits above the drum'),
  channelBelowDrumM: length('the cord channel runs below the drum'),
  drumSpacingM: length('stacked drums are some distance apart'),
  cordDiameterM: length('a cord has a diameter'),
  pulleyDiameterM: length('a pulley or pin has a diameter'),
  knotAllowanceM: { min: 0, unit: 'm', why: 'a knot allowance is 0 or more' },
  takeUpAllowanceM: { min: 0, unit: 'm', why: 'a take-up allowance is 0 or more' },
  actuatorRunM: { min: 0, unit: 'm', why: 'the run to an actuator is 0 or more' },
  bayClearanceM: { min: 0, unit: 'm', why: 'a clearance is 0 or more' },
  longestDrumM: length('a drum has a length'),
  drumsPerFrame: { min: 1, integer: true, unit: 'count', why: 'a whole number of drums, at least 1' },
  camBaseRadiusM: length('a cam disc has a radius'),
  camLiftM: length('a cam lobe rises above the base circle'),
};

/** The values `frame.turn` may take. */
export const FRAME_TURNS: readonly FrameTurn[] = ['pulley', 'pin'];

type ScalarKey = Exclude<keyof Profile, 'routing' | 'cordRouting' | 'cost' | 'frame'>;

const SCALAR_RULES: Readonly<Record<ScalarKey, NumberRule>> = {
  portWeightG: mass('a pull-up weight must be heavier than nothing'),
  zWeightG: mass('the Z weight sets the hold tension and must be heavier than nothing'),
  leverRatio: positive('', 'a lever ratio is above 0'),
  leverWeightG: mass('a lever pull-up weight must be heavier than nothing'),
  operatorExtraG: { min: 0, unit: 'g', why: 'a friction allowance is 0 or more' },
  wraps: positive('turns', 'a capstan needs some cord on the drum'),
  mu: {
    min: 0,
    exclusiveMin: true,
    max: 1.5,
    unit: '',
    why: 'μ of cord on a drum lies above 0 and well below 1.5 (0.25 is usual)',
  },
  maxPortsPerGate: { min: 1, integer: true, unit: 'count', why: 'a whole number, at least 1' },
  maxCordsPerPort: { min: 1, integer: true, unit: 'count', why: 'a whole number, at least 1' },
  minMargin: { min: 1, unit: '', why: 'a margin below 1 would accept a capstan that cannot lift its load' },
  drumRadiusM: positive('m', 'the drum has a size'),
  drumRpm: positive('rev/min', 'the drum must turn'),
  wrapPitchM: positive('m', 'each wrap takes some drum length'),
  cordBranchM: positive('m', 'a cord branch has a length'),
  stageDelayS: positive('s', 'a gate stage takes some time'),
  stageDelaySpread: {
    min: 0,
    max: 1,
    exclusiveMax: true,
    unit: '',
    why: 'a relative spread from 0 up to (not including) 1 keeps every delay positive',
  },
};

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

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/** The diagnostics of one profile reading, and the checks that add to them. */
class ProfileReader {
  readonly ds: Diagnostic[] = [];

  constructor(private readonly where: string | undefined) {}

  loc(path: string): SourceLoc {
    return this.where !== undefined ? { file: this.where, path } : { path };
  }

  /** The number at `path` when it fits its rule; LW600 otherwise. */
  checkNumber(path: string, v: unknown, r: NumberRule): number | undefined {
    if (typeof v === 'number' && fits(v, r)) return v;
    const label = path.replace(/^\$\./, '');
    const got = typeof v === 'number' ? String(v) : (JSON.stringify(v) ?? String(v));
    const unit = r.unit && r.unit !== 'count' ? ` (${r.unit})` : '';
    this.ds.push(
      diag('LW600', `profile field '${label}' must be ${describeRule(r)}${unit}; got ${got}`, this.loc(path), r.why),
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
    if (!isObject(v)) {
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
    if (!isObject(v)) {
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

  /** Read top-level field `k` into `out` (the merged profile so far). */
  field(k: string, v: unknown, out: Record<string, unknown>): void {
    const path = `$.${k}`;
    if (k === '$schema' || k === 'description') {
      if (typeof v !== 'string') this.ds.push(diag('LW600', `profile field '${k}' must be a string`, this.loc(path)));
    } else if (k === 'sources') {
      checkSources(v, path, this.ds, (p) => this.loc(p));
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
  if (!isObject(value)) {
    const hint = 'write { "mu": 0.25, … } with only the fields you change';
    r.ds.push(diag('LW100', 'a technology profile must be a JSON object', r.loc('$'), hint));
    return { diagnostics: r.ds };
  }
  const out: Record<string, unknown> = { ...DEFAULT_PROFILE };
  for (const [k, v] of Object.entries(value)) r.field(k, v, out);
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
  if (!isObject(v) || !Object.hasOwn(v, 'turn')) return mergeGroup(path, v, FRAME_RULES, DEFAULT_PROFILE.frame);
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

/** Dotted paths a `sources` entry may name: every numeric field, `frame.turn` and `cordRouting`. */
export const SOURCE_KEYS: readonly string[] = [...Object.keys(PROFILE_RULES), 'frame.turn', 'cordRouting'];

function checkSources(v: unknown, path: string, ds: Diagnostic[], loc: (p: string) => SourceLoc): void {
  if (!isObject(v)) {
    ds.push(diag('LW600', "profile field 'sources' must be an object of field → source", loc(path)));
    return;
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
}
