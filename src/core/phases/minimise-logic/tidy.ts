/**
 * Tidying cube lists at the boundary of the minimiser: fewer cubes for the same points
 * (merging, single-cube containment) and the difference of two covers (disjoint sharp).
 * Exact operations on cubes; none enumerates minterms.
 */
import { type BCube, type Space, SLOT, popcount, varPos, inContains, scratch } from './bitcube.js';

/**
 * Cubes of a minus the cube b, pairwise disjoint (the disjoint sharp of Hong, Cain and
 * Ostapko, IBM J. Res. Dev. 18(5), 1974).
 */
export function sharp(sp: Space, a: BCube, b: BCube): BCube[] {
  for (let k = 0; k < sp.wi; k++) {
    const x = a[k] & b[k];
    if (((x | (x >>> 1)) & sp.low[k]) !== sp.low[k]) return [a];
  }
  const out: BCube[] = [];
  const rest = a.slice(0, sp.wi);
  for (let k = 0; k < sp.wi; k++) {
    // fields where b is fixed and rest is wider: peel off the part outside b
    let lits = sp.low[k] & ~(b[k] & (b[k] >>> 1));
    while (lits !== 0) {
      const bit = lits & -lits;
      lits &= lits - 1;
      const both = bit | (bit << 1);
      if ((rest[k] & both) === (b[k] & both)) continue;
      const piece = rest.slice();
      piece[k] = (piece[k] & ~both) | (rest[k] & both & ~b[k]);
      out.push(piece);
      rest[k] = (rest[k] & ~both) | (b[k] & both);
    }
  }
  return out;
}

/** A cover minus a cover, as cubes (disjoint when `from` is); null past `limit` cubes. */
export function subtractCover(
  sp: Space,
  from: readonly BCube[],
  minus: readonly BCube[],
  limit = Infinity,
): BCube[] | null {
  let cur: BCube[] = from.slice();
  for (const m of minus) {
    const next: BCube[] = [];
    for (const c of cur) for (const d of sharp(sp, c, m)) next.push(d);
    cur = next;
    if (cur.length === 0) break;
    if (cur.length > limit) return null;
  }
  return cur;
}

/**
 * The same set of points in fewer cubes: repeatedly merge two cubes that differ only in the
 * value of one variable (the first step of Quine's method, done on cubes), then drop cubes
 * inside others. Cheap (hashing per variable) and exact; used on the caller's lists, which
 * often arrive as single minterms.
 */
export function compact(sp: Space, t: readonly BCube[]): BCube[] {
  if (sp.wi === 1) return compact1(sp, t);
  let cur = t.map((c) => c.slice(0, sp.wi));
  for (let changed = true; changed;) {
    changed = false;
    // Only cubes fixing the same variables can merge: skip the pass when none do.
    const cares = new Set<string>();
    let shared = false;
    for (const c of cur) {
      let id = '';
      for (let k = 0; k < sp.wi; k++) id += (sp.low[k] & ~(c[k] & (c[k] >>> 1))) + ',';
      if (cares.has(id)) {
        shared = true;
        break;
      }
      cares.add(id);
    }
    if (!shared) break;
    for (let v = 0; v < sp.n; v++) {
      const [k, s] = varPos(v);
      const both = 3 << s;
      const groups = new Map<string, number>();
      const next: BCube[] = [];
      for (const c of cur) {
        const f = c[k] & both;
        if (f === both) {
          next.push(c);
          continue;
        }
        const freed = c.slice();
        freed[k] |= both;
        const id = freed.join(',');
        const at = groups.get(id);
        if (at === undefined) {
          groups.set(id, next.length);
          next.push(c);
          continue;
        }
        const other = next[at][k] & both;
        if (other === f || other === both) continue; // duplicate, or already merged
        next[at] = freed;
        changed = true;
      }
      cur = next;
    }
  }
  return absorbCubes(sp, cur);
}

/** compact() for cubes of one input word, on plain integers (the common small case). */
function compact1(sp: Space, t: readonly BCube[]): BCube[] {
  let cur = t.map((c) => c[0]);
  // Groups by the cube with the variable freed: a direct table (with a generation stamp per
  // pass, so it is never cleared) when the word is short, else a map.
  const direct = sp.n <= 10;
  const size = direct ? 1 << (2 * sp.n) : 0;
  const stamp = direct ? scratch(SLOT.stamp, size) : null;
  const where = direct ? scratch(SLOT.value, size) : null;
  const groups = new Map<number, number>();
  for (let changed = true; changed;) {
    changed = false;
    for (let v = 0; v < sp.n; v++) {
      const both = 3 << (2 * v);
      const gen = nextGeneration(stamp);
      groups.clear();
      let out = 0;
      for (let i = 0; i < cur.length; i++) {
        const c = cur[i];
        const f = c & both;
        if (f === both) {
          cur[out++] = c;
          continue;
        }
        const freed = c | both;
        let at: number | undefined;
        if (stamp !== null) at = stamp[freed] === gen ? where![freed] : undefined;
        else at = groups.get(freed);
        if (at === undefined) {
          if (stamp !== null) {
            stamp[freed] = gen;
            where![freed] = out;
          } else groups.set(freed, out);
          cur[out++] = c;
          continue;
        }
        const other = cur[at] & both;
        if (other === f || other === both) continue;
        cur[at] = freed;
        changed = true;
      }
      cur.length = out;
    }
  }
  cur = [...new Set(cur)];
  return absorbCubes(
    sp,
    cur.map((c) => [c]),
  );
}

let generation = 0;

/** A fresh stamp value for a scratch stamp table (cleared when the counter wraps). */
function nextGeneration(stamp: Int32Array | null): number {
  if (generation >= 0x3fffffff) {
    generation = 0;
    stamp?.fill(0);
  }
  return ++generation;
}

/** Input-part single-cube containment (keep maximal cubes, first of equals, stable order). */
export function absorbCubes(sp: Space, t: readonly BCube[]): BCube[] {
  const lit = (c: BCube): number => {
    let n = 0;
    for (let k = 0; k < sp.wi; k++) n += popcount(sp.low[k] & ~(c[k] & (c[k] >>> 1)));
    return n;
  };
  const order = t.map((c, i) => ({ c, i, l: lit(c) })).sort((a, b) => a.l - b.l || a.i - b.i);
  const out: BCube[] = [];
  for (const { c } of order) {
    let inside = false;
    for (const o of out)
      if (inContains(sp, o, c)) {
        inside = true;
        break;
      }
    if (!inside) out.push(c);
  }
  return out;
}
