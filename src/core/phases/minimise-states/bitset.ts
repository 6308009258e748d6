/**
 * Small fixed-width sets of state indices, packed 32 to a word. The compatibility search
 * tests "is this set inside that class" and "is this union compatible" at every node, so
 * these must be cheap; `key` gives a canonical string for memo tables.
 */

/** A set of state indices 0..n-1, packed into 32-bit words. */
export type StateSet = Uint32Array;

/** Number of words for n states. */
export function wordsFor(n: number): number {
  return Math.max(1, Math.ceil(n / 32));
}

/** The empty set over `words` words. */
export function emptySet(words: number): StateSet {
  return new Uint32Array(words);
}

/** The set holding exactly the given states. */
export function setOf(words: number, members: Iterable<number>): StateSet {
  const s = new Uint32Array(words);
  for (const m of members) s[m >>> 5] |= 1 << (m & 31);
  return s;
}

export function has(s: StateSet, m: number): boolean {
  return (s[m >>> 5] & (1 << (m & 31))) !== 0;
}

export function add(s: StateSet, m: number): void {
  s[m >>> 5] |= 1 << (m & 31);
}

/** a ∪ b as a new set. */
export function union(a: StateSet, b: StateSet): StateSet {
  const out = new Uint32Array(a.length);
  for (let i = 0; i < a.length; i++) out[i] = a[i] | b[i];
  return out;
}

/** a ∩ b as a new set. */
export function intersection(a: StateSet, b: StateSet): StateSet {
  const out = new Uint32Array(a.length);
  for (let i = 0; i < a.length; i++) out[i] = a[i] & b[i];
  return out;
}

/** a minus b as a new set. */
export function difference(a: StateSet, b: StateSet): StateSet {
  const out = new Uint32Array(a.length);
  for (let i = 0; i < a.length; i++) out[i] = a[i] & ~b[i];
  return out;
}

/** True when every member of a is in b. */
export function isSubset(a: StateSet, b: StateSet): boolean {
  for (let i = 0; i < a.length; i++) if ((a[i] & ~b[i]) !== 0) return false;
  return true;
}

export function isEmptySet(s: StateSet): boolean {
  for (let i = 0; i < s.length; i++) if (s[i] !== 0) return false;
  return true;
}

/** Number of members. */
export function size(s: StateSet): number {
  let n = 0;
  for (let i = 0; i < s.length; i++) {
    let w = s[i];
    while (w !== 0) {
      w &= w - 1;
      n++;
    }
  }
  return n;
}

/** |a ∩ b|. */
export function overlapSize(a: StateSet, b: StateSet): number {
  let n = 0;
  for (let i = 0; i < a.length; i++) {
    let w = a[i] & b[i];
    while (w !== 0) {
      w &= w - 1;
      n++;
    }
  }
  return n;
}

/** Members in increasing order. */
export function members(s: StateSet): number[] {
  const out: number[] = [];
  for (let i = 0; i < s.length; i++) {
    let w = s[i];
    while (w !== 0) {
      const low = w & -w;
      out.push(i * 32 + 31 - Math.clz32(low));
      w ^= low;
    }
  }
  return out;
}

/** Canonical text key (equal sets, equal keys). */
export function key(s: StateSet): string {
  return Array.prototype.join.call(s, ',');
}

/** Order by lowest member, then by the members themselves (a total, deterministic order). */
export function compareSets(a: StateSet, b: StateSet): number {
  const ma = members(a);
  const mb = members(b);
  for (let i = 0; i < Math.min(ma.length, mb.length); i++) if (ma[i] !== mb[i]) return ma[i] - mb[i];
  return ma.length - mb.length;
}
