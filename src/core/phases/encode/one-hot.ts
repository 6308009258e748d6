/**
 * One-hot encoding: n bits, each state's code has a single 1; the start state gets the 1 in
 * bit 0, the others follow in FlatMachine order. A pin may take a code outside the family
 * (e.g. all zeros for the start state, a common variant); the others still get one-hot codes.
 * Pre: a flat machine with at least one state; post: distinct codes, pins honoured.
 */
import type { FlatMachine } from '../../model/flat.js';
import { oneHotCode } from './codes.js';
import { startFirst } from './order.js';
import { assignFromSequence, type PinSet, type StrategyResult } from './pinned.js';

/** One-hot codes in start-first state order. */
export function oneHot(f: FlatMachine, pins: PinSet): StrategyResult {
  return assignFromSequence(f, pins, 'one-hot', f.states.length, startFirst(f), oneHotSequence);
}

/** The `bits` one-hot codes, the 1 moving from bit 0 to the last bit. */
export function* oneHotSequence(bits: number): Generator<string> {
  for (let p = 0; p < bits; p++) yield oneHotCode(p, bits);
}
