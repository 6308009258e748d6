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
 * Events: `reveal` {line, column}, `text-edit` {edit}, `undo` {again}.
 */
import { LitElement, html, nothing, type PropertyValues } from 'lit';
import { select, zoom, zoomIdentity, zoomTransform, type Selection, type ZoomBehavior } from 'd3';
import type { Machine } from '../../core/index.js';
import type { DiagramLayout } from '../diagram/layout.js';
import { SketchDraw, type Spot } from '../controllers/sketch-draw.js';
import { actsTemplate, drawButtons, fieldTemplate } from './sketch-field.js';
import { drawEdges, drawMarks, drawNodes, lineIndex } from './sketch-svg.js';
import { keptView } from '../diagram/view.js';
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

  /** The toolbar's hint: how to look around and, on a drawable machine, how to draw. */
  private hint(touch: boolean): string {
    const look = touch
      ? 'drag to move · pinch to zoom · tap a state to find it in the text'
      : 'drag to pan · wheel to zoom · click a state to find it in the text';
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
    // A drag that starts on a state's dot draws a transition; every other drag pans.
    this.zoomer.filter(
      (e: MouseEvent) =>
        (!e.ctrlKey || e.type === 'wheel') && !e.button && !(e.target as Element | null)?.closest?.('.handle'),
    );
    svg.call(this.zoomer).on('dblclick.zoom', null);
    svg.on('dblclick.draw', (ev: MouseEvent) => {
      if ((ev.target as Element).closest('g.node, g.label') || !this.drawable || this.frozen) return;
      this.gestures.openField('new-state', this.gestures.spotOf(ev.clientX, ev.clientY));
    });
    svg.on('pointermove.draw', (ev: PointerEvent) => this.gestures.onDrag(ev));
    svg.on('pointerup.draw pointercancel.draw', (ev: PointerEvent) => this.gestures.onDrop(ev));
  }

  protected override willUpdate(changed: PropertyValues<this>): void {
    // Another machine on the bench: what was said and picked was about the one before.
    const before = changed.get('machine');
    if (before && this.machine && before.name !== this.machine.name) {
      this.draw.said = undefined;
      this.draw.picked = undefined;
    }
  }

  protected override updated(changed: PropertyValues<this>): void {
    drawMarks(select(this.renderRoot.querySelector('g.view') as SVGGElement), this.layout, this.draw);
    const opened = this.draw.field?.at;
    if (opened !== undefined && opened !== this.fieldAt) this.gestures.focusField();
    this.fieldAt = opened;
    if (!changed.has('layout') && !changed.has('codes') && !changed.has('lit')) return;
    const l = this.layout;
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
    });
    const shape = (l?.nodes ?? []).map((n) => n.id).join(' ');
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

  private svg(): Selection<SVGSVGElement, unknown, null, undefined> {
    return select(this.renderRoot.querySelector('svg') as SVGSVGElement);
  }

  /**
   * Scale and centre the whole layout in the view — but never below MIN_LABEL_PX text: then the
   * view shows the sketch from its start state at that size, and the rest is panned to.
   */
  fit(): void {
    const l = this.layout;
    const el = this.renderRoot.querySelector('svg');
    if (!l || !el || !this.zoomer) return;
    const w = el.clientWidth || 600;
    const h = el.clientHeight || 400;
    const whole = Math.min(2, 0.92 * Math.min(w / Math.max(l.width, 1), h / Math.max(l.height, 1)));
    const least = MIN_LABEL_PX / TEXT_PX;
    const k = Math.max(whole, least);
    const partial = whole < least;
    let t = zoomIdentity.translate((w - l.width * k) / 2, (h - l.height * k) / 2).scale(k);
    if (partial) {
      // Start state at the left, a little in; centred vertically on it when the sketch is taller than the view.
      const start = l.nodes.find((n) => n.start) ?? l.nodes[0];
      const tx = l.width * k <= w ? (w - l.width * k) / 2 : 24 - (start ? (start.x - start.width / 2) * k : 0) + 22;
      const ty =
        l.height * k <= h
          ? (h - l.height * k) / 2
          : Math.min(0, Math.max(h - l.height * k, h / 2 - (start?.y ?? 0) * k));
      t = zoomIdentity.translate(tx, ty).scale(k);
    }
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
    const t = keptView(before, l, zoomTransform(el), el.clientWidth, el.clientHeight);
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
