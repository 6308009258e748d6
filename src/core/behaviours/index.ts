/**
 * Behaviours: machines written from a sentence and a few parameters ("ring the bell on every
 * third marble", "open the flap after red, green, red"), in the text form, commented state by
 * state with what each remembers. The text then goes through the ordinary reader and pipeline.
 *
 * One registry lists them (name, label, summary, fields); `BEHAVIOUR_WRITERS[name]` writes one.
 * The command line's `write` command, the designer's behaviour panel and docs/behaviours.md
 * read the registry. Adding a behaviour is one module plus one entry and one line here.
 */
import { diag, didYouMean } from '../model/diagnostics.js';
import { COLLECT_FIELDS, writeCollect } from './collect.js';
import { COUNTING_FIELDS, writeCounting } from './counting.js';
import { CYCLE_FIELDS, writeCycle } from './cycle.js';
import { DELAY_FIELDS, writeDelay } from './delay.js';
import type { Field, FieldValues, Written } from './fields.js';
import { HOLD_FIELDS, writeHold } from './hold.js';
import { SEQUENCE_FIELDS, writeSequence } from './sequence.js';
import { TOGGLE_FIELDS, writeToggle } from './toggle.js';

export type { Field, FieldKind, FieldValues, Written } from './fields.js';
export { COLLECT_MAX } from './collect.js';
export { COUNT_MAX } from './counting.js';
export { CYCLE_MAX, CYCLE_OUTPUTS_MAX } from './cycle.js';
export { DELAY_MAX } from './delay.js';
export { HOLD_MAX } from './hold.js';
export { failureFunction, nextPrefix, ORDER_MAX, PRESS_INPUTS_MAX } from './sequence.js';

export type BehaviourName = 'counting' | 'sequence' | 'hold' | 'toggle' | 'collect' | 'cycle' | 'delay';

export interface BehaviourEntry {
  readonly name: BehaviourName;
  /** Short words for the designer's picker. */
  readonly label: string;
  /** One line: what it does. */
  readonly summary: string;
  readonly fields: readonly Field[];
}

/** Every behaviour, in the order the tool offers them. */
export const BEHAVIOURS: readonly BehaviourEntry[] = [
  {
    name: 'counting',
    label: 'Every Nth pulse',
    summary: 'every Nth pulse of an input gives an output (on that clock, or for one clock after)',
    fields: COUNTING_FIELDS,
  },
  {
    name: 'sequence',
    label: 'Presses in order',
    summary: 'a given order of presses opens an output; a wrong press falls back as far as it must',
    fields: SEQUENCE_FIELDS,
  },
  {
    name: 'hold',
    label: 'Held for K clocks',
    summary: 'an output once an input has been held for K clocks in a row; letting go starts again',
    fields: HOLD_FIELDS,
  },
  {
    name: 'toggle',
    label: 'Press to flip',
    summary: 'each press of an input flips an output; a press held down flips it once',
    fields: TOGGLE_FIELDS,
  },
  {
    name: 'collect',
    label: 'All seen, any order',
    summary: 'an output once each of several inputs has been pulled, in any order',
    fields: COLLECT_FIELDS,
  },
  {
    name: 'cycle',
    label: 'Steps in turn',
    summary:
      'a list of steps (the outputs that show at each) taken in turn, round and round, every clock or on each pull of an input',
    fields: CYCLE_FIELDS,
  },
  {
    name: 'delay',
    label: 'K clocks later',
    summary: 'an output that repeats an input K clocks later',
    fields: DELAY_FIELDS,
  },
];

/** What writes each behaviour's machine. */
export const BEHAVIOUR_WRITERS: Readonly<Record<BehaviourName, (values: FieldValues) => Written>> = {
  counting: writeCounting,
  sequence: writeSequence,
  hold: writeHold,
  toggle: writeToggle,
  collect: writeCollect,
  cycle: writeCycle,
  delay: writeDelay,
};

/** The registry's entry of a behaviour named by the user, or undefined. */
export function behaviourNamed(name: string): BehaviourEntry | undefined {
  return BEHAVIOURS.find((b) => b.name === name);
}

/** Write the machine of a behaviour given by name: an unknown name is LW804, bad values their codes. */
export function writeBehaviour(name: string, values: FieldValues): Written {
  const entry = behaviourNamed(name);
  if (!entry) {
    const names = BEHAVIOURS.map((b) => b.name);
    const guess = didYouMean(name, names);
    return {
      ok: false,
      diagnostics: [
        diag(
          'LW804',
          `'${name}' is not a behaviour the tool writes`,
          { path: 'behaviour' },
          `${guess ? `did you mean ${guess}? ` : ''}behaviours: ${names.join(', ')}`,
        ),
      ],
    };
  }
  return BEHAVIOUR_WRITERS[entry.name](values);
}
