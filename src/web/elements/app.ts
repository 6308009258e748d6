/**
 * <lw-app>: the designer's shell. The bench (the text) on the left; on the right the view
 * chosen from the tabs — sketch, ledger, code book, parts & forces, frame & cords, trial run, shakedown, shop (VIEWS in
 * app-view.ts, each drawn by its entry in `views` below). It owns the controllers and routes
 * the elements' events to them; it holds no state of its own beyond which view is showing and
 * what it keeps drawn of the views that are not (KEPT_VIEWS).
 */
import { LitElement, html, nothing } from 'lit';
import { SourceController } from '../controllers/source.js';
import { SynthesisController, Work, codesAreDefault } from '../controllers/synthesis.js';
import { StepperController } from '../controllers/stepper.js';
import { ShakedownController } from '../controllers/shakedown.js';
import { ThemeController } from '../controllers/theme.js';
import { applyEdit, type TextEdit } from '../controllers/table-edit.js';
import { download, type SaveForm } from '../controllers/files.js';
import { keepRead, keepSet } from '../controllers/keep.js';
import { printHtml } from '../controllers/print.js';
import { WorkshopController, type CordRouteTyped, type WorkshopPath } from '../controllers/workshop.js';
import { profileFileText } from '../worker/profile-file.js';
import { EXAMPLES } from '../examples.js';
import { ALL_DOCUMENTS, PRINT_SHEET, type BuildView, type EncodingChoice } from '../worker/protocol.js';
import {
  formatDiagnostic,
  partWords,
  type Diagnostic,
  type HandAction,
  type PartRunner,
  type PartState,
  type Pin,
} from '../../core/index.js';
import { leverStands, type Stands } from '../frame/stands.js';
import { drawingPage } from '../frame/sheet.js';
import { FrameDrawings } from '../frame/drawing.js';
import { shared } from '../styles/shared.js';
import { appStyles } from './app-styles.js';
import { VIEWS, codesByState, litStates, parseView, remember, statusWords, withFile, type ViewId } from './app-view.js';
import type { LwBench } from './bench.js';
import type { Fix } from './parts.js';
import type { LwNotationCard } from './notation-card.js';
import type { LwBehaviourCard } from './behaviour-card.js';
import './bench.js';
import './diagram.js';
import './state-table.js';
import './codes.js';
import './parts.js';
import './stepper.js';
import './notation-card.js';
import './behaviour-card.js';
import './frame-view.js';
import './workshop.js';
import './shakedown.js';

type Detail<T> = CustomEvent<T>;

/**
 * Views kept in the page, drawn, while another view shows: the frame and the schematic of a
 * large build are megabytes of SVG (tens of thousands of elements), which the browser would
 * otherwise parse, style and lay out again, freezing the page for a second or more, at every
 * switch back to them. Away, a kept view is skipped by the browser's rendering (CSS
 * content-visibility: hidden keeps its layout for its return), inert, and not drawn again: it
 * keeps the last template it was given, so a build that arrives meanwhile is drawn when the view
 * is shown. It comes back as it was left: the same zoom, scroll and pinned cord.
 */
const KEPT_VIEWS: readonly ViewId[] = ['parts', 'frame'];

export class LwApp extends LitElement {
  static override styles = [shared, appStyles];

  private readonly theme = new ThemeController(this);
  private readonly stepper = new StepperController(this);
  private readonly synth = new SynthesisController(this, {
    built: (v) => this.stepper.follow(v.build, v.profile, this.synth.good?.machine?.never ?? []),
    read: (r) => {
      if (r.name !== undefined) this.source.followName(r.name);
    },
    dropped: (ds) => this.source.tell(`Settings changed for this machine: ${ds.map((d) => d.words).join('; ')}.`),
  });
  private readonly source = new SourceController(this, (text, file) => this.synth.submit(text, file));
  /** The commissioning sheet walked at the frame (the Shakedown view). */
  private readonly shakedown = new ShakedownController(this, this.synth);
  /** The workshop's own profile: the form's draft; the builds take each profile that loads without errors. */
  private readonly workshop = new WorkshopController(this, this.synth.settings.profile, (p) =>
    this.synth.setProfile(p),
  );
  // Derived values keep their identity while their inputs do, so elements redraw only on change.
  private readonly problems = remember(
    (a: readonly Diagnostic[] | undefined, b: readonly Diagnostic[], file: string): readonly Diagnostic[] =>
      withFile([...(a ?? []), ...b], file),
  );
  /** The warnings of the text and of the build, each once (a build repeats the warnings of its reading). */
  private readonly warnings = remember(
    (
      a: readonly Diagnostic[] | undefined,
      b: readonly Diagnostic[] | undefined,
      file: string,
    ): readonly Diagnostic[] => {
      const seen = new Set<string>();
      return withFile(
        [...(a ?? []), ...(b ?? [])].filter((d) => d.severity === 'warning'),
        file,
      ).filter((d) => {
        const key = formatDiagnostic(d);
        return !seen.has(key) && (seen.add(key), true);
      });
    },
  );
  private readonly codes = remember(codesByState);
  private readonly lit = remember(litStates);
  /** The frame in the page's colours: the same drawing as frame.svg; a large one's drawn in a worker (frame/drawing.ts). */
  private readonly frameDrawings = new FrameDrawings(() => this.requestUpdate());
  private readonly partWords = remember((b: BuildView | undefined) =>
    b ? partWords(b.build, b.profile.documentUnits) : undefined,
  );
  /** Where every lever on the frame stands in the trial run (the runner's state changes with every step). */
  private readonly stands = remember(
    (runner: PartRunner | undefined, state: PartState | undefined, b: BuildView | undefined): Stands | undefined =>
      runner && state && b && runner.sim.build === b.build
        ? leverStands(b.build.netlist, b.placement.bays, runner.sim.ids, state.values)
        : undefined,
  );
  private view: ViewId = keepRead('view', parseView) ?? 'sketch';
  /** The last template of each kept view shown so far (KEPT_VIEWS), given again while it is away. */
  private readonly kept = new Map<ViewId, unknown>();

  /** How each view is drawn: one entry per view of VIEWS. */
  private readonly views: { readonly [V in ViewId]: () => unknown } = {
    sketch: () => this.sketchView(),
    ledger: () => this.ledgerView(),
    codes: () => this.codesView(),
    parts: () => this.partsView(),
    frame: () => this.frameView(),
    trial: () => this.trialView(),
    shakedown: () => this.shakedownView(),
    workshop: () => this.workshopView(),
  };

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
    const file = this.source.file;
    const diagnostics = this.problems(reading?.diagnostics, s.buildProblems, file);
    return html`${this.header()}
      <main>
        <section class="bench" aria-label="Bench: the machine's text">
          <h2 class="pane-title">Bench</h2>
          <lw-bench
            .text=${this.source.text}
            .file=${file}
            ?named=${this.source.named}
            ?dirty=${this.source.dirty}
            .diagnostics=${diagnostics}
            ?settled=${s.shown.reading >= 0 && s.work !== Work.reading}
            .notice=${this.source.notice}
            ?canRestore=${this.source.canRestore}
            @edit=${(e: Detail<{ text: string }>) => this.source.edit(e.detail.text)}
            @reveal=${this.onReveal}
            @new=${() => this.source.newMachine()}
            @open-file=${(e: Detail<{ file: File }>) => void this.source.open(e.detail.file)}
            @save=${(e: Detail<{ form: SaveForm }>) => this.source.save(e.detail.form)}
            @rename=${(e: Detail<{ name: string }>) => this.source.rename(e.detail.name)}
            @example=${(e: Detail<{ index: number }>) => this.source.useExample(EXAMPLES[e.detail.index])}
            @copy-link=${this.onCopyLink}
            @notation=${() => this.card()?.show()}
            @behaviour=${() => this.renderRoot.querySelector<LwBehaviourCard>('lw-behaviour-card')?.show()}
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
            ${this.staleNote()}${this.draftNote()}${KEPT_VIEWS.includes(this.view) ? nothing : this.views[this.view]()}${this.keptViews()}
          </div>
        </section>
      </main>
      <lw-notation-card
        @use-example=${(e: Detail<{ text: string }>) =>
          this.source.startFrom(e.detail.text, "The notation card's example: write over it.")}
      ></lw-notation-card>
      <lw-behaviour-card
        @use-behaviour=${(e: Detail<{ text: string; sentence: string }>) =>
          this.source.startFrom(e.detail.text, `Written from a behaviour: ${e.detail.sentence}`)}
      ></lw-behaviour-card>`;
  }

  private header() {
    const s = this.synth;
    const warnings = this.warnings(s.good?.diagnostics, s.built?.diagnostics, this.source.file);
    const status = statusWords(s, warnings.length);
    const goes = status.tone === 'warn' || status.tone === 'bad';
    return html`<header>
      <h1><span class="mark" aria-hidden="true"></span>Latchwright <span class="soft">lever machine designer</span></h1>
      <span class="machine">${s.good?.machine?.name ?? ''}</span>
      ${
        goes
          ? html`<button
              class="status ${status.tone}"
              role="status"
              data-work=${s.work}
              data-tone=${status.tone}
              @click=${() => this.showFindings()}
              title="Show the failing checks and the warnings"
            >
              ${status.words}
            </button>`
          : html`<span class="status ${status.tone}" role="status" data-work=${s.work} data-tone=${status.tone}
              >${status.words}</span
            >`
      }
      ${s.buildProgress && (s.work === Work.building || s.work === Work.drafted) ? html`<button @click=${() => s.stopBuild()} aria-label="Stop the code search of this build">Stop search</button>` : nothing}
      <button
        class="theme"
        @click=${() => this.theme.next()}
        aria-label=${`Colour theme: ${this.theme.theme}. Change it`}
      >
        Theme: ${this.theme.theme}
      </button>
    </header>`;
  }

  protected override updated(): void {
    // Revisions on the host, for the browser tests and the benchmark to wait on.
    const s = this.synth;
    Object.assign(this.dataset, {
      job: String(s.job),
      read: String(s.shown.reading),
      built: String(s.shown.built),
      draft: String(s.shown.draft),
      checked: String(s.shown.checks),
      // Where the shown build's codes came from, and how many searches have finished.
      codes: s.built?.codesFrom ?? '',
      searches: String(s.searches),
    });
    // The schematic is drawn only when someone looks at it.
    if (this.view === 'parts') s.drawSchematic();
    // The shakedown follows the checked build while it shows (its sheet is made in the checker).
    if (this.view === 'shakedown') this.shakedown.follow();
  }

  /** The kept views shown so far, in a fixed order: the one showing drawn afresh, the others as they were left. */
  private keptViews() {
    return KEPT_VIEWS.map((v) => {
      const here = v === this.view;
      if (here) this.kept.set(v, this.views[v]());
      const t = this.kept.get(v);
      return t === undefined
        ? nothing
        : html`<div class=${here ? 'kept' : 'kept away'} ?inert=${!here} aria-hidden=${here ? nothing : 'true'}>
            ${t}
          </div>`;
    });
  }

  /** While the text has errors the views keep the last machine that read, marked as such. */
  private get stale(): boolean {
    return this.synth.reading !== undefined && !this.synth.reading.ok;
  }

  private staleNote() {
    return this.stale && this.synth.good
      ? html`<p class="stale" role="note">
          Showing the last version that read without errors; fix the problems on the bench to update.
        </p>`
      : nothing;
  }

  /** A draft build is labelled in every view until its final build replaces it. */
  private draftNote() {
    const b = this.synth.built;
    if (!this.synth.provisional || !b) return nothing;
    const codes = b.standIn === 'previous' ? 'the codes of the build before this edit' : 'counting-order codes';
    const stopped = this.synth.work === Work.stopped;
    return html`<p class="stale draft" role="note" data-note="draft">
      Draft build: its state codes are stand-ins (${codes}) and its frame a rough arrangement,
      ${stopped ? 'because the code search was stopped' : 'while the search for the cheapest codes runs'}. The checks,
      the documents and printing wait for the final build${stopped ? '; edit the machine to search again' : ''}.
    </p>`;
  }

  private sketchView() {
    const r = this.synth.good;
    return r?.layout
      ? html`<lw-diagram
          class=${this.stale ? 'stale' : ''}
          .layout=${r.layout}
          .codes=${this.codes(r, this.synth.built)}
          .lit=${this.lit(r, this.stepper.reading?.state ?? null)}
          .machine=${r.machine}
          .text=${this.source.text}
          ?frozen=${this.stale || this.synth.work === Work.reading}
          @reveal=${this.onReveal}
          @text-edit=${this.onTextEdit}
          @undo=${this.onUndo}
        ></lw-diagram>`
      : html`<p class="soft">The sketch appears when the machine reads without errors.</p>`;
  }

  private ledgerView() {
    const s = this.synth;
    const r = s.good;
    return html`<lw-state-table
      .machine=${r?.machine}
      ?frozen=${this.stale || s.work === Work.reading}
      .text=${this.source.text}
      .codes=${this.codes(r, s.built)}
      .merged=${r?.merged ?? {}}
      @reveal=${this.onReveal}
      @text-edit=${this.onTextEdit}
      @undo=${this.onUndo}
    ></lw-state-table>`;
  }

  private codesView() {
    const s = this.synth;
    return html`<lw-codes
      .built=${s.built}
      .rows=${s.rows}
      ?rowsCurrent=${s.rowsCurrent}
      .search=${s.search}
      .progress=${s.progress}
      .settings=${s.settings}
      .states=${s.good?.machine?.states.map((x) => x.name) ?? []}
      .file=${this.source.file}
      @compare=${() => s.compare()}
      @cancel-search=${() => s.cancelSearch()}
      @choose=${(e: Detail<{ choice: EncodingChoice }>) => s.choose(e.detail.choice)}
      @unused=${(e: Detail<{ to: string | undefined }>) => s.setUnused(e.detail.to)}
    ></lw-codes>`;
  }

  private partsView() {
    const s = this.synth;
    const r = s.good;
    return html`<lw-parts
      .built=${s.built}
      .checks=${s.checks && s.shown.checks === s.shown.built && !s.provisional ? s.checks : undefined}
      .schematic=${s.shown.schematic === s.shown.built && !s.provisional ? s.schematic : undefined}
      .warnings=${this.warnings(r?.diagnostics, s.built?.diagnostics, this.source.file)}
      .fixes=${this.fixes()}
      ?checking=${s.work === Work.checking}
      ?exportable=${s.work === Work.done}
      ?draft=${s.provisional}
      @export=${this.onExport}
      @print=${this.onPrint}
      @fix=${(e: Detail<{ id: Fix['id'] }>) => this.applyFix(e.detail.id)}
      @replay=${(e: Detail<{ actions: HandAction[]; label: string }>) => {
        this.stepper.replay(e.detail.actions, e.detail.label);
        this.show('trial');
      }}
    ></lw-parts>`;
  }

  private frameView() {
    const s = this.synth;
    const st = this.stepper;
    const b = s.built;
    const drawing = this.frameDrawings.of(b);
    return html`<lw-frame
      .drawing=${drawing}
      ?pending=${b !== undefined && drawing === undefined}
      .placement=${b?.placement}
      .words=${this.partWords(b)}
      .units=${b?.profile.documentUnits ?? 'metric'}
      .stands=${this.stands(st.runner, st.runner?.state, b)}
      .reading=${st.reading}
      .clocks=${st.clocks}
      ?canUndo=${st.canUndo}
      ?printable=${s.work === Work.done}
      .pins=${s.settings.pins}
      .notes=${s.work === Work.refused ? s.buildProblems : (b?.diagnostics ?? [])}
      @step=${this.onStep}
      @print-frame=${this.onPrintFrame}
      @keep-part=${(e: Detail<{ part: string; pin: Pin }>) => s.keepPart(e.detail.part, e.detail.pin)}
      @release=${(e: Detail<{ part?: string }>) => s.release(e.detail.part)}
      .routes=${this.workshop.draft.value.cordRouting}
      .routeNotes=${this.workshop.problems}
      @cord-route=${(e: Detail<{ cord: string; typed?: CordRouteTyped }>) =>
        this.workshop.route(e.detail.cord, e.detail.typed)}
    ></lw-frame>`;
  }

  private trialView() {
    const st = this.stepper;
    return html`<lw-stepper
        .reading=${st.reading}
        .samples=${st.samples}
        .alarms=${st.alarms}
        .clocks=${st.clocks}
        .impossible=${st.impossible}
        ?canUndo=${st.canUndo}
        @step=${this.onStep}
      ></lw-stepper>
      ${
        st.reading
          ? html`<p class="to-frame">
              <button data-do="see-frame" @click=${() => this.show('frame')}>See these levers on the frame</button>
            </p>`
          : nothing
      }`;
  }

  private shakedownView() {
    const w = this.shakedown;
    const b = this.synth.built;
    return html`<lw-shakedown
      .sheet=${w.sheet}
      .reached=${w.reached}
      .marked=${w.marked}
      .narrowed=${w.narrowed}
      ?busy=${w.busy}
      .problem=${w.problem}
      .drawing=${this.frameDrawings.of(b)}
      .placement=${b?.placement}
      @walk=${(e: Detail<{ do: string; at?: number }>) => {
        const d = e.detail;
        if (d.do === 'mark' && d.at !== undefined) w.mark(d.at);
        else if (d.do === 'next') w.next();
        else if (d.do === 'back') w.back();
        else if (d.do === 'restart') w.restart();
        else if (d.do === 'retry') w.retry();
      }}
    ></lw-shakedown>`;
  }

  private workshopView() {
    const w = this.workshop;
    return html`<lw-workshop
      .draft=${w.draft}
      .problems=${w.problems}
      .inUse=${w.good}
      @profile-edit=${(e: Detail<{ path: WorkshopPath; raw: string }>) => w.edit(e.detail.path, e.detail.raw)}
      @profile-source=${(e: Detail<{ path: WorkshopPath; words: string }>) => w.source(e.detail.path, e.detail.words)}
      @profile-open=${(e: Detail<{ text: string; name: string }>) => w.open(e.detail.text, e.detail.name)}
      @profile-save=${() => w.good && download(w.good.name, 'application/json', profileFileText(w.good))}
      @profile-reset=${() => w.reset()}
      @profile-route=${(e: Detail<{ cord: string }>) => w.route(e.detail.cord, undefined)}
    ></lw-workshop>`;
  }

  /** What the failing checks offer to do about themselves. */
  private fixes(): Fix[] {
    const s = this.synth;
    const failing = s.checks?.checks.filter((c) => !c.ok) ?? [];
    const start = s.good?.machine?.start;
    const out: Fix[] = [];
    if (failing.some((c) => c.name === 'recovery') && start !== undefined && s.settings.unusedCodes !== start)
      out.push({ id: 'unused-to-start', check: 'recovery', label: 'Send unused codes to the start state' });
    if (failing.length > 0 && !codesAreDefault(s.settings))
      out.push({ id: 'defaults', label: 'Use the searched codes (the command line’s defaults)' });
    return out;
  }

  private applyFix(id: Fix['id']): void {
    const s = this.synth;
    if (id === 'unused-to-start') {
      const start = s.good?.machine?.start;
      if (start !== undefined) s.setUnused(start);
    } else s.useDefaults();
  }

  private show(v: ViewId): void {
    this.view = v;
    keepSet('view', v);
    this.requestUpdate();
  }

  /** The status was clicked: show the failing checks and warnings (Parts & forces). */
  private showFindings(): void {
    this.show('parts');
    void this.updateComplete.then(() => {
      const parts = this.renderRoot.querySelector('lw-parts');
      void parts?.updateComplete.then(() => parts.showFindings());
    });
  }

  private card(): LwNotationCard | null {
    return this.renderRoot.querySelector('lw-notation-card');
  }

  private bench(): LwBench | null {
    return this.renderRoot.querySelector<LwBench>('lw-bench');
  }

  private onReveal = (e: Detail<{ line: number; column: number; select?: boolean }>): void => {
    this.bench()?.reveal(e.detail.line, e.detail.column, e.detail.select ?? true);
  };

  private onUndo = (e: Detail<{ again: boolean }>): void => this.bench()?.undo(e.detail.again);

  /** An edit from the ledger or the sketch: typed into the text by the bench, so the text's undo takes it back. */
  private onTextEdit = (e: Detail<{ edit: TextEdit }>): void => {
    const bench = this.bench();
    if (bench) bench.applyEdit(e.detail.edit);
    else this.source.edit(applyEdit(this.source.text, e.detail.edit));
  };

  private onStep = (e: Detail<{ do: string; input?: string; value?: 0 | 1 }>): void => {
    const d = e.detail;
    if (d.do === 'input' && d.input !== undefined) this.stepper.setInput(d.input, d.value ?? 0);
    else if (d.do === 'phi1' || d.do === 'phi2') this.stepper.toggle(d.do);
    else if (d.do === 'clock') this.stepper.clock();
    else if (d.do === 'reset') this.stepper.reset();
    else if (d.do === 'undo') this.stepper.undo();
  };

  private failed = (what: string) => (err: unknown) =>
    this.source.say({ tone: 'problem', words: `No ${what}: ${err instanceof Error ? err.message : String(err)}` });

  private onExport = (e: Detail<{ doc: string }>): void => {
    const doc = e.detail.doc;
    this.synth
      .exportDoc(doc === 'all' ? ALL_DOCUMENTS : doc)
      .then((f) => download(f.name, f.mime, 'bytes' in f ? f.bytes : f.text))
      .catch(this.failed(doc === 'all' ? 'archive' : 'document'));
  };

  private onPrint = (): void => {
    this.synth
      .exportDoc(PRINT_SHEET)
      .then((f) => printHtml('text' in f ? f.text : ''))
      .catch(this.failed('build sheet to print'));
  };

  /** Print frame.svg, the build document, alone at its scale. */
  private onPrintFrame = (): void => {
    const name = this.synth.built?.build.machine.name ?? 'machine';
    this.synth
      .exportDoc('frame.svg')
      .then((f) =>
        printHtml(drawingPage('text' in f ? f.text : '', `Frame — ${name}`), 'The frame drawing, for printing'),
      )
      .catch(this.failed('frame drawing to print'));
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
    // Ctrl+/ (⌘/ on a Mac) opens the notation card from anywhere, the text included.
    if ((e.ctrlKey || e.metaKey) && !e.altKey && (e.key === '/' || e.code === 'Slash')) {
      e.preventDefault();
      const card = this.card();
      if (card?.open) card.close();
      else card?.show();
      return;
    }
    // Ctrl+P (⌘P) on the frame prints the frame drawing at its scale, not the page around it.
    if (this.view === 'frame' && (e.ctrlKey || e.metaKey) && !e.altKey && !e.shiftKey && e.key.toLowerCase() === 'p') {
      e.preventDefault();
      if (this.synth.work === Work.done) this.onPrintFrame();
      return;
    }
    // The trial run's keys work where its levers are shown: the trial run and the frame.
    if ((this.view !== 'trial' && this.view !== 'frame') || this.card()?.open) return;
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
