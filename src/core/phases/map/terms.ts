/**
 * Literals and term gates. A literal is a cord: q_j from the slave's Q output, !q_j from its
 * Q̄ output (both free, design §5), an input from its operator lever (1 exactly when pulled),
 * !input from that input's inverter, which exists only where the complement is used.
 * A set/reset term gate is NAND(φ1, literals…): its cord pulls the master's S̄ or R̄ port
 * while φ1 is pulled and the product holds.
 */
import type { Cube } from '../../model/cube.js';
import type { SopCover } from '../minimise-logic/types.js';
import type { NetBuilder } from './builder.js';
import { capacity, fitAnd } from './fan-in.js';
import { ids, srName, termText } from './names.js';

export interface MapContext {
  readonly b: NetBuilder;
  readonly bits: number;
  readonly inputs: readonly string[];
  /** Variable names: q0… then inputs. */
  readonly vars: readonly string[];
}

/** The driver whose cord carries literal `v` ('0' or '1') of variable i. */
export function literalDriver(ctx: MapContext, i: number, v: string): string {
  if (i < ctx.bits) return v === '1' ? ids.setGate(ids.slave(i)) : ids.resetGate(ids.slave(i));
  const name = ctx.inputs[i - ctx.bits];
  return v === '1' ? ids.input(name) : ids.inputInverter(name);
}

/** Drivers of every literal of a cube, in variable order. */
export function literalDrivers(ctx: MapContext, cube: Cube): string[] {
  const out: string[] = [];
  for (let i = 0; i < cube.length; i++) if (cube[i] !== '-') out.push(literalDriver(ctx, i, cube[i]));
  return out;
}

/** Ids of the term gates of a set/reset cover, one per term, named by the first function fed. */
export function nameSrTerms(sr: SopCover): string[] {
  const counters = new Map<string, number>();
  return sr.terms.map((t) => {
    const fn = srName(Math.min(...t.outputs));
    const k = (counters.get(fn) ?? 0) + 1;
    counters.set(fn, k);
    return ids.term(fn, k);
  });
}

/** Per function of the cover, the ids of the term gates feeding it. */
export function srFeeds(sr: SopCover, names: readonly string[]): string[][] {
  const feeds: string[][] = Array.from({ length: sr.functions }, () => []);
  sr.terms.forEach((t, i) => {
    for (const o of t.outputs) feeds[o].push(names[i]);
  });
  return feeds;
}

/** Build the term gates NAND(φ1, literals…) of a set/reset cover. */
export function buildSrTerms(ctx: MapContext, sr: SopCover, names: readonly string[]): void {
  sr.terms.forEach((t, i) => {
    if (t.outputs.length === 0) return;
    const id = names[i];
    const drivers = fitAnd(ctx.b, id, 'term', [ids.phi1, ...literalDrivers(ctx, t.cube)], capacity(ctx.b), 1);
    const fed = t.outputs.map(srName).join(', ');
    ctx.b.gate(id, `term φ1 ${termText(t.cube, ctx.vars)} → ${fed}`, 'term', [{ prefix: 'p', drivers }]);
  });
}
