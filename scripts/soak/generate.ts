/**
 * Machines the way people write them, for the campaign: 1–5 inputs, 1–4 outputs, 1–14
 * states; guards with `!`, `&`, `|`, `^`, parentheses and constants; overlapping guards,
 * missing `when`, Moore and Mealy outputs with "-"; `hold` and `dont-care`; `never`;
 * unreachable and equivalent states; a start state anywhere; pinned codes now and then.
 * Each machine comes in the JSON form and in a text form printed here from the notation
 * reference (docs/notation.md), with comments, spacing and statement orders varied.
 */
import type { Rng } from './random.js';
import type { SpecJson } from './reference.js';

type Bit = 0 | 1 | '-';
type Mutable<T> = { -readonly [K in keyof T]: Mutable<T[K]> };
type State = Mutable<SpecJson['states'][number]>;

/** Names a person might choose, some of them words of the notation itself. */
const INPUTS = [
  'a',
  'b',
  'coin',
  'go',
  'with',
  'lid',
  'x_1',
  'when',
  'code',
  'final',
  'push',
  '_k',
  'load',
  'start',
  'hold',
];
const OUTPUTS = ['bell', 'lamp', 'flap', 'Q', 'out_2', 'never', 'state', 'gate', 'inputs', 'machine', 'unspecified'];
const STATES = [
  'idle',
  's1',
  'go',
  '010',
  'with',
  'open_2',
  'wait',
  'ring',
  'final',
  'code',
  'A',
  'B',
  'C',
  'D',
  'E',
  's_9',
  'when',
];

/** A guard expression as text, with precedence-correct and sometimes needless parentheses. */
function guardText(r: Rng, inputs: readonly string[], depth: number): { text: string; prec: number } {
  // prec: 4 atom, 3 '!', 2 '&', 1 '^', 0 '|'
  if (depth <= 0 || r.chance(0.35)) {
    if (r.chance(0.06)) return { text: r.pick(['0', '1']), prec: 4 };
    return { text: r.pick(inputs), prec: 4 };
  }
  const roll = r.next();
  if (roll < 0.2) {
    const a = guardText(r, inputs, depth - 1);
    return { text: `!${a.prec < 3 || r.chance(0.1) ? `(${a.text})` : a.text}`, prec: 3 };
  }
  const [op, prec] = roll < 0.55 ? ['&', 2] : roll < 0.75 ? ['^', 1] : ['|', 0];
  const n = r.int(2, 3);
  const parts = Array.from({ length: n }, () => {
    const a = guardText(r, inputs, depth - 1);
    return a.prec < prec || (a.prec !== prec && r.chance(0.15)) ? `(${a.text})` : a.text;
  });
  const sep = r.pick([` ${op} `, op, ` ${op}`]);
  return { text: parts.join(sep), prec };
}

function outputsFor(r: Rng, outputs: readonly string[], p: number): Record<string, Bit> | undefined {
  const chosen = outputs.filter(() => r.chance(p));
  if (chosen.length === 0) return undefined;
  return Object.fromEntries(chosen.map((o) => [o, r.pick<Bit>([0, 1, 1, '-'])]));
}

/** A random machine in the JSON form. */

export function randomMachine(r: Rng, index: number, large = false): SpecJson {
  const inputs = r.sample(INPUTS, large ? r.int(3, 5) : r.int(1, 5));
  const outputs = r.sample(OUTPUTS, r.int(1, 4));
  const n = large ? r.int(8, 14) : r.chance(0.5) ? r.int(1, 5) : r.int(1, 14);
  const names = r.sample(STATES, n);
  const depth = r.pick([1, 1, 2, 2, 3]);
  const states: State[] = names.map((name) => {
    const transitions: State['transitions'] = [];
    const k = r.int(0, Math.min(5, 1 + inputs.length));
    for (let i = 0; i < k; i++) {
      const always = r.chance(0.1);
      transitions.push({
        ...(always ? {} : { when: guardText(r, inputs, depth).text }),
        to: r.chance(0.85) ? r.pick(names) : name,
        ...(r.chance(0.3) ? { outputs: outputsFor(r, outputs, 0.5) } : {}),
      });
    }
    const own = r.chance(0.7) ? outputsFor(r, outputs, 0.6) : undefined;
    return { name, ...(own ? { outputs: own } : {}), transitions };
  });
  // An equivalent state now and then: a copy of another under a new name, entered from somewhere.
  const spare = STATES.filter((s) => !names.includes(s));
  if (r.chance(0.2) && spare.length > 0 && states.length < 14) {
    const from = r.pick(states);
    const copy: State = { ...structuredClone(from), name: spare[0] };
    states.push(copy);
    const entry = r.pick(states);
    entry.transitions.push({ when: guardText(r, inputs, 1).text, to: copy.name });
  }
  const start = r.pick(states).name;
  if (r.chance(0.8)) spine(r, states, start, inputs);
  for (const s of states) for (const t of s.transitions) if (t.outputs === undefined) delete t.outputs;
  for (const s of states) if ((s.transitions.length === 0 && r.chance(0.5)) || r.chance(0.04)) s.final = true;
  const never =
    inputs.length >= 2 && r.chance(0.3)
      ? [`${r.pick(['', '!'])}${inputs[0]} & ${inputs[1]}`, ...(r.chance(0.3) ? [guardText(r, inputs, 1).text] : [])]
      : [];
  const m: Mutable<SpecJson> = {
    name: `soak_${index}`,
    inputs,
    outputs,
    start,
    ...(r.chance(0.35) ? { unspecified: 'dont-care' as const } : r.chance(0.2) ? { unspecified: 'hold' as const } : {}),
    ...(never.length ? { never } : {}),
    ...(r.chance(0.25)
      ? { loadsG: Object.fromEntries(r.sample(outputs, r.int(1, 2)).map((o) => [o, r.int(1, 4000) / r.pick([1, 10])])) }
      : {}),
    states,
  };
  if (r.chance(0.12)) pinCodes(r, m.states);
  return m;
}

/**
 * Most machines people write are connected: a path from the start through the states (in a
 * random order), each step a guarded transition put first or last in its state's list; now
 * and then one state is left off it (unreachable, unless some other transition leads there).
 */
function spine(r: Rng, states: State[], start: string, inputs: readonly string[]): void {
  const order = [
    start,
    ...r.sample(
      states.map((s) => s.name).filter((n) => n !== start),
      states.length,
    ),
  ];
  const skip = r.chance(0.2) ? order[order.length - 1] : undefined;
  for (let i = 0; i + 1 < order.length; i++) {
    if (order[i + 1] === skip) continue;
    const from = states.find((s) => s.name === order[i]);
    const t = { when: guardText(r, inputs, r.int(0, 2)).text, to: order[i + 1] };
    if (r.chance(0.6)) from?.transitions.unshift(t);
    else from?.transitions.push(t);
  }
}

/** Pin distinct codes of one width on some or all states. */
function pinCodes(r: Rng, states: State[]): void {
  const width = Math.max(1, Math.ceil(Math.log2(states.length))) + r.int(0, 1);
  const codes = r.sample(
    Array.from({ length: 2 ** width }, (_, k) => k.toString(2).padStart(width, '0')),
    states.length,
  );
  const all = r.chance(0.5);
  states.forEach((s, i) => {
    if (all || r.chance(0.5)) s.code = codes[i];
  });
}

const withList = (r: Rng, o: Readonly<Record<string, Bit>> | undefined): string =>
  o === undefined
    ? ''
    : ` with ${Object.entries(o)
        .map(([k, v]) => `${k}=${v}`)
        .join(r.pick([', ', ' ', ',']))}`;

const comment = (r: Rng): string => (r.chance(0.15) ? r.pick(['  # note', ' #', '\t# a, b: c']) : '');

/** The machine in the text form (docs/notation.md), printed with varied spacing, order and comments. */
export function textForm(r: Rng, m: SpecJson): string {
  const out: string[] = [];
  if (r.chance(0.5)) out.push(`# ${m.name}`, '#', '# made by the campaign');
  if (r.chance(0.3)) out.push('');
  out.push(`machine ${m.name}${comment(r)}`);
  const list = (word: string, xs: readonly string[]): void => {
    if (xs.length === 0) return;
    if (xs.length > 1 && r.chance(0.2)) {
      out.push(`${word} ${xs[0]}`, `${word} ${xs.slice(1).join(', ')}`);
      return;
    }
    out.push(`${word} ${xs.join(r.pick([', ', ' ', ',']))}${comment(r)}`);
  };
  list('inputs', m.inputs);
  list('outputs', m.outputs);
  out.push(`start ${m.start}`);
  if (m.unspecified) out.push(`unspecified ${m.unspecified}`);
  for (const [o, g] of Object.entries(m.loadsG ?? {}))
    out.push(g >= 100 && r.chance(0.5) ? `load ${o} ${g / 1000} kg` : `load ${o} ${g}${r.pick([' g', 'g'])}`);
  for (const g of m.never ?? []) out.push(`never ${g}${comment(r)}`);
  for (const s of m.states) {
    if (r.chance(0.3)) out.push('');
    const parts = [
      ...(s.code !== undefined ? [`code ${s.code}`] : []),
      ...(s.final ? ['final'] : []),
      ...(s.outputs ? [withList(r, s.outputs).trim()] : []),
    ];
    const ordered = r.chance(0.3) ? r.sample(parts, parts.length) : parts;
    out.push(`state ${s.name}${ordered.map((p) => ` ${p}`).join('')}${comment(r)}`);
    const indent = r.pick(['  ', '    ', '\t', '']);
    for (const t of s.transitions)
      out.push(
        `${indent}${t.when !== undefined ? `when ${t.when} ` : ''}go ${t.to}${withList(r, t.outputs)}${comment(r)}`,
      );
  }
  return out.join(r.chance(0.1) ? '\r\n' : '\n') + '\n';
}
