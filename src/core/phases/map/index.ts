/**
 * Map to parts: set/reset and output covers → a netlist of levers, gates, latches, flags and
 * actuators with their cords (design §3, §5; the part model of model/netlist.ts).
 *
 * Method: direct two-level NAND mapping. Every product term is one NAND gate (with φ1 for
 * set/reset terms); every sum is free — the master's S̄ (R̄) port is the wired-AND of the
 * term cords, NOT(OR of terms) — or one OR gate for an output; fan-in beyond the port limits
 * becomes NAND + inverter trees (fan-in.ts); drivers with too many branches get buffer trees
 * (fan-out.ts). Polarity comes free from Q/Q̄ of the slaves; an input's complement costs one
 * inverter, built only where some literal uses it.
 *
 * A machine with no state bits (a one-state machine) is a combinational build: no latches,
 * no clock or reset levers and no reset driver; its SignalMap names '' for φ1, φ2 and reset.
 *
 * Preconditions: the set/reset cover has 2·bits functions (2j = S_j, 2j+1 = R_j) and the
 * output cover one function per output, both over bits + inputs variables; Moore outputs
 * have no input literal.
 * Postconditions: the netlist invariants of model/netlist.ts; parts and cords in a stable
 * order (levers, reset driver, input inverters, latches bit by bit with their transfer
 * gates, set/reset terms in cover order, output terms, output gates, flags and actuators;
 * buffers right after their driver; cords in their driver's order).
 */
import type { PartCounts, SignalMap } from '../../model/build.js';
import type { Cord, Netlist } from '../../model/netlist.js';
import { nameRecordOf } from '../../model/records.js';
import type { Profile } from '../../physics/profile.js';
import type { SopCover } from '../minimise-logic/types.js';
import { NetBuilder } from './builder.js';
import { countParts } from './counts.js';
import { splitFanout, tooManyBranches } from './fan-out.js';
import { buildLatches } from './latches.js';
import { ids } from './names.js';
import { buildOutputs, planOutputs, planReferences } from './outputs.js';
import { buildSrTerms, literalDrivers, nameSrTerms, srFeeds, type MapContext } from './terms.js';

export { countParts, partsCost, withoutCapstan, withoutCapstanWords } from './counts.js';
export { splitFanout, tooManyBranches, DEFAULT_FANOUT_LIMIT } from './fan-out.js';
export { ids } from './names.js';

export interface MapInput {
  readonly bits: number;
  readonly inputs: readonly string[];
  readonly outputs: readonly string[];
  /** The start state's code ('' when there are no state bits). */
  readonly startCode: string;
  /** Set/reset cover: function 2j = S_j, 2j+1 = R_j. */
  readonly sr: SopCover;
  /** Output cover: function k = output k. */
  readonly out: SopCover;
  /** Outputs shown by an actuator pulling this many grams, by output name. */
  readonly actuators?: Readonly<Record<string, number>>;
  readonly profile: Profile;
  /** Which cords need a buffer tree (default: more than 10 branches). */
  readonly tooMany?: (cord: Cord) => boolean;
}

export interface Mapped {
  readonly netlist: Netlist;
  readonly signals: SignalMap;
  readonly parts: PartCounts;
}

/** Map set/reset and output covers onto lever parts. */
export function mapToParts(m: MapInput): Mapped {
  const b = new NetBuilder(m.profile);
  const vars = [...Array.from({ length: m.bits }, (_, j) => `q${j}`), ...m.inputs];
  const ctx: MapContext = { b, bits: m.bits, inputs: m.inputs, vars };
  const seq = m.bits > 0;
  const srNames = nameSrTerms(m.sr);
  const plan = planOutputs(ctx, m.out, m.outputs, m.actuators ?? {});
  const used = new Set([...m.sr.terms.flatMap((t) => literalDrivers(ctx, t.cube)), ...planReferences(ctx, plan)]);

  for (const name of m.inputs) b.lever(ids.input(name), name, 'input', name);
  if (seq) {
    b.lever(ids.phi1, 'φ1', 'phi1');
    b.lever(ids.phi2, 'φ2', 'phi2');
    b.lever(ids.reset, 'reset', 'reset');
    b.gate(ids.resetDriver, 'reset driver', 'reset-driver', [{ prefix: 'p', drivers: [ids.reset] }]);
  }
  for (const name of m.inputs) {
    const inv = ids.inputInverter(name);
    if (used.has(inv)) b.gate(inv, `inverter !${name}`, 'inverter', [{ prefix: 'p', drivers: [ids.input(name)] }]);
  }
  if (seq) buildLatches(ctx, m.startCode, srFeeds(m.sr, srNames));
  buildSrTerms(ctx, m.sr, srNames);
  const shown = buildOutputs(ctx, plan);

  const netlist = splitFanout(b.build(), m.tooMany ?? tooManyBranches());
  const signals: SignalMap = {
    inputs: nameRecordOf(m.inputs.map((name) => [name, ids.input(name)])),
    phi1: seq ? ids.phi1 : '',
    phi2: seq ? ids.phi2 : '',
    reset: seq ? ids.reset : '',
    masters: Array.from({ length: m.bits }, (_, j) => ids.master(j)),
    slaves: Array.from({ length: m.bits }, (_, j) => ids.slave(j)),
    outputs: shown,
  };
  return { netlist, signals, parts: countParts(netlist) };
}
