/**
 * State orders for the named encodings.
 *
 * - `startFirst`: the start state, then the others in FlatMachine order. Binary and one-hot
 *   use it so the start state gets the first code (all zeros for binary), which makes the
 *   reset pattern and the commissioning sheet easy to read; everything else keeps the order
 *   in which the user wrote the states.
 * - `traversal`: a greedy chain from the start state that always steps to the not yet
 *   placed state it exchanges the most transitions with (a nearest-neighbour walk, the
 *   cheapest heuristic for the path-ordering problem). Gray and Johnson codes give
 *   neighbours in the sequence codes one bit apart, so the heaviest transitions become
 *   single-bit changes — the adjacency idea behind classic state assignment (De Micheli,
 *   "Synthesis and Optimization of Digital Circuits", 1994, state-encoding chapter).
 *
 * A transition's weight is the share of the input space its rows cover (every input
 * combination taken as equally likely, since the tool knows nothing of how the machine
 * will be used); rows with a free next state and self-loops weigh nothing. Weights are
 * floating-point sums of powers of two, exact for the 32 inputs the tool allows, so ties compare exactly.
 */
import type { FlatMachine } from '../../model/flat.js';

/** Directed transition weights d[i][j]: the share of state i's input space that leads to state j ≠ i. */
export function directedWeights(f: FlatMachine): number[][] {
  const n = f.states.length;
  const d = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  f.rows.forEach((rows, s) => {
    for (const r of rows) {
      if (r.next < 0 || r.next === s) continue;
      let free = 0;
      for (let i = 0; i < r.cube.length; i++) if (r.cube.charCodeAt(i) === 45) free++;
      d[s][r.next] += 2 ** (free - r.cube.length);
    }
  });
  return d;
}

/** Symmetric transition weights w[i][j] = d[i][j] + d[j][i]. */
export function transitionWeights(f: FlatMachine): number[][] {
  const d = directedWeights(f);
  return d.map((row, i) => row.map((x, j) => x + d[j][i]));
}

/** The start state first, then every other state in FlatMachine order. */
export function startFirst(f: FlatMachine): number[] {
  const order = [f.start];
  for (let s = 0; s < f.states.length; s++) if (s !== f.start) order.push(s);
  return order;
}

/**
 * Greedy chain from the start: next is the unplaced state with the heaviest transitions to
 * the last placed one (ties: the heavier forward direction, so a ring is walked the way it
 * runs); when the last has none left, the unplaced state heaviest to all placed ones; any
 * remaining ties (and wholly unconnected states) go to the lower state index.
 */
export function traversal(f: FlatMachine): number[] {
  const n = f.states.length;
  const d = directedWeights(f);
  const w = d.map((row, i) => row.map((x, j) => x + d[j][i]));
  const placed = new Array<boolean>(n).fill(false);
  const toPlaced = new Array<number>(n).fill(0);
  const order: number[] = [];
  let cur = f.start;
  for (;;) {
    order.push(cur);
    placed[cur] = true;
    for (let j = 0; j < n; j++) toPlaced[j] += w[cur][j];
    if (order.length === n) return order;
    let best = -1;
    for (let j = 0; j < n; j++) {
      if (placed[j]) continue;
      if (best < 0 || w[cur][j] > w[cur][best] || (w[cur][j] === w[cur][best] && d[cur][j] > d[cur][best])) best = j;
    }
    if (w[cur][best] === 0) {
      for (let j = 0; j < n; j++) if (!placed[j] && toPlaced[j] > toPlaced[best]) best = j;
    }
    cur = best;
  }
}
