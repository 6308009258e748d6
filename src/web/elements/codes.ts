/**
 * <lw-codes>: the code book — how the build is made (its codes and where unused codes go,
 * with the command line that builds the same machine), every encoding priced side by side
 * (bits, latches, gates, levers, capstans, weights, cords, weighted cost), the state codes in
 * use, the set/reset and output equations of the build, and the forbidden-input guard's report.
 * Events: `compare`, `cancel-search`, `choose` {choice}, `unused` {to}.
 */
import { LitElement, css, html, nothing } from 'lit';
import { encodingEntry, ENCODING_REGISTRY, type EncodeStrategy } from '../../core/index.js';
import { DEFAULT_SETTINGS, type BuildSettings, type BuildView, type CodeRow } from '../worker/protocol.js';
import { commandLine, type Search, type SearchProgress } from '../controllers/synthesis.js';
import { shared } from '../styles/shared.js';
import { emit } from './emit.js';

/** The encodings the picker offers: every registered one that does not need codes pinned in the text. */
const PICKABLE = ENCODING_REGISTRY.filter((e) => !e.needsPins);

/** The designer's words for an encoding, and its short name for the table (both from the registry). */
const label = (name: EncodeStrategy): string => encodingEntry(name)?.label ?? name;
const short = (name: EncodeStrategy): string => encodingEntry(name)?.short ?? name;

export class LwCodes extends LitElement {
  static override properties = {
    built: { attribute: false },
    rows: { attribute: false },
    rowsCurrent: { type: Boolean },
    search: { type: String },
    progress: { attribute: false },
    settings: { attribute: false },
    states: { attribute: false },
    file: { type: String },
  };
  declare built: BuildView | undefined;
  declare rows: readonly CodeRow[];
  declare rowsCurrent: boolean;
  declare search: Search;
  declare progress: SearchProgress | undefined;
  declare settings: BuildSettings;
  /** The machine's states as written (where unused codes may be sent). */
  declare states: readonly string[];
  /** The bench's file name, for the command line that builds the same. */
  declare file: string;

  constructor() {
    super();
    this.built = undefined;
    this.rows = [];
    this.rowsCurrent = false;
    this.search = 'none';
    this.progress = undefined;
    this.settings = DEFAULT_SETTINGS;
    this.states = [];
    this.file = 'machine.lw';
  }

  static override styles = [
    shared,
    css`
      :host {
        display: grid;
        gap: 0.9rem;
      }
      .bar {
        display: flex;
        gap: 0.5rem;
        align-items: center;
        flex-wrap: wrap;
      }
      progress {
        width: 14rem;
        accent-color: var(--lw-brass);
      }
      tr.cheapest td {
        background: var(--lw-brass-soft);
      }
      tr.using td:first-child {
        border-left: 4px solid var(--lw-cord);
      }
      .eq {
        display: grid;
        grid-template-columns: max-content 1fr;
        gap: 0.2rem 0.8rem;
        font-family: var(--lw-mono);
        font-size: 0.85rem;
      }
      .eq dt {
        font-weight: 700;
        color: var(--lw-brass);
      }
      .eq dd {
        margin: 0;
        word-break: break-word;
      }
      .wide {
        overflow-x: auto;
        max-width: 100%;
      }
      .panel {
        min-width: 0;
      }
      .how {
        display: flex;
        flex-wrap: wrap;
        gap: 0.5rem 1.2rem;
        align-items: end;
      }
      .how label {
        display: grid;
        gap: 0.15rem;
        font-size: 0.85rem;
        color: var(--lw-ink-soft);
        min-width: 0;
        max-width: 100%;
      }
      .how select {
        width: 100%;
        max-width: 100%;
      }
      .cli code {
        overflow-wrap: anywhere;
      }
      .wide th,
      .wide td {
        padding: 0.25rem 0.4rem;
      }
      .grid2 {
        display: grid;
        grid-template-columns: repeat(auto-fit, minmax(17rem, 1fr));
        gap: 0.9rem;
      }
    `,
  ];

  override render() {
    const choice = this.settings.encoding;
    const using = 'kept' in choice ? choice.kept.strategy : choice.strategy;
    return html`${this.howSection()}
      <section class="panel" aria-label="Encodings side by side">
        <h2>Encodings side by side</h2>
        <div class="bar">
          ${
            this.search === 'running'
              ? html`<button @click=${() => emit(this, 'cancel-search', {})}>Stop pricing</button>${this.progressBar()}`
              : html`<button class="primary" @click=${() => emit(this, 'compare', {})}>Price every encoding</button>
                  <span class="soft"
                    >${this.search === 'cancelled' ? 'Pricing stopped.' : this.rows.length > 0 && !this.rowsCurrent ? 'Prices are for an earlier version of the text.' : ''}</span
                  >`
          }
        </div>
        ${this.rows.length > 0 ? this.table(using) : html`<p class="soft">Each encoding is built in full and priced by its parts; the automatic search tries many codes and can take a few seconds.</p>`}
      </section>
      ${this.buildPanels()}`;
  }

  /** The state codes, the guard and the equations of the current build. */
  private buildPanels() {
    const b = this.built;
    return b
      ? html`<div class="grid2">
            <section class="panel" aria-label="State codes">
              <h2>
                State codes (${b.build.encoding.strategy}, ${b.build.encoding.bits}
                bit${b.build.encoding.bits === 1 ? '' : 's'})
              </h2>
              <table>
                <thead>
                  <tr>
                    <th scope="col">State</th>
                    <th scope="col">Code</th>
                  </tr>
                </thead>
                <tbody>
                  ${b.build.machine.states.map(
                    (s, i) =>
                      html`<tr>
                        <td>${s}</td>
                        <td class="mono">${b.build.encoding.codes[i] || '—'}</td>
                      </tr>`,
                  )}
                </tbody>
              </table>
            </section>
            <section class="panel" aria-label="Forbidden-input guard">
              <h2>Forbidden-input guard</h2>
              <p class=${b.guard.ok ? 'ok' : 'bad'}>
                ${b.guard.ok ? 'S·R = 0 proven for every latch over every code and input.' : 'The guard could not prove S·R = 0.'}
              </p>
              <p>Method: ${b.guard.method}.</p>
              <p>
                ${b.guard.compared === false ? 'Cost not measured for this build.' : `Cost of the guard: ${b.guard.extraGates} extra gate${b.guard.extraGates === 1 ? '' : 's'}, ${b.guard.extraCords} extra cord${b.guard.extraCords === 1 ? '' : 's'}.`}
              </p>
            </section>
          </div>
          <section class="panel" aria-label="Equations">
            <h2>Set, reset and output equations</h2>
            <p class="soft">
              Over the slave bits ${b.build.vars.slice(0, b.build.encoding.bits).join(', ') || '(none)'} and the inputs;
              S and R drive master latch M of each bit during φ1.
            </p>
            <dl class="eq">
              ${b.equations.map(
                (e) =>
                  html`<dt>${e.name}</dt>
                    <dd>${e.expr}</dd>`,
              )}
            </dl>
          </section>`
      : html`<p class="soft">Codes and equations appear once the machine builds.</p>`;
  }

  /** How the build is made: its codes, where unused codes go, and the command line that builds the same machine. */
  private howSection() {
    return html`<section class="panel" aria-label="How the build is made">
      <h2>How the build is made</h2>
      <div class="how">${this.picker()} ${this.unusedPicker()}</div>
      <p class="cli soft">
        ${
          'kept' in this.settings.encoding
            ? html`Codes kept from the comparison have no command-line option: to build the same from the command line,
                pin them in the text with <code>code</code> on each state.`
            : html`The same build from the command line: <code data-cli>${commandLine(this.file, this.settings)}</code>`
        }
      </p>
    </section>`;
  }

  /** The encoding the build uses: every registered encoding that needs no pinned codes, or the codes kept from a comparison. */
  private picker() {
    const choice = this.settings.encoding;
    const dflt = 'strategy' in DEFAULT_SETTINGS.encoding ? DEFAULT_SETTINGS.encoding.strategy : 'auto';
    return html`<label
      >Codes
      <select
        aria-label="Encoding used for the build"
        @change=${(e: Event) => emit(this, 'choose', { choice: { strategy: (e.target as HTMLSelectElement).value as EncodeStrategy } })}
      >
        ${PICKABLE.map((e) => html`<option value=${e.name} ?selected=${'strategy' in choice && choice.strategy === e.name}>${e.label}${e.name === dflt ? ' (default)' : ''}</option>`)}
        ${'kept' in choice ? html`<option selected value="kept">kept from the comparison (${choice.kept.strategy})</option>` : nothing}
      </select></label
    >`;
  }

  /** Where unused codes go: the automatic choice (the default), free, or a state. */
  private unusedPicker() {
    const to = this.settings.unusedCodes;
    const states =
      to !== undefined && to !== 'dont-care' && !this.states.includes(to) ? [...this.states, to] : this.states;
    return html`<label
      >Unused codes
      <select
        aria-label="Where unused state codes go"
        @change=${(e: Event) => {
          const v = (e.target as HTMLSelectElement).value;
          emit(this, 'unused', { to: v === '' ? undefined : v });
        }}
      >
        <option value="" ?selected=${to === undefined}>automatic (default): free unless that could lock up</option>
        <option value="dont-care" ?selected=${to === 'dont-care'}>free (don't care)</option>
        ${states.map((s) => html`<option value=${s} ?selected=${to === s}>go to ${s}</option>`)}
      </select></label
    >`;
  }

  private progressBar() {
    const p = this.progress;
    const label = p
      ? `${p.done}${p.total !== null ? ` of ${p.total}` : ''} codes priced, best cost so far ${p.best}`
      : 'starting…';
    return html`<progress
        aria-label="Pricing progress"
        max=${p?.total ?? 1}
        value=${p && p.total !== null ? p.done : nothing}
      ></progress>
      <span role="status" class="soft">${label}</span>`;
  }

  private table(using: string) {
    return html`<div class="wide">
        <table aria-label="Encodings priced">
          <thead>
            <tr>
              <th scope="col">Encoding</th>
              <th scope="col" class="num">Bits</th>
              <th scope="col" class="num">Latches</th>
              <th scope="col" class="num">Gates</th>
              <th scope="col" class="num">Term gates</th>
              <th scope="col" class="num">Levers</th>
              <th scope="col" class="num">Capstans</th>
              <th scope="col" class="num">Weights</th>
              <th scope="col" class="num">Cords</th>
              <th scope="col" class="num">Cost</th>
              <th scope="col"><span class="visually-hidden">Use</span></th>
            </tr>
          </thead>
          <tbody>
            ${this.rows.map((r) => {
              const p = r.parts;
              const cls = `${r.cheapest ? 'cheapest' : ''} ${r.strategy === using ? 'using' : ''}`;
              if (!r.ok || !p || !r.encoding)
                return html`<tr>
                  <td title=${label(r.strategy)}>${short(r.strategy)}</td>
                  <td colspan="10" class="soft">${r.problem}</td>
                </tr>`;
              const kept = r.encoding;
              return html`<tr class=${cls}>
                <td title=${label(r.strategy)}>
                  ${short(r.strategy)}${r.cheapest ? html` <strong title="fewest parts by weighted cost">★</strong>` : nothing}
                </td>
                <td class="num">${kept.bits}</td>
                <td class="num">${p.latches}</td>
                <td class="num">${p.gates}</td>
                <td class="num">${r.termGates ?? '—'}</td>
                <td class="num">${p.levers}</td>
                <td class="num">${p.capstans}</td>
                <td class="num">${p.weights}</td>
                <td class="num">${p.cords}</td>
                <td class="num">${r.cost}</td>
                <td>
                  <button
                    ?disabled=${!this.rowsCurrent}
                    @click=${() => emit(this, 'choose', { choice: { kept, states: r.states } })}
                    aria-label=${`Build with the ${label(r.strategy)} codes`}
                  >
                    Use
                  </button>
                </td>
              </tr>`;
            })}
          </tbody>
        </table>
      </div>
      <p class="soft">★ fewest parts by the profile's cost weights${this.weights()}. Hover a name for its method.</p>`;
  }

  private weights(): string {
    const c = this.built?.profile.cost;
    return c
      ? ` (gate ${c.gate}, latch ${c.latch}, lever ${c.lever}, capstan ${c.capstan}, weight ${c.weight}, cord ${c.cord})`
      : '';
  }
}

customElements.define('lw-codes', LwCodes);

declare global {
  interface HTMLElementTagNameMap {
    'lw-codes': LwCodes;
  }
}
