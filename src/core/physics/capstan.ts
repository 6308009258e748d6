/**
 * The capstan equation and the tensions that follow from a technology profile.
 *
 * Method: the capstan (belt-friction) equation of Euler and Eytelwein, T_load = T_hold·e^(μθ)
 * for a cord wrapped θ radians on a surface with friction coefficient μ (J. L. Meriam &
 * L. G. Kraige, Engineering Mechanics: Statics, the flexible-belts section — from memory).
 * The same equation gives the loss of a cord redirected over a fixed pin; a pulley of
 * efficiency η multiplies the tension a branch needs by 1/η.
 * Forces are kept in grams-force (what builders weigh) and converted to newtons with standard
 * gravity g₀ = 9.80665 m/s² (the conventional value fixed by the 3rd CGPM, 1901).
 */
import type { Part } from '../model/netlist.js';
import type { Profile, RoutingLoss } from './profile.js';

/** Standard gravity, m/s². */
export const STANDARD_GRAVITY = 9.80665;

/** Grams-force to newtons. */
export function gramsToNewtons(g: number): number {
  return (g / 1000) * STANDARD_GRAVITY;
}

/** e^(μθ) with θ = 2π·wraps: how many times the hold tension a capstan can hold on its load side. */
export function capstanGain(mu: number, wraps: number): number {
  return Math.exp(mu * 2 * Math.PI * wraps);
}

/** Hold tension, gain and the load-side tension a capstan can supply, in grams-force and newtons. */
export interface Tension {
  readonly holdG: number;
  readonly gain: number;
  readonly availableG: number;
  readonly holdN: number;
  readonly availableN: number;
}

/**
 * Tension available from one capstan whose hold end is kept by `holdWeightG` (a gate's Z
 * weight by default; an operator lever's pull-up weight for a lever's capstan), wrapped
 * `wraps` turns (default: the profile's).
 */
export function availableTension(
  profile: Profile,
  holdWeightG: number = profile.zWeightG,
  wraps: number = profile.wraps,
): Tension {
  const holdG = holdWeightG * profile.leverRatio;
  const gain = capstanGain(profile.mu, wraps);
  const availableG = holdG * gain;
  return { holdG, gain, availableG, holdN: gramsToNewtons(holdG), availableN: gramsToNewtons(availableG) };
}

/** Turns of cord of a part's capstan: a gate's own `wraps` where it has them, else the profile's. */
export function wrapsOf(part: Part | undefined, profile: Profile): number {
  return part?.kind === 'gate' && part.wraps !== undefined ? part.wraps : profile.wraps;
}

/**
 * The lowest friction coefficient at which a capstan with hold tension `holdG`, wrapped
 * `wraps` turns, still holds `loadG` with the margin `margin` (1: it just holds): from the
 * capstan equation, margin·load = hold·e^(μθ), so μ = ln(margin·load / hold) / θ with
 * θ = 2π·wraps. 0 when the hold tension alone carries it.
 */
export function muNeeded(loadG: number, holdG: number, wraps: number, margin = 1): number {
  return Math.max(0, Math.log((margin * loadG) / holdG) / (2 * Math.PI * wraps));
}

/**
 * The fewest turns, in quarter turns and at least `fromWraps`, at which a capstan with hold
 * tension `holdG` holds `loadG` with the margin `margin` at friction `mu`.
 */
export function wrapsNeeded(loadG: number, holdG: number, mu: number, margin: number, fromWraps: number): number {
  const turns = Math.log((margin * loadG) / holdG) / (2 * Math.PI * mu);
  return Math.max(fromWraps, Math.ceil(turns * 4 - 1e-9) / 4);
}

/** The routing loss of a cord: the profile default with that cord's overrides. */
export function routingFor(profile: Profile, cordId: string): RoutingLoss {
  return { ...profile.routing, ...(profile.cordRouting[cordId] ?? {}) };
}

/** Factor ≥ 1 a branch's load is multiplied by: e^(μ_pin·α) · (1/η)^pulleys. */
export function routingFactor(r: RoutingLoss): number {
  return Math.exp(r.muPin * r.pinAngleRad) * Math.pow(1 / r.pulleyEfficiency, r.pulleys);
}
