/**
 * <lw-workshop>: the workshop's own figures — its cord, drum, weights and frame — as a small
 * form over a technology profile (the file `latchwright build --profile FILE` takes). It only
 * renders: the WorkshopController holds the draft and its diagnostics, and the page builds with
 * the last profile that loaded without errors. Each figure shows its unit, its allowed and
 * plausible ranges, the shipped default and where the value comes from (`sources`). The ten
 * figures that matter most come first; every other figure of the core's rules follows in a
 * folded part, named by the profile reference's own words (docs/profile.md, read as the page
 * is built), so the form and the reference never disagree. The units the workshop's papers are
 * written in (the profile's `documentUnits`: every document, the check summaries and the views'
 * readouts) are a choice of their own above the figures, which stay SI.
 */
import { LitElement, css, html, nothing } from 'lit';
import { formatDiagnostic, isJsonObject, type Diagnostic } from '../../core/index.js';
import reference from '../../../docs/profile.md?raw';
import {
  documentUnitsOf,
  fieldFacts,
  fieldWords,
  otherFields,
  UNITS_CHOICES,
  unitsRaw,
  WORKSHOP_FIELDS,
  WORKSHOP_FILE,
  type WorkshopPath,
} from '../controllers/workshop.js';
import { valueAt } from '../worker/profile-file.js';
import type { ProfileSetting } from '../worker/protocol.js';
import { shared, viewColumn } from '../styles/shared.js';
import { emit } from './emit.js';

/** The rest of the profile's figures, named in the reference's words. */
const OTHER_FIELDS = otherFields(fieldWords(reference));

export class LwWorkshop extends LitElement {
  static override properties = {
    draft: { attribute: false },
    problems: { attribute: false },
    inUse: { attribute: false },
  };
  /** The profile as edited. */
  declare draft: ProfileSetting;
  /** The draft's diagnostics (or those of a file that could not be opened). */
  declare problems: readonly Diagnostic[];
  /** The profile the builds use; undefined: the shipped defaults. */
  declare inUse: ProfileSetting | undefined;

  constructor() {
    super();
    this.draft = { name: WORKSHOP_FILE, value: {} };
    this.problems = [];
    this.inUse = undefined;
  }

  static override styles = [
    shared,
    viewColumn,
    css`
      .bar {
        display: flex;
        gap: 0.5rem;
        align-items: center;
        flex-wrap: wrap;
      }
      .figures {
        display: grid;
        grid-template-columns: repeat(auto-fit, minmax(17rem, 1fr));
        gap: 0.9rem;
      }
      fieldset {
        border: 1px solid var(--lw-line);
        border-radius: var(--lw-radius);
        margin: 0;
        padding: 0.5rem 0.7rem 0.7rem;
        display: grid;
        align-content: start;
        gap: 0.3rem;
        min-width: 0;
      }
      fieldset.bad {
        border-color: var(--lw-error);
      }
      legend {
        font-weight: 600;
        color: var(--lw-ink);
      }
      label {
        display: grid;
        gap: 0.15rem;
        font-size: 0.85rem;
        color: var(--lw-ink-soft);
      }
      .value {
        display: flex;
        gap: 0.4rem;
        align-items: center;
      }
      .value input {
        width: 8rem;
      }
      input[type='text'] {
        width: 100%;
        box-sizing: border-box;
      }
      .facts {
        font-size: 0.8rem;
      }
      details.more {
        margin-top: 0.9rem;
      }
      details.more summary {
        cursor: pointer;
        margin-bottom: 0.6rem;
      }
      .units {
        display: flex;
        gap: 1.2rem;
        flex-wrap: wrap;
        border: 0;
        padding: 0;
      }
      .units label {
        display: flex;
        gap: 0.4rem;
        align-items: baseline;
        color: var(--lw-ink);
        font-size: 0.9rem;
      }
      .problem {
        font-family: var(--lw-mono);
        font-size: 0.8rem;
        overflow-wrap: anywhere;
        margin: 0;
      }
    `,
  ];

  override render() {
    const own = this.inUse !== undefined;
    return html`<section class="panel" aria-label="The workshop's profile">
        <h2>Your workshop's figures</h2>
        <p class="soft">
          Every force margin, drum length and cut length is worked out from these figures.
          ${
            own
              ? html`The builds use <strong data-profile-name>${this.inUse?.name}</strong>, as
                  <code>--profile ${this.inUse?.name}</code> does on the command line.`
              : html`The builds use the shipped defaults (<code>profiles/default.json</code>) until you change a figure
                or open a profile file.`
          }
        </p>
        <div class="bar" role="toolbar" aria-label="Profile file">
          <button
            @click=${() => this.renderRoot.querySelector<HTMLInputElement>('input[type=file]')?.click()}
            title="Open a technology profile file (JSON)"
          >
            Open a profile…
          </button>
          <input type="file" accept=".json,application/json" hidden @change=${this.onFile} />
          <button @click=${() => emit(this, 'profile-save', {})} ?disabled=${!own}>Save the profile</button>
          <button @click=${() => emit(this, 'profile-reset', {})} ?disabled=${!own && this.problems.length === 0}>
            Back to the shipped defaults
          </button>
        </div>
        ${this.fileProblems()}
      </section>
      ${this.unitsChoice()}
      <section class="panel" aria-label="Figures">
        <p class="soft">
          Measure μ on your own drum, with your own cord, at its working speed (docs/profile.md says how), and keep the
          lowest of several measurements. A figure left empty keeps the shipped default.
        </p>
        <div class="figures">${WORKSHOP_FIELDS.map((f) => this.field(f.path, f.label))}</div>
        <details class="more" ?open=${this.otherInUse()}>
          <summary>
            Every other figure (${OTHER_FIELDS.length}): stage time and its spread, pulleys and pins, frame and cam
            dimensions, cord allowances, the search's cost weights
          </summary>
          <div class="figures">${OTHER_FIELDS.map((f) => this.field(f.path, f.label))}</div>
        </details>
        ${this.cordRoutes()}
      </section>
      <section class="panel" aria-label="Cautions">
        <p class="soft">
          Heavier weights and more turns make a turning drum pull harder: guard the drum, keep a stop within reach, hang
          weights low or enclosed so a broken cord drops them nowhere near a hand, and mind the pinch points at every
          lever. The figures support, and never replace, a competent person's judgement and your local codes.
        </p>
      </section>`;
  }

  /** Which units the papers the workshop cuts from are written in (the profile's documentUnits). */
  private unitsChoice() {
    const chosen = documentUnitsOf(this.draft.value);
    const at = this.problems.filter((d) =>
      ['$.documentUnits', '$.sources.documentUnits'].includes(d.location.path ?? ''),
    );
    return html`<section class="panel" aria-label="Units on the workshop's papers" data-units=${chosen}>
      <fieldset class="units" role="radiogroup" aria-label="Units the cut list, drawings and sheets are written in">
        <legend>Units on your papers</legend>
        ${UNITS_CHOICES.map(
          (c) =>
            html`<label
              ><input
                type="radio"
                name="document-units"
                value=${c.units}
                .checked=${chosen === c.units}
                @change=${() => emit(this, 'profile-edit', { path: 'documentUnits', raw: unitsRaw(c.units) })}
              />${c.label} <span class="soft">(${c.says})</span></label
            >`,
        )}
      </fieldset>
      <p class="soft">
        Every document (the cut list, the wiring list, the drawings, the bill of materials, the build and commissioning
        sheets), the check summaries and the Parts &amp; forces and Frame &amp; cords views give lengths, weights and
        the drum torque in these units; cut lengths are always rounded up, so no piece comes out short. The figures
        below stay in metres and grams, and the netlist stays SI. Check the printed scale bar and the cam template's
        check bar with a rule before cutting.
      </p>
      ${at.map((d) => html`<p class="problem bad" role="alert">${formatDiagnostic(d)}</p>`)}
    </section>`;
  }

  /** The cords given a route of their own (`cordRouting`, set from the frame view), each with a way back to the computed route. */
  private cordRoutes() {
    const routes = this.draft.value.cordRouting;
    const entries = isJsonObject(routes) ? Object.entries(routes) : [];
    if (entries.length === 0) return nothing;
    return html`<div class="routes" data-cord-routes>
      <p class="soft">Cords with a route of their own (<code>cordRouting</code>), set from the frame:</p>
      <ul>
        ${entries.map(
          ([cord, r]) =>
            html`<li data-cord-route=${cord}>
              <span class="mono">${cord}</span>: ${JSON.stringify(r)}
              <button @click=${() => emit(this, 'profile-route', { cord })}>Computed route</button>
            </li>`,
        )}
      </ul>
    </div>`;
  }

  /** A figure of the folded part has a value of the workshop's own or a problem: the part opens. */
  private otherInUse(): boolean {
    return OTHER_FIELDS.some(
      (f) =>
        valueAt(this.draft.value, f.path) !== undefined ||
        this.problems.some((d) => d.location.path === `$.${f.path}` || d.location.path === `$.sources.${f.path}`),
    );
  }

  /** The problems that name no field of the form (a file that is no profile, an unknown field, …). */
  private fileProblems() {
    const shown = new Set<string>(
      [...WORKSHOP_FIELDS, ...OTHER_FIELDS, { path: 'documentUnits' }].flatMap((f) => [
        `$.${f.path}`,
        `$.sources.${f.path}`,
      ]),
    );
    const rest = this.problems.filter((d) => !shown.has(d.location.path ?? ''));
    if (rest.length === 0) return nothing;
    return html`<div role="alert">
      ${rest.map((d) => html`<p class="problem ${d.severity === 'error' ? 'bad' : 'warn'}">${formatDiagnostic(d)}</p>`)}
    </div>`;
  }

  private field(path: WorkshopPath, label: string) {
    const facts = fieldFacts(path);
    const at = this.problems.filter((d) => d.location.path === `$.${path}` || d.location.path === `$.sources.${path}`);
    const value = valueAt(this.draft.value, path);
    const sources = valueAt(this.draft.value, 'sources');
    // A source's key is the dotted field path itself (`frame.longestDrumM`), not a nested object.
    const source =
      typeof sources === 'object' && sources !== null ? (sources as Record<string, unknown>)[path] : undefined;
    const unit = facts.unit === '' ? 'no unit' : facts.unit;
    const bad = at.some((d) => d.severity === 'error');
    return html`<fieldset class=${bad ? 'bad' : ''} data-field=${path}>
      <legend>${label}</legend>
      <label
        ><span class="mono">${path}</span>
        <span class="value"
          ><input
            type="text"
            inputmode="decimal"
            aria-label=${`${label} (${unit})`}
            aria-invalid=${bad ? 'true' : 'false'}
            placeholder=${String(facts.fallback)}
            .value=${value === undefined ? '' : typeof value === 'string' ? value : JSON.stringify(value)}
            @change=${(e: Event) => emit(this, 'profile-edit', { path, raw: (e.target as HTMLInputElement).value })}
          />
          ${facts.unit === '' ? nothing : html`<span>${facts.unit}</span>`}</span
        ></label
      >
      <span class="facts soft"
        >allowed: ${facts.range}; plausible ${facts.plausible}; shipped default ${facts.fallback}</span
      >
      <label
        >Where it comes from
        <input
          type="text"
          aria-label=${`Source of ${path}`}
          placeholder="measured, supplier's sheet, estimate …"
          .value=${typeof source === 'string' ? source : ''}
          @change=${(e: Event) => emit(this, 'profile-source', { path, words: (e.target as HTMLInputElement).value })}
      /></label>
      ${at.map(
        (d) =>
          html`<p
            class="problem ${d.severity === 'error' ? 'bad' : 'warn'}"
            role=${d.severity === 'error' ? 'alert' : 'note'}
          >
            ${formatDiagnostic(d)}
          </p>`,
      )}
    </fieldset>`;
  }

  private onFile = (e: Event): void => {
    const input = e.target as HTMLInputElement;
    const f = input.files?.[0];
    if (f) void f.text().then((text) => emit(this, 'profile-open', { text, name: f.name }));
    input.value = '';
  };
}

customElements.define('lw-workshop', LwWorkshop);

declare global {
  interface HTMLElementTagNameMap {
    'lw-workshop': LwWorkshop;
  }
}
