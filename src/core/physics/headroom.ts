/**
 * Friction headroom: how far the friction of cord on drum may fall (damp cord, a polished
 * drum) before the first capstan slips, and what each actuator could lift.
 *
 * Method: the capstan equation (capstan.ts). A capstan with hold tension T_hold, θ = 2π ×
 * its turns, and load L (its branches with their routing losses) holds with margin m while
 * m·L ≤ T_hold·e^(μθ), that is while μ ≥ ln(m·L / T_hold) / θ. The lowest μ at which every
 * capstan still holds (m = 1) is the largest of these over the capstans; the lowest μ at
 * which every capstan keeps the design margin (m = minMargin) likewise. Routing losses over
 * pins follow μ_pin, not the drum's μ, so they stay as they are. Per actuator: the largest
 * load its capstan could lift at the design margin, its other branches as they are.
 * Postconditions: `muMin` ≤ `muAtMinMargin`, both null when no capstan carries a load; a μ of
 * 0 means the hold tension alone carries every load. Outputs shown by an actuator that a
 * cord pulls, by output name, in part order (a constant output's actuator has no capstan).
 */
import { partIndex, type Netlist } from '../model/netlist.js';
import { muNeeded } from './capstan.js';
import { maxActuatorLoadG, type DriverBudget } from './drive.js';
import type { Profile } from './profile.js';
import { massFigure, say, type Words } from '../model/units.js';

/** What one actuator output lifts, the most it could lift at the design margin, and its capstan's margin. */
export interface OutputLoad {
  readonly loadG: number;
  /** Grams, to 0.1 g. */
  readonly maxLoadG: number;
  readonly margin: number;
}

export interface Headroom {
  /** The lowest μ at which every capstan still holds its load (margin ≥ 1). */
  readonly muMin: number | null;
  /** The lowest μ at which every capstan keeps the design margin (margin ≥ minMargin). */
  readonly muAtMinMargin: number | null;
  /** The capstan that slips first as μ falls. */
  readonly firstToSlip: string | null;
  readonly outputs: Readonly<Record<string, OutputLoad>>;
}

/** The friction headroom of a set of budgets (drive.ts) of `netlist`. */
export function frictionHeadroom(netlist: Netlist, drivers: readonly DriverBudget[], profile: Profile): Headroom {
  let muMin: number | null = null;
  let muAtMinMargin: number | null = null;
  let firstToSlip: string | null = null;
  for (const d of drivers) {
    if (!(d.loadG > 0)) continue;
    const holds = muNeeded(d.loadG, d.holdG, d.wraps);
    const keeps = muNeeded(d.loadG, d.holdG, d.wraps, profile.minMargin);
    if (muMin === null || holds > muMin) {
      muMin = holds;
      firstToSlip = d.weakestCord;
    }
    muAtMinMargin = Math.max(muAtMinMargin ?? 0, keeps);
  }
  const outputs: Record<string, OutputLoad> = {};
  const budgets = new Map(drivers.map((d) => [d.driver, d]));
  const parts = partIndex(netlist);
  for (const c of netlist.cords)
    for (const a of c.actuators) {
      const part = parts.get(a);
      const b = budgets.get(c.driver);
      const branch = b?.branches.find((x) => x.cord === c.id && x.target === a);
      if (part?.kind !== 'actuator' || !b || !branch) continue;
      const maxLoadG = Math.floor(maxActuatorLoadG(b, branch, profile.minMargin) * 10) / 10;
      outputs[part.output] = { loadG: part.loadG, maxLoadG, margin: b.margin };
    }
  return { muMin, muAtMinMargin, firstToSlip, outputs };
}

/** "every capstan holds down to μ = 0.166 and keeps margin 2 down to μ = 0.221 (μ = 0.25 now)". */
export function headroomWords(h: Headroom, profile: Profile): string {
  if (h.muMin === null || h.muAtMinMargin === null) return 'no capstan carries a load';
  return `every capstan holds down to μ = ${h.muMin.toFixed(3)} and keeps margin ${profile.minMargin} down to μ = ${h.muAtMinMargin.toFixed(3)} (μ = ${profile.mu} now)`;
}

/** "output 'sluice' lifts 300 g, at most 1094 g at margin 2" for each actuator output, as Words (model/units.ts). */
export function outputLoadWords(h: Headroom, profile: Profile): Words[] {
  return Object.entries(h.outputs).map(
    ([o, x]) =>
      say`output '${o}' lifts ${massFigure(x.loadG)}, at most ${massFigure(Math.floor(x.maxLoadG))} at margin ${profile.minMargin}`,
  );
}
