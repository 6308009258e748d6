/**
 * The sketch's inline field and its toolbar of actions: templates only, for <lw-diagram>. The
 * field asks for one thing (a name, a guard, outputs) where it is drawn; the names it may use
 * are offered as buttons that type them at the caret; the core's reason for refusing shows
 * under it at once.
 */
import { html, nothing } from 'lit';
import type { Machine } from '../../core/index.js';
import type { Field, Picked } from '../controllers/sketch-draw.js';

/** At most this many names are offered under a field (the rest are typed). */
const OFFERED = 24;

const TITLES: Record<Field['kind'], (f: Field) => string> = {
  'new-state': () => 'Name of the new state',
  'new-transition': (f) => `Guard from ${f.state ?? ''} to ${f.to ?? ''} (empty: always)`,
  guard: (f) => `Guard from ${f.state ?? ''} to ${f.to ?? ''} (empty: always)`,
  rename: (f) => `New name for ${f.state ?? ''}`,
  outputs: (f) => `Outputs of ${f.state ?? ''}, like out=1 (empty: none)`,
};

export interface FieldHandlers {
  readonly type: (value: string) => void;
  readonly submit: () => void;
  readonly cancel: () => void;
}

/** Type `word` at the caret of the field's input (with a space before it when it follows a word). */
function typeAt(input: HTMLInputElement | null, word: string, h: FieldHandlers): void {
  if (!input) return;
  const from = input.selectionStart ?? input.value.length;
  const to = input.selectionEnd ?? from;
  const before = input.value.slice(0, from);
  const gap = before !== '' && !/[\s(!&|^,]$/.test(before) ? ' ' : '';
  input.setRangeText(gap + word, from, to, 'end');
  input.focus();
  h.type(input.value);
}

/** The names a field offers: inputs for a guard, `out=1` for outputs. */
function offered(f: Field, m: Machine): readonly string[] {
  if (f.kind === 'new-transition' || f.kind === 'guard') return m.inputs.slice(0, OFFERED);
  if (f.kind === 'outputs') return m.outputs.slice(0, OFFERED).map((o) => `${o}=1`);
  return [];
}

export function fieldTemplate(f: Field, m: Machine, h: FieldHandlers) {
  const title = TITLES[f.kind](f);
  const names = offered(f, m);
  const input = (e: Event): HTMLInputElement | null =>
    (e.target as HTMLElement).closest('form')?.querySelector('input') ?? null;
  return html`<form
    class="field"
    style=${`left:${Math.round(f.at.x)}px;top:${Math.round(f.at.y)}px`}
    data-field=${f.kind}
    @submit=${(e: Event) => {
      e.preventDefault();
      h.submit();
    }}
    @keydown=${(e: KeyboardEvent) => {
      e.stopPropagation();
      if (e.key === 'Escape') h.cancel();
    }}
  >
    <label
      >${title}
      <input
        .value=${f.value}
        aria-invalid=${f.problem ? 'true' : 'false'}
        aria-describedby="field-problem"
        autocomplete="off"
        autocapitalize="off"
        spellcheck="false"
        @input=${(e: Event) => h.type((e.target as HTMLInputElement).value)}
    /></label>
    ${
      names.length > 0
        ? html`<div class="offer" role="group" aria-label=${f.kind === 'outputs' ? 'Outputs' : 'Inputs'}>
            ${names.map(
              (n) =>
                html`<button type="button" class="name" @click=${(e: Event) => typeAt(input(e), n, h)}>${n}</button>`,
            )}
          </div>`
        : nothing
    }
    <div class="go">
      <button type="submit">OK</button>
      <button type="button" @click=${() => h.cancel()}>Cancel</button>
    </div>
    <p id="field-problem" class="problem" role="alert">${f.problem ?? ''}</p>
  </form>`;
}

export interface ActHandlers {
  readonly link: () => void;
  readonly open: (kind: 'rename' | 'outputs' | 'guard') => void;
  readonly act: (what: 'start' | 'delete') => void;
}

/** The actions on the item picked: a row under the toolbar. */
export function actsTemplate(p: Picked, m: Machine, frozen: boolean, h: ActHandlers) {
  if (p.kind === 'edge')
    return html`<div class="acts" role="toolbar" aria-label=${`Transition from ${p.from} to ${p.to}`}>
      <span class="soft">${p.from} → ${p.to}:</span>
      <button ?disabled=${frozen} @click=${() => h.open('guard')}>Change guard</button>
      <button ?disabled=${frozen} @click=${() => h.act('delete')}>Delete transition</button>
    </div>`;
  return html`<div class="acts" role="toolbar" aria-label=${`State ${p.id}`}>
    <span class="soft">${p.id}:</span>
    <button ?disabled=${frozen} @click=${() => h.link()}>Draw a transition</button>
    <button ?disabled=${frozen} @click=${() => h.open('rename')}>Rename</button>
    ${m.outputs.length > 0 ? html`<button ?disabled=${frozen} @click=${() => h.open('outputs')}>Outputs</button>` : nothing}
    <button ?disabled=${frozen || m.start === p.id} @click=${() => h.act('start')}>Make start</button>
    <button ?disabled=${frozen} @click=${() => h.act('delete')}>Delete state</button>
  </div>`;
}

/** The toolbar's drawing buttons: a new state, and undo and redo of the text's edits. */
export function drawButtons(frozen: boolean, h: { readonly add: () => void; readonly undo: (again: boolean) => void }) {
  return html`<button data-do="new-state" ?disabled=${frozen} @click=${() => h.add()}>New state</button>
    <button data-do="undo" @click=${() => h.undo(false)} aria-label="Undo the last edit of the text">Undo</button>
    <button data-do="redo" @click=${() => h.undo(true)} aria-label="Redo the last edit taken back">Redo</button>`;
}
