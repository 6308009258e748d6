/**
 * <lw-lever-bank>: every lever of the machine drawn in its position — the operator levers
 * (inputs, φ1, φ2, reset: handle down while pulled), each latch's Q lever and each output
 * flag (up = 1, down = 0, level and dashed = undetermined X).
 */
import { LitElement, css, html, svg } from 'lit';
import type { PartReading } from '../../core/index.js';
import { shared } from '../styles/shared.js';

type Pos = '1' | '0' | 'X';

interface Lever {
  readonly name: string;
  readonly value: Pos;
  /** Operator levers point down when pulled; latch and flag levers point up for 1. */
  readonly operator: boolean;
  readonly words: string;
}

export class LwLeverBank extends LitElement {
  static override properties = { reading: { attribute: false } };
  declare reading: PartReading | undefined;

  constructor() {
    super();
    this.reading = undefined;
  }

  static override styles = [
    shared,
    css`
      :host {
        display: block;
      }
      .groups {
        display: flex;
        flex-wrap: wrap;
        gap: 0.5rem 1.2rem;
      }
      .group h3 {
        margin: 0 0 0.2rem;
      }
      .levers {
        display: flex;
        flex-wrap: wrap;
        gap: 0.2rem;
      }
      figure {
        margin: 0;
        width: 4.6rem;
        text-align: center;
        font-size: 0.75rem;
      }
      figcaption {
        line-height: 1.15;
        word-break: break-word;
      }
      .base {
        fill: var(--lw-ink-soft);
      }
      .arm {
        stroke: var(--lw-brass);
        stroke-width: 5px;
        stroke-linecap: round;
      }
      .operator .arm {
        stroke: var(--lw-ink);
      }
      .knob {
        fill: var(--lw-cord);
      }
      .x .arm {
        stroke: var(--lw-x);
        stroke-dasharray: 4 3;
      }
      .x .knob {
        fill: var(--lw-x);
      }
      .val {
        font: 700 13px var(--lw-mono);
        fill: var(--lw-ink);
      }
    `,
  ];

  override render() {
    const r = this.reading;
    if (!r) return html`<p class="soft">No machine to step yet.</p>`;
    const pos = (v: string): Pos => (v === '1' ? '1' : v === '0' ? '0' : 'X');
    const onOff = (b: boolean): Pos => (b ? '1' : '0');
    const operators: Lever[] = [
      ...Object.entries(r.inputs).map(([n, v]) => ({
        name: n,
        value: onOff(v === 1),
        operator: true,
        words: v === 1 ? 'pulled' : 'released',
      })),
      { name: 'φ1', value: onOff(r.phi1), operator: true, words: r.phi1 ? 'pulled' : 'released' },
      { name: 'φ2', value: onOff(r.phi2), operator: true, words: r.phi2 ? 'pulled' : 'released' },
      { name: 'reset', value: onOff(r.reset), operator: true, words: r.reset ? 'pulled' : 'released' },
    ];
    const latch = (role: 'master' | 'slave'): Lever[] =>
      r.latches
        .filter((l) => l.role === role)
        .map((l) => ({
          name: l.name.replace(/^(master|slave) latch /, ''),
          value: pos(l.q),
          operator: false,
          words: `Q ${l.q}, Q̄ ${l.qBar}`,
        }));
    const flags: Lever[] = Object.entries(r.outputs).map(([n, v]) => ({
      name: n,
      value: pos(v),
      operator: false,
      words: v === 'X' ? 'undetermined' : v === '1' ? 'raised' : 'lowered',
    }));
    return html`<div class="groups">
      ${this.group('Operator levers', operators)} ${this.group('Master latches', latch('master'))}
      ${this.group('Slave latches', latch('slave'))} ${this.group('Flags', flags)}
    </div>`;
  }

  private group(title: string, levers: readonly Lever[]) {
    if (levers.length === 0) return html``;
    return html`<div class="group" role="group" aria-label=${title}>
      <h3>${title}</h3>
      <div class="levers">${levers.map((l) => this.lever(l))}</div>
    </div>`;
  }

  private lever(l: Lever) {
    // Angle of the arm from horizontal, degrees (negative is up on screen).
    const angle = l.value === 'X' ? 0 : l.operator ? (l.value === '1' ? 30 : -30) : l.value === '1' ? -30 : 30;
    const rad = (angle * Math.PI) / 180;
    const [px, py, len] = [14, 30, 34];
    const ex = px + len * Math.cos(rad);
    const ey = py + len * Math.sin(rad);
    const cls = `${l.operator ? 'operator' : ''} ${l.value === 'X' ? 'x' : ''}`;
    return html`<figure
      role="img"
      aria-label=${`${l.name}: ${l.value} (${l.words})`}
      data-lever=${l.name}
      data-value=${l.value}
    >
      <svg width="64" height="56" viewBox="0 0 64 56" aria-hidden="true" class=${cls}>
        ${svg`<path class="base" d="M6,44 L22,44 L14,30 Z"></path>
          <line class="arm" x1=${px} y1=${py} x2=${ex} y2=${ey}></line>
          <circle class="knob" cx=${ex} cy=${ey} r="5"></circle>
          <circle class="base" cx=${px} cy=${py} r="3.5"></circle>
          <text class="val" x="56" y="52" text-anchor="end">${l.value}</text>`}
      </svg>
      <figcaption>${l.name}</figcaption>
    </figure>`;
  }
}

customElements.define('lw-lever-bank', LwLeverBank);

declare global {
  interface HTMLElementTagNameMap {
    'lw-lever-bank': LwLeverBank;
  }
}
