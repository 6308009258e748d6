/**
 * What the runner (runner.ts) keeps of its steps: each clock's two readings as the values of a
 * few drivers, put in words only when read (`LazyClockRecord`), and the log of steps that undo
 * replays (`StepLog`), in typed arrays.
 */
import { X } from './compile.js';
import { describeAction, type HandAction, type InputValues } from './hand.js';
import { readPart, type PartEvent, type PartReading, type PartSim } from './part.js';

/** What one clock did: the outputs shown while its inputs were held (before φ1), and the code before and after. */
export interface ClockRecord {
  readonly inputs: InputValues;
  readonly before: PartReading;
  readonly outputs: Readonly<Record<string, string>>;
  readonly after: PartReading;
  readonly alarms: readonly PartEvent[];
}

/** The drivers a reading looks at: levers, latch gates and the drivers of the outputs. */
export function readingDrivers(sim: PartSim): Int32Array {
  const ds = new Set<number>();
  for (let d = 0; d < sim.leverCount; d++) ds.add(d);
  for (const l of sim.latches) ds.add(l.set).add(l.reset);
  for (const r of sim.outputs) {
    if (r.kind === 'flag') ds.add(r.gate);
    if (r.kind === 'actuator') for (const d of r.drivers) ds.add(d);
  }
  return Int32Array.from([...ds].sort((a, b) => a - b));
}

/** Two readings of one clock (inputs held, then after φ2), kept as the values of a few drivers each; put in words when read. */
export class LazyClockRecord implements ClockRecord {
  private held: PartReading | undefined;
  private done: PartReading | undefined;
  constructor(
    readonly inputs: InputValues,
    private readonly sim: PartSim,
    private readonly drivers: Int32Array,
    /** From `at`: the drivers' values while the inputs were held, then after the clock. */
    private readonly kept: Uint8Array,
    private readonly at: number,
    private readonly heldUs: number,
    private readonly doneUs: number,
    readonly alarms: readonly PartEvent[],
  ) {}
  get before(): PartReading {
    return (this.held ??= this.read(this.at, this.heldUs));
  }
  get outputs(): Readonly<Record<string, string>> {
    return this.before.outputs;
  }
  get after(): PartReading {
    return (this.done ??= this.read(this.at + this.drivers.length, this.doneUs));
  }
  private read(from: number, timeUs: number): PartReading {
    const values = new Uint8Array(this.sim.driverCount).fill(X);
    for (let i = 0; i < this.drivers.length; i++) values[this.drivers[i]] = this.kept[from + i];
    return readPart(this.sim, { values, timeUs });
  }
}

/** Kinds of logged steps; a clock's payload is its input levers (a bit per input, or a '0'/'1' string past 30 inputs). */
export const ACT = 0;
export const CLOCK = 1;
export const RESET = 2;

/**
 * The log of steps, kept in typed arrays (a clock costs two numbers, nothing for the garbage
 * collector to walk): the kind of each step and, for a clock with up to 30 inputs, its input
 * levers as bits; an action or a wider clock's levers sit in a side table by step.
 */
export class StepLog {
  private kinds = new Uint8Array(256);
  private bits = new Int32Array(256);
  private readonly others = new Map<number, HandAction | string>();
  length = 0;

  push(kind: number, payload: HandAction | number | string | null): void {
    if (this.length === this.kinds.length) {
      const kinds = new Uint8Array(2 * this.length);
      kinds.set(this.kinds);
      const bits = new Int32Array(2 * this.length);
      bits.set(this.bits);
      this.kinds = kinds;
      this.bits = bits;
    }
    this.kinds[this.length] = kind;
    if (typeof payload === 'number') this.bits[this.length] = payload;
    else if (payload !== null) this.others.set(this.length, payload);
    this.length++;
  }

  pop(): void {
    this.length--;
    this.others.delete(this.length);
  }

  kind(i: number): number {
    return this.kinds[i];
  }

  payload(i: number): HandAction | number | string | null {
    return this.others.get(i) ?? (this.kinds[i] === CLOCK ? this.bits[i] : null);
  }

  /** The steps in words, oldest first. */
  labels(): string[] {
    const out: string[] = [];
    for (let i = 0; i < this.length; i++) {
      const k = this.kinds[i];
      out.push(k === CLOCK ? 'clock' : k === RESET ? 'reset' : describeAction(this.others.get(i) as HandAction));
    }
    return out;
  }
}
