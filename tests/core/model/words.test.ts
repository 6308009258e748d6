import { describe, expect, it } from 'vitest';
import { counted } from '../../../src/core/model/words.js';

// English count agreement (any grammar of English): the singular for exactly one, the plural
// for zero and for more than one.
describe('core/model/words', () => {
  it('gives the singular for one and the plural for zero and many', () => {
    expect(counted(1, 'state')).toBe('1 state');
    expect(counted(0, 'state')).toBe('0 states');
    expect(counted(2, 'start point')).toBe('2 start points');
  });

  it('takes a plural that is not the noun with an s', () => {
    expect(counted(1, 'latch', 'latches')).toBe('1 latch');
    expect(counted(4, 'latch', 'latches')).toBe('4 latches');
  });
});
