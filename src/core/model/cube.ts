/**
 * Cubes in positional notation: a string of '0', '1' and '-' with one character per
 * variable (the notation of the Berkeley PLA format and of Brayton et al., "Logic
 * Minimization Algorithms for VLSI Synthesis", 1984). A list of cubes is a cover (a sum of
 * products). Everything here is pure and works without enumerating minterms, so machines
 * with 20+ inputs stay fast.
 */

/** One product term: one character per variable, '0' | '1' | '-'. */
export type Cube = string;
/** A sum of products. */
export type CubeList = readonly Cube[];

/** The cube with every variable free (the constant 1). */
export function universe(n: number): Cube {
  return '-'.repeat(n);
}

/** Intersection of two cubes, or null when they are disjoint. */
export function intersect(a: Cube, b: Cube): Cube | null {
  let out = '';
  for (let i = 0; i < a.length; i++) {
    const x = a.charCodeAt(i);
    const y = b.charCodeAt(i);
    if (x === y || y === 45 /* - */) out += a[i];
    else if (x === 45) out += b[i];
    else return null;
  }
  return out;
}

/** True when the two cubes share at least one minterm. */
export function overlaps(a: Cube, b: Cube): boolean {
  for (let i = 0; i < a.length; i++) {
    const x = a.charCodeAt(i);
    const y = b.charCodeAt(i);
    if (x !== y && x !== 45 && y !== 45) return false;
  }
  return true;
}

/** True when cube a contains cube b (every minterm of b is in a). */
export function contains(a: Cube, b: Cube): boolean {
  for (let i = 0; i < a.length; i++) {
    const x = a.charCodeAt(i);
    if (x !== 45 && x !== b.charCodeAt(i)) return false;
  }
  return true;
}

/** Number of fixed (non '-') positions. */
export function literalCount(c: Cube): number {
  let n = 0;
  for (let i = 0; i < c.length; i++) if (c.charCodeAt(i) !== 45) n++;
  return n;
}

/** Does the cube hold for this full assignment (a string of '0'/'1')? */
export function holds(c: Cube, assignment: string): boolean {
  for (let i = 0; i < c.length; i++) {
    const x = c.charCodeAt(i);
    if (x !== 45 && x !== assignment.charCodeAt(i)) return false;
  }
  return true;
}

/** Does any cube of the cover hold for the assignment? */
export function coverHolds(cover: CubeList, assignment: string): boolean {
  for (const c of cover) if (holds(c, assignment)) return true;
  return false;
}

/**
 * Disjoint sharp a # b: cubes covering a minus b, pairwise disjoint
 * (the "disjoint sharp" of Hong, Cain & Ostapko, IBM J. Res. Dev. 1974).
 */
export function sharp(a: Cube, b: Cube): Cube[] {
  if (!overlaps(a, b)) return [a];
  const out: Cube[] = [];
  let rest = a;
  for (let i = 0; i < a.length; i++) {
    const bc = b[i];
    if (bc === '-' || rest[i] !== '-') continue;
    // rest is free here, b is fixed: split off the half that b does not touch.
    const off = bc === '0' ? '1' : '0';
    out.push(rest.slice(0, i) + off + rest.slice(i + 1));
    rest = rest.slice(0, i) + bc + rest.slice(i + 1);
  }
  return out; // what is left in rest lies inside b
}

/** A cover minus a cover, as pairwise-disjoint cubes when `from` is disjoint. */
export function subtract(from: CubeList, minus: CubeList): Cube[] {
  let cur: Cube[] = [...from];
  for (const m of minus) {
    const next: Cube[] = [];
    for (const c of cur) for (const d of sharp(c, m)) next.push(d);
    cur = next;
    if (cur.length === 0) break;
  }
  return cur;
}

/** Intersection of two covers. */
export function intersectCovers(a: CubeList, b: CubeList): Cube[] {
  const out: Cube[] = [];
  for (const x of a)
    for (const y of b) {
      const z = intersect(x, y);
      if (z !== null) out.push(z);
    }
  return absorb(out);
}

/** Complement of a cover over n variables. */
export function complement(cover: CubeList, n: number): Cube[] {
  return subtract([universe(n)], cover);
}

/** Drop cubes contained in another cube of the list (single-cube containment). */
export function absorb(cover: CubeList): Cube[] {
  const sorted = [...new Set(cover)].sort((a, b) => literalCount(a) - literalCount(b));
  const out: Cube[] = [];
  for (const c of sorted) if (!out.some((k) => contains(k, c))) out.push(c);
  return out;
}

/** True when the cover has no minterm. */
export function isEmpty(cover: CubeList): boolean {
  return cover.length === 0;
}

/** True when the cover is the constant 1 over n variables. */
export function isTautology(cover: CubeList, n: number): boolean {
  return complement(cover, n).length === 0;
}

/** True when every minterm of `inner` lies in `outer`. */
export function coverContains(outer: CubeList, inner: CubeList): boolean {
  return subtract(inner, outer).length === 0;
}

/** Number of minterms of a disjoint cover (exact only when the cubes are pairwise disjoint). */
export function disjointSize(cover: CubeList): number {
  let s = 0;
  for (const c of cover) s += 2 ** (c.length - literalCount(c));
  return s;
}

/** Make a cover pairwise disjoint (same minterms). */
export function disjoint(cover: CubeList): Cube[] {
  const out: Cube[] = [];
  for (const c of cover) for (const d of subtract([c], out)) out.push(d);
  return out;
}

/** Widen cubes over `n` variables into cubes over `n + extra` by inserting free positions. */
export function embed(c: Cube, prefix: string, suffix = ''): Cube {
  return prefix + c + suffix;
}

/** Every full assignment of n variables, as '0'/'1' strings in counting order (bit 0 first). */
export function* assignments(n: number): Generator<string> {
  const total = 2 ** n;
  for (let m = 0; m < total; m++) yield mintermString(m, n);
}

/** Minterm index m as an n-character string, variable 0 is the most significant bit. */
export function mintermString(m: number, n: number): string {
  let s = '';
  for (let i = n - 1; i >= 0; i--) s += Math.floor(m / 2 ** i) % 2 === 1 ? '1' : '0';
  return s;
}
