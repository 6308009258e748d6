/**
 * <lw-state-table>: the ledger — the machine as a table, one row per transition, always in
 * step with the text. Guards, targets and new transitions edited here become small edits of
 * the text at the places the parser recorded (controllers/table-edit.ts); the bench types them
 * into the text, so they are undone there, or here with Ctrl+Z outside a text field.
 * Events: `text-edit` {edit}, `reveal` {line, column}, `undo` {again}.
 */
import { LitElement, css, html, nothing } from 'lit';
import type { Machine, State, Transition } from '../../core/index.js';
import { outputWords } from '../diagram/layout.js';
import { addState, addTransition, reguard, retarget, type TextEdit } from '../controllers/table-edit.js';
import { shared } from '../styles/shared.js';
import { emit } from './emit.js';
import { sketchKey } from './sketch-keys.js';

/** Above this many states a target is typed (with the states offered as suggestions) rather than picked from a list per row. */
const PICK_STATES = 60;

export class LwStateTable extends LitElement {
  static override properties = {
    machine: { attribute: false },
    text: { attribute: false },
    codes: { attribute: false },
    merged: { attribute: false },
    frozen: { type: Boolean },
  };
  /** The machine shown is not (yet) the text's current version: edits wait. */
  declare frozen: boolean;
  declare machine: Machine | undefined;
  declare text: string;
  /** Code of each state of the build, by original state name. */
  declare codes: Readonly<Record<string, string>>;
  declare merged: Readonly<Record<string, string>>;

  constructor() {
    super();
    this.machine = undefined;
    this.text = '';
    this.codes = {};
    this.merged = {};
    this.frozen = false;
    // Ctrl+Z / Ctrl+Shift+Z outside a text field undo and redo the text's edits (a field keeps its own).
    this.addEventListener('keydown', (ev) => {
      const target = ev.composedPath()[0];
      if (target instanceof HTMLElement && target.closest('input:not([type=submit]), textarea')) return;
      const k = sketchKey(ev);
      if (typeof k !== 'object') return;
      ev.preventDefault();
      emit(this, 'undo', k);
    });
  }

  static override styles = [
    shared,
    css`
      :host {
        display: block;
        min-width: 0;
      }
      /* The table scrolls sideways in its own box on a narrow screen. */
      .box {
        overflow-x: auto;
        max-width: 100%;
      }
      table {
        width: 100%;
      }
      input.target {
        width: 9rem;
        font-family: var(--lw-mono);
      }
      td.state {
        border-left: 3px solid var(--lw-brass);
        background: var(--lw-sunk);
      }
      input.guard {
        width: 100%;
        min-width: 8rem;
        font-family: var(--lw-mono);
      }
      .link {
        background: none;
        border: 0;
        padding: 0;
        color: var(--lw-brass);
        font-weight: 650;
        text-decoration: underline dotted;
      }
      .otherwise td {
        color: var(--lw-ink-soft);
        font-style: italic;
      }
      .add {
        display: flex;
        gap: 0.4rem;
        margin-top: 0.8rem;
      }
    `,
  ];

  override render() {
    const m = this.machine;
    if (!m) return html`<p class="soft">The ledger fills in when the machine reads without errors.</p>`;
    const editable = m.loc?.line !== undefined;
    return html`${
        m.states.length > PICK_STATES
          ? html`<datalist id="state-names">${m.states.map((x) => html`<option value=${x.name}></option>`)}</datalist>`
          : nothing
      }
      <div class="box">
        <table aria-label="State ledger">
          <thead>
            <tr>
              <th scope="col">State</th>
              <th scope="col">Code</th>
              <th scope="col">Shows</th>
              <th scope="col">When</th>
              <th scope="col">Go to</th>
              <th scope="col">With</th>
            </tr>
          </thead>
          <tbody>
            ${m.states.map((s) => this.stateRows(m, s, editable))}
          </tbody>
        </table>
      </div>
      ${
        editable
          ? html`<form class="add" @submit=${this.onAddState}>
              <label
                >New state
                <input
                  name="name"
                  ?disabled=${this.frozen}
                  required
                  pattern="[A-Za-z_][A-Za-z0-9_]*"
                  aria-label="Name of the new state"
              /></label>
              <button type="submit" ?disabled=${this.frozen}>Add state</button>
            </form>`
          : html`<p class="soft">This machine is not in the text form, so the ledger is read-only.</p>`
      }`;
  }

  private stateRows(m: Machine, s: State, editable: boolean) {
    const covered = s.transitions.some((t) => t.when.text === '1');
    const span = s.transitions.length + (covered ? 0 : 1) + (editable ? 1 : 0);
    const into = this.merged[s.name];
    const first = html`<td class="state" rowspan=${span}>
        <button
          class="link"
          @click=${() => emit(this, 'reveal', { line: s.loc?.line ?? 1, column: s.loc?.column ?? 1, select: false })}
          aria-label=${`Show state ${s.name} in the text`}
        >
          ${s.name}</button
        >${s.name === m.start ? html` <span class="soft">(start)</span>` : nothing}
        ${into !== undefined && into !== s.name ? html`<div class="soft">same as ${into}</div>` : nothing}
      </td>
      <td class="mono" rowspan=${span}>${this.codes[s.name] ?? s.code ?? '—'}</td>
      <td class="mono" rowspan=${span}>${outputWords(s.outputs, m.outputs) || '—'}</td>`;
    const rows = s.transitions.map(
      (t, i) =>
        html`<tr>
          ${i === 0 ? first : nothing}${this.transitionCells(m, t, i, editable)}
        </tr>`,
    );
    // The unspecified rule's row, unless an unguarded transition leaves nothing to it.
    if (!covered) {
      const rest = m.unspecified === 'hold' ? 'stay here' : 'anywhere (free)';
      rows.push(
        html`<tr class="otherwise">
          ${s.transitions.length === 0 ? first : nothing}
          <td>${s.transitions.length === 0 ? 'always' : 'anything else'}</td>
          <td>${rest}</td>
          <td></td>
        </tr>`,
      );
    }
    if (editable)
      rows.push(
        html`<tr>
          <td colspan="3">${this.adder(m, s)}</td>
        </tr>`,
      );
    return rows;
  }

  private transitionCells(m: Machine, t: Transition, i: number, editable: boolean) {
    const guard = t.when.text === '1' ? '' : t.when.text;
    return html`<td>
        ${
          editable
            ? html`<input
                class="guard"
                ?disabled=${this.frozen}
                .value=${guard}
                placeholder=${i === 0 ? 'always' : 'otherwise'}
                aria-label=${`Guard of transition ${i + 1} to ${t.to}`}
                @change=${(e: Event) => this.send(reguard(this.text, t, (e.target as HTMLInputElement).value))}
              />`
            : html`<code>${guard || 'always'}</code>`
        }
      </td>
      <td>${editable ? this.targetField(m, t, i) : t.to}</td>
      <td class="mono">${outputWords(t.outputs, m.outputs) || '—'}</td>`;
  }

  /** Where a transition goes: a list of the states, or for a large machine a field with the states as suggestions. */
  private targetField(m: Machine, t: Transition, i: number) {
    if (m.states.length <= PICK_STATES)
      return html`<select
        ?disabled=${this.frozen}
        aria-label=${`Target of transition ${i + 1}`}
        @change=${(e: Event) => this.send(retarget(this.text, t, (e.target as HTMLSelectElement).value))}
      >
        ${m.states.map((s) => html`<option ?selected=${s.name === t.to} value=${s.name}>${s.name}</option>`)}
      </select>`;
    return html`<input
      class="target"
      list="state-names"
      ?disabled=${this.frozen}
      .value=${t.to}
      aria-label=${`Target of transition ${i + 1}`}
      @change=${(e: Event) => {
        const field = e.target as HTMLInputElement;
        if (m.states.some((s) => s.name === field.value)) this.send(retarget(this.text, t, field.value));
        else field.value = t.to;
      }}
    />`;
  }

  private adder(m: Machine, s: State) {
    return html`<form
      class="add"
      style="margin:0"
      @submit=${(e: Event) => {
        e.preventDefault();
        const f = new FormData(e.target as HTMLFormElement);
        const to = formText(f, 'to');
        if (m.states.some((x) => x.name === to)) this.send(addTransition(this.text, s, to, formText(f, 'when')));
      }}
    >
      <input
        name="when"
        ?disabled=${this.frozen}
        placeholder="when (always)"
        aria-label=${`Guard of a new transition from ${s.name}`}
        class="guard"
      />
      ${
        m.states.length <= PICK_STATES
          ? html`<select name="to" ?disabled=${this.frozen} aria-label=${`Target of a new transition from ${s.name}`}>
              ${m.states.map((x) => html`<option value=${x.name}>${x.name}</option>`)}
            </select>`
          : html`<input
              name="to"
              class="target"
              list="state-names"
              required
              ?disabled=${this.frozen}
              aria-label=${`Target of a new transition from ${s.name}`}
            />`
      }
      <button type="submit" ?disabled=${this.frozen} aria-label=${`Add a transition from ${s.name}`}>Add</button>
    </form>`;
  }

  private onAddState = (e: Event): void => {
    e.preventDefault();
    const name = formText(new FormData(e.target as HTMLFormElement), 'name').trim();
    if (name) this.send(addState(this.text, name));
  };

  private send(edit: TextEdit | undefined): void {
    if (edit) emit(this, 'text-edit', { edit });
  }
}

customElements.define('lw-state-table', LwStateTable);

declare global {
  interface HTMLElementTagNameMap {
    'lw-state-table': LwStateTable;
  }
}

/** A text field of a submitted form ('' when it is missing). */
function formText(f: FormData, name: string): string {
  const v = f.get(name);
  return typeof v === 'string' ? v : '';
}
