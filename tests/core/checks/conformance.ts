/**
 * A test-only product exploration, written apart from checks/equivalence.ts to check it:
 * - the build is stepped by the event-driven simulator (settle.ts, through `applyInPlace`),
 *   one hand action at a time, never by the fast pass or the bit-parallel lanes;
 * - the machine as written is read from its flat table by input combination (`rowFor`),
 *   every combination enumerated;
 * - the compatibility of a written state and a minimised state is the greatest fixed point of
 *   the pair table, computed by striking out pairs in rounds over enumerated combinations
 *   (Paull and Unger's implication table worked as the textbooks do), not by the check's
 *   breadth-first search on cubes.
 * The verdict: from the pair (start, the latches after reset), for every combination not in
 * `never`, no alarm, every output the written row specifies shown, and, where it specifies a
 * next state, the build's next code standing for a state compatible with it.
 */
import { coverHolds } from '../../../src/core/model/cube.js';
import type { Build } from '../../../src/core/model/build.js';
import { DONT_CARE, rowFor, type FlatMachine } from '../../../src/core/model/flat.js';
import { clockActions, resetActions, valuesOf } from '../../../src/core/sim/hand.js';
import {
  applyInPlace,
  isAlarm,
  outputValues,
  powerUp,
  simFor,
  slaveCode,
  type PartEvent,
  type PartSim,
} from '../../../src/core/sim/part.js';

/** Every combination of n inputs, counting. */
function combinations(n: number): string[] {
  return Array.from({ length: 2 ** n }, (_, k) => (n === 0 ? '' : k.toString(2).padStart(n, '0')));
}

/** compatible[o][m] for written state o and minimised state m, struck out in rounds until nothing changes. */
export function compatibilityTable(written: FlatMachine, reduced: FlatMachine): boolean[][] {
  const all = combinations(written.inputs.length);
  const ok = written.states.map(() => reduced.states.map(() => true));
  for (let changed = true; changed;) {
    changed = false;
    written.states.forEach((_, o) =>
      reduced.states.forEach((_, m) => {
        if (!ok[o][m]) return;
        for (const a of all) {
          const r = rowFor(written, o, a);
          const s = rowFor(reduced, m, a);
          if (!r || !s) continue;
          const clash = r.out.some((v, k) => v !== '-' && s.out[k] !== '-' && v !== s.out[k]);
          const implied = r.next !== DONT_CARE && s.next !== DONT_CARE && !ok[r.next][s.next];
          if (clash || implied) {
            ok[o][m] = false;
            changed = true;
            return;
          }
        }
      }),
    );
  }
  return ok;
}

/** Apply actions event-driven; the alarms. */
function act(sim: PartSim, values: Uint8Array, actions: ReturnType<typeof resetActions>): PartEvent[] {
  const events: PartEvent[] = [];
  for (const a of actions) applyInPlace(sim, values, 0, a, events);
  return events.filter(isAlarm);
}

/**
 * The verdict of the independent exploration, the pairs it reached, and whether some reached
 * pair holds a code whose state is not the one `merged` names for the written state (where a
 * check by the merged-state map would have failed).
 */
export function conforms(
  build: Build,
  written: FlatMachine,
  merged: Readonly<Record<string, string>> = {},
): { ok: boolean; pairs: number; leftTheMap: boolean } {
  const sim = simFor(build, { stageDelayS: 0.25 });
  const f = build.machine;
  const compatible = compatibilityTable(written, f);
  const stateOf = new Map(build.encoding.codes.map((c, i) => [c, i]));
  const inputs = f.inputs;
  const start = powerUp(sim)[0].values.slice();
  let leftTheMap = false;
  const fail = (pairs: number) => ({ ok: false, pairs, leftTheMap });
  if (act(sim, start, resetActions()).length > 0) return fail(0);
  const m0 = stateOf.get(slaveCode(sim, start));
  if (m0 !== f.start || !compatible[written.start][m0]) return fail(0);
  const allowed = combinations(inputs.length).filter((a) => !coverHolds([...f.never, ...written.never], a));
  const key = (o: number, v: Uint8Array): string =>
    `${o}:${sim.latches.map((l) => `${v[l.set]}${v[l.reset]}`).join('')}`;
  const queue: { o: number; values: Uint8Array }[] = [{ o: written.start, values: start }];
  const seen = new Set([key(written.start, start)]);
  for (let i = 0; i < queue.length; i++) {
    const { o, values } = queue[i];
    for (const a of allowed) {
      const row = rowFor(written, o, a);
      if (!row) continue;
      const v = values.slice();
      const current = Object.fromEntries(inputs.map((n, k) => [n, v[sim.inputLevers[k]] === 1 ? 1 : 0] as const));
      const steps = clockActions(inputs, valuesOf(inputs, a), current);
      if (act(sim, v, steps.slice(0, -4)).length > 0) return fail(seen.size);
      const shown = outputValues(sim, v);
      if (row.out.some((want, k) => want !== '-' && want !== shown[k])) return fail(seen.size);
      if (act(sim, v, steps.slice(-4)).length > 0) return fail(seen.size);
      if (row.next === DONT_CARE) continue;
      const m = stateOf.get(slaveCode(sim, v));
      if (m === undefined || !compatible[row.next][m]) return fail(seen.size);
      const named = merged[written.states[row.next]];
      if (named !== undefined && named !== f.states[m]) leftTheMap = true;
      const k = key(row.next, v);
      if (!seen.has(k)) {
        seen.add(k);
        queue.push({ o: row.next, values: v });
      }
    }
  }
  return { ok: true, pairs: seen.size, leftTheMap };
}
