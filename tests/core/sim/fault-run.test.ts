import { describe, expect, it } from 'vitest';
import { compareLooks, differences } from '../../../src/core/sim/fault-run.js';
import { X } from '../../../src/core/sim/compile.js';

const look = (...v: number[]): Uint8Array => Uint8Array.from(v);

describe('core/sim/fault-run', () => {
  // Three-valued comparison (X as "unknown", Abramovici, Breuer & Friedman, 1990, ch. 3 — from
  // memory): a fault is shown only where both values are determinate and differ.
  it('counts a determinate difference as shown, a faulty X as "may show", and nothing under a fault-free X', () => {
    expect(compareLooks(look(0, 1, 1), look(0, 1, 1))).toBe(0);
    expect(compareLooks(look(0, 1, 1), look(0, 0, 1))).toBe(2);
    expect(compareLooks(look(0, 1, 1), look(0, X, 1))).toBe(1);
    expect(compareLooks(look(0, 1, 1), look(X, X, 0))).toBe(2);
    expect(compareLooks(look(X, 1), look(0, 1))).toBe(0);
    expect(compareLooks(look(X, 1), look(1, 1))).toBe(0);
  });

  it('lists what differs with the value seen', () => {
    expect(differences(look(0, 1, 1, X), look(1, X, 0, 1))).toEqual([
      { at: 0, value: 1 },
      { at: 2, value: 0 },
    ]);
  });
});
