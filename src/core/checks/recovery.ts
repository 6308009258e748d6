/**
 * Recovery from unused codes: a bumped machine whose latches hold a code no state has must
 * come back to a used code within k clocks, whatever the visitor does meanwhile.
 *
 * Method: build the graph of clocks among unused codes by part-level simulation (from each
 * unused code, with masters equal to slaves, one clock of the hand procedure per input
 * combination, 32 at a time on the bit-parallel simulator of sim/sweep.ts, event-driven where
 * it cannot vouch for a clock), then a depth-first search for its longest path: k(c) = 1 + the largest k of
 * an unused successor (0 for a used one). A cycle is a lock-up loop: some input sequence
 * keeps the machine among unused codes for ever (the usual lock-up analysis of unused states;
 * e.g. Kohavi & Jha, *Switching and Finite Automata Theory*, 3rd ed. — from memory).
 * Input combinations in `never` are left out unless `includeNever` (the spec promises they
 * do not occur; the synthesis treats them as free). Inputs beyond `maxExhaustiveInputs` are
 * sampled (sim/assignments.ts's rule), and codes beyond `maxCodes` too; the result says so.
 */
import type { Build, CheckBase } from '../model/build.js';
import { seededRandom } from '../model/random.js';
import { counted } from '../model/words.js';
import type { Profile } from '../physics/profile.js';
import { allCodes, describeInputs, inputAssignments, machineInputs, randomCodes } from '../sim/assignments.js';
import { clockFrom } from '../sim/clocking.js';
import { LaneBatch } from '../sim/lanes.js';
import { codesBatchKey, sweep } from '../sim/sweep.js';
import { simFor, stateAtCode, timingOf, type PartSim } from '../sim/part.js';

export interface RecoveryOptions {
  /** Also try input combinations the spec declares impossible (default false). */
  readonly includeNever?: boolean;
  readonly maxExhaustiveInputs?: number;
  /** Random input combinations when sampling (default 256). */
  readonly samples?: number;
  readonly seed?: number;
  /** Unused codes explored at most (default 4096). */
  readonly maxCodes?: number;
}

/** A cycle of clocks among unused codes (or a clock that leaves X or raises an alarm), in words. */
export interface LockUp {
  readonly codes: readonly string[];
  readonly inputs: readonly string[];
  readonly words: string;
}

export interface RecoveryResult extends CheckBase<'recovery'> {
  /** Per unused code: the most clocks it can take to reach a used code (null: it can stay unused for ever). */
  readonly codes: readonly { readonly code: string; readonly k: number | null }[];
  /** The largest k over the unused codes (null when some code can lock up). */
  readonly worstK: number | null;
  readonly loop?: LockUp;
  readonly hint?: string;
  readonly checked: 'all' | 'sampled';
}

const HINT =
  "send the unused codes to a state: build with the synthesis option unusedCodes (for example the start state's index) and check again";

/** One clock out of an unused code: the code it leads to, the first inputs that lead there, and any alarm in words. */
interface Edge {
  readonly next: string;
  readonly inputs: string;
  readonly words?: string;
}

/** Check that every unused code reaches a used one within k clocks under every input sequence. */
export function checkRecovery(
  build: Build,
  profile: Pick<Profile, 'stageDelayS'>,
  opts: RecoveryOptions = {},
): RecoveryResult {
  const sim = simFor(build, timingOf(profile));
  const f = build.machine;
  const bits = sim.slaves.length;
  const used = new Set(build.encoding.codes);
  const maxCodes = opts.maxCodes ?? 4096;
  const rnd = seededRandom(opts.seed ?? 1);
  const { list: tries, exhaustive } = inputAssignments(machineInputs(f), rnd, opts);
  const everyCode = 2 ** bits <= maxCodes;
  const start = everyCode ? allCodes(bits).filter((c) => !used.has(c)) : randomCodes(bits, maxCodes, rnd, used);
  const edges = clockGraph(sim, start, tries, used, maxCodes);
  const { codes, loop } = longestPaths(edges, used, f.inputs);
  const stuck = codes.filter((c) => c.k === null);
  const worstK = stuck.length > 0 ? null : codes.reduce((w, c) => Math.max(w, c.k ?? 0), 0);
  const sampledNote = everyCode && exhaustive ? '' : ' (sampled)';
  const summary =
    codes.length === 0
      ? 'no unused codes'
      : worstK !== null
        ? `every unused code (${codes.length}) reaches a used code within ${counted(worstK, 'clock')}${sampledNote}`
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

/** Successors of each unused code reached from `start` (up to `maxCodes` codes): distinct next codes, each with the first inputs that lead there. */
function clockGraph(
  sim: PartSim,
  start: readonly string[],
  tries: readonly string[],
  used: ReadonlySet<string>,
  maxCodes: number,
): Map<string, Edge[]> {
  const edges = new Map<string, Edge[]>();
  const queue = [...start];
  const batch = new LaneBatch(sim);
  for (let i = 0; i < queue.length && edges.size < maxCodes; i++) {
    const c = queue[i];
    if (edges.has(c)) continue;
    const out: Edge[] = [];
    const reached = (next: string, a: string, words?: string): void => {
      if (words !== undefined) out.push({ next, inputs: a, words });
      else if (!out.some((e) => e.next === next)) out.push({ next, inputs: a });
      if (words === undefined && !used.has(next) && !edges.has(next)) queue.push(next);
    };
    sweep(
      sim,
      tries.length,
      {
        setUp: (b, lane, k) => {
          b.setCodes(lane, c);
          b.setInputs(lane, tries[k]);
        },
        recordKey: (first, n) => codesBatchKey(sim, c, c, tries, first, n),
        done: (k, b, lane) => reached(b.slaveCode(lane), tries[k]),
        slow: (k) => {
          const r = clockFrom(sim, stateAtCode(sim, c, tries[k]).values);
          const bad = r.alarms.length > 0 || r.code.includes('X');
          reached(
            r.code,
            tries[k],
            bad ? r.alarms.map((e) => e.words).join('; ') || 'a latch is left undetermined (X)' : undefined,
          );
        },
      },
      batch,
    );
    edges.set(c, out);
  }
  return edges;
}

/**
 * Per unused code, the longest path to a used code (k), by depth-first search over the clock
 * graph; null for a code on or into a lock-up loop, the first of which is returned in words.
 */
function longestPaths(
  edges: ReadonlyMap<string, readonly Edge[]>,
  used: ReadonlySet<string>,
  inputs: readonly string[],
): { codes: { code: string; k: number | null }[]; loop?: LockUp } {
  const k = new Map<string, number | null>();
  let loop: LockUp | undefined;
  const onStack: string[] = [];
  const stackInputs: string[] = [];
  const visit = (c: string): number | null => {
    const known = k.get(c);
    if (known !== undefined) return known;
    const at = onStack.indexOf(c);
    if (at >= 0) {
      if (!loop) {
        const codes = onStack.slice(at);
        const loopInputs = stackInputs.slice(at);
        const steps = codes.map((x, i) => `${x} —${describeInputs(inputs, loopInputs[i])}→`).join(' ');
        loop = { codes, inputs: loopInputs, words: `lock-up loop among unused codes: ${steps} ${c}, for ever` };
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
          words: `from unused code ${c} with ${describeInputs(inputs, e.inputs)}: ${e.words}`,
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
  return loop ? { codes, loop } : { codes };
}
