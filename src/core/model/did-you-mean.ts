/**
 * "Did you mean …?" hints: the candidate closest to a misspelt name by edit distance
 * (Levenshtein, 1966: insertions, deletions and substitutions each cost 1), compared without
 * regard to case.
 *
 * Bounded work: a hint is only offered within a distance of max(2, ⌊length/3⌋), so
 * - a name longer than HINT_NAME_MAX gets no hint (nobody misspells a name that long);
 * - a candidate whose length differs by more than the best distance so far is skipped
 *   unread (the distance is at least the difference in length);
 * - the rest are compared by the banded dynamic programme of Ukkonen (Information and
 *   Control 64, 1985): only cells within the allowed distance of the diagonal are filled,
 *   and a row whose every cell is past it stops the comparison;
 * - one search fills at most HINT_WORK cells; past that it answers with the best so far.
 * So a search costs O(candidates + HINT_WORK) whatever the names, where the plain table
 * costs O(Σ |name|·|candidate|).
 */

/** Longest name that gets a hint. */
export const HINT_NAME_MAX = 64;
/** Most cells of the distance table one search fills. */
export const HINT_WORK = 250_000;

/** Lower-cased candidates, kept for lists searched again and again (validate passes one list per machine). */
const lowered = new WeakMap<readonly string[], readonly string[]>();

function lowerAll(candidates: readonly string[]): readonly string[] {
  let l = lowered.get(candidates);
  if (l === undefined) {
    l = candidates.map((c) => c.toLowerCase());
    lowered.set(candidates, l);
  }
  return l;
}

/** Closest candidate by edit distance, for "did you mean" hints; undefined when none is close. */
export function didYouMean(name: string, candidates: readonly string[]): string | undefined {
  if (name.length > HINT_NAME_MAX) return undefined;
  const a = name.toLowerCase();
  const lower = lowerAll(candidates);
  const allowed = Math.max(2, Math.floor(name.length / 3));
  const rows = new Int32Array(2 * (HINT_NAME_MAX + allowed + 2));
  let best: string | undefined;
  let bestD = allowed + 1;
  let work = 0;
  for (let k = 0; k < lower.length && bestD > 0; k++) {
    const b = lower[k];
    if (Math.abs(b.length - a.length) >= bestD) continue;
    const bound = bestD - 1;
    work += (a.length + 1) * (2 * bound + 1);
    if (work > HINT_WORK) break;
    const d = boundedDistance(a, b, bound, rows);
    if (d < bestD) {
      bestD = d;
      best = candidates[k];
    }
  }
  return best;
}

/**
 * Edit distance of a and b when it is at most `bound`, else bound + 1. Fills only the band
 * |i − j| ≤ bound of the table; `rows` holds two rows of b.length + 1 cells.
 */
export function boundedDistance(a: string, b: string, bound: number, rows?: Int32Array): number {
  const n = a.length;
  const m = b.length;
  const far = bound + 1;
  if (Math.abs(n - m) > bound) return far;
  if (bound === 0) return a === b ? 0 : 1;
  const buf = rows && rows.length >= 2 * (m + 1) ? rows : new Int32Array(2 * (m + 1));
  let prev = 0;
  let cur = m + 1;
  for (let j = 0; j <= m; j++) buf[prev + j] = j <= bound ? j : far;
  for (let i = 1; i <= n; i++) {
    const lo = Math.max(1, i - bound);
    const hi = Math.min(m, i + bound);
    buf[cur] = i <= bound ? i : far;
    if (lo > 1) buf[cur + lo - 1] = far;
    let rowMin = buf[cur];
    const ca = a.charCodeAt(i - 1);
    for (let j = lo; j <= hi; j++) {
      const sub = buf[prev + j - 1] + (ca === b.charCodeAt(j - 1) ? 0 : 1);
      const v = Math.min(sub, buf[prev + j] + 1, buf[cur + j - 1] + 1, far);
      buf[cur + j] = v;
      if (v < rowMin) rowMin = v;
    }
    if (hi < m) buf[cur + hi + 1] = far;
    if (rowMin > bound) return far;
    const t = prev;
    prev = cur;
    cur = t;
  }
  return buf[prev + m];
}
