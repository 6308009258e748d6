/**
 * <lw-editor>: the machine's text. A plain textarea (the browser's own editing, undo and
 * accessibility) over a backdrop that mirrors the text and marks each diagnostic at its line
 * and column, beside a gutter of line numbers that flags lines with problems.
 *
 * Edits made elsewhere (the ledger, the sketch) are typed into the textarea as the browser's
 * own edit (`applyEdit`), so its undo history keeps them beside the user's typing: Ctrl+Z in
 * the text, or `undo()` from another view, takes back a drawn edit as it takes back a typed one.
 * Where the browser cannot (or the textarea's text is not the machine's text, as when its line
 * breaks were CRLF), the edit is sent as a new text instead, and that one has no undo.
 * Events: `edit` {text}.
 */
import { LitElement, css, html, nothing, type PropertyValues } from 'lit';
import type { Diagnostic } from '../../core/index.js';
import { lineStarts, markSpan } from '../controllers/text-marks.js';
import { applyEdit, type TextEdit } from '../controllers/table-edit.js';
import { emit } from './emit.js';

const LINE_PX = 20;

export class LwEditor extends LitElement {
  static override properties = {
    text: { attribute: false },
    diagnostics: { attribute: false },
  };
  declare text: string;
  declare diagnostics: readonly Diagnostic[];

  constructor() {
    super();
    this.text = '';
    this.diagnostics = [];
  }

  static override styles = css`
    *,
    *::before,
    *::after {
      box-sizing: border-box;
    }
    :host {
      display: block;
      min-height: 0;
    }
    .frame {
      display: grid;
      grid-template-columns: auto 1fr;
      grid-template-rows: minmax(0, 1fr);
      height: 100%;
      border: 1px solid var(--lw-line);
      border-radius: var(--lw-radius);
      background: var(--lw-panel);
      overflow: hidden;
    }
    .gutter {
      overflow: hidden;
      background: var(--lw-sunk);
      color: var(--lw-ink-soft);
      text-align: right;
      user-select: none;
      border-right: 1px solid var(--lw-line);
    }
    .gutter div,
    .code,
    pre {
      font: 14px/20px var(--lw-mono);
    }
    .numbers {
      padding: 8px 8px 8px 10px;
    }
    .numbers div.error {
      color: var(--lw-error);
      font-weight: 700;
    }
    .numbers div.warning {
      color: var(--lw-warn);
      font-weight: 700;
    }
    .area {
      position: relative;
      overflow: hidden;
    }
    pre,
    textarea {
      margin: 0;
      padding: 8px 10px;
      white-space: pre;
      tab-size: 4;
      border: 0;
    }
    pre {
      position: absolute;
      inset: 0;
      color: transparent;
      pointer-events: none;
      overflow: hidden;
    }
    mark {
      color: transparent;
      border-radius: 2px;
      background: var(--lw-mark-error);
      box-shadow: inset 0 -2px 0 var(--lw-error);
    }
    mark.warning,
    mark.info {
      background: var(--lw-mark-warn);
      box-shadow: inset 0 -2px 0 var(--lw-warn);
    }
    textarea {
      position: relative;
      display: block;
      width: 100%;
      height: 100%;
      resize: none;
      background: transparent;
      color: var(--lw-ink);
      caret-color: var(--lw-brass);
      font: 14px/20px var(--lw-mono);
      outline: none;
      overflow: auto;
    }
    .frame:focus-within {
      border-color: var(--lw-focus);
    }
  `;

  override render() {
    const lines = this.text.split(/\r\n|\n|\r/);
    const byLine = new Map<number, Diagnostic[]>();
    for (const d of this.diagnostics) {
      const l = d.location.line;
      // Notes (info) stay in the list; the text marks what needs attention.
      if (l !== undefined && d.location.path === undefined && d.severity !== 'info')
        byLine.set(l, [...(byLine.get(l) ?? []), d]);
    }
    const worst = (ds: readonly Diagnostic[]): string =>
      ds.some((d) => d.severity === 'error') ? 'error' : ds.some((d) => d.severity === 'warning') ? 'warning' : 'info';
    return html`<div class="frame">
      <div class="gutter" aria-hidden="true">
        <div class="numbers">
          ${lines.map((_, i) => {
            const ds = byLine.get(i + 1);
            return html`<div
              class=${ds ? worst(ds) : nothing}
              title=${ds ? ds.map((d) => `${d.code}: ${d.message}`).join('\n') : nothing}
            >
              ${i + 1}
            </div>`;
          })}
        </div>
      </div>
      <div class="area">
        <pre aria-hidden="true">
${lines.map((line, i) => html`${this.marked(line, byLine.get(i + 1))}${i < lines.length - 1 ? '\n' : ''}`)}</pre>
        <textarea
          aria-label="Machine text"
          aria-describedby="how"
          spellcheck="false"
          autocapitalize="off"
          autocomplete="off"
          wrap="off"
          @input=${this.onInput}
          @scroll=${this.onScroll}
        ></textarea>
        <span id="how" class="visually-hidden" hidden
          >One statement per line: machine, inputs, outputs, start, state, when … go …</span
        >
      </div>
    </div>`;
  }

  private marked(line: string, ds: readonly Diagnostic[] | undefined) {
    if (!ds || ds.length === 0) return line;
    const spans = ds
      .map((d) => ({ ...markSpan(line, d.location.column ?? 1), severity: d.severity }))
      .sort((a, b) => a.from - b.from);
    const parts: unknown[] = [];
    let at = 0;
    for (const s of spans) {
      if (s.from < at) continue;
      parts.push(line.slice(at, s.from));
      parts.push(html`<mark class=${s.severity}>${line.slice(s.from, s.to) || ' '}</mark>`);
      at = s.to;
    }
    parts.push(line.slice(at));
    return parts;
  }

  private get area(): HTMLTextAreaElement | null {
    return this.renderRoot.querySelector('textarea');
  }

  private onInput = (e: Event): void => {
    emit(this, 'edit', { text: (e.target as HTMLTextAreaElement).value });
  };

  private onScroll = (): void => {
    const t = this.area;
    if (!t) return;
    const pre = this.renderRoot.querySelector('pre');
    const numbers = this.renderRoot.querySelector<HTMLElement>('.numbers');
    if (pre) {
      pre.scrollTop = t.scrollTop;
      pre.scrollLeft = t.scrollLeft;
    }
    if (numbers) numbers.style.transform = `translateY(${-t.scrollTop}px)`;
  };

  protected override updated(changed: PropertyValues<this>): void {
    if (changed.has('text')) {
      const t = this.area;
      // Keep the browser's own value (and so its undo history) when it already matches. Only a
      // text put in from outside moves the view; typing scrolls the textarea itself, which
      // fires its scroll event (syncing here would force a layout on every keystroke).
      if (t && t.value !== this.text) {
        t.value = this.text;
        this.onScroll();
      }
    }
  }

  /**
   * Make an edit of the text as if typed, so the browser's undo takes it back; the focus goes
   * back where it was (the view the edit came from).
   */
  applyEdit(e: TextEdit): void {
    const t = this.area;
    const want = applyEdit(this.text, e);
    if (t && t.value === this.text) {
      const back = focused();
      t.focus({ preventScroll: true });
      t.setSelectionRange(e.from, e.to);
      // The browser's own editing command keeps the edit in its undo history; it fires `input`.
      const typed = e.insert === '' ? runCommand('delete') : runCommand('insertText', e.insert);
      back?.focus({ preventScroll: true });
      if (typed && t.value === want) return;
      if (typed) t.value = this.text;
    }
    emit(this, 'edit', { text: want });
  }

  /** Take back the last edit of the text (typed or drawn), or make again the last one taken back. */
  undo(again = false): void {
    const t = this.area;
    if (!t) return;
    const back = focused();
    t.focus({ preventScroll: true });
    runCommand(again ? 'redo' : 'undo');
    back?.focus({ preventScroll: true });
  }

  /**
   * Put the caret at a line and column (1-based) and show it; with `select`, the word there is
   * selected (a problem's word, to be typed over), else the caret sits before it.
   */
  reveal(line: number, column = 1, select = true): void {
    const t = this.area;
    if (!t) return;
    const starts = lineStarts(this.text);
    const l = Math.min(Math.max(line, 1), starts.length);
    const lineText = this.text.slice(starts[l - 1]).split(/\r\n|\n|\r/, 1)[0];
    const span = markSpan(lineText, column);
    t.focus({ preventScroll: true });
    t.setSelectionRange(starts[l - 1] + span.from, starts[l - 1] + (select ? span.to : span.from));
    t.scrollTop = Math.max(0, (l - 1) * LINE_PX - t.clientHeight / 3);
    this.onScroll();
  }
}

/** The element that has the focus, looking inside shadow roots. */
function focused(): HTMLOrSVGElement | undefined {
  let a: Element | null = document.activeElement;
  while (a?.shadowRoot?.activeElement) a = a.shadowRoot.activeElement;
  return a instanceof HTMLElement || a instanceof SVGElement ? a : undefined;
}

/** One of the browser's editing commands on the focused textarea; false where the browser has none. */
function runCommand(name: 'insertText' | 'delete' | 'undo' | 'redo', value?: string): boolean {
  try {
    // The only way to edit a textarea that its own undo history records.
    return document.execCommand(name, false, value);
  } catch {
    return false;
  }
}

customElements.define('lw-editor', LwEditor);

declare global {
  interface HTMLElementTagNameMap {
    'lw-editor': LwEditor;
  }
}
