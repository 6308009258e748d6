/**
 * Johnson (twisted-ring counter) encoding: ceil(n/2) bits give 2·ceil(n/2) codes, each one
 * bit from its neighbours, cyclically; for odd n the first n of the sequence are used (the
 * last state is then two bits from the first). Codes are handed out along the same greedy
 * traversal as Gray codes, so a machine that runs round a cycle gets the counter's own
 * sequence. A one-state machine has no ring to twist: LW701.
 * Pre: a flat machine; post: distinct codes, pins honoured.
 */
import { diag } from '../../model/diagnostics.js';
import type { FlatMachine } from '../../model/flat.js';
import { johnsonCode } from './codes.js';
import { traversal } from './order.js';
import { assignFromSequence, type PinSet, type StrategyResult } from './pinned.js';

/** Johnson counter codes along the traversal order. */
export function johnson(f: FlatMachine, pins: PinSet): StrategyResult {
  const n = f.states.length;
  if (n < 2) {
    return {
      diagnostics: [
        diag(
          'LW701',
          `Johnson codes need at least two states; '${f.name}' has one`,
          {},
          'a one-state machine needs no state bits: choose binary',
        ),
      ],
    };
  }
  return assignFromSequence(f, pins, 'johnson', Math.ceil(n / 2), traversal(f), johnsonSequence);
}

/** The 2·bits states of a twisted-ring counter, from all zeros. */
export function* johnsonSequence(bits: number): Generator<string> {
  for (let k = 0; k < 2 * bits; k++) yield johnsonCode(k, bits);
}
