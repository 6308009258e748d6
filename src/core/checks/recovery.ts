/**
 * Recovery from unused codes: a bumped machine whose latches hold a code no state has must
 * come back to a used code within k clocks, whatever the visitor does meanwhile.
 *
 * Method: build the graph of clocks among unused codes by part-level simulation (from each
 * unused code, with masters equal to slaves, one clock of the hand procedure per input
 * combination), then a depth-first search for its longest path: k(c) = 1 + the largest k of
 * an unused successor (0 for a used one). A cycle is a lock-up loop: some input sequence
 * keeps the machine among unused codes for ever (the usual lock-up analysis of unused states;
 * e.g. Kohavi & Jha, *Switching and Finite Automata Theory*, 3rd ed. — from memory).
 * Input combinations in `never` are left out unless `includeNever` (the spec promises they
 * do not occur; the synthesis treats them as free). Inputs beyond `maxExhaustiveInputs` are
 * sampled, and codes beyond `maxCodes` too; the result says so.
 */
import { coverHolds } from '../model/cube.js';
import type { Build, CheckResult } from '../model/build.js';
import { seededRandom } from '../model/random.js';
import type { Profile } from '../physics/profile.js';
import { simFor, stateAtCode, timingOf } from '../sim/part.js';
import {
  allCodes,
  clockFrom,
  describeInputs,
  EXHAUSTIVE_INPUTS,
  forEachHeld,
  grayAssignments,
  randomCodes,
  sampledAssignments,
} from './clocking.js';

export interface RecoveryOptions {
  /** Also try input combinations the spec declares impossible (default false). */
  readonly includeNever?: boolean;
  readonly maxExhaustiveInputs?: number;
  readonly samples?: number;
  readonly seed?: number;
  /** Unused codes explored at most (default 4096). */
  readonly maxCodes?: number;
}

export interface RecoveryResult extends CheckResult {
  /** Per unused code: the most clocks it can take to reach a used code (null: it can stay unused for ever). */
  readonly codes: readonly { readonly code: string; readonly k: number | null }[];
  /** The largest k over the unused codes (null when some code can lock up). */
  readonly worstK: number | null;
  readonly loop?: { readonly codes: readonly string[]; readonly inputs: readonly string[]; readonly words: string };
  readonly hint?: string;
  readonly checked: 'all' | 'sampled';
}

const HINT =
  "send the unused codes to a state: build with the synthesis option unusedCodes (for example the start state's index) and check again";

/** Check that every unused code reaches a used one within k clocks under every input sequence. */
export function checkRecovery(
  build: Build,
  profile: Pick<Profile, 'stageDelayS'>,
  opts: RecoveryOptions = {},
): RecoveryResult {
  const sim = simFor(build, timingOf(profile));
  const f = build.machine;
  const n = f.inputs.length;
  const bits = sim.slaves.length;
  const used = new Set(build.encoding.codes);
  const maxCodes = opts.maxCodes ?? 4096;
  const rnd = seededRandom(opts.seed ?? 1);
  const exhaustive = n <= (opts.maxExhaustiveInputs ?? EXHAUSTIVE_INPUTS);
  const keep = (a: string): boolean => opts.includeNever === true || !coverHolds(f.never, a);
  const tries = (
    exhaustive
      ? grayAssignments(n)
      : sampledAssignments(
          f.rows.flat().map((r) => r.cube),
          n,
          opts.samples ?? 64,
          rnd,
        )
  ).filter(keep);
  const everyCode = 2 ** bits <= maxCodes;
  const start = everyCode ? allCodes(bits).filter((c) => !used.has(c)) : randomCodes(bits, maxCodes, rnd, used);

  // Successors of each unused code: distinct next codes, each with the first inputs that lead there.
  const edges = new Map<string, { next: string; inputs: string; words?: string }[]>();
  const queue = [...start];
  for (let i = 0; i < queue.length && edges.size < maxCodes; i++) {
    const c = queue[i];
    if (edges.has(c)) continue;
    const out: { next: string; inputs: string; words?: string }[] = [];
    forEachHeld(sim, stateAtCode(sim, c, '0'.repeat(n)).values, tries, (held, a) => {
      const r = clockFrom(sim, held);
      if (r.alarms.length > 0 || r.code.includes('X')) {
        out.push({
          next: r.code,
          inputs: a,
          words: r.alarms.map((e) => e.words).join('; ') || 'a latch is left undetermined (X)',
        });
        return;
      }
      if (!out.some((e) => e.next === r.code)) out.push({ next: r.code, inputs: a });
      if (!used.has(r.code) && !edges.has(r.code)) queue.push(r.code);
    });
    edges.set(c, out);
  }

  const k = new Map<string, number | null>();
  let loop: RecoveryResult['loop'];
  const onStack: string[] = [];
  const stackInputs: string[] = [];
  const visit = (c: string): number | null => {
    if (k.has(c)) return k.get(c) as number | null;
    const at = onStack.indexOf(c);
    if (at >= 0) {
      if (!loop) {
        const codes = onStack.slice(at);
        const inputs = stackInputs.slice(at);
        const steps = codes.map((x, i) => `${x} —${describeInputs(f.inputs, inputs[i])}→`).join(' ');
        loop = { codes, inputs, words: `lock-up loop among unused codes: ${steps} ${c}, for ever` };
      }
      return null;
    }
    onStack.push(c);
    let worst: number | null = 0;
    for (const e of edges.get(c) ?? []) {
      if (e.words !== undefined) {
        loop ??= {
          codes: [c],
          inputs: [e.inputs],
          words: `from unused code ${c} with ${describeInputs(f.inputs, e.inputs)}: ${e.words}`,
        };
        worst = null;
        continue;
      }
      stackInputs.push(e.inputs);
      const sub = used.has(e.next) ? 0 : edges.has(e.next) ? visit(e.next) : null;
      stackInputs.pop();
      worst = worst === null || sub === null ? null : Math.max(worst, sub + 1);
    }
    onStack.pop();
    k.set(c, worst);
    return worst;
  };
  const codes = [...edges.keys()].sort().map((c) => ({ code: c, k: visit(c) }));
  const stuck = codes.filter((c) => c.k === null);
  const worstK = stuck.length > 0 ? null : codes.reduce((w, c) => Math.max(w, c.k as number), 0);
  const sampledNote = everyCode && exhaustive ? '' : ' (sampled)';
  const summary =
    codes.length === 0
      ? 'no unused codes'
      : worstK !== null
        ? `every unused code (${codes.length}) reaches a used code within ${worstK} clock${worstK === 1 ? '' : 's'}${sampledNote}`
        : `${stuck.length} unused code${stuck.length === 1 ? '' : 's'} can stay unused for ever: ${loop?.words ?? ''}`;
  return {
    name: 'recovery',
    ok: worstK !== null,
    summary,
    codes,
    worstK,
    checked: everyCode && exhaustive ? 'all' : 'sampled',
    ...(loop ? { loop, hint: HINT } : {}),
  };
}
