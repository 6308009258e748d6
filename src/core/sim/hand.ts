/**
 * Hand actions — what a person at the levers does — and the two-phase hand procedure of
 * DESIGN §5: per clock, set the inputs, pull φ1, release it, pull φ2, release it; reset is
 * pull the reset lever, release it. Also the three operating rules the procedure keeps and
 * how to tell whether an action breaks one.
 */
import { nameRecord, ownValue } from '../model/records.js';

/** The clock and reset levers, by role. */
export type ControlLever = 'phi1' | 'phi2' | 'reset';

/** One hand action: put an input lever at a value (1 = pulled), or pull or release a control lever. */
export type HandAction =
  | { readonly kind: 'input'; readonly input: string; readonly value: 0 | 1 }
  | { readonly kind: 'pull' | 'release'; readonly lever: ControlLever };

/** Input lever values by input name; a missing name means released (0). */
export type InputValues = Readonly<Record<string, 0 | 1>>;

/** The operating rules a person at the levers keeps (DESIGN §5). */
export type OperatingRule = 'clocks-apart' | 'inputs-steady' | 'reset-alone';

/** Each rule in words, for signage and reports. */
export const RULE_WORDS: Readonly<Record<OperatingRule, string>> = {
  'clocks-apart': 'φ1 and φ2 are never pulled together',
  'inputs-steady': 'input levers stay still while φ1 is pulled',
  'reset-alone': 'reset is pulled only with both clock levers released',
};

export const OPERATING_RULES: readonly OperatingRule[] = ['clocks-apart', 'inputs-steady', 'reset-alone'];

/** Positions of the control levers (true = pulled). */
export interface ControlPositions {
  readonly phi1: boolean;
  readonly phi2: boolean;
  readonly reset: boolean;
}

/** The rule an action breaks when taken with the control levers where they are, or null. */
export function ruleBroken(a: HandAction, at: ControlPositions): OperatingRule | null {
  if (a.kind === 'input') return at.phi1 ? 'inputs-steady' : null;
  if (a.kind === 'release') return null;
  if (a.lever === 'reset') return at.phi1 || at.phi2 ? 'reset-alone' : null;
  const other = a.lever === 'phi1' ? at.phi2 : at.phi1;
  if (other) return 'clocks-apart';
  return at.reset ? 'reset-alone' : null;
}

const LEVER_WORDS: Readonly<Record<ControlLever, string>> = { phi1: 'φ1', phi2: 'φ2', reset: 'reset' };

/** One action in words: "pull φ1", "pull input lever 'coin'", "release input lever 'coin'". */
export function describeAction(a: HandAction): string {
  if (a.kind === 'input') return `${a.value === 1 ? 'pull' : 'release'} input lever '${a.input}'`;
  return `${a.kind} ${LEVER_WORDS[a.lever]}`;
}

/** The reset procedure: pull the reset lever, release it. */
export function resetActions(): HandAction[] {
  return [
    { kind: 'pull', lever: 'reset' },
    { kind: 'release', lever: 'reset' },
  ];
}

/** The four clock-lever actions of one clock: pull φ1, release, pull φ2, release. */
export function phaseActions(): HandAction[] {
  return [
    { kind: 'pull', lever: 'phi1' },
    { kind: 'release', lever: 'phi1' },
    { kind: 'pull', lever: 'phi2' },
    { kind: 'release', lever: 'phi2' },
  ];
}

/**
 * One clock of the hand procedure: set each input lever (in the given input order; only the
 * ones that move when `current` is given), then the four phase actions.
 */
export function clockActions(inputs: readonly string[], values: InputValues, current?: InputValues): HandAction[] {
  const set: HandAction[] = [];
  for (const name of inputs) {
    const v = ownValue(values, name) ?? 0;
    if (current === undefined || (ownValue(current, name) ?? 0) !== v)
      set.push({ kind: 'input', input: name, value: v });
  }
  return [...set, ...phaseActions()];
}

/** Input values from a '0'/'1' assignment string in the machine's input order. */
export function valuesOf(inputs: readonly string[], assignment: string): Record<string, 0 | 1> {
  const out = nameRecord<0 | 1>();
  inputs.forEach((name, i) => (out[name] = assignment[i] === '1' ? 1 : 0));
  return out;
}

/** The '0'/'1' assignment string of input values, in the machine's input order. */
export function assignmentOf(inputs: readonly string[], values: InputValues): string {
  return inputs.map((n) => (values[n] === 1 ? '1' : '0')).join('');
}

/** A hand-action trace as numbered lines in words. */
export function describeTrace(actions: readonly HandAction[]): string[] {
  return actions.map((a, i) => `${i + 1}. ${describeAction(a)}`);
}
