import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { chainPlan, stageChain, type StageChain, type TimedAction } from '../../../src/core/checks/stage-chains.js';
import type { Build } from '../../../src/core/model/build.js';
import { retimed, X, type PartSim } from '../../../src/core/sim/compile.js';
import { simFor } from '../../../src/core/sim/part.js';
import { evalGate } from '../../../src/core/sim/settle.js';
import { randomBuild } from '../sim/actions.js';
import { brokenBuild, exampleBuild, exampleNames } from './builds.js';

const ACTIONS: readonly TimedAction[] = ['phi1', 'phi1-release', 'phi2', 'phi2-release', 'inputs', 'reset'];

/**
 * The longest stage chain by a fresh search, written out independently of stage-chains.ts:
 * constants by delay-free three-valued evaluation, then the longest path of the DAG of the
 * gates that can still change by depth-first search with memoised arrival times (Cormen et al.,
 * *Introduction to Algorithms*, 3rd ed., §24.2 — from memory), the latest input the first of
 * equals in input order, the last gate the first of equals in driver order.
 */
function freshChain(sim: PartSim, action: TimedAction): StageChain {
  const fixed = new Map<number, 0 | 1>();
  const still = { phi1: [sim.phi2, sim.reset], phi2: [sim.phi1, sim.reset], reset: [sim.phi1, sim.phi2] };
  const moving = action.startsWith('phi1')
    ? 'phi1'
    : action.startsWith('phi2')
      ? 'phi2'
      : action === 'reset'
        ? 'reset'
        : null;
  for (const d of moving ? still[moving] : [sim.phi1, sim.phi2, sim.reset]) fixed.set(d, 0);
  const sources = new Set(moving ? [sim[moving]] : Array.from(sim.inputLevers));
  const values = new Uint8Array(sim.driverCount).fill(X);
  for (const [d, v] of fixed) values[d] = v;
  for (let again = true; again;) {
    again = false;
    for (let g = sim.leverCount; g < sim.driverCount; g++)
      if (sim.latchOf[g] < 0 && values[g] === X && evalGate(sim, values, g) !== X) {
        values[g] = evalGate(sim, values, g);
        again = true;
      }
  }
  const cross = action === 'phi1' || action === 'phi2' || action === 'reset';
  const arrival = new Map<number, number>();
  const pred = new Map<number, number>();
  const onStack = new Set<number>();
  let loop: string[] | undefined;
  const stack: number[] = [];
  const inputsOf = (d: number): number[] => {
    const li = sim.latchOf[d];
    if (li < 0) return Array.from(sim.inputs.subarray(sim.inStart[d], sim.inStart[d + 1]));
    return [...sim.latches[li].sBar, ...sim.latches[li].rBar];
  };
  const visit = (d: number): number => {
    const known = arrival.get(d);
    if (known !== undefined) return known;
    if (sources.has(d)) return arrival.set(d, 0).get(d) as number;
    if (d < sim.leverCount || values[d] !== X || (sim.latchOf[d] >= 0 && !cross))
      return arrival.set(d, -Infinity).get(d) as number;
    if (onStack.has(d)) {
      loop ??= stack.slice(stack.indexOf(d)).map((g) => sim.names[g]);
      return -Infinity;
    }
    onStack.add(d);
    stack.push(d);
    let best = -Infinity;
    let from = -1;
    for (const i of inputsOf(d)) {
      const a = visit(i);
      if (a > best) [best, from] = [a, i];
    }
    stack.pop();
    onStack.delete(d);
    const li = sim.latchOf[d];
    const own = li >= 0 ? sim.delayUs[sim.latches[li].set] + sim.delayUs[sim.latches[li].reset] : sim.delayUs[d];
    pred.set(d, from);
    return arrival.set(d, best === -Infinity ? best : best + own).get(d) as number;
  };
  let end = -1;
  for (let d = 0; d < sim.driverCount; d++) {
    const a = visit(d);
    if (a > 0 && (end < 0 || a > (arrival.get(end) ?? 0))) end = d;
  }
  if (loop) return { timeS: Infinity, parts: [], loop };
  const parts: string[] = [];
  for (let d = end; d >= 0 && !sources.has(d); d = pred.get(d) ?? -1) {
    const li = sim.latchOf[d];
    const label = li >= 0 ? `latch ${sim.latches[li].name} (2 stages)` : sim.names[d];
    if (parts[0] !== label) parts.unshift(label);
  }
  return { timeS: end < 0 ? 0 : (arrival.get(end) ?? 0) / 1e6, parts };
}

const subjects = (): [string, Build][] => [
  ...exampleNames().map((n): [string, Build] => [n, exampleBuild(n).build]),
  ...['toggle-long-chain', 'toggle-release-race', 'counter-unguarded'].map((n): [string, Build] => [n, brokenBuild(n)]),
  ['random 20 × 3', randomBuild(20, 3, 2, 7)],
];

describe('core/checks/stage-chains', () => {
  it('gives the chains of a fresh search with the nominal delays, on every example and the broken fixtures', () => {
    for (const [name, build] of subjects()) {
      const sim = simFor(build, { stageDelayS: 0.25 });
      for (const action of ACTIONS)
        expect(stageChain(sim, action), `${name}, ${action}`).toEqual(freshChain(sim, action));
    }
  });

  // The Monte Carlo runs put other delays on one plan: it must give what a fresh search gives with them.
  it('gives the chains of a fresh search with any stage delays put on a plan (fast-check, fixed seed)', () => {
    const builds = subjects();
    const plans = builds.map(([, build]) => {
      const sim = simFor(build, { stageDelayS: 0.25 });
      return { sim, plans: ACTIONS.map((a) => chainPlan(sim, a)) };
    });
    fc.assert(
      fc.property(
        fc.nat(builds.length - 1),
        fc.array(fc.integer({ min: 1, max: 400_000 }), { minLength: 1, maxLength: 8 }),
        (k, pool) => {
          const { sim, plans: ps } = plans[k];
          // Few distinct delays, so equal arrivals (and the first-of-equals rules) are common.
          const delayUs = Int32Array.from(sim.delayUs, (_, d) => (d < sim.leverCount ? 0 : pool[d % pool.length]));
          const varied = retimed(sim, delayUs);
          ps.forEach((p, i) => expect(p.chain(varied)).toEqual(freshChain(varied, ACTIONS[i])));
        },
      ),
      { seed: 20261205, numRuns: 60 },
    );
  });
});
