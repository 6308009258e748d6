/**
 * One behaviour: with the workshop's own profile the designer and the command line still build
 * the same machine. Every example is built both ways with the guide's slippery cord
 * (examples/profiles/slippery-cord.json: μ = 0.12) — `latchwright build FILE --profile P --out DIR`
 * run in-process, and the designer's worker jobs with the page's settings carrying the same
 * file — and the netlists (with the frame) and the build sheets must be identical, byte for byte,
 * with the same verdict of every check. The archive of every document carries the profile file,
 * which the core's loader reads back to the same profile.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { strFromU8, unzipSync } from 'fflate';
import { loadProfile, netlistJson } from '../../../src/core/index.js';
import { exportFile } from '../../../src/web/worker/exports.js';
import { buildJob, buildKey, checkJob, codesPlan, readJob } from '../../../src/web/worker/jobs.js';
import { profileFileText } from '../../../src/web/worker/profile-file.js';
import { ALL_DOCUMENTS, DEFAULT_SETTINGS, type BuildSettings } from '../../../src/web/worker/protocol.js';
import { EXAMPLES, examplePath, removeTempDirs, run, tempDir } from '../../cli/support.js';
import { expectCliVerdict } from './verdict.support.js';

afterAll(removeTempDirs);

const PROFILE = 'examples/profiles/slippery-cord.json';
const settings: BuildSettings = {
  ...DEFAULT_SETTINGS,
  profile: { name: PROFILE, value: JSON.parse(readFileSync(PROFILE, 'utf8')) as Record<string, unknown> },
};

describe('src/web/worker (the same build as the command line, with a profile of the workshop)', () => {
  for (const name of EXAMPLES)
    it(`builds ${name} with ${PROFILE} exactly as \`latchwright build --profile\` does`, async () => {
      const file = examplePath(name);
      const dir = tempDir();
      const cli = await run(['build', file, '--profile', PROFILE, '--out', dir]);
      expect([0, 1], cli.err).toContain(cli.code);
      const a = readJob(readFileSync(file, 'utf8'), file).analysed;
      if (!a) throw new Error(`${name} must read`);
      const b = buildJob(a, settings);
      if (!b.built || !b.view) throw new Error(`${name} must build in the worker`);
      expect(b.view.profile.mu).toBe(0.12);
      const frame = { placement: b.view.placement, profile: b.view.profile };
      expect(netlistJson(b.view.build, frame)).toBe(readFileSync(join(dir, 'netlist.json'), 'utf8'));
      const checked = checkJob(b.built, settings.seed);
      const sheet = exportFile(checked.built, 'build-sheet.html');
      expect('text' in sheet && sheet.text).toBe(readFileSync(join(dir, 'build-sheet.html'), 'utf8'));
      const checks = checked.view.checks;
      expectCliVerdict(name, checks, cli.code);
    });

  it('never takes codes searched for the shipped profile: the search setup key names the profile', () => {
    const file = examplePath('marble-bell');
    const a = readJob(readFileSync(file, 'utf8'), file).analysed;
    if (!a) throw new Error('marble-bell must read');
    const plain = codesPlan(a, DEFAULT_SETTINGS);
    const own = codesPlan(a, settings);
    if (plain.kind !== 'search' || own.kind !== 'search') throw new Error('the default encoding searches');
    expect(own.key).not.toBe(plain.key);
    expect(codesPlan(a, settings, [{ key: plain.key, outcome: { diagnostics: [] } }]).kind).toBe('search');
    expect(buildKey(a, settings)).not.toBe(buildKey(a, DEFAULT_SETTINGS));
  });

  it('puts the profile file in the archive of every document; the core reads it back to the same profile', () => {
    const file = examplePath('marble-bell');
    const a = readJob(readFileSync(file, 'utf8'), file).analysed;
    if (!a) throw new Error('marble-bell must read');
    const b = buildJob(a, settings);
    if (!b.built || !settings.profile) throw new Error('marble-bell must build');
    const checked = checkJob(b.built, settings.seed);
    const extra = { 'slippery-cord.json': profileFileText(settings.profile) };
    const zip = exportFile(checked.built, ALL_DOCUMENTS, extra);
    if (!('bytes' in zip)) throw new Error('the archive is bytes');
    const files = unzipSync(zip.bytes);
    const text = strFromU8(files['slippery-cord.json']);
    const back = loadProfile(JSON.parse(text), PROFILE);
    expect(back.diagnostics).toEqual([]);
    expect(back.profile).toEqual(b.view?.profile);
    // Without a profile of its own, the archive holds the documents only.
    const plain = exportFile(checked.built, ALL_DOCUMENTS);
    if (!('bytes' in plain)) throw new Error('the archive is bytes');
    expect(Object.keys(unzipSync(plain.bytes)).some((f) => f.endsWith('slippery-cord.json'))).toBe(false);
  });
});
