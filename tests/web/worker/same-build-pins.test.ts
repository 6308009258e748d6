/**
 * One behaviour: with parts kept in a bay (the frame view's pins) the designer and the command
 * line still build the same machine. Every example is built with an operator lever moved to
 * another bay and a latch (or, with no latch, a gate) kept at the visitor end: the command is
 * the one the code book shows for those settings (`commandLine`), read back by the command
 * line's own parser (`parseArgs`, `pinsFrom`) and run in-process with `--out`; the designer's
 * worker jobs build the same settings. The netlists (with the frame) and the build sheets must
 * be identical, byte for byte, with the same verdict of every check.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { netlistJson, type Placement } from '../../../src/core/index.js';
import { parseArgs } from '../../../src/cli/args.js';
import { pinsFrom } from '../../../src/cli/commands/build-common.js';
import { commandLine } from '../../../src/web/controllers/synthesis.js';
import { exportFile } from '../../../src/web/worker/exports.js';
import { buildJob, buildKey, checkJob, codesPlan, compareJob, readJob } from '../../../src/web/worker/jobs.js';
import { DEFAULT_SETTINGS, type BuildSettings } from '../../../src/web/worker/protocol.js';
import { EXAMPLES, examplePath, removeTempDirs, run, tempDir } from '../../cli/support.js';
import { expectCliVerdict } from './verdict.support.js';

afterAll(removeTempDirs);

/** The command line's flags (src/cli/main.ts), for reading the code book's command back. */
const SPEC = {
  values: ['encoding', 'profile', 'seed', 'unused', 'inputs', 'out'],
  switches: ['json', 'force', 'abstract', 'help', 'version'],
  lists: ['pin'],
};

/** The words of a command as a POSIX shell splits them (plain words and single-quoted ones, as commandLine writes). */
function shellWords(line: string): string[] {
  return [...line.matchAll(/'((?:[^']|'\\'')*)'|(\S+)/g)].map((m) => (m[1] ?? '').replace(/'\\''/g, "'") || m[2]);
}

/** An operator lever moved three bays (toward the visitor end when it can), and a latch (or a gate) kept in bays 1 and 2. */
function somePins(p: Placement): NonNullable<BuildSettings['pins']> {
  const lever = p.bays.find((b) => b.kind === 'lever');
  const latch = p.bays.find((b) => b.unit !== b.part);
  const gate = p.bays.find((b) => b.kind === 'gate');
  if (!lever || !gate) throw new Error('every example has an operator lever and a gate');
  // Bay 3 or past it: bays 1 and 2 are the other part's.
  const to = lever.bay >= 6 ? lever.bay - 3 : lever.bay + 3;
  return { [lever.part]: { bay: to }, [latch ? latch.unit : gate.part]: { bay: 1 } };
}

describe('src/web/worker (the same build as the command line, with parts kept in a bay)', () => {
  for (const name of EXAMPLES)
    it(`builds ${name} with pins exactly as \`latchwright build --pin\` does`, async () => {
      const file = examplePath(name);
      const a = readJob(readFileSync(file, 'utf8'), file).analysed;
      if (!a) throw new Error(`${name} must read`);
      const free = buildJob(a, DEFAULT_SETTINGS).view;
      if (!free) throw new Error(`${name} must build`);
      const pins = somePins(free.placement);
      const command = commandLine(file, { ...DEFAULT_SETTINGS, pins });
      const words = shellWords(command).slice(1);
      expect(words.filter((w) => w === '--pin')).toHaveLength(2);
      const read = pinsFrom(parseArgs(words, SPEC));
      if ('error' in read) throw new Error(read.error.message);
      expect(read.pins).toEqual(pins);
      const settings: BuildSettings = { ...DEFAULT_SETTINGS, pins: read.pins };

      const dir = tempDir();
      const cli = await run([...words, '--out', dir]);
      expect([0, 1], cli.err).toContain(cli.code);
      const b = buildJob(a, settings);
      if (!b.built || !b.view) throw new Error(`${name} must build in the worker`);
      // Each pin is kept, or the build says why not (LW708), as the command line does.
      for (const [part, pin] of Object.entries(pins)) {
        const bay = b.view.placement.bays.find((x) => x.part === part || x.unit === part);
        const why = b.view.diagnostics.some((d) => d.code === 'LW708' && d.location.path === `--pin ${part}`);
        expect(bay?.bay === pin.bay || why, `${name}: ${part} kept in bay ${pin.bay}`).toBe(true);
      }
      const frame = { placement: b.view.placement, profile: b.view.profile };
      expect(netlistJson(b.view.build, frame)).toBe(readFileSync(join(dir, 'netlist.json'), 'utf8'));
      const checked = checkJob(b.built, settings.seed);
      const sheet = exportFile(checked.built, 'build-sheet.html');
      expect('text' in sheet && sheet.text).toBe(readFileSync(join(dir, 'build-sheet.html'), 'utf8'));
      expectCliVerdict(name, checked.view.checks, cli.code);
    });

  it('searches the codes once: pins change the build key, never the search setup', () => {
    const file = examplePath('marble-bell');
    const a = readJob(readFileSync(file, 'utf8'), file).analysed;
    if (!a) throw new Error('marble-bell must read');
    const pinned: BuildSettings = { ...DEFAULT_SETTINGS, pins: { rst: { bay: 5 } } };
    const plain = codesPlan(a, DEFAULT_SETTINGS);
    if (plain.kind !== 'search') throw new Error('the default encoding searches');
    const again = codesPlan(a, pinned, [{ key: plain.key, outcome: { diagnostics: [] } }]);
    expect(again.kind).toBe('remembered');
    expect(buildKey(a, pinned)).not.toBe(buildKey(a, DEFAULT_SETTINGS));
    expect(buildKey(a, { ...DEFAULT_SETTINGS, pins: { rst: { bay: 6 } } })).not.toBe(buildKey(a, pinned));
  });

  it('reports a pin of a part the machine no longer has with the command line’s LW707, its place and hint', async () => {
    const file = examplePath('marble-bell');
    const a = readJob(readFileSync(file, 'utf8'), file).analysed;
    if (!a) throw new Error('marble-bell must read');
    const b = buildJob(a, { ...DEFAULT_SETTINGS, pins: { 'in.marbel': { bay: 3 } } });
    expect(b.view).toBeUndefined();
    const d = b.diagnostics.find((x) => x.code === 'LW707');
    expect(d?.location.path).toBe('--pin in.marbel');
    expect(d?.hint).toBe("did you mean 'in.marble'?");
    const cli = await run(['build', file, '--pin', 'in.marbel=3']);
    expect(cli.code).not.toBe(0);
    expect(cli.err).toContain('LW707');
    expect(cli.err).toContain(d?.message ?? '—');
    expect(cli.err).toContain("did you mean 'in.marble'?");
  });

  it('compares the encodings without the pins, as `latchwright compare` takes none', async () => {
    const file = examplePath('odd-lever');
    const a = readJob(readFileSync(file, 'utf8'), file).analysed;
    if (!a) throw new Error('odd-lever must read');
    const rows = compareJob(a, { ...DEFAULT_SETTINGS, pins: { 'in.gone': { bay: 2 } } });
    expect(rows.map((r) => [r.strategy, r.ok, r.cost])).toEqual(
      compareJob(a, DEFAULT_SETTINGS).map((r) => [r.strategy, r.ok, r.cost]),
    );
    expect(rows.some((r) => r.ok)).toBe(true);
    const cli = await run(['compare', file, '--json']);
    expect(cli.code, cli.err).toBe(0);
  });
});
