/**
 * <lw-notation-card>: the text form on one card — every statement, the guard operators, the
 * naming rules and a worked example — read from docs/notation.md (../notation.ts), so it says
 * what the reference says. A modal dialog: Escape or the close button shuts it; "Put the
 * example on the bench" sends the example as a new machine.
 * Events: `use-example` {text}.
 */
import { css, html } from 'lit';
import { DIALOG_STYLES, DialogCard } from './dialog-card.js';
import reference from '../../../docs/notation.md?raw';
import { notationCard, type CardRow, type Inline } from '../notation.js';
import { shared } from '../styles/shared.js';
import { emit } from './emit.js';

const CARD = notationCard(reference);

const words = (runs: readonly Inline[]) => runs.map((r) => (r.code ? html`<code>${r.text}</code>` : r.text));

export class LwNotationCard extends DialogCard {
  static override styles = [
    shared,
    DIALOG_STYLES,
    css`
      .body {
        padding: 0.4rem 0.9rem 0.9rem;
        display: grid;
        gap: 0.6rem;
      }
      .box {
        overflow-x: auto;
      }
      table {
        width: 100%;
      }
      td:first-child {
        white-space: nowrap;
      }
      pre {
        margin: 0;
        padding: 0.5rem 0.7rem;
        background: var(--lw-sunk);
        border-radius: var(--lw-radius);
        font: 0.82rem/1.4 var(--lw-mono);
        overflow-x: auto;
      }
    `,
  ];

  override render() {
    return html`<dialog aria-labelledby="card-title" @close=${() => this.dispatchEvent(new Event('closed'))}>
      <div class="head">
        <h2 id="card-title">Notation card: the text form</h2>
        <button @click=${() => this.close()} aria-label="Close the notation card">Close</button>
      </div>
      <div class="body">
        <p>${words(CARD.intro)}</p>
        ${this.table('Statements', 'write', CARD.statements)}
        <h3>Guards</h3>
        ${this.table('Guard expressions', 'guard', CARD.guards)}
        <p class="soft">${words(CARD.guardNote)}</p>
        <h3>Names</h3>
        ${this.table('Names', 'what', CARD.names)}
        <h3>Example</h3>
        <pre aria-label="An example machine in the text form">${CARD.example}</pre>
        <p>
          <button @click=${this.useExample}>Put the example on the bench</button>
          <span class="soft">The full reference, with the JSON form and every diagnostic code: docs/notation.md.</span>
        </p>
      </div>
    </dialog>`;
  }

  private table(caption: string, first: string, rows: readonly CardRow[]) {
    return html`<div class="box">
      <table aria-label=${caption}>
        <thead>
          <tr>
            <th scope="col">${first}</th>
            <th scope="col">meaning</th>
          </tr>
        </thead>
        <tbody>
          ${rows.map(
            (r) =>
              html`<tr>
                <td>${words(r.write)}</td>
                <td>${words(r.means)}</td>
              </tr>`,
          )}
        </tbody>
      </table>
    </div>`;
  }

  private useExample = (): void => {
    this.close();
    emit(this, 'use-example', { text: CARD.example });
  };
}

customElements.define('lw-notation-card', LwNotationCard);

declare global {
  interface HTMLElementTagNameMap {
    'lw-notation-card': LwNotationCard;
  }
}
