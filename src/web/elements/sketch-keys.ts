/**
 * The sketch's keys for drawing (listed for users in docs/designer.md, "Drawing a machine"),
 * each read as what it asks for. Pure: <lw-diagram> does what they ask.
 *
 * On a focused state: T draw a transition from it, F2 rename it, O its outputs, S make it the
 * start, Delete or Backspace delete it, Shift with an arrow key move it a step (MOVE_STEP). While a transition is drawn by keys: the arrow keys or
 * Tab (Shift+Tab back) move to the target, Enter or Space take it, Escape stops. On a focused
 * transition label: ↑ and ↓ choose one of its transitions, F2 or G change its guard, Delete or
 * Backspace delete it. Anywhere in the sketch: N a new state, Ctrl+Z (⌘Z) undo, Ctrl+Shift+Z
 * or Ctrl+Y redo, Escape stops drawing.
 */

/** The parts of a key event the keys are read from. */
export type Key = Pick<KeyboardEvent, 'key' | 'shiftKey' | 'ctrlKey' | 'altKey' | 'metaKey'>;

/** A key with no Ctrl, Alt or ⌘ (Shift allowed). */
export const plain = (ev: Key): boolean => !ev.ctrlKey && !ev.altKey && !ev.metaKey;

const letter = (ev: Key): string => (ev.key.length === 1 ? ev.key.toLowerCase() : ev.key);

export type StateKey = 'link' | 'rename' | 'outputs' | 'start' | 'delete';

const STATE_KEYS: Readonly<Record<string, StateKey>> = {
  t: 'link',
  F2: 'rename',
  o: 'outputs',
  s: 'start',
  Delete: 'delete',
  Backspace: 'delete',
};

export function stateKey(ev: Key): StateKey | undefined {
  return plain(ev) && Object.hasOwn(STATE_KEYS, letter(ev)) ? STATE_KEYS[letter(ev)] : undefined;
}

/** How far Shift and an arrow key move a focused state, in the sketch's pixels (a line of its text). */
export const MOVE_STEP = 16;

const MOVES: Readonly<Record<string, readonly [number, number]>> = {
  ArrowLeft: [-1, 0],
  ArrowRight: [1, 0],
  ArrowUp: [0, -1],
  ArrowDown: [0, 1],
};

/** Shift with an arrow key on a focused state: how far to move it. */
export function moveKey(ev: Key): { readonly dx: number; readonly dy: number } | undefined {
  if (!plain(ev) || !ev.shiftKey || !Object.hasOwn(MOVES, ev.key)) return undefined;
  const [x, y] = MOVES[ev.key];
  return { dx: x * MOVE_STEP, dy: y * MOVE_STEP };
}

/** Move to the next (1) or the previous (-1) item. */
export interface Step {
  readonly step: 1 | -1;
}

export function targetKey(ev: Key): Step | 'take' | 'stop' | undefined {
  if (ev.key === 'ArrowRight' || ev.key === 'ArrowDown' || (ev.key === 'Tab' && !ev.shiftKey)) return { step: 1 };
  if (ev.key === 'ArrowLeft' || ev.key === 'ArrowUp' || ev.key === 'Tab') return { step: -1 };
  if (ev.key === 'Enter' || ev.key === ' ') return 'take';
  return ev.key === 'Escape' ? 'stop' : undefined;
}

export function labelKey(ev: Key): Step | 'guard' | 'delete' | undefined {
  if (!plain(ev)) return undefined;
  if (ev.key === 'ArrowDown') return { step: 1 };
  if (ev.key === 'ArrowUp') return { step: -1 };
  if (ev.key === 'F2' || letter(ev) === 'g') return 'guard';
  return ev.key === 'Delete' || ev.key === 'Backspace' ? 'delete' : undefined;
}

/** Undo (again: false) or redo (again: true). */
export interface Undo {
  readonly again: boolean;
}

export function sketchKey(ev: Key): Undo | 'new-state' | 'stop' | undefined {
  const k = letter(ev);
  if ((ev.ctrlKey || ev.metaKey) && !ev.altKey && (k === 'z' || k === 'y')) return { again: k === 'y' || ev.shiftKey };
  if (plain(ev) && k === 'n') return 'new-state';
  return ev.key === 'Escape' ? 'stop' : undefined;
}
