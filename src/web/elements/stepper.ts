/**
 * <lw-stepper>: the trial run — the machine stepped by hand at part level. Input levers as
 * toggles; φ1, φ2, a whole clock, reset and undo as buttons (and keys); the state, code and
 * outputs read off the latches; every lever drawn in its position; the timing diagram (in a
 * box of its own that scrolls sideways); the alarms in words when an operating rule is broken,
 * each naming its clock and hand action; and a flag when the input levers stand at a
 * combination the machine declares `never`.
 * Events: `step` {do: 'phi1' | 'phi2' | 'clock' | 'reset' | 'undo'} or {do: 'input', input, value}.
 */
import { LitElement, css, html, nothing } from 'lit';
import type { PartReading } from '../../core/index.js';
import type { Alarm, Impossible, Sample } from '../controllers/stepper.js';
import { shared, viewColumn } from '../styles/shared.js';
import { emit } from './emit.js';
import { touchScreen } from '../touch.js';
import './lever-bank.js';
import './timing-chart.js';

export class LwStepper extends LitElement {
  static override properties = {
    reading: { attribute: false },
    samples: { attribute: false },
    alarms: { attribute: false },
    clocks: { type: Number },
    impossible: { attribute: false },
    canUndo: { type: Boolean },
  };
  declare reading: PartReading | undefined;
  declare samples: readonly Sample[];
  declare alarms: readonly Alarm[];
  declare clocks: number;
  declare impossible: Impossible | undefined;
  declare canUndo: boolean;

  constructor() {
    super();
    this.reading = undefined;
    this.samples = [];
    this.alarms = [];
    this.clocks = 0;
    this.impossible = undefined;
    this.canUndo = false;
  }

  static override styles = [
    shared,
    viewColumn,
    css`
      .never {
        margin: 0.5rem 0 0;
        padding: 0.3rem 0.6rem;
        border-left: 4px solid var(--lw-warn);
        background: var(--lw-sunk);
      }
      :host([touch]) kbd {
        display: none;
      }
      .controls {
        display: flex;
        flex-wrap: wrap;
        gap: 0.4rem;
        align-items: center;
      }
      button[aria-pressed='true'] {
        background: var(--lw-brass);
        color: var(--lw-panel);
        border-color: var(--lw-brass);
      }
      kbd {
        font: 0.72rem var(--lw-mono);
        border: 1px solid currentColor;
        border-radius: 3px;
        padding: 0 0.25rem;
        margin-left: 0.3rem;
        opacity: 0.75;
      }
      .readout {
        display: flex;
        gap: 1.4rem;
        flex-wrap: wrap;
        font-size: 1rem;
      }
      .readout strong {
        font-family: var(--lw-mono);
        color: var(--lw-brass);
      }
      .alarms {
        margin: 0;
        padding: 0;
        list-style: none;
        max-height: 12rem;
        overflow: auto;
      }
      .alarms li {
        border-left: 4px solid var(--lw-warn);
        padding: 0.25rem 0.5rem;
        margin-bottom: 3px;
        background: var(--lw-sunk);
      }
      .alarms li.latch {
        border-left-color: var(--lw-error);
      }
    `,
  ];

  override connectedCallback(): void {
    super.connectedCallback();
    // Key hints mean nothing on a touch screen.
    this.toggleAttribute('touch', touchScreen());
  }

  override render() {
    const r = this.reading;
    if (!r) return html`<p class="soft">The trial run starts once the machine builds.</p>`;
    const step = (d: Record<string, unknown>) => () => emit(this, 'step', d);
    const outs = Object.entries(r.outputs);
    return html`<section class="panel" aria-label="Levers">
        <h2>Levers</h2>
        <div class="controls" role="group" aria-label="Input levers">
          ${Object.entries(r.inputs).map(
            ([name, v], i) =>
              html`<button
                aria-pressed=${v === 1 ? 'true' : 'false'}
                data-input=${name}
                @click=${step({ do: 'input', input: name, value: v === 1 ? 0 : 1 })}
              >
                ${name}${i < 9 ? html`<kbd>⇧${i + 1}</kbd>` : nothing}
              </button>`,
          )}
          ${Object.keys(r.inputs).length === 0 ? html`<span class="soft">No input levers.</span>` : nothing}
        </div>
        ${
          this.impossible
            ? html`<p class="never" role="alert" data-never=${this.impossible.guard}>
                These inputs are declared impossible:
                <code>never ${this.impossible.guard}</code
                >${this.impossible.line !== undefined ? ` (line ${this.impossible.line})` : ''}. The build may go to any
                state from here; its latches stay safe.
              </p>`
            : nothing
        }
        <div class="controls" role="group" aria-label="Clock and reset" style="margin-top:0.5rem">
          <button aria-pressed=${r.phi1 ? 'true' : 'false'} @click=${step({ do: 'phi1' })} data-do="phi1">
            φ1<kbd>1</kbd>
          </button>
          <button aria-pressed=${r.phi2 ? 'true' : 'false'} @click=${step({ do: 'phi2' })} data-do="phi2">
            φ2<kbd>2</kbd>
          </button>
          <button class="primary" @click=${step({ do: 'clock' })} data-do="clock">Whole clock<kbd>C</kbd></button>
          <button @click=${step({ do: 'reset' })} data-do="reset">Reset<kbd>R</kbd></button>
          <button ?disabled=${!this.canUndo} @click=${step({ do: 'undo' })} data-do="undo">Undo<kbd>U</kbd></button>
        </div>
      </section>
      <section class="panel" aria-label="Machine now">
        <div class="readout" role="status" aria-live="polite">
          <span
            >State
            <strong data-read="state"
              >${r.state ?? (r.code.includes('X') ? 'undetermined' : 'unused code')}</strong
            ></span
          >
          <span>Code <strong data-read="code">${r.code || '—'}</strong></span>
          <span
            >Outputs
            <strong data-read="outputs"
              >${outs.length ? outs.map(([k, v]) => `${k}=${v}`).join(' ') : '—'}</strong
            ></span
          >
          <span>Clocks <strong data-read="clocks">${this.clocks}</strong></span>
        </div>
      </section>
      <section class="panel" aria-label="Alarms">
        <h2>Alarms</h2>
        ${
          this.alarms.length === 0
            ? html`<p class="soft" role="log">None: every operating rule kept so far.</p>`
            : html`<ul class="alarms" role="log" aria-live="polite">
                ${[...this.alarms].reverse().map((a) => html`<li class=${a.latch ? 'latch' : a.kind === 'never' ? 'never' : ''} data-kind=${a.kind} data-clock=${a.clock}>Clock ${a.clock}, ${a.moment}: ${a.words}</li>`)}
              </ul>`
        }
      </section>
      <section class="panel" aria-label="Lever positions">
        <h2>Levers as they stand</h2>
        <lw-lever-bank .reading=${r}></lw-lever-bank>
      </section>
      <section class="panel" aria-label="Timing diagram">
        <h2>Timing diagram</h2>
        <lw-timing-chart .samples=${this.samples}></lw-timing-chart>
      </section>`;
  }
}

customElements.define('lw-stepper', LwStepper);

declare global {
  interface HTMLElementTagNameMap {
    'lw-stepper': LwStepper;
  }
}
