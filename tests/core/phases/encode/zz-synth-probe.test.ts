import { it } from 'vitest';
import { encode } from '../../../../src/core/phases/encode/index.js';
import { synthesise } from '../../../../src/core/synthesise.js';
import { DEFAULT_PROFILE } from '../../../../src/core/physics/profile.js';
import { partsCost } from '../../../../src/core/phases/map/counts.js';
import { seededRandom } from '../../../../src/core/model/random.js';
import { tableMachine } from './machines.js';
it('probe', () => {
  const rng = seededRandom(5);
  const f = tableMachine('r16', 4, Array.from({ length: 16 }, () => Array.from({ length: 16 }, () => rng.int(16))));
  const cost = (codes: readonly string[], bits: number) => partsCost(synthesise(f, { strategy: 'x', bits, codes }, { profile: DEFAULT_PROFILE }).parts, DEFAULT_PROFILE.cost);
  const t0 = performance.now();
  let k = 0;
  for (const s of ['binary', 'gray', 'johnson', 'one-hot'] as const) {
    const e = encode(f, s).encoding!;
    const t = performance.now();
    console.log(s, cost(e.codes, e.bits), (performance.now() - t).toFixed(1), 'ms');
  }
  const t1 = performance.now();
  const r = encode(f, 'auto', { cost, budget: { evaluations: 100 } });
  console.log('auto100', r.search, ((performance.now() - t1) / 100).toFixed(2), 'ms/eval');
  // machine with 8 states 2 inputs
  const g = tableMachine('r8', 2, Array.from({ length: 8 }, () => Array.from({ length: 4 }, () => rng.int(8))));
  const cost2 = (codes: readonly string[], bits: number) => partsCost(synthesise(g, { strategy: 'x', bits, codes }, { profile: DEFAULT_PROFILE }).parts, DEFAULT_PROFILE.cost);
  const t2 = performance.now();
  const r2 = encode(g, 'auto', { cost: cost2 });
  console.log('auto8', r2.search, (performance.now() - t2).toFixed(0), 'ms');
  for (const s of ['binary', 'gray', 'johnson', 'one-hot'] as const) {
    const e = encode(g, s).encoding!;
    console.log(s, cost2(e.codes, e.bits));
  }
});
