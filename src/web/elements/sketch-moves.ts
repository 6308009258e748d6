/**
 * Moving a state of the sketch by dragging it, for <lw-diagram> (a mouse, a pen or a finger:
 * pointer events). A press on a state's card becomes a move only once the pointer has gone
 * MOVE_FROM pixels, so a click or a tap on it still finds its line in the text, and a press on
 * its dot still draws a transition (sketch-gestures.ts). The click that ends a move is not
 * taken as a click on the state. Where the state goes is the element's business (the places
 * of controllers/sketch-places.ts); nothing here touches the text.
 */
import { zoomTransform } from 'd3';
import type { LaidNode, Point } from '../diagram/layout.js';

/** How far (screen pixels) a press on a state goes before it moves the state. */
export const MOVE_FROM = 4;

/** The sketch element as the mover sees it. */
export interface MoverHost extends HTMLElement {
  readonly renderRoot: HTMLElement | DocumentFragment;
  /** Put a state at `at` (layout coordinates); `done` when the move ends (the place is then kept). */
  moveState(id: string, at: Point, done: boolean): void;
}

interface Press {
  readonly id: string;
  readonly pointerId: number;
  readonly x0: number;
  readonly y0: number;
  /** The state's centre when pressed. */
  readonly from: Point;
  moving: boolean;
  at: Point;
}

export class StateMover {
  private press: Press | undefined;
  private swallow = false;

  constructor(private readonly host: MoverHost) {}

  private svg(): SVGSVGElement | null {
    return this.host.renderRoot.querySelector('svg');
  }

  /** A press on a state's card (not its dot) may start a move. */
  onPress(ev: PointerEvent, n: LaidNode): void {
    this.swallow = false;
    if (ev.button !== 0 || !ev.isPrimary || (ev.target as Element | null)?.closest?.('.handle')) return;
    const from = { x: n.x, y: n.y };
    this.press = { id: n.id, pointerId: ev.pointerId, x0: ev.clientX, y0: ev.clientY, from, moving: false, at: from };
  }

  onDrag(ev: PointerEvent): void {
    const p = this.press;
    const svg = this.svg();
    if (!p || !svg || ev.pointerId !== p.pointerId) return;
    const dx = ev.clientX - p.x0;
    const dy = ev.clientY - p.y0;
    if (!p.moving) {
      if (Math.hypot(dx, dy) < MOVE_FROM) return;
      p.moving = true;
      svg.setPointerCapture(ev.pointerId);
    }
    ev.preventDefault();
    const k = zoomTransform(svg).k;
    p.at = { x: p.from.x + dx / k, y: p.from.y + dy / k };
    this.host.moveState(p.id, p.at, false);
  }

  onDrop(ev: PointerEvent): void {
    const p = this.press;
    if (!p || ev.pointerId !== p.pointerId) return;
    this.press = undefined;
    if (!p.moving) return;
    const svg = this.svg();
    if (svg?.hasPointerCapture(ev.pointerId)) svg.releasePointerCapture(ev.pointerId);
    this.swallow = true;
    this.host.moveState(p.id, p.at, true);
  }

  /** True (once) for the click that ends a move: it is not a click on the state. */
  swallowClick(): boolean {
    const s = this.swallow;
    this.swallow = false;
    return s;
  }
}
