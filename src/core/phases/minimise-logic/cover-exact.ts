/**
 * Minimum-cost covering by branch and bound, with fixed charges.
 *
 * A column covers a set of rows and costs `cost`; it belongs to a group whose fixed cost is
 * paid once when the first of its columns is chosen. For the minimiser a group is a product
 * term (term gate + its literal cords) and a column is that term feeding one function (one
 * cord branch); with a single function every group has one column and this is the ordinary
 * unate covering problem.
 *
 * Method: depth-first branch and bound. At every node the table is first reduced as Quine and
 * McCluskey reduce a prime implicant chart (essential columns, row dominance, column
 * dominance — the latter only where the fixed charges keep it sound); then the search
 * branches on the uncovered row with fewest columns, pruned by lower bounds: a maximal set of
 * rows that share no group (each needs its own group, so their cheapest columns add up), and
 * in the unate case the per-row share of the cheapest column. A column tried in one branch is
 * left out of the later branches. References: O. Coudert, "On solving covering problems",
 * DAC 1996, for the independent-set bound; E. J. McCluskey, Bell System Technical Journal
 * 35(6), 1956, for the table reductions. A greedy cover (or the caller's bound) gives the
 * first upper bound.
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
  private readonly nc: number;
  private readonly rw: number;
  /** Per column: its rows as a bitset. */
  private readonly colBits: Uint32Array[];
  /** Per row: every column covering it (dead ones are skipped through `alive`). */
  private readonly rowCols: number[][];
  /** Per group: how many chosen columns use it (a group is paid for while > 0). */
  private readonly opened: Int32Array;
  private readonly stamp: Int32Array;
  private readonly colStamp: Int32Array;
  private stampGen = 0;
  private best: number;
  private bestCols: number[] = [];
  private found = false;
  private nodes = 0;
  private aborted = false;
  private readonly chosen: number[] = [];
  /** One column per group: the plain unate covering problem. */
  private readonly unate: boolean;
  /** Every cost an integer, so bounds may round up. */
  private readonly integral: boolean;

  constructor(
    private readonly p: CoverProblem,
    private readonly nodeLimit: number,
    private readonly upperBound: number,
  ) {
    this.nr = p.rowCount;
    this.nc = p.columns.length;
    this.rw = (this.nr + 31) >>> 5;
    this.colBits = p.columns.map((c) => {
      const b = new Uint32Array(this.rw);
      for (const r of c.rows) b[r >>> 5] |= 1 << (r & 31);
      return b;
    });
    this.rowCols = Array.from({ length: this.nr }, () => []);
    p.columns.forEach((c, ci) => {
      for (const r of c.rows) this.rowCols[r].push(ci);
    });
    this.opened = new Int32Array(p.groupCost.length);
    this.stamp = new Int32Array(p.groupCost.length);
    this.colStamp = new Int32Array(this.nc);
    this.best = upperBound;
    const perGroup = new Int32Array(p.groupCost.length);
    for (const c of p.columns) perGroup[c.group]++;
    this.unate = perGroup.every((n) => n <= 1);
    this.integral = p.columns.every((c) => Number.isInteger(c.cost)) && p.groupCost.every((g) => Number.isInteger(g));
  }

  run(): CoverSolution | null {
    const unc = new Uint32Array(this.rw);
    for (let r = 0; r < this.nr; r++) {
      if (this.rowCols[r].length === 0) throw new Error('covering problem has a row no column covers');
      unc[r >>> 5] |= 1 << (r & 31);
    }
    const alive = new Uint8Array(this.nc).fill(1);
    const greedy = this.greedy(unc, alive);
    if (greedy.cost < this.best) {
      this.best = greedy.cost;
      this.bestCols = greedy.cols;
      this.found = true;
    }
    this.search(unc, alive, 0);
    if (!this.found) return null;
    return { columns: this.bestCols.slice().sort((a, b) => a - b), cost: this.best, optimal: !this.aborted };
  }

  private isUnc(unc: Uint32Array, r: number): boolean {
    return (unc[r >>> 5] & (1 << (r & 31))) !== 0;
  }

  /** Cost of adding column ci now. */
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

  private untake(): void {
    const ci = this.chosen.pop()!;
    this.opened[this.p.columns[ci].group]--;
  }

  /** Uncovered rows of column ci. */
  private covers(ci: number, unc: Uint32Array): number {
    const b = this.colBits[ci];
    let n = 0;
    for (let k = 0; k < this.rw; k++) {
      let x = b[k] & unc[k];
      while (x !== 0) {
        x &= x - 1;
        n++;
      }
    }
    return n;
  }

  /** Are the uncovered rows of column a all in column b? */
  private subset(a: number, b: number, unc: Uint32Array): boolean {
    const x = this.colBits[a];
    const y = this.colBits[b];
    for (let k = 0; k < this.rw; k++) if ((x[k] & unc[k] & ~y[k]) !== 0) return false;
    return true;
  }

  private live(r: number, alive: Uint8Array): number[] {
    return this.rowCols[r].filter((c) => alive[c] === 1);
  }

  /**
   * Essential columns, column dominance and row dominance on the current table, to a fixed
   * point (Quine–McCluskey's cyclic-core reduction, redone at every node). Mutates unc and
   * alive; returns the cost added and how many columns it took, or null when a row is left
   * with no column.
   */
  private reduce(unc: Uint32Array, alive: Uint8Array): { cost: number; taken: number } | null {
    let cost = 0;
    let taken = 0;
    for (let changed = true; changed;) {
      const ess = this.takeEssentials(unc, alive);
      if (ess === null) return null;
      cost += ess.cost;
      taken += ess.taken;
      const columns = this.dropDominatedColumns(unc, alive);
      const rows = this.dropDominatedRows(unc, alive);
      if (rows === null) return null;
      changed = ess.taken > 0 || columns || rows;
    }
    return { cost, taken };
  }

  /** Take every column that is the only live one of an uncovered row (null: a row has none). */
  private takeEssentials(unc: Uint32Array, alive: Uint8Array): { cost: number; taken: number } | null {
    let cost = 0;
    let taken = 0;
    for (let r = 0; r < this.nr; r++) {
      if (!this.isUnc(unc, r)) continue;
      let only = -1;
      let n = 0;
      for (const c of this.rowCols[r])
        if (alive[c] === 1) {
          n++;
          only = c;
          if (n > 1) break;
        }
      if (n === 0) return null;
      if (n === 1) {
        cost += this.inc(only);
        this.take(only, unc);
        taken++;
      }
    }
    return { cost, taken };
  }

  /** Column dominance: a's rows within b's, and b can never cost more than a would. */
  private dropDominatedColumns(unc: Uint32Array, alive: Uint8Array): boolean {
    const cols = this.p.columns;
    let changed = false;
    const groupLive = new Int32Array(this.p.groupCost.length);
    for (let ci = 0; ci < this.nc; ci++) {
      if (alive[ci] === 0) continue;
      if (this.covers(ci, unc) === 0) {
        alive[ci] = 0;
        continue;
      }
      groupLive[cols[ci].group]++;
    }
    for (let a = 0; a < this.nc; a++) {
      if (alive[a] === 0) continue;
      const ca = cols[a];
      const solo = groupLive[ca.group] === 1 && this.opened[ca.group] === 0;
      const bestA = ca.cost + (solo ? this.p.groupCost[ca.group] : 0);
      let pivot = -1;
      let pivotN = Infinity;
      for (const r of ca.rows) {
        if (!this.isUnc(unc, r)) continue;
        const n = this.rowCols[r].length;
        if (n < pivotN) {
          pivotN = n;
          pivot = r;
        }
      }
      for (const b of this.rowCols[pivot]) {
        if (b === a || alive[b] === 0) continue;
        const cb = cols[b];
        const worstB = cb.cost + (this.opened[cb.group] > 0 ? 0 : this.p.groupCost[cb.group]);
        if (worstB > bestA) continue;
        if (!this.subset(a, b, unc)) continue;
        // Equal columns at equal cost: keep the lower index.
        if (worstB === bestA && b > a && this.subset(b, a, unc)) continue;
        alive[a] = 0;
        groupLive[ca.group]--;
        changed = true;
        break;
      }
    }
    return changed;
  }

  /**
   * Row dominance: a row holding every live column of another row is implied by it.
   * Returns whether a row went, or null when a row is left with no column.
   */
  private dropDominatedRows(unc: Uint32Array, alive: Uint8Array): boolean | null {
    const cols = this.p.columns;
    let changed = false;
    for (let s = 0; s < this.nr; s++) {
      if (!this.isUnc(unc, s)) continue;
      const ls = this.live(s, alive);
      if (ls.length === 0) return null;
      let pivot = ls[0];
      for (const c of ls) if (cols[c].rows.length < cols[pivot].rows.length) pivot = c;
      for (const r of cols[pivot].rows) {
        if (r === s || !this.isUnc(unc, r)) continue;
        let inAll = true;
        for (const c of ls)
          if ((this.colBits[c][r >>> 5] & (1 << (r & 31))) === 0) {
            inAll = false;
            break;
          }
        if (!inAll) continue;
        // r holds all of s's columns; if s also holds all of r's, drop only the later one.
        if (r < s) {
          const lr = this.live(r, alive);
          if (lr.length === ls.length) continue;
        }
        unc[r >>> 5] &= ~(1 << (r & 31));
        changed = true;
      }
    }
    return changed;
  }

  /** Cheapest cost per newly covered row, then drop columns made redundant. */
  private greedy(start: Uint32Array, alive: Uint8Array): { cols: number[]; cost: number } {
    const unc = start.slice();
    const saved = this.opened.slice();
    const picked: number[] = [];
    const count = (): number => {
      let n = 0;
      for (const w of unc) {
        let x = w;
        while (x) {
          x &= x - 1;
          n++;
        }
      }
      return n;
    };
    while (count() > 0) {
      let bestCol = -1;
      let bestRatio = Infinity;
      for (let ci = 0; ci < this.nc; ci++) {
        if (alive[ci] === 0) continue;
        const n = this.covers(ci, unc);
        if (n === 0) continue;
        const ratio = this.inc(ci) / n;
        if (ratio < bestRatio) {
          bestRatio = ratio;
          bestCol = ci;
        }
      }
      const b = this.colBits[bestCol];
      for (let k = 0; k < this.rw; k++) unc[k] &= ~b[k];
      this.opened[this.p.columns[bestCol].group]++;
      picked.push(bestCol);
    }
    const keep = new Set(picked);
    for (const ci of [...picked].sort((a, b) => this.p.columns[b].cost - this.p.columns[a].cost || b - a)) {
      keep.delete(ci);
      const cov = new Uint32Array(this.rw);
      for (const k2 of keep) {
        const b = this.colBits[k2];
        for (let k = 0; k < this.rw; k++) cov[k] |= b[k];
      }
      let ok = true;
      for (let k = 0; k < this.rw; k++)
        if ((start[k] & ~cov[k]) !== 0) {
          ok = false;
          break;
        }
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

  /**
   * Lower bound on the cost still to pay. Rows sharing no group need distinct groups, so
   * their cheapest columns add up; further rows sharing no column with any counted row still
   * need a column (a cord branch) each, whose own cost adds up too. Rows are taken fewest
   * columns first, which tends to give larger independent sets.
   */
  private lowerBound(unc: Uint32Array, alive: Uint8Array, order: readonly number[]): number {
    const gen = ++this.stampGen;
    const cols = this.p.columns;
    let lb = 0;
    const rest: number[] = [];
    for (const r of order) {
      let free = true;
      for (const ci of this.rowCols[r])
        if (alive[ci] === 1 && this.stamp[cols[ci].group] === gen) {
          free = false;
          break;
        }
      if (!free) {
        rest.push(r);
        continue;
      }
      let min = Infinity;
      for (const ci of this.rowCols[r]) {
        if (alive[ci] === 0) continue;
        this.stamp[cols[ci].group] = gen;
        this.colStamp[ci] = gen;
        const v = this.inc(ci);
        if (v < min) min = v;
      }
      lb += min;
    }
    for (const r of rest) {
      let free = true;
      for (const ci of this.rowCols[r])
        if (alive[ci] === 1 && this.colStamp[ci] === gen) {
          free = false;
          break;
        }
      if (!free) continue;
      let min = Infinity;
      for (const ci of this.rowCols[r]) {
        if (alive[ci] === 0) continue;
        this.colStamp[ci] = gen;
        if (cols[ci].cost < min) min = cols[ci].cost;
      }
      lb += min;
    }
    if (!this.unate) return lb;
    // With one column per group, each row also pays at least the cheapest share, per row
    // covered, of a column covering it (the bound of the covering LP's dual).
    let frac = 0;
    for (const r of order) {
      let min = Infinity;
      for (const ci of this.rowCols[r]) {
        if (alive[ci] === 0) continue;
        const v = this.inc(ci) / this.covers(ci, unc);
        if (v < min) min = v;
      }
      frac += min;
    }
    return Math.max(lb, this.integral ? Math.ceil(frac - 1e-9) : frac);
  }

  private search(unc0: Uint32Array, alive0: Uint8Array, cost0: number): void {
    if (this.aborted) return;
    if (++this.nodes > this.nodeLimit) {
      this.aborted = true;
      return;
    }
    const unc = unc0.slice();
    const alive = alive0.slice();
    const mark = this.chosen.length;
    try {
      const red = this.reduce(unc, alive);
      if (red === null) return;
      const cost = cost0 + red.cost;
      if (cost >= this.best) return;
      const order: number[] = [];
      const counts = new Int32Array(this.nr);
      for (let r = 0; r < this.nr; r++) {
        if (!this.isUnc(unc, r)) continue;
        let n = 0;
        for (const c of this.rowCols[r]) if (alive[c] === 1) n++;
        counts[r] = n;
        order.push(r);
      }
      if (order.length === 0) {
        this.best = cost;
        this.bestCols = this.chosen.slice();
        this.found = true;
        return;
      }
      order.sort((a, b) => counts[a] - counts[b] || a - b);
      if (cost + this.lowerBound(unc, alive, order) >= this.best) return;
      const options = this.live(order[0], alive)
        .map((ci) => ({ ci, inc: this.inc(ci), n: this.covers(ci, unc) }))
        .sort((a, b) => a.inc / a.n - b.inc / b.n || a.inc - b.inc || a.ci - b.ci);
      for (const o of options) {
        if (cost + o.inc < this.best) {
          const next = unc.slice();
          this.take(o.ci, next);
          this.search(next, alive, cost + o.inc);
          this.untake();
          if (this.aborted) return;
        }
        // Every cover using this column was searched in its branch: the later branches
        // may leave it out.
        alive[o.ci] = 0;
      }
    } finally {
      while (this.chosen.length > mark) this.untake();
    }
  }
}
