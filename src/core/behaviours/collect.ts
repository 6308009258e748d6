/**
 * Collect: an output once every one of several inputs has been pulled at least once, in any
 * order, on any clocks (several on one clock count together) — "both the red and the blue
 * marble have come down". An optional clear input starts again with none seen; without one,
 * the output stays until the reset lever.
 *
 * The output is a Moore output, from the clock after the last one is seen. The states are the
 * subsets of the inputs seen so far: 2^k states for k inputs, minimal (two different subsets S
 * and S′ differ in some input x; pulling every input but x once completes the one that holds x
 * and not the other).
 */
import { commented, FieldReader, header, nameField, type Field, type FieldValues, type Written } from './fields.js';

/** The most inputs a collect machine takes: 4 (16 states). */
export const COLLECT_MAX = 4;

export const COLLECT_FIELDS: readonly Field[] = [
  {
    key: 'inputs',
    kind: 'names',
    label: 'Inputs to see',
    help: `the inputs that must each be pulled at least once, in any order (2 to ${COLLECT_MAX})`,
    example: 'red_marble, blue_marble',
    min: 2,
    max: COLLECT_MAX,
  },
  { key: 'output', kind: 'name', label: 'Output', help: 'the output once every one has been seen', example: 'gate' },
  {
    key: 'clear',
    kind: 'name',
    label: 'Clear input (optional)',
    help: 'an input that starts again with none seen (optional; without it, the reset lever)',
    optional: true,
    example: 'clear',
  },
  nameField('collector'),
];

/** The machine of "an output once every one of these inputs has been pulled". */
export function writeCollect(values: FieldValues): Written {
  const r = new FieldReader('collect', COLLECT_FIELDS, values);
  const inputs = r.names('inputs');
  if (inputs) r.claimAll('inputs', inputs);
  const output = r.name('output');
  const clear = r.name('clear');
  const name = r.machineName('collector');
  if (inputs && (inputs.length < 2 || inputs.length > COLLECT_MAX)) r.countOf('inputs', inputs.length);
  if (!r.ok || inputs === undefined || output === undefined) return { ok: false, diagnostics: r.diagnostics };
  const sentence = `${output} is 1 once each of ${inputs.join(', ')} has been pulled, in any order${clear ? `, until ${clear} is pulled` : ''}.`;
  const lines = [
    ...header(sentence, [
      `Written from the behaviour "collect". Each of ${inputs.join(', ')} counts once it has been pulled on any clock, ` +
        `several on one clock together. ${output} is a Moore output, 1 from the clock after the last one is seen, ` +
        (clear ? `until ${clear} starts again with none seen.` : 'until the reset lever is pulled.'),
    ]),
    '',
    `machine ${name}`,
    `inputs ${[...inputs, ...(clear ? [clear] : [])].join(', ')}`,
    `outputs ${output}`,
    `start ${stateName(inputs, 0)}`,
    '',
  ];
  const full = (1 << inputs.length) - 1;
  for (let s = 0; s <= full; s++) lines.push(...stateLines(inputs, s, output, clear), '');
  return { ok: true, text: lines.slice(0, -1).join('\n') + '\n', sentence, diagnostics: [] };
}

const members = (inputs: readonly string[], s: number): string[] => inputs.filter((_, i) => (s >> i) & 1);

/** `none_seen`, `all_seen`, or the names seen (their bits when the names are long). */
function stateName(inputs: readonly string[], s: number): string {
  const full = (1 << inputs.length) - 1;
  if (s === 0) return 'none_seen';
  if (s === full) return 'all_seen';
  const seen = members(inputs, s).join('_');
  return seen.length <= 100 ? `seen_${seen}` : `seen_${s.toString(2).padStart(inputs.length, '0')}`;
}

function stateLines(inputs: readonly string[], s: number, output: string, clear: string | undefined): string[] {
  const full = (1 << inputs.length) - 1;
  const seen = members(inputs, s);
  const missing = inputs.filter((x) => !seen.includes(x));
  const title = `state ${stateName(inputs, s)}${s === full && !clear ? ' final' : ''}${s === full ? ` with ${output}=1` : ''}`;
  const body: [string, string][] = [
    [
      title,
      `remembers: ${s === 0 ? 'none seen yet' : s === full ? `every one seen: ${output} shows` : `seen ${seen.join(', ')}; not yet ${missing.join(', ')}`}`,
    ],
  ];
  if (clear) body.push([`  when ${clear} go ${stateName(inputs, 0)}`, `${clear}: start again with none seen`]);
  // Every non-empty set of the missing inputs pulled together: they are seen at once.
  for (let t = full; t > 0; t--) {
    if ((t & s) !== 0) continue; // only inputs not yet seen
    const now = members(inputs, t);
    const guard = missing.map((x) => (now.includes(x) ? x : `!${x}`)).join(' & ');
    body.push([`  when ${guard} go ${stateName(inputs, s | t)}`, `seen now: ${now.join(', ')}`]);
  }
  body.push([
    `  go ${stateName(inputs, s)}`,
    s === full ? `stays until ${clear ?? 'the reset lever'}` : 'nothing new seen',
  ]);
  return commented(body);
}
