/**
 * Our two-level minimiser against espresso-iisojs (an independent Espresso-II) on the same
 * random 10-variable single-output functions with don't-cares (fixed seed): time as a ratio
 * measured in the same run, and the term and literal totals of both.
 */
import { espresso } from 'espresso-iisojs';
import { minimiseSop } from '../src/core/phases/minimise-logic/index.js';
import { literalCount, mintermString } from '../src/core/model/cube.js';
import { seededRandom } from '../src/core/model/random.js';
import { median as medianMs } from './median.js';

const VARS = 10;
const FUNCTIONS = 20;

interface Fn {
  readonly on: string[];
  readonly dc: string[];
}

function randomFunctions(seed: number): Fn[] {
  const rnd = seededRandom(seed);
  return Array.from({ length: FUNCTIONS }, () => {
    const on: string[] = [];
    const dc: string[] = [];
    for (let m = 0; m < 2 ** VARS; m++) {
      const r = rnd.next();
      if (r < 0.4) on.push(mintermString(m, VARS));
      else if (r < 0.5) dc.push(mintermString(m, VARS));
    }
    return { on, dc };
  });
}

/** A cube string as espresso-iisojs literals: (var << 1) | 1 for a positive literal, var << 1 for a negative one. */
function toLiterals(c: string): number[] {
  const out: number[] = [];
  for (let v = 0; v < c.length; v++) if (c[v] !== '-') out.push((v << 1) | (c[v] === '1' ? 1 : 0));
  return out;
}


export async function benchMinimiseLogic(): Promise<{ markdown: string }> {
  const fns = randomFunctions(2026);
  let oursTerms = 0, oursLits = 0, refTerms = 0, refLits = 0;
  const ours = medianMs(3, () => {
    oursTerms = oursLits = 0;
    for (const f of fns) {
      const c = minimiseSop(f.on, f.dc, VARS);
      oursTerms += c.length;
      for (const t of c) oursLits += literalCount(t);
    }
  });
  const onL = fns.map((f) => f.on.map(toLiterals));
  const dcL = fns.map((f) => f.dc.map(toLiterals));
  const ref = medianMs(3, () => {
    refTerms = refLits = 0;
    fns.forEach((_, i) => {
      const r = espresso(onL[i], dcL[i]);
      refTerms += r.length;
      for (const t of r) refLits += t.length;
    });
  });
  const markdown = [
    `${FUNCTIONS} random single-output functions of ${VARS} variables (about 40 % on-set, 10 % don't-care; seed 2026), median of 3 runs:`,
    '',
    '| minimiser | time | product terms | literals |',
    '|---|---|---|---|',
    `| ours (minimiseSop, method auto) | ${ours.toFixed(0)} ms | ${oursTerms} | ${oursLits} |`,
    `| espresso-iisojs (Espresso-II) | ${ref.toFixed(0)} ms | ${refTerms} | ${refLits} |`,
    `| ratio ours / reference | ${(ours / ref).toFixed(2)}× (goal ≤ 2×) | ${(oursTerms / refTerms).toFixed(3)} | ${(oursLits / refLits).toFixed(3)} |`,
  ].join('\n');
  return { markdown };
}
