/**
 * The lever stepper's state: a part-level runner over the current build (src/core/sim), the
 * steps taken (each a hand action or a whole clock, undone as one), a sample of every lever,
 * latch and flag after every hand action (the timing chart's data), and the alarms in words.
 */
import type { ReactiveController, ReactiveControllerHost } from 'lit';
import {
  type Build,
  type ControlLever,
  createRunner,
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

/** An alarm in words, with the step that raised it. */
export interface Alarm {
  readonly step: number;
  readonly kind: PartEvent['kind'];
  readonly words: string;
  readonly latch?: string;
}

interface Step {
  readonly label: string;
  readonly acts: number;
  readonly clocked: boolean;
}

export class StepperController implements ReactiveController {
  runner: PartRunner | undefined;
  samples: Sample[] = [];
  alarms: Alarm[] = [];
  clocks = 0;
  private steps: Step[] = [];
  private build: Build | undefined;

  constructor(private readonly host: ReactiveControllerHost) {
    host.addController(this);
  }

  hostConnected(): void {}

  /** Follow a new build: a fresh machine, reset to its start state. */
  follow(build: Build | undefined, profile: Profile | undefined): void {
    if (build === this.build) return;
    this.build = build;
    this.samples = [];
    this.alarms = [];
    this.steps = [];
    this.clocks = 0;
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
    this.run(`${pulled ? 'release' : 'pull'} ${lever === 'phi1' ? 'φ1' : 'φ2'}`, [
      { kind: pulled ? 'release' : 'pull', lever },
    ]);
  }

  /** A whole clock with the input levers where they are: pull φ1, release, pull φ2, release. */
  clock(): void {
    this.run('clock', phaseActions(), true);
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
    if (s.clocked) this.clocks--;
    this.reading = this.runner.reading();
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
    switch (e.key) {
      case '1':
        this.toggle('phi1');
        return true;
      case '2':
        this.toggle('phi2');
        return true;
      case 'c':
      case 'Enter':
        this.clock();
        return true;
      case 'r':
        this.reset();
        return true;
      case 'u':
        this.undo();
        return true;
      default:
        return false;
    }
  }

  private run(label: string, actions: readonly HandAction[], clocked = false): void {
    const r = this.runner;
    if (!r) return;
    const step = this.steps.length;
    for (const a of actions) {
      const events = r.act(a);
      const reading = r.reading();
      for (const e of events)
        this.alarms.push({ step, kind: e.kind, words: e.words, ...(e.latch ? { latch: e.latch } : {}) });
      this.samples.push({
        action: describe(a),
        clock: this.clocks + (clocked && a === actions[actions.length - 1] ? 1 : 0),
        reading,
      });
    }
    if (clocked) this.clocks++;
    this.steps.push({ label, acts: actions.length, clocked });
    this.reading = r.reading();
    // New arrays, so the elements drawing them see a change.
    this.samples = [...this.samples];
    this.alarms = [...this.alarms];
    this.host.requestUpdate();
  }
}

function describe(a: HandAction): string {
  if (a.kind === 'input') return `${a.input}=${a.value}`;
  const lever = a.lever === 'phi1' ? 'φ1' : a.lever === 'phi2' ? 'φ2' : 'reset';
  return `${a.kind === 'pull' ? '↓' : '↑'}${lever}`;
}
