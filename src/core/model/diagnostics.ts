/**
 * Diagnostics: every problem a user can cause has a stable code, a severity, a message that
 * names the offending thing, a location (text line/column and/or JSON path) and a hint.
 * The table below is the single source of the codes; docs/notation.md is generated from it.
 */
import type { SourceLoc } from './machine.js';
import { MESSAGE_MAX, printable } from './printable.js';

export { didYouMean } from './did-you-mean.js';
export { ECHO_MAX, printable, shorten } from './printable.js';

export type Severity = 'error' | 'warning' | 'info';

export interface Diagnostic {
  readonly code: DiagnosticCode;
  readonly severity: Severity;
  readonly message: string;
  readonly location: SourceLoc;
  readonly hint?: string;
}

interface CodeInfo {
  readonly severity: Severity;
  /** What causes it, for the notation reference. */
  readonly cause: string;
  /** How to fix it, for the notation reference. */
  readonly fix: string;
}

/**
 * Stable codes. Numbers group by area: LW1xx syntax, LW2xx names and references,
 * LW3xx behaviour, LW4xx limits, LW5xx interop, LW6xx technology profile, LW7xx build options, LW8xx behaviours.
 * Never renumber; retire a code by leaving it here marked as retired.
 */
export const DIAGNOSTIC_CODES = {
  LW100: {
    severity: 'error',
    cause: 'The file is not valid JSON, or not an object where an object is needed.',
    fix: 'Check brackets, commas and quotes at the reported position.',
  },
  LW101: {
    severity: 'error',
    cause: 'A line of the text form is not a statement the notation knows.',
    fix: 'Compare the line with the notation reference; check for a missing keyword (state, when, go, with).',
  },
  LW102: {
    severity: 'error',
    cause: 'A guard or never expression has a syntax error.',
    fix: 'Use input names, !, &, ^, |, parentheses, 0 and 1.',
  },
  LW103: {
    severity: 'error',
    cause: 'A field has the wrong type or an unknown value.',
    fix: 'See the JSON Schema in schemas/machine.schema.json.',
  },
  LW104: {
    severity: 'error',
    cause: 'A required field or section is missing.',
    fix: 'Add the field the message names.',
  },
  LW105: {
    severity: 'warning',
    cause: 'A field the form does not know was ignored.',
    fix: 'Remove it or correct its spelling.',
  },
  LW106: {
    severity: 'error',
    cause: 'An output value is not 0, 1 or -, or one list gives an output two values.',
    fix: "Write 0, 1 or - (don't care), once per output.",
  },
  LW107: {
    severity: 'error',
    cause:
      'An output load is not a mass above 0 with its unit (text form: load NAME 300 g, or 0.3 kg; JSON form: "loadsG", a number of grams above 0), or an output is given two loads.',
    fix: 'Write the mass the output lifts with its unit, for example load sluice 300 g; give each output one load.',
  },
  LW108: {
    severity: 'error',
    cause:
      'A number in a JSON file (a machine, an xstate configuration, a profile or an input sequence) is too large to hold (such as 1e309): JSON readers turn it into infinity.',
    fix: 'Write a number of ordinary size.',
  },
  LW109: {
    severity: 'error',
    cause:
      'A JSON object names the same key twice: a JSON reader keeps only one of the two (RFC 8259 leaves duplicate names to the reader), so the other would be lost without a word.',
    fix: 'Keep one of the two, or merge them.',
  },
  LW200: {
    severity: 'error',
    cause: 'A transition goes to a state that does not exist.',
    fix: 'Correct the state name, or declare the state.',
  },
  LW201: {
    severity: 'error',
    cause: 'An expression names an input that is not declared.',
    fix: 'Declare the input, or correct its name.',
  },
  LW202: {
    severity: 'error',
    cause: 'An output value names an output that is not declared.',
    fix: 'Declare the output, or correct its name.',
  },
  LW203: {
    severity: 'error',
    cause: 'Two states, inputs or outputs share a name, or a name is used for two kinds of thing.',
    fix: 'Rename one of them.',
  },
  LW204: {
    severity: 'error',
    cause: 'The start state is missing or names no state.',
    fix: 'Name an existing state as the start.',
  },
  LW205: {
    severity: 'error',
    cause: 'A name is not a valid identifier.',
    fix: 'Use letters, digits and _ ; start with a letter or _.',
  },
  LW206: {
    severity: 'error',
    cause: "A pinned state code has the wrong length, bad characters, or repeats another state's code.",
    fix: 'Give every pinned code the same number of 0/1 digits, all different.',
  },
  LW207: {
    severity: 'warning',
    cause:
      'A pinned state code names a state the built machine does not have (misspelt, or merged with an equivalent state by state minimisation); the pin is ignored.',
    fix: 'Pin the state it was merged into, or correct the name.',
  },
  LW208: {
    severity: 'error',
    cause: 'A step input sequence names an input the machine does not have.',
    fix: "Use the machine's input names; a missing input counts as released (0).",
  },
  LW300: { severity: 'error', cause: 'The machine has no states.', fix: 'Declare at least one state.' },
  LW301: {
    severity: 'warning',
    cause:
      'A transition can never fire: earlier transitions of the state (or never constraints) already cover its guard.',
    fix: 'Remove it, reorder the transitions, or narrow the earlier guards.',
  },
  LW302: {
    severity: 'info',
    cause: "Some input combinations have no transition in a state; the unspecified rule applies (hold, or don't care).",
    fix: 'Nothing to do if that is intended; otherwise add transitions.',
  },
  LW303: {
    severity: 'warning',
    cause: 'A state cannot be reached from the start state.',
    fix: 'Add a transition into it, or remove it; it is dropped from the build.',
  },
  LW304: { severity: 'warning', cause: 'A guard is never true (it is the constant 0).', fix: 'Check the expression.' },
  LW305: {
    severity: 'warning',
    cause: 'The never constraints exclude every input combination.',
    fix: 'Check the never expressions.',
  },
  LW306: {
    severity: 'warning',
    cause:
      'A reachable state has no way out: no transition leads to another state, so once there the machine stays until the reset lever is pulled.',
    fix: 'Add a transition out of it, or mark it final (text form: state NAME final; JSON form: "final": true) if the machine is meant to stop there.',
  },
  LW307: {
    severity: 'warning',
    cause: 'An output is never 1 (or never 0) in any reachable state or transition: its flag or actuator never moves.',
    fix: 'Set it where it should change (with NAME=1 on a state or transition), or remove the output.',
  },
  LW400: {
    severity: 'error',
    cause: 'The machine has more states than the tool handles (4096).',
    fix: 'Split the machine.',
  },
  LW401: {
    severity: 'error',
    cause: 'The machine has more inputs than the tool handles (32).',
    fix: 'Split the machine or combine inputs.',
  },
  LW402: {
    severity: 'error',
    cause: 'The machine has more outputs than the tool handles (256).',
    fix: 'Split the machine.',
  },
  LW403: {
    severity: 'error',
    cause: 'A guard expands into too many product terms to handle.',
    fix: 'Simplify the guard or split the transition.',
  },
  LW404: {
    severity: 'error',
    cause: 'A guard or never expression nests parentheses and ! deeper than the tool reads (256 levels).',
    fix: 'Write the expression flatter: drop doubled ! and parentheses that group nothing.',
  },
  LW405: {
    severity: 'error',
    cause: 'A name (of the machine, a state, an input or an output) is longer than the tool takes (128 characters).',
    fix: 'Shorten the name.',
  },
  LW406: {
    severity: 'error',
    cause:
      'A JSON file (a machine, an xstate configuration, a profile or an input sequence) nests objects and lists deeper than the tool reads (64 levels); none of them needs more than a few.',
    fix: 'Check the brackets near the reported position.',
  },
  LW407: {
    severity: 'error',
    cause:
      'The machine has more states after state minimisation than a build handles (256): its synthesis would run for minutes. Checking it (latchwright check) still works.',
    fix: 'Split the machine into smaller ones that drive each other, or merge states that behave alike.',
  },
  LW500: {
    severity: 'error',
    cause:
      'The xstate configuration uses a feature a lever machine cannot have (parallel or nested states, history, delays, code guards or actions).',
    fix: 'Flatten the machine; replace code with events and states.',
  },
  LW501: {
    severity: 'error',
    cause: 'The xstate configuration is malformed.',
    fix: "Check the configuration against xstate's documentation.",
  },
  LW502: {
    severity: 'error',
    cause: 'The input is neither the text form, the JSON form nor an xstate configuration.',
    fix: 'Check the file; JSON machines need "states" and "start", xstate configs need "initial" and "states".',
  },
  LW600: {
    severity: 'error',
    cause: 'A technology profile value is out of its allowed range.',
    fix: "See the profile reference for the field's range.",
  },
  LW601: {
    severity: 'error',
    cause: 'A technology profile names a field that does not exist.',
    fix: 'Correct the field name.',
  },
  LW602: {
    severity: 'warning',
    cause:
      'A technology profile value lies outside its plausible range: it is allowed, but is most likely a slip of units (millimetres given as metres, kilograms given as grams, milliseconds given as seconds).',
    fix: 'Check the unit in the field name (G grams, M metres, S seconds); the hint names the likely slip and the value meant.',
  },
  LW603: {
    severity: 'error',
    cause:
      'A cordRouting entry of the technology profile names a cord the build does not have, so its routing would be ignored.',
    fix: 'Use a cord id of this build (netlist.json or the wiring list lists them, e.g. c.clk.phi1); the hint names the closest.',
  },
  LW700: {
    severity: 'error',
    cause:
      'The command line is not usable: an unknown command or option, a missing value or file, a value out of range (encoding name, seed, unused-code target), or interactive stepping away from a terminal.',
    fix: 'See `latchwright --help`.',
  },
  LW701: {
    severity: 'error',
    cause:
      'The chosen encoding does not fit the machine (for example Johnson codes for a machine whose states do not form a cycle, or pinned codes for too few bits).',
    fix: 'Choose another encoding.',
  },
  LW703: {
    severity: 'info',
    cause:
      "With unused state codes left as don't-cares the build could lock up in them, so every unused code was sent to the start state.",
    fix: 'Nothing to do; pass --unused dont-care to keep them free, or --unused STATE to choose the state.',
  },
  LW702: {
    severity: 'error',
    cause: 'The output folder exists, is not empty, and was not made by the tool.',
    fix: 'Choose another folder or pass --force.',
  },
  LW704: {
    severity: 'error',
    cause: 'The output folder could not be written: no permission, no space, or a file where the folder should be.',
    fix: 'Check the path and its permissions, or choose another folder.',
  },
  LW705: {
    severity: 'error',
    cause:
      'A file named on the command line (the machine, the profile or the input sequence) could not be read: it does not exist, is a folder, or may not be read.',
    fix: 'Check the path; name a file, not a folder.',
  },
  LW706: {
    severity: 'warning',
    cause:
      'After writing the build documents, a folder the tool left beside the output folder (an earlier build moved aside, or the temporary folder of an interrupted run) could not be removed.',
    fix: 'The new documents are in place; remove the folder the message names by hand.',
  },
  LW707: {
    severity: 'error',
    cause:
      'A pin (--pin PART=BAY) names a part the build does not have, a part that takes no bay of its own (a flag), a bay or drum the frame cannot have, or a bay another pin already holds.',
    fix: 'Pin a gate, latch, lever or actuator by its id (netlist.json lists them) to a bay counted from 1, on a drum the frame carries.',
  },
  LW708: {
    severity: 'warning',
    cause:
      'A pin could not be kept in this build: its drum has fewer bays than the pin asks for, or the pins on one drum cannot all be met together. The pin is dropped and the part placed freely.',
    fix: 'Pin it to a bay the drum has (the frame drawing numbers them), or move one of the pins by a bay.',
  },
  LW800: {
    severity: 'error',
    cause:
      'A count given to a behaviour (every N, clocks held K, the length of an order, the number of levers) is not a whole number within its range.',
    fix: 'Give a whole number in the range the message names (docs/behaviours.md lists each).',
  },
  LW801: {
    severity: 'error',
    cause: 'A name given to a behaviour (an input, an output or the machine) is not a name the notation takes.',
    fix: 'Use letters, digits and _ , starting with a letter or _ (the machine name may also use -).',
  },
  LW802: {
    severity: 'error',
    cause:
      'A behaviour is missing a parameter it needs (an input, an output, a count or the order of presses), or it was left empty.',
    fix: 'Give the parameter the message names; the hint shows an example.',
  },
  LW803: {
    severity: 'error',
    cause:
      'A behaviour is given one name for two roles (the same lever as the counted input and the clear input, an output named like an input), or a list names one lever twice.',
    fix: 'Give each lever and each output its own name, once.',
  },
  LW804: {
    severity: 'error',
    cause: 'A behaviour, or a choice of one of its parameters, is not one the tool knows.',
    fix: 'Write one of the words the hint lists (latchwright write --help lists them all).',
  },
  LW805: {
    severity: 'error',
    cause:
      "A behaviour's list does not fit the names it was given: the order of a sequence presses a lever that is not among its levers, or a step of a cycle shows an output not among its outputs, or an output that shows at no step or at every step (it would never move).",
    fix: 'Add the name to the list of levers or outputs (a sequence may leave its list out: it then holds the levers the order names), or show each output at some steps and not at others.',
  },
  LW900: {
    severity: 'error',
    cause: 'A fault of the tool itself, not of the input: an internal check failed or the tool ran out of stack.',
    fix: 'Please report it, with the machine file and the command line that caused it.',
  },
} as const satisfies Record<string, CodeInfo>;

export type DiagnosticCode = keyof typeof DIAGNOSTIC_CODES;

/**
 * Make a diagnostic with the code's default severity. The message, the hint and the location
 * are made printable (model/printable.ts): whatever of the input they echo, no control
 * character reaches a terminal and no message runs past a few lines.
 */
export function diag(
  code: DiagnosticCode,
  message: string,
  location: SourceLoc,
  hint?: string,
  severity?: Severity,
): Diagnostic {
  return printableDiagnostic({
    code,
    severity: severity ?? DIAGNOSTIC_CODES[code].severity,
    message,
    location,
    ...(hint ? { hint } : {}),
  });
}

/** The same diagnostic with its message, hint, file and path made printable (itself when they are). */
export function printableDiagnostic(d: Diagnostic): Diagnostic {
  const message = printable(d.message, MESSAGE_MAX);
  const hint = d.hint === undefined ? undefined : printable(d.hint, MESSAGE_MAX);
  const l = d.location;
  const file = l.file === undefined ? undefined : printable(l.file, MESSAGE_MAX);
  const path = l.path === undefined ? undefined : printable(l.path, MESSAGE_MAX);
  if (message === d.message && hint === d.hint && file === l.file && path === l.path) return d;
  return {
    ...d,
    message,
    ...(hint !== undefined ? { hint } : {}),
    location: { ...l, ...(file !== undefined ? { file } : {}), ...(path !== undefined ? { path } : {}) },
  };
}

export function hasErrors(ds: readonly Diagnostic[]): boolean {
  return ds.some((d) => d.severity === 'error');
}

/** `file:line:col`, then the JSON path when there is one (`file:3:7 $.states[0].to`), for printing. */
export function formatLocation(l: SourceLoc): string {
  const file = l.file === undefined ? undefined : printable(l.file, MESSAGE_MAX);
  const path = l.path === undefined ? undefined : printable(l.path, MESSAGE_MAX);
  if (l.line !== undefined) return `${file ?? '<input>'}:${l.line}:${l.column ?? 1}${path ? ` ${path}` : ''}`;
  if (path !== undefined) return `${file ? file + ' ' : ''}${path}`;
  return file ?? '<input>';
}

/** One line per diagnostic: `where: severity CODE: message — hint`. */
export function formatDiagnostic(d: Diagnostic): string {
  const p = printableDiagnostic(d);
  return `${formatLocation(p.location)}: ${p.severity} ${p.code}: ${p.message}${p.hint ? ` — ${p.hint}` : ''}`;
}

/** A user-caused failure carried as diagnostics (never a stack trace at the shells). */
export class DiagnosticError extends Error {
  constructor(readonly diagnostics: readonly Diagnostic[]) {
    super(diagnostics.map(formatDiagnostic).join('\n'));
    this.name = 'DiagnosticError';
  }
}
