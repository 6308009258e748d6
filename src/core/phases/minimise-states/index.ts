/**
 * Phase "minimise states": the smallest machine that does everything the given one specifies.
 *
 * 1. States the start state cannot reach are dropped (reachable.ts).
 * 2. A completely specified machine (isIncomplete() false) is reduced by partition refinement
 *    (E. F. Moore 1956; J. Hopcroft 1971 — partition.ts): equivalent states merge; the result is
 *    the unique minimal machine, so `exact` is true.
 * 3. An incompletely specified machine is reduced through compatibles (M. C. Paull and
 *    S. H. Unger 1959 — compatible.ts) and a closed cover of them (A. Grasselli and F. Luccio
 *    1965 — closed-cover.ts): a greedy closed cover first, then an exact branch and bound
 *    within a work budget (`exact` says whether it finished or met its lower bound). A reduced state stands for a class; its rows combine the members'
 *    specified values ('-' only where every member leaves a value free) and go, per input
 *    region, to the class itself when it holds the implied set, else to the first chosen
 *    class (in order) that does; a region where no member names a next state keeps it free.
 *    When the result is not proven minimal, the reduction is repeated on its own result until
 *    it no longer shrinks, so that minimising twice changes nothing.
 *
 * Preconditions: a FlatMachine from `flatten` (rows disjoint, covering the inputs minus
 * `never`; start is a valid state).
 * Postconditions: the reduced machine has no unreachable states and never more states than
 * the reachable original; from the start state, on every input sequence, wherever the
 * original's next state and outputs are specified the reduced machine's outputs agree; it
 * is a fixed point (minimising it again returns it unchanged). Deterministic.
 * State names follow quotient.ts (each reduced state keeps one member's name).
 */
import { DONT_CARE, isIncomplete, type FlatMachine, type FlatRow } from '../../model/flat.js';
import { nameRecord } from '../../model/records.js';
import { has, isEmptySet, isSubset, members, type StateSet } from './bitset.js';
import { closedCover, DEFAULT_COVER_BUDGET } from './closed-cover.js';
import { classRegions, compatibility } from './compatible.js';
import { equivalenceBlocks } from './partition.js';
import { nameClasses } from './quotient.js';
import { pruneUnreachable, reachableStates } from './reachable.js';

export interface StateMinimisation {
  /** The reduced machine (start kept as an index). */
  readonly machine: FlatMachine;
  /** Original state name → name of the reduced state that stands for it, for every reachable original state. */
  readonly merged: Readonly<Record<string, string>>;
  /** Original states the start state cannot reach, in the original order. */
  readonly unreachable: readonly string[];
  readonly method: 'partition-refinement' | 'compatibility';
  /** True when the reduced machine is proven to have the fewest states possible. */
  readonly exact: boolean;
}

export interface MinimiseStatesOptions {
  /** Work budget of the exact closed-cover search (elementary set operations); see closed-cover.ts. */
  readonly coverBudget?: number;
}

/** One reduction step: the reduced machine and, per state of the input machine, its reduced state. */
interface Step {
  readonly machine: FlatMachine;
  readonly assign: readonly number[];
}

interface Attempt {
  readonly step: Step | null;
  readonly exact: boolean;
  readonly lowerBound: number;
}

/** Minimise the states of a flat machine (see the module comment for the contract). */
export function minimiseStates(f: FlatMachine, options: MinimiseStatesOptions = {}): StateMinimisation {
  const pruned = pruneUnreachable(f);
  const incomplete = isIncomplete(pruned.machine);
  const budget = options.coverBudget ?? DEFAULT_COVER_BUDGET;
  let machine = pruned.machine;
  let current = pruned.original.map((_, i) => i); // per reachable original state: its state in `machine`
  let exact = true;
  let lowerBound = 0;
  for (let round = 0; ; round++) {
    // Dispatch afresh each round, exactly as a new call would, so the result is a fixed point.
    const attempt = isIncomplete(machine) ? reduceByCompatibles(machine, budget) : reduceByPartition(machine);
    if (round === 0) {
      exact = attempt.exact;
      lowerBound = attempt.lowerBound;
    }
    if (attempt.step === null) break;
    const step = attempt.step;
    current = current.map((s) => step.assign[s]);
    machine = step.machine;
    if (attempt.exact) break; // proven minimal: nothing further can shrink it
  }
  const merged = nameRecord<string>();
  pruned.original.forEach((o, i) => (merged[f.states[o]] = machine.states[current[i]]));
  return {
    machine,
    merged,
    unreachable: pruned.unreachable,
    method: incomplete ? 'compatibility' : 'partition-refinement',
    exact: exact || machine.states.length <= lowerBound,
  };
}

/** Equivalent states merged; each block keeps its first member's rows (all members agree). */
function reduceByPartition(f: FlatMachine): Attempt {
  const blockOf = equivalenceBlocks(f);
  const count = blockOf.reduce((m, b) => Math.max(m, b + 1), 0);
  if (count >= f.states.length) return { step: null, exact: true, lowerBound: count };
  const classes: number[][] = Array.from({ length: count }, () => []);
  blockOf.forEach((b, s) => classes[b].push(s));
  const rows = classes.map((c) => f.rows[c[0]].map((r) => ({ ...r, next: blockOf[r.next] })));
  const machine = { ...f, states: nameClasses(f, classes), start: blockOf[f.start], rows };
  return { step: { machine, assign: Array.from(blockOf) }, exact: true, lowerBound: count };
}

/** A closed cover of compatibles turned into a machine (see the module comment for the rows). */
function reduceByCompatibles(f: FlatMachine, budget: number): Attempt {
  const n = f.states.length;
  const search = closedCover(f, compatibility(f), budget);
  const { exact, lowerBound } = search;
  if (search.classes.length >= n) return { step: null, exact, lowerBound };
  const classes = search.classes;
  const target = (d: StateSet, self: number): number => {
    if (isSubset(d, classes[self])) return self;
    return classes.findIndex((c) => isSubset(d, c));
  };
  const targetOf = (t: number, self: number): number =>
    has(classes[self], t) ? self : classes.findIndex((c) => has(c, t));
  const rows: FlatRow[][] = classes.map((c, i) => {
    const list = members(c);
    if (list.length === 1)
      return f.rows[list[0]].map((r) => ({ ...r, next: r.next === DONT_CARE ? DONT_CARE : targetOf(r.next, i) }));
    return classRegions(f, list).map((g) => ({
      cube: g.cube,
      next: isEmptySet(g.next) ? DONT_CARE : target(g.next, i),
      out: g.out,
      transition: g.transition,
    }));
  });
  const startClass = classes.findIndex((c) => has(c, f.start));
  // Keep the classes the reduced machine can reach; closure guarantees that every original
  // state lies in at least one of them (the reduced run always holds the original state).
  const whole: FlatMachine = { ...f, states: classes.map((_, i) => String(i)), start: startClass, rows };
  const live = reachableStates(whole);
  const kept = classes.map((_, i) => i).filter((i) => live[i]);
  const renumber = new Map(kept.map((k, i) => [k, i]));
  const machine: FlatMachine = {
    ...f,
    states: nameClasses(
      f,
      kept.map((k) => members(classes[k])),
    ),
    start: renumber.get(startClass) as number,
    rows: kept.map((k) =>
      rows[k].map((r) => ({ ...r, next: r.next === DONT_CARE ? DONT_CARE : (renumber.get(r.next) as number) })),
    ),
  };
  const assign = Array.from({ length: n }, (_, s) =>
    s === f.start ? machine.start : kept.findIndex((k) => has(classes[k], s)),
  );
  return { step: { machine, assign }, exact, lowerBound };
}
