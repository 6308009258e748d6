/**
 * <lw-parts>: parts & forces — the checks (a failing one offers its fix where there is one),
 * the build documents (print the build sheet, download them all in one archive, or one by
 * one), the schematic (drawn in the page's theme), parts and bill of materials, the capstans'
 * force margins (bar chart, the minimum margin marked, each capstan named by what it does),
 * drum torque per state, timing and clock rate, the operating rules, warnings, and the safety
 * cautions.
 * Events: `export` {doc} (a document's file name, or 'all'), `print`, `fix` {id},
 * `replay` {actions, label}.
 */
import { LitElement, css, html, nothing } from 'lit';
import { unsafeSVG } from 'lit/directives/unsafe-svg.js';
import {
  CAUTIONS,
  DOCUMENT_REGISTRY,
  formatDiagnostic,
  quantitiesFor,
  RULE_WORDS,
  summaryIn,
  type Diagnostic,
  type Quantities,
  type RuleViolation,
} from '../../core/index.js';
import type { BuildView, ChecksView } from '../worker/protocol.js';
import { shared, viewColumn } from '../styles/shared.js';
import { checksSection, headroomView, partsSection, rulesSection, timingSection, type Fix } from './parts-sections.js';
import { emit } from './emit.js';
import type { Bar } from './bar-chart.js';
import './bar-chart.js';

export type { Fix };

export class LwParts extends LitElement {
  static override properties = {
    built: { attribute: false },
    checks: { attribute: false },
    schematic: { attribute: false },
    warnings: { attribute: false },
    fixes: { attribute: false },
    checking: { type: Boolean },
    exportable: { type: Boolean },
    draft: { type: Boolean },
  };
  declare built: BuildView | undefined;
  declare checks: ChecksView | undefined;
  declare schematic: { readonly svg?: string; readonly problem?: string } | undefined;
  declare warnings: readonly Diagnostic[];
  declare fixes: readonly Fix[];
  declare checking: boolean;
  declare exportable: boolean;
  /** The build shown is a draft (stand-in codes): no documents are made from it. */
  declare draft: boolean;
  private zoom = 1;

  constructor() {
    super();
    this.built = undefined;
    this.checks = undefined;
    this.schematic = undefined;
    this.warnings = [];
    this.fixes = [];
    this.checking = false;
    this.exportable = false;
    this.draft = false;
  }

  static override styles = [
    shared,
    viewColumn,
    css`
      .box {
        overflow-x: auto;
        max-width: 100%;
      }
      .fixes {
        display: flex;
        flex-wrap: wrap;
        gap: 0.4rem;
        margin-top: 0.5rem;
      }
      .exports.main {
        margin-bottom: 0.5rem;
      }
      ul.checks,
      ol.rules,
      ul.plain {
        margin: 0;
        padding-left: 1.1rem;
      }
      ul.checks {
        list-style: none;
        padding: 0;
      }
      ul.checks li {
        margin-bottom: 0.4rem;
      }
      .summary {
        color: var(--lw-ink-soft);
        font-size: 0.85rem;
      }
      ol.rules li {
        margin-bottom: 0.6rem;
      }
      .counts {
        display: flex;
        gap: 1rem;
        flex-wrap: wrap;
      }
      .exports {
        display: flex;
        flex-wrap: wrap;
        gap: 0.4rem;
      }
      .sheet {
        overflow: auto;
        max-height: 32rem;
        background: var(--lw-panel);
        border: 1px solid var(--lw-line);
        border-radius: var(--lw-radius);
      }
      .sheet svg {
        display: block;
        height: auto;
      }
      .cautions {
        border-left: 5px solid var(--lw-cord);
      }
      .row {
        display: flex;
        flex-wrap: wrap;
        gap: 0.4rem;
        align-items: center;
        margin-bottom: 0.4rem;
      }
      .row button {
        white-space: nowrap;
      }
      details summary {
        font-size: 0.88rem;
        cursor: pointer;
        margin: 0.2rem 0;
      }
    `,
  ];

  override render() {
    const b = this.built;
    const c = this.checks;
    if (!b) return html`<p class="soft">Parts and forces appear once the machine builds.</p>`;
    // The workshop's units: the profile's documentUnits, as the Shop view sets it (core model/units.ts).
    const q = quantitiesFor(b.profile.documentUnits);
    return html`${checksSection(c?.checks, this.checking, this.fixes, (id) => emit(this, 'fix', { id }), this.draft, q.units)}
      ${this.exportsSection()} ${this.schematicSection()} ${partsSection(b)}
      <section class="panel" aria-label="Force margins">
        <h2>Force margins of the capstans</h2>
        ${
          c
            ? html`<p class="soft">
                  Available pull ÷ load for each capstan (capstan equation); the design rule asks for at least
                  ${c.minMargin}.
                </p>
                <lw-bar-chart
                  caption="Force margin per capstan"
                  unit="×"
                  floor
                  .bars=${charts(c, q).margins}
                  .marker=${charts(c, q).marker}
                ></lw-bar-chart>
                ${headroomView(c, q)}`
            : html`<p class="soft">Checking…</p>`
        }
      </section>
      <section class="panel" aria-label="Drum torque per state">
        <h2>Drum torque per state</h2>
        ${
          c
            ? html`<p class="soft">
                  The worst case of each state over its inputs and clock phases; the worst sizes the motor or crank
                  (${c.powerW.toFixed(2)} W at the drum's speed).
                </p>
                ${torqueWords(c.torque, q)}
                <lw-bar-chart
                  caption="Drum torque per state"
                  unit=${q.torqueUnit}
                  .bars=${charts(c, q).torque}
                ></lw-bar-chart>`
            : html`<p class="soft">Checking…</p>`
        }
      </section>
      ${timingSection(c?.timing)} ${rulesSection(c?.rules ?? [], (r) => this.replay(r))} ${this.warningsSection()}
      <section class="panel cautions" aria-label="Safety cautions">
        <h2>Safety cautions</h2>
        <ul class="plain">
          ${CAUTIONS.map((w) => html`<li>${w}</li>`)}
        </ul>
      </section>`;
  }

  private exportsSection() {
    const off = !this.exportable;
    return html`<section class="panel" aria-label="Build documents">
      <h2>Build documents</h2>
      <div class="exports main">
        <button class="primary" ?disabled=${off} @click=${() => emit(this, 'print', {})} data-do="print">
          Print the build sheet
        </button>
        <button ?disabled=${off} @click=${() => emit(this, 'export', { doc: 'all' })} data-doc="all">
          All documents (.zip)
        </button>
      </div>
      <details>
        <summary class="soft">One document at a time</summary>
        <div class="exports">
          ${DOCUMENT_REGISTRY.map((d) => html`<button ?disabled=${off} @click=${() => emit(this, 'export', { doc: d.file })} data-doc=${d.file}>${d.label}</button>`)}
        </div>
      </details>
      ${
        off
          ? html`<p class="soft" data-note="exports">
              ${
                this.draft
                  ? 'Not from a draft build: the documents are made from the final build, once its codes are chosen and its checks are done.'
                  : 'Ready when the checks are done.'
              }
            </p>`
          : nothing
      }
    </section>`;
  }

  private schematicSection() {
    const s = this.schematic;
    return html`<section class="panel" aria-label="Schematic">
      <h2>Schematic</h2>
      ${
        s?.svg
          ? html`<div class="row">
                <button @click=${() => this.setZoom(this.zoom * 1.25)} aria-label="Enlarge the schematic">+</button>
                <button @click=${() => this.setZoom(this.zoom / 1.25)} aria-label="Shrink the schematic">−</button>
                <button @click=${() => this.setZoom(1)} title="Show the schematic at its own size">Actual size</button>
                <button @click=${() => this.fitWidth(s.svg ?? '')} title="Shrink the schematic to the width of its box">
                  Fit width
                </button>
              </div>
              <p class="soft">
                Each box: its kind, what it does, and its id in the wiring list. The legend is at the foot.
              </p>
              <div
                class="sheet"
                tabindex="0"
                role="img"
                aria-label="Schematic of the lever machine: levers, gates, latches and cords, left to right through one clock; scroll to pan"
              >
                ${unsafeSVG(sized(s.svg, this.zoom))}
              </div>`
          : html`<p class="soft">
              ${
                s?.problem
                  ? `No schematic: ${s.problem}`
                  : this.draft
                    ? 'Drawn from the final build, once its codes are chosen.'
                    : 'Drawing…'
              }
            </p>`
      }
    </section>`;
  }

  private warningsSection() {
    const failing = this.checks?.checks.filter((c) => !c.ok) ?? [];
    const units = this.built?.profile.documentUnits ?? 'metric';
    if (this.warnings.length === 0 && failing.length === 0) return nothing;
    return html`<section class="panel" aria-label="Warnings" id="findings" tabindex="-1">
      <h2>Failing checks and warnings</h2>
      <ul class="plain">
        ${failing.map((c) => html`<li class="bad">${c.name}: ${summaryIn(c, units)}</li>`)}
        ${this.warnings.map((d) => html`<li class="warn mono">${formatDiagnostic(d)}</li>`)}
      </ul>
    </section>`;
  }

  /** Bring the failing checks and warnings into view (the status line was clicked). */
  showFindings(): void {
    const at = this.renderRoot.querySelector<HTMLElement>('#findings') ?? this.renderRoot.querySelector('[data-check]');
    if (!(at instanceof HTMLElement)) return;
    at.scrollIntoView({ block: 'start' });
    at.focus({ preventScroll: true });
  }

  private setZoom(z: number): void {
    this.zoom = Math.min(4, Math.max(0.1, z));
    this.requestUpdate();
  }

  /** Shrink the schematic to the width of its box (its text may then be small: Actual size brings it back). */
  private fitWidth(svgText: string): void {
    const box = this.renderRoot.querySelector<HTMLElement>('.sheet');
    const w = Number(/ width="(\d+)"/.exec(svgText)?.[1] ?? 0);
    if (box && w > 0) this.setZoom(box.clientWidth / w);
  }

  private replay(r: RuleViolation): void {
    emit(this, 'replay', { actions: r.violation, label: `break: ${RULE_WORDS[r.rule]}` });
  }
}

/** The bars of the two charts of a checked build, and the margin chart's marker. */
interface Charts {
  readonly margins: readonly Bar[];
  readonly marker: { readonly value: number; readonly label: string };
  readonly torque: readonly Bar[];
}

/**
 * The charts' bars, made once per checked build and units: the same arrays at every render, so a chart
 * draws again only when its build changed (a large build has a bar per capstan, hundreds of
 * them, and the view renders again whenever it is shown).
 */
const chartsOf = new WeakMap<ChecksView, Charts & { readonly units: Quantities['units'] }>();
function charts(c: ChecksView, q: Quantities): Charts {
  let out = chartsOf.get(c);
  if (out?.units !== q.units) {
    out = {
      units: q.units,
      margins: c.margins.map((m) => ({
        label: `${m.kind}: ${m.does}`,
        value: m.margin,
        note: `${m.margin.toFixed(2)}×`,
      })),
      marker: { value: c.minMargin, label: `minimum ${c.minMargin}` },
      torque: c.torque.map((t) => ({
        label: t.state,
        sub: `worst at ${t.at}`,
        value: q.torqueValue(t.torqueNm),
        note: q.torque(t.torqueNm),
      })),
    };
    chartsOf.set(c, out);
  }
  return out;
}

/** The schematic's SVG at `zoom` × its own size (1: its text at the size it was drawn for), its viewBox kept. */
function sized(svgText: string, zoom: number): string {
  return svgText
    .replace(/^<\?xml[^>]*\?>\s*/, '')
    .replace(
      /^<svg([^>]*?) width="(\d+)" height="(\d+)"/,
      (_, attrs: string, w: string, h: string) =>
        `<svg${attrs} width="${Math.round(Number(w) * zoom)}" height="${Math.round(Number(h) * zoom)}"`,
    );
}

/** A sentence on the torque chart when every state has the same worst case (the bars then look alike on purpose). */
function torqueWords(torque: ChecksView['torque'], q: Quantities) {
  if (torque.length < 2) return nothing;
  const first = torque[0].torqueNm;
  return torque.every((t) => Math.abs(t.torqueNm - first) < 1e-9)
    ? html`<p class="soft">Every state has the same worst case, ${q.torque(first)}: the same capstans pull in each.</p>`
    : nothing;
}

customElements.define('lw-parts', LwParts);

declare global {
  interface HTMLElementTagNameMap {
    'lw-parts': LwParts;
  }
}
