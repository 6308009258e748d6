/**
 * What the user does to draw on the sketch, for <lw-diagram>: the inline field opened at a spot
 * (a new state, a guard, a new name, outputs) and submitted as one edit of the text; a
 * transition drawn by dragging a state's dot or by keys (T, then the arrows or Tab, Enter);
 * the keys on a state, on a transition label and anywhere in the sketch (sketch-keys.ts);
 * a picked item started, deleted or made the start; a focused state moved by Shift and the
 * arrow keys (moving by dragging is sketch-moves.ts). The drawing's state is SketchDraw's
 * (controllers/sketch-draw.ts); the element keeps the view (zoom, fit) and the SVG.
 * Events, sent from the element: `reveal` {line, column}, `text-edit` {edit}, `undo` {again}.
 */
import { pointer, select } from 'd3';
import type { Machine } from '../../core/index.js';
import type { DiagramLayout, LaidEdge, LaidNode, Point } from '../diagram/layout.js';
import type { FieldKind, Picked, SketchDraw, Spot } from '../controllers/sketch-draw.js';
import type { TextEdit } from '../controllers/table-edit.js';
import { labelKey, moveKey, sketchKey, stateKey, targetKey } from './sketch-keys.js';
import { emit } from './emit.js';

/** The sketch element as its gestures see it. */
export interface SketchHost extends HTMLElement {
  readonly renderRoot: HTMLElement | DocumentFragment;
  readonly machine: Machine | undefined;
  readonly text: string;
  readonly frozen: boolean;
  readonly layout: DiagramLayout | undefined;
  readonly drawable: boolean;
  /** Move a state by (dx, dy) in the layout's coordinates (a view matter: the text stays). */
  moveBy(id: string, dx: number, dy: number): void;
  /** A new state about to be added under this name goes to `at` (layout coordinates) once it is drawn. */
  expectState(id: string, at: Point): void;
}

/** Enter or Space on a focused sketch item: find it in the text, and let the key do nothing else. */
function onActivate(ev: KeyboardEvent, line: number | undefined, reveal: (line: number | undefined) => void): void {
  if (ev.key !== 'Enter' && ev.key !== ' ') return;
  ev.preventDefault();
  ev.stopPropagation();
  reveal(line);
}

export class SketchGestures {
  /** A state to give the focus to once it is drawn (after a rename or a new state). */
  focusDue: string | undefined;

  constructor(
    private readonly host: SketchHost,
    private readonly draw: SketchDraw,
  ) {}

  nodeElement(id: string): SVGGElement | undefined {
    return [...this.host.renderRoot.querySelectorAll<SVGGElement>('g.node')].find((g) => g.dataset.state === id);
  }

  /** A point of the screen as a spot on this element (where a field opens). */
  spotOf(clientX: number, clientY: number): Spot {
    const r = this.host.getBoundingClientRect();
    return { x: clientX - r.left, y: clientY - r.top };
  }

  /** The spot just under a state (or the middle of the canvas). */
  spotUnder(id: string): Spot {
    const b =
      this.nodeElement(id)?.getBoundingClientRect() ??
      this.host.renderRoot.querySelector('svg')?.getBoundingClientRect();
    return b ? this.spotOf(b.left, b.bottom + 4) : { x: 8, y: 40 };
  }

  openField(
    kind: FieldKind,
    at: Spot,
    more: { state?: string; to?: string; index?: number; place?: Point } = {},
  ): void {
    const m = this.host.machine;
    if (!m || !this.host.drawable) return;
    if (this.host.frozen) return this.draw.say('The text is being read: draw again in a moment.');
    // Keep the field inside the sketch (it is about 17rem wide and, with a reason shown, 11rem high).
    const x = Math.max(0, Math.min(at.x, this.host.clientWidth - 270));
    const y = Math.max(0, Math.min(at.y, this.host.clientHeight - 180));
    this.draw.open(kind, { x, y }, m, more);
  }

  openNewState(): void {
    const b = this.host.renderRoot.querySelector('svg')?.getBoundingClientRect();
    this.openField('new-state', b ? this.spotOf(b.left + b.width / 3, b.top + b.height / 3) : { x: 8, y: 40 });
  }

  openGuard(e: LaidEdge, index: number): void {
    const g = [...this.host.renderRoot.querySelectorAll<SVGGElement>('g.label')].find(
      (x) => select<SVGGElement, LaidEdge>(x).datum() === e,
    );
    const b = g?.getBoundingClientRect();
    this.openField('guard', b ? this.spotOf(b.left, b.bottom + 4) : { x: 8, y: 40 }, {
      state: e.from,
      to: e.to,
      index,
    });
  }

  /** The item picked, while the sketch still has it (a deletion or a rename in the text takes it away). */
  picked(): Picked | undefined {
    const p = this.draw.picked;
    const l = this.host.layout;
    if (!p || !l) return undefined;
    const there =
      p.kind === 'state'
        ? l.nodes.some((n) => n.id === p.id)
        : l.edges.some((e) => e.from === p.from && e.to === p.to && p.index < e.lines.length);
    return there ? p : undefined;
  }

  openOnPicked(kind: 'rename' | 'outputs' | 'guard'): void {
    const p = this.picked();
    if (p?.kind === 'state' && kind !== 'guard') this.openField(kind, this.spotUnder(p.id), { state: p.id });
    const e = p?.kind === 'edge' ? this.host.layout?.edges.find((x) => x.from === p.from && x.to === p.to) : undefined;
    if (p?.kind === 'edge' && e) this.openGuard(e, p.index);
  }

  focusField(): void {
    const input = this.host.renderRoot.querySelector<HTMLInputElement>('form.field input');
    if (input) {
      input.focus();
      input.select();
    }
  }

  submitField(): void {
    const m = this.host.machine;
    const f = this.draw.field;
    if (!m || !f) return;
    // The machine drawn must be the text's current reading, or the places it records are not the text's.
    if (this.host.frozen) return this.draw.refuse('The text is being read: press Enter again in a moment.');
    const edit = this.draw.submit(m, this.host.text);
    if (!edit) return;
    const back = f.kind === 'new-state' || f.kind === 'rename' ? undefined : f.state;
    if (f.kind === 'new-state' || f.kind === 'rename') {
      this.focusDue = f.value.trim();
      this.draw.pick({ kind: 'state', id: this.focusDue });
    }
    if (f.kind === 'new-state' && f.place) this.host.expectState(f.value.trim(), f.place);
    this.send(edit, back);
  }

  cancelField(): void {
    const f = this.draw.field;
    this.draw.cancel();
    const back = f?.state !== undefined ? this.nodeElement(f.state) : undefined;
    (back ?? this.host.renderRoot.querySelector<HTMLElement>('button[data-do="new-state"]'))?.focus({
      preventScroll: true,
    });
  }

  /** Send an edit, the focus first on the state it came from, so the bench gives it back there. */
  private send(edit: TextEdit, focus: string | undefined): void {
    const el = focus !== undefined ? this.nodeElement(focus) : undefined;
    if (el) el.focus({ preventScroll: true });
    else this.host.renderRoot.querySelector<HTMLElement>('button[data-do="new-state"]')?.focus({ preventScroll: true });
    emit(this.host, 'text-edit', { edit });
  }

  act(what: 'start' | 'delete'): void {
    const m = this.host.machine;
    const p = this.picked();
    if (!m || !p || !this.host.drawable) return;
    if (this.host.frozen) return this.draw.say('The text is being read: try again in a moment.');
    const edit = this.draw.act(what, m, this.host.text, p);
    if (edit) this.send(edit, p.kind === 'state' ? (what === 'start' ? p.id : undefined) : p.from);
  }

  startLink(from: string | undefined): void {
    if (from === undefined || !this.host.drawable || this.host.frozen) return;
    const ids = this.host.layout?.nodes.map((n) => n.id) ?? [];
    const next = ids[(ids.indexOf(from) + 1) % ids.length];
    this.draw.link({ from, to: next });
    this.draw.say(
      `Drawing a transition from ${from}: arrow keys or Tab choose the state it goes to, Enter takes it, Escape stops.`,
    );
    this.nodeElement(from)?.focus({ preventScroll: true });
  }

  onGrab(ev: PointerEvent, n: LaidNode): void {
    if (!this.host.drawable || this.host.frozen) return;
    ev.preventDefault();
    ev.stopPropagation();
    this.host.renderRoot.querySelector('svg')?.setPointerCapture(ev.pointerId);
    this.draw.link({ from: n.id });
  }

  onDrag(ev: PointerEvent): void {
    const l = this.draw.linking;
    if (!l || (l.to !== undefined && l.pointer === undefined)) return;
    const [x, y] = pointer(ev, this.host.renderRoot.querySelector('g.view'));
    const over = (this.host.renderRoot as ShadowRoot)
      .elementFromPoint(ev.clientX, ev.clientY)
      ?.closest<SVGGElement>('g.node');
    this.draw.link({
      from: l.from,
      pointer: { x, y },
      ...(over?.dataset.state !== undefined ? { to: over.dataset.state } : {}),
    });
  }

  onDrop(ev: PointerEvent): void {
    const l = this.draw.linking;
    if (!l || (l.pointer === undefined && l.to !== undefined)) return;
    this.host.renderRoot.querySelector('svg')?.releasePointerCapture(ev.pointerId);
    if (l.pointer === undefined) {
      this.draw.link(undefined);
      return this.draw.say(`Drag the dot of ${l.from} onto the state the transition goes to (or back onto ${l.from}).`);
    }
    const over = (this.host.renderRoot as ShadowRoot)
      .elementFromPoint(ev.clientX, ev.clientY)
      ?.closest<SVGGElement>('g.node');
    const to = over?.dataset.state;
    if (to === undefined || ev.type === 'pointercancel') return this.draw.link(undefined);
    this.openField('new-transition', this.spotUnder(to), { state: l.from, to });
  }

  /** Keys on a state: Enter finds it in the text; while a transition is drawn, the keys choose its target. */
  onNodeKey(ev: KeyboardEvent, n: LaidNode): void {
    const l = this.draw.linking;
    if (l && l.from === n.id && l.pointer === undefined) return this.chooseTarget(ev, l.from, l.to ?? n.id);
    onActivate(ev, n.line, (line) => this.revealLine(line));
    const move = ev.defaultPrevented ? undefined : moveKey(ev);
    if (move) {
      ev.preventDefault();
      ev.stopPropagation();
      return this.host.moveBy(n.id, move.dx, move.dy);
    }
    const k = stateKey(ev);
    if (ev.defaultPrevented || !k || !this.host.drawable || (k === 'outputs' && !this.host.machine?.outputs.length))
      return;
    ev.preventDefault();
    ev.stopPropagation();
    if (k === 'link') this.startLink(n.id);
    else if (k === 'rename' || k === 'outputs') this.openField(k, this.spotUnder(n.id), { state: n.id });
    else {
      this.draw.pick({ kind: 'state', id: n.id });
      this.act(k);
    }
  }

  private chooseTarget(ev: KeyboardEvent, from: string, to: string): void {
    const k = targetKey(ev);
    if (!k) return;
    ev.preventDefault();
    ev.stopPropagation();
    const ids = this.host.layout?.nodes.map((x) => x.id) ?? [];
    if (typeof k === 'object') this.draw.link({ from, to: ids[(ids.indexOf(to) + k.step + ids.length) % ids.length] });
    else if (k === 'take') this.openField('new-transition', this.spotUnder(to), { state: from, to });
    else {
      this.draw.link(undefined);
      this.draw.say(undefined);
    }
  }

  /** Keys on a transition label: Enter finds it; with several transitions, ↑ and ↓ pick one; F2 or G its guard; Delete. */
  onLabelKey(ev: KeyboardEvent, e: LaidEdge): void {
    const p = this.draw.picked;
    const index = p?.kind === 'edge' && p.from === e.from && p.to === e.to ? p.index : 0;
    onActivate(ev, e.sourceLines[index], (line) => this.revealLine(line));
    const k = labelKey(ev);
    if (ev.defaultPrevented || !k || !this.host.drawable || (typeof k === 'object' && e.lines.length < 2)) return;
    ev.preventDefault();
    ev.stopPropagation();
    const i = typeof k === 'object' ? (index + k.step + e.lines.length) % e.lines.length : index;
    this.draw.pick({ kind: 'edge', from: e.from, to: e.to, index: i });
    if (typeof k === 'object')
      this.draw.say(`Transition ${i + 1} of ${e.lines.length} from ${e.from} to ${e.to}: ${e.lines[i]}`);
    else if (k === 'guard') this.openGuard(e, index);
    else this.act('delete');
  }

  /** Keys anywhere in the sketch (not in its field): a new state, undo and redo, stop drawing. */
  readonly onKey = (ev: KeyboardEvent): void => {
    const target = ev.composedPath()[0];
    if (target instanceof HTMLElement && target.closest('input, textarea, select')) return;
    const k = sketchKey(ev);
    if (!k || (k === 'new-state' && !this.host.drawable) || (k === 'stop' && !this.draw.linking && !this.draw.field))
      return;
    ev.preventDefault();
    if (typeof k === 'object') emit(this.host, 'undo', k);
    else if (k === 'new-state') this.openNewState();
    else this.draw.cancel();
  };

  /** Put the caret at the start of a line of the text (nothing selected, so the next key typed only adds). */
  revealLine(line: number | undefined): void {
    if (line !== undefined) emit(this.host, 'reveal', { line, column: 1, select: false });
  }
}
