/** Styles every element shares: panels, buttons, tables, focus rings, visually hidden text. */
import { css } from 'lit';

export const shared = css`
  /* The page's box-sizing rule (theme.css) does not reach into shadow roots: repeat it here. */
  *,
  *::before,
  *::after {
    box-sizing: border-box;
  }
  :host {
    /* Contains the visually hidden text, so it never stretches the page. */
    position: relative;
    color: var(--lw-ink);
    font-family: var(--lw-font);
  }
  h2,
  h3 {
    margin: 0 0 0.5rem;
    font-weight: 650;
    letter-spacing: 0.01em;
  }
  h2 {
    font-size: 1.05rem;
  }
  h3 {
    font-size: 0.95rem;
    color: var(--lw-ink-soft);
    text-transform: uppercase;
    letter-spacing: 0.06em;
    font-size: 0.78rem;
  }
  p {
    margin: 0.3rem 0;
    line-height: 1.45;
  }
  button,
  select,
  input,
  .button {
    font: inherit;
    font-size: 0.88rem;
    color: var(--lw-ink);
    background: var(--lw-panel);
    border: 1px solid var(--lw-line);
    border-radius: var(--lw-radius);
    padding: 0.3rem 0.65rem;
    cursor: pointer;
  }
  button:hover:not(:disabled),
  .button:hover {
    border-color: var(--lw-brass);
  }
  button:disabled {
    opacity: 0.5;
    cursor: default;
  }
  button.primary {
    background: var(--lw-brass);
    border-color: var(--lw-brass);
    color: var(--lw-panel);
    font-weight: 600;
  }
  :focus-visible {
    outline: 2px solid var(--lw-focus);
    outline-offset: 2px;
  }
  table {
    border-collapse: collapse;
    font-size: 0.86rem;
  }
  th,
  td {
    text-align: left;
    padding: 0.25rem 0.6rem;
    border-bottom: 1px solid var(--lw-line);
    vertical-align: top;
  }
  th {
    color: var(--lw-ink-soft);
    font-weight: 600;
  }
  td.num,
  th.num {
    text-align: right;
    font-variant-numeric: tabular-nums;
  }
  code,
  .mono {
    font-family: var(--lw-mono);
    font-size: 0.85rem;
  }
  .panel {
    background: var(--lw-panel);
    border: 1px solid var(--lw-line);
    border-radius: var(--lw-radius);
    padding: 0.75rem 0.9rem;
  }
  .ok {
    color: var(--lw-ok);
  }
  .bad {
    color: var(--lw-error);
  }
  .warn {
    color: var(--lw-warn);
  }
  .soft {
    color: var(--lw-ink-soft);
  }
  /* A box that scrolls sideways on its own (a wide table on a phone). Positioned, so that
     visually hidden text inside it stays inside it rather than widening the page. */
  .wide,
  .box {
    position: relative;
    overflow-x: auto;
    max-width: 100%;
  }
  .visually-hidden {
    position: absolute;
    width: 1px;
    height: 1px;
    overflow: hidden;
    clip: rect(0 0 0 0);
    white-space: nowrap;
  }
`;

/** A view of one column of panels that never grows past its box (the parts, frame and trial-run views). */
export const viewColumn = css`
  :host {
    display: grid;
    grid-template-columns: minmax(0, 1fr);
    gap: 0.9rem;
  }
  .panel {
    min-width: 0;
  }
`;
