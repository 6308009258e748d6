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
 * weight by default; an operator lever's pull-up weight for a lever's capstan).
 */
export function availableTension(profile: Profile, holdWeightG: number = profile.zWeightG): Tension {
  const holdG = holdWeightG * profile.leverRatio;
  const gain = capstanGain(profile.mu, profile.wraps);
  const availableG = holdG * gain;
  return { holdG, gain, availableG, holdN: gramsToNewtons(holdG), availableN: gramsToNewtons(availableG) };
}

/** The routing loss of a cord: the profile default with that cord's overrides. */
export function routingFor(profile: Profile, cordId: string): RoutingLoss {
  return { ...profile.routing, ...(profile.cordRouting[cordId] ?? {}) };
}

/** Factor ≥ 1 a branch's load is multiplied by: e^(μ_pin·α) · (1/η)^pulleys. */
export function routingFactor(r: RoutingLoss): number {
  return Math.exp(r.muPin * r.pinAngleRad) * Math.pow(1 / r.pulleyEfficiency, r.pulleys);
}
