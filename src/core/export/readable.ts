/**
 * Cubes as expressions a person reads, in the machine notation's own operators (`!` binds
 * tighter than `&`, which binds tighter than `|`): `q0 & !q1 & marble | red`. For display the
 * cubes of one cover are first widened as far as the cover allows (the "expand" step of
 * Espresso-II: R. K. Brayton et al., *Logic Minimization Algorithms for VLSI Synthesis*,
 * Kluwer 1984, ch. 4 — each literal is dropped when the larger cube still lies inside the
 * cover) and absorbed, so `1-`, `01` reads `a | b`, not `a | !a & b`. The widened cover has
 * exactly the same minterms, apart from input combinations the machine declares never to
 * occur, which a guard may be read to include or not: it changes the words, never the
 * behaviour.
 */
import { absorb, coverContains, type Cube, type CubeList } from '../model/cube.js';

/** One product term: `1` for the empty product, else literals joined by ` & `. */
export function cubeExpr(cube: Cube, vars: readonly string[]): string {
  const lits: string[] = [];
  for (let i = 0; i < cube.length; i++) if (cube[i] !== '-') lits.push(cube[i] === '1' ? vars[i] : `!${vars[i]}`);
  return lits.length === 0 ? '1' : lits.join(' & ');
}

/** Covers larger than this are shown as they are (widening costs a subtraction per literal). */
const WIDEN_LIMIT = 64;

/**
 * The cover with every cube widened inside the cover plus the don't-care cubes `dc` (input
 * combinations that never occur), absorbed, in a stable order.
 */
export function widen(cover: CubeList, dc: CubeList = []): Cube[] {
  if (cover.length === 0 || cover.length + dc.length > WIDEN_LIMIT) return [...cover];
  const room = [...cover, ...dc];
  const out = cover.map((c) => {
    let cube = c;
    for (let i = 0; i < cube.length; i++) {
      if (cube[i] === '-') continue;
      const wider = cube.slice(0, i) + '-' + cube.slice(i + 1);
      if (coverContains(room, [wider])) cube = wider;
    }
    return cube;
  });
  return absorb(out).sort((a, b) => (a < b ? 1 : a > b ? -1 : 0));
}

/**
 * A sum of products: `0` when empty, `1` when some term is the constant 1. Widened for
 * display unless `widen` is false; `dc` are combinations that never occur (widening may use them).
 */
export function coverExpr(
  cover: CubeList,
  vars: readonly string[],
  opts: { readonly widen?: boolean; readonly dc?: CubeList } = {},
): string {
  const cubes = opts.widen === false ? [...cover] : widen(cover, opts.dc);
  if (cubes.length === 0) return '0';
  const terms = cubes.map((c) => cubeExpr(c, vars));
  return terms.includes('1') ? '1' : terms.join(' | ');
}

/** A number with at most `digits` decimals, trailing zeros dropped; ∞ for Infinity. */
export function num(x: number, digits = 2): string {
  if (x === Infinity) return '∞';
  if (!Number.isFinite(x)) return String(x);
  return String(Math.round(x * 10 ** digits) / 10 ** digits);
}

/** Join parts with `sep`, breaking into lines of about `width` characters; a broken line keeps the trimmed separator at its end. */
export function wrapJoined(parts: readonly string[], sep: string, width: number): string[] {
  const lines: string[] = [];
  let cur = '';
  for (const part of parts) {
    const next = cur === '' ? part : `${cur}${sep}${part}`;
    if (cur !== '' && next.length > width) {
      lines.push(`${cur}${sep.trimEnd()}`);
      cur = part;
    } else cur = next;
  }
  if (cur !== '') lines.push(cur);
  return lines;
}

/** Split a long ` | `-joined expression into lines of about `width` characters. */
export function wrapExpr(expr: string, width: number): string[] {
  return wrapJoined(expr.split(' | '), ' | ', width);
}
