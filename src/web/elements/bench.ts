/**
 * <lw-bench>: where the machine is written — New, file and example actions, starting from a
 * behaviour, the shareable
 * link, the notation card, the file name (follows the machine's name until typed over),
 * notices, the text editor and its problem list.
 * Events: `edit` {text} (from the editor), `reveal`, `new`, `open-file` {file}, `save` {form},
 * `example` {index}, `behaviour` (open the behaviour panel), `copy-link`, `notation`, `rename` {name},
 * `restore`, `dismiss`.
 */
import { LitElement, css, html, nothing } from 'lit';
import type { Diagnostic } from '../../core/index.js';
import type { Notice } from '../controllers/source.js';
import { EXAMPLES } from '../examples.js';
import { shared } from '../styles/shared.js';
import { emit } from './emit.js';
import type { LwEditor } from './editor.js';
import type { TextEdit } from '../controllers/table-edit.js';
import './editor.js';
import './problems.js';

export class LwBench extends LitElement {
  static override properties = {
    text: { attribute: false },
    file: { type: String },
    named: { type: Boolean },
    dirty: { type: Boolean },
    diagnostics: { attribute: false },
    settled: { type: Boolean },
    notice: { attribute: false },
    canRestore: { type: Boolean },
  };
  declare text: string;
  declare file: string;
  /** The user named the file (it no longer follows the machine's name). */
  declare named: boolean;
  declare dirty: boolean;
  declare diagnostics: readonly Diagnostic[];
  declare settled: boolean;
  declare notice: Notice | undefined;
  declare canRestore: boolean;

  constructor() {
    super();
    this.text = '';
    this.file = '';
    this.named = false;
    this.dirty = false;
    this.diagnostics = [];
    this.settled = true;
    this.notice = undefined;
    this.canRestore = false;
  }

  static override styles = [
    shared,
    css`
      :host {
        display: flex;
        flex-direction: column;
        gap: 0.5rem;
        min-height: 0;
        height: 100%;
      }
      .tools {
        display: flex;
        gap: 0.4rem;
        flex-wrap: wrap;
        align-items: center;
      }
      .file {
        display: flex;
        align-items: center;
        gap: 0.25rem;
        margin-left: auto;
        min-width: 0;
        font-size: 0.85rem;
        color: var(--lw-ink-soft);
      }
      .file input {
        font-family: var(--lw-mono);
        font-size: 0.85rem;
        width: 12rem;
        max-width: 100%;
        min-width: 6rem;
      }
      lw-editor {
        flex: 1;
        min-height: 14rem;
      }
      .notice {
        display: flex;
        gap: 0.5rem;
        align-items: start;
        padding: 0.45rem 0.6rem;
        border-radius: var(--lw-radius);
        background: var(--lw-sunk);
        border-left: 4px solid var(--lw-info);
        font-size: 0.88rem;
      }
      .notice.problem {
        border-left-color: var(--lw-error);
      }
      .notice .words {
        flex: 1;
      }
      .notice ul {
        margin: 0.3rem 0 0;
        padding-left: 1rem;
        font-family: var(--lw-mono);
        font-size: 0.8rem;
      }
      select {
        max-width: 9.5rem;
      }
      input[type='file'] {
        display: none;
      }
    `,
  ];

  override render() {
    const n = this.notice;
    return html`<div class="tools" role="toolbar" aria-label="Machine file">
        <button @click=${() => emit(this, 'new', {})} aria-label="New machine from a short template">New</button>
        <button
          @click=${() => this.renderRoot.querySelector<HTMLInputElement>('input[type=file]')?.click()}
          aria-label="Open a machine file: text form, JSON form or xstate configuration"
        >
          Open…
        </button>
        <input
          type="file"
          accept=".lw,.txt,.json,text/plain,application/json"
          @change=${this.onFile}
          aria-hidden="true"
          tabindex="-1"
        />
        <select aria-label="Save the machine" @change=${this.onSave}>
          <option value="">Save as…</option>
          <option value="text">Text form (.lw)</option>
          <option value="json">JSON form (.json)</option>
          <option value="xstate">xstate configuration (.json)</option>
        </select>
        <select aria-label="Load an example machine" @change=${this.onExample}>
          <option value="">Examples…</option>
          ${EXAMPLES.map((e, i) => html`<option value=${i}>${e.title}</option>`)}
        </select>
        <button
          @click=${() => emit(this, 'behaviour', {})}
          title="Start from a behaviour: a sentence and a few fields write the machine"
        >
          From a behaviour…
        </button>
        <button @click=${() => emit(this, 'copy-link', {})} title="Copy a link that carries this machine">
          Copy link
        </button>
        <button
          @click=${() => emit(this, 'notation', {})}
          aria-label="Notation card: every statement of the text form (Ctrl+/)"
          aria-keyshortcuts="Control+Slash"
        >
          Notation
        </button>
        <label
          class="file"
          title=${this.named ? 'the name you gave the file' : "follows the machine's name until you type another"}
        >
          <span class="visually-hidden">File name</span>
          <input
            .value=${this.file}
            spellcheck="false"
            autocapitalize="off"
            aria-label=${`File name${this.named ? '' : " (follows the machine's name)"}${this.dirty ? ', changed since saved' : ''}`}
            @change=${(e: Event) => emit(this, 'rename', { name: (e.target as HTMLInputElement).value })}
            @keydown=${(e: KeyboardEvent) => e.key === 'Enter' && (e.target as HTMLInputElement).blur()}
          />
          <span aria-hidden="true" title="changed since it was last saved to a file">${this.dirty ? '•' : ''}</span>
        </label>
      </div>
      ${
        n
          ? html`<div class="notice ${n.tone}" role=${n.tone === 'problem' ? 'alert' : 'status'}>
              <div class="words">
                ${n.words}
                ${
                  n.details?.length
                    ? html`<ul>
                        ${n.details.map((d) => html`<li>${d}</li>`)}
                      </ul>`
                    : nothing
                }
              </div>
              ${n.restore && this.canRestore ? html`<button @click=${() => emit(this, 'restore', {})}>Bring back the earlier machine</button>` : nothing}
              <button @click=${() => emit(this, 'dismiss', {})} aria-label="Dismiss this message">×</button>
            </div>`
          : nothing
      }
      <lw-editor .text=${this.text} .diagnostics=${this.diagnostics}></lw-editor>
      <lw-problems .diagnostics=${this.diagnostics} ?settled=${this.settled}></lw-problems>`;
  }

  /** Show a line and column of the text (selecting the word there unless told not to). */
  reveal(line: number, column: number, select = true): void {
    this.renderRoot.querySelector<LwEditor>('lw-editor')?.reveal(line, column, select);
  }

  /** Make an edit of the text as if typed (the editor's undo takes it back). */
  applyEdit(edit: TextEdit): void {
    this.renderRoot.querySelector<LwEditor>('lw-editor')?.applyEdit(edit);
  }

  /** Take back the last edit of the text, or (`again`) make the last one taken back again. */
  undo(again = false): void {
    this.renderRoot.querySelector<LwEditor>('lw-editor')?.undo(again);
  }

  private onFile = (e: Event): void => {
    const input = e.target as HTMLInputElement;
    const f = input.files?.[0];
    if (f) emit(this, 'open-file', { file: f });
    input.value = '';
  };

  private onSave = (e: Event): void => {
    const s = e.target as HTMLSelectElement;
    if (s.value) emit(this, 'save', { form: s.value });
    s.value = '';
  };

  private onExample = (e: Event): void => {
    const s = e.target as HTMLSelectElement;
    if (s.value) emit(this, 'example', { index: Number(s.value) });
    s.value = '';
  };
}

customElements.define('lw-bench', LwBench);

declare global {
  interface HTMLElementTagNameMap {
    'lw-bench': LwBench;
  }
}
