import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { routedBudgets } from '../../../src/core/checks/budgets.js';
import { findCheck } from '../../../src/core/checks/registry.js';
import { DEFAULT_PROFILE } from '../../../src/core/physics/profile.js';
import { driveBudget } from '../../../src/core/physics/drive.js';
import { lossByBranch } from '../../../src/core/physics/routing.js';
import { analyse, buildMachine, runChecks, type Analysed, type Built } from '../../../src/core/pipeline.js';
import { flatToJsonText, randomFlatMachine } from '../../../src/core/sim/random-machine.js';
import { exampleNames } from './builds.js';

function built(text: string, file: string): { a: Analysed; b: Built } {
  const a = analyse(text, file);
  if (!a.ok) throw new Error(`${file} must analyse`);
  const b = buildMachine(a, { encoding: 'binary', checks: false });
  if (!b.ok) throw new Error(`${file} must build`);
  return { a, b };
}

const subjects = (): [string, { a: Analysed; b: Built }][] => [
  ...exampleNames().map((n): [string, { a: Analysed; b: Built }] => {
    const file = `examples/${n}.lw`;
    return [n, built(readFileSync(file, 'utf8'), file)];
  }),
  ...[[14, 3, 2, 5] as const, [9, 5, 1, 6] as const].map(([s, i, o, seed]): [string, { a: Analysed; b: Built }] => [
    `random ${s} × ${i}`,
    built(flatToJsonText(randomFlatMachine(s, i, o, seed)), `random-${seed}.json`),
  ]),
];

describe('core/checks/budgets', () => {
  it('gives the budgets driveBudget gives with the routed losses, made once per routing, netlist and profile', () => {
    for (const [name, { b }] of subjects()) {
      const { netlist } = b.build;
      const fresh = driveBudget(netlist, DEFAULT_PROFILE, lossByBranch(b.placement.routing));
      const kept = routedBudgets(netlist, DEFAULT_PROFILE, b.placement.routing);
      expect(kept, name).toEqual(fresh);
      expect(routedBudgets(netlist, DEFAULT_PROFILE, b.placement.routing), name).toBe(kept);
      // Another profile is another set of budgets.
      const other = { ...DEFAULT_PROFILE, minMargin: DEFAULT_PROFILE.minMargin + 1 };
      expect(routedBudgets(netlist, other, b.placement.routing), name).toEqual(
        driveBudget(netlist, other, lossByBranch(b.placement.routing)),
      );
    }
  });

  // Budgets, settle programs, move memos and clock records are shared within a build: checking a
  // build again, and checking an equal build made afresh, must give the same results to the byte.
  it('leaves every check result unchanged when a build is checked again or checked afresh', () => {
    for (const [name, { a, b }] of subjects()) {
      const first = JSON.stringify(runChecks(b.build, a, DEFAULT_PROFILE, 1, b.placement));
      expect(JSON.stringify(runChecks(b.build, a, DEFAULT_PROFILE, 1, b.placement)), `${name}, again`).toBe(first);
      const copy = { ...b.build };
      const placement = { ...b.placement, routing: { ...b.placement.routing } };
      expect(JSON.stringify(runChecks(copy, a, DEFAULT_PROFILE, 1, placement)), `${name}, afresh`).toBe(first);
      const drive = findCheck(JSON.parse(first) as ReturnType<typeof runChecks>, 'drive');
      expect(drive?.drivers, name).toEqual(
        driveBudget(b.build.netlist, DEFAULT_PROFILE, lossByBranch(b.placement.routing)),
      );
    }
  });
});
