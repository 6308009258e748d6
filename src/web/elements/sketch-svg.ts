/**
 * The sketch's SVG, drawn with d3 for <lw-diagram>: the transitions (a wire and a label with a
 * line per transition), the states (a card with name, outputs and code, the start's entry
 * arrow, and the dot a transition is dragged from; a state is drawn wherever the layout given
 * has it, which is where the user moved it, diagram/arrange.ts), and the marks of drawing (the item picked,
 * the cord of a transition being drawn and the state it would go to). Elements are joined by
 * key, so a redraw keeps every element that stays (and its focus).
 */
import { curveBasis, line, select, type Selection } from 'd3';
import type { DiagramLayout, LaidEdge, LaidNode } from '../diagram/layout.js';
import { LINE_H } from '../diagram/layout.js';
import type { Linking, Picked } from '../controllers/sketch-draw.js';

type G = Selection<SVGGElement, unknown, null, undefined>;

/** What the user does on an item of the sketch. */
export interface Handlers<T> {
  readonly click: (ev: MouseEvent, item: T) => void;
  readonly dblclick: (ev: MouseEvent, item: T) => void;
  readonly key: (ev: KeyboardEvent, item: T) => void;
  /** The keys the item takes, for assistive technology (aria-keyshortcuts). */
  readonly keys: string;
}

export interface NodeHandlers extends Handlers<LaidNode> {
  readonly codes: Readonly<Record<string, string>>;
  readonly lit: ReadonlySet<string>;
  /** Show the dots transitions are dragged from. */
  readonly drawable: boolean;
  readonly grab: (ev: PointerEvent, n: LaidNode) => void;
  /** A press on the card (it may become a move of the state). */
  readonly press: (ev: PointerEvent, n: LaidNode) => void;
}

/** Which line of a transition label an event is on (0 when not on a line). */
export function lineIndex(ev: Event): number {
  const t = (ev.target as Element | null)?.closest?.('text[data-line]');
  return t ? Number(t.getAttribute('data-line')) || 0 : 0;
}

export function drawEdges(g: G, edges: readonly LaidEdge[], on: Handlers<LaidEdge>): void {
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
    .attr('aria-keyshortcuts', on.keys)
    .on('click', on.click)
    .on('dblclick', on.dblclick)
    .on('keydown', on.key);
  label
    .select('rect')
    .attr('width', (e) => e.label.width)
    .attr('height', (e) => e.label.height)
    .attr('rx', 3);
  label
    .selectAll<SVGTextElement, string>('text')
    .data((e) => e.lines)
    .join('text')
    .attr('data-line', (_, i) => i)
    .attr('x', 4)
    .attr('y', (_, i) => 12 + i * LINE_H)
    .text((t) => t);
}

export function drawNodes(g: G, nodes: readonly LaidNode[], on: NodeHandlers): void {
  const sel = g
    .selectAll<SVGGElement, LaidNode>('g.node')
    .data(nodes, (n) => n.id)
    .join((enter) => {
      const e = enter.append('g').attr('class', 'node').attr('tabindex', 0).attr('role', 'button');
      e.append('rect').attr('class', 'body');
      e.append('path').attr('class', 'entry');
      e.append('text').attr('class', 'code');
      e.append('text').attr('class', 'merged');
      e.append('circle').attr('class', 'handle').attr('r', 6);
      return e;
    });
  sel
    .attr('transform', (n) => `translate(${n.x - n.width / 2},${n.y - n.height / 2})`)
    .classed('start', (n) => n.start)
    .classed('unreachable', (n) => n.unreachable)
    .classed('lit', (n) => on.lit.has(n.id))
    .attr('data-state', (n) => n.id)
    .attr(
      'aria-label',
      (n) =>
        `State ${n.lines.join(', ')}${on.codes[n.id] ? `, code ${on.codes[n.id]}` : ''}${n.start ? ', start' : ''}${on.lit.has(n.id) ? ', the machine is here' : ''}${n.line ? `, line ${n.line}` : ''}`,
    )
    .on('click', on.click)
    .on('dblclick', on.dblclick)
    .on('keydown', on.key)
    .on('pointerdown', on.press);
  sel
    .select('circle.handle')
    .attr('cx', (n) => n.width)
    .attr('cy', (n) => n.height / 2)
    .attr('display', on.drawable ? null : 'none')
    .on('pointerdown', on.grab);
  sel.attr('aria-keyshortcuts', on.keys);
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
    .text((n) => on.codes[n.id] ?? '');
  sel
    .select('text.merged')
    .attr('x', 2)
    .attr('y', (n) => n.height + 13)
    .text((n) => (n.mergedInto ? `same as ${n.mergedInto}` : n.unreachable ? 'unreachable' : ''));
}

/** The picked item, the transition being drawn and its target, drawn over the sketch. */
export function drawMarks(
  view: G,
  layout: DiagramLayout | undefined,
  d: { readonly picked: Picked | undefined; readonly linking: Linking | undefined },
): void {
  const picked = d.picked;
  view
    .selectAll<SVGGElement, LaidNode>('g.node')
    .classed('picked', (n) => picked?.kind === 'state' && picked.id === n.id)
    .classed('target', (n) => d.linking?.to === n.id);
  view
    .selectAll<SVGGElement, LaidEdge>('g.label')
    .selectAll<SVGTextElement, string>('text')
    .classed('picked', function (_, i) {
      const e = select<Element, LaidEdge>(this.parentNode as Element).datum();
      return (
        picked?.kind === 'edge' &&
        picked.from === e.from &&
        picked.to === e.to &&
        picked.index === i &&
        e.lines.length > 1
      );
    });
  const rubber = view.select('path.rubber');
  const l = d.linking;
  const from = l && layout?.nodes.find((n) => n.id === l.from);
  if (!l || !from) {
    rubber.attr('d', null);
    return;
  }
  const to = layout?.nodes.find((n) => n.id === l.to);
  const end = l.pointer ?? (to ? { x: to.x, y: to.y - to.height / 2 - (to === from ? 18 : 0) } : undefined);
  const x0 = from.x + from.width / 2;
  rubber.attr('d', end ? `M${x0},${from.y} L${end.x},${end.y}` : null);
}
