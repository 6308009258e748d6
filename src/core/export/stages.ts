/**
 * Stage order of the parts: the order in which signals flow through one clock, used to sort
 * the wiring list (a builder ties cords in one pass, from the levers to the flags) and to
 * group the schematic. Stages: levers → input inverters and the reset driver → φ1 term gates
 * → master latches → φ2 transfer gates → slave latches → output gates → flags and actuators.
 * Helper gates take the stage of what they serve: an inverter or buffer inherits the stage of
 * the driver feeding it (a fan-in tree's inverter sits with its term gates, a buffer pair with
 * its driver), except that an inverter fed by an input lever is an input inverter.
 * Within a stage the netlist's own order is kept (stable ids, stable order).
 */
import type { Netlist, Part } from '../model/netlist.js';

export type Stage =
  'lever' | 'input-inverter' | 'reset-driver' | 'term' | 'master' | 'transfer' | 'slave' | 'output' | 'indicator';

/** Rank of each stage, left to right. */
export const STAGE_RANK: Readonly<Record<Stage, number>> = {
  lever: 0,
  'input-inverter': 1,
  'reset-driver': 1,
  term: 2,
  master: 3,
  transfer: 4,
  slave: 5,
  output: 6,
  indicator: 7,
};

/** Each stage in words, for tables and legends. */
export const STAGE_WORDS: Readonly<Record<Stage, string>> = {
  lever: 'lever',
  'input-inverter': 'input inverter',
  'reset-driver': 'reset driver',
  term: 'φ1 term gate',
  master: 'master latch',
  transfer: 'φ2 transfer gate',
  slave: 'slave latch',
  output: 'output gate',
  indicator: 'flag or actuator',
};

/** Stage, rank and netlist position of every part. */
export interface StageInfo {
  readonly stage: ReadonlyMap<string, Stage>;
  /** Sort key: stage rank, then netlist position. */
  compare(a: string, b: string): number;
  readonly position: ReadonlyMap<string, number>;
}

/** Work out the stage of every part of a netlist. */
export function stagesOf(n: Netlist): StageInfo {
  const byId = new Map(n.parts.map((p) => [p.id, p]));
  const latchRole = new Map<string, 'master' | 'slave'>();
  for (const p of n.parts) if (p.kind === 'latch') latchRole.set(p.id, p.role);
  const feeder = new Map<string, string>();
  for (const c of n.cords) for (const r of c.ports) if (!feeder.has(r.part)) feeder.set(r.part, c.driver);
  const stage = new Map<string, Stage>();
  const of = (p: Part, depth: number): Stage => {
    const known = stage.get(p.id);
    if (known) return known;
    let s: Stage;
    if (p.kind === 'lever') s = 'lever';
    else if (p.kind === 'flag' || p.kind === 'actuator') s = 'indicator';
    else if (p.kind === 'latch') s = p.role;
    else if (p.role === 'latch-set' || p.role === 'latch-reset') s = latchRole.get(p.latch ?? '') ?? 'master';
    else if (p.role === 'term' || p.role === 'transfer' || p.role === 'output' || p.role === 'reset-driver') s = p.role;
    else {
      const up = byId.get(feeder.get(p.id) ?? '');
      const upStage = up && depth < n.parts.length ? of(up, depth + 1) : 'lever';
      s = p.role === 'inverter' && upStage === 'lever' ? 'input-inverter' : upStage;
    }
    stage.set(p.id, s);
    return s;
  };
  for (const p of n.parts) of(p, 0);
  const position = new Map(n.parts.map((p, i) => [p.id, i]));
  const key = (id: string): [number, number] => [
    STAGE_RANK[stage.get(id) ?? 'indicator'],
    position.get(id) ?? Infinity,
  ];
  return {
    stage,
    position,
    compare(a, b) {
      const [ra, pa] = key(a);
      const [rb, pb] = key(b);
      return ra - rb || pa - pb;
    },
  };
}
