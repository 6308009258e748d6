import { describe, expect, it } from 'vitest';
import {
  assignmentOf,
  clockActions,
  describeAction,
  describeTrace,
  ruleBroken,
  valuesOf,
} from '../../../src/core/sim/hand.js';

describe('core/sim/hand', () => {
  it('tells which operating rule an action breaks', () => {
    const rest = { phi1: false, phi2: false, reset: false };
    expect(ruleBroken({ kind: 'input', input: 'a', value: 1 }, rest)).toBeNull();
    expect(ruleBroken({ kind: 'input', input: 'a', value: 1 }, { ...rest, phi1: true })).toBe('inputs-steady');
    expect(ruleBroken({ kind: 'input', input: 'a', value: 0 }, { ...rest, phi2: true })).toBeNull();
    expect(ruleBroken({ kind: 'pull', lever: 'phi2' }, { ...rest, phi1: true })).toBe('clocks-apart');
    expect(ruleBroken({ kind: 'pull', lever: 'phi1' }, { ...rest, reset: true })).toBe('reset-alone');
    expect(ruleBroken({ kind: 'pull', lever: 'reset' }, { ...rest, phi2: true })).toBe('reset-alone');
    expect(ruleBroken({ kind: 'release', lever: 'phi1' }, { phi1: true, phi2: true, reset: true })).toBeNull();
  });

  it('lists one clock of the hand procedure, moving only the levers that change', () => {
    const acts = clockActions(['a', 'b'], { a: 1 }, { a: 0, b: 1 });
    expect(describeTrace(acts)).toEqual([
      "1. pull input lever 'a'",
      "2. release input lever 'b'",
      '3. pull φ1',
      '4. release φ1',
      '5. pull φ2',
      '6. release φ2',
    ]);
    expect(clockActions(['a'], { a: 1 }, { a: 1 }).map(describeAction)).toEqual([
      'pull φ1',
      'release φ1',
      'pull φ2',
      'release φ2',
    ]);
  });

  it('converts between input values and assignment strings', () => {
    expect(valuesOf(['a', 'b', 'c'], '101')).toEqual({ a: 1, b: 0, c: 1 });
    expect(assignmentOf(['a', 'b', 'c'], { c: 1 })).toBe('001');
  });
});
