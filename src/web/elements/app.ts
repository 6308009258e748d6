/**
 * <lw-app>: the designer's shell. The bench (the text) on the left; on the right the view
 * chosen from the tabs — sketch, ledger, code book, parts & forces, trial run. It owns the
 * controllers and routes the elements' events to them; it holds no state of its own beyond
 * which view is showing.
 */
import { LitElement, html, nothing } from 'lit';
import { SourceController } from '../controllers/source.js';
import { SynthesisController, Work } from '../controllers/synthesis.js';
import { StepperController } from '../controllers/stepper.js';
import { ThemeController } from '../controllers/theme.js';
import { applyEdit, type TextEdit } from '../controllers/table-edit.js';
import { download, type SaveForm } from '../controllers/files.js';
import { keepGet, keepSet } from '../controllers/keep.js';
import { EXAMPLES } from '../examples.js';
import type { EncodingChoice } from '../worker/protocol.js';
import type { Diagnostic, HandAction } from '../../core/index.js';
import { shared } from '../styles/shared.js';
import { appStyles } from './app-styles.js';
import { VIEWS, codesByState, litStates, remember, statusWords, type ViewId } from './app-view.js';
import type { LwBench } from './bench.js';
import './bench.js';
import './diagram.js';
import './state-table.js';
import './codes.js';
import './parts.js';
import './stepper.js';

type Detail<T> = CustomEvent<T>;

export class LwApp extends LitElement {
  static override styles = [shared, appStyles];

  private readonly theme = new ThemeController(this);
  private readonly stepper = new StepperController(this);
  private readonly synth = new SynthesisController(this, (v) => this.stepper.follow(v.build, v.profile));
  private readonly source = new SourceController(this, (text, file) => this.synth.submit(text, file));
  // Derived values keep their identity while their inputs do, so elements redraw only on change.
  private readonly problems = remember(
    (a: readonly Diagnostic[] | undefined, b: readonly Diagnostic[]): readonly Diagnostic[] => [...(a ?? []), ...b],
  );
  private readonly warnings = remember(
    (a: readonly Diagnostic[] | undefined, b: readonly Diagnostic[] | undefined): readonly Diagnostic[] =>
      [...(a ?? []), ...(b ?? [])].filter((d) => d.severity === 'warning'),
  );
  private readonly codes = remember(codesByState);
  private readonly lit = remember(litStates);
  private view: ViewId = VIEWS.find((v) => v.id === keepGet('view'))?.id ?? 'sketch';

  override connectedCallback(): void {
    super.connectedCallback();
    addEventListener('keydown', this.onKey);
  }

  override disconnectedCallback(): void {
    removeEventListener('keydown', this.onKey);
    super.disconnectedCallback();
  }

  override render() {
    const s = this.synth;
    const reading = s.reading;
    const diagnostics = this.problems(reading?.diagnostics, s.buildProblems);
    const status = statusWords(s);
    return html`<header>
        <h1>
          <span class="mark" aria-hidden="true"></span>Latchwright <span class="soft">lever machine designer</span>
        </h1>
        <span class="machine">${s.good?.machine?.name ?? ''}</span>
        <span class="status ${status.tone}" role="status" data-work=${s.work}>${status.words}</span>
        ${s.buildProgress && s.work === Work.building ? html`<button @click=${() => s.stopBuild()} aria-label="Stop the code search of this build">Stop search</button>` : nothing}
        <button
          class="theme"
          @click=${() => this.theme.next()}
          aria-label=${`Colour theme: ${this.theme.theme}. Change it`}
        >
          ${
            this.theme.theme === 'system'
              ? 'Theme: system'
              : this.theme.theme === 'light'
                ? 'Theme: light'
                : 'Theme: dark'
          }
        </button>
      </header>
      <main>
        <section class="bench" aria-label="Bench: the machine's text">
          <h2 class="pane-title">Bench</h2>
          <lw-bench
            .text=${this.source.text}
            .file=${this.source.file}
            ?dirty=${this.source.dirty}
            .diagnostics=${diagnostics}
            ?settled=${s.shown.reading >= 0 && s.work !== Work.reading}
            .notice=${this.source.notice}
            ?canRestore=${this.source.canRestore}
            @edit=${(e: Detail<{ text: string }>) => this.source.edit(e.detail.text)}
            @reveal=${this.onReveal}
            @open-file=${(e: Detail<{ file: File }>) => void this.source.open(e.detail.file)}
            @save=${(e: Detail<{ form: SaveForm }>) => this.source.save(e.detail.form)}
            @example=${(e: Detail<{ index: number }>) => this.source.useExample(EXAMPLES[e.detail.index])}
            @copy-link=${this.onCopyLink}
            @restore=${() => this.source.restore()}
            @dismiss=${() => this.source.say(undefined)}
          ></lw-bench>
        </section>
        <section class="views" aria-label="Views">
          <div role="tablist" aria-label="Views of the machine" @keydown=${this.onTabKey}>
            ${VIEWS.map(
              (v) =>
                html`<button
                  role="tab"
                  id=${`tab-${v.id}`}
                  aria-selected=${v.id === this.view ? 'true' : 'false'}
                  aria-controls="view"
                  tabindex=${v.id === this.view ? 0 : -1}
                  @click=${() => this.show(v.id)}
                >
                  ${v.label}
                </button>`,
            )}
          </div>
          <div id="view" role="tabpanel" aria-labelledby=${`tab-${this.view}`} class=${`view-${this.view}`}>
            ${this.viewBody()}
          </div>
        </section>
      </main>`;
  }

  protected override updated(): void {
    // Revisions on the host, for the browser tests and the benchmark to wait on.
    const s = this.synth;
    Object.assign(this.dataset, {
      job: String(s.job),
      read: String(s.shown.reading),
      built: String(s.shown.built),
      checked: String(s.shown.checks),
    });
    // The schematic is drawn only when someone looks at it.
    if (this.view === 'parts') s.drawSchematic();
  }

  private viewBody() {
    const s = this.synth;
    // While the text has errors the views keep the last machine that read, marked as such.
    const stale = s.reading !== undefined && !s.reading.ok;
    const r = s.good;
    const b = s.built;
    const codes = this.codes(r, b);
    const note =
      stale && r
        ? html`<p class="stale" role="note">
            Showing the last version that read without errors; fix the problems on the bench to update.
          </p>`
        : nothing;
    switch (this.view) {
      case 'sketch':
        return r?.layout
          ? html`${note}<lw-diagram
                class=${stale ? 'stale' : ''}
                .layout=${r.layout}
                .codes=${codes}
                .lit=${this.lit(r, this.stepper.reading?.state ?? null)}
                @reveal=${this.onReveal}
              ></lw-diagram>`
          : html`<p class="soft">The sketch appears when the machine reads without errors.</p>`;
      case 'ledger':
        return html`${note}<lw-state-table
            .machine=${r?.machine}
            ?frozen=${stale || s.work === Work.reading}
            .text=${this.source.text}
            .codes=${codes}
            .merged=${r?.merged ?? {}}
            @reveal=${this.onReveal}
            @text-edit=${(e: Detail<{ edit: TextEdit }>) => this.source.edit(applyEdit(this.source.text, e.detail.edit))}
          ></lw-state-table>`;
      case 'codes':
        return html`${note}<lw-codes
            .built=${b}
            .rows=${s.rows}
            ?rowsCurrent=${s.rowsCurrent}
            .search=${s.search}
            .progress=${s.progress}
            .choice=${s.settings.encoding}
            @compare=${() => s.compare()}
            @cancel-search=${() => s.cancelSearch()}
            @choose=${(e: Detail<{ choice: EncodingChoice }>) => s.choose(e.detail.choice)}
          ></lw-codes>`;
      case 'parts':
        return html`${note}<lw-parts
            .built=${b}
            .checks=${s.checks && s.shown.checks === s.shown.built ? s.checks : undefined}
            .schematic=${s.shown.schematic === s.shown.built ? s.schematic : undefined}
            .warnings=${this.warnings(r?.diagnostics, b?.diagnostics)}
            ?checking=${s.work === Work.checking}
            ?exportable=${s.work === Work.done}
            @export=${this.onExport}
            @replay=${(e: Detail<{ actions: HandAction[]; label: string }>) => {
              this.stepper.replay(e.detail.actions, e.detail.label);
              this.show('trial');
            }}
          ></lw-parts>`;
      case 'trial':
        return html`${note}<lw-stepper
            .reading=${this.stepper.reading}
            .samples=${this.stepper.samples}
            .alarms=${this.stepper.alarms}
            .clocks=${this.stepper.clocks}
            ?canUndo=${this.stepper.canUndo}
            @step=${this.onStep}
          ></lw-stepper>`;
      default:
        return nothing;
    }
  }

  private show(v: ViewId): void {
    this.view = v;
    keepSet('view', v);
    this.requestUpdate();
  }

  private onReveal = (e: Detail<{ line: number; column: number }>): void => {
    this.renderRoot.querySelector<LwBench>('lw-bench')?.reveal(e.detail.line, e.detail.column);
  };

  private onStep = (e: Detail<{ do: string; input?: string; value?: 0 | 1 }>): void => {
    const d = e.detail;
    if (d.do === 'input' && d.input !== undefined) this.stepper.setInput(d.input, d.value ?? 0);
    else if (d.do === 'phi1' || d.do === 'phi2') this.stepper.toggle(d.do);
    else if (d.do === 'clock') this.stepper.clock();
    else if (d.do === 'reset') this.stepper.reset();
    else if (d.do === 'undo') this.stepper.undo();
  };

  private onExport = (e: Detail<{ doc: string }>): void => {
    this.synth
      .exportDoc(e.detail.doc)
      .then((f) => download(f.name, f.mime, f.text))
      .catch((err: unknown) =>
        this.source.say({ tone: 'problem', words: `No document: ${err instanceof Error ? err.message : String(err)}` }),
      );
  };

  private onCopyLink = (): void => {
    const link = this.source.link();
    const told = (ok: boolean): void =>
      this.source.say({
        tone: 'info',
        words: ok ? 'Link copied: it carries the whole machine.' : 'Copy this link; it carries the whole machine:',
        ...(ok ? {} : { details: [link] }),
      });
    if (!navigator.clipboard) return told(false);
    navigator.clipboard.writeText(link).then(
      () => told(true),
      () => told(false),
    );
  };

  private onTabKey = (e: KeyboardEvent): void => {
    if (e.key !== 'ArrowRight' && e.key !== 'ArrowLeft') return;
    const i = VIEWS.findIndex((v) => v.id === this.view);
    const next = VIEWS[(i + (e.key === 'ArrowRight' ? 1 : VIEWS.length - 1)) % VIEWS.length];
    this.show(next.id);
    void this.updateComplete.then(() => this.renderRoot.querySelector<HTMLElement>(`#tab-${next.id}`)?.focus());
  };

  private onKey = (e: KeyboardEvent): void => {
    if (this.view !== 'trial') return;
    const target = e.composedPath()[0];
    if (target instanceof HTMLElement && (target.closest('textarea, input, select') || target.isContentEditable))
      return;
    if (target instanceof HTMLButtonElement && (e.key === 'Enter' || e.key === ' ')) return;
    if (this.stepper.key(e)) e.preventDefault();
  };
}

customElements.define('lw-app', LwApp);

declare global {
  interface HTMLElementTagNameMap {
    'lw-app': LwApp;
  }
}
