import { it } from 'vitest';
import { DEFAULT_PROFILE } from '../../src/core/physics/profile.js';
import { excite } from '../../src/core/phases/excite.js';
import { splitFunction } from '../../src/core/phases/guard.js';
import { minimiseOutputs } from '../../src/core/synthesise.js';
import { mapToParts } from '../../src/core/phases/map/index.js';
import { minimiseCover } from '../../src/core/phases/minimise-logic/index.js';
import { binaryEncoding, fixture } from './support/synthesis.js';
it('prof', () => {
  for (const name of ['lion', 'dk27', 'bbara', 'dk16', 'keyb']) {
    const f = fixture(name); const enc = binaryEncoding(f);
    const N = 20;
    let ex: any, sr: any, out: any;
    let t0 = performance.now();
    for (let i = 0; i < N; i++) ex = excite(f, enc);
    const te = (performance.now() - t0) / N;
    sr = minimiseCover(splitFunction(ex)); out = minimiseOutputs(ex, minimiseCover);
    t0 = performance.now();
    for (let i = 0; i < N; i++) mapToParts({ bits: enc.bits, inputs: f.inputs, outputs: f.outputs, startCode: enc.codes[f.start], sr, out, profile: DEFAULT_PROFILE });
    const tmap = (performance.now() - t0) / N;
    t0 = performance.now();
    for (let i = 0; i < N; i++) minimiseOutputs(ex, minimiseCover);
    const to = (performance.now() - t0) / N;
    console.log(name, 'excite', te.toFixed(3), 'map', tmap.toFixed(3), 'outputs-min', to.toFixed(2), 'ms');
  }
}, 120000);
