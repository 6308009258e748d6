/**
 * <lw-diagram>: the sketch — the state diagram laid out by dagre (in the worker) and drawn with
 * d3, with zoom and pan. Each state shows its name, its outputs and its code; while stepping,
 * the state the machine is in is lit. Clicking a state (or pressing Enter on it) puts the
 * caret on its line in the text and changes nothing there (the key press goes no further);
 * clicking a transition label does the same for the transition. Fit never shrinks the text
 * below MIN_LABEL_PX: a sketch too big for the view at that size is shown from its start
 * state, and the rest is a drag (or a swipe) away.
 * Events: `reveal` {line, column}.
 */
import { LitElement, html, nothing, type PropertyValues } from 'lit';
import { curveBasis, line, select, zoom, zoomIdentity, type Selection, type ZoomBehavior } from 'd3';
import type { DiagramLayout, LaidEdge, LaidNode } from '../diagram/layout.js';
import { LINE_H } from '../diagram/layout.js';
import { shared } from '../styles/shared.js';
import { diagramStyles } from './diagram-styles.js';
import { emit } from './emit.js';
import { touchScreen } from '../touch.js';

type G = Selection<SVGGElement, unknown, null, undefined>;

/** The sketch's text is 12 px at scale 1; Fit keeps it at least this big on screen. */
export const MIN_LABEL_PX = 10;
const TEXT_PX = 12;

/** Enter or Space on a focused sketch item: find it in the text, and let the key do nothing else. */
function onActivate(ev: KeyboardEvent, line: number | undefined, reveal: (line: number | undefined) => void): void {
  if (ev.key !== 'Enter' && ev.key !== ' ') return;
  ev.preventDefault();
  ev.stopPropagation();
  reveal(line);
}

export class LwDiagram extends LitElement {
  static override properties = {
    layout: { attribute: false },
    codes: { attribute: false },
    lit: { attribute: false },
  };
  declare layout: DiagramLayout | undefined;
  /** Code of each state, by state name (from the build). */
  declare codes: Readonly<Record<string, string>>;
  /** States to light (the machine is in one of them). */
  declare lit: ReadonlySet<string>;

  private zoomer: ZoomBehavior<SVGSVGElement, unknown> | undefined;
  private shape = '';
  /** Fit could not show everything at a readable size (the view shows part of the sketch). */
  private partial = false;

  constructor() {
    super();
    this.layout = undefined;
    this.codes = {};
    this.lit = new Set();
  }

  static override styles = [shared, diagramStyles];

  override render() {
    const n = this.layout?.nodes.length ?? 0;
    const touch = touchScreen();
    const hint = touch
      ? 'drag to move · pinch to zoom · tap a state to find it in the text'
      : 'drag to pan · wheel to zoom · click a state to find it in the text';
    return html`<div class="tools" role="toolbar" aria-label="Sketch view">
        <button @click=${() => this.fit()} aria-label="Fit the sketch in view, as far as its text stays readable">
          Fit
        </button>
        <button @click=${() => this.scaleBy(1.25)} aria-label="Zoom in">+</button>
        <button @click=${() => this.scaleBy(0.8)} aria-label="Zoom out">−</button>
        <span class="soft legend" data-hint=${touch ? 'touch' : 'pointer'}>${hint}</span>
      </div>
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
        </g>
      </svg>`;
  }

  protected override firstUpdated(): void {
    const svg = this.svg();
    this.zoomer = zoom<SVGSVGElement, unknown>()
      .scaleExtent([0.15, 5])
      .on('zoom', (e: { transform: { toString(): string } }) =>
        select(this.renderRoot.querySelector('g.view') as SVGGElement).attr('transform', e.transform.toString()),
      );
    svg.call(this.zoomer).on('dblclick.zoom', null);
  }

  protected override updated(changed: PropertyValues<this>): void {
    if (!changed.has('layout') && !changed.has('codes') && !changed.has('lit')) return;
    const l = this.layout;
    const view = select(this.renderRoot.querySelector('g.view') as SVGGElement);
    this.drawEdges(view.select<SVGGElement>('g.edges'), l?.edges ?? []);
    this.drawNodes(view.select<SVGGElement>('g.nodes'), l?.nodes ?? []);
    const shape = (l?.nodes ?? []).map((n) => n.id).join(' ');
    if (shape !== this.shape) {
      this.shape = shape;
      this.fit();
    }
    this.dataset.drawn = String((Number(this.dataset.drawn) || 0) + 1);
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

  private scaleBy(f: number): void {
    const zoomer = this.zoomer;
    if (zoomer) this.svg().call((svg) => zoomer.scaleBy(svg, f));
  }

  private drawEdges(g: G, edges: readonly LaidEdge[]): void {
    const path = line<{ x: number; y: number }>()
      .x((p) => p.x)
      .y((p) => p.y)
      .curve(curveBasis);
    const sel = g
      .selectAll<SVGGElement, LaidEdge>('g.edge')
      .data(edges, (e) => `${e.from}\u0000${e.to}`)
      .join((enter) => {
        const e = enter.append('g').attr('class', 'edge');
        e.append('path').attr('class', 'wire').attr('marker-end', 'url(#tip)');
        const label = e.append('g').attr('class', 'label').attr('tabindex', 0).attr('role', 'button');
        label.append('rect');
        return e;
      });
    sel.select('path.wire').attr('d', (e) => path(e.points as { x: number; y: number }[]) ?? '');
    const label = sel.select<SVGGElement>('g.label');
    label
      .attr('transform', (e) => `translate(${e.label.x - e.label.width / 2},${e.label.y - e.label.height / 2})`)
      .attr('aria-label', (e) => `Transition from ${e.from} to ${e.to}: ${e.lines.join('; ')}`)
      .on('click', (_, e) => this.revealLine(e.sourceLines[0]))
      .on('keydown', (ev: KeyboardEvent, e) => onActivate(ev, e.sourceLines[0], (l) => this.revealLine(l)));
    label
      .select('rect')
      .attr('width', (e) => e.label.width)
      .attr('height', (e) => e.label.height)
      .attr('rx', 3);
    label
      .selectAll<SVGTextElement, string>('text')
      .data((e) => e.lines)
      .join('text')
      .attr('x', 4)
      .attr('y', (_, i) => 12 + i * LINE_H)
      .text((t) => t);
  }

  private drawNodes(g: G, nodes: readonly LaidNode[]): void {
    const sel = g
      .selectAll<SVGGElement, LaidNode>('g.node')
      .data(nodes, (n) => n.id)
      .join((enter) => {
        const e = enter.append('g').attr('class', 'node').attr('tabindex', 0).attr('role', 'button');
        e.append('rect').attr('class', 'body');
        e.append('path').attr('class', 'entry');
        e.append('text').attr('class', 'code');
        e.append('text').attr('class', 'merged');
        return e;
      });
    sel
      .attr('transform', (n) => `translate(${n.x - n.width / 2},${n.y - n.height / 2})`)
      .classed('start', (n) => n.start)
      .classed('unreachable', (n) => n.unreachable)
      .classed('lit', (n) => this.lit.has(n.id))
      .attr('data-state', (n) => n.id)
      .attr(
        'aria-label',
        (n) =>
          `State ${n.lines.join(', ')}${this.codes[n.id] ? `, code ${this.codes[n.id]}` : ''}${n.start ? ', start' : ''}${this.lit.has(n.id) ? ', the machine is here' : ''}${n.line ? `, line ${n.line}` : ''}`,
      )
      .on('click', (_, n) => this.revealLine(n.line))
      .on('keydown', (ev: KeyboardEvent, n) => onActivate(ev, n.line, (l) => this.revealLine(l)));
    sel
      .select('rect.body')
      .attr('width', (n) => n.width)
      .attr('height', (n) => n.height)
      .attr('rx', 7);
    sel
      .select('path.entry')
      .attr('d', (n) => (n.start ? `M-22,${n.height / 2} L-3,${n.height / 2}` : ''))
      .attr('marker-end', (n) => (n.start ? 'url(#tip)' : null));
    sel
      .selectAll<SVGTextElement, string>('text.line')
      .data((n) => n.lines)
      .join('text')
      .attr('class', (_, i) => (i === 0 ? 'line name' : 'line outs'))
      .attr('x', 12)
      .attr('y', (_, i) => 21 + i * LINE_H)
      .text((t) => t);
    sel
      .select('text.code')
      .attr('x', (n) => n.width - 4)
      .attr('y', -4)
      .text((n) => this.codes[n.id] ?? '');
    sel
      .select('text.merged')
      .attr('x', 2)
      .attr('y', (n) => n.height + 13)
      .text((n) => (n.mergedInto ? `same as ${n.mergedInto}` : n.unreachable ? 'unreachable' : ''));
  }

  /** Put the caret at the start of a line of the text (nothing selected, so the next key typed only adds). */
  private revealLine(line: number | undefined): void {
    if (line !== undefined) emit(this, 'reveal', { line, column: 1, select: false });
  }
}

customElements.define('lw-diagram', LwDiagram);

declare global {
  interface HTMLElementTagNameMap {
    'lw-diagram': LwDiagram;
  }
}
