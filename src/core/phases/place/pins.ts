/**
 * Pins: parts the user fixes to a bay ("bay 7, drum 1", counted from 1 at the visitor end).
 * A pin wins over the end rules. A latch's id pins its set side to the bay and its reset side
 * to the next one; a latch gate's id pins that gate alone. Every pin that cannot be kept is
 * reported, with what to change, and dropped: an unknown part (with a did-you-mean), a part
 * that takes no bay (a flag), a bay or drum out of range, two pins on one bay (these four are
 * wrong whatever the build), a bay past the last one its drum has in this build, or pins that
 * no order can meet together (these two depend on the build).
 */
import { diag, didYouMean, type Diagnostic } from '../../model/diagnostics.js';
import type { Netlist, Part } from '../../model/netlist.js';
import type { FrameUnits } from './units.js';

export interface Pin {
  /** Counted from 1 at the visitor end of its drum. */
  readonly bay: number;
  /** Counted from 1, the lowest drum first (default 1). */
  readonly drum?: number;
}

export type PlacementProblem = { readonly message: string; readonly hint?: string } & (
  | { readonly kind: 'pin-unknown-part'; readonly part: string }
  | { readonly kind: 'pin-not-placeable'; readonly part: string }
  | { readonly kind: 'pin-out-of-range'; readonly part: string; readonly drum: number; readonly bay: number }
  | {
      readonly kind: 'pin-clash';
      readonly part: string;
      readonly other: string;
      readonly drum: number;
      readonly bay: number;
    }
  | {
      readonly kind: 'pin-beyond-drum';
      readonly part: string;
      readonly drum: number;
      readonly bay: number;
      /** Bays the drum has in this build. */
      readonly bays: number;
    }
  | { readonly kind: 'pin-unmet'; readonly part: string; readonly drum: number; readonly bay: number }
  | { readonly kind: 'bay-too-wide'; readonly part: string; readonly widthM: number; readonly longestM: number }
  | { readonly kind: 'drum-too-long'; readonly drum: number; readonly lengthM: number; readonly longestM: number }
  | { readonly kind: 'too-many-drums'; readonly drums: number; readonly allowed: number }
);

/** A pin on one bay: its part, drum (0-based) and bay index (0-based). */
interface BayPin {
  readonly part: string;
  readonly bay: number;
  readonly drum: number;
  readonly index: number;
}

export interface CheckedPins {
  readonly problems: readonly PlacementProblem[];
  /** Per unit: the drum (0-based) it must be on, or −1. Units at either end go on drum 0 unless pinned. */
  readonly fixedDrum: Int32Array;
  /** Per drum (0-based) with pins: the bays it must keep so that its farthest pinned bay exists. */
  readonly baysNeeded: ReadonlyMap<number, number>;
  /** The pins whose bay exists on their drum under a split, by bay; the others reported. */
  inRange(
    drumOf: Int32Array,
    drums: number,
  ): { pins: Map<number, { drum: number; index: number }>; problems: PlacementProblem[] };
  /** The problems of every pin on drum d (0-based), when they could not be met together. */
  unmetOn(d: number): PlacementProblem[];
}

const whole = (x: unknown, lo: number): x is number => typeof x === 'number' && Number.isInteger(x) && x >= lo;

/** What one pin asks for: the part ids to put in which bay (1-based), or why it cannot be kept. */
function readPin(
  part: string,
  pin: Pin,
  parts: ReadonlyMap<string, Part>,
  fu: FrameUnits,
  drumsPerFrame: number,
): PlacementProblem | { readonly drum: number; readonly ids: readonly (readonly [string, number])[] } {
  const p = parts.get(part);
  const drum = pin.drum ?? 1;
  if (!p) {
    const guess = didYouMean(part, [...fu.unitOf.keys()]);
    return {
      kind: 'pin-unknown-part',
      part,
      message: `a pin names '${part}', which is not a part of this build`,
      hint: guess ? `did you mean '${guess}'?` : 'pin a gate, latch, lever or actuator by its id',
    };
  }
  if (!fu.unitOf.has(part))
    return {
      kind: 'pin-not-placeable',
      part,
      message: `'${part}' takes no bay of its own, so it cannot be pinned`,
      hint:
        p.kind === 'flag'
          ? `a flag rides on its gate: pin '${p.gate}' instead`
          : 'pin a gate, latch, lever or actuator',
    };
  if (!whole(pin.bay, 1) || !whole(drum, 1) || drum > drumsPerFrame)
    return {
      kind: 'pin-out-of-range',
      part,
      drum: Number(drum),
      bay: Number(pin.bay),
      message: `'${part}' is pinned to bay ${String(pin.bay)} of drum ${String(drum)}, which the frame does not have`,
      hint: `bays and drums count from 1; the frame carries ${drumsPerFrame} drum${drumsPerFrame === 1 ? '' : 's'}`,
    };
  const ids: (readonly [string, number])[] =
    p.kind === 'latch'
      ? [
          [p.setGate, pin.bay],
          [p.resetGate, pin.bay + 1],
        ]
      : [[part, pin.bay]];
  return { drum, ids };
}

/** Check the pins against the netlist and the frame; what survives is kept per bay. */
export function checkPins(
  netlist: Netlist,
  fu: FrameUnits,
  pins: Readonly<Record<string, Pin>>,
  drumsPerFrame: number,
): CheckedPins {
  const problems: PlacementProblem[] = [];
  const parts = new Map(netlist.parts.map((p) => [p.id, p]));
  const kept: BayPin[] = [];
  const taken = new Map<string, string>();
  for (const [part, pin] of Object.entries(pins)) {
    const read = readPin(part, pin, parts, fu, drumsPerFrame);
    if ('kind' in read) {
      problems.push(read);
      continue;
    }
    for (const [id, bay] of read.ids) {
      const other = taken.get(`${read.drum}:${bay}`);
      if (other !== undefined) {
        problems.push({
          kind: 'pin-clash',
          part,
          other,
          drum: read.drum,
          bay,
          message: `'${part}' and '${other}' are both pinned to bay ${bay} of drum ${read.drum}`,
          hint: 'pin one of them to another bay',
        });
        continue;
      }
      taken.set(`${read.drum}:${bay}`, part);
      kept.push({ part, bay: fu.bayOf.get(id) as number, drum: read.drum - 1, index: bay - 1 });
    }
  }
  const fixedDrum = Int32Array.from(fu.units, (u) => (u.zone === 1 ? -1 : 0));
  const baysNeeded = new Map<number, number>();
  for (const k of kept) {
    fixedDrum[fu.bays[k.bay].unit] = k.drum;
    baysNeeded.set(k.drum, Math.max(baysNeeded.get(k.drum) ?? 0, k.index + 1));
  }
  return {
    problems,
    fixedDrum,
    baysNeeded,
    inRange: (drumOf, drums) => inRange(fu, kept, drumOf, drums),
    unmetOn: (d) =>
      kept
        .filter((k) => k.drum === d)
        .map((k) => ({
          kind: 'pin-unmet',
          part: k.part,
          drum: k.drum + 1,
          bay: k.index + 1,
          message: `'${k.part}' could not be kept in bay ${k.index + 1} of drum ${k.drum + 1}: the pins on this drum cannot all be met together`,
          hint: 'move a pin by one bay, or drop it',
        })),
  };
}

function inRange(
  fu: FrameUnits,
  kept: readonly BayPin[],
  drumOf: Int32Array,
  drums: number,
): { pins: Map<number, { drum: number; index: number }>; problems: PlacementProblem[] } {
  const count = new Array<number>(drums).fill(0);
  fu.units.forEach((u, i) => (count[drumOf[i]] += u.bays.length));
  const pins = new Map<number, { drum: number; index: number }>();
  const problems: PlacementProblem[] = [];
  for (const k of kept) {
    if (k.drum < drums && k.index < count[k.drum]) pins.set(k.bay, { drum: k.drum, index: k.index });
    else
      problems.push({
        kind: 'pin-beyond-drum',
        part: k.part,
        drum: k.drum + 1,
        bay: k.index + 1,
        bays: count[k.drum] ?? 0,
        message: `'${k.part}' is pinned to bay ${k.index + 1} of drum ${k.drum + 1}, which has ${count[k.drum] ?? 0} bays`,
        hint: `pin it to a bay from 1 to ${count[k.drum] ?? 0}`,
      });
  }
  return { pins, problems };
}

/** Pin problems as diagnostics: LW707 for a pin that is wrong whatever the build, LW708 for one this build could not keep. */
export function pinDiagnostics(problems: readonly PlacementProblem[]): Diagnostic[] {
  const out: Diagnostic[] = [];
  for (const p of problems) {
    if (p.kind === 'pin-unmet' || p.kind === 'pin-beyond-drum')
      out.push(diag('LW708', p.message, { path: `--pin ${p.part}` }, p.hint));
    else if (p.kind.startsWith('pin-') && 'part' in p)
      out.push(diag('LW707', p.message, { path: `--pin ${p.part}` }, p.hint));
  }
  return out;
}
