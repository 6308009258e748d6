/**
 * The frame in the page's colours for <lw-app> to give <lw-frame>: the core's frameSvg in the
 * screen palette, the same drawing as frame.svg. A build of up to FRAME_HERE_BAYS bays (every
 * example) is drawn at once, in the page; a larger one (a frame of thousands of bays takes the
 * better part of a second to draw) in a worker of its own (frame/draw-worker.ts), so the page
 * answers while it is drawn, and the view says so meanwhile. Only the drawing of the newest
 * build asked for is kept.
 */
import { frameSvg } from '../../core/index.js';
import type { BuildView } from '../worker/protocol.js';
import type { FromFrameDrawer, ToFrameDrawer } from './draw-worker.js';

/** The drawing, or why there is none. */
export interface FrameDrawing {
  readonly svg?: string;
  readonly problem?: string;
}

/** Frames of up to this many bays are drawn in the page (planet, 48 states, has about 600 bays; the largest example under 40). */
export const FRAME_HERE_BAYS = 400;

const problemOf = (e: unknown): FrameDrawing => ({ problem: e instanceof Error ? e.message : String(e) });

export class FrameDrawings {
  private worker: Worker | undefined;
  private asked: { readonly view: BuildView; readonly id: number } | undefined;
  private drawn: { readonly view: BuildView; readonly drawing: FrameDrawing } | undefined;
  private ids = 0;

  /** `arrived` is called when a drawing made away from the page is ready. */
  constructor(private readonly arrived: () => void) {}

  /** The drawing of `view`: at once for a small frame; for a large one, undefined until its worker has drawn it. */
  of(view: BuildView | undefined): FrameDrawing | undefined {
    if (!view) return undefined;
    if (this.drawn?.view === view) return this.drawn.drawing;
    if (view.placement.bays.length <= FRAME_HERE_BAYS) {
      let drawing: FrameDrawing;
      try {
        drawing = { svg: frameSvg(view.build, view.placement, view.profile, { palette: 'screen' }) };
      } catch (e) {
        // A fault of the drawing must not take the rest of the page with it: say so in the view.
        drawing = problemOf(e);
      }
      this.drawn = { view, drawing };
      return drawing;
    }
    if (this.asked?.view !== view) this.ask(view);
    return undefined;
  }

  private ask(view: BuildView): void {
    const id = ++this.ids;
    this.asked = { view, id };
    this.worker ??= this.start();
    const m: ToFrameDrawer = { id, build: view.build, placement: view.placement, profile: view.profile };
    this.worker.postMessage(m);
  }

  private start(): Worker {
    const w = new Worker(new URL('./draw-worker.ts', import.meta.url), { type: 'module' });
    w.onmessage = (e: MessageEvent<FromFrameDrawer>) => {
      const asked = this.asked;
      if (!asked || e.data.id !== asked.id) return; // a drawing of a build since replaced
      this.drawn = {
        view: asked.view,
        drawing: e.data.svg !== undefined ? { svg: e.data.svg } : problemOf(e.data.problem),
      };
      this.arrived();
    };
    w.onerror = (e) => {
      // A worker that failed is started afresh for the next drawing.
      w.terminate();
      this.worker = undefined;
      const asked = this.asked;
      if (!asked) return;
      this.drawn = { view: asked.view, drawing: problemOf(e.message || 'the frame could not be drawn') };
      this.arrived();
    };
    return w;
  }
}
