/** The sketch's look: chalk-line wires, paper state cards, a brass band on the start state. */
import { css } from 'lit';

export const diagramStyles = css`
  :host {
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
    font-family: var(--lw-mono);
    font-size: 12px;
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
`;
