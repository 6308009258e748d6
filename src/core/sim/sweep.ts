/**
 * Many clocks from many start points, 32 at a time (lanes.ts), in the order of the start
 * points: the loop the exhaustive checks share. A start point the lanes cannot vouch for goes
 * to the caller's event-driven path, in its place in the order, so that "the first failure"
 * is the same whichever path found it.
 *
 * Several checks run the same clocks (every code with every input combination: the
 * forbidden-input sweep, then the equivalence check, recovery and the timing check's replay
 * from some of the same codes). A batch is a function of what it was set up with, so a sweep
 * that names its batches (`recordKey`: the latches every lane starts from and each lane's
 * inputs) keeps what a clock batch shows — the lanes it cannot vouch for, the outputs while the
 * inputs are held, the latches after the clock — per netlist, and a later sweep of a batch of
 * the same name reads them instead of running it again (`ClockedLanes`, `HeldLanes`).
 */
import { readOutputs, type PartSim, type Trit } from './compile.js';
import { latchesAtCode } from './part.js';
import { LANES, LaneBatch } from './lanes.js';

/** What the `held` step reads of a lane while its inputs are held. */
export interface HeldLanes {
  /** The outputs of a lane, as part.ts's outputValues reads them. */
  outputs(lane: number): Trit[];
}

/** What the `done` step reads of a lane after its clock. */
export interface ClockedLanes {
  /** Q and Q̄ of every latch of a lane (part.ts's latchesOf layout). */
  latchesOf(lane: number): Uint8Array;
  /** The slave code of a lane. */
  slaveCode(lane: number): string;
}

/** What a sweep does with its start points. */
export interface SweepSteps<T> {
  /** Put start point i into a lane: latches and inputs (control levers released). */
  setUp(b: LaneBatch, lane: number, i: number): void;
  /** Read a lane while its inputs are held, before the moves (e.g. the outputs shown). */
  held?(b: HeldLanes, lane: number, i: number): T;
  /** The moves made from the held state (default: one clock). */
  moves?(b: LaneBatch): void;
  /** Start point i, vouched for by the lanes, after the moves; false stops the sweep. */
  done(i: number, b: ClockedLanes, lane: number, held: T | undefined): boolean | void;
  /** Start point i, which the lanes cannot vouch for: simulate it event-driven; false stops the sweep. */
  slow(i: number): boolean | void;
  /**
   * The name of the batch of start points first … first + n − 1 (`batchKey`), when `setUp`
   * puts every lane of it at the same latches; undefined: not kept. Only one-clock sweeps (no
   * `moves`) are kept.
   */
  recordKey?(first: number, n: number): string | undefined;
}

/** Run start points 0 … count-1 through `steps`, in order; false when a step stopped it. */
export function sweep<T>(sim: PartSim, count: number, steps: SweepSteps<T>, batch = new LaneBatch(sim)): boolean {
  const held: (T | undefined)[] = new Array<T | undefined>(LANES).fill(undefined);
  const records = steps.recordKey && !steps.moves ? recordsOf(sim) : undefined;
  for (let first = 0; first < count; first += LANES) {
    const n = Math.min(LANES, count - first);
    const key = records ? steps.recordKey?.(first, n) : undefined;
    const kept = key === undefined ? undefined : records?.get(key);
    let lanes: ClockedLanes = batch;
    let suspect: number;
    if (kept && records) {
      const r = new RecordedLanes(sim, kept, records.at);
      if (steps.held)
        for (let lane = 0; lane < n; lane++)
          held[lane] = (kept.suspectHeld >>> lane) & 1 ? undefined : steps.held(r, lane, first + lane);
      lanes = r;
      suspect = kept.suspect;
    } else {
      batch.clear();
      for (let lane = 0; lane < n; lane++) steps.setUp(batch, lane, first + lane);
      batch.settleHeld();
      const suspectHeld = batch.suspect;
      const heldWords = records && key !== undefined ? Int32Array.from(records.drivers, (d) => batch.words[d]) : null;
      if (steps.held)
        for (let lane = 0; lane < n; lane++)
          held[lane] = (batch.suspect >>> lane) & 1 ? undefined : steps.held(batch, lane, first + lane);
      if (steps.moves) steps.moves(batch);
      else batch.clock();
      suspect = batch.suspect;
      if (records && key !== undefined && heldWords)
        records.keep(key, { suspectHeld, suspect, held: heldWords, after: latchWords(batch) });
    }
    for (let lane = 0; lane < n; lane++) {
      const i = first + lane;
      const go = (suspect >>> lane) & 1 ? steps.slow(i) : steps.done(i, lanes, lane, held[lane]);
      if (go === false) return false;
    }
  }
  return true;
}

/**
 * The name of a batch whose every lane starts from `latches` (Q and Q̄ per latch, part.ts's
 * latchesOf layout; the control levers released) with the inputs `list[first …]`: what
 * `recordKey` returns.
 */
export function batchKey(latches: ArrayLike<number>, list: readonly string[], first: number, n: number): string {
  let k = '';
  for (let i = 0; i < latches.length; i += 2) k += String.fromCharCode(48 + latches[i] * 3 + latches[i + 1]);
  for (let lane = 0; lane < n; lane++) k += `|${list[first + lane]}`;
  return k;
}

/**
 * `batchKey` of a batch set up by `LaneBatch.setCodes(lane, code, masterCode)` in every lane,
 * which puts the latches where `latchesAtCode` says when the codes reach every latch (a master
 * and a slave per bit, as synthesis builds them); undefined otherwise (not kept).
 */
export function codesBatchKey(
  sim: PartSim,
  code: string,
  masterCode: string,
  list: readonly string[],
  first: number,
  n: number,
): string | undefined {
  const bits = code.length;
  const reach = sim.masters.length === bits && sim.slaves.length === bits && sim.latches.length === 2 * bits;
  return reach ? batchKey(latchesAtCode(sim, code, masterCode), list, first, n) : undefined;
}

/** What is kept of one clock batch. */
interface ClockRecord {
  /** Lanes suspect once the held state was settled (no `held` read for them), and after the clock. */
  readonly suspectHeld: number;
  readonly suspect: number;
  /** The words of the output drivers (`Records.drivers`) while the inputs were held. */
  readonly held: Int32Array;
  /** The words of every latch's two gates after the clock: set, reset, per latch. */
  readonly after: Int32Array;
}

/** Bound on the bytes of clock records kept per netlist. */
const RECORD_BYTES = 1 << 22;

/** The clock records of one netlist. */
class Records {
  /** The drivers the output readers read, each once; `at` gives each one's place. */
  readonly drivers: Int32Array;
  readonly at: ReadonlyMap<number, number>;
  private readonly map = new Map<string, ClockRecord>();
  private bytes = 0;

  constructor(sim: PartSim) {
    const ds: number[] = [];
    for (const r of sim.outputs) {
      if (r.kind === 'flag') ds.push(r.gate);
      else if (r.kind === 'actuator') ds.push(...r.drivers);
    }
    this.drivers = Int32Array.from(new Set(ds));
    this.at = new Map(Array.from(this.drivers, (d, i) => [d, i]));
  }

  get(key: string): ClockRecord | undefined {
    return this.map.get(key);
  }

  /** Keep a record while the bound allows. */
  keep(key: string, r: ClockRecord): void {
    const size = 2 * key.length + 4 * (r.held.length + r.after.length) + 64;
    if (this.bytes + size > RECORD_BYTES) return;
    this.bytes += size;
    this.map.set(key, r);
  }
}

// By the netlist's shape: a batch's values depend on nothing else (no time is kept), so retimed copies share them.
const recordsByNetlist = new WeakMap<Int32Array, Records>();

function recordsOf(sim: PartSim): Records {
  let r = recordsByNetlist.get(sim.inStart);
  if (!r) recordsByNetlist.set(sim.inStart, (r = new Records(sim)));
  return r;
}

function latchWords(b: LaneBatch): Int32Array {
  const latches = b.sim.latches;
  const after = new Int32Array(2 * latches.length);
  for (let li = 0; li < latches.length; li++) {
    after[2 * li] = b.words[latches[li].set];
    after[2 * li + 1] = b.words[latches[li].reset];
  }
  return after;
}

/** A kept clock batch, read as the batch itself is read (LaneBatch's `outputs`, `latchesOf`, `slaveCode`). */
class RecordedLanes implements HeldLanes, ClockedLanes {
  constructor(
    private readonly sim: PartSim,
    private readonly r: ClockRecord,
    private readonly at: ReadonlyMap<number, number>,
  ) {}

  private heldBit(d: number, lane: number): number {
    return (this.r.held[this.at.get(d) ?? -1] >>> lane) & 1;
  }

  outputs(lane: number): Trit[] {
    return readOutputs(this.sim, (d) => this.heldBit(d, lane) as Trit);
  }

  latchesOf(lane: number): Uint8Array {
    const a = this.r.after;
    const out = new Uint8Array(a.length);
    for (let i = 0; i < a.length; i++) out[i] = (a[i] >>> lane) & 1;
    return out;
  }

  slaveCode(lane: number): string {
    let s = '';
    for (const li of this.sim.slaves) s += (this.r.after[2 * li] >>> lane) & 1;
    return s;
  }
}
