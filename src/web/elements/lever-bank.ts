/**
 * <lw-lever-bank>: every lever of the machine drawn where it physically stands, one meaning
 * for every drawing: handle down = held down (by a hand, or by the cord of the part that
 * pulls it), handle up = at rest on its weight, level and dashed = undetermined (X). The figure
 * beside each drawing is its signal:
 *
 * - an operator lever (an input, φ1, φ2, reset) is down while pulled, and then reads 1;
 * - a latch is drawn as its two gates' Z levers, set side and reset side, as the commissioning
 *   sheet describes them: a gate whose output is 1 has its Z lever down, so a latch holding 1
 *   has its set-side lever down and its reset-side lever up ("down · up"), holding 0 "up · down";
 * - a flag is mounted to stand up when it shows 1.
 *
 * A legend under the drawings says so.
 */
import { LitElement, css, html, svg, type TemplateResult } from 'lit';
import type { PartReading } from '../../core/index.js';
import { shared } from '../styles/shared.js';

/** Where a lever stands. */
export type Stand = 'down' | 'up' | 'X';

/** What each stand means, in the legend's words: one meaning for every lever drawing of the designer (the frame's too). */
export const STAND_WORDS: Readonly<Record<Stand, string>> = {
  down: 'held down — an operator lever pulled (reads 1), or a latch side whose gate gives 1',
  up: 'the lever stands up — at rest on its weight; a flag stands up to show 1',
  X: 'undetermined (X), e.g. before the first reset',
};

/** The drawing of one lever standing `stand`, with a figure beside it (styled by LEVER_GLYPH_STYLES). */
export function leverGlyph(stand: Stand, figure: string): TemplateResult {
  // Angle of the arm from horizontal, degrees (positive is down on screen).
  const angle = stand === 'X' ? 0 : stand === 'down' ? 30 : -30;
  const rad = (angle * Math.PI) / 180;
  const [px, py, len] = [14, 30, 34];
  const ex = px + len * Math.cos(rad);
  const ey = py + len * Math.sin(rad);
  return html`<svg width="60" height="56" viewBox="0 0 64 56" aria-hidden="true" class=${stand === 'X' ? 'x' : ''}>
    ${svg`<path class="base" d="M6,44 L22,44 L14,30 Z"></path>
        <line class="arm" x1=${px} y1=${py} x2=${ex} y2=${ey}></line>
        <circle class="knob" cx=${ex} cy=${ey} r="5"></circle>
        <circle class="base" cx=${px} cy=${py} r="3.5"></circle>
        <text class="val" x="58" y="52" text-anchor="end">${figure}</text>`}
  </svg>`;
}

/** The styles of leverGlyph's drawing. */
export const LEVER_GLYPH_STYLES = css`
  .base {
    fill: var(--lw-ink-soft);
  }
  .arm {
    stroke: var(--lw-brass);
    stroke-width: 5px;
    stroke-linecap: round;
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
`;

interface Lever {
  readonly name: string;
  readonly stand: Stand;
  /** The signal it gives, as read ('1', '0' or 'X'). */
  readonly value: string;
  readonly words: string;
}

interface LatchLevers {
  readonly name: string;
  readonly q: string;
  readonly set: Stand;
  readonly reset: Stand;
}

const standOf = (output: string): Stand => (output === '1' ? 'down' : output === '0' ? 'up' : 'X');

export class LwLeverBank extends LitElement {
  static override properties = { reading: { attribute: false } };
  declare reading: PartReading | undefined;

  constructor() {
    super();
    this.reading = undefined;
  }

  static override styles = [
    shared,
    LEVER_GLYPH_STYLES,
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
        min-width: 4.2rem;
        text-align: center;
        font-size: 0.75rem;
      }
      figure.latch {
        min-width: 7.4rem;
        border: 1px solid var(--lw-line);
        border-radius: var(--lw-radius);
        padding: 0.1rem 0.2rem 0.2rem;
      }
      .pair {
        display: flex;
        justify-content: center;
      }
      .pair span {
        display: block;
        font-size: 0.68rem;
        color: var(--lw-ink-soft);
      }
      figcaption {
        line-height: 1.15;
        word-break: break-word;
      }
      .legend {
        display: flex;
        flex-wrap: wrap;
        gap: 0.3rem 1.2rem;
        margin: 0.6rem 0 0;
        padding: 0.4rem 0 0;
        border-top: 1px solid var(--lw-line);
        font-size: 0.8rem;
        color: var(--lw-ink-soft);
      }
      .legend div {
        display: flex;
        align-items: center;
        gap: 0.3rem;
        max-width: 22rem;
      }
      .legend svg {
        flex: none;
      }
    `,
  ];

  override render() {
    const r = this.reading;
    if (!r) return html`<p class="soft">No machine to step yet.</p>`;
    const pulled = (name: string, on: boolean): Lever => ({
      name,
      stand: on ? 'down' : 'up',
      value: on ? '1' : '0',
      words: on ? 'pulled, down' : 'released, up',
    });
    const operators: Lever[] = [
      ...Object.entries(r.inputs).map(([n, v]) => pulled(n, v === 1)),
      pulled('φ1', r.phi1),
      pulled('φ2', r.phi2),
      pulled('reset', r.reset),
    ];
    const latches = (role: 'master' | 'slave'): LatchLevers[] =>
      r.latches
        .filter((l) => l.role === role)
        .map((l) => ({
          name: l.name.replace(/^(master|slave) latch /, ''),
          q: l.q,
          set: standOf(l.q),
          reset: standOf(l.qBar),
        }));
    const flags: Lever[] = Object.entries(r.outputs).map(([n, v]) => ({
      name: n,
      stand: v === '1' ? 'up' : v === '0' ? 'down' : 'X',
      value: v,
      words: v === 'X' ? 'undetermined' : v === '1' ? 'up, shows 1' : 'down, shows 0',
    }));
    return html`<div class="groups">
        ${this.group(
          'Operator levers',
          operators.map((l) => this.lever(l)),
        )}
        ${this.group(
          'Master latches',
          latches('master').map((l) => this.latch(l)),
        )}
        ${this.group(
          'Slave latches',
          latches('slave').map((l) => this.latch(l)),
        )}
        ${this.group(
          'Flags',
          flags.map((l) => this.lever(l)),
        )}
      </div>
      ${this.legend()}`;
  }

  private group(title: string, items: readonly unknown[]) {
    if (items.length === 0) return html``;
    return html`<div class="group" role="group" aria-label=${title}>
      <h3>${title}</h3>
      <div class="levers">${items}</div>
    </div>`;
  }

  private glyph(stand: Stand, figure: string) {
    return leverGlyph(stand, figure);
  }

  private lever(l: Lever) {
    return html`<figure
      role="img"
      aria-label=${`${l.name}: ${l.value} (${l.words})`}
      data-lever=${l.name}
      data-value=${l.value}
      data-stand=${l.stand}
    >
      ${this.glyph(l.stand, l.value)}
      <figcaption>${l.name}</figcaption>
    </figure>`;
  }

  private latch(l: LatchLevers) {
    const holds = l.q === 'X' ? 'undetermined' : `holds ${l.q}`;
    return html`<figure
      class="latch"
      role="img"
      aria-label=${`${l.name} ${holds}: set-side lever ${l.set}, reset-side lever ${l.reset}`}
      data-lever=${l.name}
      data-value=${l.q}
      data-set=${l.set}
      data-reset=${l.reset}
    >
      <div class="pair">
        <div>${this.glyph(l.set, '')}<span>set side</span></div>
        <div>${this.glyph(l.reset, '')}<span>reset side</span></div>
      </div>
      <figcaption><strong>${l.name}</strong> ${holds}</figcaption>
    </figure>`;
  }

  private legend() {
    return html`<div class="legend" role="note" aria-label="How the levers are drawn">
      <div>${this.glyph('down', '')}<span>Down: ${STAND_WORDS.down}.</span></div>
      <div>${this.glyph('up', '')}<span>Up: ${STAND_WORDS.up}.</span></div>
      <div>${this.glyph('X', '')}<span>Level, dashed: ${STAND_WORDS.X}.</span></div>
      <div>
        <span>A latch holding 1 has its set side down and its reset side up; holding 0, the other way round.</span>
      </div>
    </div>`;
  }
}

customElements.define('lw-lever-bank', LwLeverBank);

declare global {
  interface HTMLElementTagNameMap {
    'lw-lever-bank': LwLeverBank;
  }
}
