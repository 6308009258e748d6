/**
 * Output logic (design §3, §5). Output terms carry no φ1, so they never share gates with
 * set/reset terms; they share among outputs. Moore outputs arrive here with state-bit
 * literals only (they decode the slave bits); Mealy outputs also use inputs.
 *
 * Polarity (design §3): a cord PULLS exactly when its driver's Z = 1, i.e. when its signal is
 * 0; a flag reads a gate's Z directly (an inverted flag shows NOT Z). So a flag needs a Z
 * equal to the output or to its complement, and an actuator, which must be pulled exactly
 * when the output is 1, needs a driver whose Z equals the output (whose signal is its
 * complement).
 *
 * How an output is shown, by the shape of its cover:
 * - constant 0 or 1: a flag pinned in place, or an actuator left at rest / hung lifted; no
 *   gate at all;
 * - one literal: a flag reads a Z that already carries it — the slave's set-side gate
 *   (Z = Q̄, so q_j is shown by an inverted flag) or the input's inverter (Z = the input);
 *   an actuator ties onto the cord of the complement literal (Q̄'s cord has Z = Q, an input
 *   lever's cord pulls while the lever is at rest, an inverter's while it is pulled);
 * - one product of several literals: the Z of its term gate NAND(literals) is the product:
 *   an upright flag reads it, or an actuator ties onto the term gate's cord;
 * - a sum of products: an OR gate whose port(s) take the cord carrying NOT p for every term
 *   p (a term gate's cord, or the complement literal's cord for a one-literal term). Its
 *   Z = AND(NOT p) = NOT f is read by an inverted flag. An actuator needs one more one-port
 *   gate on the OR gate's cord (its Z = f), whose cord pulls the load.
 */
import { nameRecord, ownValue } from '../../model/records.js';
import type { SopCover } from '../minimise-logic/types.js';
import { capacity, fitAnd } from './fan-in.js';
import { ids, termText } from './names.js';
import { literalDriver, literalDrivers, type MapContext } from './terms.js';

type Show =
  | { readonly kind: 'fixed'; readonly value: 0 | 1 }
  | { readonly kind: 'cord'; readonly driver: string }
  | { readonly kind: 'read'; readonly gate: string; readonly inverted: boolean }
  | { readonly kind: 'or'; readonly drivers: readonly string[] };

export interface OutputPlan {
  readonly outputs: readonly { readonly name: string; readonly loadG?: number; readonly show: Show }[];
  /** Term gates NAND(literals…), in cover order. */
  readonly terms: readonly { readonly id: string; readonly cube: string }[];
}

/** Decide how every output is shown and which output term gates exist. */
export function planOutputs(
  ctx: MapContext,
  cover: SopCover,
  names: readonly string[],
  actuators: Readonly<Record<string, number>>,
): OutputPlan {
  const perOut: number[][] = names.map(() => []);
  cover.terms.forEach((t, i) => t.outputs.forEach((o) => perOut[o].push(i)));
  const lits = cover.terms.map((t) => [...t.cube].filter((c) => c !== '-').length);
  const constant = perOut.map((ts): 0 | 1 | undefined =>
    ts.length === 0 ? 0 : ts.some((i) => lits[i] === 0) ? 1 : undefined,
  );
  // Term gates: every product of two or more literals that a non-constant output uses.
  const termId = new Map<number, string>();
  const counters = new Map<string, number>();
  cover.terms.forEach((t, i) => {
    const users = t.outputs.filter((o) => constant[o] === undefined);
    if (lits[i] < 2 || users.length === 0) return;
    const first = names[Math.min(...users)];
    const k = (counters.get(first) ?? 0) + 1;
    counters.set(first, k);
    termId.set(i, ids.outputTerm(first, k));
  });
  const outputs = names.map((name, k) => {
    const loadG = ownValue(actuators, name);
    const ts = perOut[k];
    const c = constant[k];
    let show: Show;
    if (c !== undefined) show = { kind: 'fixed', value: c };
    else if (ts.length === 1 && lits[ts[0]] === 1) {
      const cube = cover.terms[ts[0]].cube;
      const i = [...cube].findIndex((x) => x !== '-');
      show =
        loadG !== undefined
          ? { kind: 'cord', driver: literalDriver(ctx, i, cube[i] === '1' ? '0' : '1') }
          : readLiteral(ctx, i, cube[i]);
    } else if (ts.length === 1) {
      const gate = termId.get(ts[0]) as string;
      show = loadG !== undefined ? { kind: 'cord', driver: gate } : { kind: 'read', gate, inverted: false };
    } else
      show = {
        kind: 'or',
        drivers: ts.map((i) => {
          if (lits[i] > 1) return termId.get(i) as string;
          const cube = cover.terms[i].cube;
          const j = [...cube].findIndex((x) => x !== '-');
          return literalDriver(ctx, j, cube[j] === '1' ? '0' : '1');
        }),
      };
    return { name, ...(loadG !== undefined ? { loadG } : {}), show };
  });
  const terms = [...termId].map(([i, id]) => ({ id, cube: cover.terms[i].cube }));
  return { outputs, terms };
}

/** Every driver or gate the plan refers to (to know which input inverters to build). */
export function planReferences(ctx: MapContext, plan: OutputPlan): string[] {
  const out: string[] = [];
  for (const t of plan.terms) out.push(...literalDrivers(ctx, t.cube));
  for (const o of plan.outputs) {
    if (o.show.kind === 'cord') out.push(o.show.driver);
    else if (o.show.kind === 'read') out.push(o.show.gate);
    else if (o.show.kind === 'or') out.push(...o.show.drivers);
  }
  return out;
}

/** Build the output term gates, OR gates, flags and actuators of a plan; returns output → part id. */
export function buildOutputs(ctx: MapContext, plan: OutputPlan): Record<string, string> {
  const { b } = ctx;
  for (const t of plan.terms) {
    const drivers = fitAnd(b, t.id, 'output', literalDrivers(ctx, t.cube), capacity(b));
    b.gate(t.id, `output term ${termText(t.cube, ctx.vars)}`, 'output', [{ prefix: 'p', drivers }]);
  }
  for (const o of plan.outputs) {
    if (o.show.kind !== 'or') continue;
    const id = ids.output(o.name);
    b.gate(id, `output ${o.name} (OR of its terms)`, 'output', [
      { prefix: 'p', drivers: fitAnd(b, id, 'output', o.show.drivers, capacity(b)) },
    ]);
    if (o.loadG !== undefined)
      b.gate(ids.outputDriver(o.name), `output ${o.name} actuator driver`, 'output', [{ prefix: 'p', drivers: [id] }]);
  }
  const shown = nameRecord<string>();
  for (const o of plan.outputs) {
    const s = o.show;
    if (o.loadG !== undefined) {
      const id = ids.actuator(o.name);
      const driver = s.kind === 'cord' ? s.driver : s.kind === 'or' ? ids.outputDriver(o.name) : undefined;
      b.actuator(id, `actuator ${o.name}`, o.name, o.loadG, driver, s.kind === 'fixed' ? s.value : undefined);
      shown[o.name] = id;
    } else {
      const id = ids.flag(o.name);
      if (s.kind === 'fixed') b.fixedFlag(id, `flag ${o.name}`, o.name, s.value);
      else if (s.kind === 'read') b.flag(id, `flag ${o.name}`, o.name, s.gate, s.inverted);
      else if (s.kind === 'or') b.flag(id, `flag ${o.name}`, o.name, ids.output(o.name), true);
      else throw new Error(`flag ${o.name} cannot show a bare cord`);
      shown[o.name] = id;
    }
  }
  return shown;
}

/** A flag reading a Z that already carries literal v of variable i. */
function readLiteral(ctx: MapContext, i: number, v: string): Show {
  if (i < ctx.bits) return { kind: 'read', gate: ids.setGate(ids.slave(i)), inverted: v === '1' };
  return { kind: 'read', gate: ids.inputInverter(ctx.inputs[i - ctx.bits]), inverted: v === '0' };
}
