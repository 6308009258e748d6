import { describe, expect, it } from 'vitest';
import { encode } from '../../../../src/core/phases/encode/index.js';
import { hamming } from '../../../../src/core/phases/encode/codes.js';
import { ring, tableMachine } from './machines.js';

describe('core/phases/encode/gray', () => {
  it('hands out the reflected Gray code along the ring from the start', () => {
    const r = encode({ ...ring(4), start: 1 }, 'gray');
    // Walk s1 → s2 → s3 → s0 gets 00, 01, 11, 10 (Gray, US patent 2,632,058, 2-bit table).
    expect(r.encoding).toEqual({ strategy: 'gray', bits: 2, codes: ['10', '00', '01', '11'] });
  });

  it('puts every step of a ring of 2^b states one bit apart', () => {
    const f = ring(8);
    const codes = encode(f, 'gray').encoding?.codes ?? [];
    for (let s = 0; s < 8; s++) expect(hamming(codes[s], codes[(s + 1) % 8])).toBe(1);
  });

  it('makes the heaviest transition a single-bit change even when the state order does not', () => {
    // s0 goes to s3 on three of four input combinations, to s1 on one; s3 returns to s0.
    const f = tableMachine('heavy', 2, [
      [1, 3, 3, 3],
      [2, 2, 2, 2],
      [0, 0, 0, 0],
      [0, 0, 0, 0],
    ]);
    const codes = encode(f, 'gray').encoding?.codes ?? [];
    expect(hamming(codes[0], codes[3])).toBe(1);
    expect(encode(f, 'binary').encoding?.codes[3]).toBe('11'); // binary puts them two bits apart
  });

  it('honours a partial pin', () => {
    const r = encode(ring(4), 'gray', { pinned: { s0: '11' } });
    expect(r.encoding?.codes[0]).toBe('11');
    expect(new Set(r.encoding?.codes).size).toBe(4);
  });
});
