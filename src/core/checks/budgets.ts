/**
 * The force budgets of a build with its cords as routed, which the drive check and the layout
 * check both judge: made once per routing, netlist and profile (physics/drive.ts
 * `driveBudget` with physics/routing.ts `lossByBranch`) and shared, instead of made by each.
 * The memo holds a routing's budgets only while the routing itself is kept (a WeakMap), and
 * tells netlists and profiles apart by identity: the core treats all three as immutable.
 */
import type { Netlist } from '../model/netlist.js';
import type { Routing } from '../physics/routing.js';
import { driveBudget, type DriverBudget } from '../physics/drive.js';
import type { Profile } from '../physics/profile.js';
import { lossByBranch } from '../physics/routing.js';

interface Kept {
  readonly netlist: Netlist;
  readonly profile: Profile;
  readonly budgets: readonly DriverBudget[];
}

const kept = new WeakMap<Routing, Kept[]>();

/** Every driver's budget with each branch at its routed loss (driveBudget's order and figures). */
export function routedBudgets(netlist: Netlist, profile: Profile, routing: Routing): readonly DriverBudget[] {
  let list = kept.get(routing);
  if (!list) kept.set(routing, (list = []));
  const hit = list.find((k) => k.netlist === netlist && k.profile === profile);
  if (hit) return hit.budgets;
  const budgets = driveBudget(netlist, profile, lossByBranch(routing));
  list.push({ netlist, profile, budgets });
  return budgets;
}
