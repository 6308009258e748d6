/**
 * A card the page shows as a modal dialog (the notation card, the behaviour card): the element
 * renders one <dialog> in its shadow root, and this base opens and closes it. The browser's own
 * modal dialog keeps the keyboard inside it, closes it on Escape and gives focus back.
 */
import { LitElement, css } from 'lit';

/** The look both cards share: the panel with its brass top edge, the dimmed page behind, a head that stays in view. */
export const DIALOG_STYLES = css`
  dialog {
    max-width: min(46rem, calc(100vw - 1rem));
    max-height: calc(100vh - 2rem);
    padding: 0;
    border: 1px solid var(--lw-line);
    border-top: 4px solid var(--lw-brass);
    border-radius: var(--lw-radius);
    background: var(--lw-panel);
    color: var(--lw-ink);
  }
  dialog::backdrop {
    background: rgb(0 0 0 / 35%);
  }
  .head {
    display: flex;
    align-items: center;
    gap: 0.5rem;
    padding: 0.6rem 0.9rem;
    border-bottom: 1px solid var(--lw-line);
    position: sticky;
    top: 0;
    background: var(--lw-panel);
    z-index: 1;
  }
  .head h2 {
    margin: 0;
    flex: 1;
  }
`;

export class DialogCard extends LitElement {
  get open(): boolean {
    return this.renderRoot.querySelector('dialog')?.open ?? false;
  }

  show(): void {
    const d = this.renderRoot.querySelector('dialog');
    if (d && !d.open) d.showModal();
  }

  close(): void {
    this.renderRoot.querySelector('dialog')?.close();
  }
}
