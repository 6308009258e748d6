/** The shell's layout: a header, then the bench and the views side by side (stacked when narrow). */
import { css } from 'lit';

export const appStyles = css`
  :host {
    display: flex;
    flex-direction: column;
    height: 100%;
    min-height: 0;
  }
  header {
    display: flex;
    align-items: center;
    gap: 1rem;
    padding: 0.45rem 1rem;
    border-bottom: 2px solid var(--lw-brass);
    background: var(--lw-panel);
  }
  h1 {
    font-size: 1.05rem;
    margin: 0;
    display: flex;
    align-items: center;
    gap: 0.5rem;
  }
  h1 .soft {
    font-weight: 400;
    font-size: 0.85rem;
  }
  .mark {
    width: 18px;
    height: 18px;
    border-radius: 50%;
    border: 4px solid var(--lw-brass);
    box-shadow: 8px -6px 0 -5px var(--lw-cord);
  }
  .machine {
    font-family: var(--lw-mono);
    font-weight: 700;
  }
  .status {
    margin-left: auto;
    font-size: 0.85rem;
    padding: 0.2rem 0.6rem;
    border-radius: 999px;
    border: 1px solid var(--lw-line);
  }
  .status.ok {
    color: var(--lw-ok);
    border-color: var(--lw-ok);
  }
  .status.bad {
    color: var(--lw-error);
    border-color: var(--lw-error);
  }
  .status.busy {
    color: var(--lw-ink-soft);
  }
  main {
    flex: 1;
    min-height: 0;
    display: grid;
    grid-template-columns: minmax(22rem, 0.85fr) 1.15fr;
    grid-template-rows: minmax(0, 1fr);
    gap: 0.8rem;
    padding: 0.7rem 1rem 0.8rem;
  }
  section.bench,
  section.views {
    display: flex;
    flex-direction: column;
    min-height: 0;
    min-width: 0;
  }
  .pane-title {
    margin: 0 0 0.4rem;
    font-size: 0.8rem;
    text-transform: uppercase;
    letter-spacing: 0.08em;
    color: var(--lw-ink-soft);
  }
  lw-bench {
    flex: 1;
    min-height: 0;
  }
  [role='tablist'] {
    display: flex;
    gap: 0.2rem;
    border-bottom: 1px solid var(--lw-line);
    margin-bottom: 0.6rem;
    flex-wrap: wrap;
  }
  [role='tab'] {
    border: 0;
    border-bottom: 3px solid transparent;
    border-radius: 0;
    background: none;
    padding: 0.35rem 0.8rem;
    font-weight: 600;
    color: var(--lw-ink-soft);
  }
  [role='tab'][aria-selected='true'] {
    color: var(--lw-ink);
    border-bottom-color: var(--lw-brass);
  }
  #view {
    flex: 1;
    min-height: 0;
    overflow: auto;
  }
  #view.view-sketch {
    overflow: hidden;
    display: flex;
    flex-direction: column;
  }
  lw-diagram {
    flex: 1;
  }
  lw-diagram.stale {
    opacity: 0.6;
  }
  .stale {
    margin: 0 0 0.5rem;
    padding: 0.3rem 0.6rem;
    border-left: 4px solid var(--lw-warn);
    background: var(--lw-sunk);
    font-size: 0.85rem;
  }
  @media (max-width: 60rem) {
    main {
      grid-template-columns: 1fr;
      grid-template-rows: none;
      grid-auto-rows: minmax(28rem, auto);
    }
    header h1 .soft {
      display: none;
    }
  }
`;
