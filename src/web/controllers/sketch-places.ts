/**
 * The sketch's arrangement as the page keeps it: the places of the states the user moved
 * (diagram/arrange.ts), for the machine on the bench, kept in the browser's storage under the
 * machine's name so that another machine never takes them, for the last SHELF_SIZE machines
 * arranged; a machine renamed in its text takes its places along. Places are whole pixels of the layout's coordinates, so the entry stays small.
 * Nothing here touches the machine's text: an arrangement is a view matter.
 *
 * The stored entry is read once, when the page starts, with the other kept entries, so a broken
 * one is set aside and reported with them (keep.ts).
 */
import type { DiagramLayout, Point } from '../diagram/layout.js';
import { follow, type Places } from '../diagram/arrange.js';
import { keepRead, keepSet, keepDrop, parseJson } from './keep.js';

/** How many machines' arrangements are kept (the most recently arranged first). */
export const SHELF_SIZE = 8;
/** Longest machine name and most states kept for one machine (a bound on what storage holds). */
const MAX_NAME = 200;
const MAX_PLACES = 2000;

/** One machine's arrangement: its name, and where each moved state is. */
export interface Arrangement {
  readonly machine: string;
  readonly at: Readonly<Record<string, readonly [number, number]>>;
}

export type Shelf = readonly Arrangement[];

const isPair = (v: unknown): v is [number, number] =>
  Array.isArray(v) && v.length === 2 && v.every((x) => typeof x === 'number' && Number.isFinite(x));

function isArrangement(v: unknown): v is Arrangement {
  if (typeof v !== 'object' || v === null || Array.isArray(v)) return false;
  const { machine, at } = v as { machine?: unknown; at?: unknown };
  if (typeof machine !== 'string' || machine.length > MAX_NAME) return false;
  if (typeof at !== 'object' || at === null || Array.isArray(at)) return false;
  const values = Object.values(at);
  return values.length <= MAX_PLACES && values.every(isPair);
}

/** The stored entry, or undefined when it does not have the shape written by shelfText. */
export function parseShelf(raw: string): Shelf | undefined {
  const v = parseJson(raw);
  return Array.isArray(v) && v.length <= SHELF_SIZE && v.every(isArrangement) ? v : undefined;
}

export function shelfText(shelf: Shelf): string {
  return JSON.stringify(shelf);
}

/** The places kept for a machine (empty when none). */
export function unshelve(shelf: Shelf, machine: string): Map<string, Point> {
  const a = shelf.find((x) => x.machine === machine);
  return new Map(Object.entries(a?.at ?? {}).map(([id, [x, y]]) => [id, { x, y }]));
}

/** The shelf with a machine's places put first (in whole pixels), or taken off when it has none. */
export function shelve(shelf: Shelf, machine: string, places: Places): Shelf {
  const rest = shelf.filter((x) => x.machine !== machine);
  if (places.size === 0) return rest;
  const at = Object.fromEntries([...places].map(([id, p]) => [id, [Math.round(p.x), Math.round(p.y)] as const]));
  return [{ machine, at }, ...rest].slice(0, SHELF_SIZE);
}

/** Read with the other kept entries when the page starts (see the file comment). */
let kept: Shelf = keepRead('places', parseShelf) ?? [];

/**
 * The arrangement of the machine on the sketch: its places, moved along when the layout is made
 * again, kept in storage whenever they change.
 */
export class SketchPlaces {
  places: ReadonlyMap<string, Point> = new Map();
  /** The machine (by name) the places are of. */
  machine: string | undefined;
  /** A state asked for at a spot, placed there once the layout has it. */
  private due: { readonly id: string; readonly at: Point } | undefined;

  /**
   * Take up the arrangement kept for a machine (the states of `l` only). `was` is the layout
   * shown until now, when the machine on the sketch changed its name by an edit of the text:
   * when it has exactly the states of `l` and the new name has nothing kept, the machine was
   * renamed, and its places go with it (the old name's entry moves to the new one) rather than
   * being left behind under a name no machine has.
   */
  open(machine: string, l: DiagramLayout, was?: DiagramLayout): void {
    const ids = new Set(l.nodes.map((n) => n.id));
    const mine = unshelve(kept, machine);
    const renamed =
      was !== undefined &&
      this.machine !== undefined &&
      this.places.size > 0 &&
      mine.size === 0 &&
      was.nodes.length === ids.size &&
      was.nodes.every((n) => ids.has(n.id));
    this.due = undefined;
    if (renamed) {
      kept = kept.filter((x) => x.machine !== this.machine);
      this.machine = machine;
      this.keep();
      return;
    }
    this.machine = machine;
    this.places = new Map([...mine].filter(([id]) => ids.has(id)));
  }

  /**
   * The layout was made again after an edit of the text: the places follow it (arrange.ts).
   * Returns the name of the state asked for at a spot when it has just been placed there.
   */
  follow(before: DiagramLayout, after: DiagramLayout): string | undefined {
    const next = follow(this.places, before, after);
    const due = this.due;
    const placed = due && after.nodes.some((n) => n.id === due.id) ? due : undefined;
    if (placed) {
      next.set(placed.id, follow(new Map([[placed.id, placed.at]]), before, after).get(placed.id) ?? placed.at);
      this.due = undefined;
    }
    const changed = next.size !== this.places.size || [...next].some(([id, p]) => !same(this.places.get(id), p));
    this.places = next;
    if (changed) this.keep();
    return placed?.id;
  }

  /** Place the state that is about to be added under this name (a new state asked for at a spot). */
  expect(id: string, at: Point): void {
    this.due = { id, at };
  }

  /** Put a state at `at`; `keep` false while it is being dragged (it is kept when it is let go). */
  move(id: string, at: Point, keep = true): void {
    this.places = new Map(this.places).set(id, at);
    if (keep) this.keep();
  }

  /** Every state back where the layout puts it. */
  reset(): void {
    this.places = new Map();
    this.due = undefined;
    this.keep();
  }

  keep(): void {
    if (this.machine === undefined) return;
    kept = shelve(kept, this.machine, this.places);
    // Whole pixels, as stored: the sketch after a reload is the sketch now.
    this.places = unshelve(kept, this.machine);
    if (kept.length === 0) keepDrop('places');
    else keepSet('places', shelfText(kept));
  }
}

function same(a: Point | undefined, b: Point): boolean {
  return a !== undefined && a.x === b.x && a.y === b.y;
}
