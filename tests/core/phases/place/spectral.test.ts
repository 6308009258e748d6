import { describe, expect, it } from 'vitest';
import { components, fiedlerVector, spectralValues } from '../../../../src/core/phases/place/spectral.js';
import { seededRandom } from '../../../../src/core/model/random.js';

const path = (n: number) => Array.from({ length: n - 1 }, (_, i) => ({ a: i, b: i + 1, w: 1 }));

describe('core/phases/place/spectral', () => {
  // The Laplacian of the path P_n has eigenvalues 2 − 2cos(πk/n) with eigenvectors cos(πk(i + ½)/n)
  // (A. E. Brouwer & W. H. Haemers, "Spectra of Graphs", Springer 2012, the path in §1.4 — from memory).
  it('finds the Fiedler vector of a path: cos(π(i + ½)/n), eigenvalue 2 − 2cos(π/n)', () => {
    for (const n of [5, 12, 40]) {
      const f = fiedlerVector(n, path(n), seededRandom(n));
      const want = Array.from({ length: n }, (_, i) => Math.cos((Math.PI * (i + 0.5)) / n));
      const norm = Math.hypot(...want);
      const sign = Math.sign(f[0]);
      for (let i = 0; i < n; i++) expect(sign * f[i]).toBeCloseTo(want[i] / norm, 4);
      // Rayleigh quotient x·Lx / x·x (x has unit length).
      let q = 0;
      for (let i = 0; i + 1 < n; i++) q += (f[i] - f[i + 1]) ** 2;
      expect(q).toBeCloseTo(2 - 2 * Math.cos(Math.PI / n), 6);
    }
  });

  // Juvan & Mohar (1992): sorting by the Fiedler vector solves the arrangement of a path exactly.
  it('orders a shuffled path back into path order', () => {
    const n = 15;
    const label = [7, 3, 11, 0, 14, 5, 9, 1, 12, 4, 8, 13, 2, 10, 6];
    const edges = path(n).map((e) => ({ a: label[e.a], b: label[e.b], w: 1 }));
    const v = spectralValues(n, edges, seededRandom(4));
    const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => v[a] - v[b]);
    expect([label, [...label].reverse()]).toContainEqual(order);
  });

  it('keeps components apart, largest first', () => {
    const edges = [
      { a: 0, b: 4, w: 1 },
      { a: 1, b: 2, w: 1 },
      { a: 2, b: 3, w: 1 },
    ];
    expect(components(6, edges)).toEqual([[1, 2, 3], [0, 4], [5]]);
    const v = spectralValues(6, edges, seededRandom(1));
    for (const i of [1, 2, 3]) expect(v[i]).toBeLessThanOrEqual(1);
    for (const i of [0, 4]) expect(v[i]).toBeGreaterThanOrEqual(2);
    expect(v[5]).toBeGreaterThanOrEqual(4);
  });

  it('is deterministic for a given generator seed', () => {
    const edges = path(30).concat([{ a: 0, b: 29, w: 2 }]);
    expect(Array.from(spectralValues(30, edges, seededRandom(8)))).toEqual(
      Array.from(spectralValues(30, edges, seededRandom(8))),
    );
  });
});
