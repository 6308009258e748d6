/**
 * Cycle: a list of steps, each a set of outputs that show, taken in turn and round again: the
 * lamps of a crossing, the hammers of a chime, the arms of a signal. The machine moves on one
 * step every clock, or only on the clocks when an advance input is pulled; an optional restart
 * input goes back to the first step (it wins over a pull of the advance input on the same clock).
 *
 * Every output is a Moore output: step j's outputs show on the clocks the machine is at step j,
 * from the first clock after reset at step 1. States step_1 … step_k, one per step. A list that
 * repeats itself (red, green, red, green) has fewer distinguishable steps than it has entries:
 * the state minimisation merges the steps one period apart, leaving as many states as the
 * list's smallest period that divides its length (its primitive root's length; M. Lothaire,
 * *Combinatorics on Words*, 1983, ch. 1 — from memory). A restart input keeps the merge: steps
 * one period apart show the same and move to steps one period apart.
 *
 * A step is written as the outputs that show joined by `+` (`red+amber`), or `0` for a step
 * where none shows; steps are separated by commas or spaces.
 */
import { diag, printable } from '../model/diagnostics.js';
import { commented, FieldReader, header, nameField, type Field, type FieldValues, type Written } from './fields.js';

/** The most steps a cycle takes. */
export const CYCLE_MAX = 16;
/** The most outputs a cycle drives. */
export const CYCLE_OUTPUTS_MAX = 6;

export const CYCLE_FIELDS: readonly Field[] = [
  {
    key: 'outputs',
    kind: 'names',
    label: 'Outputs',
    help: `the outputs the steps show (1 to ${CYCLE_OUTPUTS_MAX})`,
    example: 'red,amber,green',
    min: 1,
    max: CYCLE_OUTPUTS_MAX,
  },
  {
    key: 'steps',
    kind: 'steps',
    label: 'Steps in turn',
    help: `each step the outputs that show, joined by + (0: none), in turn (2 to ${CYCLE_MAX} steps)`,
    example: 'red,red+amber,green,amber',
    min: 2,
    max: CYCLE_MAX,
  },
  {
    key: 'advance',
    kind: 'name',
    label: 'Advance input (optional)',
    help: 'an input whose pull moves on one step (optional: without it, every clock moves on)',
    optional: true,
    example: 'crank_cam',
  },
  {
    key: 'restart',
    kind: 'name',
    label: 'Restart input (optional)',
    help: 'an input that goes back to the first step (optional)',
    optional: true,
    example: 'restart',
  },
  nameField('cycle'),
];

/** The outputs that show at a step, in words. */
const shown = (step: readonly string[]): string =>
  step.length === 0 ? 'nothing shows' : `${step.join(' and ')} ${step.length === 1 ? 'shows' : 'show'}`;

/** Read the steps: each a list of outputs among `outputs`, or [] for `0`. */
function readSteps(r: FieldReader, outputs: readonly string[]): string[][] | undefined {
  const raw = r.words('steps');
  if (raw === undefined) return undefined;
  const steps: string[][] = [];
  for (const word of raw) {
    if (word === '0') {
      steps.push([]);
      continue;
    }
    const names = word.split('+');
    const stray = names.find((n) => !outputs.includes(n));
    if (stray !== undefined) {
      r.report(
        diag(
          'LW805',
          `cycle: the step '${printable(word)}' shows '${printable(stray)}', which is not among --outputs`,
          { path: 'cycle.steps' },
          stray === ''
            ? 'join the outputs of a step with + and nothing else; write 0 for a step where none shows'
            : `add ${printable(stray)} to --outputs, or write the step with the outputs listed there`,
        ),
      );
      return undefined;
    }
    const twice = names.find((n, i) => names.indexOf(n) !== i);
    if (twice !== undefined) {
      r.report(
        diag(
          'LW803',
          `cycle: the step '${printable(word)}' names '${twice}' twice`,
          { path: 'cycle.steps' },
          'name it once',
        ),
      );
      return undefined;
    }
    // The outputs of a step in the order --outputs lists them, so equal steps read alike.
    steps.push(outputs.filter((o) => names.includes(o)));
  }
  if (!r.countOf('steps', steps.length)) return undefined;
  // An output no step shows, or every step shows, never moves: its flag would be a fixture.
  const still = outputs.find((o) => steps.every((s) => s.includes(o)) || !steps.some((s) => s.includes(o)));
  if (still !== undefined) {
    const always = steps.some((s) => s.includes(still));
    r.report(
      diag(
        'LW805',
        `cycle: '${still}' shows at ${always ? 'every' : 'no'} step, so it never moves`,
        { path: 'cycle.steps' },
        `show ${still} at some steps and not at others, or leave it out of --outputs`,
      ),
    );
    return undefined;
  }
  return steps;
}

/** The machine of "a list of steps taken in turn, round and round". */
export function writeCycle(values: FieldValues): Written {
  const r = new FieldReader('cycle', CYCLE_FIELDS, values);
  const outputs = r.names('outputs');
  const counted = outputs !== undefined && r.countOf('outputs', outputs.length);
  if (outputs !== undefined) r.claimAll('outputs', outputs);
  const steps = outputs === undefined || !counted ? undefined : readSteps(r, outputs);
  const advance = r.name('advance');
  const restart = r.name('restart');
  const name = r.machineName('cycle');
  if (!r.ok || outputs === undefined || steps === undefined) return { ok: false, diagnostics: r.diagnostics };
  const k = steps.length;
  const moves = advance === undefined ? 'every clock' : `each clock ${advance} is pulled`;
  const written = steps.map((s) => (s.length === 0 ? '0' : s.join('+'))).join(', ');
  const sentence = `${k} steps in turn, round and round (${written}), one step ${moves}${restart ? `; ${restart} goes back to the first` : ''}.`;
  const inputs = [...(advance ? [advance] : []), ...(restart ? [restart] : [])];
  const lines = [
    ...header(sentence, [
      `Written from the behaviour "cycle". The steps: ${steps.map((s, j) => `${j + 1}. ${shown(s)}`).join('; ')}. ` +
        `Every output is a Moore output: a step's outputs show on the clocks the machine is at that step, step 1 on the first clock after reset.` +
        (restart
          ? ` A clock with ${restart} pulled goes back to step 1${advance ? `, whatever ${advance} does` : ''}.`
          : ''),
    ]),
    '',
    `machine ${name}`,
    ...(inputs.length > 0 ? [`inputs ${inputs.join(', ')}`] : []),
    `outputs ${outputs.join(', ')}`,
    'start step_1',
    '',
  ];
  for (let j = 0; j < k; j++) {
    const next = `step_${((j + 1) % k) + 1}`;
    const shows = steps[j].length === 0 ? '' : ` with ${steps[j].map((o) => `${o}=1`).join(', ')}`;
    const rows: [string, string][] = [
      [`state step_${j + 1}${shows}`, `remembers: step ${j + 1} of ${k}: ${shown(steps[j])}`],
    ];
    if (restart) rows.push([`  when ${restart} go step_1`, 'back to the first step']);
    if (advance) {
      rows.push([`  when ${advance} go ${next}`, 'move on']);
      rows.push([`  go step_${j + 1}`, `${advance} not pulled: stay`]);
    } else rows.push([`  go ${next}`, 'move on']);
    lines.push(...commented(rows), '');
  }
  return { ok: true, text: lines.slice(0, -1).join('\n') + '\n', sentence, diagnostics: [] };
}
