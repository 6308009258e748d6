/**
 * fast-check generators of well-formed machines in the JSON form, shared by the form tests.
 * Names are valid, targets exist; guards are random expression trees printed as text.
 */
import fc from 'fast-check';
import { printExpr } from '../../../src/core/forms/expr.js';
import type { JsonMachine, JsonState } from '../../../src/core/forms/json.js';
import type { Expr, OutBit } from '../../../src/core/model/machine.js';

const INPUT_POOL = ['a', 'b', 'lid', 'go', 'with', 'when', 'x_1'];
const OUTPUT_POOL = ['bell', 'lamp', 'code', 'flap'];
const STATE_POOL = ['idle', 's1', 'go', '010', 'with', 'state', 'open_2'];

function exprArb(inputs: readonly string[]): fc.Arbitrary<Expr> {
  const leaves: fc.Arbitrary<Expr>[] = [
    fc.constantFrom<Expr>({ kind: 'const', value: 0 }, { kind: 'const', value: 1 }),
  ];
  if (inputs.length)
    leaves.push(
      fc.integer({ min: 0, max: inputs.length - 1 }).map((i): Expr => ({ kind: 'input', name: inputs[i], index: i })),
    );
  const leaf = fc.oneof(...leaves);
  return fc.letrec<{ e: Expr }>((tie) => ({
    e: fc.oneof(
      { depthSize: 'small' },
      leaf,
      tie('e').map((arg): Expr => ({ kind: 'not', arg })),
      fc
        .tuple(
          fc.constantFrom('and' as const, 'or' as const, 'xor' as const),
          fc.array(tie('e'), { minLength: 2, maxLength: 3 }),
        )
        .map(([kind, args]): Expr => ({ kind, args })),
    ),
  })).e;
}

const outBit = fc.constantFrom<OutBit>(0, 1, '-');

function outputsArb(outputs: readonly string[]): fc.Arbitrary<Record<string, OutBit> | undefined> {
  return fc
    .subarray([...outputs])
    .chain((keys) =>
      fc
        .tuple(...keys.map(() => outBit))
        .map((vals) => (keys.length ? Object.fromEntries(keys.map((k, i) => [k, vals[i]])) : undefined)),
    );
}

/** Loads (grams, as a person weighs them: whole or tenths) for a subset of the outputs; undefined for none. */
function loadsArb(outputs: readonly string[]): fc.Arbitrary<Record<string, number> | undefined> {
  return fc
    .subarray([...outputs])
    .chain((keys) =>
      fc
        .tuple(...keys.map(() => fc.integer({ min: 1, max: 50000 }).map((t) => t / 10)))
        .map((g) => (keys.length ? Object.fromEntries(keys.map((k, i) => [k, g[i]])) : undefined)),
    );
}

const descriptionArb = fc.option(
  fc
    .array(
      fc.stringMatching(/^[A-Za-z0-9 ,.'()#!-]{0,30}$/).map((s) => s.trimEnd()),
      { minLength: 1, maxLength: 4 },
    )
    .map((ls) => ls.join('\n')),
  { nil: undefined },
);

/** A well-formed machine in the JSON form (canonical key order, `undefined` fields removed). */
export const jsonMachineArb: fc.Arbitrary<JsonMachine> = fc
  .record({
    inputs: fc.subarray(INPUT_POOL, { maxLength: 4 }),
    outputs: fc.subarray(OUTPUT_POOL, { maxLength: 3 }),
    states: fc.subarray(STATE_POOL, { minLength: 1, maxLength: 5 }),
  })
  .chain(({ inputs, outputs, states }) => {
    const guardText = fc.option(exprArb(inputs).map(printExpr), { nil: undefined });
    const transition = fc.record({ when: guardText, to: fc.constantFrom(...states), outputs: outputsArb(outputs) });
    const bits = Math.max(1, Math.ceil(Math.log2(states.length + 1)));
    const state = (name: string, i: number): fc.Arbitrary<JsonState> =>
      fc
        .record({
          code: fc.option(fc.constant(i.toString(2).padStart(bits, '0')), { nil: undefined }),
          final: fc.option(fc.constant(true as const), { nil: undefined }),
          outputs: outputsArb(outputs),
          transitions: fc.array(transition, { maxLength: 4 }),
        })
        .map((s) => clean({ name, ...s, transitions: s.transitions.map(clean) }) as JsonState);
    return fc
      .record({
        description: descriptionArb,
        start: fc.constantFrom(...states),
        unspecified: fc.constantFrom('hold' as const, 'dont-care' as const),
        never: fc.option(fc.array(exprArb(inputs).map(printExpr), { minLength: 1, maxLength: 2 }), { nil: undefined }),
        loadsG: loadsArb(outputs),
        states: fc.tuple(...states.map(state)),
      })
      .map(
        (r) =>
          clean({
            name: 'gen_machine',
            description: r.description,
            inputs,
            outputs,
            start: r.start,
            unspecified: r.unspecified,
            never: r.never,
            loadsG: r.loadsG,
            states: r.states,
          }) as JsonMachine,
      );
  });

function clean<T extends object>(o: T): T {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as T;
}
