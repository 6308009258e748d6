/**
 * Printing a document of the build: the page hands the browser's print dialog a page of its own
 * — the document in a hidden frame, sandboxed (it may show the print dialog; it runs nothing) —
 * so the print is the document exactly, not the designer around it.
 */

const FRAME_ID = 'lw-print';

/**
 * Print a self-contained HTML page (the build sheet, the frame drawing), `title` naming it for
 * assistive technology. Resolves once the print dialog was opened and closed.
 */
export function printHtml(html: string, title = 'The build sheet, for printing'): Promise<void> {
  document.getElementById(FRAME_ID)?.remove();
  const frame = document.createElement('iframe');
  frame.id = FRAME_ID;
  frame.title = title;
  frame.setAttribute('aria-hidden', 'true');
  frame.setAttribute('sandbox', 'allow-modals allow-same-origin');
  Object.assign(frame.style, { position: 'fixed', right: '0', bottom: '0', width: '0', height: '0', border: '0' });
  return new Promise((done) => {
    frame.addEventListener(
      'load',
      () => {
        const w = frame.contentWindow;
        const back = deepActive();
        w?.focus();
        w?.print();
        // The dialog is closed: the keys go back to where they were (the designer's own shortcuts with them).
        back?.focus();
        frame.dataset.printed = String(Number(frame.dataset.printed ?? 0) + 1);
        done();
      },
      { once: true },
    );
    frame.srcdoc = html;
    document.body.append(frame);
  });
}

/** The element that has the focus, looked for inside shadow roots too. */
function deepActive(): HTMLElement | undefined {
  let at = document.activeElement;
  while (at?.shadowRoot?.activeElement) at = at.shadowRoot.activeElement;
  return at instanceof HTMLElement ? at : undefined;
}
