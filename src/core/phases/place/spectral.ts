/**
 * Spectral starting order: units sorted by their entry in the Fiedler vector of the net
 * graph's Laplacian (the eigenvector of the second-smallest eigenvalue; M. Fiedler, "Algebraic
 * connectivity of graphs", Czech. Math. J. 23, 1973). Juvan & Mohar ("Optimal linear labelings
 * and eigenvalues of graphs", Discrete Applied Math. 36, 1992) show this order is a good
 * approximation of the minimum linear arrangement and bound the optimum by λ₂.
 *
 * Method: inverse iteration on the Laplacian L = D − A of each connected component, deflated
 * by the constant vector (L's null vector on a connected graph): repeatedly solve L·y = x by
 * conjugate gradients (Hestenes & Stiefel, J. Res. NBS 49, 1952) with x kept orthogonal to the
 * constant vector, so the system is consistent and CG stays in the orthogonal complement;
 * normalise. The iteration converges to the Fiedler vector at the rate λ₂/λ₃ per step; the
 * order needs only its signs and ranks, so a few dozen steps suffice. Components are ordered
 * one after another (each by its own vector), largest first.
 *
 * Pre: edge weights > 0 between nodes 0..n−1. Post: one value per node; deterministic for a
 * given generator state (the starting vector is drawn from it).
 */
import type { Random } from '../../model/random.js';

export interface WeightedEdge {
  readonly a: number;
  readonly b: number;
  readonly w: number;
}

/** Outer inverse-iteration steps at most; stop earlier when the vector settles. */
const MAX_STEPS = 30;
const SETTLED = 1e-10;

interface Adjacency {
  readonly to: number[][];
  readonly w: number[][];
}

function adjacency(n: number, edges: readonly WeightedEdge[]): Adjacency {
  const to = Array.from({ length: n }, () => [] as number[]);
  const w = Array.from({ length: n }, () => [] as number[]);
  for (const e of edges) {
    if (e.a === e.b) continue;
    to[e.a].push(e.b);
    w[e.a].push(e.w);
    to[e.b].push(e.a);
    w[e.b].push(e.w);
  }
  return { to, w };
}

/** Connected components, each a list of nodes in increasing order, largest first (ties: lowest node first). */
export function components(n: number, edges: readonly WeightedEdge[]): number[][] {
  const { to } = adjacency(n, edges);
  const seen = new Uint8Array(n);
  const out: number[][] = [];
  for (let s = 0; s < n; s++) {
    if (seen[s]) continue;
    const comp = [s];
    seen[s] = 1;
    for (let i = 0; i < comp.length; i++)
      for (const v of to[comp[i]])
        if (!seen[v]) {
          seen[v] = 1;
          comp.push(v);
        }
    out.push(comp.sort((a, b) => a - b));
  }
  return out.sort((a, b) => b.length - a.length || a[0] - b[0]);
}

/** y = L·x on one component (local indices). */
function laplacianTimes(adj: Adjacency, x: Float64Array, y: Float64Array): void {
  for (let i = 0; i < x.length; i++) {
    let s = 0;
    const to = adj.to[i];
    const w = adj.w[i];
    for (let k = 0; k < to.length; k++) s += w[k] * (x[i] - x[to[k]]);
    y[i] = s;
  }
}

const dot = (a: Float64Array, b: Float64Array): number => {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s;
};

function deflate(x: Float64Array): void {
  let mean = 0;
  for (const v of x) mean += v;
  mean /= x.length;
  for (let i = 0; i < x.length; i++) x[i] -= mean;
}

function normalise(x: Float64Array): boolean {
  const norm = Math.sqrt(dot(x, x));
  if (!(norm > 0)) return false;
  for (let i = 0; i < x.length; i++) x[i] /= norm;
  return true;
}

/** Solve L·y = b (b ⊥ 1) by conjugate gradients from y = 0. */
function solve(adj: Adjacency, b: Float64Array): Float64Array {
  const n = b.length;
  const y = new Float64Array(n);
  const r = Float64Array.from(b);
  const d = Float64Array.from(b);
  const q = new Float64Array(n);
  let rr = dot(r, r);
  const stop = rr * 1e-16;
  for (let it = 0; it < 4 * n && rr > stop; it++) {
    laplacianTimes(adj, d, q);
    const dq = dot(d, q);
    if (!(dq > 0)) break;
    const alpha = rr / dq;
    for (let i = 0; i < n; i++) {
      y[i] += alpha * d[i];
      r[i] -= alpha * q[i];
    }
    const next = dot(r, r);
    const beta = next / rr;
    rr = next;
    for (let i = 0; i < n; i++) d[i] = r[i] + beta * d[i];
  }
  deflate(y);
  return y;
}

/** The Fiedler vector of one connected graph on `n` nodes (unit length, ⊥ 1); sign as it falls. */
export function fiedlerVector(n: number, edges: readonly WeightedEdge[], rng: Random): Float64Array {
  if (n <= 1) return new Float64Array(n);
  const adj = adjacency(n, edges);
  let x: Float64Array = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = rng.next() - 0.5;
  deflate(x);
  if (!normalise(x)) x[0] = 1;
  for (let step = 0; step < MAX_STEPS; step++) {
    const y = solve(adj, x);
    if (!normalise(y)) break;
    const settled = 1 - Math.abs(dot(x, y)) < SETTLED;
    x = y;
    if (settled) break;
  }
  return x;
}

/**
 * A spectral value per node: nodes of the k-th component (largest first) get values in
 * [2k, 2k + 1], ordered within by that component's Fiedler vector, so that sorting by value
 * keeps components apart.
 */
export function spectralValues(n: number, edges: readonly WeightedEdge[], rng: Random): Float64Array {
  const out = new Float64Array(n);
  components(n, edges).forEach((comp, k) => {
    const local = new Map(comp.map((v, i) => [v, i]));
    const sub: WeightedEdge[] = [];
    for (const e of edges) {
      const a = local.get(e.a);
      const b = local.get(e.b);
      if (a !== undefined && b !== undefined) sub.push({ a, b, w: e.w });
    }
    const f = fiedlerVector(comp.length, sub, rng);
    let lo = Infinity;
    let hi = -Infinity;
    for (const v of f) {
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
    const span = hi > lo ? hi - lo : 1;
    comp.forEach((v, i) => (out[v] = 2 * k + (f[i] - lo) / span));
  });
  return out;
}
