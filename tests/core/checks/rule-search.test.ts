import { describe, expect, it } from 'vitest';
import { searchRules, type RuleViolation } from '../../../src/core/checks/rule-search.js';
import type { Build } from '../../../src/core/model/build.js';
import { latchKey } from '../../../src/core/sim/clocking.js';
import { isReady, moverFor } from '../../../src/core/sim/fast.js';
import {
  describeAction,
  describeTrace,
  OPERATING_RULES,
  resetActions,
  RULE_WORDS,
  ruleBroken,
  type HandAction,
  type OperatingRule,
} from '../../../src/core/sim/hand.js';
import {
  applyFastInPlace,
  latchLabel,
  powerUp,
  simFor,
  stepSim,
  type PartEvent,
  type PartSim,
} from '../../../src/core/sim/part.js';
import { randomBuild } from '../sim/actions.js';
import { brokenBuild, exampleBuild, exampleNames } from './builds.js';

const UPSETS = new Set(['forbidden-input', 'latch-x', 'oscillation']);

/** One rule's search on its own, every move settled afresh (no memo shared between searches or states). */
function alone(sim: PartSim, rule: OperatingRule, maxActions: number, maxStates: number): RuleViolation {
  let [start] = powerUp(sim);
  for (const a of resetActions()) start = stepSim(sim, start, a)[0];
  const states = [
    {
      v: start.values,
      ready: isReady(sim, start.values),
      broken: false,
      parent: -1,
      via: null as HandAction | null,
      depth: 0,
    },
  ];
  const key = (v: Uint8Array, b: boolean): string => {
    let k = b ? '1' : '0';
    for (let d = 0; d < sim.leverCount; d++) k += v[d] === 1 ? '1' : '0';
    return k + latchKey(sim, v);
  };
  const seen = new Set([key(start.values, false)]);
  const path = (i: number, last: HandAction): HandAction[] => {
    const out = [last];
    for (let j = i; states[j].parent >= 0; j = states[j].parent) out.unshift(states[j].via as HandAction);
    return out;
  };
  let firstBreak: HandAction[] | undefined;
  for (let i = 0; i < states.length && states.length < maxStates; i++) {
    const s = states[i];
    if (s.depth >= maxActions) continue;
    const moves: HandAction[] = sim.build.machine.inputs.map((input, k) => ({
      kind: 'input',
      input,
      value: s.v[sim.inputLevers[k]] === 1 ? 0 : 1,
    }));
    for (const [l, d] of [
      ['phi1', sim.phi1],
      ['phi2', sim.phi2],
      ['reset', sim.reset],
    ] as const)
      moves.push({ kind: s.v[d] === 1 ? 'release' : 'pull', lever: l });
    const at = { phi1: s.v[sim.phi1] === 1, phi2: s.v[sim.phi2] === 1, reset: s.v[sim.reset] === 1 };
    for (const a of moves) {
      const r = ruleBroken(a, at);
      if (r !== null && r !== rule) continue;
      const b = s.broken || r === rule;
      if (b && !firstBreak) firstBreak = path(i, a);
      const next = s.v.slice();
      const events: PartEvent[] = [];
      applyFastInPlace(sim, next, 0, a, events, s.ready);
      const upset = events.filter((e) => UPSETS.has(e.kind));
      if (b && upset.length > 0) {
        const actions = path(i, a);
        const latches = [...new Set(upset.flatMap((e) => (e.latch ? [e.latch] : [])))];
        const words = `${RULE_WORDS[rule]}: breaking it (${actions.map(describeAction).join(', ')}) upsets ${latches.length > 0 ? latches.map(latchLabel).join(', ') : 'the machine'}: ${upset[0].words}`;
        return { rule, violation: actions, trace: describeTrace(actions), upsets: latches, words };
      }
      const k = key(next, b);
      if (seen.has(k)) continue;
      seen.add(k);
      states.push({ v: next, ready: moverFor(sim).ready, broken: b, parent: i, via: a, depth: s.depth + 1 });
    }
  }
  const actions = firstBreak ?? [];
  const words = `${RULE_WORDS[rule]}: no way of breaking it upsets a latch within ${maxActions} hand actions from the reset machine (${states.length} machine states searched)`;
  return { rule, violation: actions, trace: describeTrace(actions), upsets: [], words };
}

describe('core/checks/rule-search', () => {
  // The searches share one memo of lever moves; each must find what it finds alone, bounds included.
  it('finds, with its memo of moves, what each rule search finds alone: every example, the broken fixtures, random builds', () => {
    const builds: [string, Build][] = [
      ...exampleNames().map((n): [string, Build] => [n, exampleBuild(n).build]),
      ...['counter-unguarded', 'toggle-release-race', 'counter-lock-up'].map((n): [string, Build] => [
        n,
        brokenBuild(n),
      ]),
      ['random 12 × 3', randomBuild(12, 3, 2, 11)],
      ['random 6 × 4', randomBuild(6, 4, 1, 12)],
    ];
    for (const [name, build] of builds) {
      const sim = simFor(build, { stageDelayS: 0.25 });
      for (const [maxActions, maxStates] of [
        [8, 20_000],
        [5, 300],
      ] as const)
        expect(searchRules(sim, maxActions, maxStates), `${name}, ${maxActions} actions, ${maxStates} states`).toEqual(
          OPERATING_RULES.map((r) => alone(sim, r, maxActions, maxStates)),
        );
    }
  });
});
