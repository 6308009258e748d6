/**
 * Which input combinations (and which state codes) the simulation-based checks try: the one
 * rule that the part-level checks (checks/*.ts) and the drive snapshots (snapshots.ts) share.
 *
 * The rule, for a machine with n inputs:
 * - n ≤ `maxExhaustiveInputs` (default 16): every combination, in reflected Gray-code order
 *   (one lever moves between neighbours), so a check over them is a proof;
 * - beyond: one combination inside each cube the caller names (the rows of the machine's flat
 *   table, or of the states in hand; free inputs released), one inside each `never` cube when
 *   those are tried, and `samples` (default 256) seeded random combinations, duplicates
 *   dropped, in that order — then a check is a test, not a proof, and says so;
 * - combinations in the machine's `never` cubes are dropped unless `includeNever` (the
 *   forbidden-input check includes them: a visitor will try them; the others follow the spec's
 *   promise that they do not occur, as the synthesis does).
 * The random combinations come from the caller's seeded generator (model/random.ts), so a
 * given seed always gives the same list; a caller that draws once per state gets fresh
 * samples for each state from the same generator.
 */
import { coverHolds, mintermString, type Cube } from '../model/cube.js';
import type { FlatMachine } from '../model/flat.js';
import type { Random } from '../model/random.js';

/** Default bound: up to this many inputs every combination is tried. */
export const EXHAUSTIVE_INPUTS = 16;

/** Default number of seeded random combinations beyond the bound. */
export const SAMPLED_INPUTS = 256;

/** The input space to draw combinations from. */
export interface InputSpace {
  /** Number of inputs (the length of every combination). */
  readonly inputs: number;
  /** Cubes of which one combination each is always tried when sampling. */
  readonly cubes: readonly Cube[];
  /** Input cubes the machine declares never to occur. */
  readonly never: readonly Cube[];
}

/** How many combinations to try, and whether the `never` ones count. */
export interface AssignmentRule {
  /** Inputs up to which every combination is tried (default EXHAUSTIVE_INPUTS). */
  readonly maxExhaustiveInputs?: number;
  /** Seeded random combinations beyond that bound (default SAMPLED_INPUTS). */
  readonly samples?: number;
  /** Also try combinations in `never` (default false). */
  readonly includeNever?: boolean;
}

/** The combinations to try, '0'/'1' per input in the machine's order, and whether they are all of them. */
export interface Assignments {
  readonly list: readonly string[];
  readonly exhaustive: boolean;
}

/** The input space of a flat machine: every row cube of every state, and its `never` cubes. */
export function machineInputs(f: Pick<FlatMachine, 'inputs' | 'rows' | 'never'>): InputSpace {
  return { inputs: f.inputs.length, cubes: f.rows.flatMap((rs) => rs.map((r) => r.cube)), never: f.never };
}

/** Whether `inputs` inputs are past the exhaustive bound of `rule`. */
export function isExhaustive(inputs: number, rule: AssignmentRule = {}): boolean {
  return inputs <= (rule.maxExhaustiveInputs ?? EXHAUSTIVE_INPUTS);
}

/** The input combinations to try (the rule in this module's comment). */
export function inputAssignments(space: InputSpace, rnd: Random, rule: AssignmentRule = {}): Assignments {
  const n = space.inputs;
  const keep = (a: string): boolean => rule.includeNever === true || !coverHolds(space.never, a);
  if (isExhaustive(n, rule)) return { list: grayAssignments(n).filter(keep), exhaustive: true };
  const cubes = rule.includeNever === true ? [...space.cubes, ...space.never] : space.cubes;
  const list = sampledAssignments(cubes, n, rule.samples ?? SAMPLED_INPUTS, rnd).filter(keep);
  return { list, exhaustive: false };
}

/** Every assignment of n inputs in reflected Gray-code order (one lever moves between neighbours). */
export function grayAssignments(n: number): string[] {
  const out: string[] = [];
  const total = 2 ** n;
  for (let k = 0; k < total; k++) out.push(mintermString(k ^ (k >>> 1), n));
  return out;
}

/** One assignment inside each cube (free inputs released) plus `samples` seeded random ones, duplicates dropped. */
function sampledAssignments(cubes: readonly string[], n: number, samples: number, rnd: Random): string[] {
  const out = new Set<string>();
  for (const c of cubes) out.add(c.replace(/-/g, '0'));
  for (let i = 0; i < samples; i++) out.add(randomBits(n, rnd));
  return [...out];
}

function randomBits(n: number, rnd: Random): string {
  let s = '';
  for (let k = 0; k < n; k++) s += rnd.next() < 0.5 ? '0' : '1';
  return s;
}

/** Every code of `bits` bits, in counting order. */
export function allCodes(bits: number): string[] {
  const out: string[] = [];
  for (let m = 0; m < 2 ** bits; m++) out.push(mintermString(m, bits));
  return out;
}

/** Up to `count` distinct seeded random codes of `bits` bits, none of them in `skip`. */
export function randomCodes(bits: number, count: number, rnd: Random, skip: ReadonlySet<string> = new Set()): string[] {
  const out = new Set<string>();
  for (let tries = 0; out.size < count && tries < count * 4; tries++) {
    const s = randomBits(bits, rnd);
    if (!skip.has(s)) out.add(s);
  }
  return [...out];
}

/** `a=1 b=0` for an assignment. */
export function describeInputs(inputs: readonly string[], assignment: string): string {
  return inputs.length === 0 ? '(no inputs)' : inputs.map((n, i) => `${n}=${assignment[i]}`).join(' ');
}
