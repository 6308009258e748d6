/**
 * Toggle: each press of an input flips an output. A press is the input's rise (pulled on this
 * clock, released on the clock before, or pulled on the first clock after reset); a press held
 * over many clocks flips once: edge, not level.
 *
 * The output is a Moore output, flipped from the clock after the press. The machine remembers
 * the output and the input's level on the last clock: four states, minimal (off_up and off_down
 * both show 0, but a pull flips the one and not the other).
 */
import { commented, FieldReader, header, nameField, type Field, type FieldValues, type Written } from './fields.js';

export const TOGGLE_FIELDS: readonly Field[] = [
  {
    key: 'input',
    kind: 'name',
    label: 'Press input',
    help: 'the input whose presses flip the output',
    example: 'button',
  },
  { key: 'output', kind: 'name', label: 'Output', help: 'the output each press flips', example: 'lamp' },
  nameField('toggle'),
];

/** The machine of "each press of an input flips an output". */
export function writeToggle(values: FieldValues): Written {
  const r = new FieldReader('toggle', TOGGLE_FIELDS, values);
  const input = r.name('input');
  const output = r.name('output');
  const name = r.machineName('toggle');
  if (!r.ok || input === undefined || output === undefined) return { ok: false, diagnostics: r.diagnostics };
  const sentence = `Each press of ${input} flips ${output}; a press held down flips it once.`;
  const lines = [
    ...header(sentence, [
      `Written from the behaviour "toggle". A press is a clock on which ${input} is pulled after a clock on which it was not ` +
        `(or the first clock after reset); holding it flips ${output} once. ${output} is a Moore output: it flips on the clock after the press.`,
    ]),
    '',
    `machine ${name}`,
    `inputs ${input}`,
    `outputs ${output}`,
    'start off_up',
    '',
    ...commented([
      ['state off_up', `remembers: ${output} off, ${input} not pulled on the last clock`],
      [`  when ${input} go on_down`, 'a press: flip on'],
      ['  go off_up', 'no press'],
    ]),
    '',
    ...commented([
      [`state on_down with ${output}=1`, `remembers: ${output} on, ${input} still pulled since the press`],
      [`  when ${input} go on_down`, 'still held: no new press'],
      ['  go on_up', 'released'],
    ]),
    '',
    ...commented([
      [`state on_up with ${output}=1`, `remembers: ${output} on, ${input} not pulled on the last clock`],
      [`  when ${input} go off_down`, 'a press: flip off'],
      ['  go on_up', 'no press'],
    ]),
    '',
    ...commented([
      ['state off_down', `remembers: ${output} off, ${input} still pulled since the press`],
      [`  when ${input} go off_down`, 'still held: no new press'],
      ['  go off_up', 'released'],
    ]),
  ];
  return { ok: true, text: lines.join('\n') + '\n', sentence, diagnostics: [] };
}
