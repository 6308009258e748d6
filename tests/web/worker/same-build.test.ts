/**
 * One behaviour: the designer and the command line build the same machine from the same file.
 * Every example is built both ways — `latchwright build FILE --out DIR` run in-process, and
 * the designer's worker jobs with the page's starting settings (DEFAULT_SETTINGS, taken from
 * the core's BUILD_DEFAULTS) — and the netlists must be identical, part for part and cord for
 * cord, with the same codes and the same verdict of every check; the checker, handed the
 * builder's build through the page, finds the same checks.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import {
  BUILD_DEFAULTS,
  DEFAULT_ENCODING,
  DEFAULT_PROFILE,
  DOCUMENT_REGISTRY,
  netlistJson,
} from '../../../src/core/index.js';
import { exportFile } from '../../../src/web/worker/exports.js';
import { buildJob, builtForChecks, checkJob, readJob } from '../../../src/web/worker/jobs.js';
import { DEFAULT_SETTINGS } from '../../../src/web/worker/protocol.js';
import { EXAMPLES, examplePath, removeTempDirs, run, tempDir } from '../../cli/support.js';
import { expectCliVerdict } from './verdict.support.js';

afterAll(removeTempDirs);

describe('src/web/worker (the same build as the command line)', () => {
  it('starts from the core’s build defaults: the searched codes, seed, profile, unused codes left to the pipeline', () => {
    expect(DEFAULT_SETTINGS).toEqual({ encoding: { strategy: BUILD_DEFAULTS.encoding }, seed: BUILD_DEFAULTS.seed });
    expect(BUILD_DEFAULTS.encoding).toBe(DEFAULT_ENCODING);
    expect(BUILD_DEFAULTS.profile).toBe(DEFAULT_PROFILE);
    expect('unusedCodes' in DEFAULT_SETTINGS).toBe(false);
  });

  for (const name of EXAMPLES)
    it(`builds ${name} exactly as \`latchwright build\` does`, async () => {
      const file = examplePath(name);
      const dir = tempDir();
      const cli = await run(['build', file, '--out', dir]);
      expect([0, 1], cli.err).toContain(cli.code);
      const a = readJob(readFileSync(file, 'utf8'), file).analysed;
      if (!a) throw new Error(`${name} must read`);
      const b = buildJob(a, DEFAULT_SETTINGS);
      if (!b.built || !b.view) throw new Error(`${name} must build in the worker`);
      // netlist.json carries the frame too: every part's bay, every branch's run and length.
      const frame = { placement: b.view.placement, profile: b.view.profile };
      expect(netlistJson(b.view.build, frame)).toBe(readFileSync(join(dir, 'netlist.json'), 'utf8'));
      const checked = checkJob(b.built, DEFAULT_SETTINGS.seed);
      const checks = checked.view.checks;
      // The checker checks the builder's build as the page hands it over, copied twice by
      // structured clone (builder → page → checker; HTML Living Standard, "structured clone"),
      // with its own reading of the text: the same checks, result for result.
      const { build, placement, profile, diagnostics } = structuredClone(structuredClone(b.view));
      const again = readJob(readFileSync(file, 'utf8'), file).analysed;
      if (!again) throw new Error(`${name} must read again`);
      const handed = checkJob(builtForChecks(again, { build, placement, profile, diagnostics }), DEFAULT_SETTINGS.seed);
      expect(handed.view.checks).toEqual(checks);
      // And the documents made from it are the same, byte for byte.
      for (const d of DOCUMENT_REGISTRY)
        expect(exportFile(handed.built, d.file), d.file).toEqual(exportFile(checked.built, d.file));
      expectCliVerdict(name, checks, cli.code);
    });
});
