/**
 * The `layout` check: the build's place in the frame keeps every rule of design §11, and the
 * force budgets still hold with the cords as routed.
 *
 * What it proves, from the placement's own figures (phases/place/audit.ts re-derives every
 * rule, so it judges any placement the same way): every gate, lever and actuator has exactly
 * one bay and no two share one; the bays of each drum are counted 1, 2, 3 … side by side; a
 * latch's gates are neighbours; operator levers sit at the visitor end of drum 1 and clock and
 * reset levers at its crank end (unless pinned); every drum is within the longest allowed, and
 * the frame carries every drum; every branch is longer than 0 and as long as the runs it is cut
 * as (its own segments of the cord's tree) and the allowances. Then every capstan's margin with each branch's routed loss — pulleys at η each
 * and pins by the capstan equation of Euler and Eytelwein (physics/routing.ts) — must be at
 * least profile.minMargin (the same budget as the drive check, physics/drive.ts).
 * A failure says what to change: a longer drum allowed, a second drum, more wraps, a buffer
 * tree. A pulley whose bend radius is under 4 × the cord diameter (rope-rescue practice) is a
 * note, not a failure: it costs more force than the figures say.
 */
import type { CheckBase } from '../model/build.js';
import type { Netlist } from '../model/netlist.js';
import { auditPlacement, type AuditFinding, type Placement } from '../phases/place/index.js';
import type { Profile } from '../physics/profile.js';
import { routedBudgets } from './budgets.js';
import { budgetWords } from '../physics/drive.js';
import {
  fixed,
  inMetres,
  inMillimetres,
  joinWords,
  lengthFigure,
  plain,
  say,
  sizeFigure,
  wordsIn,
  type Words,
} from '../model/units.js';

/** One rule the layout breaks, and what to change. */
export interface LayoutFinding {
  readonly rule: AuditFinding['rule'] | 'margin';
  readonly message: string;
  /** The message with its figures typed (model/units.ts), where it has any. */
  readonly says?: Words;
  readonly hint: string;
  /** The hint with its figures typed, where it has any. */
  readonly hintSays?: Words;
}

export interface LayoutResult extends CheckBase<'layout'> {
  /** How the bays were ordered: 'exact', 'heuristic' or 'netlist' (the netlist's own order was shortest). */
  readonly method: Placement['method'];
  /** One drum whose order is a proven minimum. */
  readonly exact: boolean;
  readonly drums: readonly { readonly drum: number; readonly lengthM: number; readonly bays: number }[];
  readonly longestDrumM: number;
  readonly drumsAllowed: number;
  /** Every cord's cut length together, and the same routed in the netlist's own order. */
  readonly totalCordM: number;
  readonly baselineCordM: number;
  readonly pulleys: number;
  /** Smallest force margin with the routed cords (null without loaded drivers). */
  readonly minMargin: number | null;
  readonly findings: readonly LayoutFinding[];
  /** Things to know that do not fail the check (a tight bend). */
  readonly notes: readonly string[];
}

/** Judge a placement of `netlist` under `profile`. */
export function checkLayout(netlist: Netlist, placement: Placement, profile: Profile): LayoutResult {
  const findings: LayoutFinding[] = [...auditPlacement(netlist, placement, profile, new Set(placement.pinned))];
  const budgets = routedBudgets(netlist, profile, placement.routing);
  for (const b of budgets)
    if (!b.ok) {
      const w = budgetWords(b, profile);
      const says = say`with its cords as routed, ${w.message}`;
      const hintSays = joinWords(w.fixes, '; or ');
      findings.push({
        rule: 'margin',
        message: wordsIn(says, 'metric'),
        says,
        hint: wordsIn(hintSays, 'metric'),
        hintSays,
      });
    }
  const loaded = budgets.filter((b) => Number.isFinite(b.margin));
  const minMargin = loaded.length > 0 ? Math.min(...loaded.map((b) => b.margin)) : null;
  const bend = placement.routing.bend;
  // Typed figures (model/units.ts): `summary` and `notes` are these in metric, `says` for the workshop's units.
  const noteWords: Words[] = bend.ok
    ? []
    : [
        say`pulleys of ${sizeFigure(bend.radiusM * 2, inMillimetres(fixed(0)))} bend the cord tighter than 4 × its diameter (at least ${sizeFigure(bend.minRadiusM * 2, inMillimetres(fixed(0)))} across): they cost more force than the figures say`,
      ];
  const notes = noteWords.map((w) => wordsIn(w, 'metric'));
  const drums = placement.drums.map((d) => ({ drum: d.drum, lengthM: d.lengthM, bays: d.bays.length }));
  const ok = findings.length === 0;
  const eachDrum = joinWords(
    drums.map((d) => say`${lengthFigure(d.lengthM)}, ${d.bays} bays`),
    '; ',
  );
  const frame = say`${drums.length === 1 ? '1 drum' : `${drums.length} drums`} (${eachDrum}; longest allowed ${lengthFigure(placement.longestDrumM, inMetres(plain))})`;
  const cord = say`${lengthFigure(placement.totalCordM)} of cord to cut (${lengthFigure(placement.baselineCordM)} in netlist order), ${placement.pulleys} pulleys`;
  const noted = noteWords.length > 0 ? say`; note: ${joinWords(noteWords, '; ')}` : [];
  const first = findings[0];
  const says = ok
    ? say`every part in a bay of its own on ${frame}, ${placement.method} order; ${cord}; smallest margin with the routed cords ${minMargin === null ? '—' : minMargin.toFixed(2)}${noted}`
    : say`${findings.length} ${findings.length === 1 ? 'problem' : 'problems'} on ${frame}: ${first.says ?? [first.message]}; fix: ${first.hintSays ?? [first.hint]}${findings.length > 1 ? ` (and ${findings.length - 1} more)` : ''}`;
  const summary = wordsIn(says, 'metric');
  return {
    name: 'layout',
    ok,
    summary,
    says,
    method: placement.method,
    exact: placement.exact,
    drums,
    longestDrumM: placement.longestDrumM,
    drumsAllowed: placement.drumsAllowed,
    totalCordM: placement.totalCordM,
    baselineCordM: placement.baselineCordM,
    pulleys: placement.pulleys,
    minMargin,
    findings,
    notes,
  };
}
