/**
 * The commissioning input sequence: a transition tour of the minimised machine — a run from
 * reset that visits every reachable state and takes every reachable transition at least once,
 * so that a person stepping it at the bench (and the Verilog testbench) exercises every row
 * of the state table.
 *
 * Method: greedy nearest-untaken-transition tour (a standard way to build a covering tour
 * when a shortest one — the directed Chinese-postman problem of J. Edmonds & E. L. Johnson,
 * "Matching, Euler tours and the Chinese postman", Math. Programming 5, 1973 — is not needed;
 * from memory): from the current state, a breadth-first search finds the nearest state with a
 * transition not yet taken; the tour walks there along the shortest path and takes it.
 * Transitions that stay inside the current strongly connected component (S. R. Kosaraju's
 * two-pass method; M. Sharir, "A strong-connectivity algorithm and its applications in data
 * flow analysis", Comput. Math. Appl. 7(1), 1981) are taken before any that leave it, since
 * after leaving, only a reset leads back. When nothing untaken can be reached from the current
 * state but something can from the start, the tour resets. A "transition" is one row of the flat table (an input cube with its next state
 * and outputs) whose next state is specified; rows whose next state is free are not part of
 * the specification and are not taken (the abstract machine says nothing about where they go).
 * Inputs a row leaves free are released (0): a person pulls only the levers that matter. Row
 * cubes never meet the `never` set (flat.ts), so the tour never asks for an impossible input.
 *
 * Postconditions: every row with a specified next state of every state reachable from the
 * start is taken; deterministic (rows and states in table order).
 */
import { DONT_CARE, type FlatMachine } from '../model/flat.js';

/** One clock of the tour. */
export interface TourClock {
  /** Pull and release the reset lever before this clock (the tour itself always begins from reset). */
  readonly reset: boolean;
  /** Input levers for this clock, '0'/'1' per input in input order (1 = pulled). */
  readonly inputs: string;
  /** State before the clock, the row taken, and the state after (indices into the machine). */
  readonly state: number;
  readonly row: number;
  readonly next: number;
  /**
   * A clock appended after the tour to show a broken cord the tour does not show
   * (sheet-faults.ts); absent on the tour's own clocks.
   */
  readonly extra?: boolean;
}

export interface TourOptions {
  /** Stop after this many clocks even if some transition is untaken (default 100 000). */
  readonly maxClocks?: number;
}

/** The input assignment a person sets for a row cube: free inputs released. */
export function assignmentFor(cube: string): string {
  return cube.replace(/-/g, '0');
}

/** Every (state, row) pair a tour must take: specified rows of states reachable from the start. */
export function reachableTransitions(f: FlatMachine): [number, number][] {
  const seen = new Set([f.start]);
  const queue = [f.start];
  const out: [number, number][] = [];
  for (let i = 0; i < queue.length; i++) {
    const s = queue[i];
    f.rows[s].forEach((r, k) => {
      if (r.next === DONT_CARE) return;
      out.push([s, k]);
      if (!seen.has(r.next)) {
        seen.add(r.next);
        queue.push(r.next);
      }
    });
  }
  return out.sort((a, b) => a[0] - b[0] || a[1] - b[1]);
}

/** A transition tour of the machine from its start state (see the module comment). */
export function commissioningTour(f: FlatMachine, opts: TourOptions = {}): TourClock[] {
  const maxClocks = opts.maxClocks ?? 100_000;
  const taken = f.rows.map((rs) => rs.map(() => false));
  const untaken = (s: number): number => taken[s].findIndex((t, k) => !t && f.rows[s][k].next !== DONT_CARE);
  const out: TourClock[] = [];
  let cur = f.start;
  let pendingReset = false;
  const take = (s: number, k: number): void => {
    const r = f.rows[s][k];
    taken[s][k] = true;
    out.push({ reset: pendingReset, inputs: assignmentFor(r.cube), state: s, row: k, next: r.next });
    pendingReset = false;
    cur = r.next;
  };
  const scc = components(f);
  // An untaken row of s, preferring one that stays in s's component.
  const inside = (s: number): number =>
    taken[s].findIndex((t, k) => !t && f.rows[s][k].next !== DONT_CARE && scc[f.rows[s][k].next] === scc[s]);
  const anyRow = untaken;
  while (out.length < maxClocks) {
    let path = pathToUntaken(f, cur, inside, (a, b) => scc[a] === scc[b]);
    let pick = inside;
    if (path === null) {
      path = pathToUntaken(f, cur, anyRow, () => true);
      pick = anyRow;
    }
    if (path === null) {
      if (cur === f.start || pathToUntaken(f, f.start, anyRow, () => true) === null) break;
      cur = f.start;
      pendingReset = true;
      continue;
    }
    for (const [s, k] of path) {
      if (out.length >= maxClocks) break;
      take(s, k);
    }
    if (out.length >= maxClocks) break;
    take(cur, pick(cur));
  }
  return out;
}

/** Strongly connected component of every state (Kosaraju: finish order on the graph, then search the reversed graph). */
function components(f: FlatMachine): number[] {
  const n = f.states.length;
  const succ = f.rows.map((rs) => [...new Set(rs.filter((r) => r.next !== DONT_CARE).map((r) => r.next))]);
  const pred: number[][] = Array.from({ length: n }, () => []);
  succ.forEach((list, s) => list.forEach((t) => pred[t].push(s)));
  const order: number[] = [];
  const seen = new Uint8Array(n);
  for (let root = 0; root < n; root++) {
    if (seen[root]) continue;
    // Iterative depth-first search recording finish order (no recursion: machines may have thousands of states).
    const stack: [number, number][] = [[root, 0]];
    seen[root] = 1;
    while (stack.length > 0) {
      const top = stack[stack.length - 1];
      const [s, i] = top;
      if (i < succ[s].length) {
        top[1]++;
        const t = succ[s][i];
        if (!seen[t]) {
          seen[t] = 1;
          stack.push([t, 0]);
        }
      } else {
        order.push(s);
        stack.pop();
      }
    }
  }
  const comp = new Array<number>(n).fill(-1);
  let c = 0;
  for (let k = order.length - 1; k >= 0; k--) {
    const root = order[k];
    if (comp[root] >= 0) continue;
    const queue = [root];
    comp[root] = c;
    for (let q = 0; q < queue.length; q++) {
      for (const p of pred[queue[q]]) {
        if (comp[p] >= 0) continue;
        comp[p] = c;
        queue.push(p);
      }
    }
    c++;
  }
  return comp;
}

/** Shortest path (as rows taken, along edges `allowed` keeps) from `from` to the nearest state with an untaken row, or null. */
function pathToUntaken(
  f: FlatMachine,
  from: number,
  untaken: (s: number) => number,
  allowed: (a: number, b: number) => boolean,
): [number, number][] | null {
  const via = new Map<number, [number, number]>();
  const queue = [from];
  const seen = new Set([from]);
  for (let i = 0; i < queue.length; i++) {
    const s = queue[i];
    if (untaken(s) >= 0) {
      const path: [number, number][] = [];
      for (let t = s; t !== from;) {
        const step = via.get(t) as [number, number];
        path.unshift(step);
        t = step[0];
      }
      return path;
    }
    f.rows[s].forEach((r, k) => {
      if (r.next === DONT_CARE || seen.has(r.next) || !allowed(s, r.next)) return;
      seen.add(r.next);
      via.set(r.next, [s, k]);
      queue.push(r.next);
    });
  }
  return null;
}
