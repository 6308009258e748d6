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
export const allDontCaresOne: Minimiser = (f: MultiFunction): SopCover =>
  cubesAsCover(f, (k) => [...f.on[k], ...f.dc[k]]);
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
  const cubes = [cube];
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
    allowed
      .flatMap((a) => cut(rng, a, 1 + rng.int(3)))
      .map((cube, k) => ({
        cube,
        next: shape.incomplete && rng.next() < 0.15 ? DONT_CARE : k === 0 ? (s + 1) % n : rng.int(n),
        out: Array.from({ length: no }, (): OutBit =>
          shape.incomplete && rng.next() < 0.2 ? '-' : rng.int(2) === 1 ? 1 : 0,
        ),
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
    if (!d || (d.kind !== 'lever' && d.kind !== 'gate'))
      bad.push(`cord ${c.id}: driver ${c.driver} is not a lever or gate`);
    if (c.ports.length + c.actuators.length === 0) bad.push(`cord ${c.id} ties nothing`);
    for (const p of c.ports) {
      const g = parts.get(p.part);
      if (g?.kind !== 'gate' || !g.ports.some((q) => q.name === p.port))
        bad.push(`cord ${c.id}: no port ${p.part}.${p.port}`);
      tied.add(`${p.part}.${p.port}`);
    }
    for (const a of c.actuators) if (parts.get(a)?.kind !== 'actuator') bad.push(`cord ${c.id}: no actuator ${a}`);
  }
  const perPort = new Map<string, number>();
  for (const c of n.cords)
    for (const p of c.ports) perPort.set(`${p.part}.${p.port}`, (perPort.get(`${p.part}.${p.port}`) ?? 0) + 1);
  for (const p of n.parts) {
    if (p.kind === 'gate') {
      if (p.ports.length > profile.maxPortsPerGate) bad.push(`gate ${p.id} has ${p.ports.length} ports`);
      if (new Set(p.ports.map((q) => q.name)).size !== p.ports.length) bad.push(`gate ${p.id} repeats a port name`);
      for (const q of p.ports) {
        if (!tied.has(`${p.id}.${q.name}`)) bad.push(`port ${p.id}.${q.name} has no cord`);
        if ((perPort.get(`${p.id}.${q.name}`) ?? 0) > profile.maxCordsPerPort)
          bad.push(`port ${p.id}.${q.name} has too many cords`);
      }
    }
    if (p.kind === 'flag' && p.fixed === undefined && parts.get(p.gate)?.kind !== 'gate')
      bad.push(`flag ${p.id} reads no gate`);
    if (p.kind === 'latch')
      for (const g of [p.setGate, p.resetGate])
        if (parts.get(g)?.kind !== 'gate') bad.push(`latch ${p.id}: no gate ${g}`);
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
    if (
      !unsat(
        Logic.and(coverFormula(b.equations[2 * j].terms, b.vars), coverFormula(b.equations[2 * j + 1].terms, b.vars)),
      )
    )
      return false;
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
          const S = coverFormula(b.equations[2 * j].terms, b.vars),
            R = coverFormula(b.equations[2 * j + 1].terms, b.vars);
          const next = Logic.or(Logic.and(S, Logic.not(R)), Logic.and(`v_q${j}`, Logic.not(R), Logic.not(S)));
          wrong.push(
            Logic.and(at, b.encoding.codes[r.next][j] === '1' ? Logic.not(next) : Logic.or(next, Logic.and(S, R))),
          );
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

/** Settled values of a netlist (levers given, latch outputs held at given Q values). */
export interface Settled {
  /** Signal of every lever and gate (its capstan output as a value: 0 while its cord pulls). */
  readonly signal: Map<string, 0 | 1>;
  /** A gate's Z (AND of its ports). */
  z(gate: string): 0 | 1;
  /** A port's value (AND of the cords tied to it; 1 with none). */
  port(gate: string, port: string): 0 | 1;
  /** What a machine output shows (flag or actuator). */
  shows(partId: string): 0 | 1;
}

/**
 * Settle the gates of a netlist by the model of model/netlist.ts: a port is the AND of its
 * cords, Z is the AND of the ports, a gate's signal is NOT Z, a lever's signal is 1 when
 * pulled; latch gates are held at Q / NOT Q. A reference evaluator for the tests, written
 * from the model, not from the mapper.
 */
export function settle(
  n: Netlist,
  levers: Readonly<Record<string, 0 | 1>>,
  latchQ: Readonly<Record<string, 0 | 1>>,
): Settled {
  const parts = new Map(n.parts.map((p) => [p.id, p]));
  const signal = new Map<string, 0 | 1>();
  const held = new Set<string>();
  for (const p of n.parts) {
    if (p.kind === 'lever') signal.set(p.id, levers[p.id] ?? 0);
    if (p.kind === 'latch') {
      const q = latchQ[p.id] ?? 0;
      signal.set(p.setGate, q);
      signal.set(p.resetGate, q === 1 ? 0 : 1);
      held.add(p.setGate).add(p.resetGate);
    }
  }
  const tiedTo = new Map<string, string[]>();
  for (const c of n.cords)
    for (const p of c.ports)
      tiedTo.set(`${p.part}.${p.port}`, [...(tiedTo.get(`${p.part}.${p.port}`) ?? []), c.driver]);
  const port = (g: string, q: string): 0 | 1 =>
    (tiedTo.get(`${g}.${q}`) ?? []).every((d) => signal.get(d) === 1) ? 1 : 0;
  const z = (g: string): 0 | 1 => {
    const gate = parts.get(g);
    if (gate?.kind !== 'gate') throw new Error(`no gate ${g}`);
    return gate.ports.every((q) => port(g, q.name) === 1) ? 1 : 0;
  };
  const gates = n.parts.filter((p) => p.kind === 'gate' && !held.has(p.id));
  for (const g of gates) signal.set(g.id, 1);
  for (let round = 0; round <= gates.length; round++) {
    let changed = false;
    for (const g of gates) {
      const v = z(g.id) === 1 ? 0 : 1;
      if (signal.get(g.id) !== v) {
        signal.set(g.id, v);
        changed = true;
      }
    }
    if (!changed) break;
  }
  const shows = (id: string): 0 | 1 => {
    const p = parts.get(id);
    if (p?.kind === 'flag') return p.fixed ?? ((z(p.gate) === 1) !== p.inverted ? 1 : 0);
    if (p?.kind === 'actuator') {
      if (p.fixed !== undefined) return p.fixed;
      // Pulled while any cord tied to it pulls, i.e. while its driver's signal is 0.
      return n.cords.some((c) => c.actuators.includes(id) && signal.get(c.driver) === 0) ? 1 : 0;
    }
    throw new Error(`no flag or actuator ${id}`);
  };
  return { signal, z, port, shows };
}

/**
 * Settle the build's netlist at every used code × every input combination (small machines
 * only) and compare with its equations: with φ1 pulled, each master's S̄ (R̄) ports read
 * NOT S_j (NOT R_j), and read 1 with φ1 released; with φ2 pulled, each slave's S̄ reads
 * NOT M_j and R̄ reads M_j; with reset pulled, exactly the start code's side is held at 0;
 * every flag or actuator shows its output's equation. Returns the first mismatch in words.
 */
export function polarityMismatch(b: Build): string | null {
  const bits = b.encoding.bits;
  const sig = b.signals;
  const n = b.netlist;
  const latchGate = (id: string, side: 'set' | 'reset'): string => {
    const l = n.parts.find((p) => p.id === id);
    if (l?.kind !== 'latch') throw new Error(`no latch ${id}`);
    return side === 'set' ? l.setGate : l.resetGate;
  };
  const sideBar = (s: Settled, latch: string, side: 'set' | 'reset'): 0 | 1 => {
    const g = latchGate(latch, side);
    const gate = n.parts.find((p) => p.id === g);
    if (gate?.kind !== 'gate') throw new Error(`no gate ${g}`);
    return gate.ports.filter((q) => q.name !== 'fb').every((q) => s.port(g, q.name) === 1) ? 1 : 0;
  };
  const ni = b.machine.inputs.length;
  for (const code of b.encoding.codes)
    for (let m = 0; m < 2 ** ni; m++) {
      const x = m
        .toString(2)
        .padStart(ni, '0')
        .slice(-ni || 0);
      const xs = ni === 0 ? '' : x;
      const point = code + xs;
      const levers: Record<string, 0 | 1> = {};
      b.machine.inputs.forEach((name, i) => (levers[sig.inputs[name]] = xs[i] === '1' ? 1 : 0));
      const slaves: Record<string, 0 | 1> = {};
      for (let j = 0; j < bits; j++) slaves[sig.slaves[j]] = code[j] === '1' ? 1 : 0;
      const on = settle(n, { ...levers, [sig.phi1]: 1 }, slaves);
      const off = settle(n, levers, slaves);
      for (let j = 0; j < bits; j++) {
        const S = coverHoldsAt(b.equations[2 * j].terms, point),
          R = coverHoldsAt(b.equations[2 * j + 1].terms, point);
        if (sideBar(on, sig.masters[j], 'set') !== 1 - S) return `S̄ of ${sig.masters[j]} at ${point}`;
        if (sideBar(on, sig.masters[j], 'reset') !== 1 - R) return `R̄ of ${sig.masters[j]} at ${point}`;
        if (sideBar(off, sig.masters[j], 'set') !== 1 || sideBar(off, sig.masters[j], 'reset') !== 1)
          return `master ${j} driven without φ1 at ${point}`;
      }
      for (let k = 0; k < b.machine.outputs.length; k++) {
        const want = coverHoldsAt(b.equations[2 * bits + k].terms, point);
        for (const s of [on, off])
          if (s.shows(sig.outputs[b.machine.outputs[k]]) !== want) return `output ${b.machine.outputs[k]} at ${point}`;
      }
    }
  for (let j = 0; j < bits; j++)
    for (const mq of [0, 1] as const) {
      const s = settle(n, { [sig.phi2]: 1 }, { [sig.masters[j]]: mq });
      if (sideBar(s, sig.slaves[j], 'set') !== 1 - mq || sideBar(s, sig.slaves[j], 'reset') !== mq)
        return `transfer into ${sig.slaves[j]} with M = ${mq}`;
    }
  if (bits > 0) {
    const r = settle(n, { [sig.reset]: 1 }, {});
    const start = b.encoding.codes[b.machine.start];
    for (let j = 0; j < bits; j++)
      for (const l of [sig.masters[j], sig.slaves[j]]) {
        const want = start[j] === '1' ? [0, 1] : [1, 0];
        if (sideBar(r, l, 'set') !== want[0] || sideBar(r, l, 'reset') !== want[1]) return `reset of ${l}`;
      }
  }
  return null;
}

function coverHoldsAt(cover: readonly Cube[], point: string): 0 | 1 {
  return cover.some((c) => [...c].every((ch, i) => ch === '-' || ch === point[i])) ? 1 : 0;
}
