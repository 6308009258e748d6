/**
 * Force a person needs to pull each operator, clock and reset lever (design §4).
 *
 * Model (kept simple on purpose): a lever is pulled down against its own pull-up weight
 * (profile.leverWeightG), plus a fixed allowance for pivot friction and cord stiffness
 * (profile.operatorExtraG). No port cord is ever tied to a lever (levers only drive), and the
 * lever's capstan tail takes its tension from that same weight, so pulling the lever only
 * lifts the weight: the tail goes slack as it rises. The force is given at the point where the
 * weight hangs; a handle on a longer arm needs proportionally less.
 * Postcondition: one entry per lever part, in part order.
 */
import type { LeverRole, Netlist } from '../model/netlist.js';
import { gramsToNewtons } from './capstan.js';
import type { Profile } from './profile.js';

export interface OperatorForce {
  readonly lever: string;
  readonly name: string;
  readonly role: LeverRole;
  readonly forceG: number;
  readonly forceN: number;
}

/** Pulling force of every lever in the netlist. */
export function operatorForces(netlist: Netlist, profile: Profile): OperatorForce[] {
  const forceG = profile.leverWeightG + profile.operatorExtraG;
  return netlist.parts.flatMap((p) =>
    p.kind === 'lever' ? [{ lever: p.id, name: p.name, role: p.role, forceG, forceN: gramsToNewtons(forceG) }] : [],
  );
}
