/**
 * Minimum-cost covering by branch and bound, with fixed charges.
 *
 * A column covers a set of rows and costs `cost`; it belongs to a group whose fixed cost is
 * paid once when the first of its columns is chosen. For the minimiser a group is a product
 * term (term gate + its literal cords) and a column is that term feeding one function (one
 * cord branch); with a single function every group has one column and this is the ordinary
 * unate covering problem.
 *
 * Method: the reductions of Quine and McCluskey (essential columns, row dominance, column
 * dominance — the latter only where the fixed charges keep it sound), then depth-first branch
 * and bound on the uncovered row with fewest columns, pruned by a lower bound from a maximal
 * set of rows that share no group (each needs its own group, so their cheapest columns add
 * up). Reference: O. Coudert, "On solving covering problems", DAC 1996, §2–3, for the
 * independent-set bound; E. J. McCluskey, Bell System Technical Journal 35(6), 1956, for the
 * table reductions. A greedy cover gives the first upper bound.
 *
 * Postcondition: the chosen columns cover every row; `optimal` is true when the search ran to
 * completion within the node limit.
 */

export interface CoverColumn {
  readonly group: number;
  readonly cost: number;
  /** Row indices covered. */
  readonly rows: readonly number[];
}

export interface CoverProblem {
  readonly rowCount: number;
  readonly columns: readonly CoverColumn[];
  readonly groupCost: readonly number[];
}

export interface CoverSolution {
  readonly columns: readonly number[];
  readonly cost: number;
  readonly optimal: boolean;
}

/**
 * Solve; `nodeLimit` bounds the search (Infinity for a guaranteed minimum). With an
 * `upperBound`, only covers cheaper than it count: null when there is none (or none found).
 */
export function solveCover(p: CoverProblem, nodeLimit?: number): CoverSolution;
export function solveCover(p: CoverProblem, nodeLimit: number, upperBound: number): CoverSolution | null;
export function solveCover(p: CoverProblem, nodeLimit = Infinity, upperBound = Infinity): CoverSolution | null {
  return new Solver(p, nodeLimit, upperBound).run();
}

class Solver {
  private readonly nr: number;
  private readonly rw: number;
  private readonly colBits: Uint32Array[];
  private rowCols: number[][];
  private readonly opened: Int32Array;
  private readonly stamp: Int32Array;
  private stampGen = 0;
  private best = Infinity;
  private bestCols: number[] = [];
  private nodes = 0;
  private aborted = false;
  private readonly chosen: number[] = [];
  private rowOrder: number[] = [];
  /** Columns not removed by dominance (rows dropped by row dominance assume only these). */
  private readonly alive: Uint8Array;

  constructor(private readonly p: CoverProblem, private readonly nodeLimit: number, private readonly upperBound: number) {
    this.nr = p.rowCount;
    this.rw = (this.nr + 31) >>> 5;
    this.colBits = p.columns.map((c) => {
      const b = new Uint32Array(this.rw);
      for (const r of c.rows) b[r >>> 5] |= 1 << (r & 31);
      return b;
    });
    this.rowCols = Array.from({ length: this.nr }, () => []);
    p.columns.forEach((c, ci) => { for (const r of c.rows) this.rowCols[r].push(ci); });
    this.opened = new Int32Array(p.groupCost.length);
    this.stamp = new Int32Array(p.groupCost.length);
    this.alive = new Uint8Array(p.columns.length).fill(1);
  }

  run(): CoverSolution | null {
    const unc = new Uint32Array(this.rw);
    for (let r = 0; r < this.nr; r++) unc[r >>> 5] |= 1 << (r & 31);
    for (let r = 0; r < this.nr; r++)
      if (this.rowCols[r].length === 0) throw new Error('covering problem has a row no column covers');
    let cost = this.reduce(unc);
    const fixed = this.chosen.slice();
    const greedy = this.greedy(unc);
    this.best = cost + greedy.cost;
    this.bestCols = fixed.concat(greedy.cols);
    let found = this.best < this.upperBound;
    if (!found) this.best = this.upperBound;
    this.rowOrder = [];
    for (let r = 0; r < this.nr; r++) if (unc[r >>> 5] & (1 << (r & 31))) this.rowOrder.push(r);
    this.rowOrder.sort((a, b) => this.rowCols[a].length - this.rowCols[b].length || a - b);
    const before = this.best;
    this.search(unc, cost);
    if (this.best < before) found = true;
    if (!found) return null;
    return { columns: this.bestCols.slice().sort((a, b) => a - b), cost: this.best, optimal: !this.aborted };
  }

  private inc(ci: number): number {
    const c = this.p.columns[ci];
    return c.cost + (this.opened[c.group] > 0 ? 0 : this.p.groupCost[c.group]);
  }

  private take(ci: number, unc: Uint32Array): void {
    const b = this.colBits[ci];
    for (let k = 0; k < this.rw; k++) unc[k] &= ~b[k];
    this.opened[this.p.columns[ci].group]++;
    this.chosen.push(ci);
  }

  private covers(ci: number, unc: Uint32Array): number {
    const b = this.colBits[ci];
    let n = 0;
    for (let k = 0; k < this.rw; k++) {
      let x = b[k] & unc[k];
      while (x !== 0) { x &= x - 1; n++; }
    }
    return n;
  }

  /** Essential columns, row dominance and sound column dominance, to a fixed point. */
  private reduce(unc: Uint32Array): number {
    let cost = 0;
    const alive = this.alive;
    const isUnc = (r: number): boolean => (unc[r >>> 5] & (1 << (r & 31))) !== 0;
    for (let changed = true; changed; ) {
      changed = false;
      for (let r = 0; r < this.nr; r++) {
        if (!isUnc(r)) continue;
        const live = this.rowCols[r].filter((c) => alive[c]);
        if (live.length === 1) {
          cost += this.inc(live[0]);
          this.take(live[0], unc);
          changed = true;
        }
      }
      // Column dominance: a's rows within b's, and b can never cost more than a would.
      const groupLive = new Int32Array(this.p.groupCost.length);
      this.p.columns.forEach((c, ci) => { if (alive[ci] && this.covers(ci, unc) > 0) groupLive[c.group]++; });
      for (let a = 0; a < this.p.columns.length; a++) {
        if (!alive[a]) continue;
        const ca = this.p.columns[a];
        const rowsA = ca.rows.filter(isUnc);
        if (rowsA.length === 0) { alive[a] = 0; changed = true; continue; }
        const solo = groupLive[ca.group] === 1 && this.opened[ca.group] === 0;
        const bestA = ca.cost + (solo ? this.p.groupCost[ca.group] : 0);
        let pivot = rowsA[0];
        for (const r of rowsA) if (this.rowCols[r].length < this.rowCols[pivot].length) pivot = r;
        for (const b of this.rowCols[pivot]) {
          if (b === a || !alive[b]) continue;
          const cb = this.p.columns[b];
          const worstB = cb.cost + (this.opened[cb.group] > 0 ? 0 : this.p.groupCost[cb.group]);
          if (worstB > bestA || (worstB === bestA && b > a && this.subset(b, a, unc))) continue;
          if (!this.subset(a, b, unc)) continue;
          alive[a] = 0;
          groupLive[ca.group]--;
          changed = true;
          break;
        }
      }
      // Row dominance: a row whose live columns include another row's is implied by it.
      // A dominated row r holds every column of its dominator s, so it lies in the rows of
      // the column of s with fewest rows: only those are candidates.
      const live = this.rowCols.map((cs) => cs.filter((c) => alive[c]));
      const liveSets = live.map((cs) => new Set(cs));
      for (let s = 0; s < this.nr; s++) {
        if (!isUnc(s) || live[s].length === 0) continue;
        let pivot = live[s][0];
        for (const c of live[s]) if (this.p.columns[c].rows.length < this.p.columns[pivot].rows.length) pivot = c;
        for (const r of this.p.columns[pivot].rows) {
          if (r === s || !isUnc(r) || live[s].length > live[r].length) continue;
          if (live[s].length === live[r].length && s > r) continue;
          if (live[s].every((c) => liveSets[r].has(c))) {
            unc[r >>> 5] &= ~(1 << (r & 31));
            changed = true;
          }
        }
      }
      this.rowCols = live;
    }
    return cost;
  }

  /** Uncovered rows of column a all in column b? */
  private subset(a: number, b: number, unc: Uint32Array): boolean {
    const x = this.colBits[a];
    const y = this.colBits[b];
    for (let k = 0; k < this.rw; k++) if ((x[k] & unc[k] & ~y[k]) !== 0) return false;
    return true;
  }

  /** Cheapest cost per newly covered row, then drop columns made redundant. */
  private greedy(start: Uint32Array): { cols: number[]; cost: number } {
    const unc = start.slice();
    const saved = this.opened.slice();
    const picked: number[] = [];
    const count = (): number => { let n = 0; for (const w of unc) { let x = w; while (x) { x &= x - 1; n++; } } return n; };
    while (count() > 0) {
      let bestCol = -1;
      let bestRatio = Infinity;
      for (let ci = 0; ci < this.p.columns.length; ci++) {
        if (!this.alive[ci]) continue;
        const n = this.covers(ci, unc);
        if (n === 0) continue;
        const ratio = this.inc(ci) / n;
        if (ratio < bestRatio) { bestRatio = ratio; bestCol = ci; }
      }
      const b = this.colBits[bestCol];
      for (let k = 0; k < this.rw; k++) unc[k] &= ~b[k];
      this.opened[this.p.columns[bestCol].group]++;
      picked.push(bestCol);
    }
    // Redundancy removal, most expensive first.
    const keep = new Set(picked);
    for (const ci of [...picked].sort((a, b) => this.p.columns[b].cost - this.p.columns[a].cost || b - a)) {
      keep.delete(ci);
      const cov = new Uint32Array(this.rw);
      for (const k2 of keep) { const b = this.colBits[k2]; for (let k = 0; k < this.rw; k++) cov[k] |= b[k]; }
      let ok = true;
      for (let k = 0; k < this.rw; k++) if ((start[k] & ~cov[k]) !== 0) { ok = false; break; }
      if (!ok) keep.add(ci);
    }
    this.opened.set(saved);
    const cols = [...keep];
    const groups = new Set<number>();
    let cost = 0;
    for (const ci of cols) {
      const c = this.p.columns[ci];
      cost += c.cost;
      if (!groups.has(c.group) && saved[c.group] === 0) cost += this.p.groupCost[c.group];
      groups.add(c.group);
    }
    return { cols, cost };
  }

  /** Lower bound on the cost still to pay: rows sharing no group need separate groups. */
  private lowerBound(unc: Uint32Array): number {
    this.stampGen++;
    let lb = 0;
    for (const r of this.rowOrder) {
      if ((unc[r >>> 5] & (1 << (r & 31))) === 0) continue;
      const cols = this.rowCols[r];
      let free = true;
      for (const ci of cols) if (this.stamp[this.p.columns[ci].group] === this.stampGen) { free = false; break; }
      if (!free) continue;
      let min = Infinity;
      for (const ci of cols) {
        this.stamp[this.p.columns[ci].group] = this.stampGen;
        const v = this.inc(ci);
        if (v < min) min = v;
      }
      lb += min;
    }
    return lb;
  }

  private search(unc: Uint32Array, cost: number): void {
    if (this.aborted) return;
    if (++this.nodes > this.nodeLimit) { this.aborted = true; return; }
    let pick = -1;
    let fewest = Infinity;
    for (const r of this.rowOrder) {
      if ((unc[r >>> 5] & (1 << (r & 31))) === 0) continue;
      const n = this.rowCols[r].length;
      if (n < fewest) { fewest = n; pick = r; if (n <= 1) break; }
    }
    if (pick < 0) {
      if (cost < this.best) { this.best = cost; this.bestCols = this.chosen.slice(); }
      return;
    }
    if (cost + this.lowerBound(unc) >= this.best) return;
    const options = this.rowCols[pick]
      .map((ci) => ({ ci, inc: this.inc(ci), n: this.covers(ci, unc) }))
      .sort((a, b) => a.inc / a.n - b.inc / b.n || a.inc - b.inc || a.ci - b.ci);
    for (const o of options) {
      if (cost + o.inc >= this.best) continue;
      const next = unc.slice();
      this.take(o.ci, next);
      this.search(next, cost + o.inc);
      this.chosen.pop();
      this.opened[this.p.columns[o.ci].group]--;
      if (this.aborted) return;
    }
  }
}
