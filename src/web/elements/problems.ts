/**
 * <lw-problems>: the diagnostics, worded exactly as the command line words them
 * (formatDiagnostic), errors first. An entry with a line jumps there; one without says that it
 * concerns the whole machine.
 * Events: `reveal` {line, column}.
 */
import { LitElement, css, html, nothing } from 'lit';
import { type Diagnostic, formatDiagnostic } from '../../core/index.js';
import { shared } from '../styles/shared.js';
import { emit } from './emit.js';

const RANK = { error: 0, warning: 1, info: 2 } as const;

export class LwProblems extends LitElement {
  static override properties = { diagnostics: { attribute: false }, settled: { type: Boolean } };
  declare diagnostics: readonly Diagnostic[];
  /** False while the text is still being read (the list may lag a keystroke). */
  declare settled: boolean;

  constructor() {
    super();
    this.diagnostics = [];
    this.settled = true;
  }

  static override styles = [
    shared,
    css`
      :host {
        display: block;
      }
      ul {
        list-style: none;
        margin: 0;
        padding: 0;
        max-height: 11rem;
        overflow: auto;
      }
      li button:disabled {
        opacity: 1;
        cursor: default;
      }
      li button {
        display: grid;
        grid-template-columns: 4.6rem 1fr;
        gap: 0.5rem;
        width: 100%;
        text-align: left;
        border: 0;
        border-left: 4px solid var(--lw-line);
        border-radius: 0;
        margin: 0 0 2px;
        background: var(--lw-panel);
      }
      li.error button {
        border-left-color: var(--lw-error);
      }
      li.warning button {
        border-left-color: var(--lw-warn);
      }
      li.info button {
        border-left-color: var(--lw-info);
      }
      .sev {
        font-weight: 700;
        font-size: 0.78rem;
        text-transform: uppercase;
        letter-spacing: 0.04em;
      }
      li.error .sev {
        color: var(--lw-error);
      }
      li.warning .sev {
        color: var(--lw-warn);
      }
      li.info .sev {
        color: var(--lw-info);
      }
      .line,
      .sev {
        white-space: pre-wrap;
        overflow-wrap: anywhere;
      }
      .clear {
        padding: 0.3rem 0.2rem;
      }
      summary {
        cursor: pointer;
        color: var(--lw-ink-soft);
        font-size: 0.85rem;
        padding: 0.2rem 0;
      }
    `,
  ];

  override render() {
    const ds = [...this.diagnostics].sort(
      (a, b) => RANK[a.severity] - RANK[b.severity] || (a.location.line ?? 0) - (b.location.line ?? 0),
    );
    const main = ds.filter((d) => d.severity !== 'info');
    const notes = ds.filter((d) => d.severity === 'info');
    const errors = ds.filter((d) => d.severity === 'error').length;
    return html`<section aria-label="Problems">
      <div role="status" class="visually-hidden">
        ${errors === 0 ? 'No errors' : `${errors} error${errors === 1 ? '' : 's'}`}
      </div>
      ${
        main.length === 0
          ? html`<p class="clear ok">${this.settled ? 'No problems: the machine reads cleanly.' : 'Reading…'}</p>`
          : html`<ul>
              ${main.map((d) => this.entry(d))}
            </ul>`
      }
      ${
        notes.length > 0
          ? html`<details>
              <summary>${notes.length} note${notes.length === 1 ? '' : 's'} (nothing wrong; worth knowing)</summary>
              <ul>
                ${notes.map((d) => this.entry(d))}
              </ul>
            </details>`
          : nothing
      }
    </section>`;
  }

  private entry(d: Diagnostic) {
    const line = d.location.line;
    const path = d.location.path;
    const whole = line === undefined && (path === undefined || path === '$');
    return html`<li class=${d.severity} data-line=${line ?? 'machine'}>
      <button
        ?disabled=${line === undefined}
        @click=${() => emit(this, 'reveal', { line: line ?? 1, column: d.location.column ?? 1 })}
        title=${line !== undefined ? `Show line ${line} in the text` : ''}
      >
        <span class="sev"
          >${d.severity}<br />${line !== undefined ? `line ${line}` : whole ? 'whole machine' : path}</span
        >
        <span class="line mono">${formatDiagnostic(d)}</span>
      </button>
    </li>`;
  }
}

customElements.define('lw-problems', LwProblems);

declare global {
  interface HTMLElementTagNameMap {
    'lw-problems': LwProblems;
  }
}
