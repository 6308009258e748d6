/**
 * An independent reading of the timing check: every used code with every allowed input
 * combination, each hand action of one clock settled event by event at the nominal stage
 * delay (stepSim with trace), the time from the action to the last lever that moves measured.
 * The check's phase times and dead bands are what a person must wait (DESIGN.md §4: "the
 * longest chain in each clock phase gives the minimum phase time"), so none of the measured
 * settling times may exceed them; so also for a change of the input levers before φ1 (it
 * must fit the dead band after φ2, which "includes the next inputs settling").
 */
import { findCheck, stepSim, timingOf, type Built, type HandAction } from '../../src/core/index.js';
import { simFor, stateAtCode, type PartState } from '../../src/core/sim/part.js';
import type { Reference } from './reference.js';

const PHASES: readonly [HandAction, 'phi1' | 'afterPhi1' | 'phi2' | 'afterPhi2'][] = [
  [{ kind: 'pull', lever: 'phi1' }, 'phi1'],
  [{ kind: 'release', lever: 'phi1' }, 'afterPhi1'],
  [{ kind: 'pull', lever: 'phi2' }, 'phi2'],
  [{ kind: 'release', lever: 'phi2' }, 'afterPhi2'],
];

/** The first settling time longer than the timing check allows, in words; undefined when none. */
export function timingDisagreement(b: Built, ref: Reference, r: { pick<T>(xs: readonly T[]): T }): string | undefined {
  const timing = findCheck(b.checks, 'timing');
  if (!timing) return undefined;
  const sim = simFor(b.build, timingOf(b.profile));
  const allowed = ref.assignments.filter((a) => !ref.isNever(a));
  const limit = {
    phi1: timing.phaseTimesS.phi1,
    afterPhi1: timing.deadBandsS.afterPhi1,
    phi2: timing.phaseTimesS.phi2,
    afterPhi2: timing.deadBandsS.afterPhi2,
  };
  const settle = (state: PartState, action: HandAction): [PartState, number] => {
    const [s, events] = stepSim(sim, state, action, true);
    const last = Math.max(state.timeUs / 1e6, ...events.filter((e) => e.kind === 'change').map((e) => e.timeS));
    return [s, last - state.timeUs / 1e6];
  };
  for (const code of b.build.encoding.codes)
    for (const a of allowed) {
      // The inputs change from another combination to a, then the clock.
      const from = r.pick(allowed);
      let state = stateAtCode(sim, code, from);
      for (let k = 0; k < a.length; k++) {
        if (a[k] === from[k]) continue;
        const [s, took] = settle(state, { kind: 'input', input: ref.spec.inputs[k], value: a[k] === '1' ? 1 : 0 });
        state = s;
        if (took > limit.afterPhi2 + 1e-9)
          return `code ${code}, inputs ${from}→${a}: the inputs settle in ${took.toFixed(3)} s, the dead band after φ2 is ${limit.afterPhi2.toFixed(3)} s`;
      }
      for (const [action, phase] of PHASES) {
        const [s, took] = settle(state, action);
        state = s;
        if (took > limit[phase] + 1e-9)
          return `code ${code}, inputs ${a}: ${action.kind} ${action.kind === 'input' ? '' : action.lever} settles in ${took.toFixed(3)} s, the check allows ${limit[phase].toFixed(3)} s (${phase})`;
      }
    }
  return undefined;
}
