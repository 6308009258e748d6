/**
 * Checking a cover against its function, on cubes (no minterm enumeration): for every
 * function j, each on-set cube must lie in the union of the terms feeding j, and each term
 * feeding j must lie in on_j ∪ dc_j. Both are cube-in-cover tests, answered by the tautology
 * of a cofactor (Brayton et al., "Logic Minimization Algorithms for VLSI Synthesis", Kluwer
 * 1984, ch. 3).
 */
import { type BCube, makeSpace, parseInput } from './bitcube.js';
import { cubeCovered } from './unate.js';
import type { MultiFunction, SopCover } from './types.js';

/** Is `c` a correct cover of `f`? On failure, `problem` names the function and cube. */
export function verifyCover(f: MultiFunction, c: SopCover): { ok: boolean; problem?: string } {
  const m = f.on.length;
  if (c.vars !== f.vars) return { ok: false, problem: `cover has ${c.vars} variables, function has ${f.vars}` };
  if (c.functions !== m) return { ok: false, problem: `cover has ${c.functions} functions, function has ${m}` };
  const sp = makeSpace(f.vars, 1);
  const parse = (s: string): BCube | string =>
    s.length !== f.vars ? `cube '${s}' has ${s.length} positions, expected ${f.vars}` : tryParse(s);
  const tryParse = (s: string): BCube | string => {
    try {
      return parseInput(sp, s);
    } catch (e) {
      return (e as Error).message;
    }
  };
  const feeds: BCube[][] = Array.from({ length: m }, () => []);
  for (const t of c.terms) {
    const cube = parse(t.cube);
    if (typeof cube === 'string') return { ok: false, problem: cube };
    for (const j of t.outputs) {
      if (!Number.isInteger(j) || j < 0 || j >= m)
        return { ok: false, problem: `term ${t.cube} feeds unknown function ${j}` };
      feeds[j].push(cube);
    }
  }
  for (let j = 0; j < m; j++) {
    const on: BCube[] = [];
    for (const s of f.on[j]) {
      const x = parse(s);
      if (typeof x === 'string') return { ok: false, problem: x };
      on.push(x);
    }
    const allowed = on.slice();
    for (const s of f.dc[j] ?? []) {
      const x = parse(s);
      if (typeof x === 'string') return { ok: false, problem: x };
      allowed.push(x);
    }
    for (let i = 0; i < on.length; i++)
      if (!cubeCovered(sp, feeds[j], on[i]))
        return { ok: false, problem: `function ${j}: on-set cube ${f.on[j][i]} is not covered` };
    for (const t of c.terms)
      if (t.outputs.includes(j) && !cubeCovered(sp, allowed, parseInput(sp, t.cube)))
        return { ok: false, problem: `function ${j}: term ${t.cube} reaches the off-set` };
  }
  return { ok: true };
}
