/** Random hand-action sequences for the simulator agreement tests: mostly whole clocks, with resets and rule-breaking lever moves mixed in. */
import type { Build } from '../../../src/core/model/build.js';
import type { Random } from '../../../src/core/model/random.js';
import { synthesise } from '../../../src/core/synthesise.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { randomFlatMachine } from '../../../src/core/sim/random-machine.js';
import type { HandAction } from '../../../src/core/sim/hand.js';

/**
 * `count` hand actions: a reset first; then, per step, a clock of the hand procedure with
 * random inputs (most often), a reset, or one control lever pulled or released at random
 * (which may break an operating rule and upset a latch).
 */
export function randomActions(rng: Random, inputs: readonly string[], count: number): HandAction[] {
  const out: HandAction[] = [
    { kind: 'pull', lever: 'reset' },
    { kind: 'release', lever: 'reset' },
  ];
  while (out.length < count) {
    const r = rng.next();
    if (r < 0.03) out.push({ kind: 'pull', lever: 'reset' }, { kind: 'release', lever: 'reset' });
    else if (r < 0.08) {
      const lever = (['phi1', 'phi2', 'reset'] as const)[rng.int(3)];
      out.push({ kind: rng.next() < 0.5 ? 'pull' : 'release', lever });
    } else if (r < 0.1 && inputs.length > 0) {
      out.push({ kind: 'input', input: inputs[rng.int(inputs.length)], value: rng.next() < 0.5 ? 0 : 1 });
    } else {
      for (const input of inputs) if (rng.next() < 0.5) out.push({ kind: 'input', input, value: rng.int(2) as 0 | 1 });
      out.push(
        { kind: 'pull', lever: 'phi1' },
        { kind: 'release', lever: 'phi1' },
        { kind: 'pull', lever: 'phi2' },
        { kind: 'release', lever: 'phi2' },
      );
    }
  }
  return out;
}

/** A build of a random completely specified machine with binary codes (synthesised directly). */
export function randomBuild(states: number, inputs: number, outputs: number, seed: number): Build {
  const f = randomFlatMachine(states, inputs, outputs, seed);
  const bits = Math.max(1, Math.ceil(Math.log2(states)));
  const codes = f.states.map((_, i) => i.toString(2).padStart(bits, '0'));
  return synthesise(f, { strategy: 'binary', bits, codes }, { profile: DEFAULT_PROFILE });
}
