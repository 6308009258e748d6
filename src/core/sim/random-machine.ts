/**
 * Random completely specified flat machines, for benchmarks (time parse, validate and
 * minimise on large tables) and for tests. Each state's input space is cut into a few
 * disjoint cubes by splitting on random inputs; each cube gets a random next state and
 * random 0/1 outputs. Row 0 of state i goes to state i+1 (the last state's to state 0), so
 * every state is reachable and the timings measure the whole table. Deterministic per seed.
 * `flatToJsonText` writes such a table back into the JSON form (one transition per row), so a
 * benchmark or a test can start from the text a user would have written.
 */
import { printCubes } from '../forms/expr.js';
import type { FlatMachine, FlatRow } from '../model/flat.js';
import type { OutBit } from '../model/machine.js';
import { seededRandom, type Random } from '../model/random.js';

/** Cut the space of `inputs` variables into 1..4 disjoint cubes (fewer when there are no inputs). */
function randomPartition(rng: Random, inputs: number): string[] {
  let cubes = ['-'.repeat(inputs)];
  const target = 1 + rng.int(4);
  while (cubes.length < target) {
    const i = rng.int(cubes.length);
    const free = [...cubes[i]].flatMap((c, v) => (c === '-' ? [v] : []));
    if (free.length === 0) break;
    const v = free[rng.int(free.length)];
    const c = cubes[i];
    cubes = [
      ...cubes.slice(0, i),
      c.slice(0, v) + '0' + c.slice(v + 1),
      c.slice(0, v) + '1' + c.slice(v + 1),
      ...cubes.slice(i + 1),
    ];
  }
  return cubes;
}

/** A random completely specified FlatMachine with every state reachable from state 0. */
export function randomFlatMachine(states: number, inputs: number, outputs: number, seed: number): FlatMachine {
  const rng = seededRandom(seed);
  const n = Math.max(1, states);
  const rows = Array.from({ length: n }, (_, s): FlatRow[] =>
    randomPartition(rng, inputs).map((cube, k) => ({
      cube,
      next: k === 0 ? (s + 1) % n : rng.int(n),
      out: Array.from({ length: outputs }, (): OutBit => (rng.int(2) === 1 ? 1 : 0)),
      transition: k,
    })),
  );
  return {
    name: `random_${n}x${inputs}_${seed}`,
    inputs: Array.from({ length: inputs }, (_, i) => `x${i + 1}`),
    outputs: Array.from({ length: outputs }, (_, i) => `z${i + 1}`),
    states: Array.from({ length: n }, (_, i) => `s${i}`),
    start: 0,
    rows,
    never: [],
  };
}

/** A flat table in the JSON form (docs/notation.md), one transition per row. */
export function flatToJsonText(f: FlatMachine): string {
  return JSON.stringify({
    name: f.name,
    inputs: f.inputs,
    outputs: f.outputs,
    start: f.states[f.start],
    states: f.states.map((name, s) => ({
      name,
      transitions: f.rows[s].map((r) => ({
        when: printCubes([r.cube], f.inputs),
        to: f.states[r.next],
        outputs: Object.fromEntries(f.outputs.map((o, k) => [o, r.out[k]])),
      })),
    })),
  });
}
