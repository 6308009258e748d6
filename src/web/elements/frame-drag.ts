/**
 * A part of the frame dragged onto another bay, for <lw-frame> (frame-view.ts): a lever end or
 * bay label pressed with the mouse or a pen becomes a drag once the pointer has moved DRAG_PX;
 * the bay it is over is found among the drawn bays (frame/bays.ts); let go there, the part is
 * kept in that bay (the build's pins), and Escape puts it back. A finger pans the frame instead,
 * and picks a part by a tap. The click a drag ends with picks nothing.
 */
import type { Pin, Placement } from '../../core/index.js';
import { bayOf, pinForDrop, type BaySpot } from '../controllers/pins.js';
import { bayBoxes, bayNearest, type BayBox } from '../frame/bays.js';
import type { DrawnFrame } from '../frame/drawn.js';

/** A pointer that moves less than this (px) is a click, not a drag. */
const DRAG_PX = 5;

/** The frame as a drag sees it. */
export interface DragHost {
  placement(): Placement | undefined;
  drawn(): DrawnFrame | undefined;
  /** The part was let go over a bay other than its own: keep it there. */
  keep(part: string, pin: Pin): void;
  /** The part a drag ended on is the one picked. */
  pick(part: string): void;
  requestUpdate(): void;
}

/** The part of a lever end or bay label under an event (not a cord's). */
export function partAt(e: Event): string | undefined {
  const t = e.composedPath()[0];
  if (!(t instanceof Element) || t.closest('[data-cord]')) return undefined;
  return t.closest('rect.lever[data-part], g[data-part]')?.getAttribute('data-part') ?? undefined;
}

export class PartDrag {
  /** The part pressed, where the press began, and once it moved: the drawn bays and the one it is over. */
  private drag:
    { readonly part: string; readonly x: number; readonly y: number; boxes?: readonly BayBox[] } | undefined;
  /** The bay the dragged part is over. */
  over: BaySpot | undefined;
  /** A drag just ended: the click that follows it picks nothing. */
  private ended = false;

  constructor(private readonly host: DragHost) {}

  /** The part being dragged over a bay, if any. */
  get part(): string | undefined {
    return this.over ? this.drag?.part : undefined;
  }

  readonly down = (e: PointerEvent): void => {
    this.ended = false;
    const part = partAt(e);
    if (part === undefined || e.pointerType === 'touch' || e.button !== 0) return;
    e.preventDefault();
    this.drag = { part, x: e.clientX, y: e.clientY };
  };

  readonly move = (e: PointerEvent): void => {
    const d = this.drag;
    const drawn = this.host.drawn();
    if (!d || !drawn) return;
    if (!d.boxes) {
      if (Math.hypot(e.clientX - d.x, e.clientY - d.y) < DRAG_PX) return;
      (e.currentTarget as Element).setPointerCapture(e.pointerId);
      d.boxes = bayBoxes(drawn.bayEnds((part) => bayOf(this.host.placement(), part)));
    }
    const over = bayNearest(d.boxes, e.clientX, e.clientY);
    if (over?.bay === this.over?.bay && over?.drum === this.over?.drum) return;
    this.over = over;
    this.host.requestUpdate();
  };

  /** Let go over a bay: keep the part there (nothing when it is where it stands). */
  readonly up = (): void => {
    const d = this.drag;
    const over = this.over;
    this.stop();
    if (!d?.boxes) return;
    this.ended = true;
    this.host.pick(d.part);
    const pin = over ? pinForDrop(this.host.placement(), d.part, over) : undefined;
    if (pin) this.host.keep(d.part, pin);
    this.host.requestUpdate();
  };

  readonly cancel = (): void => {
    this.stop();
    this.host.requestUpdate();
  };

  /** Escape while dragging: the part goes back where it stands. True when there was a drag to stop. */
  escape(): boolean {
    if (!this.drag) return false;
    this.cancel();
    return true;
  }

  /** True once, for the click a drag ended with. */
  endedJustNow(): boolean {
    const was = this.ended;
    this.ended = false;
    return was;
  }

  private stop(): void {
    this.drag = undefined;
    this.over = undefined;
  }
}
