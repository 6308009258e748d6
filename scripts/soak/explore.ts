/**
 * The built machine against the reference: the part-level runner (createRunner, the one the
 * `step` command uses) clocked by the hand procedure, explored depth first over every pair
 * (state of the specification, latch contents of the build) reachable from reset with inputs
 * the spec allows, every combination of inputs at each pair (undo between them), then a few
 * random sequences without undo. At each clock every output the spec names must show its
 * value and no latch may see its forbidden input; at each pair the combinations the spec
 * says never occur are tried too (the latches must stay safe: DESIGN.md §5), and not followed.
 */
import { createRunner, timingOf, type Build, type Profile } from '../../src/core/index.js';
import type { Rng } from './random.js';
import type { Reference } from './reference.js';

export interface Difference {
  readonly kind: 'output' | 'alarm' | 'never-alarm';
  /** Input combinations from reset, one per clock (inputs in the machine's order). */
  readonly path: readonly string[];
  readonly words: string;
}

export interface Exploration {
  readonly pairs: number;
  readonly clocks: number;
  readonly complete: boolean;
  readonly difference?: Difference;
}

type Runner = ReturnType<typeof createRunner>;

function valuesOf(inputs: readonly string[], a: string): Record<string, 0 | 1> {
  return Object.fromEntries(inputs.map((n, k) => [n, a[k] === '1' ? 1 : 0]));
}

class Explorer {
  readonly runner: Runner;
  readonly seen = new Set<string>();
  clocks = 0;
  complete = true;
  difference?: Difference;
  constructor(
    readonly build: Build,
    readonly ref: Reference,
    profile: Profile,
    readonly maxPairs: number,
  ) {
    this.runner = createRunner(build, timingOf(profile), { memoBytes: 1 << 20 });
  }
  private key(state: string): string {
    const r = this.runner.reading();
    return `${state}|${r.code}|${r.masterCode}`;
  }
  /** One clock compared with the spec; the spec's next state, or undefined when the path ends here. */
  clock(state: string, a: string, path: string[]): string | null | undefined {
    const inputs = this.ref.spec.inputs;
    const rec = this.runner.clock(valuesOf(inputs, a));
    this.clocks++;
    const never = this.ref.isNever(a);
    if (rec.alarms.length > 0) {
      this.difference = {
        kind: never ? 'never-alarm' : 'alarm',
        path: [...path, a],
        words: rec.alarms.map((e) => e.words).join('; '),
      };
      return undefined;
    }
    if (never) return undefined;
    const want = this.ref.step(state, a);
    const wrong = this.ref.spec.outputs.filter(
      (o, k) => want.outputs[k] !== null && rec.outputs[o] !== String(want.outputs[k]),
    );
    if (wrong.length > 0) {
      const shown = wrong.map((o) => `${o}=${rec.outputs[o]} (spec ${want.outputs[this.ref.spec.outputs.indexOf(o)]})`);
      this.difference = { kind: 'output', path: [...path, a], words: `in '${state}': ${shown.join(', ')}` };
      return undefined;
    }
    return want.next;
  }
  dfs(state: string, path: string[]): void {
    const k = this.key(state);
    if (this.seen.has(k)) return;
    if (this.seen.size >= this.maxPairs) {
      this.complete = false;
      return;
    }
    this.seen.add(k);
    for (const a of this.ref.assignments) {
      const next = this.clock(state, a, path);
      if (this.difference) return;
      if (typeof next === 'string') this.dfs(next, [...path, a]);
      this.runner.undo();
      if (this.difference) return;
    }
  }
}

/** Explore the build against the reference (at most maxPairs pairs), then `walks` random walks. */
export function explore(
  build: Build,
  ref: Reference,
  profile: Profile,
  r: Rng,
  maxPairs = 3000,
  walks = 4,
): Exploration {
  const x = new Explorer(build, ref, profile, maxPairs);
  const resetAlarms = x.runner.reset();
  const result = (): Exploration => ({
    pairs: x.seen.size,
    clocks: x.clocks,
    complete: x.complete,
    ...(x.difference ? { difference: x.difference } : {}),
  });
  if (resetAlarms.length > 0) {
    x.difference = { kind: 'alarm', path: [], words: `reset: ${resetAlarms.map((e) => e.words).join('; ')}` };
    return result();
  }
  x.dfs(ref.spec.start, []);
  const allowed = ref.assignments.filter((a) => !ref.isNever(a));
  for (let w = 0; w < walks && !x.difference && allowed.length > 0; w++) {
    x.runner.reset();
    let state: string | null | undefined = ref.spec.start;
    const path: string[] = [];
    for (let i = 0; i < 30 && typeof state === 'string'; i++) {
      const a = r.pick(allowed);
      state = x.clock(state, a, path);
      path.push(a);
    }
  }
  return result();
}
