/** Builds for the check tests: the examples of examples/ built by the pipeline, and the broken fixtures. */
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { SpecInfo } from '../../../src/core/checks/spec.js';
import type { Build } from '../../../src/core/model/build.js';
import { analyse, buildMachine, type BuildOptions } from '../../../src/core/pipeline.js';

const root = fileURLToPath(new URL('../../../', import.meta.url));

/** Names of the example machines (examples/*.lw). */
export function exampleNames(): string[] {
  return readdirSync(join(root, 'examples'))
    .filter((f) => f.endsWith('.lw'))
    .map((f) => f.slice(0, -3))
    .sort();
}

/** Build an example without running the pipeline's checks; binary codes unless told otherwise. */
export function exampleBuild(name: string, opts: BuildOptions = {}): { build: Build; spec: SpecInfo } {
  const file = join(root, 'examples', `${name}.lw`);
  const a = analyse(readFileSync(file, 'utf8'), file);
  if (!a.ok) throw new Error(`example ${name} does not parse`);
  const b = buildMachine(a, { encoding: 'binary', ...opts, checks: false });
  if (!b.ok) throw new Error(`example ${name} does not build`);
  return { build: b.build, spec: { original: a.flat, merged: a.minimised.merged } };
}

/** A deliberately broken build from tests/fixtures/broken/. */
export function brokenBuild(name: string): Build {
  return JSON.parse(readFileSync(join(root, 'tests', 'fixtures', 'broken', `${name}.json`), 'utf8')) as Build;
}
