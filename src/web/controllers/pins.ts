/**
 * The parts the workshop keeps in a bay: the build's pins (`--pin PART=BAY@DRUM` on the command
 * line, the core's `pins` option), as the frame view sets them. Pure: a part dragged onto a bay
 * or named in the view's field becomes a pin here, the pins become the command line's options,
 * go into the browser's storage and come back out of it, and the build's own word on each pin
 * (LW707, LW708, located at `--pin PART`) is found for the view to show beside it.
 */
import type { Diagnostic, Pin, Placement } from '../../core/index.js';
import { parseJson } from './keep.js';

/** Pins by part id, in the order they were set (the command line's order too). */
export type Pins = Readonly<Record<string, Pin>>;

/** A bay of the frame: its drum and bay, both counted from 1 (drum 1 the lowest, bay 1 at the visitor end). */
export interface BaySpot {
  readonly drum: number;
  readonly bay: number;
}

/** One pin as the command line writes it: PART=BAY, with @DRUM when it is not drum 1. */
export function pinWords(part: string, pin: Pin): string {
  return `${part}=${pin.bay}${pin.drum !== undefined && pin.drum !== 1 ? `@${pin.drum}` : ''}`;
}

/** The pin of a spot, written the shortest way (no drum for drum 1, as `--pin PART=BAY` gives it). */
export function pinAt(spot: BaySpot): Pin {
  return spot.drum === 1 ? { bay: spot.bay } : { bay: spot.bay, drum: spot.drum };
}

/** The spot of a pin (drum 1 when it names none): the inverse of `pinAt`. */
export function spotOfPin(pin: Pin): BaySpot {
  return { drum: pin.drum ?? 1, bay: pin.bay };
}

/** The same pins with `part` kept at `pin` (a part pinned again keeps its place in the order). */
export function withPin(pins: Pins | undefined, part: string, pin: Pin): Pins {
  return Object.fromEntries([...Object.entries(pins ?? {}).filter(([p]) => p !== part), [part, pin]]);
}

/** The same pins without `part`'s; undefined when none is left. */
export function withoutPin(pins: Pins | undefined, part: string): Pins | undefined {
  const left = Object.entries(pins ?? {}).filter(([p]) => p !== part);
  return left.length > 0 ? Object.fromEntries(left) : undefined;
}

/** Where a part stands in a placement (its own bay, or the first bay of the latch it names); undefined when it has none. */
export function bayOf(placement: Placement | undefined, part: string): BaySpot | undefined {
  const b = placement?.bays.find((x) => x.part === part) ?? placement?.bays.find((x) => x.unit === part);
  return b ? { drum: b.drum, bay: b.bay } : undefined;
}

/**
 * The pin a part dropped on a bay asks for; undefined when it was dropped where it stands (no
 * pin to set), or it is not a part of this placement.
 */
export function pinForDrop(placement: Placement | undefined, part: string, to: BaySpot): Pin | undefined {
  const at = bayOf(placement, part);
  if (!at || (at.drum === to.drum && at.bay === to.bay)) return undefined;
  return pinAt(to);
}

/**
 * A bay named in the view's field: whole numbers from 1 (an empty drum is drum 1); undefined for
 * anything else (the field says so and sets no pin). Whether the frame has that bay is the
 * build's to say (LW707, LW708), as for the command line.
 */
export function spotFrom(bay: string, drum: string): BaySpot | undefined {
  const b = /^\s*\d+\s*$/.test(bay) ? Number(bay) : NaN;
  const d = drum.trim() === '' ? 1 : /^\s*\d+\s*$/.test(drum) ? Number(drum) : NaN;
  return Number.isSafeInteger(b) && b >= 1 && Number.isSafeInteger(d) && d >= 1 ? { drum: d, bay: b } : undefined;
}

/** The --pin options of the pins, in their order. */
export function pinOptions(pins: Pins | undefined): string[] {
  return Object.entries(pins ?? {}).flatMap(([part, pin]) => ['--pin', pinWords(part, pin)]);
}

/** The pins as the browser keeps them: their entries in order, as JSON. */
export function storedPins(pins: Pins): string {
  return JSON.stringify(Object.entries(pins));
}

const whole = (v: unknown): v is number => typeof v === 'number' && Number.isSafeInteger(v) && v >= 1;

/** Stored pins read back, only when every entry has the shape of one (keep.ts sets anything else aside). */
export function parseStoredPins(raw: string): Pins | undefined {
  const v = parseJson(raw);
  if (!Array.isArray(v) || v.length === 0) return undefined;
  const out: [string, Pin][] = [];
  for (const e of v as unknown[]) {
    if (!Array.isArray(e) || e.length !== 2) return undefined;
    const [part, pin] = e as [unknown, unknown];
    if (typeof part !== 'string' || part === '' || typeof pin !== 'object' || pin === null) return undefined;
    const { bay, drum } = pin as Record<string, unknown>;
    if (!whole(bay) || (drum !== undefined && !whole(drum))) return undefined;
    out.push([part, drum === undefined ? { bay } : { bay, drum }]);
  }
  return Object.fromEntries(out);
}

/** The pins naming a part this placement does not have (the machine changed since they were set). */
export function pinsAway(pins: Pins | undefined, placement: Placement | undefined): string[] {
  if (!placement) return [];
  return Object.keys(pins ?? {}).filter((part) => bayOf(placement, part) === undefined);
}

/** What the build said about one pin: its diagnostics located at `--pin PART` (LW707, LW708). */
export function pinNotes(diagnostics: readonly Diagnostic[], part: string): Diagnostic[] {
  return diagnostics.filter((d) => d.location.path === `--pin ${part}`);
}
