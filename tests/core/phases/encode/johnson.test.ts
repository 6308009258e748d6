import { describe, expect, it } from 'vitest';
import { encode } from '../../../../src/core/phases/encode/index.js';
import { ring, tableMachine } from './machines.js';

describe('core/phases/encode/johnson', () => {
  it('gives a 6-state ring the 3-stage counter sequence (Mano & Ciletti, Digital Design, from memory)', () => {
    const r = encode(ring(6), 'johnson');
    expect(r.encoding).toEqual({ strategy: 'johnson', bits: 3, codes: ['000', '100', '110', '111', '011', '001'] });
  });

  it('uses the first n codes of the sequence for odd n', () => {
    const r = encode(ring(5), 'johnson');
    expect(r.encoding).toEqual({ strategy: 'johnson', bits: 3, codes: ['000', '100', '110', '111', '011'] });
  });

  it('fits two states in one bit', () => {
    expect(encode(ring(2), 'johnson').encoding).toEqual({ strategy: 'johnson', bits: 1, codes: ['0', '1'] });
  });

  it('reports LW701 for a one-state machine', () => {
    const r = encode(tableMachine('one', 0, [[0]]), 'johnson');
    expect(r.encoding).toBeUndefined();
    expect(r.diagnostics.map((d) => [d.code, d.severity])).toEqual([['LW701', 'error']]);
  });

  it('reports LW701 when the pinned length leaves too few Johnson codes', () => {
    // 6 states with 2-bit pins: the 2-stage counter has 4 codes, 5 unpinned states need 5.
    const r = encode(ring(6), 'johnson', { pinned: { s0: '00' } });
    expect(r.encoding).toBeUndefined();
    expect(r.diagnostics.map((d) => d.code)).toEqual(['LW701']);
  });

  it('fills around pins that lie outside the Johnson sequence', () => {
    const r = encode(ring(7), 'johnson', { pinned: { s0: '010', s1: '101' } });
    expect(r.encoding?.codes).toEqual(['010', '101', '000', '100', '110', '111', '011']);
  });
});
