/**
 * The logic parts of the build sheet: the state table with codes (rows of one state with the
 * same next state and outputs grouped under one guard), and the set/reset equations of every
 * latch and the output equations, as readable expressions. Also the grouping the state
 * diagram draws its arrows from.
 *
 * Equations are read by position, as synthesise writes them: S0, R0, S1, R1, … then one per
 * output (an output may itself be named `S0`). They are shown term for term as built — each
 * term is one gate — not widened.
 */
import { DONT_CARE, type FlatMachine } from '../model/flat.js';
import type { Build } from '../model/build.js';
import type { OutBit } from '../model/machine.js';
import { p, table, type Block } from './doc.js';
import { coverExpr } from './readable.js';

/** Rows of one state that share next state and outputs. */
export interface RowGroup {
  readonly state: number;
  /** Next state index, or DONT_CARE. */
  readonly next: number;
  readonly out: readonly OutBit[];
  readonly cubes: readonly string[];
  /** The `unspecified` rule made these rows (no written transition). */
  readonly unspecified: boolean;
}

/** Group each state's rows by (next state, outputs), in order of first appearance. */
export function rowGroups(f: FlatMachine): RowGroup[][] {
  return f.rows.map((rows, s) => {
    const groups = new Map<string, { next: number; out: readonly OutBit[]; cubes: string[]; unspecified: boolean }>();
    for (const r of rows) {
      const key = `${r.next}|${r.out.join('')}|${r.transition < 0 ? 'u' : 't'}`;
      const g = groups.get(key);
      if (g) g.cubes.push(r.cube);
      else groups.set(key, { next: r.next, out: r.out, cubes: [r.cube], unspecified: r.transition < 0 });
    }
    return [...groups.values()].map((g) => ({ state: s, ...g }));
  });
}

/** Outputs with the same value on every row of a state: its Moore outputs (index → value). */
export function mooreOutputs(f: FlatMachine, s: number): Map<number, OutBit> {
  const out = new Map<number, OutBit>();
  const rows = f.rows[s];
  f.outputs.forEach((_, k) => {
    const v = rows[0]?.out[k];
    if (v !== undefined && v !== '-' && rows.every((r) => r.out[k] === v)) out.set(k, v);
  });
  return out;
}

/** `bell=1, lamp=0`; a free output reads `bell free`; no outputs reads an em dash. */
export function outputsText(names: readonly string[], out: readonly OutBit[], only?: ReadonlySet<number>): string {
  const parts = names.flatMap((n, k) =>
    only && !only.has(k) ? [] : [out[k] === '-' ? `${n} free` : `${n}=${out[k]}`],
  );
  return parts.length === 0 ? '—' : parts.join(', ');
}

/** The state table as sheet blocks. */
export function stateTableBlocks(build: Build): Block[] {
  const f = build.machine;
  const codes = build.encoding.codes;
  const name = (s: number): string => (s === DONT_CARE ? 'free' : f.states[s]);
  const code = (s: number): string => (s === DONT_CARE ? '' : (codes[s] ?? ''));
  const rows: string[][] = [];
  rowGroups(f).forEach((groups, s) => {
    groups.forEach((g, i) => {
      const when = f.inputs.length === 0 ? 'always' : coverExpr(g.cubes, f.inputs, { dc: f.never });
      rows.push([
        i === 0 ? `${f.states[s]}${s === f.start ? ' (start)' : ''}` : '',
        i === 0 ? code(s) : '',
        when === '1' ? 'always' : when,
        name(g.next),
        code(g.next),
        outputsText(f.outputs, g.out),
        g.unspecified ? (g.next === DONT_CARE ? 'no transition: left free' : 'no transition: holds') : 'as written',
      ]);
    });
  });
  const blocks: Block[] = [
    p(
      `Each state with its code (bit 0 first; q0 is the first digit). For each group of input combinations: the next state and code, and the outputs shown while the inputs are held (before φ1). Input names mean "lever pulled".${f.never.length > 0 ? ' Guards are written as simply as the combinations that never occur allow.' : ''}`,
    ),
    table(['state', 'code', 'when (inputs)', 'next state', 'next code', 'outputs', 'from'], rows, { mono: [1, 2, 4] }),
  ];
  if (f.never.length > 0)
    blocks.push(
      p(
        `Input combinations declared never to occur: ${coverExpr(f.never, f.inputs)}. The machine is still guarded against them.`,
      ),
    );
  const used = new Set(codes);
  const bits = build.encoding.bits;
  const unused =
    bits > 0 && bits <= 8
      ? Array.from({ length: 2 ** bits }, (_, i) => i.toString(2).padStart(bits, '0')).filter((c) => !used.has(c))
      : [];
  if (unused.length > 0)
    blocks.push(
      p(
        `Unused codes: ${unused.join(', ')}. A bumped machine holding one returns to a used code (see the recovery check).`,
      ),
    );
  return blocks;
}

/** The equations as sheet blocks. */
export function equationBlocks(build: Build): Block[] {
  const f = build.machine;
  const bits = build.encoding.bits;
  const eq = build.equations;
  const vars = build.vars;
  const blocks: Block[] = [];
  if (bits > 0) {
    const start = build.encoding.codes[f.start] ?? '';
    blocks.push(
      p(
        `q0 … q${bits - 1} are the state bits, read from the slave latches (Q for q, Q̄ for !q); input names mean "lever pulled". Each product term is one term gate NAND(φ1, its literals); the terms of S are tied to the master latch's set ports, those of R to its reset ports (wired-AND). On φ2 the master is copied into the slave. A bit holds when neither S nor R is 1. The reset lever forces code ${start} (${f.states[f.start]}).`,
      ),
      table(
        ['bit', 'master latch', 'slave latch', 'set S when', 'reset R when'],
        Array.from({ length: bits }, (_, j) => [
          `q${j}`,
          build.signals.masters[j] ?? '',
          build.signals.slaves[j] ?? '',
          coverExpr(eq[2 * j]?.terms ?? [], vars, { widen: false }),
          coverExpr(eq[2 * j + 1]?.terms ?? [], vars, { widen: false }),
        ]),
        { mono: [0, 1, 2, 3, 4] },
      ),
    );
  } else {
    blocks.push(
      p(
        'A one-state machine has no state bits: no latches, no set or reset equations. Its outputs are decoded from the input levers alone.',
      ),
    );
  }
  if (f.outputs.length > 0) {
    blocks.push(
      table(
        ['output', 'shown by', 'kind', 'equals 1 when'],
        f.outputs.map((o, k) => {
          const terms = eq[2 * bits + k]?.terms ?? [];
          const mealy = terms.some((c) => c.slice(bits).includes('0') || c.slice(bits).includes('1'));
          return [
            o,
            build.signals.outputs[o] ?? '',
            mealy ? 'Mealy (state and inputs)' : 'Moore (state only)',
            coverExpr(terms, vars, { widen: false }),
          ];
        }),
        { mono: [1, 3], caption: 'Output equations' },
      ),
    );
  }
  return blocks;
}
