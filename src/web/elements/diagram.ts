/**
 * <lw-diagram>: the sketch — the state diagram laid out by dagre (in the worker) and drawn with
 * d3, with zoom and pan. Each state shows its name, its outputs and its code; while stepping,
 * the state the machine is in is lit. Clicking a state (or pressing Enter on it) puts the
 * caret on its line in the text and changes nothing there (the key press goes no further);
 * clicking a transition label does the same for the transition. Fit never shrinks the text
 * below MIN_LABEL_PX: a sketch too big for the view at that size is shown from its start
 * state, and the rest is a drag (or a swipe) away.
 *
 * The sketch is also drawn on (a machine in the text form, while its text reads): a new state
 * (double-click the canvas, the New state button, or N), a transition (drag a state's dot onto
 * a state, or T and then the arrow keys), a guard, a name or outputs changed in place
 * (double-click, or the keys of docs/designer.md), a state made the start, an item deleted.
 * Each becomes one small edit of the text (controllers/sketch-draw.ts), which the bench types
 * into the text so its undo takes it back; the sketch redraws from the text as always, and
 * when the states are mostly the same ones it keeps them where they were on screen (keepView).
 * The SVG itself is drawn by sketch-svg.ts, the inline field and the actions by sketch-field.ts;
 * what the pointer and the keys do to draw is in sketch-gestures.ts.
 *
 * The user arranges the sketch: a state dragged by its card (sketch-moves.ts) or moved by Shift
 * and the arrow keys goes where it is put, its transitions following (diagram/arrange.ts); a
 * state asked for by a double-click goes to the spot clicked. The arrangement is a view matter:
 * it is kept for the machine's name in the browser's storage (controllers/sketch-places.ts),
 * follows the layout across edits, and never touches the text; "Back to the layout" drops it.
 * Events: `reveal` {line, column}, `text-edit` {edit}, `undo` {again}.
 */
import { LitElement, html, nothing, type PropertyValues } from 'lit';
import { pointer, select, zoom, zoomTransform, type Selection, type ZoomBehavior } from 'd3';
import type { Machine } from '../../core/index.js';
import type { DiagramLayout, Point } from '../diagram/layout.js';
import { arranged, meanShift } from '../diagram/arrange.js';
import { SketchPlaces } from '../controllers/sketch-places.js';
import { StateMover } from './sketch-moves.js';
import { SketchDraw, type Spot } from '../controllers/sketch-draw.js';
import { actsTemplate, drawButtons, fieldTemplate } from './sketch-field.js';
import { drawEdges, drawMarks, drawNodes, lineIndex } from './sketch-svg.js';
import { fitted, insideView, keptView } from '../diagram/view.js';
import { SketchGestures } from './sketch-gestures.js';
import { shared } from '../styles/shared.js';
import { diagramStyles } from './diagram-styles.js';
import { emit } from './emit.js';
import { touchScreen } from '../touch.js';

/** The sketch's text is 12 px at scale 1; Fit keeps it at least this big on screen. */
export const MIN_LABEL_PX = 10;
const TEXT_PX = 12;

export class LwDiagram extends LitElement {
  static override properties = {
    layout: { attribute: false },
    codes: { attribute: false },
    lit: { attribute: false },
    machine: { attribute: false },
    text: { attribute: false },
    frozen: { type: Boolean },
  };
  declare layout: DiagramLayout | undefined;
  /** Code of each state, by state name (from the build). */
  declare codes: Readonly<Record<string, string>>;
  /** States to light (the machine is in one of them). */
  declare lit: ReadonlySet<string>;
  /** The machine drawn, with the places its parts were written (drawing needs them). */
  declare machine: Machine | undefined;
  /** The text the machine was read from. */
  declare text: string;
  /** The machine shown is not (yet) the text's current version: drawing waits. */
  declare frozen: boolean;

  private readonly draw = new SketchDraw(this);
  private readonly gestures = new SketchGestures(this, this.draw);
  private readonly arrangement = new SketchPlaces();
  private readonly mover = new StateMover(this);
  /** The layout as drawn: with the states the user moved where they are. */
  private shown: DiagramLayout | undefined;
  /** A state just placed where it was asked for (kept inside the view once drawn). */
  private placedNew: string | undefined;
  /** The frame a drag's drawing waits for. */
  private frame = 0;
  /** Where the field shown was opened (a new spot is a new field, which takes the focus). */
  private fieldAt: Spot | undefined;

  private zoomer: ZoomBehavior<SVGSVGElement, unknown> | undefined;
  private shape = '';
  /** Fit could not show everything at a readable size (the view shows part of the sketch). */
  private partial = false;

  constructor() {
    super();
    this.layout = undefined;
    this.codes = {};
    this.lit = new Set();
    this.machine = undefined;
    this.text = '';
    this.frozen = false;
  }

  override connectedCallback(): void {
    super.connectedCallback();
    this.addEventListener('keydown', this.gestures.onKey);
  }

  override disconnectedCallback(): void {
    this.removeEventListener('keydown', this.gestures.onKey);
    super.disconnectedCallback();
  }

  /** The machine can be drawn on: it is in the text form (its parts have lines). */
  get drawable(): boolean {
    return this.machine?.loc?.line !== undefined && this.layout !== undefined;
  }

  static override styles = [shared, diagramStyles];

  override render() {
    const n = this.layout?.nodes.length ?? 0;
    const touch = touchScreen();
    const hint = this.hint(touch);
    const m = this.machine;
    const d = this.draw;
    const picked = this.gestures.picked();
    return html`<div class="tools" role="toolbar" aria-label="Sketch view">
        <button @click=${() => this.fit()} aria-label="Fit the sketch in view, as far as its text stays readable">
          Fit
        </button>
        <button @click=${() => this.scaleBy(1.25)} aria-label="Zoom in">+</button>
        <button @click=${() => this.scaleBy(0.8)} aria-label="Zoom out">−</button>
        ${
          this.drawable
            ? drawButtons(this.frozen, {
                add: () => this.gestures.openNewState(),
                undo: (again) => emit(this, 'undo', { again }),
              })
            : nothing
        }
        <span class="soft legend" data-hint=${touch ? 'touch' : 'pointer'}>${hint}</span>
      </div>
      ${
        this.drawable && m && picked
          ? actsTemplate(picked, m, this.frozen, {
              link: () => this.gestures.startLink(picked.kind === 'state' ? picked.id : undefined),
              open: (kind) => this.gestures.openOnPicked(kind),
              act: (what) => this.gestures.act(what),
            })
          : nothing
      }
      ${d.said ? html`<p class="soft said" role="status">${d.said}</p>` : nothing}
      ${
        this.partial || this.layout?.method === 'by-distance'
          ? html`<p class="soft note" role="note">
              ${this.layout?.method === 'by-distance' ? `A large machine (${n} states): laid out in columns by clocks from the start state. ` : ''}${this.partial ? `Too big to show whole at a readable size: ${touch ? 'drag' : 'drag or scroll'} to see the rest.` : ''}
            </p>`
          : nothing
      }
      <svg role="group" aria-label=${`State sketch with ${n} states`}>
        <defs>
          <marker
            id="tip"
            viewBox="0 0 10 10"
            refX="9"
            refY="5"
            markerWidth="8"
            markerHeight="8"
            orient="auto-start-reverse"
          >
            <path d="M0,0 L10,5 L0,10 z" class="tip"></path>
          </marker>
        </defs>
        <g class="view">
          <g class="edges"></g>
          <g class="nodes"></g>
          <path class="rubber" marker-end="url(#tip)"></path>
        </g>
      </svg>
      ${this.relayoutButton()}
      ${
        d.field && m
          ? fieldTemplate(d.field, m, {
              type: (v) => d.type(v),
              submit: () => this.gestures.submitField(),
              cancel: () => this.gestures.cancelField(),
            })
          : nothing
      }`;
  }

  /**
   * Once a state was moved: the command that puts every state back where the layout puts it, in
   * the sketch's corner (so it never changes the size of the view it is about).
   */
  private relayoutButton() {
    return this.arrangement.places.size > 0
      ? html`<button
          class="relayout"
          data-do="relayout"
          @click=${() => this.relayout()}
          aria-label="Put every moved state back where the automatic layout places it"
        >
          Back to the layout
        </button>`
      : nothing;
  }

  /** The toolbar's hint: how to look around and, on a drawable machine, how to draw. */
  private hint(touch: boolean): string {
    const look = touch
      ? 'drag to move · pinch to zoom · tap a state to find it in the text, drag it to move it'
      : 'drag to pan · wheel to zoom · click a state to find it in the text, drag it to move it';
    if (this.layout !== undefined && this.machine !== undefined && !this.drawable)
      return `${look} · this machine is not in the text form, so the sketch only shows it: drawing works in the text form`;
    if (!this.drawable) return look;
    return touch
      ? `${look} · New state adds one · drag a tapped state's dot onto a state to draw a transition · tap a label, then Change guard`
      : `${look} · double-click the canvas for a new state · drag a state's dot onto a state to draw a transition · double-click a name or a guard to change it`;
  }

  protected override firstUpdated(): void {
    const svg = this.svg();
    this.zoomer = zoom<SVGSVGElement, unknown>()
      .scaleExtent([0.15, 5])
      .on('zoom', (e: { transform: { toString(): string } }) =>
        select(this.renderRoot.querySelector('g.view') as SVGGElement).attr('transform', e.transform.toString()),
      );
    // A drag that starts on a state's dot draws a transition, one on its card moves it; every other drag pans.
    this.zoomer.filter(
      (e: MouseEvent) =>
        (!e.ctrlKey || e.type === 'wheel') &&
        !e.button &&
        (e.type === 'wheel' || !(e.target as Element | null)?.closest?.('.handle, g.node')),
    );
    svg.call(this.zoomer).on('dblclick.zoom', null);
    svg.on('dblclick.draw', (ev: MouseEvent) => {
      if ((ev.target as Element).closest('g.node, g.label') || !this.drawable || this.frozen) return;
      const [x, y] = pointer(ev, this.renderRoot.querySelector('g.view'));
      this.gestures.openField('new-state', this.gestures.spotOf(ev.clientX, ev.clientY), { place: { x, y } });
    });
    svg.on('pointermove.draw', (ev: PointerEvent) => this.gestures.onDrag(ev));
    svg.on('pointerup.draw pointercancel.draw', (ev: PointerEvent) => this.gestures.onDrop(ev));
    svg.on('pointermove.move', (ev: PointerEvent) => this.mover.onDrag(ev));
    svg.on('pointerup.move pointercancel.move', (ev: PointerEvent) => this.mover.onDrop(ev));
  }

  protected override willUpdate(changed: PropertyValues<this>): void {
    // Another machine on the bench: what was said and picked was about the one before.
    const before = changed.get('machine');
    if (before && this.machine && before.name !== this.machine.name) {
      this.draw.said = undefined;
      this.draw.picked = undefined;
    }
    const l = this.layout;
    if (changed.has('layout') && l) {
      const was = changed.get('layout');
      const name = this.machine?.name ?? '';
      if (!was || name !== this.arrangement.machine) this.arrangement.open(name, l, was);
      else this.placedNew = this.arrangement.follow(was, l);
    }
    this.shown = l && arranged(l, this.arrangement.places);
  }

  /** Put a state at `at` (layout coordinates) and draw it there with its transitions; kept when `done`. */
  moveState(id: string, at: Point, done: boolean): void {
    const first = this.arrangement.places.size === 0;
    this.arrangement.move(id, at, done);
    // While dragging, draw at most once a frame (a large sketch is many elements); at the end, at once.
    cancelAnimationFrame(this.frame);
    if (done) this.drawArranged();
    else this.frame = requestAnimationFrame(() => this.drawArranged());
    if (first) this.requestUpdate();
  }

  private drawArranged(): void {
    if (this.layout) this.shown = arranged(this.layout, this.arrangement.places);
    this.drawSketch();
    drawMarks(select(this.renderRoot.querySelector('g.view') as SVGGElement), this.shown, this.draw);
  }

  moveBy(id: string, dx: number, dy: number): void {
    const n = this.shown?.nodes.find((x) => x.id === id);
    if (n) this.moveState(id, { x: n.x + dx, y: n.y + dy }, true);
  }

  /** A new state asked for at a spot goes there once it is drawn. */
  expectState(id: string, at: Point): void {
    this.arrangement.expect(id, at);
  }

  /**
   * Keep the card of a state just placed at a spot inside the view the sketch is about to keep
   * (the view moved by the layout's shift, keptView), once the toolbars have their new size.
   */
  private keepInView(id: string, before: DiagramLayout | undefined): void {
    const el = this.renderRoot.querySelector('svg');
    const l = this.layout;
    const n = this.shown?.nodes.find((x) => x.id === id);
    if (!el || !l || !n) return;
    const shift = before ? meanShift(before, l) : { x: 0, y: 0 };
    const t = zoomTransform(el).translate(-shift.x, -shift.y);
    this.arrangement.move(id, insideView(n, t, el.clientWidth, el.clientHeight));
    this.shown = arranged(l, this.arrangement.places);
  }

  /** Every state back where the automatic layout puts it. */
  private relayout(): void {
    this.arrangement.reset();
    this.shown = this.layout;
    this.drawSketch();
    this.requestUpdate();
  }

  protected override updated(changed: PropertyValues<this>): void {
    drawMarks(select(this.renderRoot.querySelector('g.view') as SVGGElement), this.shown, this.draw);
    const opened = this.draw.field?.at;
    if (opened !== undefined && opened !== this.fieldAt) this.gestures.focusField();
    this.fieldAt = opened;
    if (!changed.has('layout') && !changed.has('codes') && !changed.has('lit')) return;
    const placed = this.placedNew;
    this.placedNew = undefined;
    if (placed !== undefined) this.keepInView(placed, changed.get('layout'));
    this.drawSketch();
    const shape = (this.layout?.nodes ?? []).map((n) => n.id).join(' ');
    if (shape !== this.shape) {
      this.shape = shape;
      if (!this.keepView(changed.get('layout'))) this.fit();
    }
    this.dataset.drawn = String((Number(this.dataset.drawn) || 0) + 1);
    const due = this.gestures.focusDue;
    if (due !== undefined && changed.has('layout')) {
      const el = this.gestures.nodeElement(due);
      if (el) {
        this.gestures.focusDue = undefined;
        el.focus({ preventScroll: true });
      }
    }
  }

  /** Draw the transitions and the states of the layout as shown (sketch-svg.ts). */
  private drawSketch(): void {
    const l = this.shown;
    const view = select(this.renderRoot.querySelector('g.view') as SVGGElement);
    drawEdges(view.select<SVGGElement>('g.edges'), l?.edges ?? [], {
      click: (ev, e) => {
        const i = lineIndex(ev);
        this.gestures.revealLine(e.sourceLines[i]);
        this.draw.pick({ kind: 'edge', from: e.from, to: e.to, index: i });
      },
      dblclick: (ev, e) => {
        ev.stopPropagation();
        this.gestures.openGuard(e, lineIndex(ev));
      },
      key: (ev, e) => this.gestures.onLabelKey(ev, e),
      keys: this.drawable ? 'Enter ArrowUp ArrowDown F2 G Delete' : 'Enter',
    });
    drawNodes(view.select<SVGGElement>('g.nodes'), l?.nodes ?? [], {
      codes: this.codes,
      lit: this.lit,
      drawable: this.drawable,
      click: (_, n) => {
        if (this.mover.swallowClick()) return;
        this.gestures.revealLine(n.line);
        this.draw.pick({ kind: 'state', id: n.id });
      },
      dblclick: (ev, n) => {
        ev.stopPropagation();
        if (this.drawable && !this.frozen)
          this.gestures.openField('rename', this.gestures.spotUnder(n.id), { state: n.id });
      },
      key: (ev, n) => this.gestures.onNodeKey(ev, n),
      keys: this.drawable ? 'Enter T F2 O S Delete' : 'Enter',
      grab: (ev, n) => this.gestures.onGrab(ev, n),
      press: (ev, n) => this.mover.onPress(ev, n),
    });
  }

  private svg(): Selection<SVGSVGElement, unknown, null, undefined> {
    return select(this.renderRoot.querySelector('svg') as SVGSVGElement);
  }

  /**
   * Scale and centre the whole layout in the view — but never below MIN_LABEL_PX text: then the
   * view shows the sketch from its start state at that size, and the rest is panned to.
   */
  fit(): void {
    const l = this.layout;
    const shown = this.shown ?? l;
    const el = this.renderRoot.querySelector('svg');
    if (!l || !shown || !el || !this.zoomer) return;
    const { t, k, partial } = fitted(l, shown, el.clientWidth || 600, el.clientHeight || 400, MIN_LABEL_PX / TEXT_PX);
    const zoomer = this.zoomer;
    this.svg().call((svg) => zoomer.transform(svg, t));
    if (partial !== this.partial) {
      this.partial = partial;
      this.requestUpdate();
    }
    this.dataset.scale = String(k);
  }

  /**
   * After a state was added, renamed or deleted, keep the states that stay where they were on
   * screen (the layout moves them all alike when a rank is added), as long as every state is
   * then in view (diagram/view.ts); true when it did. A new machine, or one that would leave
   * the view, is fitted.
   */
  private keepView(before: DiagramLayout | undefined): boolean {
    const l = this.layout;
    const el = this.renderRoot.querySelector('svg');
    const zoomer = this.zoomer;
    if (!before || !l || !el || !zoomer) return false;
    const t = keptView(before, l, zoomTransform(el), el.clientWidth, el.clientHeight, this.shown);
    if (t) this.svg().call((svg) => zoomer.transform(svg, t));
    return t !== undefined;
  }

  private scaleBy(f: number): void {
    const zoomer = this.zoomer;
    if (zoomer) this.svg().call((svg) => zoomer.scaleBy(svg, f));
  }
}

customElements.define('lw-diagram', LwDiagram);

declare global {
  interface HTMLElementTagNameMap {
    'lw-diagram': LwDiagram;
  }
}
