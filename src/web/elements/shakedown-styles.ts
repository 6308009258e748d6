/** The shakedown's look (<lw-shakedown>, shakedown.ts): large targets for a finger at the frame, in both themes. */
import { css } from 'lit';

export const shakedownStyles = css`
  .walk-caution {
    border-left: 4px solid var(--lw-warn);
    background: var(--lw-sunk);
    padding: 0.3rem 0.6rem;
  }
  .card {
    border: 1px solid var(--lw-line);
    border-radius: var(--lw-radius);
    background: var(--lw-panel);
    padding: 0.6rem 0.8rem;
  }
  .action {
    font-size: 1.1rem;
    font-weight: 600;
  }
  .looks {
    list-style: none;
    margin: 0.4rem 0;
    padding: 0;
    display: grid;
    gap: 0.3rem;
  }
  .looks li {
    display: grid;
    grid-template-columns: minmax(0, 1fr) auto auto;
    gap: 0.6rem;
    align-items: center;
    padding: 0.25rem 0;
    border-bottom: 1px solid var(--lw-line);
  }
  .looks .expected {
    font-weight: 600;
    min-width: 6rem;
  }
  .looks button,
  button.big {
    min-height: 44px;
    min-width: 44px;
  }
  button.primary {
    color: var(--lw-panel);
  }
  button[aria-pressed='true'] {
    background: var(--lw-error);
    border-color: var(--lw-error);
    color: var(--lw-panel);
  }
  .findings[data-verdict='found'],
  .findings[data-verdict='suspects'] {
    border-left: 4px solid var(--lw-focus);
    padding-left: 0.6rem;
  }
  .bad {
    color: var(--lw-error);
  }
  .suspects li,
  .ahead li {
    margin: 0.25rem 0;
    overflow-wrap: anywhere;
  }
  .soft {
    color: var(--lw-ink-soft);
  }
`;
