/**
 * The one seeded random generator every search and Monte Carlo run goes through, so that a
 * given seed always gives the same answer (mulberry32: T. Ettinger's 32-bit generator,
 * public domain; small, fast and good enough for search, not for cryptography).
 */

export interface Random {
  /** Uniform in [0, 1). */
  next(): number;
  /** Uniform integer in [0, n). */
  int(n: number): number;
  /** A new generator derived from this one (for independent sub-searches). */
  fork(): Random;
}

export function seededRandom(seed: number): Random {
  let a = seed >>> 0;
  const next = (): number => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return {
    next,
    int: (n: number) => Math.floor(next() * n),
    fork: () => seededRandom(Math.floor(next() * 4294967296)),
  };
}
