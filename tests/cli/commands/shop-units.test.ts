/**
 * `build --shop-units`: every figure a person reads follows the workshop's units, across every
 * document and the printed report, for every example.
 *
 * Metric: every document, the printed report and `--json` are byte for byte what they were
 * before inch figures reached the check summaries, the wiring list and the bill of materials'
 * notes (SHA-256 digests stored in tests/fixtures/documents/metric-digests.json, made
 * from main at that time; `LW_UPDATE_EXPECTED=1` rewrites them, to be reviewed).
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, it } from 'vitest';
import { expectStoredDigests } from '../../core/export/support.js';
import { EXAMPLES, examplePath, removeTempDirs, run, tempDir } from '../support.js';

const DIGESTS = 'tests/fixtures/documents/metric-digests.json';

/** Build `name` with `units` into a fresh folder: the printed report and every file written. */
async function built(name: string, units: 'metric' | 'inch'): Promise<{ report: string; files: Map<string, string> }> {
  const dir = tempDir('lw-units-');
  const r = await run(['build', examplePath(name), '--shop-units', units, '--out', dir]);
  const files = new Map(readdirSync(dir).map((f) => [f, readFileSync(join(dir, f), 'utf8')]));
  return { report: r.out.replaceAll(dir, '<out>'), files };
}

afterAll(removeTempDirs);

describe('src/cli/commands/build (--shop-units)', () => {
  it('writes every metric document, the printed report and --json byte for byte as before (stored digests)', async () => {
    const all: Record<string, string> = {};
    for (const name of EXAMPLES) {
      const m = await built(name, 'metric');
      all[`${name}/report`] = m.report;
      for (const [file, text] of [...m.files].sort(([a], [b]) => a.localeCompare(b))) all[`${name}/${file}`] = text;
      all[`${name}/--json`] = (await run(['build', examplePath(name), '--json'])).out;
    }
    expectStoredDigests(DIGESTS, all);
  }, 300_000);
});
