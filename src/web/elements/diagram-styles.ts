/**
 * The sketch's look: chalk-line wires, paper state cards, a brass band on the start state.
 * Drawing adds a cord-coloured dot on a state (shown on hover, focus or when picked) to drag a
 * transition from, a dashed cord while it is drawn, and a paper field where a name is asked.
 */
import { css } from 'lit';

export const diagramStyles = css`
  :host {
    position: relative;
    display: flex;
    flex-direction: column;
    min-height: 0;
    height: 100%;
  }
  .tools {
    display: flex;
    gap: 0.4rem;
    align-items: center;
    padding-bottom: 0.4rem;
    flex-wrap: wrap;
  }
  .legend {
    font-size: 0.8rem;
  }
  .note {
    margin: 0 0 0.4rem;
    font-size: 0.82rem;
  }
  svg {
    flex: 1;
    min-height: 260px;
    width: 100%;
    background: var(--lw-sunk);
    border: 1px solid var(--lw-line);
    border-radius: var(--lw-radius);
    cursor: grab;
    /* Touches on the sketch pan and zoom it (d3) or draw a transition, never scroll the page. */
    touch-action: none;
    font-family: var(--lw-mono);
    font-size: 12px;
  }
  .relayout {
    position: absolute;
    right: 0.5rem;
    bottom: 0.5rem;
    z-index: 1;
  }
  .tip {
    fill: var(--lw-ink-soft);
  }
  .wire {
    fill: none;
    stroke: var(--lw-ink-soft);
    stroke-width: 1.4px;
  }
  .label rect {
    fill: var(--lw-sunk);
    stroke: none;
  }
  .label text {
    fill: var(--lw-ink);
  }
  .label {
    cursor: pointer;
  }
  .label:hover rect,
  .label:focus rect {
    fill: var(--lw-brass-soft);
  }
  .node {
    cursor: pointer;
  }
  .node rect.body {
    fill: var(--lw-panel);
    stroke: var(--lw-ink);
    stroke-width: 1.4px;
  }
  .node.start rect.body {
    stroke: var(--lw-brass);
    stroke-width: 3px;
  }
  .node .entry {
    stroke: var(--lw-brass);
    stroke-width: 2px;
  }
  .node.unreachable {
    opacity: 0.55;
  }
  /* The last sketch that read, while the text does not (app.ts): the drawing dimmed, its tools and key as ever. */
  :host(.stale) svg {
    opacity: 0.6;
  }
  .node.unreachable rect.body {
    stroke-dasharray: 4 3;
  }
  .node.lit rect.body {
    fill: var(--lw-brass-soft);
    stroke: var(--lw-cord);
    stroke-width: 3px;
  }
  .node:hover rect.body,
  .node:focus rect.body {
    stroke: var(--lw-focus);
  }
  .node:focus,
  .label:focus {
    outline: none;
  }
  .name {
    font-weight: 700;
    fill: var(--lw-ink);
  }
  .outs {
    fill: var(--lw-cord);
  }
  .code {
    text-anchor: end;
    fill: var(--lw-brass);
    font-size: 11px;
    font-weight: 700;
  }
  .merged {
    fill: var(--lw-ink-soft);
    font-size: 11px;
    font-style: italic;
  }

  .said {
    margin: 0 0 0.4rem;
    font-size: 0.82rem;
  }
  .acts {
    display: flex;
    gap: 0.4rem;
    align-items: center;
    flex-wrap: wrap;
    padding-bottom: 0.4rem;
  }
  .handle {
    fill: var(--lw-cord);
    stroke: var(--lw-panel);
    stroke-width: 2px;
    cursor: crosshair;
    opacity: 0;
    touch-action: none;
  }
  .node:hover .handle,
  .node:focus .handle,
  .node.picked .handle {
    opacity: 1;
  }
  .node.picked rect.body,
  .node.target rect.body {
    stroke: var(--lw-focus);
    stroke-width: 3px;
  }
  .label text.picked {
    font-weight: 700;
    text-decoration: underline;
  }
  .rubber {
    fill: none;
    stroke: var(--lw-cord);
    stroke-width: 2px;
    stroke-dasharray: 6 4;
    pointer-events: none;
  }
  form.field {
    position: absolute;
    z-index: 2;
    display: flex;
    flex-direction: column;
    gap: 0.35rem;
    max-width: min(24rem, 90%);
    padding: 0.5rem 0.6rem;
    background: var(--lw-panel);
    border: 1px solid var(--lw-brass);
    border-radius: var(--lw-radius);
    box-shadow: 0 2px 8px rgba(0, 0, 0, 0.18);
    font-size: 0.85rem;
  }
  form.field label {
    display: flex;
    flex-direction: column;
    gap: 0.2rem;
  }
  form.field input {
    font-family: var(--lw-mono);
    min-width: 12rem;
  }
  form.field input[aria-invalid='true'] {
    border-color: var(--lw-error);
  }
  .offer,
  .go {
    display: flex;
    flex-wrap: wrap;
    gap: 0.3rem;
  }
  .offer .name {
    font-family: var(--lw-mono);
    font-size: 0.8rem;
    padding: 0.05rem 0.4rem;
  }
  .problem {
    margin: 0;
    color: var(--lw-error);
  }
  .problem:empty {
    display: none;
  }
`;
