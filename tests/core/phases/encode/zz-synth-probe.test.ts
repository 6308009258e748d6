import { it } from 'vitest';
import { readFileSync } from 'node:fs';
import { encode } from '../../../../src/core/phases/encode/index.js';
import { synthesise } from '../../../../src/core/synthesise.js';
import { analyse } from '../../../../src/core/pipeline.js';
import { DEFAULT_PROFILE } from '../../../../src/core/physics/profile.js';
import { partsCost } from '../../../../src/core/phases/map/counts.js';
it('probe', () => {
  for (const name of ['bbara', 'dk512', 'dk27', 's386', 'ex4', 'dk16', 'bbsse', 'tav', 'lion9', 'train11']) {
    const a = analyse(readFileSync(`tests/fixtures/lgsynth91/${name}.json`, 'utf8'), name);
    if (!a.ok) { console.log(name, 'rejected'); continue; }
    const f = a.minimised.machine;
    const cost = (codes: readonly string[], bits: number) => partsCost(synthesise(f, { strategy: 'x', bits, codes }, { profile: DEFAULT_PROFILE }).parts, DEFAULT_PROFILE.cost);
    const line: string[] = [`${name} n=${f.states.length} i=${f.inputs.length}`];
    for (const s of ['binary', 'gray', 'johnson', 'one-hot'] as const) {
      const e = encode(f, s).encoding!;
      const t = performance.now();
      const c = cost(e.codes, e.bits);
      line.push(`${s}=${c} (${(performance.now() - t).toFixed(0)}ms)`);
    }
    const t1 = performance.now();
    const r = encode(f, 'auto', { cost, budget: { evaluations: 204 } });
    line.push(`auto204=${r.search?.bestCost} ${r.search?.method} ${((performance.now() - t1) / (r.search?.evaluations ?? 1)).toFixed(1)}ms/eval`);
    console.log(line.join(' '));
  }
});
