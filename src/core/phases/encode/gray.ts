/**
 * Gray encoding: the reflected binary Gray code (F. Gray, US patent 2,632,058, 1953),
 * ceil(log2 n) bits, handed out along a greedy traversal from the start state (see
 * order.ts) so that the heaviest transitions join states whose codes differ in one bit.
 * Pre: a flat machine with at least one state; post: distinct codes, pins honoured.
 */
import type { FlatMachine } from '../../model/flat.js';
import { bitsFor, grayCode } from './codes.js';
import { traversal } from './order.js';
import { assignFromSequence, type PinSet, type StrategyResult } from './pinned.js';

/** Reflected Gray codes along the traversal order. */
export function gray(f: FlatMachine, pins: PinSet): StrategyResult {
  return assignFromSequence(f, pins, 'gray', bitsFor(f.states.length), traversal(f), graySequence);
}

/** The reflected Gray code sequence of the given length, lazily. */
export function* graySequence(bits: number): Generator<string> {
  for (let m = 0; m < 2 ** bits; m++) yield grayCode(m, bits);
}
