/**
 * Every machine of the MCNC / LGSynth'91 FSM benchmark set (open dataset; provenance in
 * tests/fixtures/lgsynth91/PROVENANCE.md) builds with every check passing. Twenty-odd of them
 * are incompletely specified; their compatible-state reductions may send the machine to any
 * compatible state, which the equivalence check must accept.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ENCODINGS } from '../../../src/core/phases/encode/index.js';
import { analyse, buildMachine, type Analysed } from '../../../src/core/pipeline.js';
import { findCheck } from '../../../src/core/checks/results.js';
import { DEFAULT_PROFILE, type Profile } from '../../../src/core/physics/profile.js';

const dir = new URL('../../fixtures/lgsynth91/', import.meta.url);
const names = readdirSync(dir)
  .filter((f) => f.endsWith('.json'))
  .map((f) => f.slice(0, -5))
  .sort();

/**
 * The larger machines need more drums than one frame of the shipped profile carries (s298:
 * 84 drums of 1.5 m), which the layout check rightly reports; here every frame may carry as
 * many drums as the machine needs, and every other layout rule and every margin must hold.
 */
const MANY_DRUMS: Profile = { ...DEFAULT_PROFILE, frame: { ...DEFAULT_PROFILE.frame, drumsPerFrame: 1000 } };

function analysed(name: string): Analysed {
  const a = analyse(readFileSync(new URL(`${name}.json`, dir), 'utf8'), `${name}.json`);
  if (!a.ok) throw new Error(`${name} does not analyse: ${a.diagnostics.map((d) => d.message).join('; ')}`);
  return a;
}

describe("core/checks on the LGSynth'91 benchmark machines", () => {
  it('has all 53 machines of the set', () => {
    expect(names).toHaveLength(53);
  });

  it.each(names)('%s builds with binary codes and passes every check', (name) => {
    const b = buildMachine(analysed(name), { encoding: 'binary', profile: MANY_DRUMS });
    if (!b.ok) throw new Error(`${name} does not build: ${b.diagnostics.map((d) => d.message).join('; ')}`);
    const failing = b.checks.filter((c) => !c.ok).map((c) => `${c.name}: ${c.summary}`);
    expect(failing).toEqual([]);
  });

  // These five used to fail the equivalence check with every encoding: the check expected the
  // code of the merged state, where the reduction may go to any compatible one.
  it.each(['beecount', 'ex2', 'ex3', 'ex5', 'ex7'])('%s passes the equivalence check with every encoding', (name) => {
    const a = analysed(name);
    expect(a.minimised.method).toBe('compatibility');
    for (const encoding of ENCODINGS.filter((e) => e !== 'pinned')) {
      const b = buildMachine(a, { encoding });
      if (!b.ok) throw new Error(`${name} does not build with ${encoding}`);
      const eq = findCheck(b.checks, 'equivalence');
      expect(eq?.summary).toMatch(/^the build behaves as the machine as written, wherever it is specified/);
      expect({ encoding, ok: eq?.ok, complete: eq?.complete, inputs: eq?.inputs }).toEqual({
        encoding,
        ok: true,
        complete: true,
        inputs: 'exhaustive',
      });
    }
  });
});
