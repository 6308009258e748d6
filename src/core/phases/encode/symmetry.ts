/**
 * Symmetries of the b-cube and the classes of state assignments they leave.
 *
 * Permuting the state bits or complementing some of them maps every assignment to one that
 * costs the same in a build with both latch outputs Q and Q̄ free (complementing a bit swaps
 * its latch's set and reset equations; permuting bits renames latches). These maps are the
 * 2^b·b! symmetries of the b-cube, the Hamming-distance-preserving maps of the codes.
 * McCluskey & Unger ("A note on the number of internal variable assignments for sequential
 * switching circuits", IRE Trans. Electronic Computers EC-8, 1959; also De Micheli,
 * "Synthesis and Optimization of Digital Circuits", 1994, state-encoding chapter) count the
 * distinct assignments of n states to b bits as (2^b − 1)! / ((2^b − n)! · b!); that formula
 * holds at the minimum b (n > 2^(b−1)), where no symmetry but the identity fixes an
 * assignment. The enumeration below gives exactly one assignment per class for any b and any
 * pins, by orderly generation: it keeps an assignment only when it is the lexicographically
 * smallest of its class, and prunes a partial assignment as soon as some symmetry maps its
 * prefix lower (every completion would then be mapped lower too).
 */

/** One symmetry of the cube: the image of every code (codes as integers, bit 0 most significant). */
export interface CubeMap {
  readonly table: Int32Array;
}

/**
 * Largest code length whose full symmetry group is built (2^5·5! = 3,840 maps). Longer codes
 * get an empty list, which every function here treats as the identity alone (no reduction).
 */
export const MAX_SYMMETRY_BITS = 5;

/** All 2^b·b! symmetries of the b-cube (identity first), or [] (identity alone) past MAX_SYMMETRY_BITS. */
export function cubeSymmetries(bits: number): CubeMap[] {
  if (bits > MAX_SYMMETRY_BITS) return [];
  const size = 2 ** bits;
  const maps: CubeMap[] = [];
  for (const perm of permutations(bits))
    for (let mask = 0; mask < size; mask++) {
      const table = new Int32Array(size);
      for (let x = 0; x < size; x++) {
        let y = 0;
        for (let i = 0; i < bits; i++) if ((x >> (bits - 1 - i)) & 1) y |= 1 << (bits - 1 - perm[i]);
        table[x] = y ^ mask;
      }
      maps.push({ table });
    }
  return maps;
}

/** The symmetries that leave every one of `codes` where it is (the pins' stabiliser). */
export function fixing(group: readonly CubeMap[], codes: Iterable<number>): CubeMap[] {
  const fixed = [...codes];
  return group.filter((g) => fixed.every((c) => g.table[c] === c));
}

/** The lexicographically smallest image of a code vector under the group: equal for equivalent assignments. */
export function canonicalKey(codes: readonly number[], group: readonly CubeMap[]): string {
  let best = codes.slice();
  for (const g of group) {
    for (let i = 0; i < codes.length; i++) {
      const y = g.table[codes[i]];
      if (y === best[i]) continue;
      if (y < best[i]) best = codes.map((c) => g.table[c]);
      break;
    }
  }
  return best.join(',');
}

/**
 * One assignment per class: `slots` distinct codes drawn from `available` (ascending; the
 * group must map it onto itself), smallest of its class under `group`, in ascending
 * lexicographic order. Depth-first with an explicit stack, so thousands of slots need no
 * deeper call stack than one.
 */
export function* assignmentClasses(
  slots: number,
  available: readonly number[],
  group: readonly CubeMap[],
): Generator<number[]> {
  const prefix: number[] = [];
  const used = new Set<number>();
  // Per depth d: the maps that keep prefix[0..d) fixed (they decide the comparison at d), and
  // the next index of `available` to try there.
  const alive: (readonly CubeMap[])[] = [group];
  const cursor: number[] = [0];
  const back = (): void => {
    cursor.pop();
    alive.pop();
    const x = prefix.pop();
    if (x !== undefined) used.delete(x);
  };
  while (cursor.length > 0) {
    const d = cursor.length - 1;
    if (d === slots) {
      yield prefix.slice();
      back();
      continue;
    }
    let placed = false;
    while (!placed && cursor[d] < available.length) {
      const x = available[cursor[d]++];
      if (used.has(x)) continue;
      const next: CubeMap[] = [];
      let lower = false;
      for (const g of alive[d]) {
        const y = g.table[x];
        if (y < x) {
          lower = true;
          break;
        }
        if (y === x) next.push(g);
      }
      if (lower) continue;
      prefix.push(x);
      used.add(x);
      alive.push(next);
      cursor.push(0);
      placed = true;
    }
    if (!placed) back();
  }
}

/**
 * Whether the classes of `slots` states over `available` codes certainly outnumber `cap`: every
 * class holds at most |group| assignments (the identity alone when the group is empty), so
 * there are at least P(available, slots) / |group| of them. Decided without listing any.
 */
export function surelyMoreClasses(slots: number, available: number, groupSize: number, cap: number): boolean {
  const limit = cap * Math.max(1, groupSize);
  let p = 1;
  for (let k = 0; k < slots; k++) {
    p *= available - k;
    if (p <= 0) return false;
    if (p > limit) return true;
  }
  return false;
}

/** McCluskey & Unger's count (2^b − 1)! / ((2^b − n)! · b!) of distinct assignments of n states to b bits. */
export function publishedClassCount(n: number, bits: number): number {
  const codes = 2n ** BigInt(bits);
  let num = 1n;
  for (let k = codes - BigInt(n) + 1n; k <= codes - 1n; k++) num *= k;
  let den = 1n;
  for (let k = 2n; k <= BigInt(bits); k++) den *= k;
  return Number(num / den);
}

function permutations(k: number): number[][] {
  if (k === 0) return [[]];
  const out: number[][] = [];
  for (const p of permutations(k - 1))
    for (let at = 0; at <= p.length; at++) out.push([...p.slice(0, at), k - 1, ...p.slice(at)]);
  // Identity first, the rest in a fixed order.
  return out.sort((a, b) => (a.join() < b.join() ? -1 : a.join() > b.join() ? 1 : 0));
}
