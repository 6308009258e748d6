/**
 * The public entry as another program sees it: the package imported by its name
 * (`import('latchwright')`, which Node resolves through package.json `exports` to the build
 * output dist/core/index.js), in a child Node process, as `npm install` leaves it. The build
 * output is refreshed first when any source is newer (`npm run build`, i.e. tsc with
 * tsconfig.build.json), so the test never reads a stale dist/.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import * as entry from '../../src/core/index.js';

const ROOT = join(import.meta.dirname, '..', '..');
const BUILT = join(ROOT, 'dist', 'core', 'index.js');

interface Package {
  main: string;
  types: string;
  exports: Record<string, { types: string; import: string }>;
}
const pkg = JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as Package & { name: string };

/** Newest modification time of the sources the build output is made from. */
function newestSource(): number {
  const files = ['src/core', 'src/cli'].flatMap((d) =>
    readdirSync(join(ROOT, d), { recursive: true, withFileTypes: true })
      .filter((e) => e.isFile() && e.name.endsWith('.ts'))
      .map((e) => join(e.parentPath, e.name)),
  );
  files.push(join(ROOT, 'tsconfig.json'), join(ROOT, 'tsconfig.build.json'));
  return Math.max(...files.map((f) => statSync(f).mtimeMs));
}

/** Run Node on an ES module given as text, in the package's folder; its standard output parsed as JSON. */
function node(script: string): { status: number | null; json?: unknown; stderr: string } {
  const r = spawnSync(process.execPath, ['--input-type=module', '-e', script], { cwd: ROOT, encoding: 'utf8' });
  return { status: r.status, stderr: r.stderr, ...(r.status === 0 ? { json: JSON.parse(r.stdout) as unknown } : {}) };
}

beforeAll(() => {
  if (existsSync(BUILT) && statSync(BUILT).mtimeMs >= newestSource()) return;
  const tsc = join(ROOT, 'node_modules', 'typescript', 'bin', 'tsc');
  const r = spawnSync(process.execPath, [tsc, '-p', 'tsconfig.build.json'], { cwd: ROOT, encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`npm run build failed:\n${r.stdout}${r.stderr}`);
});

describe('core/index', () => {
  it('package.json points main, types and exports at the build output of src/core/index.ts', () => {
    expect(pkg.name).toBe('latchwright');
    expect(pkg.main).toBe('dist/core/index.js');
    expect(pkg.types).toBe('dist/core/index.d.ts');
    expect(pkg.exports).toEqual({ '.': { types: './dist/core/index.d.ts', import: './dist/core/index.js' } });
    expect(existsSync(BUILT)).toBe(true);
    expect(existsSync(join(ROOT, 'dist', 'core', 'index.d.ts'))).toBe(true);
  });

  it('imported by name, the built package builds an example as the CLI does (stored expected build)', () => {
    // The stored expected build of the marble bell (tests/fixtures/expected, reviewed when it changes).
    const expected = JSON.parse(readFileSync(join(ROOT, 'tests/fixtures/expected/marble-bell.json'), 'utf8')) as {
      encoding: { strategy: string; codes: Record<string, string> };
      parts: Record<string, number>;
      checks: { name: string; ok: boolean }[];
    };
    const r = node(`
      import { readFileSync } from 'node:fs';
      const lw = await import('latchwright');
      const a = lw.analyse(readFileSync('examples/marble-bell.lw', 'utf8'), 'marble-bell.lw');
      if (!a.ok) throw new Error('did not read');
      const b = lw.buildMachine(a);
      if (!b.ok) throw new Error('did not build');
      const f = b.build.machine;
      console.log(JSON.stringify({
        encoding: b.build.encoding.strategy,
        codes: Object.fromEntries(f.states.map((s, i) => [s, b.build.encoding.codes[i]])),
        parts: b.build.parts,
        checks: b.checks.map((c) => ({ name: c.name, ok: c.ok })),
        documents: [...lw.buildDocuments(b).keys()],
        names: Object.keys(lw).sort(),
      }));
    `);
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    const got = r.json as {
      encoding: string;
      codes: Record<string, string>;
      parts: Record<string, number>;
      checks: { name: string; ok: boolean }[];
      documents: string[];
      names: string[];
    };
    expect(got.encoding).toBe(expected.encoding.strategy);
    expect(got.codes).toEqual(expected.encoding.codes);
    expect(got.parts).toEqual(expected.parts);
    expect(got.checks).toEqual(expected.checks);
    expect(got.documents).toEqual([...entry.DOCUMENT_FILES]);
    // The built package offers exactly what src/core/index.ts exports (the build is not stale).
    expect(got.names).toEqual(Object.keys(entry).sort());
  });

  it('keeps deep paths closed: only the entry is exported', () => {
    const r = node(`
      try {
        await import('latchwright/dist/core/pipeline.js');
        console.log(JSON.stringify('opened'));
      } catch (e) {
        console.log(JSON.stringify(e.code));
      }
    `);
    expect(r.json).toBe('ERR_PACKAGE_PATH_NOT_EXPORTED');
  });

  it('offers each purpose of the public API by name', () => {
    const names = Object.keys(entry);
    const purposes = {
      parse: ['readMachine', 'printTextMachine', 'machineToJson', 'importXstate', 'exportXstate'],
      analyse: ['analyse'],
      build: ['buildMachine'],
      compare: ['compareEncodings'],
      check: [
        'runChecks',
        'checkEquivalence',
        'checkForbiddenInput',
        'checkRecovery',
        'checkTiming',
        'checkDrive',
        'checkLayout',
      ],
      frame: ['place', 'route', 'lossByBranch', 'auditPlacement', 'frameSvg', 'camsSvg', 'cutListRows', 'partWords'],
      simulate: ['createRunner', 'stepPart', 'runPartScript', 'stepAbstract'],
      documents: ['buildDocuments', 'DOCUMENT_REGISTRY', 'DOCUMENT_MAKERS', 'buildReport'],
      encodings: ['encode', 'ENCODING_REGISTRY', 'ENCODING_RUNS'],
      profile: ['loadProfile', 'DEFAULT_PROFILE'],
      behaviours: ['BEHAVIOURS', 'BEHAVIOUR_WRITERS', 'writeBehaviour'],
    };
    for (const [purpose, wanted] of Object.entries(purposes))
      for (const w of wanted) expect(names, `${purpose}: ${w}`).toContain(w);
  });
});
