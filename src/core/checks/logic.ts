/**
 * Logic-level checks of a build, on its equations (cube operations, no enumeration).
 *
 * forbidden-input: for every master latch, S_j·R_j = 0 over all 2^bits codes × all input
 * combinations, `never` ones included: every pair of an S_j term and an R_j term is disjoint.
 * Every slave latch is set by NAND(φ2, M_j) and reset by NAND(φ2, M̄_j), which are never
 * active together while its master holds a valid value (proven above); the check confirms in
 * the netlist that each slave is wired so, and that the reset cord enters exactly one side
 * of every latch.
 *
 * next-state-equivalence: for every state of the built machine and every row of its flat
 * table (an input cube), the equations give the specified next code — bit j goes to 1 when
 * S_j = 1, to 0 when R_j = 1 and holds otherwise (SR table; S = R = 1 never counts as right)
 * — and every specified output value.
 *
 * Equations are read by position: S0, R0, S1, R1 … then one per output, as synthesise
 * writes them.
 */
import { coverHolds, intersect, subtract, type Cube } from '../model/cube.js';
import { DONT_CARE } from '../model/flat.js';
import type { Build, CheckBase } from '../model/build.js';
import { partIndex, type Cord, type Netlist, type Part } from '../model/netlist.js';
import { counted } from '../model/words.js';

/** The logic-level forbidden-input proof (the part-level check carries it as `logic`). */
export interface LogicForbiddenResult extends CheckBase<'forbidden-input'> {
  /** Latches checked before the first failure (all of them, masters and slaves, when ok). */
  readonly latchesChecked: number;
  /** The latch that fails, and where (code and inputs are empty for a slave wired wrongly). */
  readonly counterexample?: { readonly latch: string; readonly code: string; readonly inputs: string };
}

/** The result of the next-state equivalence of the equations. */
export interface NextStateResult extends CheckBase<'next-state-equivalence'> {
  /** (state, row cube) cells checked. */
  readonly cellsChecked: number;
  readonly counterexample?: {
    readonly state: string;
    readonly code: string;
    readonly inputs: string;
    /** `next q<j>` or `output <name>`. */
    readonly what: string;
    readonly expected: number;
    readonly got: number | 'forbidden';
  };
}

/** S·R = 0 for every latch, over every code and input combination. */
export function checkForbiddenInput(build: Build): LogicForbiddenResult {
  const bits = build.encoding.bits;
  for (let j = 0; j < bits; j++) {
    const s = build.equations[2 * j].terms,
      r = build.equations[2 * j + 1].terms;
    for (const a of s)
      for (const b of r) {
        const x = intersect(a, b);
        if (x === null) continue;
        const point = x.replaceAll('-', '0');
        return {
          name: 'forbidden-input',
          ok: false,
          summary: `master latch M${j} gets set and reset together at code ${point.slice(0, bits)} with inputs ${point.slice(bits) || '(none)'}`,
          latchesChecked: j + 1,
          counterexample: { latch: build.signals.masters[j], code: point.slice(0, bits), inputs: point.slice(bits) },
        };
      }
  }
  const index = new NetIndex(build.netlist);
  for (let j = 0; j < bits; j++) {
    const wrong = slaveWiring(build, index, j);
    if (wrong) {
      return {
        name: 'forbidden-input',
        ok: false,
        summary: wrong,
        latchesChecked: bits + j + 1,
        counterexample: { latch: build.signals.slaves[j], code: '', inputs: '' },
      };
    }
  }
  return {
    name: 'forbidden-input',
    ok: true,
    summary:
      bits === 0
        ? 'no latches (a combinational build)'
        : `S·R = 0 proven for ${bits} master latches over all ${2 ** bits} codes × all input combinations; ${bits} slave latches take complementary transfer gates`,
    latchesChecked: 2 * bits,
  };
}

/** The equations give the specified next code and outputs in every state and input cube. */
export function checkNextStateEquivalence(build: Build): NextStateResult {
  const f = build.machine;
  const { bits, codes } = build.encoding;
  const eq = build.equations;
  let cells = 0;
  const fail = (
    state: number,
    at: Cube,
    what: string,
    expected: number,
    got: number | 'forbidden',
  ): NextStateResult => ({
    name: 'next-state-equivalence',
    ok: false,
    summary: `in state ${f.states[state]} with inputs ${at.slice(bits) || '(none)'}: ${what} should be ${expected}, the build gives ${got}`,
    cellsChecked: cells,
    counterexample: { state: f.states[state], code: codes[state], inputs: at.slice(bits), what, expected, got },
  });
  for (let s = 0; s < f.states.length; s++) {
    const code = codes[s];
    // Each equation's terms that can hold at this code, in order: the others meet no cube of this state.
    const at = eq.map((e) => termsAtCode(e.terms, code));
    for (const row of f.rows[s]) {
      cells++;
      const x = code + row.cube;
      if (row.next !== DONT_CARE) {
        const to = codes[row.next];
        for (let j = 0; j < bits; j++) {
          const set = at[2 * j],
            reset = at[2 * j + 1];
          const want = to[j] === '1' ? 1 : 0;
          // Wrong where the opposite input fires, or where the needed input is missing.
          const bad =
            meet(x, want === 1 ? reset : set) ?? (code[j] === to[j] ? null : miss(x, want === 1 ? set : reset));
          if (bad !== null) return fail(s, bad, `next q${j}`, want, nextBit(bad, j, set, reset));
        }
      }
      for (let k = 0; k < f.outputs.length; k++) {
        const v = row.out[k];
        if (v === '-') continue;
        const terms = at[2 * bits + k];
        const bad = v === 1 ? miss(x, terms) : meet(x, terms);
        if (bad !== null) return fail(s, bad, `output ${f.outputs[k]}`, v, v === 1 ? 0 : 1);
      }
    }
  }
  return {
    name: 'next-state-equivalence',
    ok: true,
    summary: `next codes and outputs match the specification in ${f.states.length === 1 ? 'its one state' : `all ${f.states.length} states`} (${counted(cells, 'input cube')})`,
    cellsChecked: cells,
  };
}

/**
 * The terms of a cover that agree with a state code on its bits (the code's variables come
 * first), in cover order. A term left out is disjoint from every cube of that code, so it
 * changes neither where the cover meets such a cube nor what subtracting it leaves.
 */
function termsAtCode(cover: readonly Cube[], code: string): readonly Cube[] {
  return cover.filter((t) => {
    for (let i = 0; i < code.length; i++) if (t[i] !== '-' && t[i] !== code[i]) return false;
    return true;
  });
}

/** A point of cube x where the cover holds, or null. */
function meet(x: Cube, cover: readonly Cube[]): string | null {
  for (const c of cover) {
    const y = intersect(x, c);
    if (y !== null) return y.replaceAll('-', '0');
  }
  return null;
}

/** A point of cube x where the cover does not hold, or null. */
function miss(x: Cube, cover: readonly Cube[]): string | null {
  const rest = subtract([x], cover);
  return rest.length === 0 ? null : rest[0].replaceAll('-', '0');
}

function nextBit(point: string, j: number, set: readonly Cube[], reset: readonly Cube[]): number | 'forbidden' {
  const s = coverHolds(set, point),
    r = coverHolds(reset, point);
  if (s && r) return 'forbidden';
  return s ? 1 : r ? 0 : point[j] === '1' ? 1 : 0;
}

/** Why slave j is not wired as NAND(φ2, M_j) → S̄, NAND(φ2, M̄_j) → R̄ with reset on one side; or null. */
function slaveWiring(build: Build, n: NetIndex, j: number): string | null {
  const slave = n.part(build.signals.slaves[j]);
  const master = n.part(build.signals.masters[j]);
  if (slave?.kind !== 'latch' || master?.kind !== 'latch') return `latches of bit ${j} are missing`;
  const setIn = feeders(n, slave.setGate, slave.resetGate),
    resetIn = feeders(n, slave.resetGate, slave.setGate);
  const phi2 = build.signals.phi2;
  const transfer = (drivers: Set<string>, from: string): boolean =>
    [...drivers].some((d) => {
      const g = feeders(n, d, '');
      return g.size === 2 && g.has(phi2) && g.has(from);
    });
  if (!transfer(setIn, master.setGate)) return `slave latch Q${j} is not set by NAND(φ2, M${j})`;
  if (!transfer(resetIn, master.resetGate)) return `slave latch Q${j} is not reset by NAND(φ2, !M${j})`;
  for (const l of [master, slave]) {
    if (l.kind !== 'latch') continue;
    const a = feeders(n, l.setGate, l.resetGate).has('rst.drv'),
      b = feeders(n, l.resetGate, l.setGate).has('rst.drv');
    if (a === b) return `the reset cord enters ${a ? 'both sides' : 'neither side'} of latch ${l.name}`;
  }
  return null;
}

/** A netlist's parts by id and its cords by the parts they pull, looked up instead of scanned. */
class NetIndex {
  private readonly parts: ReadonlyMap<string, Part>;
  /** Per part, the cords with a port on it, in netlist order (each once). */
  private readonly cords = new Map<string, Cord[]>();

  constructor(n: Netlist) {
    // Ids are unique (the netlist invariants), so the index finds what a search from the front would.
    this.parts = partIndex(n);
    for (const c of n.cords)
      for (const part of new Set(c.ports.map((p) => p.part))) {
        const list = this.cords.get(part);
        if (list) list.push(c);
        else this.cords.set(part, [c]);
      }
  }

  part(id: string): Part | undefined {
    return this.parts.get(id);
  }

  cordsAt(part: string): readonly Cord[] {
    return this.cords.get(part) ?? [];
  }
}

/**
 * The drivers whose cords reach a gate's ports (except the feedback from `skip`), looking
 * through buffer pairs and fan-in trees (gates named `<gate>.and<k>`), which pass signals on.
 */
function feeders(n: NetIndex, gate: string, skip: string): Set<string> {
  const out = new Set<string>();
  const seen = new Set<string>();
  const visit = (g: string): void => {
    if (seen.has(g)) return;
    seen.add(g);
    for (const c of n.cordsAt(g)) {
      if (c.driver === skip) continue;
      const d = n.part(c.driver);
      const passOn =
        d?.kind === 'gate' && (d.role === 'buffer' || d.id.startsWith(`${gate}.and`) || d.id.startsWith(`${g}.and`));
      if (passOn) visit(d.id);
      else out.add(c.driver);
    }
  };
  visit(gate);
  return out;
}
