/**
 * The frame view's look (<lw-frame>, frame-view.ts): its rows of tools, the drawing's box that
 * zooms and pans, a lit cord above the dimmed others, the levers the trial run holds down, the
 * bays a dragged part may be let go on, and the legend's swatches.
 */
import { css } from 'lit';

export const frameStyles = css`
  .row {
    display: flex;
    flex-wrap: wrap;
    gap: 0.4rem;
    align-items: center;
    margin-bottom: 0.4rem;
  }
  button[aria-pressed='true'] {
    background: var(--lw-brass);
    color: var(--lw-panel);
    border-color: var(--lw-brass);
  }
  /* Under the drawing, so that its words changing never moves the cords under the pointer. */
  .readout {
    min-height: 2.9em;
    margin: 0.4rem 0 0;
    padding: 0.3rem 0.6rem;
    border-left: 4px solid var(--lw-line);
    background: var(--lw-sunk);
    overflow-wrap: anywhere;
  }
  .readout.on {
    border-left-color: var(--lw-focus);
  }
  .sheet {
    position: relative;
    overflow: auto;
    max-width: 100%;
    max-height: 70vh;
    background: var(--lw-panel);
    border: 1px solid var(--lw-line);
    border-radius: var(--lw-radius);
    touch-action: pan-x pan-y pinch-zoom;
  }
  .sheet svg {
    display: block;
  }
  /* The cords: each one a target to point at, tab to or tap. */
  .sheet path.cord[data-cord] {
    stroke-width: 0.45px;
  }
  .sheet path.hit {
    fill: none;
    stroke: transparent;
    /* As wide as the space between two lanes of a cord channel (frame-svg.ts), no wider. */
    stroke-width: 1px;
    pointer-events: stroke;
    cursor: pointer;
  }
  .sheet path.cord[data-cord]:focus {
    outline: none;
  }
  /* While a cord is lit the others are dimmed: their group as one element (frame/drawn.ts). */
  .sheet g.cords.veiled {
    opacity: 0.22;
  }
  .sheet path.cord.lit {
    stroke-width: 0.9px;
  }
  /* A branch shares its way down and along the channel with others of its cord: its whole path, drawn when lit. */
  .sheet path.route.lit {
    visibility: visible;
    stroke-width: 0.9px;
  }
  /* The lit branch and its whole path, drawn again above the dimmed cords. */
  .sheet g.lit-copies path {
    fill: none;
    stroke-width: 0.9px;
    stroke-linejoin: round;
    pointer-events: none;
  }
  .sheet .end rect,
  .sheet rect.end {
    stroke: var(--lw-focus);
    stroke-width: 0.7px;
  }
  .sheet g.end text {
    fill: var(--lw-focus);
    font-weight: 700;
  }
  /* A part's lever ends and label: picked up and dragged onto another bay. */
  .sheet rect.lever[data-part],
  .sheet g[data-part] {
    cursor: grab;
  }
  .sheet.dragging,
  .sheet.dragging * {
    cursor: grabbing;
  }
  .sheet rect.picked {
    stroke: var(--lw-focus);
    stroke-width: 1px;
  }
  .sheet g.picked text {
    fill: var(--lw-focus);
    font-weight: 700;
  }
  .sheet rect.drop {
    stroke: var(--lw-brass);
    stroke-width: 1px;
    stroke-dasharray: 0.8 0.4;
  }
  /* The trial run's levers as they stand: held down hangs below the rail; undetermined is dashed. */
  .sheet rect.lever[data-stand='down'] {
    transform-box: fill-box;
    transform: translateY(100%);
    fill: var(--lw-brass);
  }
  .sheet rect.lever[data-stand='X'] {
    fill: color-mix(in srgb, var(--lw-x) 30%, var(--lw-panel));
    stroke: var(--lw-x);
    stroke-dasharray: 0.6 0.4;
  }
  .legend {
    display: flex;
    flex-wrap: wrap;
    gap: 0.3rem 1.2rem;
    margin: 0.6rem 0 0;
    font-size: 0.8rem;
    color: var(--lw-ink-soft);
  }
  .legend div {
    display: flex;
    align-items: center;
    gap: 0.3rem;
    max-width: 24rem;
  }
  .legend svg {
    flex: none;
  }
  .swatch .rail {
    stroke: var(--lw-ink-soft);
    stroke-width: 2px;
  }
  .swatch .end {
    fill: var(--lw-sunk);
    stroke: var(--lw-ink);
    stroke-width: 1px;
  }
  .swatch .down {
    fill: var(--lw-brass);
  }
  .swatch .x {
    fill: color-mix(in srgb, var(--lw-x) 30%, var(--lw-panel));
    stroke: var(--lw-x);
    stroke-dasharray: 3 2;
  }
`;
