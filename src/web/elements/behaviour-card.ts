/**
 * <lw-behaviour-card>: start from a behaviour. Pick one (every Nth pulse, presses in order,
 * held for K clocks, press to flip, all seen, steps in turn, K clocks later), fill its few fields, read the sentence it stands for and
 * the machine text it will write, and put that on the bench. A modal dialog like the notation
 * card: Escape or the close button shuts it. The draft lives in controllers/behaviour-draft.ts;
 * the text is written by the core's behaviours (src/core/behaviours).
 * Events: `use-behaviour` {text, sentence}.
 */
import { css, html, nothing } from 'lit';
import { DIALOG_STYLES, DialogCard } from './dialog-card.js';
import type { Field } from '../../core/behaviours/index.js';
import { BEHAVIOURS } from '../../core/behaviours/index.js';
import { BehaviourDraft } from '../controllers/behaviour-draft.js';
import { shared } from '../styles/shared.js';
import { emit } from './emit.js';

export class LwBehaviourCard extends DialogCard {
  private readonly draft = new BehaviourDraft(this);

  static override styles = [
    shared,
    DIALOG_STYLES,
    css`
      dialog {
        width: min(46rem, calc(100vw - 1rem));
        box-sizing: border-box;
      }
      .body {
        padding: 0.6rem 0.9rem 0.9rem;
        display: grid;
        gap: 0.7rem;
        min-width: 0;
      }
      .fields {
        display: grid;
        grid-template-columns: repeat(auto-fill, minmax(14rem, 1fr));
        gap: 0.5rem 0.8rem;
      }
      label {
        display: grid;
        gap: 0.15rem;
        font-size: 0.88rem;
        min-width: 0;
      }
      input,
      select {
        font: inherit;
        min-width: 0;
        max-width: 100%;
      }
      input[aria-invalid='true'] {
        outline: 2px solid var(--lw-error);
      }
      .problem {
        color: var(--lw-error);
        font-size: 0.8rem;
      }
      .sentence {
        margin: 0;
        padding: 0.45rem 0.6rem;
        border-left: 4px solid var(--lw-ok);
        background: var(--lw-sunk);
        border-radius: var(--lw-radius);
      }
      .sentence.problem {
        border-left-color: var(--lw-error);
        font-size: 0.9rem;
      }
      pre {
        margin: 0;
        padding: 0.5rem 0.7rem;
        background: var(--lw-sunk);
        border-radius: var(--lw-radius);
        font: 0.78rem/1.4 var(--lw-mono);
        overflow: auto;
        max-height: 18rem;
      }
      .actions {
        display: flex;
        flex-wrap: wrap;
        gap: 0.5rem;
        align-items: center;
      }
    `,
  ];

  override render() {
    const b = this.draft.behaviour;
    const w = this.draft.written;
    return html`<dialog aria-labelledby="behaviour-title">
      <div class="head">
        <h2 id="behaviour-title">Start from a behaviour</h2>
        <button @click=${() => this.close()} aria-label="Close the behaviour panel">Close</button>
      </div>
      <div class="body">
        <label>
          Behaviour
          <select @change=${(e: Event) => this.draft.choose((e.target as HTMLSelectElement).value)}>
            ${BEHAVIOURS.map((x) => html`<option value=${x.name} ?selected=${x.name === b.name}>${x.label}</option>`)}
          </select>
        </label>
        <p class="soft">${b.summary.charAt(0).toUpperCase() + b.summary.slice(1)}.</p>
        <div class="fields" role="group" aria-label="The behaviour's fields">${b.fields.map((f) => this.field(f))}</div>
        ${
          w.ok
            ? html`<p class="sentence" role="status" aria-label="What the machine will do">${w.sentence}</p>
                <pre tabindex="0" aria-label="The machine text it will write">${w.text}</pre>`
            : html`<p class="sentence problem" role="status">
                Not yet a machine: ${w.diagnostics.map((d) => `${d.message}${d.hint ? ` — ${d.hint}` : ''}`).join('; ')}
              </p>`
        }
        <div class="actions">
          <button ?disabled=${!w.ok} @click=${this.use}>Put it on the bench</button>
          <span class="soft">What is on the bench now is kept as the earlier machine.</span>
        </div>
      </div>
    </dialog>`;
  }

  private field(f: Field) {
    const value = this.draft.value(f.key);
    const problems = this.draft.problemsOf(f.key);
    const id = `field-${f.key}`;
    const set = (e: Event) => this.draft.set(f.key, (e.target as HTMLInputElement | HTMLSelectElement).value);
    const control = f.choices
      ? html`<select id=${id} @change=${set} title=${f.help}>
          ${f.choices.map((c) => html`<option value=${c.value} ?selected=${c.value === value}>${c.label}</option>`)}
        </select>`
      : // The type before the value: the input may be the one the previous behaviour's field at this
        // place had, and a number input refuses a text value (red,red+amber) set before it turns text.
        html`<input
          id=${id}
          type=${f.kind === 'count' ? 'number' : 'text'}
          min=${f.min ?? nothing}
          max=${f.max ?? nothing}
          .value=${value}
          spellcheck="false"
          autocapitalize="off"
          placeholder=${f.optional ? `e.g. ${f.example}` : nothing}
          title=${f.help}
          aria-invalid=${problems.length > 0 ? 'true' : 'false'}
          aria-describedby=${problems.length > 0 ? `${id}-problem` : nothing}
          @input=${set}
        />`;
    return html`<label>
      ${f.label} ${control}
      ${
        problems.length > 0
          ? html`<span class="problem" id=${`${id}-problem`}>${problems.map((d) => d.message).join('; ')}</span>`
          : nothing
      }
    </label>`;
  }

  private use = (): void => {
    const w = this.draft.written;
    if (!w.ok) return;
    this.close();
    emit(this, 'use-behaviour', { text: w.text, sentence: w.sentence });
  };
}

customElements.define('lw-behaviour-card', LwBehaviourCard);

declare global {
  interface HTMLElementTagNameMap {
    'lw-behaviour-card': LwBehaviourCard;
  }
}
