/**
 * The workshop's profile in the page: every value is judged by the core's own loader (the
 * codes and hints of docs/profile.md), the build keeps the last good profile while a bad value
 * stands in the form, and what is saved names only what differs from the shipped defaults plus
 * the sources, and reads back through the loader to the same profile. The guide's scenario
 * (examples/profiles/slippery-cord.json, μ = 0.12) is the file opened.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { host } from './host.support.js';
import { DEFAULT_PROFILE, loadProfile } from '../../../src/core/index.js';
import { PROFILE_RULES } from '../../../src/core/physics/index.js';
import {
  documentUnitsOf,
  fieldFacts,
  fieldWords,
  otherFields,
  parseStoredProfile,
  readProfileFile,
  typedValue,
  UNITS_CHOICES,
  unitsRaw,
  withCordRoute,
  withValue,
  WORKSHOP_FIELDS,
  WorkshopController,
} from '../../../src/web/controllers/workshop.js';
import { commandLine, isDefault } from '../../../src/web/controllers/synthesis.js';
import { profileFileText, savedValue } from '../../../src/web/worker/profile-file.js';
import { DEFAULT_SETTINGS, type ProfileSetting } from '../../../src/web/worker/protocol.js';

const SLIPPERY = readFileSync('examples/profiles/slippery-cord.json', 'utf8');

function form(initial?: ProfileSetting) {
  const told: (ProfileSetting | undefined)[] = [];
  const w = new WorkshopController(host(), initial, (s) => told.push(s));
  return { w, told };
}

describe('src/web/controllers/workshop', () => {
  it('offers the figures that matter most, each a field the core knows, with its unit and ranges from the core', () => {
    for (const f of WORKSHOP_FIELDS) expect(PROFILE_RULES[f.path], f.path).toBeDefined();
    // docs/profile.md, Fields: μ has no unit, > 0 and ≤ 1.5, plausible 0.05–0.8, default 0.25.
    expect(fieldFacts('mu')).toEqual({
      unit: '',
      range: 'greater than 0, at most 1.5',
      plausible: '0.05–0.8',
      fallback: 0.25,
    });
    // docs/profile.md, The frame: drums per frame, a whole number ≥ 1, default 2.
    expect(fieldFacts('frame.drumsPerFrame')).toMatchObject({ unit: 'count', range: 'a whole number, at least 1' });
    expect(fieldFacts('drumRadiusM')).toMatchObject({ unit: 'm', fallback: 0.04 });
  });

  it('offers every other figure of the profile, each named in the words of docs/profile.md', () => {
    const words = fieldWords(readFileSync('docs/profile.md', 'utf8'));
    const others = otherFields(words);
    // The form's two parts together hold every field the core's rules know, each once.
    const all = [...WORKSHOP_FIELDS.map((f) => f.path), ...others.map((f) => f.path)];
    expect(new Set(all).size).toBe(all.length);
    expect([...all].sort()).toEqual(Object.keys(PROFILE_RULES).sort());
    // Every one has words of the reference's own table: its first sentence, as a heading (no full stop).
    for (const path of Object.keys(PROFILE_RULES)) expect(words.get(path), path).toMatch(/^[A-Z].*[^.]$/);
    // docs/profile.md, Fields: the stage time, and a row naming all six cost weights.
    expect(others.find((f) => f.path === 'stageDelayS')?.label).toBe(
      'Time for one gate stage: lever swing plus cord take-up',
    );
    expect(others.find((f) => f.path === 'cordBranchM')?.label).toBe(
      'Length allowed per cord branch where a build has no placement',
    );
    expect(others.find((f) => f.path === 'cost.capstan')?.label).toBe(
      'Relative effort per part kind, used by the automatic encoding search to compare builds: capstan',
    );
  });

  it('builds with a good value at once, and keeps the last good profile while a bad one stands (LW600 with its hint)', () => {
    const { w, told } = form();
    w.edit('mu', '0.12');
    expect(told).toEqual([{ name: 'workshop-profile.json', value: { mu: 0.12 } }]);
    w.edit('mu', '25');
    // docs/profile.md: "a percentage given as a fraction (`mu: 25`)" is an error that names the slip.
    expect(told).toHaveLength(1);
    expect(w.good?.value).toEqual({ mu: 0.12 });
    const [d] = w.problemsAt('mu');
    expect(d.code).toBe('LW600');
    expect(d.location).toEqual({ file: 'workshop-profile.json', path: '$.mu' });
    expect(d.hint).toContain('did you mean 0.25 (a percentage given as a fraction)?');
    // Text that is no number goes to the loader as typed, which refuses it.
    w.edit('frame.drumsPerFrame', 'two');
    expect(w.problemsAt('frame.drumsPerFrame')[0].code).toBe('LW600');
    w.edit('frame.drumsPerFrame', '');
    w.edit('mu', '0.2');
    expect(w.problems).toEqual([]);
    expect(told.at(-1)?.value).toEqual({ mu: 0.2 });
  });

  it('shows a plausibility warning (LW602) but builds with the value', () => {
    const { w, told } = form();
    w.edit('drumRadiusM', '-1');
    expect(w.problemsAt('drumRadiusM')[0].code).toBe('LW600');
    expect(told).toHaveLength(0);
    // docs/profile.md, "Units, ranges and slips": 40 m is allowed but not plausible, and names the slip.
    w.edit('drumRadiusM', '40');
    const [d] = w.problemsAt('drumRadiusM');
    expect(d).toMatchObject({ code: 'LW602', severity: 'warning' });
    expect(d.message).toContain('did you mean 0.04 (millimetres given as metres)?');
    expect(told.at(-1)?.value).toEqual({ drumRadiusM: 40 });
  });

  it('opens a profile file as the command line reads it; a broken one changes nothing and says why', () => {
    const { w, told } = form();
    expect(w.open(SLIPPERY, 'slippery-cord.json')).toBe(true);
    expect(told).toHaveLength(1);
    expect(w.good?.name).toBe('slippery-cord.json');
    expect(loadProfile(w.good?.value, 'slippery-cord.json').profile?.mu).toBe(0.12);
    // An unknown field: LW601 with a did-you-mean (docs/profile.md).
    expect(w.open('{ "muu": 0.2 }', 'typo.json')).toBe(false);
    expect(w.problems[0]).toMatchObject({ code: 'LW601', hint: "did you mean 'mu'?" });
    expect(w.good?.name).toBe('slippery-cord.json');
    expect(w.open('{ "mu": ', 'cut.json')).toBe(false);
    expect(w.problems[0].code).toBe('LW100');
    expect(told).toHaveLength(1);
  });

  it('fills in sources, and goes back to the shipped defaults in one step', () => {
    const { w, told } = form();
    w.edit('wraps', '3');
    w.source('wraps', 'three turns fit our drum');
    expect(w.good?.value).toEqual({ wraps: 3, sources: { wraps: 'three turns fit our drum' } });
    w.source('wraps', '');
    expect(w.good?.value).toEqual({ wraps: 3 });
    w.reset();
    expect(w.good).toBeUndefined();
    expect(told.at(-1)).toBeUndefined();
    expect(w.draft.value).toEqual({});
  });

  it('saves only the fields that differ from the defaults, plus sources; the loader reads it back to the same profile', () => {
    const value = withValue(
      withValue(
        {
          $schema: '../schemas/profile.schema.json',
          description: 'our shop',
          mu: 0.2,
          wraps: DEFAULT_PROFILE.wraps,
          routing: { muPin: DEFAULT_PROFILE.routing.muPin },
          cordRouting: {},
          sources: { mu: 'measured, lowest of five', wraps: 'the shipped two turns, checked on our drum' },
        },
        'frame.longestDrumM',
        1.2,
      ),
      'frame.drumsPerFrame',
      DEFAULT_PROFILE.frame.drumsPerFrame,
    );
    const saved = savedValue(value);
    expect(saved).toEqual({
      description: 'our shop',
      mu: 0.2,
      frame: { longestDrumM: 1.2 },
      sources: { mu: 'measured, lowest of five', wraps: 'the shipped two turns, checked on our drum' },
    });
    const setting: ProfileSetting = { name: 'shop.json', value };
    const text = profileFileText(setting);
    const back = readProfileFile(text, 'shop.json');
    expect(back.diagnostics).toEqual([]);
    // Blank sources are left out of the file (the loader would refuse them).
    expect(savedValue({ mu: 0.2, sources: { mu: '  ' } })).toEqual({ mu: 0.2 });
    const a = loadProfile(value, 'shop.json').profile;
    const b = loadProfile(JSON.parse(text), 'shop.json').profile;
    expect(a).toBeDefined();
    expect(b).toEqual(a);
    expect(b?.frame.longestDrumM).toBe(1.2);
  });

  it('keeps in storage only a profile the loader accepts', () => {
    const good = JSON.stringify({ name: 'slippery-cord.json', value: JSON.parse(SLIPPERY) as unknown });
    expect(parseStoredProfile(good)?.name).toBe('slippery-cord.json');
    for (const bad of [
      '{',
      'null',
      '{"name": "shop.json", "value": {"mu": 25}}',
      '{"name": "../shop.json", "value": {"mu": 0.2}}',
      '{"name": "shop.json", "value": [1]}',
    ])
      expect(parseStoredProfile(bad), bad).toBeUndefined();
  });

  it('reads a typed figure: empty keeps the default, a number is a number, other text goes to the loader', () => {
    expect(typedValue(' ')).toBeUndefined();
    expect(typedValue('0.12')).toBe(0.12);
    expect(typedValue('1e-1')).toBe(0.1);
    expect(typedValue('abc')).toBe('abc');
  });

  it('makes the status say own settings and names the profile on the command line (src/cli: --profile FILE)', () => {
    const s = { ...DEFAULT_SETTINGS, profile: { name: 'slippery-cord.json', value: { mu: 0.12 } } };
    expect(isDefault(s)).toBe(false);
    expect(commandLine('ferry-gate.lw', s)).toBe('latchwright build ferry-gate.lw --profile slippery-cord.json');
    expect(commandLine('a.lw', { ...s, profile: { name: 'our shop.json', value: {} } })).toBe(
      "latchwright build a.lw --profile 'our shop.json'",
    );
  });

  it("sets one cord's own route from the frame as its cordRouting entry (docs/profile.md), and clears it", () => {
    const { w, told } = form();
    // Cord ids hold dots: the entry is set by key, never as a dotted path.
    w.route('c.clk.phi1', { pulleys: '1', pinAngleRad: '1.5708' });
    expect(w.draft.value).toEqual({ cordRouting: { 'c.clk.phi1': { pulleys: 1, pinAngleRad: 1.5708 } } });
    expect(told.at(-1)?.value).toEqual(w.draft.value);
    // The file saved (and put in the archive) carries it; the core's loader reads it back.
    const back = loadProfile(JSON.parse(profileFileText(w.draft)), 'workshop-profile.json');
    expect(back.diagnostics).toEqual([]);
    expect(back.profile?.cordRouting).toEqual({ 'c.clk.phi1': { pulleys: 1, pinAngleRad: 1.5708 } });
    // One figure left empty keeps the computed one; a value the loader refuses stays in the form, unused.
    expect(withCordRoute({ mu: 0.2 }, 'c.in.coin', { pulleys: '', pinAngleRad: '0.5' })).toEqual({
      mu: 0.2,
      cordRouting: { 'c.in.coin': { pinAngleRad: 0.5 } },
    });
    w.route('c.in.coin', { pulleys: '-1', pinAngleRad: '' });
    expect(w.problems.some((d) => d.code === 'LW600' && d.location.path === '$.cordRouting.c.in.coin.pulleys')).toBe(
      true,
    );
    expect(told.at(-1)?.value).toEqual({ cordRouting: { 'c.clk.phi1': { pulleys: 1, pinAngleRad: 1.5708 } } });
    w.route('c.in.coin', undefined);
    w.route('c.clk.phi1', undefined);
    expect(w.draft.value).toEqual({});
    expect(told.at(-1)).toBeUndefined();
  });

  it('offers the units of the papers the core knows, leaving the field out for metric (the default) and saving inch', () => {
    expect(UNITS_CHOICES.map((c) => c.units)).toEqual(['metric', 'inch']);
    const { w, told } = form();
    w.edit('documentUnits', unitsRaw('inch'));
    expect(w.draft.value).toEqual({ documentUnits: 'inch' });
    expect(w.problems).toEqual([]);
    expect(told.at(-1)?.value).toEqual({ documentUnits: 'inch' });
    expect(documentUnitsOf(w.draft.value)).toBe('inch');
    expect(JSON.parse(profileFileText(w.draft))).toEqual({ documentUnits: 'inch' });
    w.edit('documentUnits', unitsRaw('metric'));
    expect(w.draft.value).toEqual({});
    expect(told.at(-1)).toBeUndefined();
    // A file with a word the loader refuses: its code at the field, and the choice shows metric.
    w.open('{ "documentUnits": "imperial" }', 'shop.json');
    expect(w.problemsAt('documentUnits').map((d) => d.code)).toEqual(['LW600']);
    expect(documentUnitsOf({ documentUnits: 'imperial' })).toBe('metric');
  });
});
