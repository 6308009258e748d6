/**
 * <lw-parts>: parts & forces — the checks, the schematic, parts and bill of materials, the
 * capstans' force margins (bar chart, the minimum margin marked), drum torque per state,
 * timing and clock rate, the operating rules, warnings, safety cautions, and a button for
 * every build document.
 * Events: `export` {doc}, `replay` {actions, label}.
 */
import { LitElement, css, html, nothing } from 'lit';
import {
  CAUTIONS,
  DOCUMENT_REGISTRY,
  formatDiagnostic,
  RULE_WORDS,
  type Diagnostic,
  type RuleViolation,
} from '../../core/index.js';
import type { BuildView, ChecksView } from '../worker/protocol.js';
import { shared } from '../styles/shared.js';
import { checksSection, headroomView, partsSection, rulesSection, timingSection } from './parts-sections.js';
import { emit } from './emit.js';
import './bar-chart.js';

export class LwParts extends LitElement {
  static override properties = {
    built: { attribute: false },
    checks: { attribute: false },
    schematic: { attribute: false },
    warnings: { attribute: false },
    checking: { type: Boolean },
    exportable: { type: Boolean },
  };
  declare built: BuildView | undefined;
  declare checks: ChecksView | undefined;
  declare schematic: { readonly svg?: string; readonly problem?: string } | undefined;
  declare warnings: readonly Diagnostic[];
  declare checking: boolean;
  declare exportable: boolean;
  private zoom = 1;

  constructor() {
    super();
    this.built = undefined;
    this.checks = undefined;
    this.schematic = undefined;
    this.warnings = [];
    this.checking = false;
    this.exportable = false;
  }

  static override styles = [
    shared,
    css`
      :host {
        display: grid;
        gap: 0.9rem;
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
        background: #fff;
        border: 1px solid var(--lw-line);
        border-radius: var(--lw-radius);
      }
      .sheet img {
        display: block;
        transform-origin: 0 0;
      }
      .cautions {
        border-left: 5px solid var(--lw-cord);
      }
      .row {
        display: flex;
        gap: 0.4rem;
        align-items: center;
        margin-bottom: 0.4rem;
      }
    `,
  ];

  override render() {
    const b = this.built;
    const c = this.checks;
    if (!b) return html`<p class="soft">Parts and forces appear once the machine builds.</p>`;
    return html`${checksSection(c?.checks, this.checking)} ${this.exportsSection()} ${this.schematicSection()}
      ${partsSection(b)}
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
                  .bars=${c.margins.map((m) => ({ label: m.label, value: m.margin }))}
                  .marker=${{ value: c.minMargin, label: `minimum ${c.minMargin}` }}
                ></lw-bar-chart>
                ${headroomView(c)}`
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
                <lw-bar-chart
                  caption="Drum torque per state"
                  unit="N·m"
                  .bars=${c.torque.map((t) => ({ label: t.state, value: t.torqueNm, note: `${t.torqueNm.toFixed(3)} N·m (${t.at})` }))}
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
    return html`<section class="panel" aria-label="Build documents">
      <h2>Build documents</h2>
      <div class="exports">
        ${DOCUMENT_REGISTRY.map((d) => html`<button ?disabled=${!this.exportable} @click=${() => emit(this, 'export', { doc: d.file })} data-doc=${d.file}>${d.label}</button>`)}
      </div>
      ${this.exportable ? nothing : html`<p class="soft">Ready when the checks are done.</p>`}
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
                <button @click=${() => this.setZoom(1)}>Fit width</button>
              </div>
              <div class="sheet" tabindex="0" aria-label="Schematic drawing; scroll to pan">
                <img
                  alt="Schematic of the lever machine: levers, gates, latches and cords, left to right through one clock"
                  src=${`data:image/svg+xml;charset=utf-8,${encodeURIComponent(s.svg)}`}
                  style=${`width:${Math.round(this.zoom * 100)}%`}
                />
              </div>`
          : html`<p class="soft">${s?.problem ? `No schematic: ${s.problem}` : 'Drawing…'}</p>`
      }
    </section>`;
  }

  private warningsSection() {
    const failing = this.checks?.checks.filter((c) => !c.ok) ?? [];
    if (this.warnings.length === 0 && failing.length === 0) return nothing;
    return html`<section class="panel" aria-label="Warnings">
      <h2>Warnings</h2>
      <ul class="plain">
        ${failing.map((c) => html`<li class="bad">${c.name}: ${c.summary}</li>`)}
        ${this.warnings.map((d) => html`<li class="warn mono">${formatDiagnostic(d)}</li>`)}
      </ul>
    </section>`;
  }

  private setZoom(z: number): void {
    this.zoom = Math.min(4, Math.max(0.25, z));
    this.requestUpdate();
  }

  private replay(r: RuleViolation): void {
    emit(this, 'replay', { actions: r.violation, label: `break: ${RULE_WORDS[r.rule]}` });
  }
}

customElements.define('lw-parts', LwParts);

declare global {
  interface HTMLElementTagNameMap {
    'lw-parts': LwParts;
  }
}
