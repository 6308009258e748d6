/**
 * The designer's remembered searches (src/web/worker/jobs.ts `codesPlan`, `standInSettings`,
 * src/web/controllers/search-memory.ts): a build whose search setup the page remembers takes
 * the remembered codes instead of searching, and must come out identical to the build a fresh
 * search gives — the same netlist JSON, part for part and cord for cord — on every example and
 * on cse, a machine of the MCNC / LGSynth'91 FSM benchmark set (16 states after minimisation).
 * The builder's last build taken again for a text with only comments added (`buildKey`,
 * `againFor`) must equal the build made afresh, diagnostics at their new lines included; the
 * checker's last checked build taken again (`checkKey`, `checkedAgain`) must equal the checks
 * run afresh.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  machineFromJson,
  netlistJson,
  printTextMachine,
  type Analysed,
  type EncodeResult,
} from '../../../src/core/index.js';
import { SearchMemory } from '../../../src/web/controllers/search-memory.js';
import {
  againFor,
  buildJob,
  buildKey,
  checkedAgain,
  checkJob,
  checkKey,
  codesPlan,
  readJob,
  standInSettings,
  toRemember,
} from '../../../src/web/worker/jobs.js';
import { searchOnTwoCores } from '../../../src/web/worker/search.js';
import { buildOptions } from '../../../src/web/worker/jobs.js';
import { DEFAULT_SETTINGS, type BuildView, type RememberedSearch } from '../../../src/web/worker/protocol.js';
import { EXAMPLES, examplePath } from '../../cli/support.js';

const CSE = 'tests/fixtures/lgsynth91/cse.json';

function cseText(): string {
  const m = machineFromJson(JSON.parse(readFileSync(CSE, 'utf8')) as unknown, CSE);
  if (!m.machine) throw new Error('cse must read');
  return printTextMachine(m.machine);
}

function analysed(text: string): Analysed {
  const a = readJob(text, 'm.lw').analysed;
  if (!a) throw new Error('must read');
  return a;
}

const netlist = (v: BuildView | undefined): string | undefined =>
  v && netlistJson(v.build, { placement: v.placement, profile: v.profile });

/**
 * Search as the builder does (here without a helper worker), remember the outcome as the page
 * does; also the whole outcome, with which the builder makes its final build.
 */
async function searchAndRemember(
  a: Analysed,
  memory: SearchMemory,
): Promise<RememberedSearch & { readonly whole: EncodeResult }> {
  const plan = codesPlan(a, DEFAULT_SETTINGS, memory.entries());
  if (plan.kind !== 'search') throw new Error(`expected a search, got ${plan.kind}`);
  const whole = await searchOnTwoCores(a, buildOptions(DEFAULT_SETTINGS));
  if (!whole) throw new Error('the search must finish');
  // The outcome crosses to the page and back by structured clone, without the search's minimisations.
  const kept = structuredClone(toRemember(plan.key, whole));
  expect('kept' in kept.outcome).toBe(false);
  memory.remember(kept);
  return { ...kept, whole };
}

const machines = [
  ...EXAMPLES.map((name) => ({ name, text: readFileSync(examplePath(name), 'utf8') })),
  { name: 'cse (LGSynth91)', text: cseText() },
];

describe('src/web/worker/jobs (remembered search outcomes)', () => {
  for (const m of machines)
    it(`${m.name}: a comment typed, the remembered codes build the same netlist as a fresh search`, async () => {
      const memory = new SearchMemory();
      const original = analysed(m.text);
      const kept = await searchAndRemember(original, memory);
      const typed = analysed(`# a note typed on top\n\n${m.text}\n# and one below\n`);
      const plan = codesPlan(typed, DEFAULT_SETTINGS, memory.entries());
      expect(plan.kind).toBe('remembered');
      if (plan.kind !== 'remembered') return;
      const reused = buildJob(typed, DEFAULT_SETTINGS, undefined, plan.outcome, 'remembered').view;
      const fresh = buildJob(typed, DEFAULT_SETTINGS).view; // buildMachine searches itself
      expect(reused?.codesFrom).toBe('remembered');
      expect(fresh?.codesFrom).toBe('searched');
      expect(reused?.build.encoding).toEqual(fresh?.build.encoding);
      expect(reused?.search).toEqual(fresh?.search);
      expect(netlist(reused)).toBe(netlist(fresh));
      expect(reused?.diagnostics).toEqual(fresh?.diagnostics);
      // The builder's last build, taken again for the typed text (no build at all): the same view, its
      // reading's diagnostics at their new lines.
      expect(buildKey(typed, DEFAULT_SETTINGS)).toBe(buildKey(original, DEFAULT_SETTINGS));
      const before = buildJob(original, DEFAULT_SETTINGS, undefined, kept.outcome, 'remembered').view;
      if (!before) throw new Error('must build');
      // The builder's own final build, from the whole outcome (the minimisations the search kept
      // seed its memo): the same netlist as from the outcome the page keeps.
      expect(netlist(buildJob(original, DEFAULT_SETTINGS, undefined, kept.whole).view)).toBe(netlist(before));
      expect(againFor(before, original.diagnostics.length, typed, DEFAULT_SETTINGS, 'remembered')).toEqual(reused);
      // The checker's last checked build, taken again for the typed text: the same as checking afresh.
      const kept2 = {
        ...DEFAULT_SETTINGS,
        encoding: { kept: before.build.encoding, states: before.build.machine.states },
      };
      expect(checkKey(typed, kept2)).toBe(checkKey(original, kept2));
      const checkedBefore = buildJob(original, kept2).built;
      const checkedTyped = buildJob(typed, kept2).built;
      if (!checkedBefore || !checkedTyped) throw new Error('must build');
      const c = checkJob(checkedBefore, DEFAULT_SETTINGS.seed).built;
      expect(checkedAgain(c, original.diagnostics.length, typed)).toEqual(
        checkJob(checkedTyped, DEFAULT_SETTINGS.seed).built,
      );
    }, 60_000);

  it('misses on a change of seed or unused codes, and named codes never search', async () => {
    const text = readFileSync(examplePath('lighthouse'), 'utf8');
    const a = analysed(text);
    const memory = new SearchMemory();
    await searchAndRemember(a, memory);
    expect(codesPlan(a, DEFAULT_SETTINGS, memory.entries()).kind).toBe('remembered');
    expect(codesPlan(a, { ...DEFAULT_SETTINGS, seed: 2 }, memory.entries()).kind).toBe('search');
    expect(codesPlan(a, { ...DEFAULT_SETTINGS, unusedCodes: 'dont-care' }, memory.entries()).kind).toBe('search');
    expect(codesPlan(a, { ...DEFAULT_SETTINGS, encoding: { strategy: 'gray' } }, memory.entries()).kind).toBe('named');
  });

  it('misses when one transition changes, and hits again when the edit is undone', async () => {
    const text = readFileSync(examplePath('marble-bell'), 'utf8');
    const edited = text.replace('  when marble go two', '  when marble go rung');
    expect(edited).not.toBe(text);
    const memory = new SearchMemory();
    await searchAndRemember(analysed(text), memory);
    expect(codesPlan(analysed(edited), DEFAULT_SETTINGS, memory.entries()).kind).toBe('search');
    await searchAndRemember(analysed(edited), memory);
    expect(codesPlan(analysed(text), DEFAULT_SETTINGS, memory.entries()).kind).toBe('remembered');
    expect(codesPlan(analysed(edited), DEFAULT_SETTINGS, memory.entries()).kind).toBe('remembered');
  });

  it('drafts with the codes shown before when they fit the states, else counting order', () => {
    const text = readFileSync(examplePath('marble-bell'), 'utf8');
    const a = analysed(text);
    const plan = codesPlan(a, DEFAULT_SETTINGS);
    if (plan.kind !== 'search') throw new Error('must search');
    const states = a.minimised.machine.states;
    const previous = { encoding: { strategy: 'gray', bits: 2, codes: ['00', '01', '11', '10'] }, states };
    const fits = standInSettings(a, DEFAULT_SETTINGS, plan.setup, previous);
    expect(fits.standIn).toBe('previous');
    expect(buildJob(a, fits.settings).view?.build.encoding.codes).toEqual(previous.encoding.codes);
    const other = standInSettings(a, DEFAULT_SETTINGS, plan.setup, { ...previous, states: [...states].reverse() });
    expect(other.standIn).toBe('binary');
    expect(standInSettings(a, DEFAULT_SETTINGS, plan.setup).standIn).toBe('binary');
    // A pinned code the previous codes break: counting order, which keeps pins.
    const pinned = { ...plan.setup, pinned: { [states[1]]: '11' } };
    expect(standInSettings(a, DEFAULT_SETTINGS, pinned, previous).standIn).toBe('binary');
  });
});
