/**
 * <lw-bar-chart>: horizontal bars drawn with d3 (scale, axis), with an optional marker line
 * (the design rule's minimum margin). Bars below the marker are drawn as failing. Used for the
 * capstans' force margins and the drum torque per state.
 *
 * Nothing is cut: the chart is drawn at the width of its box (and again when the box changes
 * size), each label is wrapped onto as many lines as it needs, with an optional smaller second
 * label under it, and room is kept at the right for the longest value.
 */
import { LitElement, css, html, type PropertyValues } from 'lit';
import { axisBottom, max, scaleLinear, select } from 'd3';
import { shared } from '../styles/shared.js';

export interface Bar {
  readonly label: string;
  /** A second, smaller line under the label (where the value was found, …). */
  readonly sub?: string;
  readonly value: number;
  /** Shown beside the bar (default: the value). */
  readonly note?: string;
}

/** Average advance of a character of the chart's 12 px and 11 px sans text (an estimate, generous). */
const CHAR_12 = 6.7;
const CHAR_11 = 6.1;
const LINE_12 = 14;
const LINE_11 = 13;

/** Break text into lines of at most `width` characters, at spaces (a longer word gets a line of its own). */
export function wrapText(text: string, width: number): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(' ')) {
    if (line !== '' && line.length + 1 + word.length > width) {
      lines.push(line);
      line = word;
    } else line = line === '' ? word : `${line} ${word}`;
  }
  if (line !== '') lines.push(line);
  // A word longer than the line is broken, never clipped.
  return lines.flatMap((l) =>
    l.length <= width ? [l] : (l.match(new RegExp(`.{1,${Math.max(width, 1)}}`, 'g')) ?? [l]),
  );
}

interface Row {
  readonly bar: Bar;
  readonly lines: readonly string[];
  readonly subs: readonly string[];
  readonly y: number;
  readonly height: number;
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
  private width = 0;
  private readonly resized = new ResizeObserver(() => {
    const w = Math.floor(this.clientWidth);
    if (w > 0 && w !== this.width) this.draw();
  });

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
        min-width: 0;
      }
      svg {
        display: block;
        font-family: var(--lw-font);
        font-size: 12px;
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
      .sub {
        fill: var(--lw-ink-soft);
        font-size: 11px;
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
      .rule {
        stroke: var(--lw-line);
        stroke-width: 0.5px;
      }
    `,
  ];

  override connectedCallback(): void {
    super.connectedCallback();
    this.resized.observe(this);
  }

  override disconnectedCallback(): void {
    this.resized.disconnect();
    super.disconnectedCallback();
  }

  override render() {
    return html`<figure style="margin:0">
      <svg role="img" aria-label=${this.describe()}></svg>
      <figcaption class="visually-hidden">${this.describe()}</figcaption>
    </figure>`;
  }

  private describe(): string {
    const low = this.bars.reduce<Bar | undefined>((m, b) => (!m || b.value < m.value ? b : m), undefined);
    const high = this.bars.reduce<Bar | undefined>((m, b) => (!m || b.value > m.value ? b : m), undefined);
    if (!low || !high) return `${this.caption}: nothing to show`;
    return `${this.caption}: ${this.bars.length} bars, lowest ${low.label} at ${low.value.toFixed(2)} ${this.unit}, highest ${high.label} at ${high.value.toFixed(2)} ${this.unit}${this.marker ? `; ${this.marker.label}` : ''}`;
  }

  protected override updated(changed: PropertyValues<this>): void {
    if (changed.has('bars') || changed.has('marker')) this.draw();
  }

  /** Rows of wrapped labels, stacked from `top`. */
  private rows(labelChars: number, top: number): Row[] {
    let y = top;
    return this.bars.map((bar) => {
      const lines = wrapText(bar.label, labelChars);
      const subs = bar.sub ? wrapText(bar.sub, Math.floor((labelChars * CHAR_12) / CHAR_11)) : [];
      const height = Math.max(22, lines.length * LINE_12 + subs.length * LINE_11 + 8);
      const row = { bar, lines, subs, y, height };
      y += height;
      return row;
    });
  }

  private draw(): void {
    const el = this.renderRoot.querySelector('svg');
    if (!el) return;
    const width = Math.max(240, Math.floor(this.clientWidth) || 640);
    this.width = width;
    const svg = select(el);
    svg.selectAll('*').remove();
    const notes = this.bars.map((b) => b.note ?? b.value.toFixed(2));
    const right = Math.ceil(Math.max(4, ...notes.map((n) => n.length)) * CHAR_12) + 12;
    const longest = Math.max(4, ...this.bars.map((b) => b.label.length));
    const left = Math.min(Math.max(90, Math.floor(width * 0.45)), Math.ceil(longest * CHAR_12) + 10);
    const labelChars = Math.max(8, Math.floor((left - 10) / CHAR_12));
    const top = 18;
    const rows = this.rows(labelChars, top);
    const bottom = (rows.length > 0 ? rows[rows.length - 1].y + rows[rows.length - 1].height : top) + 4;
    const height = bottom + 24;
    svg.attr('width', width).attr('height', height).attr('viewBox', `0 0 ${width} ${height}`);
    const most = Math.max(max(this.bars, (b) => b.value) ?? 0, this.marker?.value ?? 0) * 1.05 || 1;
    const x = scaleLinear()
      .domain([0, most])
      .range([left, Math.max(left + 40, width - right)])
      .nice();
    this.drawRows(svg.append('g'), rows, left, x);
    svg
      .append('g')
      .attr('class', 'axis')
      .attr('transform', `translate(0,${bottom})`)
      .call(axisBottom(x).ticks(Math.max(2, Math.floor((width - left - right) / 70))));
    if (this.marker) {
      const mx = x(this.marker.value);
      svg
        .append('line')
        .attr('class', 'marker')
        .attr('x1', mx)
        .attr('x2', mx)
        .attr('y1', top - 4)
        .attr('y2', bottom);
      const near = mx + 4 + this.marker.label.length * CHAR_12 > width;
      svg
        .append('text')
        .attr('class', 'marker-label')
        .attr('x', near ? mx - 4 : mx + 4)
        .attr('y', top - 6)
        .attr('text-anchor', near ? 'end' : 'start')
        .text(this.marker.label);
    }
    this.dataset.drawn = String(width);
  }

  private drawRows(
    g: ReturnType<typeof select<SVGGElement, unknown>>,
    rows: readonly Row[],
    left: number,
    x: (v: number) => number,
  ): void {
    for (const r of rows) {
      const row = g.append('g').attr('transform', `translate(0,${r.y})`);
      const b = r.bar;
      r.lines.forEach((l, i) =>
        row
          .append('text')
          .attr('class', 'name')
          .attr('x', left - 8)
          .attr('y', 14 + i * LINE_12)
          .attr('text-anchor', 'end')
          .text(l),
      );
      r.subs.forEach((l, i) =>
        row
          .append('text')
          .attr('class', 'sub')
          .attr('x', left - 8)
          .attr('y', 14 + r.lines.length * LINE_12 + i * LINE_11)
          .attr('text-anchor', 'end')
          .text(l),
      );
      const barH = Math.min(16, r.height - 6);
      const failing = this.floor && this.marker !== undefined && b.value < this.marker.value;
      row
        .append('rect')
        .attr('class', failing ? 'bar fail' : 'bar')
        .attr('x', left)
        .attr('y', 3)
        .attr('height', barH)
        .attr('width', Math.max(1, x(b.value) - left))
        .append('title')
        .text(`${b.label}: ${b.note ?? `${b.value.toFixed(2)} ${this.unit}`}`);
      row
        .append('text')
        .attr('class', 'value')
        .attr('x', x(b.value) + 4)
        .attr('y', 3 + barH / 2 + 4)
        .text(b.note ?? b.value.toFixed(2));
      row
        .append('line')
        .attr('class', 'rule')
        .attr('x1', 0)
        .attr('x2', left - 4)
        .attr('y1', r.height)
        .attr('y2', r.height);
    }
  }
}

customElements.define('lw-bar-chart', LwBarChart);

declare global {
  interface HTMLElementTagNameMap {
    'lw-bar-chart': LwBarChart;
  }
}
