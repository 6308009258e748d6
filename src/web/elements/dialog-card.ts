/**
 * A card the page shows as a modal dialog (the notation card, the behaviour card): the element
 * renders one <dialog> in its shadow root, and this base opens and closes it. The browser's own
 * modal dialog keeps the keyboard inside it, closes it on Escape and gives focus back.
 */
import { LitElement } from 'lit';

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
