/**
 * Counting: every Nth pulse of an input gives an output — a modulo-N counter.
 *
 * A pulse is a clock on which the input is pulled (a marble resting on its lever for one turn
 * of the crank; held over two clocks it counts twice). Two timings:
 *   - `same-clock` (Mealy output): the output is 1 on the clock of the Nth pulse itself;
 *     N states, count_0 … count_(N−1), one per count modulo N;
 *   - `next-clock` (Moore output): the output is 1 for the one clock after the Nth pulse;
 *     N + 1 states (the count of 0 is remembered twice: just reached, showing, and not).
 * An optional clear input starts the count again from 0; it wins over a pulse on the same
 * clock, and that pulse is not counted.
 *
 * Method: the residue counter of the textbooks (the count modulo N as the state).
 * Postconditions: the text reads back through the ordinary reader with no error; its states
 * are minimal (each count needs a different number of pulses to the next output).
 */
import {
  commented,
  FieldReader,
  header,
  nameField,
  noneOf,
  ordinal,
  type Field,
  type FieldValues,
  type Written,
} from './fields.js';

/** The largest N: a count of 32 already takes 5 pairs of latches and a long frame. */
export const COUNT_MAX = 32;

export const COUNTING_FIELDS: readonly Field[] = [
  { key: 'input', kind: 'name', label: 'Pulse input', help: 'the input whose pulses are counted', example: 'marble' },
  {
    key: 'every',
    kind: 'count',
    label: 'Every how many',
    help: `N: every Nth pulse gives the output (2 to ${COUNT_MAX})`,
    example: '3',
    min: 2,
    max: COUNT_MAX,
  },
  { key: 'output', kind: 'name', label: 'Output', help: 'the output the Nth pulse gives', example: 'bell' },
  {
    key: 'clear',
    kind: 'name',
    label: 'Clear input (optional)',
    help: 'an input that starts the count again from 0 (optional)',
    optional: true,
    example: 'clear',
  },
  {
    key: 'timing',
    kind: 'choice',
    label: 'Output shown',
    help: 'same-clock: on the clock of the Nth pulse (Mealy); next-clock: for one clock after it (Moore)',
    example: 'same-clock',
    choices: [
      { value: 'same-clock', label: 'with the Nth pulse' },
      { value: 'next-clock', label: 'the clock after it' },
    ],
  },
  nameField('counter'),
];

type Timing = 'same-clock' | 'next-clock';

/** The machine of "every Nth pulse of an input gives an output". */
export function writeCounting(values: FieldValues): Written {
  const r = new FieldReader('counting', COUNTING_FIELDS, values);
  const input = r.name('input');
  const n = r.count('every');
  const output = r.name('output');
  const clear = r.name('clear');
  const timing = r.choice<Timing>('timing');
  const name = r.machineName('counter');
  if (!r.ok || input === undefined || n === undefined || output === undefined || timing === undefined)
    return { ok: false, diagnostics: r.diagnostics };
  const when = timing === 'same-clock' ? 'on the same clock' : 'for one clock after it';
  const sentence = `Every ${ordinal(n)} pulse of ${input} sets ${output} to 1 ${when}${clear ? `; ${clear} starts the count again` : ''}.`;
  const inputs = clear ? [input, clear] : [input];
  const lines = [
    ...header(sentence, [
      `Written from the behaviour "counting" (every ${n}). A pulse is a clock on which ${input} is pulled; ` +
        `held over two clocks it counts twice. ${timing === 'same-clock' ? `${output} is a Mealy output: 1 while the ${ordinal(n)} pulse is on its lever.` : `${output} is a Moore output: 1 for the clock after the ${ordinal(n)} pulse.`}` +
        (clear ? ` ${clear} wins over a pulse on the same clock; that pulse is not counted.` : ''),
    ]),
    '',
    `machine ${name}`,
    `inputs ${inputs.join(', ')}`,
    `outputs ${output}`,
    'start count_0',
    '',
    ...states(n, input, output, clear, timing),
  ];
  return { ok: true, text: lines.join('\n') + '\n', sentence, diagnostics: [] };
}

function states(n: number, input: string, output: string, clear: string | undefined, timing: Timing): string[] {
  const out: string[] = [];
  const idle = clear ? noneOf([input, clear]) : `!${input}`;
  const pulse = clear ? `${input} & !${clear}` : input;
  for (let k = 0; k < n; k++) {
    const last = k === n - 1;
    const next = last ? (timing === 'same-clock' ? 'count_0' : 'done') : `count_${k + 1}`;
    const remembers =
      k === 0
        ? 'no pulse counted yet (or a whole count of ' + n + ' done)'
        : `${k} ${k === 1 ? 'pulse' : 'pulses'} counted`;
    const body: [string, string][] = [];
    if (clear) body.push([`  when ${clear} go count_0`, 'clear: start again from 0']);
    body.push([
      `  when ${pulse} go ${next}${last && timing === 'same-clock' ? ` with ${output}=1` : ''}`,
      last
        ? `the ${ordinal(n)} pulse: ${output}${timing === 'same-clock' ? ' on this clock' : ' on the next clock'}`
        : `the ${ordinal(k + 1)} pulse`,
    ]);
    body.push([`  when ${idle} go count_${k}`, 'no pulse: keep the count']);
    out.push(...commented([[`state count_${k}`, `remembers: ${remembers}`], ...body]), '');
  }
  if (timing === 'next-clock') {
    const body: [string, string][] = [
      [`state done with ${output}=1`, `remembers: ${n} pulses counted, ${output} showing for this clock`],
    ];
    if (clear) body.push([`  when ${clear} go count_0`, 'clear: start again from 0']);
    body.push([`  when ${pulse} go count_1`, 'the 1st pulse of the next count']);
    body.push([`  when ${idle} go count_0`, 'no pulse: the count starts again']);
    out.push(...commented(body), '');
  }
  return out.slice(0, -1);
}
