import { it } from 'vitest';
import { excite } from '../../src/core/phases/excite.js';
import { splitFunction, unguardedFunction } from '../../src/core/phases/guard.js';
import { minimiseCover } from '../../src/core/phases/minimise-logic/index.js';
import { randomEncoding, randomMachine } from './support/synthesis.js';
it('prof', () => {
  const fs = [];
  for (let seed = 0; seed < 25; seed++) {
    const f = randomMachine(seed * 7919, { maxStates: 6, maxInputs: 3, maxOutputs: 0, incomplete: true });
    const bits = Math.max(1, Math.ceil(Math.log2(f.states.length))) + (seed % 2);
    const ex = excite(f, randomEncoding(f, bits, seed));
    fs.push(splitFunction(ex), unguardedFunction(ex));
  }
  for (let rep = 0; rep < 3; rep++) {
    for (const method of ['auto', 'heuristic', 'exact'] as const) {
      const t0 = performance.now();
      for (const f of fs) minimiseCover(f, { method });
      console.log(rep, method, ((performance.now() - t0) / fs.length).toFixed(2), 'ms/call');
    }
  }
  let worst = 0, wf;
  for (const f of fs) { const t0 = performance.now(); minimiseCover(f); const t = performance.now() - t0; if (t > worst) { worst = t; wf = f; } }
  console.log('worst', worst, wf!.vars, wf!.on.map(x => x.length), wf!.dc.map(x => x.length));
});
