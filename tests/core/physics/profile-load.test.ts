import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  cordRoutingDiagnostics,
  likelySlip,
  loadProfile,
  profileChanges,
  PROFILE_META_KEYS,
  PROFILE_RULES,
  SOURCE_KEYS,
} from '../../../src/core/physics/profile-load.js';
import { fanOut } from './netlists.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';

const readJson = (rel: string): Record<string, unknown> =>
  JSON.parse(readFileSync(new URL(rel, import.meta.url), 'utf8')) as Record<string, unknown>;
const defaultFile = readJson('../../../profiles/default.json');
const schema = readJson('../../../schemas/profile.schema.json') as {
  additionalProperties: boolean;
  properties: Record<string, Record<string, unknown>>;
  $defs: { routing: { properties: Record<string, Record<string, unknown>> } };
};

const errorsOf = (v: unknown) => loadProfile(v, 'shop.json').diagnostics;

describe('core/physics/profile-load', () => {
  it('gives the defaults for an empty override', () => {
    expect(loadProfile({})).toEqual({ profile: DEFAULT_PROFILE, diagnostics: [] });
  });

  it('keeps profiles/default.json equal to DEFAULT_PROFILE', () => {
    const { $schema, description, sources, ...values } = defaultFile;
    expect(typeof $schema).toBe('string');
    expect(typeof description).toBe('string');
    expect(typeof sources).toBe('object');
    expect(values).toEqual(DEFAULT_PROFILE);
    expect(Object.keys(values)).toEqual(Object.keys(DEFAULT_PROFILE));
    // Read as a file, it carries what it says of itself (for the build sheet) and nothing else.
    expect(loadProfile(defaultFile)).toEqual({
      profile: { ...DEFAULT_PROFILE, about: { description, sources } },
      diagnostics: [],
    });
  });

  it('gives every field of default.json a source, marking the design figures "common practice"', () => {
    const sources = defaultFile.sources as Record<string, string>;
    expect(Object.keys(sources).sort()).toEqual([...SOURCE_KEYS].sort());
    for (const s of Object.values(sources)) expect(s.trim().length).toBeGreaterThan(0);
    // Design §4: 15 g per port, two wraps, μ = 0.25, margin 2 are common practice.
    for (const k of ['portWeightG', 'wraps', 'mu', 'minMargin']) expect(sources[k]).toMatch(/^common practice/);
  });

  it('documents every field in docs/profile.md, with the same kind of source as default.json', () => {
    const doc = readFileSync(new URL('../../../docs/profile.md', import.meta.url), 'utf8');
    const sources = defaultFile.sources as Record<string, string>;
    for (const k of SOURCE_KEYS) {
      expect(doc, k).toContain(`\`${k}\``);
      if (k.startsWith('cost.')) continue; // the cost weights share one row
      const row = doc.split('\n').find((l) => l.startsWith(`| \`${k}\``));
      expect(row, k).toBeDefined();
      expect(row, k).toContain(sources[k].startsWith('estimate') ? 'estimate' : 'common practice');
    }
  });

  it('merges nested objects field by field', () => {
    const { profile } = loadProfile({ mu: 0.3, routing: { muPin: 0.35 }, cost: { gate: 9 } });
    expect(profile?.mu).toBe(0.3);
    expect(profile?.routing).toEqual({ ...DEFAULT_PROFILE.routing, muPin: 0.35 });
    expect(profile?.cost).toEqual({ ...DEFAULT_PROFILE.cost, gate: 9 });
    expect(profile?.wraps).toBe(2);
  });

  it('takes per-cord routing overrides', () => {
    const { profile, diagnostics } = loadProfile({ cordRouting: { 'c.φ1': { pulleys: 2 } } });
    expect(diagnostics).toEqual([]);
    expect(profile?.cordRouting).toEqual({ 'c.φ1': { pulleys: 2 } });
  });

  it('rejects unknown fields with LW601 and a did-you-mean hint', () => {
    const [d] = errorsOf({ mew: 0.3 });
    expect(d).toMatchObject({
      code: 'LW601',
      location: { file: 'shop.json', path: '$.mew' },
      hint: "did you mean 'mu'?",
    });
    expect(d.message).toContain("'mew'");
    const [n] = errorsOf({ routing: { pulley: 1 } });
    expect(n).toMatchObject({ code: 'LW601', location: { path: '$.routing.pulley' }, hint: "did you mean 'pulleys'?" });
    expect(n.message).toContain("'routing.pulley'");
    expect(errorsOf({ sources: { mue: 'estimate' } })[0]).toMatchObject({ code: 'LW601', hint: "did you mean 'mu'?" });
    expect(loadProfile({ mew: 0.3 }).profile).toBeUndefined();
  });

  it.each([
    ['portWeightG', -5],
    ['portWeightG', 0],
    ['zWeightG', 0],
    ['leverWeightG', -1],
    ['mu', 1.6],
    ['mu', 0],
    ['mu', -0.2],
    ['minMargin', 0.9],
    ['wraps', 0],
    ['wraps', -2],
    ['maxPortsPerGate', 2.5],
    ['maxPortsPerGate', 0],
    ['maxCordsPerPort', 0],
    ['stageDelaySpread', 1.2],
    ['stageDelaySpread', -0.1],
    ['stageDelayS', 0],
    ['stageDelayS', 7.5],
    ['drumRpm', 0],
    ['leverRatio', 0],
    ['operatorExtraG', -1],
    ['mu', '0.25'],
    ['wraps', null],
  ])('rejects %s = %j with LW600 naming the field', (field, value) => {
    const ds = errorsOf({ [field]: value });
    expect(ds).toHaveLength(1);
    expect(ds[0]).toMatchObject({
      code: 'LW600',
      severity: 'error',
      location: { file: 'shop.json', path: `$.${field}` },
    });
    expect(ds[0].message).toContain(`'${field}'`);
    expect(ds[0].hint).toBeTruthy();
  });

  // The unit slips of the issue that asked for these checks, each caught with a message naming it.
  it.each([
    ['drumRadiusM', 40, 'LW602', 'did you mean 0.04 (millimetres given as metres)?'],
    ['portWeightG', 0.015, 'LW602', 'did you mean 15 (kilograms given as grams)?'],
    ['zWeightG', 0.015, 'LW602', 'did you mean 15 (kilograms given as grams)?'],
    ['leverWeightG', 0.015, 'LW602', 'did you mean 15 (kilograms given as grams)?'],
    ['stageDelayS', 250, 'LW600', 'did you mean 0.25 (milliseconds given as seconds)?'],
    ['mu', 25, 'LW600', 'did you mean 0.25 (a percentage given as a fraction)?'],
    ['wrapPitchM', 8, 'LW602', 'did you mean 0.008 (millimetres given as metres)?'],
    ['drumRpm', 0.33, 'LW602', 'did you mean 19.8 (revolutions per second given as per minute)?'],
  ])('catches %s = %d as %s, naming the slip', (field, value, code, slip) => {
    const r = loadProfile({ [field]: value }, 'shop.json');
    expect(r.diagnostics).toHaveLength(1);
    const d = r.diagnostics[0];
    expect(d).toMatchObject({ code, location: { file: 'shop.json', path: `$.${field}` } });
    expect(`${d.message} ${d.hint}`).toContain(slip);
    // A warning keeps the value (it is allowed, only implausible); an error gives no profile.
    expect(r.profile === undefined).toBe(code === 'LW600');
  });

  it('names the slip over pins too: degrees given as radians', () => {
    const [d] = errorsOf({ routing: { pinAngleRad: 90 } });
    expect(d).toMatchObject({ code: 'LW602', location: { path: '$.routing.pinAngleRad' } });
    expect(d.message).toContain('did you mean 1.571 (degrees given as radians)?');
  });

  it('warns without guessing when no usual slip explains a value', () => {
    const [d] = errorsOf({ drumRadiusM: 0.5 });
    expect(d.code).toBe('LW602');
    expect(d.message).toBe("profile field 'drumRadiusM' is 0.5 m, outside the plausible 0.01–0.3 m");
    expect(d.hint).toMatch(/^plausible range: estimate/);
  });

  it('gives every numeric field a plausible range inside its allowed range, with a source, holding the default', () => {
    const at = (path: string): unknown =>
      path.split('.').reduce<unknown>((o, k) => (o as Record<string, unknown>)[k], DEFAULT_PROFILE);
    for (const [path, r] of Object.entries(PROFILE_RULES)) {
      expect(r.plausible.min, path).toBeLessThanOrEqual(r.plausible.max);
      expect(r.plausible.source, path).toMatch(/^(estimate|common practice)/);
      const v = at(path) as number;
      expect(v >= r.plausible.min && v <= r.plausible.max, `${path} = ${v}`).toBe(true);
      if (r.min !== undefined) expect(r.plausible.min, path).toBeGreaterThanOrEqual(r.min);
      if (r.max !== undefined) expect(r.plausible.max, path).toBeLessThanOrEqual(r.max);
      // Every field with a unit says it at the end of its name (G grams, M metres, S seconds …).
      const suffix = { g: 'G', m: 'M', s: 'S', rad: 'Rad', 'rev/min': 'Rpm' }[r.unit];
      if (suffix) expect(path.endsWith(suffix), path).toBe(true);
    }
    expect(likelySlip(40, PROFILE_RULES.drumRadiusM)).toBe('did you mean 0.04 (millimetres given as metres)?');
    expect(likelySlip(0.5, PROFILE_RULES.drumRadiusM)).toBeUndefined();
  });

  it('names a cordRouting key that matches no cord of the build (LW603), with a did-you-mean', () => {
    // The profile reference's example once routed 'c.phi1'; the φ1 lever's cord is 'c.clk.phi1'.
    const net = fanOut(2);
    const withPhi = { ...net, cords: [...net.cords, { id: 'c.clk.phi1', driver: 'L', ports: [], actuators: [] }] };
    const { profile } = loadProfile({ cordRouting: { 'c.phi1': { pulleys: 1 }, 'c.L': { pulleys: 1 } } }, 'shop.json');
    if (!profile) throw new Error('the profile must load');
    const ds = cordRoutingDiagnostics(profile, withPhi);
    expect(ds).toHaveLength(1);
    expect(ds[0]).toMatchObject({
      code: 'LW603',
      severity: 'error',
      location: { file: 'shop.json', path: '$.cordRouting["c.phi1"]' },
      hint: "did you mean 'c.clk.phi1'?",
    });
    expect(cordRoutingDiagnostics(DEFAULT_PROFILE, withPhi)).toEqual([]);
  });

  it('keeps the file, description and sources, and lists every changed value with its source', () => {
    const { profile } = loadProfile(
      {
        description: 'beech drum',
        mu: 0.22,
        frame: { turn: 'pin' },
        cordRouting: { 'c.clk.phi1': { pulleys: 1 } },
        sources: { mu: 'measured, lowest of five' },
      },
      'shop.json',
    );
    expect(profile?.about).toEqual({
      file: 'shop.json',
      description: 'beech drum',
      sources: { mu: 'measured, lowest of five' },
    });
    expect(profileChanges(profile ?? DEFAULT_PROFILE)).toEqual([
      { field: 'mu', value: '0.22', fallback: '0.25', source: 'measured, lowest of five' },
      { field: 'frame.turn', value: 'pin', fallback: 'pulley', source: undefined },
      { field: 'cordRouting.c.clk.phi1', value: '{"pulleys":1}', fallback: '—', source: undefined },
    ]);
    expect(profileChanges(DEFAULT_PROFILE)).toEqual([]);
  });

  it('rejects nested nonsense naming the nested field', () => {
    const ds = errorsOf({
      routing: { pulleyEfficiency: 1.5, pulleys: -1 },
      cordRouting: { c1: { muPin: 9 } },
      cost: { gate: -1 },
    });
    expect(ds.map((d) => d.location.path)).toEqual([
      '$.routing.pulleyEfficiency',
      '$.routing.pulleys',
      '$.cordRouting.c1.muPin',
      '$.cost.gate',
    ]);
    expect(ds.every((d) => d.code === 'LW600')).toBe(true);
    expect(ds[0].message).toContain("'routing.pulleyEfficiency'");
    expect(ds[2].message).toContain("'cordRouting.c1.muPin'");
  });

  it('treats names of built-in object members as unknown fields', () => {
    const ds = errorsOf(JSON.parse('{"toString": 1, "routing": {"__proto__": 2}, "cost": {"constructor": 3}}'));
    expect(ds.map((d) => [d.code, d.location.path])).toEqual([
      ['LW601', '$.toString'],
      ['LW601', '$.routing.__proto__'],
      ['LW601', '$.cost.constructor'],
    ]);
  });

  it('merges the frame geometry field by field, and checks it', () => {
    const { profile, diagnostics } = loadProfile({ frame: { longestDrumM: 0.9, turn: 'pin' } });
    expect(diagnostics).toEqual([]);
    expect(profile?.frame).toEqual({ ...DEFAULT_PROFILE.frame, longestDrumM: 0.9, turn: 'pin' });
    const ds = errorsOf({
      frame: { leverPitchM: 0, drumsPerFrame: 1.5, knotAllowanceM: -0.1, turn: 'pulleys', lever: 1 },
    });
    expect(ds.map((d) => [d.code, d.location.path])).toEqual([
      ['LW600', '$.frame.leverPitchM'],
      ['LW600', '$.frame.drumsPerFrame'],
      ['LW600', '$.frame.knotAllowanceM'],
      ['LW601', '$.frame.lever'],
      ['LW600', '$.frame.turn'],
    ]);
    expect(ds[4]).toMatchObject({ hint: "did you mean 'pulley'?" });
    expect(ds[4].message).toContain("'frame.turn'");
    expect(errorsOf({ frame: { turn: 3 } })[0]).toMatchObject({ code: 'LW600', location: { path: '$.frame.turn' } });
    expect(errorsOf({ frame: 'wide' })[0]).toMatchObject({ code: 'LW600', location: { path: '$.frame' } });
  });

  it('takes documentUnits "metric" or "inch", and gives LW600 at $.documentUnits with a hint for anything else', () => {
    expect(loadProfile({ documentUnits: 'inch' })).toEqual({
      profile: { ...DEFAULT_PROFILE, documentUnits: 'inch' },
      diagnostics: [],
    });
    expect(DEFAULT_PROFILE.documentUnits).toBe('metric');
    const bad = errorsOf({ documentUnits: 'inches' });
    expect(bad).toHaveLength(1);
    expect(bad[0]).toMatchObject({
      code: 'LW600',
      severity: 'error',
      location: { file: 'shop.json', path: '$.documentUnits' },
      hint: "did you mean 'inch'?",
    });
    expect(bad[0].message).toContain("'documentUnits'");
    // A word for the system rather than our name for it: the hint names the one it means.
    expect(errorsOf({ documentUnits: 'imperial' })[0].hint).toBe("did you mean 'inch'?");
    expect(errorsOf({ documentUnits: 'SI' })[0].hint).toBe("did you mean 'metric'?");
    // The wrong type: the same code and place, and a hint that says what the field is.
    for (const v of [3, true, null, ['inch'], { inch: 1 }]) {
      const [d] = errorsOf({ documentUnits: v });
      expect(d, JSON.stringify(v)).toMatchObject({ code: 'LW600', location: { path: '$.documentUnits' } });
      expect(d.hint, JSON.stringify(v)).toContain('"metric"');
    }
    expect(loadProfile({ documentUnits: 'furlong' }).profile).toBeUndefined();
    expect(profileChanges(loadProfile({ documentUnits: 'inch' }).profile!)).toEqual([
      { field: 'documentUnits', value: 'inch', fallback: 'metric', source: undefined },
    ]);
  });

  it('rejects a value that is not an object with LW100', () => {
    for (const v of [null, 3, 'mu', [1]]) expect(errorsOf(v)[0].code).toBe('LW100');
  });

  it('never throws, whatever JSON it is given (property)', () => {
    fc.assert(
      fc.property(
        fc.jsonValue(),
        fc.dictionary(
          fc.constantFrom(...Object.keys(DEFAULT_PROFILE), 'sources', 'mew', 'toString', '__proto__'),
          fc.jsonValue(),
        ),
        (a, b) => {
          loadProfile(a);
          const r = loadProfile(b);
          return r.profile !== undefined || r.diagnostics.length > 0;
        },
      ),
      { seed: 42, numRuns: 300 },
    );
  });

  it('states the same fields and ranges in schemas/profile.schema.json as the loader checks', () => {
    expect(schema.additionalProperties).toBe(false);
    expect(Object.keys(schema.properties).sort()).toEqual(
      [...Object.keys(DEFAULT_PROFILE), ...PROFILE_META_KEYS].sort(),
    );
    for (const [path, rule] of Object.entries(PROFILE_RULES)) {
      const [head, tail] = path.split('.');
      const prop =
        tail === undefined
          ? schema.properties[head]
          : head === 'routing'
            ? schema.$defs.routing.properties[tail]
            : (schema.properties[head].properties as Record<string, Record<string, unknown>>)[tail];
      expect(prop, path).toBeDefined();
      expect(prop.type, path).toBe(rule.integer ? 'integer' : 'number');
      expect(prop.minimum, path).toBe(rule.min !== undefined && !rule.exclusiveMin ? rule.min : undefined);
      expect(prop.exclusiveMinimum, path).toBe(rule.exclusiveMin ? rule.min : undefined);
      expect(prop.maximum, path).toBe(rule.max !== undefined && !rule.exclusiveMax ? rule.max : undefined);
      expect(prop.exclusiveMaximum, path).toBe(rule.exclusiveMax ? rule.max : undefined);
    }
  });
});
