import { describe, expect, it } from 'vitest';
import {
  binaryCode,
  bitsFor,
  grayCode,
  hamming,
  johnsonCode,
  oneHotCode,
} from '../../../../src/core/phases/encode/codes.js';

describe('core/phases/encode/codes', () => {
  // F. Gray, US patent 2,632,058 (1953), "Pulse code communication": the reflected binary
  // code, whose 3-bit table reads 000 001 011 010 110 111 101 100.
  it('gives the reflected binary Gray code for 3 bits (Gray, US patent 2,632,058)', () => {
    const seq = Array.from({ length: 8 }, (_, m) => grayCode(m, 3));
    expect(seq).toEqual(['000', '001', '011', '010', '110', '111', '101', '100']);
  });

  it('Gray neighbours differ in exactly one bit, cyclically, for 1–6 bits', () => {
    for (let b = 1; b <= 6; b++) {
      const seq = Array.from({ length: 2 ** b }, (_, m) => grayCode(m, b));
      expect(new Set(seq).size).toBe(2 ** b);
      for (let m = 0; m < seq.length; m++) expect(hamming(seq[m], seq[(m + 1) % seq.length])).toBe(1);
    }
  });

  // From memory: M. Morris Mano & M. D. Ciletti, Digital Design, counters section (Johnson
  // counter): the switch-tail ring counter's states 000, 100, 110, 111, 011, 001 (3 stages)
  // and 0000, 1000, 1100, 1110, 1111, 0111, 0011, 0001 (4 stages).
  it('gives the Johnson counter sequence (Mano & Ciletti, Digital Design, from memory)', () => {
    expect(Array.from({ length: 6 }, (_, k) => johnsonCode(k, 3))).toEqual(['000', '100', '110', '111', '011', '001']);
    expect(Array.from({ length: 8 }, (_, k) => johnsonCode(k, 4))).toEqual([
      '0000',
      '1000',
      '1100',
      '1110',
      '1111',
      '0111',
      '0011',
      '0001',
    ]);
  });

  it('Johnson neighbours differ in one bit, cyclically', () => {
    for (let b = 1; b <= 6; b++) {
      const seq = Array.from({ length: 2 * b }, (_, k) => johnsonCode(k, b));
      expect(new Set(seq).size).toBe(2 * b);
      for (let k = 0; k < seq.length; k++) expect(hamming(seq[k], seq[(k + 1) % seq.length])).toBe(1);
    }
  });

  it('counts bits, writes binary and one-hot codes most significant bit first', () => {
    expect([1, 2, 3, 4, 5, 8, 9, 16, 17].map(bitsFor)).toEqual([0, 1, 2, 2, 3, 3, 4, 4, 5]);
    expect(binaryCode(6, 4)).toBe('0110');
    expect(binaryCode(0, 0)).toBe('');
    expect(oneHotCode(0, 3)).toBe('100');
    expect(oneHotCode(2, 3)).toBe('001');
  });
});
