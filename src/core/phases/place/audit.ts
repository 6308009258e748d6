/**
 * An audit of a placement against the netlist and the profile, from the outside: what a
 * layout check reports. It re-derives every rule from the placement's own figures, so a
 * placement edited by hand, or one from an older run, is judged the same way.
 *
 * Findings: a part with no bay or with two; two parts in one bay; bays on a drum not counted
 * 1, 2, 3 … without gaps, or not side by side; a latch whose gates are not neighbours; an
 * operator lever or actuator exit not at the visitor end of drum 1, or a clock or reset lever
 * not at its crank end (unless pinned there by the user); a drum longer than allowed; more
 * drums than the frame carries; a branch of non-positive length, or whose length is not the
 * runs it is cut as (its own segments of the cord's tree, physics/routing.ts) plus the
 * allowances. The force margins with the computed routing are the drive check's.
 */
import type { Netlist, Part } from '../../model/netlist.js';
import type { Profile } from '../../physics/profile.js';
import type { Placement } from './placement.js';
import { fixed, inMetres, lengthFigure, plain, say, wordsIn, type Words } from '../../model/units.js';

export interface AuditFinding {
  readonly rule:
    | 'no-bay'
    | 'shared-bay'
    | 'bay-order'
    | 'latch-apart'
    | 'end-rule'
    | 'drum-too-long'
    | 'too-many-drums'
    | 'branch-length';
  readonly message: string;
  /** The message with its lengths as typed figures (model/units.ts), where it has any; `message` is it in metric. */
  readonly says?: Words;
  /** What to change. */
  readonly hint: string;
}

const TOLERANCE_M = 1e-6;

function placeable(p: Part): boolean {
  return p.kind === 'gate' || p.kind === 'lever' || (p.kind === 'actuator' && p.fixed === undefined);
}

function baysFindings(netlist: Netlist, placement: Placement, out: AuditFinding[]): void {
  const seen = new Map<string, number>();
  for (const b of placement.bays) seen.set(b.part, (seen.get(b.part) ?? 0) + 1);
  for (const p of netlist.parts.filter(placeable)) {
    const k = seen.get(p.id) ?? 0;
    if (k !== 1)
      out.push({
        rule: 'no-bay',
        message: k === 0 ? `'${p.id}' has no bay` : `'${p.id}' has ${k} bays`,
        hint: 'place the build again',
      });
  }
  const owner = new Map<string, string>();
  for (const b of placement.bays) {
    const key = `${b.drum}:${b.bay}`;
    const other = owner.get(key);
    if (other !== undefined)
      out.push({
        rule: 'shared-bay',
        message: `'${b.part}' and '${other}' share bay ${b.bay} of drum ${b.drum}`,
        hint: 'give each part a bay of its own (check the pins)',
      });
    owner.set(key, b.part);
  }
  for (const d of placement.drums) {
    const on = placement.bays.filter((b) => b.drum === d.drum).sort((a, b) => a.bay - b.bay);
    let x = 0;
    on.forEach((b, i) => {
      if (b.bay !== i + 1 || Math.abs(b.xM - (x + b.widthM / 2)) > TOLERANCE_M)
        out.push({
          rule: 'bay-order',
          message: `bay ${b.bay} of drum ${d.drum} ('${b.part}') is not where the bays before it end`,
          hint: 'place the build again',
        });
      x += b.widthM;
    });
  }
}

function latchAndEndFindings(
  netlist: Netlist,
  placement: Placement,
  pinned: ReadonlySet<string>,
  out: AuditFinding[],
): void {
  const at = new Map(placement.bays.map((b) => [b.part, b]));
  for (const l of netlist.parts) {
    if (l.kind !== 'latch') continue;
    const s = at.get(l.setGate);
    const r = at.get(l.resetGate);
    if (s && r && (s.drum !== r.drum || Math.abs(s.bay - r.bay) !== 1))
      out.push({
        rule: 'latch-apart',
        message: `latch '${l.id}' has its gates in bay ${s.bay} of drum ${s.drum} and bay ${r.bay} of drum ${r.drum}`,
        hint: 'put a latch’s two gates in neighbouring bays (check the pins)',
      });
  }
  const drum1 = placement.bays.filter((b) => b.drum === 1 && !pinned.has(b.part)).sort((a, b) => a.bay - b.bay);
  const zoneOf = new Map(
    netlist.parts.map((p) => [p.id, p.kind === 'lever' ? (p.role === 'input' ? 0 : 2) : p.kind === 'actuator' ? 0 : 1]),
  );
  let zone = 0;
  for (const b of drum1) {
    const z = zoneOf.get(b.part) ?? 1;
    if (z < zone)
      out.push({
        rule: 'end-rule',
        message: `'${b.part}' in bay ${b.bay} is not at its end of drum 1 (operator levers at the visitor end, clock and reset levers at the crank end)`,
        hint: 'move it to its end, or pin it where it is wanted',
      });
    zone = Math.max(zone, z);
  }
  for (const b of placement.bays)
    if (b.drum !== 1 && (zoneOf.get(b.part) ?? 1) !== 1 && !pinned.has(b.part))
      out.push({
        rule: 'end-rule',
        message: `'${b.part}' sits on drum ${b.drum}; operator, clock and reset levers belong on drum 1`,
        hint: 'move it to drum 1, or pin it where it is wanted',
      });
}

function frameFindings(placement: Placement, profile: Profile, out: AuditFinding[]): void {
  const f = profile.frame;
  for (const d of placement.drums)
    if (d.lengthM > f.longestDrumM + TOLERANCE_M) {
      const says = say`drum ${d.drum} is ${lengthFigure(d.lengthM)} long; the longest allowed is ${lengthFigure(f.longestDrumM, inMetres(plain))}`;
      out.push({
        rule: 'drum-too-long',
        message: wordsIn(says, 'metric'),
        says,
        hint: 'allow a longer drum (frame.longestDrumM), or more drums per frame (frame.drumsPerFrame)',
      });
    }
  if (placement.drums.length > f.drumsPerFrame)
    out.push({
      rule: 'too-many-drums',
      message: `the machine takes ${placement.drums.length} drums; the frame carries ${f.drumsPerFrame}`,
      hint: 'allow more drums per frame (frame.drumsPerFrame), or a longer drum (frame.longestDrumM)',
    });
  for (const b of placement.routing.branches) {
    const runs = b.own.reduce((s, r) => s + r.lengthM, 0);
    const want = runs + 2 * f.knotAllowanceM + f.takeUpAllowanceM;
    if (!(b.lengthM > 0) || Math.abs(b.lengthM - want) > TOLERANCE_M) {
      const says = say`branch of cord '${b.cord}' to '${b.target}' is ${lengthFigure(b.lengthM, inMetres(fixed(3)))}; its own runs and allowances make ${lengthFigure(want, inMetres(fixed(3)))}`;
      out.push({
        rule: 'branch-length',
        message: wordsIn(says, 'metric'),
        says,
        hint: 'route the build again with this profile',
      });
    }
  }
}

/** Every rule a placement breaks, with what to change; empty when it keeps them all. `pinned`: part ids the user pinned. */
export function auditPlacement(
  netlist: Netlist,
  placement: Placement,
  profile: Profile,
  pinned: ReadonlySet<string> = new Set(),
): AuditFinding[] {
  const out: AuditFinding[] = [];
  baysFindings(netlist, placement, out);
  latchAndEndFindings(netlist, placement, pinned, out);
  frameFindings(placement, profile, out);
  return out;
}
