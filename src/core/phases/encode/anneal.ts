/**
 * Simulated annealing over state assignments of a fixed code length (Kirkpatrick, Gelatt &
 * Vecchi, "Optimization by simulated annealing", Science 220, 1983), the usual heuristic
 * for state assignment once exhaustive search is out of reach (De Micheli 1994,
 * state-encoding chapter). Moves: mostly flip one bit of an unpinned state's code (a step
 * to a neighbouring corner of the cube, swapping with whichever state holds that corner);
 * sometimes swap the codes of two unpinned states, or move one to a random unused code.
 * Restarts split the budget evenly; the first starts from
 * the best assignment found so far, the others from random ones. The temperature follows
 * the running mean of the uphill steps seen (so it needs no tuning to the cost's scale),
 * cooled geometrically from 15% to 1% of it over each restart's share.
 * Deterministic for a given generator state when only the evaluation count bounds it.
 */
import type { Random } from '../../model/random.js';
import type { CostBook } from './cost.js';

export interface AnnealSpace {
  readonly n: number;
  readonly bits: number;
  /** Pinned states' codes, by state index. */
  readonly pinned: ReadonlyMap<number, number>;
  /** A full assignment to start the first restart from. */
  readonly start?: readonly number[];
  readonly restarts: number;
}

/** Steps allowed per new evaluation before a restart gives up (memo hits cost no evaluation). */
const STEPS_PER_EVALUATION = 30;
/**
 * Temperature at the start and end of a restart, as fractions of the mean uphill step (tuned
 * on synthetic machines of 12–17 states: hotter starts wasted the budget on random walks).
 */
const START_TEMPERATURE = 0.15;
const FINAL_TEMPERATURE = 0.01;
/** Share of proposals that flip one bit of one state's code. */
const FLIP_SHARE = 0.6;
/** Share of proposals that move a state to a random unused code (when there is one); the rest swap two states. */
const JUMP_SHARE = 0.2;

/** Search the assignments of `space`, recording every priced one in `book` (whose best is the answer). */
export function anneal(book: CostBook, space: AnnealSpace, rng: Random, now?: () => number, deadline?: number): void {
  const { n, bits, pinned } = space;
  const size = 2 ** bits;
  const free: number[] = [];
  for (let s = 0; s < n; s++) if (!pinned.has(s)) free.push(s);
  const unused = size - n;
  if (free.length === 0 || (free.length < 2 && unused === 0)) return;

  const pinnedCodes = new Set(pinned.values());
  const clock = now && deadline !== undefined ? now : undefined;
  for (let r = 0; r < space.restarts && !book.exhausted(); r++) {
    const left = space.restarts - r;
    const evalShare = Math.max(1, Math.floor(book.remaining() / left));
    const t0 = clock ? clock() : 0;
    const timeShare = clock ? ((deadline as number) - t0) / left : Infinity;
    const e0 = book.evaluations;
    let cur = r === 0 && space.start ? space.start.slice() : randomAssignment(n, size, pinned, rng);
    let curCost = book.price(cur, bits);
    let ups = 0;
    let meanUp = 0;
    const stepCap = Number.isFinite(evalShare) ? STEPS_PER_EVALUATION * evalShare : Infinity;
    for (let step = 0; step < stepCap && !book.exhausted(); step++) {
      const p = Math.max((book.evaluations - e0) / evalShare, clock ? (clock() - t0) / timeShare : 0);
      if (p >= 1) break;
      const cand = propose(cur, free, bits, unused, pinnedCodes, rng);
      const candCost = book.price(cand, bits);
      const delta = candCost - curCost;
      if (delta > 0 && Number.isFinite(delta)) {
        ups++;
        meanUp += (delta - meanUp) / ups;
      }
      const t = meanUp * START_TEMPERATURE * (FINAL_TEMPERATURE / START_TEMPERATURE) ** p;
      const accept = curCost === Infinity || delta <= 0 || (t > 0 && rng.next() < Math.exp(-delta / t));
      if (accept) {
        cur = cand;
        curCost = candCost;
      }
    }
  }
}

/**
 * One move from `cur`: flip one bit of an unpinned state's code (swapping with the state
 * that holds the new code, if any) — a step to a neighbouring corner of the cube — or, less
 * often, a long jump: move a state to a random unused code, or swap two random states.
 */
function propose(
  cur: readonly number[],
  free: readonly number[],
  bits: number,
  unused: number,
  pinnedCodes: ReadonlySet<number>,
  rng: Random,
): number[] {
  const next = cur.slice();
  const r = rng.next();
  if (r < FLIP_SHARE && bits > 0) {
    const s = free[rng.int(free.length)];
    const target = cur[s] ^ (1 << rng.int(bits));
    if (!pinnedCodes.has(target)) {
      const holder = cur.indexOf(target);
      if (holder >= 0) next[holder] = cur[s];
      next[s] = target;
      return next;
    }
  }
  if (unused > 0 && (free.length < 2 || r < FLIP_SHARE + JUMP_SHARE)) {
    const taken = new Set(cur);
    const size = 2 ** bits;
    let code = rng.int(size);
    while (taken.has(code)) code = rng.int(size);
    next[free[rng.int(free.length)]] = code;
    return next;
  }
  const i = rng.int(free.length);
  let j = rng.int(free.length - 1);
  if (j >= i) j++;
  [next[free[i]], next[free[j]]] = [next[free[j]], next[free[i]]];
  return next;
}

function randomAssignment(n: number, size: number, pinned: ReadonlyMap<number, number>, rng: Random): number[] {
  const codes = new Array<number>(n);
  const taken = new Set(pinned.values());
  for (let s = 0; s < n; s++) {
    const p = pinned.get(s);
    if (p !== undefined) {
      codes[s] = p;
      continue;
    }
    let code = rng.int(size);
    while (taken.has(code)) code = rng.int(size);
    codes[s] = code;
    taken.add(code);
  }
  return codes;
}
