/**
 * Binary encoding: the start state gets 0…0, the other states count up in FlatMachine
 * order, ceil(log2 n) bits (none for a one-state machine, which builds as pure logic).
 * Pre: a flat machine with at least one state; post: distinct codes, pins honoured.
 */
import type { FlatMachine } from '../../model/flat.js';
import { binaryCode, bitsFor } from './codes.js';
import { startFirst } from './order.js';
import { assignFromSequence, type PinSet, type StrategyResult } from './pinned.js';

/** Plain binary counting codes in start-first state order. */
export function binary(f: FlatMachine, pins: PinSet): StrategyResult {
  return assignFromSequence(f, pins, 'binary', bitsFor(f.states.length), startFirst(f), binarySequence);
}

/** 0 … 2^bits − 1 as codes, lazily (pins may ask for many bits). */
export function* binarySequence(bits: number): Generator<string> {
  for (let m = 0; m < 2 ** bits; m++) yield binaryCode(m, bits);
}
