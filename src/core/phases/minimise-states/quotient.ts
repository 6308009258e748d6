/**
 * Names for the states of the reduced machine.
 *
 * Naming rule (deterministic, and built from names the user wrote, so it stays a valid
 * identifier for every export): a reduced state takes the name of its first member (in the
 * original state order) that no earlier reduced state has taken. Classes of the partition
 * method are disjoint, so each simply keeps its first member's name. Only overlapping
 * compatibility classes can run out of untaken member names; such a class gets its first
 * member's name with the first suffix `_2`, `_3`, … that names no original state.
 */
import type { FlatMachine } from '../../model/flat.js';

/** Names for the classes (each a list of original state indices, ascending), in class order. */
export function nameClasses(f: FlatMachine, classes: readonly (readonly number[])[]): string[] {
  const taken = new Set<string>();
  const originals = new Set(f.states);
  return classes.map((c) => {
    let name = c.map((s) => f.states[s]).find((n) => !taken.has(n));
    if (name === undefined) {
      const base = f.states[c[0]];
      let k = 2;
      while (taken.has(`${base}_${k}`) || originals.has(`${base}_${k}`)) k++;
      name = `${base}_${k}`;
    }
    taken.add(name);
    return name;
  });
}
