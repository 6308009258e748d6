/**
 * Sketch: a quick estimate of what the set/reset and output logic of a candidate encoding
 * will cost, so that the automatic search can screen thousands of candidates and leave the
 * real synthesis (tens to hundreds of milliseconds each) to the few best.
 *
 * Method. Every function is read straight off the flat table, so no complement is computed:
 * for state bit j, a row from code c to code c' turns S_j on when c_j = 0 and c'_j = 1, R_j on
 * when c_j = 1 and c'_j = 0, and keeps the other one off; the rest is the SR excitation table
 * (Mano & Ciletti, Digital Design, flip-flop excitation tables), with the global don't-cares
 * (unused codes, `never` inputs, free next states) split by bit as the build's guard splits
 * them (phases/guard.ts, split-by-bit): S_j's where c_j = 0, R_j's where c_j = 1. An output is
 * on, off or free by its rows. Each on-set cube is then expanded against the off-set —
 * every literal raised in turn, state bits first, while the cube stays clear of the off-set:
 * the EXPAND step of Espresso-II (Brayton, Hachtel, McMullen & Sangiovanni-Vincentelli,
 * "Logic Minimization Algorithms for VLSI Synthesis", 1984) without its ordering heuristics
 * or the REDUCE/IRREDUNDANT loop — and cubes already covered are skipped. Equal cubes feeding
 * several functions count once, as the build shares their gate.
 *
 * Estimate = Σ over distinct cubes of (term + literal · literals) + connection · (functions
 * fed), in the caller's weights. It ranks candidates; it is not a part count.
 *
 * Rows are compressed once per machine, before any encoding is seen: per state, the input
 * cubes of rows that go to the same next state (or give an output the same value) are merged
 * where two differ in one input only, so a table written minterm by minterm costs no more to
 * sketch than one written with wide guards.
 *
 * Precondition: at most 32 inputs and 30 state bits (the tool's limits are lower).
 * Deterministic; pure.
 */
import { DONT_CARE, type FlatMachine } from '../../model/flat.js';

/** Weights of the estimate, in the caller's cost units. */
export interface SketchWeights {
  /** One product term (its gate, capstan and weights). */
  readonly term: number;
  /** One literal of a term (a cord into its ports). */
  readonly literal: number;
  /** One function a term feeds (a branch of its output cord). */
  readonly connection: number;
  /** Branches one driver carries before it needs a buffer (its force budget over one port's load). */
  readonly fanout: number;
  /** One buffer pair (two one-port gates, their capstans, weights and cords). */
  readonly buffer: number;
}

/** The sketch of one machine. */
export interface Sketch {
  /** Estimate of an assignment given as integer codes (bit 0 of a code string is the most significant). */
  estimate(codes: readonly number[], bits: number): number;
  /**
   * Work done so far, in elementary steps (cube pairs compared). It depends only on what was
   * sketched, never on the clock, so a search may budget it and stay deterministic.
   */
  readonly work: number;
}

/** Unit weights: roughly the default profile's proportions (a term 8, a literal or a connection 1, five branches per driver). */
export const SKETCH_WEIGHTS: SketchWeights = { term: 8, literal: 1, connection: 1, fanout: 5, buffer: 18 };

/** Unused codes are listed one by one up to this many; past it they are left free to both sides. */
const MAX_UNUSED_LISTED = 4096;

/** Input cubes as care and value masks (bit i = input i). */
interface InputCubes {
  readonly care: Int32Array;
  readonly value: Int32Array;
}

/** One state's rows that go to one next state (or DONT_CARE), merged. */
interface Group {
  readonly next: number;
  readonly cubes: InputCubes;
}

/** The encoding-independent part of the sketch of one machine. */
interface Table {
  readonly inputs: number;
  readonly groups: readonly (readonly Group[])[];
  /** Per output, per state: where it is 1 and where it is 0. */
  readonly outOn: readonly (readonly InputCubes[])[];
  readonly outOff: readonly (readonly InputCubes[])[];
  readonly never: InputCubes;
}

/** A growable list of cubes over state bits and inputs, as four parallel mask arrays. */
class Cubes {
  sc: Int32Array = new Int32Array(64);
  sv: Int32Array = new Int32Array(64);
  ic: Int32Array = new Int32Array(64);
  iv: Int32Array = new Int32Array(64);
  length = 0;

  clear(): void {
    this.length = 0;
  }

  push(sc: number, sv: number, ic: number, iv: number): void {
    if (this.length === this.sc.length) {
      const grow = (a: Int32Array): Int32Array => {
        const b = new Int32Array(a.length * 2);
        b.set(a);
        return b;
      };
      this.sc = grow(this.sc);
      this.sv = grow(this.sv);
      this.ic = grow(this.ic);
      this.iv = grow(this.iv);
    }
    const k = this.length++;
    this.sc[k] = sc;
    this.sv[k] = sv;
    this.ic[k] = ic;
    this.iv[k] = iv;
  }

  /** Add every input cube under one state code. */
  pushAll(codeCare: number, code: number, c: InputCubes): void {
    for (let k = 0; k < c.care.length; k++) this.push(codeCare, code, c.care[k], c.value[k]);
  }
}

/** Build the sketch of a machine: compress its rows once, then estimate any assignment. */
export function sketchOf(f: FlatMachine, weights: SketchWeights = SKETCH_WEIGHTS): Sketch {
  return new Workspace(compress(f), weights);
}

/** Buffers reused from one estimate to the next. */
class Workspace implements Sketch {
  work = 0;
  private readonly on = new Cubes();
  private readonly off = new Cubes();
  private readonly kept = new Cubes();
  private conflictS: Int32Array = new Int32Array(64);
  private conflictI: Int32Array = new Int32Array(64);
  /** Distinct terms: key → index into the term arrays. */
  private readonly terms = new Map<string, number>();
  /** Per distinct term: its cube's masks and the functions it feeds. */
  private readonly term = new Cubes();
  private feeds: Int32Array = new Int32Array(64);
  private sr: Int32Array = new Int32Array(64);
  private readonly kinds: Uint8Array;

  constructor(
    private readonly t: Table,
    private readonly w: SketchWeights,
  ) {
    this.kinds = new Uint8Array(Math.max(1, ...t.groups.map((g) => g.length)));
  }

  estimate(codes: readonly number[], bits: number): number {
    this.terms.clear();
    this.term.clear();
    const unused = unusedCodes(codes, bits);
    for (let j = 0; j < bits; j++) {
      const m = 1 << (bits - 1 - j);
      this.srFunction(codes, bits, m, true, unused);
      this.srFunction(codes, bits, m, false, unused);
    }
    for (let k = 0; k < this.t.outOn.length; k++) this.output(codes, bits, k);
    return this.total(bits);
  }

  /**
   * Σ over terms of term + literal · literals + connection · feeds, plus a buffer pair per
   * `fanout − 1` branches past the first `fanout` of every driver: each literal (a state bit's
   * latch output, an input lever or its inverter) drives one branch per term that uses it, and
   * every set/reset term takes a branch of φ1.
   */
  private total(bits: number): number {
    const { w, term } = this;
    const uses = new Int32Array(2 * (bits + this.t.inputs));
    let total = 0;
    let phi1 = 0;
    for (let x = 0; x < term.length; x++) {
      const sc = term.sc[x],
        ic = term.ic[x];
      total += w.term + w.literal * (popcount(sc) + popcount(ic)) + w.connection * this.feeds[x];
      for (let j = 0; j < bits; j++) if ((sc >> j) & 1) uses[2 * j + ((term.sv[x] >> j) & 1)]++;
      for (let i = 0; i < this.t.inputs; i++) if ((ic >> i) & 1) uses[2 * (bits + i) + ((term.iv[x] >> i) & 1)]++;
      if (this.sr[x]) phi1++;
      total += buffers(this.feeds[x], w) * w.buffer;
    }
    for (const u of uses) total += buffers(u, w) * w.buffer;
    return total + buffers(phi1, w) * w.buffer;
  }

  /** S_j (set = true) or R_j of the bit with mask m. */
  private srFunction(codes: readonly number[], bits: number, m: number, set: boolean, unused: number[] | null): void {
    const { on, off } = this;
    on.clear();
    off.clear();
    const full = bits >= 31 ? -1 : (1 << bits) - 1;
    const noNever = this.t.never.care.length === 0;
    const kinds = this.kinds;
    this.t.groups.forEach((groups, s) => {
      const code = codes[s];
      const here = (code & m) !== 0;
      let ons = 0,
        offs = 0;
      for (let g = 0; g < groups.length; g++) {
        const k = groupKind(groups[g].next, codes, m, here, set);
        kinds[g] = k;
        if (k === ON) ons++;
        else if (k === OFF) offs++;
      }
      // A state wholly on (or wholly off) is one cube over its code: its `never` inputs are
      // the function's don't-cares where it is on, and off where the global ones are off.
      if (ons === groups.length) on.push(full, code, 0, 0);
      else if (offs === groups.length && (noNever || here === set)) off.push(full, code, 0, 0);
      else
        for (let g = 0; g < groups.length; g++)
          if (kinds[g] === ON) on.pushAll(full, code, groups[g].cubes);
          else if (kinds[g] === OFF) off.pushAll(full, code, groups[g].cubes);
    });
    if (unused) for (const u of unused) if (((u & m) !== 0) === set) off.push(full, u, 0, 0);
    const nv = this.t.never;
    for (let k = 0; k < nv.care.length; k++) off.push(m, set ? m : 0, nv.care[k], nv.value[k]);
    this.expand(bits, true);
  }

  private output(codes: readonly number[], bits: number, k: number): void {
    const { on, off } = this;
    on.clear();
    off.clear();
    const full = bits >= 31 ? -1 : (1 << bits) - 1;
    for (let s = 0; s < codes.length; s++) {
      on.pushAll(full, codes[s], this.t.outOn[k][s]);
      off.pushAll(full, codes[s], this.t.outOff[k][s]);
    }
    if (on.length === 0) return;
    if (off.length === 0) this.addTerm(0, 0, 0, 0, false);
    else this.expand(bits, false);
  }

  /** Expand every on-set cube against the off-set; record the cubes that are kept (`sr`: as set/reset terms). */
  private expand(bits: number, sr: boolean): void {
    const { on, off, kept } = this;
    kept.clear();
    if (this.conflictS.length < off.length) {
      this.conflictS = new Int32Array(off.length * 2);
      this.conflictI = new Int32Array(off.length * 2);
    }
    const cs = this.conflictS;
    const ci = this.conflictI;
    for (let x = 0; x < on.length; x++) {
      const xsc = on.sc[x],
        xsv = on.sv[x],
        xic = on.ic[x],
        xiv = on.iv[x];
      this.work += kept.length + 1;
      if (coveredBy(kept, xsc, xsv, xic, xiv)) continue;
      this.work += off.length * (1 + popcount(xsc) + popcount(xic));
      for (let k = 0; k < off.length; k++) {
        cs[k] = (xsv ^ off.sv[k]) & xsc & off.sc[k];
        ci[k] = (xiv ^ off.iv[k]) & xic & off.ic[k];
      }
      let sc = xsc;
      for (let j = bits - 1; j >= 0; j--) {
        const m = 1 << j;
        if ((sc & m) !== 0 && raise(cs, ci, off.length, m)) sc &= ~m;
      }
      let ic = xic;
      for (let i = 0; i < 32 && ic !== 0; i++) {
        const m = 1 << i;
        if ((ic & m) !== 0 && raise(ci, cs, off.length, m)) ic &= ~m;
      }
      kept.push(sc, xsv & sc, ic, xiv & ic);
    }
    for (let x = 0; x < kept.length; x++) this.addTerm(kept.sc[x], kept.sv[x], kept.ic[x], kept.iv[x], sr);
  }

  /** Count a term for one more function (a new one when no equal cube was seen); `sr`: it feeds a master latch. */
  private addTerm(sc: number, sv: number, ic: number, iv: number, sr: boolean): void {
    const key = `${sc},${sv},${ic},${iv}`;
    const seen = this.terms.get(key);
    if (seen !== undefined) {
      this.feeds[seen]++;
      if (sr) this.sr[seen] = 1;
      return;
    }
    const x = this.term.length;
    this.term.push(sc, sv, ic, iv);
    if (this.feeds.length <= x) {
      const grow = (a: Int32Array): Int32Array => {
        const b = new Int32Array(a.length * 2);
        b.set(a);
        return b;
      };
      this.feeds = grow(this.feeds);
      this.sr = grow(this.sr);
    }
    this.feeds[x] = 1;
    this.sr[x] = sr ? 1 : 0;
    this.terms.set(key, x);
  }
}

const ON = 1;
const OFF = 2;
const FREE = 0;

/**
 * What a group of rows is to S_j (set) or R_j: on where it turns the function on; off where
 * the next bit says the function must stay 0 (S_j where it goes to 0, R_j where it goes to
 * 1); free in the excitation table's own don't-cares. Global don't-cares (a free next state)
 * are S_j's where the bit is 0 and R_j's where it is 1, and off for the other.
 */
function groupKind(next: number, codes: readonly number[], m: number, here: boolean, set: boolean): number {
  if (next === DONT_CARE) return here === set ? OFF : FREE;
  const there = (codes[next] & m) !== 0;
  if (set ? !here && there : here && !there) return ON;
  return there !== set ? OFF : FREE;
}

/**
 * Raise the literal with mask m when no off-set cube is kept apart by it alone; then drop it
 * from every conflict set (`mine` holds the conflicts on m's side, `other` the rest).
 */
function raise(mine: Int32Array, other: Int32Array, n: number, m: number): boolean {
  for (let k = 0; k < n; k++) if (mine[k] === m && other[k] === 0) return false;
  const keep = ~m;
  for (let k = 0; k < n; k++) mine[k] &= keep;
  return true;
}

/** Buffer pairs a driver with `branches` branches needs: one per `fanout − 1` past the first `fanout`. */
function buffers(branches: number, w: SketchWeights): number {
  return branches <= w.fanout ? 0 : Math.ceil((branches - w.fanout) / Math.max(1, w.fanout - 1));
}

/** Is the cube inside one already kept? */
function coveredBy(kept: Cubes, sc: number, sv: number, ic: number, iv: number): boolean {
  for (let e = 0; e < kept.length; e++) {
    const esc = kept.sc[e],
      eic = kept.ic[e];
    if ((esc & ~sc) === 0 && (eic & ~ic) === 0 && ((kept.sv[e] ^ sv) & esc) === 0 && ((kept.iv[e] ^ iv) & eic) === 0)
      return true;
  }
  return false;
}

/** Codes no state uses, or null when there are too many to list. */
function unusedCodes(codes: readonly number[], bits: number): number[] | null {
  const size = 2 ** bits;
  if (size - codes.length > MAX_UNUSED_LISTED) return null;
  const used = new Uint8Array(size);
  for (const c of codes) used[c] = 1;
  const out: number[] = [];
  for (let c = 0; c < size; c++) if (!used[c]) out.push(c);
  return out;
}

function popcount(x: number): number {
  x = x - ((x >>> 1) & 0x55555555);
  x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
  return (Math.imul((x + (x >>> 4)) & 0x0f0f0f0f, 0x01010101) >>> 24) & 0xff;
}

/** The encoding-independent tables: rows grouped by next state and by output value, merged. */
function compress(f: FlatMachine): Table {
  const n = f.inputs.length;
  const groups = f.rows.map((rows) => {
    const byNext = new Map<number, string[]>();
    for (const r of rows) {
      const list = byNext.get(r.next);
      if (list) list.push(r.cube);
      else byNext.set(r.next, [r.cube]);
    }
    return [...byNext].map(([next, cubes]) => ({ next, cubes: merged(cubes, n) }));
  });
  const outOn = f.outputs.map((_, k) =>
    f.rows.map((rows) =>
      merged(
        rows.filter((r) => r.out[k] === 1).map((r) => r.cube),
        n,
      ),
    ),
  );
  const outOff = f.outputs.map((_, k) =>
    f.rows.map((rows) =>
      merged(
        rows.filter((r) => r.out[k] === 0).map((r) => r.cube),
        n,
      ),
    ),
  );
  return { inputs: n, groups, outOn, outOff, never: merged(f.never, n) };
}

/**
 * Disjoint input cubes merged where two differ in one input only, repeated until none do
 * (each merge keeps the list disjoint and covering the same combinations).
 */
function merged(cubes: readonly string[], n: number): InputCubes {
  let care: number[] = [];
  let value: number[] = [];
  for (const c of cubes) {
    let cm = 0,
      vm = 0;
    for (let i = 0; i < n; i++) {
      const ch = c.charCodeAt(i);
      if (ch === 45) continue;
      cm |= 1 << i;
      if (ch === 49) vm |= 1 << i;
    }
    care.push(cm);
    value.push(vm);
  }
  for (let changed = care.length > 1; changed;) {
    changed = false;
    const alive = new Uint8Array(care.length).fill(1);
    const partner = new Map<string, number>();
    for (let k = 0; k < care.length; k++) {
      for (let i = 0; i < n && alive[k]; i++) {
        const m = 1 << i;
        if ((care[k] & m) === 0) continue;
        const key = `${care[k]},${value[k] & ~m},${i}`;
        const other = partner.get(key);
        const fits =
          other !== undefined &&
          alive[other] === 1 &&
          care[other] === care[k] &&
          ((value[other] ^ value[k]) & ~m) === 0 &&
          (value[other] & m) !== (value[k] & m);
        if (other !== undefined && fits) {
          care[other] &= ~m;
          value[other] &= ~m;
          alive[k] = 0;
          partner.delete(key);
          changed = true;
        } else partner.set(key, k);
      }
    }
    const keepCare: number[] = [],
      keepValue: number[] = [];
    for (let k = 0; k < care.length; k++)
      if (alive[k]) {
        keepCare.push(care[k]);
        keepValue.push(value[k]);
      }
    care = keepCare;
    value = keepValue;
  }
  return { care: Int32Array.from(care), value: Int32Array.from(value) };
}
