import { describe, expect, it } from 'vitest';
import { encode } from '../../../../src/core/phases/encode/index.js';
import { ring, tableMachine } from './machines.js';

describe('core/phases/encode/one-hot', () => {
  it('gives n bits with a single 1, the start state first', () => {
    const r = encode({ ...ring(4), start: 2 }, 'one-hot');
    expect(r.encoding).toEqual({ strategy: 'one-hot', bits: 4, codes: ['0100', '0010', '1000', '0001'] });
  });

  it('lets the start state be pinned to all zeros, the others staying one-hot', () => {
    const r = encode(ring(3), 'one-hot', { pinned: { s0: '000' } });
    expect(r.encoding?.codes).toEqual(['000', '100', '010']);
  });

  it('gives a one-state machine the code 1', () => {
    expect(encode(tableMachine('one', 0, [[0]]), 'one-hot').encoding).toEqual({
      strategy: 'one-hot',
      bits: 1,
      codes: ['1'],
    });
  });
});
