/**
 * The shell's layout: a header, then the bench and the views side by side; stacked when narrow,
 * and at phone width (about 390 px) the header wraps onto two rows so nothing leaves the screen.
 */
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
    flex-wrap: wrap;
    align-items: center;
    gap: 0.4rem 1rem;
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
    min-width: 0;
    overflow-wrap: anywhere;
  }
  .status {
    margin-left: auto;
    font: inherit;
    font-size: 0.85rem;
    padding: 0.2rem 0.6rem;
    border-radius: 999px;
    border: 1px solid var(--lw-line);
    background: none;
    color: var(--lw-ink);
  }
  button.status {
    cursor: pointer;
  }
  button.status:hover {
    text-decoration: underline;
  }
  .status.ok {
    color: var(--lw-ok);
    border-color: var(--lw-ok);
  }
  .status.warn {
    color: var(--lw-warn);
    border-color: var(--lw-warn);
    background: var(--lw-mark-warn);
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
  /*
   * A column for every view, not only the sketch's: a change of display would build the layout of
   * everything in it again, the kept views' large drawings included (app.ts KEPT_VIEWS).
   */
  #view {
    flex: 1;
    min-height: 0;
    overflow: auto;
    display: flex;
    flex-direction: column;
  }
  #view.view-sketch {
    overflow: hidden;
  }
  /* A kept view while another shows (app.ts KEPT_VIEWS): skipped by rendering, its layout kept for its return. */
  .kept.away {
    content-visibility: hidden;
  }
  lw-diagram {
    flex: 1;
  }
  .stale {
    margin: 0 0 0.5rem;
    padding: 0.3rem 0.6rem;
    border-left: 4px solid var(--lw-warn);
    background: var(--lw-sunk);
    font-size: 0.85rem;
  }
  /* Stacked: the page scrolls as a whole; the text and the sketch keep a screenful each. */
  @media (max-width: 60rem) {
    :host {
      height: auto;
      min-height: 100%;
    }
    main {
      flex: 1 0 auto;
      grid-template-columns: minmax(0, 1fr);
      grid-template-rows: none;
    }
    section.bench {
      height: max(24rem, 70vh);
    }
    #view {
      overflow: visible;
    }
    /* Its own height, not a share of the column's (flex: 1 would size it from a basis of 0 and leave it a sliver). */
    #view.view-sketch {
      flex: none;
      height: max(24rem, 70vh);
    }
    header h1 .soft {
      display: none;
    }
  }
  @media (max-width: 32rem) {
    header {
      padding: 0.4rem 0.6rem;
    }
    main {
      padding: 0.5rem 0.5rem 0.6rem;
    }
    /* The status gets a row of its own, on one line. */
    .status {
      order: 5;
      flex: 1 1 100%;
      margin-left: 0;
      text-align: left;
      white-space: nowrap;
      overflow: hidden;
      text-overflow: ellipsis;
    }
    .theme {
      margin-left: auto;
    }
    [role='tab'] {
      padding: 0.35rem 0.5rem;
    }
  }
`;
