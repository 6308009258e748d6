/**
 * <lw-timing-chart>: a timing diagram of the trial run, drawn with d3 — one trace per input
 * lever, φ1, φ2, reset, slave and master state bit and output, one column per hand action,
 * with the clock boundaries marked. An undetermined value (X) is a hatched band. The chart
 * grows to the right with every action inside a box of its own that scrolls sideways (kept
 * at its newest end); the page around it never widens.
 */
import { LitElement, css, html, type PropertyValues } from 'lit';
import { select } from 'd3';
import type { Sample } from '../controllers/stepper.js';
import { tracesOf, type Trace } from '../controllers/traces.js';
import { shared } from '../styles/shared.js';

const ROW = 24;
const COL = 18;
/** Width of the fixed column of trace names, and the gap before the first column of the traces. */
const LEFT = 70;
const PAD = 6;

export class LwTimingChart extends LitElement {
  static override properties = { samples: { attribute: false } };
  declare samples: readonly Sample[];

  constructor() {
    super();
    this.samples = [];
  }

  static override styles = [
    shared,
    css`
      :host {
        display: block;
        min-width: 0;
        max-width: 100%;
      }
      /* The trace names stay put at the left; the traces scroll beside them. */
      .frame {
        display: flex;
        max-width: 100%;
        border: 1px solid var(--lw-line);
        border-radius: var(--lw-radius);
        background: var(--lw-sunk);
      }
      .names {
        flex: none;
        border-right: 1px solid var(--lw-line);
      }
      .scroll {
        flex: 1;
        min-width: 0;
        overflow-x: auto;
      }
      svg {
        display: block;
        font: 11px var(--lw-mono);
      }
      .name {
        fill: var(--lw-ink);
      }
      .trace {
        fill: none;
        stroke-width: 2px;
      }
      .input {
        stroke: var(--lw-info);
      }
      .clock {
        stroke: var(--lw-brass);
      }
      .bit {
        stroke: var(--lw-ink);
      }
      .output {
        stroke: var(--lw-cord);
      }
      .x {
        fill: url(#hatch);
        stroke: var(--lw-x);
      }
      .hatch-line {
        stroke: var(--lw-x);
        stroke-width: 1.5px;
      }
      .tick {
        stroke: var(--lw-line);
        stroke-dasharray: 2 3;
      }
      .clock-no {
        fill: var(--lw-ink-soft);
        font-size: 10px;
      }
    `,
  ];

  override render() {
    const traces = tracesOf(this.samples);
    return html`<div class="frame">
      <svg class="names" aria-hidden="true"></svg>
      <div class="scroll" tabindex="0" aria-label="Timing diagram; scroll sideways for earlier clocks">
        <svg class="traces" role="img" aria-label=${this.describe(traces)}></svg>
      </div>
    </div>`;
  }

  private describe(traces: readonly Trace[]): string {
    const n = this.samples.length;
    if (n === 0) return 'Timing diagram: no steps yet';
    const last = traces.map((t) => `${t.name}=${t.values[n - 1]}`).join(', ');
    return `Timing diagram of ${n} hand actions over ${this.samples[n - 1].clock} clocks; now ${last}`;
  }

  protected override updated(changed: PropertyValues<this>): void {
    if (!changed.has('samples')) return;
    const traces = tracesOf(this.samples);
    const n = this.samples.length;
    const width = PAD + Math.max(n, 1) * COL + 20;
    const height = traces.length * ROW + 22;
    const names = select(this.renderRoot.querySelector('svg.names') as SVGSVGElement)
      .attr('width', LEFT)
      .attr('height', height);
    names.selectAll('*').remove();
    names
      .selectAll('text')
      .data(traces)
      .join('text')
      .attr('class', 'name')
      .attr('x', 6)
      .attr('y', (_, k) => 16 + k * ROW + ROW / 2 + 2)
      .text((t) => t.name);
    const root = select(this.renderRoot.querySelector('svg.traces') as SVGSVGElement)
      .attr('width', width)
      .attr('height', height);
    root.selectAll('*').remove();
    const pattern = root
      .append('defs')
      .append('pattern')
      .attr('id', 'hatch')
      .attr('width', 6)
      .attr('height', 6)
      .attr('patternUnits', 'userSpaceOnUse');
    pattern.append('path').attr('class', 'hatch-line').attr('d', 'M0,6 L6,0');
    const x = (i: number): number => PAD + i * COL;
    // Clock boundaries: where the count of finished clocks goes up.
    this.samples.forEach((s, i) => {
      if (i === 0 || s.clock === this.samples[i - 1].clock) return;
      root
        .append('line')
        .attr('class', 'tick')
        .attr('x1', x(i + 1))
        .attr('x2', x(i + 1))
        .attr('y1', 12)
        .attr('y2', height);
      root
        .append('text')
        .attr('class', 'clock-no')
        .attr('x', x(i + 1) + 2)
        .attr('y', 10)
        .text(String(s.clock));
    });
    const rows = root
      .selectAll('g.row')
      .data(traces)
      .join('g')
      .attr('class', 'row')
      .attr('transform', (_, k) => `translate(0,${16 + k * ROW})`);
    rows.each(function (t) {
      const g = select(this);
      let d = '';
      t.values.forEach((v, i) => {
        const x0 = x(i);
        const x1 = x(i + 1);
        if (v === 'X') {
          g.append('rect')
            .attr('class', 'x')
            .attr('x', x0)
            .attr('y', 4)
            .attr('width', COL)
            .attr('height', ROW - 10);
          return;
        }
        const y = v === '1' ? 4 : ROW - 6;
        d += `${d === '' || t.values[i - 1] === 'X' ? 'M' : 'L'}${x0},${y} L${x1},${y} `;
      });
      g.append('path').attr('class', `trace ${t.group}`).attr('d', d);
    });
    const scroller = this.renderRoot.querySelector('.scroll');
    if (scroller) scroller.scrollLeft = scroller.scrollWidth;
  }
}

customElements.define('lw-timing-chart', LwTimingChart);

declare global {
  interface HTMLElementTagNameMap {
    'lw-timing-chart': LwTimingChart;
  }
}
