/**
 * Hold: an output once an input has been held for K consecutive clocks; a release starts the
 * count again. Optionally a second output shows that a hold is under way but not yet long
 * enough.
 *
 * Both outputs are Moore outputs (read from the state): after the Kth held clock the output
 * is 1, and it stays 1 for as long as the input stays held. States held_0 … held_K, where
 * held_k remembers "the last k clocks all held" (k < K) or "at least K" (k = K): K + 1 states,
 * minimal (held_k needs K − k more held clocks to give the output).
 */
import {
  commented,
  FieldReader,
  header,
  nameField,
  ordinal,
  type Field,
  type FieldValues,
  type Written,
} from './fields.js';

/** The most clocks a hold counts. */
export const HOLD_MAX = 32;

export const HOLD_FIELDS: readonly Field[] = [
  { key: 'input', kind: 'name', label: 'Held input', help: 'the input that must be held', example: 'sensor' },
  {
    key: 'clocks',
    kind: 'count',
    label: 'Clocks held',
    help: `K: how many consecutive clocks it must be held (2 to ${HOLD_MAX})`,
    example: '2',
    min: 2,
    max: HOLD_MAX,
  },
  { key: 'output', kind: 'name', label: 'Output', help: 'the output once held long enough', example: 'unlock' },
  {
    key: 'holding',
    kind: 'name',
    label: 'While-holding output (optional)',
    help: 'an output that shows a hold under way, not yet long enough (optional)',
    optional: true,
    example: 'waiting',
  },
  nameField('hold_timer'),
];

/** The machine of "an output after an input has held for K clocks". */
export function writeHold(values: FieldValues): Written {
  const r = new FieldReader('hold', HOLD_FIELDS, values);
  const input = r.name('input');
  const k = r.count('clocks');
  const output = r.name('output');
  const holding = r.name('holding');
  const name = r.machineName('hold_timer');
  if (!r.ok || input === undefined || k === undefined || output === undefined)
    return { ok: false, diagnostics: r.diagnostics };
  const sentence = `${output} is 1 once ${input} has been held for ${k} clocks in a row${holding ? `, and ${holding} while a hold is under way` : ''}; letting go starts again.`;
  const lines = [
    ...header(sentence, [
      `Written from the behaviour "hold" (${k} clocks). ${output} is a Moore output: 1 from the clock after the ${ordinal(k)} held clock, ` +
        `for as long as ${input} stays held. A clock with ${input} released starts the count again from nothing.` +
        (holding ? ` ${holding} is 1 after ${k === 2 ? '1 held clock' : `1 to ${k - 1} held clocks`}.` : ''),
    ]),
    '',
    `machine ${name}`,
    `inputs ${input}`,
    `outputs ${[output, ...(holding ? [holding] : [])].join(', ')}`,
    'start held_0',
    '',
  ];
  for (let j = 0; j <= k; j++) {
    const shows = j === k ? ` with ${output}=1` : holding && j > 0 ? ` with ${holding}=1` : '';
    const remembers =
      j === 0
        ? `${input} not held on the last clock`
        : j === k
          ? `${input} held for at least ${k} clocks in a row: ${output} shows`
          : `${input} held for the last ${j === 1 ? 'clock' : `${j} clocks`}`;
    const next = Math.min(j + 1, k);
    lines.push(
      ...commented([
        [`state held_${j}${shows}`, `remembers: ${remembers}`],
        [`  when ${input} go held_${next}`, j === k ? 'still held' : `held: the ${ordinal(j + 1)} clock in a row`],
        [`  go held_0`, 'released: start again'],
      ]),
      '',
    );
  }
  return { ok: true, text: lines.slice(0, -1).join('\n') + '\n', sentence, diagnostics: [] };
}
