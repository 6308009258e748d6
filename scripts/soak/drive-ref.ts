/**
 * An independent reading of the capstan budgets (DESIGN.md §4; the capstan equation of
 * Euler–Eytelwein, T_load = T_hold · e^(μθ)), from the netlist and the profile alone: for each
 * driver, the hold weight (an operator, clock or reset lever's pull-up, or Z's weight) times
 * the lever ratio times e^(μ · 2π · turns) is what it can pull; the sum over the ports it pulls
 * of each port's weight plus the Z lever it drags (Z alone in a one-port gate), plus any
 * actuator load, is the least it must pull (routing only adds to it). A drive check that
 * passes while some driver's margin on that least load is under the profile's minimum is
 * wrong; so is a reported gain or available tension off the equation.
 */
import type { Built } from '../../src/core/index.js';
import { findCheck } from '../../src/core/index.js';

/** The first disagreement between the drive check and the capstan equation, in words; undefined when none. */
export function driveDisagreement(b: Built): string | undefined {
  const drive = findCheck(b.checks, 'drive');
  if (!drive) return undefined;
  const p = b.profile;
  const parts = new Map(b.build.netlist.parts.map((x) => [x.id, x]));
  const least = new Map<string, number>();
  for (const c of b.build.netlist.cords) {
    let g = least.get(c.driver) ?? 0;
    for (const port of c.ports) {
      const part = parts.get(port.part);
      g += part?.kind === 'gate' && part.ports.length === 1 ? p.zWeightG : p.portWeightG + p.zWeightG;
    }
    for (const a of c.actuators) {
      const part = parts.get(a);
      if (part?.kind === 'actuator') g += part.loadG;
    }
    least.set(c.driver, g);
  }
  for (const [driver, loadG] of least) {
    const part = parts.get(driver);
    if (!part || loadG === 0) continue;
    const wraps = part.kind === 'gate' ? (part.wraps ?? p.wraps) : p.wraps;
    const hold = part.kind === 'lever' ? p.leverWeightG : p.zWeightG;
    const available = hold * p.leverRatio * Math.exp(p.mu * 2 * Math.PI * wraps);
    const reported = drive.drivers.find((d) => d.driver === driver);
    if (reported && Math.abs(reported.availableG - available) > 1e-6 * available)
      return `driver ${driver}: available ${reported.availableG} g, the capstan equation gives ${available} g`;
    if (reported && reported.loadG < loadG - 1e-6)
      return `driver ${driver}: load ${reported.loadG} g is below the least load ${loadG} g`;
    if (drive.ok && available / loadG < p.minMargin - 1e-9)
      return `drive passes, but driver ${driver} has margin ${(available / loadG).toFixed(3)} < ${p.minMargin} on its least load`;
  }
  return undefined;
}
