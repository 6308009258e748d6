/**
 * cli/commands/build-common: `--shop-units metric|inch` over the profile's `documentUnits` for
 * one build; a word that is neither gives LW700 at the option with a did-you-mean hint, never a
 * stack trace.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { expectNoStack, removeTempDirs, run, tempDir } from '../support.js';

const MB = 'examples/marble-bell.lw';

afterAll(removeTempDirs);

describe('cli/commands/build-common', () => {
  it('writes the cut list in inches with --shop-units inch, over a profile that says metric', async () => {
    const dir = tempDir();
    const profile = join(dir, 'shop.json');
    writeFileSync(profile, JSON.stringify({ documentUnits: 'metric' }), 'utf8');
    const out = join(dir, 'docs');
    const r = await run([
      'build',
      MB,
      '--encoding',
      'binary',
      '--profile',
      profile,
      '--shop-units',
      'inch',
      '--out',
      out,
    ]);
    expect(r.code).toBe(0);
    const cut = readFileSync(join(out, 'cut-list.csv'), 'utf8');
    expect(cut.split('\r\n')[0]).toBe('group,item,piece,count,length (in),length (ft in),size,where,note');
    expect(readFileSync(join(out, 'cams.svg'), 'utf8')).toContain('4 in check bar');
    // The netlist stays SI.
    expect(readFileSync(join(out, 'netlist.json'), 'utf8')).toContain('"lengthM"');
  });

  it('refuses a system it does not know with LW700 at --shop-units and a hint', async () => {
    const r = await run(['build', MB, '--shop-units', 'imperial', '--json']);
    expect(r.code).toBe(2);
    expectNoStack(r);
    const doc = JSON.parse(r.out) as { diagnostics: { code: string; location: { path?: string }; hint?: string }[] };
    expect(doc.diagnostics[0]).toMatchObject({ code: 'LW700', location: { path: '--shop-units' } });
    expect(doc.diagnostics[0].hint).toContain('metric or inch');
    expect(JSON.stringify(doc.diagnostics[0])).toContain("did you mean 'inch'?");
  });

  it('gives the profile loader its say: a wrong documentUnits in --profile is LW600 at its place in the file', async () => {
    const dir = tempDir();
    const profile = join(dir, 'shop.json');
    writeFileSync(profile, '{\n  "documentUnits": "inches"\n}\n', 'utf8');
    const r = await run(['build', MB, '--profile', profile]);
    expect(r.code).toBe(2);
    expectNoStack(r);
    expect(r.err).toContain(`${profile}:2:20 $.documentUnits: error LW600`);
    expect(r.err).toContain("did you mean 'inch'?");
  });
});
