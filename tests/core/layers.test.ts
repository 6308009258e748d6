/**
 * The layer rule of CONVENTIONS.md, enforced on every import in src/ and bench/:
 *
 *   model ← forms, physics, behaviours ← phases ← sim ← checks ← pipeline ← export, report ← index ← cli, web
 *
 * A module may import from its own layer or from a layer below it, never from a layer above
 * nor from a peer (layers at the same height, like forms and physics, or export and report,
 * do not import each other: a helper both need moves down). Type-only imports count too: a
 * type is part of a layer's vocabulary. The shells (cli, web) and the benchmarks reach the
 * core only through its public entry (src/core/index.ts) or an area's barrel
 * (src/core/<area>/index.ts).
 */
import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join, normalize, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = normalize(join(import.meta.dirname, '..', '..'));

/** Each layer by the paths it holds (first match wins), and its height: a layer imports only lower ones. */
const LAYERS: readonly { readonly name: string; readonly height: number; readonly holds: RegExp }[] = [
  { name: 'model', height: 0, holds: /^src\/core\/model\// },
  { name: 'forms', height: 1, holds: /^src\/core\/forms\// },
  { name: 'physics', height: 1, holds: /^src\/core\/physics\// },
  // Behaviours write machines in the text form from a few parameters; they need only the model.
  { name: 'behaviours', height: 1, holds: /^src\/core\/behaviours\// },
  { name: 'phases', height: 2, holds: /^src\/core\/phases\// },
  { name: 'sim', height: 3, holds: /^src\/core\/sim\// },
  { name: 'checks', height: 4, holds: /^src\/core\/checks\// },
  // The pipeline layer: the one list of phases and the synthesis wiring it calls.
  { name: 'pipeline', height: 5, holds: /^src\/core\/(pipeline|synthesise|search)\.ts$/ },
  { name: 'export', height: 6, holds: /^src\/core\/export\// },
  { name: 'report', height: 6, holds: /^src\/core\/report\.ts$/ },
  // The public entry re-exports every layer of the core and nothing else.
  { name: 'index', height: 7, holds: /^src\/core\/index\.ts$/ },
  { name: 'cli', height: 8, holds: /^src\/cli\// },
  { name: 'web', height: 8, holds: /^src\/web\// },
  { name: 'bench', height: 9, holds: /^bench\// },
];

/**
 * Imports that break the rule today, each with the reason and the change that removes it. An
 * entry that no longer matches any import is fine (the fix has landed); remove it then.
 */
const KNOWN_EXCEPTIONS: readonly { readonly from: string; readonly to: string; readonly why: string }[] = [];

/** What a shell may import from the core: the public entry or an area's barrel. */
const CORE_DOOR = /^src\/core\/(.+\/)?index\.ts$/;

interface Import {
  readonly from: string;
  readonly to: string;
  readonly line: number;
  readonly text: string;
}

function tsFiles(dir: string): string[] {
  return readdirSync(join(ROOT, dir), { withFileTypes: true, recursive: true })
    .filter((e) => e.isFile() && e.name.endsWith('.ts'))
    .map((e) => relative(ROOT, join(e.parentPath, e.name)).split('\\').join('/'))
    .sort();
}

/** `import … from '…'`, `export … from '…'`, `import '…'` and `import('…')`, with their line. */
const IMPORT =
  /(?:^|[\s;])(?:import|export)\s[^'";]*?\sfrom\s*['"]([^'"]+)['"]|(?:^|[\s;])import\s*['"]([^'"]+)['"]|\bimport\(\s*['"]([^'"]+)['"]\s*\)/gm;

function importsOf(file: string): Import[] {
  const text = readFileSync(join(ROOT, file), 'utf8');
  const out: Import[] = [];
  for (const m of text.matchAll(IMPORT)) {
    const spec = m[1] ?? m[2] ?? m[3];
    if (!spec.startsWith('.')) continue; // a package, not a module of ours
    const target = normalize(join(dirname(file), spec.replace(/\?.*$/, '')))
      .split('\\')
      .join('/')
      .replace(/\.js$/, '.ts');
    const line = text.slice(0, m.index).split('\n').length + (m[0].startsWith('\n') ? 1 : 0);
    out.push({ from: file, to: target, line, text: m[0].trim().replace(/\s+/g, ' ') });
  }
  return out;
}

const layerOf = (path: string) => LAYERS.find((l) => l.holds.test(path));

/** Why an import breaks the layer rule, or undefined when it keeps it. */
function breach(i: Import): string | undefined {
  const from = layerOf(i.from);
  const to = layerOf(i.to);
  if (!from || !to || from.name === to.name) return undefined;
  if (to.height > from.height) return `${from.name} imports from ${to.name}, a layer above it`;
  if (to.height === from.height) return `${from.name} imports from its peer ${to.name}`;
  return undefined;
}

const ALL = [...tsFiles('src'), ...tsFiles('bench')].flatMap(importsOf);
const where = (i: Import): string => `${i.from}:${i.line} ${i.text}`;
const excepted = (i: Import): boolean => KNOWN_EXCEPTIONS.some((e) => e.from === i.from && e.to === i.to);

describe('core/layers', () => {
  it('reads the imports of every module (the reader finds the ones it must)', () => {
    expect(ALL.length).toBeGreaterThan(300);
    // Each form the reader must understand, seen in a file of ours.
    const has = (from: string, to: string): boolean => ALL.some((i) => i.from === from && i.to === to);
    expect(has('src/core/pipeline.ts', 'src/core/synthesise.ts')).toBe(true); // import { … } from
    expect(has('src/core/index.ts', 'src/core/pipeline.ts')).toBe(true); // export { … } from
    expect(has('src/web/main.ts', 'src/web/elements/app.ts')).toBe(true); // import '…'
    // Every module of src/ is in a layer.
    expect(tsFiles('src').filter((f) => !layerOf(f))).toEqual([]);
  });

  it('no module imports from a layer above it or from a peer', () => {
    const breaches = ALL.filter((i) => !excepted(i)).flatMap((i) => {
      const why = breach(i);
      return why ? [`${where(i)} — ${why}`] : [];
    });
    expect(breaches).toEqual([]);
  });

  it('the known exceptions are real breaches, each with its reason (so none hides a legal import)', () => {
    for (const e of KNOWN_EXCEPTIONS) expect(e.why.length).toBeGreaterThan(20);
    for (const i of ALL.filter(excepted)) expect(breach(i), where(i)).toBeDefined();
  });

  it('the CLI, the web designer and the benchmarks reach the core only through its entry or a barrel', () => {
    const shells = ALL.filter((i) => /^(src\/cli|src\/web|bench)\//.test(i.from) && i.to.startsWith('src/core/'));
    expect(shells.length).toBeGreaterThan(20);
    expect(shells.filter((i) => !CORE_DOOR.test(i.to)).map(where)).toEqual([]);
  });

  it('the rule itself: a breach upward or across is caught, an import downward is not', () => {
    const at = (from: string, to: string): Import => ({ from, to, line: 1, text: '' });
    expect(breach(at('src/core/physics/bom.ts', 'src/core/export/csv.ts'))).toMatch(/layer above/);
    expect(breach(at('src/core/forms/json.ts', 'src/core/physics/profile.ts'))).toMatch(/peer/);
    expect(breach(at('src/core/report.ts', 'src/core/export/csv.ts'))).toMatch(/peer/);
    expect(breach(at('src/cli/main.ts', 'src/web/serve.ts'))).toMatch(/peer/);
    expect(breach(at('src/core/checks/timing.ts', 'src/core/sim/part.ts'))).toBeUndefined();
    expect(breach(at('src/core/export/index.ts', 'src/core/pipeline.ts'))).toBeUndefined();
    expect(breach(at('src/core/phases/encode/index.ts', 'src/core/phases/encode/registry.ts'))).toBeUndefined();
  });
});
