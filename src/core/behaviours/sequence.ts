/**
 * Sequence: a given order of presses opens an output (a combination lock of levers).
 *
 * A press is one input pulled alone on a clock (held over two clocks it is pressed twice);
 * a clock with nothing pulled is ignored; two or more pulled at once is a wrong press that
 * matches nothing of the order, and so goes back to the start. After a wrong press:
 *   - `overlap` (default): the machine falls back exactly as far as the string-matching
 *     automaton does: to the longest end of the presses so far that begins the order. The
 *     states are the prefixes of the order, 0 … m pressed, and the transition from q on a
 *     press a is the automaton's δ(q, a), computed from the Knuth–Morris–Pratt failure
 *     function (D. E. Knuth, J. H. Morris, V. R. Pratt, "Fast pattern matching in strings",
 *     SIAM J. Comput. 6(2), 1977; Cormen, Leiserson, Rivest, Stein, "Introduction to
 *     Algorithms", §32.3 "String matching with finite automata" and §32.4). So red, red,
 *     green, red opens a lock whose order is red, green, red.
 *   - `strict`: any wrong press goes all the way back to the start, and is not counted as the
 *     first press of a new try.
 * Once the order is complete the output opens (a Moore output, from the clock after the last
 * press): `one-clock` shows it for that clock only, the next press (or idle clock) going on as
 * the automaton says; `until-closed` holds it until the close input is pulled (or, with no
 * close input, until the reset lever). A close input, when given, starts afresh from any state.
 *
 * Postconditions: m + 1 states for an order of m presses, minimal (CLRS §32.3: state q is the
 * longest prefix of the order that ends the presses so far).
 */
import { diag } from '../model/diagnostics.js';
import {
  alone,
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

/** The longest order: 16 presses (17 states) keeps a build within a few seconds. */
export const ORDER_MAX = 16;
/** The most levers a sequence takes. */
export const PRESS_INPUTS_MAX = 8;

export const SEQUENCE_FIELDS: readonly Field[] = [
  {
    key: 'inputs',
    kind: 'names',
    label: 'Levers (optional)',
    help: `the levers a visitor can press, decoys included (default: those the order names; at most ${PRESS_INPUTS_MAX})`,
    optional: true,
    example: 'red, green, blue',
  },
  {
    key: 'order',
    kind: 'names',
    label: 'Order of presses',
    help: `the presses that open, in order (1 to ${ORDER_MAX})`,
    example: 'red, green, red',
    min: 1,
    max: ORDER_MAX,
  },
  { key: 'output', kind: 'name', label: 'Output', help: 'the output the right order opens', example: 'flap' },
  {
    key: 'fallback',
    kind: 'choice',
    label: 'After a wrong press',
    help: 'overlap: fall back only as far as needed (Knuth–Morris–Pratt); strict: back to the start',
    example: 'overlap',
    choices: [
      { value: 'overlap', label: 'keep what still fits' },
      { value: 'strict', label: 'start again' },
    ],
  },
  {
    key: 'open',
    kind: 'choice',
    label: 'Once open',
    help: 'one-clock: open for one clock; until-closed: open until the close input (or the reset lever)',
    example: 'one-clock',
    choices: [
      { value: 'one-clock', label: 'open for one clock' },
      { value: 'until-closed', label: 'stay open until closed' },
    ],
  },
  {
    key: 'close',
    kind: 'name',
    label: 'Close input (optional)',
    help: 'an input that closes the output and starts afresh (optional)',
    optional: true,
    example: 'close',
  },
  nameField('sequence_lock'),
];

type Fallback = 'overlap' | 'strict';
type Open = 'one-clock' | 'until-closed';

/**
 * The Knuth–Morris–Pratt failure function: π[q] is the length of the longest proper prefix of
 * `order` that is also a suffix of its first q presses (CLRS §32.4, COMPUTE-PREFIX-FUNCTION).
 */
export function failureFunction(order: readonly string[]): number[] {
  const pi = new Array<number>(order.length + 1).fill(0);
  let k = 0;
  for (let q = 1; q < order.length; q++) {
    while (k > 0 && order[k] !== order[q]) k = pi[k];
    if (order[k] === order[q]) k++;
    pi[q + 1] = k;
  }
  return pi;
}

/** δ(q, a): the state after press `a` in state q (0 ≤ q ≤ m), by the fallback rule. */
export function nextPrefix(
  order: readonly string[],
  pi: readonly number[],
  q: number,
  a: string,
  fallback: Fallback,
): number {
  if (fallback === 'strict')
    return q < order.length && order[q] === a ? q + 1 : order[0] === a && q === order.length ? 1 : 0;
  let k = q === order.length ? pi[q] : q;
  while (k > 0 && order[k] !== a) k = pi[k];
  return order[k] === a ? k + 1 : 0;
}

/** The machine of "this order of presses opens an output". */
export function writeSequence(values: FieldValues): Written {
  const r = new FieldReader('sequence', SEQUENCE_FIELDS, values);
  const given = r.names('inputs');
  const order = r.names('order', true);
  const output = r.name('output');
  const close = r.name('close');
  const fallback = r.choice<Fallback>('fallback');
  const open = r.choice<Open>('open');
  const name = r.machineName('sequence_lock');
  if (given === undefined || order === undefined || output === undefined || !fallback || !open)
    return { ok: false, diagnostics: r.diagnostics };
  const inputs = given.length > 0 ? given : [...new Set(order)];
  checkSizes(r, order, inputs, given.length > 0);
  r.claimAll('inputs', inputs);
  if (!r.ok) return { ok: false, diagnostics: r.diagnostics };
  const opens = open === 'one-clock' ? 'for one clock' : close ? `until ${close} is pulled` : 'until the reset lever';
  const sentence = `Pressing ${order.join(', ')} in that order opens ${output} ${opens}${fallback === 'strict' ? '; any wrong press starts again from nothing' : ''}.`;
  const words =
    `Written from the behaviour "sequence". A press is one lever pulled alone on a clock (held over two clocks it is pressed twice); ` +
    `a clock with nothing pulled is ignored; two or more at once is a wrong press and goes back to the start. ` +
    (fallback === 'overlap'
      ? 'After a wrong press the machine keeps the longest end of the presses so far that begins the order (the Knuth–Morris–Pratt string-matching automaton).'
      : 'Any wrong press goes back to the start and is not counted as the first press of a new try.') +
    ` ${output} is a Moore output: it opens on the clock after the last press.` +
    (close ? ` ${close} closes it and starts afresh from any state.` : '');
  const lines = [
    ...header(sentence, [words]),
    '',
    `machine ${name}`,
    `inputs ${[...inputs, ...(close ? [close] : [])].join(', ')}`,
    `outputs ${output}`,
    'start ready',
    '',
    ...states({ order, inputs, output, close, fallback, open }),
  ];
  return { ok: true, text: lines.join('\n') + '\n', sentence, diagnostics: [] };
}

function checkSizes(r: FieldReader, order: readonly string[], inputs: readonly string[], listed: boolean): void {
  if (order.length > ORDER_MAX)
    r.report(
      diag(
        'LW800',
        `sequence: the order has ${order.length} presses, more than ${ORDER_MAX}`,
        { path: 'sequence.order' },
        `give at most ${ORDER_MAX} presses`,
      ),
    );
  if (inputs.length > PRESS_INPUTS_MAX)
    r.report(
      diag(
        'LW800',
        `sequence: ${inputs.length} levers, more than ${PRESS_INPUTS_MAX}`,
        { path: 'sequence.inputs' },
        `give at most ${PRESS_INPUTS_MAX} levers`,
      ),
    );
  const stray = listed ? order.find((x) => !inputs.includes(x)) : undefined;
  if (stray !== undefined)
    r.report(
      diag(
        'LW805',
        `sequence: the order presses '${stray}', which is not among --inputs`,
        { path: 'sequence.order' },
        `add ${stray} to --inputs, or leave --inputs out`,
      ),
    );
}

interface Plan {
  readonly order: readonly string[];
  readonly inputs: readonly string[];
  readonly output: string;
  readonly close: string | undefined;
  readonly fallback: Fallback;
  readonly open: Open;
}

const stateName = (q: number, m: number): string => (q === 0 ? 'ready' : q === m ? 'open' : `had_${q}`);

function remembers(p: Plan, q: number): string {
  const m = p.order.length;
  if (q === 0) return 'nothing of the order pressed yet';
  if (q === m) return `the whole order pressed: ${p.output} open`;
  const pressed = p.order.slice(0, q).join(', ');
  if (p.fallback === 'strict') return `this try has pressed ${pressed} (${q} of ${m})`;
  return `the last ${q === 1 ? 'press was' : `${q} presses were`} ${pressed} (${q} of ${m})`;
}

function pressWords(p: Plan, q: number, to: number, a: string): string {
  const m = p.order.length;
  if (q < m && to === q + 1)
    return to === m ? `${a}: the order is complete` : `${a}: the ${ordinal(to)} press of the order`;
  if (to === 0) return `${a}: a wrong press, nothing of the order left`;
  return `${a}: ${q === m ? 'the' : 'a wrong press, but the'} last ${to === 1 ? 'press begins' : `${to} presses begin`} the order`;
}

function states(p: Plan): string[] {
  const m = p.order.length;
  const pi = failureFunction(p.order);
  const out: string[] = [];
  for (let q = 0; q <= m; q++) {
    const self = stateName(q, m);
    const held = q === m && p.open === 'until-closed';
    const title = `state ${self}${held && !p.close ? ' final' : ''}${q === m ? ` with ${p.output}=1` : ''}`;
    const body: [string, string][] = [[title, `remembers: ${remembers(p, q)}`]];
    if (p.close) body.push([`  when ${p.close} go ready`, `${p.close}: close and start afresh`]);
    if (held) body.push([`  go ${self}`, `stays open until ${p.close ?? 'the reset lever is pulled'}`]);
    else {
      const idle = q === m ? (p.fallback === 'overlap' ? pi[m] : 0) : q;
      body.push([
        `  when ${noneOf(p.inputs)} go ${stateName(idle, m)}`,
        q === m ? 'no press: open for this clock only' : 'no press: an idle clock is ignored',
      ]);
      for (const a of p.inputs) {
        const to = nextPrefix(p.order, pi, q, a, p.fallback);
        body.push([`  when ${alone(a, p.inputs)} go ${stateName(to, m)}`, pressWords(p, q, to, a)]);
      }
      if (p.inputs.length > 1) body.push(['  go ready', 'two or more levers at once: a wrong press']);
    }
    out.push(...commented(body), '');
  }
  return out.slice(0, -1);
}
