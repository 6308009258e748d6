/**
 * <lw-bar-chart>: horizontal bars drawn with d3 (scale, axis, join), with an optional marker
 * line (the design rule's minimum margin). Bars below the marker are drawn as failing.
 * Used for the capstans' force margins and the drum torque per state.
 */
import { LitElement, css, html, type PropertyValues } from 'lit';
import { axisBottom, max, scaleBand, scaleLinear, select } from 'd3';
import { shared } from '../styles/shared.js';

export interface Bar {
  readonly label: string;
  readonly value: number;
  /** Shown beside the bar (default: the value). */
  readonly note?: string;
}

export class LwBarChart extends LitElement {
  static override properties = {
    bars: { attribute: false },
    marker: { attribute: false },
    unit: { type: String },
    caption: { type: String },
    /** Bars under the marker fail (margins); otherwise the marker is only a reference. */
    floor: { type: Boolean },
  };
  declare bars: readonly Bar[];
  declare marker: { readonly value: number; readonly label: string } | undefined;
  declare unit: string;
  declare caption: string;
  declare floor: boolean;

  constructor() {
    super();
    this.bars = [];
    this.marker = undefined;
    this.unit = '';
    this.caption = '';
    this.floor = false;
  }

  static override styles = [
    shared,
    css`
      :host {
        display: block;
      }
      svg {
        width: 100%;
        font-family: var(--lw-font);
        font-size: 11px;
      }
      .bar {
        fill: var(--lw-brass);
      }
      .bar.fail {
        fill: var(--lw-error);
      }
      .name,
      .value {
        fill: var(--lw-ink);
      }
      .marker {
        stroke: var(--lw-cord);
        stroke-width: 2px;
        stroke-dasharray: 5 3;
      }
      .marker-label {
        fill: var(--lw-cord);
        font-weight: 700;
      }
      .axis text {
        fill: var(--lw-ink-soft);
      }
      .axis path,
      .axis line {
        stroke: var(--lw-line);
      }
    `,
  ];

  override render() {
    const h = this.height();
    return html`<figure style="margin:0">
      <svg role="img" aria-label=${this.describe()} viewBox=${`0 0 640 ${h}`} height=${h}></svg>
      <figcaption class="visually-hidden">${this.describe()}</figcaption>
    </figure>`;
  }

  private height(): number {
    return 40 + this.bars.length * 18;
  }

  private describe(): string {
    const low = this.bars.reduce<Bar | undefined>((m, b) => (!m || b.value < m.value ? b : m), undefined);
    const high = this.bars.reduce<Bar | undefined>((m, b) => (!m || b.value > m.value ? b : m), undefined);
    if (!low || !high) return `${this.caption}: nothing to show`;
    return `${this.caption}: ${this.bars.length} bars, lowest ${low.label} at ${low.value.toFixed(2)} ${this.unit}, highest ${high.label} at ${high.value.toFixed(2)} ${this.unit}${this.marker ? `; ${this.marker.label}` : ''}`;
  }

  protected override updated(changed: PropertyValues<this>): void {
    if (!changed.has('bars') && !changed.has('marker')) return;
    const svg = select(this.renderRoot.querySelector('svg') as SVGSVGElement);
    svg.selectAll('*').remove();
    const left = 150;
    const right = 70;
    const width = 640;
    const h = this.height();
    const top = 8;
    const bottom = h - 24;
    const most = Math.max(max(this.bars, (b) => b.value) ?? 0, this.marker?.value ?? 0) * 1.08 || 1;
    const x = scaleLinear()
      .domain([0, most])
      .range([left, width - right])
      .nice();
    const y = scaleBand<number>()
      .domain(this.bars.map((_, i) => i))
      .range([top, bottom])
      .padding(0.18);
    const row = svg
      .append('g')
      .selectAll('g')
      .data(this.bars)
      .join('g')
      .attr('transform', (_, i) => `translate(0,${y(i) ?? 0})`);
    row
      .append('text')
      .attr('class', 'name')
      .attr('x', left - 6)
      .attr('y', y.bandwidth() / 2 + 4)
      .attr('text-anchor', 'end')
      .text((b) => (b.label.length > 24 ? b.label.slice(0, 23) + '…' : b.label));
    row
      .append('rect')
      .attr('class', (b) => (this.floor && this.marker && b.value < this.marker.value ? 'bar fail' : 'bar'))
      .attr('x', left)
      .attr('height', y.bandwidth())
      .attr('width', (b) => Math.max(1, x(b.value) - left))
      .append('title')
      .text((b) => `${b.label}: ${b.note ?? `${b.value.toFixed(2)} ${this.unit}`}`);
    row
      .append('text')
      .attr('class', 'value')
      .attr('x', (b) => x(b.value) + 4)
      .attr('y', y.bandwidth() / 2 + 4)
      .text((b) => b.note ?? b.value.toFixed(2));
    svg.append('g').attr('class', 'axis').attr('transform', `translate(0,${bottom})`).call(axisBottom(x).ticks(6));
    if (this.marker) {
      const mx = x(this.marker.value);
      svg
        .append('line')
        .attr('class', 'marker')
        .attr('x1', mx)
        .attr('x2', mx)
        .attr('y1', top - 4)
        .attr('y2', bottom);
      svg
        .append('text')
        .attr('class', 'marker-label')
        .attr('x', mx + 4)
        .attr('y', top + 6)
        .text(this.marker.label);
    }
  }
}

customElements.define('lw-bar-chart', LwBarChart);

declare global {
  interface HTMLElementTagNameMap {
    'lw-bar-chart': LwBarChart;
  }
}
