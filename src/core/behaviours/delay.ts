/**
 * Delay: an output that repeats an input K clocks later, as a marble that trips a lever reaches
 * the far end of a track a few turns of the crank after it passed the start: "lift the flap two
 * turns after the marble passes". Every pull of the input shows, however close together.
 *
 * The output is a Moore output: on each clock it shows whether the input was pulled K clocks
 * before (not pulled before the first clock after reset). The machine remembers the input of the
 * last K clocks: a shift register of K bits, 2^K states, and none can be merged — the outputs of
 * the next K clocks read the K bits back one by one, so any two states differ on one of them
 * (the K-bit shift register as the finite-memory machine of memory K; Z. Kohavi, *Switching and
 * Finite Automata Theory*, 2nd ed., 1978, ch. 15 — from memory).
 *
 * State `was_b₁…b_K` names the input's last K clocks, the most recent first: `was_10` (K = 2)
 * remembers pulled on the last clock, not on the one before.
 */
import { commented, FieldReader, header, nameField, type Field, type FieldValues, type Written } from './fields.js';

/** The most clocks a delay waits: 2^K states. */
export const DELAY_MAX = 4;

export const DELAY_FIELDS: readonly Field[] = [
  {
    key: 'input',
    kind: 'name',
    label: 'Input',
    help: 'the input whose pulls the output repeats',
    example: 'marble',
  },
  {
    key: 'clocks',
    kind: 'count',
    label: 'Clocks later',
    help: `K: how many clocks later the output repeats it (1 to ${DELAY_MAX})`,
    example: '2',
    min: 1,
    max: DELAY_MAX,
  },
  { key: 'output', kind: 'name', label: 'Output', help: 'the output that repeats the input', example: 'flap' },
  nameField('delay'),
];

/** The history a state remembers, in words: the most recent clock first. */
function history(bits: string, input: string): string {
  const said = [...bits].map((b, i) => {
    const when = i === 0 ? 'on the last clock' : i === 1 ? 'on the one before' : `${i + 1} clocks back`;
    return `${b === '1' ? 'pulled' : 'not pulled'} ${when}`;
  });
  return `${input} ${said.join(', ')}`;
}

/** The machine of "the output repeats the input K clocks later". */
export function writeDelay(values: FieldValues): Written {
  const r = new FieldReader('delay', DELAY_FIELDS, values);
  const input = r.name('input');
  const k = r.count('clocks');
  const output = r.name('output');
  const name = r.machineName('delay');
  if (!r.ok || input === undefined || k === undefined || output === undefined)
    return { ok: false, diagnostics: r.diagnostics };
  const later = k === 1 ? 'one clock later' : `${k} clocks later`;
  const sentence = `${output} repeats ${input} ${later}.`;
  const codes = Array.from({ length: 2 ** k }, (_, v) => v.toString(2).padStart(k, '0'));
  const start = '0'.repeat(k);
  const lines = [
    ...header(sentence, [
      `Written from the behaviour "delay" (${k} ${k === 1 ? 'clock' : 'clocks'}). ${output} is a Moore output: on each clock it is 1 ` +
        `when ${input} was pulled ${k === 1 ? 'on the clock before' : `${k} clocks before`}; before that many clocks have passed ` +
        `since reset it is 0. The states remember ${input} on the last ${k === 1 ? 'clock' : `${k} clocks`}, the most recent first.`,
    ]),
    '',
    `machine ${name}`,
    `inputs ${input}`,
    `outputs ${output}`,
    `start was_${start}`,
    '',
  ];
  for (const bits of [start, ...codes.filter((c) => c !== start)]) {
    const shows = bits[k - 1] === '1' ? ` with ${output}=1` : '';
    const kept = bits.slice(0, k - 1);
    lines.push(
      ...commented([
        [`state was_${bits}${shows}`, `remembers: ${history(bits, input)}`],
        [`  when ${input} go was_1${kept}`, 'pulled'],
        [`  go was_0${kept}`, 'not pulled'],
      ]),
      '',
    );
  }
  return { ok: true, text: lines.slice(0, -1).join('\n') + '\n', sentence, diagnostics: [] };
}
