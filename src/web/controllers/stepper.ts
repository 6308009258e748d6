/**
 * The lever stepper's state: a part-level runner over the current build (src/core/sim), the
 * steps taken (each a hand action or a whole clock, undone as one), a sample of every lever,
 * latch and flag after every hand action (the timing chart's data), and the alarms in words.
 *
 * A clock counts however it is done: the whole-clock button, or by hand — pull φ1, release
 * it, pull φ2, release it (the hand procedure of src/core/sim/hand.ts). Every alarm names the
 * clock it happened in and the hand action that raised it. Input levers set to a combination
 * the machine declares `never` are flagged at once.
 */
import type { ReactiveController, ReactiveControllerHost } from 'lit';
import {
  type Build,
  type ControlLever,
  createRunner,
  type Guard,
  type HandAction,
  type PartEvent,
  type PartReading,
  type PartRunner,
  phaseActions,
  type Profile,
  resetActions,
  timingOf,
} from '../../core/index.js';

/** One column of the timing chart: the machine after a hand action. */
export interface Sample {
  readonly action: string;
  /** Clocks completed when this sample was taken. */
  readonly clock: number;
  readonly reading: PartReading;
}

/** An alarm in words: the clock it happened in, the hand action that raised it, and what went wrong. */
export interface Alarm {
  /** The step that raised it (undo takes it back with the step). */
  readonly step: number;
  /** The clock in progress (1 = the first clock after reset or power-up). */
  readonly clock: number;
  /** The hand action, in words: "pulling φ2 while φ1 is pulled". */
  readonly moment: string;
  readonly kind: PartEvent['kind'] | 'never';
  readonly words: string;
  readonly latch?: string;
}

/** Where a clock done by hand stands: nothing yet, φ1 pulled, φ1 pulled and released, φ2 pulled. */
type HandPhase = 'idle' | 'phi1' | 'computed' | 'phi2';

interface Step {
  readonly label: string;
  readonly acts: number;
  readonly clocksBefore: number;
  readonly phaseBefore: HandPhase;
}

/** A combination of inputs the machine declares impossible, as written. */
export interface Impossible {
  readonly guard: string;
  readonly line?: number;
}

/** The clock procedure after one more hand action, and whether that action finished a clock. */
export function nextPhase(phase: HandPhase, a: HandAction): { phase: HandPhase; clocked: boolean } {
  if (a.kind === 'input') return { phase, clocked: false };
  if (a.lever === 'reset') return { phase: 'idle', clocked: false };
  if (a.lever === 'phi1')
    return { phase: a.kind === 'pull' ? 'phi1' : phase === 'phi1' ? 'computed' : 'idle', clocked: false };
  if (a.kind === 'pull') return { phase: phase === 'computed' ? 'phi2' : 'idle', clocked: false };
  return { phase: 'idle', clocked: phase === 'phi2' };
}

const LEVER_WORDS: Readonly<Record<ControlLever, string>> = { phi1: 'φ1', phi2: 'φ2', reset: 'reset' };

/** A hand action in words, with the clock levers already pulled when it was taken. */
export function momentWords(a: HandAction, before: PartReading | undefined): string {
  const held = [before?.phi1 ? 'φ1' : '', before?.phi2 ? 'φ2' : ''].filter(
    (l) => l !== '' && (a.kind === 'input' || LEVER_WORDS[a.lever] !== l),
  );
  const verb =
    a.kind === 'input'
      ? `setting ${a.input}=${a.value}`
      : `${a.kind === 'pull' ? 'pulling' : 'releasing'} ${LEVER_WORDS[a.lever]}`;
  return held.length === 0 ? verb : `${verb} while ${held.join(' and ')} ${held.length === 1 ? 'is' : 'are'} pulled`;
}

/** True when a cube (positional '0'/'1'/'-') holds for an assignment of '0'/'1' digits. */
const holds = (cube: string, values: string): boolean => [...cube].every((c, i) => c === '-' || c === values[i]);

export class StepperController implements ReactiveController {
  runner: PartRunner | undefined;
  samples: Sample[] = [];
  alarms: Alarm[] = [];
  clocks = 0;
  /** The input levers now stand at a combination the machine declares `never`. */
  impossible: Impossible | undefined;
  private phase: HandPhase = 'idle';
  private steps: Step[] = [];
  private build: Build | undefined;
  private never: readonly Guard[] = [];

  constructor(private readonly host: ReactiveControllerHost) {
    host.addController(this);
  }

  hostConnected(): void {}

  /** Follow a new build: a fresh machine, reset to its start state. `never` is the machine's list as written. */
  follow(build: Build | undefined, profile: Profile | undefined, never: readonly Guard[] = []): void {
    if (build === this.build) return;
    this.build = build;
    this.never = never;
    this.samples = [];
    this.alarms = [];
    this.steps = [];
    this.clocks = 0;
    this.phase = 'idle';
    this.impossible = undefined;
    this.runner = build && profile ? createRunner(build, timingOf(profile)) : undefined;
    this.reading = this.runner?.reading();
    if (this.runner) {
      this.samples.push({ action: 'power up', clock: 0, reading: this.runner.reading() });
      this.reset();
    }
    this.host.requestUpdate();
  }

  /** The machine as it stands (read again after every step). */
  reading: PartReading | undefined;

  /** Move an input lever (1 = pulled). */
  setInput(input: string, value: 0 | 1): void {
    this.run(`${value ? 'pull' : 'release'} ${input}`, [{ kind: 'input', input, value }]);
  }

  /** Pull a released clock lever, or release a pulled one. */
  toggle(lever: Exclude<ControlLever, 'reset'>): void {
    const r = this.runner?.reading();
    if (!r) return;
    const pulled = lever === 'phi1' ? r.phi1 : r.phi2;
    this.run(`${pulled ? 'release' : 'pull'} ${LEVER_WORDS[lever]}`, [{ kind: pulled ? 'release' : 'pull', lever }]);
  }

  /** A whole clock with the input levers where they are: pull φ1, release, pull φ2, release. */
  clock(): void {
    this.run('clock', phaseActions());
  }

  reset(): void {
    this.run('reset', resetActions());
  }

  /** Take back the last step (a whole clock counts as one). */
  undo(): boolean {
    const s = this.steps.pop();
    if (!s || !this.runner) return false;
    for (let i = 0; i < s.acts; i++) this.runner.undo();
    this.samples = this.samples.slice(0, this.samples.length - s.acts);
    const n = this.steps.length;
    this.alarms = this.alarms.filter((a) => a.step < n);
    this.clocks = s.clocksBefore;
    this.phase = s.phaseBefore;
    this.reading = this.runner.reading();
    this.impossible = this.impossibleNow(this.reading);
    this.host.requestUpdate();
    return true;
  }

  get canUndo(): boolean {
    return this.steps.length > 0;
  }

  /** Replay a sequence of hand actions (e.g. the shortest way of breaking a rule), from reset. */
  replay(actions: readonly HandAction[], label: string): void {
    if (!this.runner) return;
    this.reset();
    this.run(label, actions);
  }

  /**
   * The stepper's keys: 1 φ1, 2 φ2, c (or Enter) a whole clock, r reset, u (or Ctrl+Z) undo,
   * Shift+1…9 the input levers in order. True when the key was the stepper's.
   */
  key(e: KeyboardEvent): boolean {
    const r = this.runner?.reading();
    if (!r || e.altKey || e.metaKey) return false;
    const inputs = this.build?.machine.inputs ?? [];
    const digit = /^Digit([1-9])$/.exec(e.code);
    if (e.shiftKey && digit) {
      const name = inputs[Number(digit[1]) - 1];
      if (name === undefined) return false;
      this.setInput(name, r.inputs[name] === 1 ? 0 : 1);
      return true;
    }
    if (e.ctrlKey) {
      if (e.key.toLowerCase() !== 'z') return false;
      this.undo();
      return true;
    }
    if (e.shiftKey) return false;
    const act: Readonly<Record<string, () => unknown>> = {
      '1': () => this.toggle('phi1'),
      '2': () => this.toggle('phi2'),
      c: () => this.clock(),
      Enter: () => this.clock(),
      r: () => this.reset(),
      u: () => this.undo(),
    };
    const f = act[e.key];
    if (!f) return false;
    f();
    return true;
  }

  /** The `never` line the input levers now match, if any. */
  private impossibleNow(r: PartReading | undefined): Impossible | undefined {
    const inputs = this.build?.machine.inputs ?? [];
    if (!r || this.never.length === 0) return undefined;
    const values = inputs.map((n) => (r.inputs[n] === 1 ? '1' : '0')).join('');
    const g = this.never.find((n) => n.cubes.some((c) => holds(c, values)));
    return g ? { guard: g.text, ...(g.loc?.line !== undefined ? { line: g.loc.line } : {}) } : undefined;
  }

  private run(label: string, actions: readonly HandAction[]): void {
    const r = this.runner;
    if (!r) return;
    const step = this.steps.length;
    this.steps.push({ label, acts: actions.length, clocksBefore: this.clocks, phaseBefore: this.phase });
    for (const a of actions) {
      const before = r.reading();
      const events = r.act(a);
      const reading = r.reading();
      const clock = this.clocks + 1;
      const moment = momentWords(a, before);
      for (const e of events)
        this.alarms.push({ step, clock, moment, kind: e.kind, words: e.words, ...(e.latch ? { latch: e.latch } : {}) });
      const next = nextPhase(this.phase, a);
      this.phase = next.phase;
      if (next.clocked) this.clocks++;
      if (a.kind === 'input') this.flagImpossible(reading, step, clock, moment);
      this.samples.push({ action: describe(a), clock: this.clocks, reading });
    }
    this.reading = r.reading();
    this.impossible = this.impossibleNow(this.reading);
    // New arrays, so the elements drawing them see a change.
    this.samples = [...this.samples];
    this.alarms = [...this.alarms];
    this.host.requestUpdate();
  }

  /** An input lever moved into a combination the machine declares impossible: say so in the alarms. */
  private flagImpossible(reading: PartReading, step: number, clock: number, moment: string): void {
    const was = this.impossible;
    const now = this.impossibleNow(reading);
    this.impossible = now;
    if (!now || was?.guard === now.guard) return;
    const inputs = (this.build?.machine.inputs ?? []).map((n) => `${n}=${reading.inputs[n] ?? 0}`).join(' ');
    this.alarms.push({
      step,
      clock,
      moment,
      kind: 'never',
      words: `the inputs ${inputs} are declared impossible (never ${now.guard}${now.line !== undefined ? `, line ${now.line}` : ''}): the build may go to any state from here; its latches stay safe`,
    });
  }
}

function describe(a: HandAction): string {
  if (a.kind === 'input') return `${a.input}=${a.value}`;
  return `${a.kind === 'pull' ? '↓' : '↑'}${LEVER_WORDS[a.lever]}`;
}
