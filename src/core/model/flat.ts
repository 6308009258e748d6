/**
 * The flat table: each state's ordered, first-match transitions turned into pairwise-disjoint
 * rows (input cube → next state, outputs) that together cover exactly the input space minus
 * the `never` set. Every algorithm after validation works on this table, on cubes, never on
 * enumerated input combinations.
 *
 * Rows come from the disjoint sharp of each guard against the guards before it; the rest of
 * the space gets one row per cube for the `unspecified` rule: `hold` stays in the state with
 * the state's outputs (unnamed → 0); `dont-care` leaves next state free and every output the
 * state does not name free.
 */
import { complement, disjoint, subtract, type Cube } from './cube.js';
import { transitionOutputs, type Machine, type OutBit } from './machine.js';

/** Next state index, or DONT_CARE when the next state is free. */
export const DONT_CARE = -1;

export interface FlatRow {
  readonly cube: Cube;
  readonly next: number;
  readonly out: readonly OutBit[];
  /** Index of the transition this row came from, or -1 for the `unspecified` rule. */
  readonly transition: number;
}

export interface FlatMachine {
  readonly name: string;
  readonly inputs: readonly string[];
  readonly outputs: readonly string[];
  readonly states: readonly string[];
  readonly start: number;
  /** Per state: disjoint rows covering every input combination not in `never`. */
  readonly rows: readonly (readonly FlatRow[])[];
  /** Disjoint cubes of input combinations that cannot occur. */
  readonly never: readonly Cube[];
}

/** Flatten a (validated) machine; states named by transitions must exist. */
export function flatten(m: Machine): FlatMachine {
  const n = m.inputs.length;
  const index = new Map(m.states.map((s, i) => [s.name, i]));
  const never = disjoint(m.never.flatMap((g) => g.cubes));
  const rows = m.states.map((s, si) => {
    const out: FlatRow[] = [];
    let taken: Cube[] = [...never];
    s.transitions.forEach((t, ti) => {
      const fresh = subtract(disjoint(t.when.cubes), taken);
      const next = index.get(t.to) ?? DONT_CARE;
      const outs = transitionOutputs(m, s, t);
      for (const c of fresh) out.push({ cube: c, next, out: outs, transition: ti });
      taken = taken.concat(fresh);
    });
    const rest = complement(taken, n);
    if (rest.length > 0) {
      const hold = m.unspecified === 'hold';
      const outs: OutBit[] = m.outputs.map((o) => s.outputs[o] ?? (hold ? 0 : '-'));
      for (const c of rest) out.push({ cube: c, next: hold ? si : DONT_CARE, out: outs, transition: -1 });
    }
    return out;
  });
  return {
    name: m.name,
    inputs: m.inputs,
    outputs: m.outputs,
    states: m.states.map((s) => s.name),
    start: index.get(m.start) ?? 0,
    rows,
    never,
  };
}

/** The row of state `s` that holds for a full input assignment ('0'/'1' per input), if any. */
export function rowFor(f: FlatMachine, s: number, assignment: string): FlatRow | undefined {
  for (const r of f.rows[s]) {
    let ok = true;
    for (let i = 0; i < r.cube.length; i++) {
      const c = r.cube.charCodeAt(i);
      if (c !== 45 && c !== assignment.charCodeAt(i)) {
        ok = false;
        break;
      }
    }
    if (ok) return r;
  }
  return undefined;
}

/** True when some row has a free next state or output (an incompletely specified machine; `never` alone does not count). */
export function isIncomplete(f: FlatMachine): boolean {
  return f.rows.some((rs) => rs.some((r) => r.next === DONT_CARE || r.out.includes('-')));
}
