/**
 * EXPAND of Espresso-II (Brayton et al., "Logic Minimization Algorithms for VLSI Synthesis",
 * Kluwer 1984, §4.2; R. Rudell, "Multiple-valued logic minimization for PLA synthesis",
 * UCB/ERL M86/65, 1986, ch. 3): grow each cube of the cover into a prime that stays off the
 * off-set R, choosing the raised parts so as to swallow as many other cubes as possible.
 *
 * Every R cube feeds exactly one function. Against the cube c being grown, an off cube r is
 * kept away by its "blocking" bits: the lowered bits of c that, once raised, would let c meet
 * r (one bit per conflicting input variable, plus r's function bit when c does not feed it).
 * c stays off r while at least one of those bits stays lowered, so the choice of bits to keep
 * is a covering problem (the blocking matrix of §4.2).
 *
 * Precondition: every cube of F misses R. Postcondition: every returned cube is prime (no
 * allowed bit can be raised without meeting R), and every cube of F lies in one of them.
 */
import { type BCube, type Space, contains, popcount } from './bitcube.js';

/** Expand every cube of F against the off-set R; `inputOnly` leaves output parts alone. */
export function expandCover(sp: Space, F: readonly BCube[], R: readonly BCube[], inputOnly = false): BCube[] {
  const W = sp.w;
  const allow = allowMask(sp, inputOnly);
  // Espresso's ordering: light cubes (whose parts few other cubes share) first, since they
  // are the least likely to be covered by others.
  const colCount = new Int32Array(W * 30);
  for (const c of F)
    for (let k = 0; k < W; k++) {
      let x = c[k];
      while (x !== 0) { colCount[k * 30 + 31 - Math.clz32(x & -x)]++; x &= x - 1; }
    }
  const weight = F.map((c) => {
    let s = 0;
    for (let k = 0; k < W; k++) {
      let x = c[k];
      while (x !== 0) { s += colCount[k * 30 + 31 - Math.clz32(x & -x)]; x &= x - 1; }
    }
    return s;
  });
  const order = F.map((_, i) => i).sort((a, b) => weight[a] - weight[b] || a - b);
  const covered = new Uint8Array(F.length);
  const out: BCube[] = [];
  for (const i of order) {
    if (covered[i]) continue;
    covered[i] = 1;
    const cands: BCube[] = [];
    for (const j of order) if (!covered[j]) cands.push(F[j]);
    const e = expandCube(sp, F[i], R, cands, allow);
    for (let j = 0; j < F.length; j++) if (!covered[j] && contains(sp, e, F[j])) covered[j] = 1;
    out.push(e);
  }
  return out;
}

/** Bits EXPAND may raise: all input bits, and output bits unless `inputOnly`. */
export function allowMask(sp: Space, inputOnly: boolean): number[] {
  const a: number[] = [];
  for (let k = 0; k < sp.wi; k++) a.push(sp.full[k]);
  for (let k = 0; k < sp.wo; k++) a.push(inputOnly ? 0 : sp.outFull[k]);
  return a;
}

/** Grow one cube into a prime against R, trying to cover the candidate cubes. */
export function expandCube(sp: Space, c0: BCube, R: readonly BCube[], cands: readonly BCube[], allow: readonly number[]): BCube {
  const W = sp.w;
  const wi = sp.wi;
  const c = c0.slice();
  const free = new Array<number>(W);
  const keep = new Array<number>(W).fill(0);
  for (let k = 0; k < W; k++) free[k] = allow[k] & ~c[k];
  let active: number[][] = [];
  for (const r of R) {
    const row = new Array<number>(W);
    let any = 0;
    let fixed = false;
    for (let k = 0; k < W; k++) {
      let x: number;
      if (k < wi) {
        const y = c[k] & r[k];
        const z = sp.low[k] & ~(y | (y >>> 1));
        x = (z | (z << 1)) & r[k] & ~c[k];
      } else x = r[k] & ~c[k];
      row[k] = x;
      any |= x;
      if ((x & ~free[k]) !== 0) fixed = true;
    }
    if (any === 0) throw new Error('expand: a cube of the cover meets the off-set');
    if (!fixed) active.push(row); // a bit we may not raise already keeps c off r
  }
  let pending = cands.slice();
  for (;;) {
    active = essentialLowering(W, active, free, keep);
    // Raise, for free, every bit no remaining off cube depends on.
    const used = new Array<number>(W).fill(0);
    for (const row of active) for (let k = 0; k < W; k++) used[k] |= row[k];
    for (let k = 0; k < W; k++) {
      const up = free[k] & ~used[k];
      c[k] |= up;
      free[k] &= ~up;
    }
    // Cubes still coverable by raising only free bits without meeting R.
    const feasible: { need: number[]; d: BCube }[] = [];
    const still: BCube[] = [];
    for (const d of pending) {
      const need = new Array<number>(W);
      let some = 0;
      let blocked = false;
      for (let k = 0; k < W; k++) {
        need[k] = d[k] & ~c[k];
        some |= need[k];
        if ((need[k] & ~free[k]) !== 0) blocked = true;
      }
      if (some === 0 || blocked) continue; // already covered, or never coverable
      still.push(d);
      let ok = true;
      for (const row of active) {
        let left = 0;
        for (let k = 0; k < W; k++) left |= row[k] & free[k] & ~need[k];
        if (left === 0) { ok = false; break; }
      }
      if (ok) feasible.push({ need, d });
    }
    pending = still;
    if (feasible.length === 0) break;
    // Espresso's select_feasible: take the cube whose raise leaves most of the other feasible
    // cubes still feasible; ties go to the smaller raise, then to the earlier cube.
    let best = 0;
    let bestScore = -1;
    let bestBits = Infinity;
    const both = new Array<number>(W);
    for (let a = 0; a < feasible.length; a++) {
      const na = feasible[a].need;
      let score = 0;
      for (let b = 0; b < feasible.length; b++) {
        if (a === b) continue;
        const nb = feasible[b].need;
        for (let k = 0; k < W; k++) both[k] = na[k] | nb[k];
        let ok = true;
        for (const row of active) {
          let left = 0;
          for (let k = 0; k < W; k++) left |= row[k] & free[k] & ~both[k];
          if (left === 0) { ok = false; break; }
        }
        if (ok) score++;
      }
      let bits = 0;
      for (let k = 0; k < W; k++) bits += popcount(na[k]);
      if (score > bestScore || (score === bestScore && bits < bestBits)) {
        best = a;
        bestScore = score;
        bestBits = bits;
      }
    }
    const need = feasible[best].need;
    for (let k = 0; k < W; k++) {
      c[k] |= need[k];
      free[k] &= ~need[k];
    }
  }
  lowestLowering(W, active, free, keep);
  for (let k = 0; k < W; k++) c[k] |= free[k] & ~keep[k];
  return c;
}

/**
 * Rows left with a single free bit force that bit to stay lowered; repeat to a fixed point.
 * Returns the rows not yet kept off by a lowered bit.
 */
function essentialLowering(W: number, rows: number[][], free: number[], keep: number[]): number[][] {
  let active = rows;
  for (let changed = true; changed; ) {
    changed = false;
    const next: number[][] = [];
    for (const row of active) {
      let blocked = false;
      let cnt = 0;
      for (let k = 0; k < W; k++) {
        if ((row[k] & keep[k]) !== 0) { blocked = true; break; }
        cnt += popcount(row[k] & free[k]);
      }
      if (blocked) continue;
      if (cnt === 0) throw new Error('expand: a raise made the cube meet the off-set');
      if (cnt === 1) {
        for (let k = 0; k < W; k++) {
          const b = row[k] & free[k];
          keep[k] |= b;
          free[k] &= ~b;
        }
        changed = true;
        continue;
      }
      next.push(row);
    }
    active = next;
  }
  return active;
}

/**
 * The rest of the blocking matrix: greedily keep the bit that blocks most rows, then give back
 * any kept bit whose rows are all blocked by others (so the result is prime).
 */
function lowestLowering(W: number, rows: number[][], free: number[], keep: number[]): void {
  if (rows.length === 0) return;
  let left = rows;
  const chosen: [number, number][] = [];
  const counts = new Int32Array(W * 30);
  while (left.length > 0) {
    counts.fill(0);
    for (const row of left)
      for (let k = 0; k < W; k++) {
        let x = row[k] & free[k];
        while (x !== 0) { counts[k * 30 + 31 - Math.clz32(x & -x)]++; x &= x - 1; }
      }
    let bi = 0;
    for (let i = 1; i < counts.length; i++) if (counts[i] > counts[bi]) bi = i;
    const k = (bi / 30) | 0;
    const bit = 1 << (bi % 30);
    keep[k] |= bit;
    free[k] &= ~bit;
    chosen.push([k, bit]);
    left = left.filter((row) => (row[k] & bit) === 0);
  }
  for (let i = chosen.length - 1; i >= 0; i--) {
    const [k, bit] = chosen[i];
    keep[k] &= ~bit;
    let needed = false;
    for (const row of rows) {
      if ((row[k] & bit) === 0) continue;
      let other = 0;
      for (let q = 0; q < W; q++) other |= row[q] & keep[q];
      if (other === 0) { needed = true; break; }
    }
    if (needed) keep[k] |= bit;
    else free[k] |= bit;
  }
}
