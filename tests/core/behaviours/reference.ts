/**
 * Reference behaviours: plain functions of the input history, written straight from each
 * behaviour's definition (docs/behaviours.md), knowing nothing of states or of the text the
 * tool writes. Each returns the outputs of every clock.
 */
import type { Clock, Shown } from './harness.js';

/** Counting: the count of pulses modulo N (a clear clock sets it to 0 and counts nothing). */
export function countingReference(
  clocks: readonly Clock[],
  p: { input: string; every: number; output: string; clear?: string; timing: 'same-clock' | 'next-clock' },
): Shown[] {
  let count = 0;
  let hitBefore = false;
  return clocks.map((c) => {
    let hit = false;
    if (p.clear && c[p.clear]) count = 0;
    else if (c[p.input]) {
      count = (count + 1) % p.every;
      hit = count === 0;
    }
    const shown = p.timing === 'same-clock' ? hit : hitBefore;
    hitBefore = hit;
    return { [p.output]: shown ? 1 : 0 };
  });
}

/** Does `seen` end with `order`? */
const endsWith = (seen: readonly string[], order: readonly string[]): boolean =>
  seen.length >= order.length && order.every((x, i) => seen[seen.length - order.length + i] === x);

/**
 * Sequence, overlapping mode (CLRS §32.3: the automaton accepts exactly when the text read so
 * far ends with the pattern): the presses since the start or the last close, a press of two
 * or more at once written as a symbol no order has; open on the clock after a press that makes
 * them end with the order (one-clock), or from then until a close (until-closed).
 * Strict mode: how far into the order the presses since the last wrong press have gone.
 */
export function sequenceReference(
  clocks: readonly Clock[],
  p: {
    inputs: readonly string[];
    order: readonly string[];
    output: string;
    close?: string;
    fallback: 'overlap' | 'strict';
    open: 'one-clock' | 'until-closed';
  },
): Shown[] {
  let seen: string[] = [];
  let progress = 0;
  let completedBefore = false;
  let open = false;
  return clocks.map((c) => {
    const shown = p.open === 'one-clock' ? completedBefore : open;
    completedBefore = false;
    const pulled = p.inputs.filter((x) => c[x]);
    if (p.close && c[p.close]) {
      seen = [];
      progress = 0;
      open = false;
    } else if (!open && pulled.length > 0) {
      const press = pulled.length === 1 ? pulled[0] : '#two-or-more';
      seen.push(press);
      if (p.fallback === 'strict') {
        const fresh = progress === p.order.length ? 0 : progress;
        progress = p.order[fresh] === press ? fresh + 1 : 0;
      } else progress = endsWith(seen, p.order) ? p.order.length : 0;
      if (progress === p.order.length) {
        completedBefore = true;
        open = p.open === 'until-closed';
      }
    } else if (p.fallback === 'strict' && progress === p.order.length && pulled.length === 0) progress = 0;
    return { [p.output]: shown ? 1 : 0 };
  });
}

/** Hold: the output when the last K clocks all held the input; `holding` when the last clock held but not K of them. */
export function holdReference(
  clocks: readonly Clock[],
  p: { input: string; clocks: number; output: string; holding?: string },
): Shown[] {
  let run = 0; // held clocks in a row, up to the clock before this one
  return clocks.map((c) => {
    const shown: Shown = { [p.output]: run >= p.clocks ? 1 : 0 };
    if (p.holding) shown[p.holding] = run > 0 && run < p.clocks ? 1 : 0;
    run = c[p.input] ? run + 1 : 0;
    return shown;
  });
}

/** Toggle: the parity of the rising edges of the input before this clock (released before the first clock). */
export function toggleReference(clocks: readonly Clock[], p: { input: string; output: string }): Shown[] {
  let rises = 0;
  let before = 0;
  return clocks.map((c) => {
    const shown = { [p.output]: (rises % 2) as 0 | 1 };
    const now = c[p.input] ? 1 : 0;
    if (now === 1 && before === 0) rises++;
    before = now;
    return shown;
  });
}

/** Collect: the set of inputs pulled since the start (or the last clear clock); the output once it holds them all. */
export function collectReference(
  clocks: readonly Clock[],
  p: { inputs: readonly string[]; output: string; clear?: string },
): Shown[] {
  const seen = new Set<string>();
  return clocks.map((c) => {
    const shown: Shown = { [p.output]: seen.size === p.inputs.length ? 1 : 0 };
    if (p.clear && c[p.clear]) seen.clear();
    else for (const x of p.inputs) if (c[x]) seen.add(x);
    return shown;
  });
}

/** Cycle: the step reached by moving on each clock (or each clock the advance input is pulled), back to the first on a restart clock. */
export function cycleReference(
  clocks: readonly Clock[],
  p: { outputs: readonly string[]; steps: readonly (readonly string[])[]; advance?: string; restart?: string },
): Shown[] {
  let at = 0;
  return clocks.map((c) => {
    const shown: Shown = Object.fromEntries(p.outputs.map((o) => [o, p.steps[at].includes(o) ? 1 : 0]));
    if (p.restart && c[p.restart]) at = 0;
    else if (!p.advance || c[p.advance]) at = (at + 1) % p.steps.length;
    return shown;
  });
}

/** Delay: the input as it was K clocks before (not pulled before the first clock). */
export function delayReference(
  clocks: readonly Clock[],
  p: { input: string; clocks: number; output: string },
): Shown[] {
  return clocks.map((_, i) => ({ [p.output]: i >= p.clocks && clocks[i - p.clocks][p.input] ? 1 : 0 }));
}
