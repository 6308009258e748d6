import { describe, expect, it } from 'vitest';
import { encode } from '../../../../src/core/phases/encode/index.js';
import { ring, tableMachine } from './machines.js';

describe('core/phases/encode/binary', () => {
  it('counts up from the start state in FlatMachine order, ceil(log2 n) bits', () => {
    const f = { ...ring(5), start: 2 };
    const r = encode(f, 'binary');
    expect(r.diagnostics).toEqual([]);
    expect(r.encoding).toEqual({ strategy: 'binary', bits: 3, codes: ['001', '010', '000', '011', '100'] });
  });

  it('uses no bits for a one-state machine (a combinational build)', () => {
    const r = encode(tableMachine('one', 1, [[0, 0]]), 'binary');
    expect(r.encoding).toEqual({ strategy: 'binary', bits: 0, codes: [''] });
  });

  it('fills around a partial pin, keeping the pinned code', () => {
    const r = encode(ring(4), 'binary', { pinned: { s2: '00' } });
    expect(r.encoding?.codes).toEqual(['01', '10', '00', '11']);
  });

  it('takes the pinned length when it is longer than needed', () => {
    const r = encode(ring(3), 'binary', { pinned: { s0: '111' } });
    expect(r.encoding).toEqual({ strategy: 'binary', bits: 3, codes: ['111', '000', '001'] });
  });

  it('reports LW701 when the pinned length is too short for the machine', () => {
    const r = encode(ring(5), 'binary', { pinned: { s0: '11' } });
    expect(r.encoding).toBeUndefined();
    expect(r.diagnostics.map((d) => d.code)).toEqual(['LW701']);
  });
});
