/**
 * Code words of the named encodings, as '0'/'1' strings with bit 0 (the most significant)
 * first, the convention of `Encoding.codes` and of `mintermString` in model/cube.ts.
 * Every generator takes the code length explicitly so that a user's pinned codes may ask
 * for more bits than the strategy's minimum.
 */

/** Fewest bits that give n states distinct codes: ceil(log2 n), 0 for one state. */
export function bitsFor(n: number): number {
  let b = 0;
  while (2 ** b < n) b++;
  return b;
}

/** The m-th code of plain binary counting, `bits` long (m < 2^53). */
export function binaryCode(m: number, bits: number): string {
  return bits === 0 ? '' : m.toString(2).padStart(bits, '0');
}

/** The m-th reflected binary Gray code, m XOR (m >> 1) (F. Gray, US patent 2,632,058, 1953). */
export function grayCode(m: number, bits: number): string {
  return binaryCode(m ^ (m >>> 1), bits);
}

/**
 * The k-th state of a `bits`-stage twisted-ring (Johnson) counter that shifts towards the
 * last bit and feeds the complement of the last bit into the first: 0…0, 10…0, 110…0, …,
 * 1…1, 01…1, …, 0…01; 2·bits states in all, neighbours (cyclically) one bit apart.
 */
export function johnsonCode(k: number, bits: number): string {
  return k <= bits ? '1'.repeat(k) + '0'.repeat(bits - k) : '0'.repeat(k - bits) + '1'.repeat(2 * bits - k);
}

/** The code with a single 1 at position p. */
export function oneHotCode(p: number, bits: number): string {
  return '0'.repeat(p) + '1' + '0'.repeat(bits - p - 1);
}

/** Code string → integer (bit 0 is the most significant); only for bits ≤ 30. */
export function codeToInt(code: string): number {
  return code === '' ? 0 : parseInt(code, 2);
}

/** Number of positions where two codes of equal length differ. */
export function hamming(a: string, b: string): number {
  let d = 0;
  for (let i = 0; i < a.length; i++) if (a.charCodeAt(i) !== b.charCodeAt(i)) d++;
  return d;
}
