/**
 * Helpers for the synthesis tests: a small stand-in minimiser (expand against the off-set,
 * then drop redundant cubes — correct, not minimal), random incompletely specified flat
 * machines, simple encodings, the netlist invariants, fixture loading and an independent
 * SAT check with the npm package `logic-solver` (MiniSat).
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { absorb, complement, type Cube } from '../../../src/core/model/cube.js';
import { DONT_CARE, flatten, type FlatMachine, type FlatRow } from '../../../src/core/model/flat.js';
import type { OutBit } from '../../../src/core/model/machine.js';
import type { Build, Encoding } from '../../../src/core/model/build.js';
import type { Netlist } from '../../../src/core/model/netlist.js';
import { seededRandom, type Random } from '../../../src/core/model/random.js';
import type { Profile } from '../../../src/core/physics/profile.js';
import { parseJsonMachine } from '../../../src/core/forms/json.js';
import type { Minimiser } from '../../../src/core/phases/guard.js';
import type { MultiFunction, SopCover, Term } from '../../../src/core/phases/minimise-logic/types.js';

/**
 * Two extreme but legal "minimisers": every don't-care set to 1 (each on and dc cube becomes a
 * term) or every don't-care set to 0 (the on-set itself). Any real minimiser's cover lies
 * between the two, so a guard that is safe for the first is safe whatever the minimiser does.
 */
export const allDontCaresOne: Minimiser = (f: MultiFunction): SopCover => cubesAsCover(f, (k) => [...f.on[k], ...f.dc[k]]);
export const allDontCaresZero: Minimiser = (f: MultiFunction): SopCover => cubesAsCover(f, (k) => [...f.on[k]]);

function cubesAsCover(f: MultiFunction, pick: (k: number) => Cube[]): SopCover {
  const by = new Map<Cube, number[]>();
  f.on.forEach((_, k) => {
    for (const c of absorb(pick(k))) by.set(c, [...(by.get(c) ?? []), k]);
  });
  const terms: Term[] = [...by].map(([cube, outputs]) => ({ cube, outputs }));
  return { vars: f.vars, functions: f.on.length, terms };
}

/** Cut a cube into 1..parts disjoint cubes by splitting on random free variables. */
function cut(rng: Random, cube: Cube, parts: number): Cube[] {
  let cubes = [cube];
  while (cubes.length < parts) {
    const i = rng.int(cubes.length);
    const free = [...cubes[i]].flatMap((ch, v) => (ch === '-' ? [v] : []));
    if (free.length === 0) break;
    const v = free[rng.int(free.length)];
    const c = cubes[i];
    cubes.splice(i, 1, c.slice(0, v) + '0' + c.slice(v + 1), c.slice(0, v) + '1' + c.slice(v + 1));
  }
  return cubes;
}

export interface RandomShape {
  readonly maxStates: number;
  readonly maxInputs: number;
  readonly maxOutputs: number;
  /** Allow never inputs, free next states and '-' outputs. */
  readonly incomplete: boolean;
}

/** A random flat machine (rows disjoint, covering the input space minus never). Deterministic per seed. */
export function randomMachine(seed: number, shape: RandomShape): FlatMachine {
  const rng = seededRandom(seed);
  const n = 1 + rng.int(shape.maxStates);
  const ni = rng.int(shape.maxInputs + 1);
  const no = rng.int(shape.maxOutputs + 1);
  let never: Cube[] = [];
  if (shape.incomplete && ni > 0 && rng.next() < 0.5) {
    const leaves = cut(rng, '-'.repeat(ni), 2 + rng.int(3));
    never = leaves.filter(() => rng.next() < 0.3).slice(0, leaves.length - 1);
  }
  const allowed = complement(never, ni);
  const rows = Array.from({ length: n }, (_, s): FlatRow[] =>
    allowed.flatMap((a) => cut(rng, a, 1 + rng.int(3))).map((cube, k) => ({
      cube,
      next: shape.incomplete && rng.next() < 0.15 ? DONT_CARE : k === 0 ? (s + 1) % n : rng.int(n),
      out: Array.from({ length: no }, (): OutBit => (shape.incomplete && rng.next() < 0.2 ? '-' : rng.int(2) === 1 ? 1 : 0)),
      transition: k,
    })),
  );
  return {
    name: `random${seed}`,
    inputs: Array.from({ length: ni }, (_, i) => `x${i}`),
    outputs: Array.from({ length: no }, (_, i) => `z${i}`),
    states: Array.from({ length: n }, (_, i) => `s${i}`),
    start: 0,
    rows,
    never,
  };
}

/** Binary codes in state order with the fewest bits (at least one). */
export function binaryEncoding(f: FlatMachine): Encoding {
  const bits = Math.max(1, Math.ceil(Math.log2(f.states.length)));
  return { strategy: 'binary', bits, codes: f.states.map((_, i) => i.toString(2).padStart(bits, '0')) };
}

/** Distinct random codes of `bits` bits (enough bits assumed). */
export function randomEncoding(f: FlatMachine, bits: number, seed: number): Encoding {
  const rng = seededRandom(seed);
  const pool = Array.from({ length: 2 ** bits }, (_, i) => i.toString(2).padStart(bits, '0'));
  const codes = f.states.map(() => pool.splice(rng.int(pool.length), 1)[0]);
  return { strategy: 'random', bits, codes };
}

/** One-hot codes. */
export function oneHotEncoding(f: FlatMachine): Encoding {
  const n = f.states.length;
  return { strategy: 'one-hot', bits: n, codes: f.states.map((_, i) => '0'.repeat(i) + '1' + '0'.repeat(n - i - 1)) };
}

/** A fixture of tests/fixtures/lgsynth91 as a flat machine. */
export function fixture(name: string): FlatMachine {
  const text = readFileSync(new URL(`../../fixtures/lgsynth91/${name}.json`, import.meta.url), 'utf8');
  const r = parseJsonMachine(text, `${name}.json`);
  if (!r.machine) throw new Error(`fixture ${name}: ${r.diagnostics.map((d) => d.message).join('; ')}`);
  return flatten(r.machine);
}

/** Every broken netlist invariant, in words (empty when the netlist is sound). */
export function netlistViolations(n: Netlist, profile: Profile): string[] {
  const bad: string[] = [];
  const ids = new Set<string>();
  for (const x of [...n.parts, ...n.cords]) {
    if (ids.has(x.id)) bad.push(`duplicate id ${x.id}`);
    ids.add(x.id);
  }
  const parts = new Map(n.parts.map((p) => [p.id, p]));
  const tied = new Set<string>();
  for (const c of n.cords) {
    const d = parts.get(c.driver);
    if (!d || (d.kind !== 'lever' && d.kind !== 'gate')) bad.push(`cord ${c.id}: driver ${c.driver} is not a lever or gate`);
    if (c.ports.length + c.actuators.length === 0) bad.push(`cord ${c.id} ties nothing`);
    for (const p of c.ports) {
      const g = parts.get(p.part);
      if (g?.kind !== 'gate' || !g.ports.some((q) => q.name === p.port)) bad.push(`cord ${c.id}: no port ${p.part}.${p.port}`);
      tied.add(`${p.part}.${p.port}`);
    }
    for (const a of c.actuators) if (parts.get(a)?.kind !== 'actuator') bad.push(`cord ${c.id}: no actuator ${a}`);
  }
  const perPort = new Map<string, number>();
  for (const c of n.cords) for (const p of c.ports) perPort.set(`${p.part}.${p.port}`, (perPort.get(`${p.part}.${p.port}`) ?? 0) + 1);
  for (const p of n.parts) {
    if (p.kind === 'gate') {
      if (p.ports.length > profile.maxPortsPerGate) bad.push(`gate ${p.id} has ${p.ports.length} ports`);
      if (new Set(p.ports.map((q) => q.name)).size !== p.ports.length) bad.push(`gate ${p.id} repeats a port name`);
      for (const q of p.ports) {
        if (!tied.has(`${p.id}.${q.name}`)) bad.push(`port ${p.id}.${q.name} has no cord`);
        if ((perPort.get(`${p.id}.${q.name}`) ?? 0) > profile.maxCordsPerPort) bad.push(`port ${p.id}.${q.name} has too many cords`);
      }
    }
    if (p.kind === 'flag' && p.fixed === undefined && parts.get(p.gate)?.kind !== 'gate') bad.push(`flag ${p.id} reads no gate`);
    if (p.kind === 'latch') for (const g of [p.setGate, p.resetGate]) if (parts.get(g)?.kind !== 'gate') bad.push(`latch ${p.id}: no gate ${g}`);
  }
  return bad;
}

interface LogicFormula {
  readonly __formula?: never;
}
interface LogicSolver {
  require(...f: unknown[]): void;
  solve(): { getMap(): Record<string, boolean> } | null;
  solveAssuming(f: unknown): { getMap(): Record<string, boolean> } | null;
}
interface LogicApi {
  Solver: new () => LogicSolver;
  and(...a: unknown[]): LogicFormula;
  or(...a: unknown[]): LogicFormula;
  not(a: unknown): LogicFormula;
  xor(...a: unknown[]): LogicFormula;
  equiv(a: unknown, b: unknown): LogicFormula;
  TRUE: LogicFormula;
  FALSE: LogicFormula;
}
/** The npm package logic-solver (MiniSat compiled to JavaScript). */
export const Logic = createRequire(import.meta.url)('logic-solver') as LogicApi;

/** A cover as a logic-solver formula over variables named `v_<name>`. */
export function coverFormula(cover: readonly Cube[], vars: readonly string[]): LogicFormula {
  return Logic.or(...cover.map((c) => cubeFormula(c, vars)));
}

export function cubeFormula(c: Cube, vars: readonly string[]): LogicFormula {
  const lits: string[] = [];
  for (let i = 0; i < c.length; i++) if (c[i] !== '-') lits.push(`${c[i] === '0' ? '-' : ''}v_${vars[i]}`);
  return Logic.and(...lits);
}

// One solver for every query (starting MiniSat is the slow part); each query is a temporary
// assumption, so queries do not constrain each other.
let shared: LogicSolver | undefined;

/** True when the formula has no satisfying assignment (MiniSat says UNSAT). */
export function unsat(f: LogicFormula): boolean {
  shared ??= new Logic.Solver();
  return shared.solveAssuming(f) === null;
}

/** MiniSat: S_j ∧ R_j is unsatisfiable for every bit, over all codes × all inputs. */
export function satExclusive(b: Build): boolean {
  for (let j = 0; j < b.encoding.bits; j++) {
    if (!unsat(Logic.and(coverFormula(b.equations[2 * j].terms, b.vars), coverFormula(b.equations[2 * j + 1].terms, b.vars)))) return false;
  }
  return true;
}

/**
 * MiniSat: in every state and row of the specification, next code (bit j goes to S_j ∨ q_j·¬R_j,
 * with S_j·R_j never allowed) and every specified output equal the spec.
 */
export function satEquivalent(b: Build): boolean {
  const f = b.machine;
  const bits = b.encoding.bits;
  const wrong: LogicFormula[] = [];
  f.rows.forEach((rows, s) => {
    for (const r of rows) {
      const at = cubeFormula(b.encoding.codes[s] + r.cube, b.vars);
      if (r.next !== DONT_CARE) {
        for (let j = 0; j < bits; j++) {
          const S = coverFormula(b.equations[2 * j].terms, b.vars), R = coverFormula(b.equations[2 * j + 1].terms, b.vars);
          const next = Logic.or(Logic.and(S, Logic.not(R)), Logic.and(`v_q${j}`, Logic.not(R), Logic.not(S)));
          wrong.push(Logic.and(at, b.encoding.codes[r.next][j] === '1' ? Logic.not(next) : Logic.or(next, Logic.and(S, R))));
        }
      }
      r.out.forEach((v, k) => {
        if (v === '-') return;
        const F = coverFormula(b.equations[2 * bits + k].terms, b.vars);
        wrong.push(Logic.and(at, v === 1 ? Logic.not(F) : F));
      });
    }
  });
  return unsat(Logic.or(...wrong));
}
