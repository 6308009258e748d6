/**
 * Reachability from the start state, on the flat table's rows (each row is one input cube, so
 * this never enumerates input combinations). A row with a free next state (DONT_CARE) leads
 * nowhere in particular and adds no state.
 */
import { DONT_CARE, type FlatMachine, type FlatRow } from '../../model/flat.js';

/** For each state: can it be reached from `f.start` through rows whose next state is given? */
export function reachableStates(f: FlatMachine): boolean[] {
  const seen = f.states.map(() => false);
  if (f.states.length === 0) return seen;
  const stack = [f.start];
  seen[f.start] = true;
  while (stack.length > 0) {
    const s = stack.pop() as number;
    for (const r of f.rows[s]) {
      if (r.next !== DONT_CARE && !seen[r.next]) {
        seen[r.next] = true;
        stack.push(r.next);
      }
    }
  }
  return seen;
}

/** The machine restricted to its reachable states, with the map back to the original indices. */
export interface Pruned {
  readonly machine: FlatMachine;
  /** Original index of each state of `machine`. */
  readonly original: readonly number[];
  /** Names of the dropped states, in the original order. */
  readonly unreachable: readonly string[];
}

/** Drop unreachable states; returns `f` itself (same object) when every state is reachable. */
export function pruneUnreachable(f: FlatMachine): Pruned {
  const seen = reachableStates(f);
  const original: number[] = [];
  const unreachable: string[] = [];
  seen.forEach((ok, i) => (ok ? original.push(i) : unreachable.push(f.states[i])));
  if (unreachable.length === 0) return { machine: f, original, unreachable };
  const newIndex = new Map(original.map((o, i) => [o, i]));
  const remap = (r: FlatRow): FlatRow => ({
    ...r,
    next: r.next === DONT_CARE ? DONT_CARE : (newIndex.get(r.next) as number),
  });
  const machine: FlatMachine = {
    ...f,
    states: original.map((o) => f.states[o]),
    start: newIndex.get(f.start) as number,
    rows: original.map((o) => f.rows[o].map(remap)),
  };
  return { machine, original, unreachable };
}
