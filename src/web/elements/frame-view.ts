/**
 * <lw-frame>: the frame — the placed machine drawn along its drum(s), from the build's own
 * placement and the same drawing as frame.svg (the core's frameSvg, in the page's theme
 * colours). Pointing at a cord, tabbing to it or tapping it lights its run and its two ends
 * (the capstan that pulls it, the lever it is tied to) and says where it goes in words; a
 * branch that shares its drop and channel run with others of its cord lights its whole path. The
 * trial run's levers stand on the frame as they stand now: a lever held down hangs below the
 * pivot rail (the one meaning of "down" the trial run's lever drawings have, with their
 * legend's glyphs beside), and the trial run can be stepped from here. Zoom and pan in the box;
 * Print gives frame.svg at its scale. A part is kept in a bay of the workshop's choosing (the
 * build's pins, `--pin PART=BAY@DRUM`) by dragging its lever end onto another bay (frame-drag.ts), or by picking
 * it (a click, a tap, or the field of frame-keep.ts) and naming the bay; the parts kept are
 * listed with what the build said of each, and each can be let go. A cord tapped can be given
 * its own route (pulleys, angle over pins) in the workshop's profile (frame-route.ts). A large
 * drawing comes in piece by piece, one piece per animation frame (frame/pieces.ts), and the
 * drawing in the page is indexed as it comes (frame/drawn.ts), so lighting a cord touches only
 * that cord's elements.
 * Events: `step` (as <lw-stepper>), `print-frame`, `keep-part` ({ part, pin }), `release`
 * ({ part? }: none, every part), `cord-route` ({ cord, typed? }: none, the computed route again).
 */
import { LitElement, html, nothing, type PropertyValues } from 'lit';
import { unsafeSVG } from 'lit/directives/unsafe-svg.js';
import {
  fixed,
  inMetres,
  quantitiesFor,
  type BranchRoute,
  type Diagnostic,
  type DocumentUnits,
  type PartReading,
  type Placement,
} from '../../core/index.js';
import { pinAt, type BaySpot, type Pins } from '../controllers/pins.js';
import type { Stands } from '../frame/stands.js';
import { DrawnFrame } from '../frame/drawn.js';
import { FRAME_HERE_BAYS } from '../frame/drawing.js';
import { drawingPieces, type Piece } from '../frame/pieces.js';
import { screenSize, screenSized, svgSizeMm, PX_PER_MM } from '../frame/sheet.js';
import { shared, viewColumn } from '../styles/shared.js';
import { touchScreen } from '../touch.js';
import { emit } from './emit.js';
import { PartDrag, partAt } from './frame-drag.js';
import { routeField } from './frame-route.js';
import { frameStyles } from './frame-styles.js';
import { KEEP_STYLES, keepField, keptList, type KeepActions, type KeepInput } from './frame-keep.js';
import { LEVER_GLYPH_STYLES, leverGlyph, STAND_WORDS } from './lever-bank.js';

/** The smallest text of the drawing, mm on paper (the key's part ids), and the least it may be on screen, px. */
const SMALLEST_TEXT_MM = 2.1;
export const MIN_TEXT_PX = 8;
/** The zoom the view opens at: the drawing's labels at about 12 px (on a narrow screen, the least readable zoom). */
const START_ZOOM = 1.5;
/** A box narrower than this (a phone) opens the drawing at the smallest zoom whose text stays readable. */
const NARROW_PX = 600;
const MIN_ZOOM = MIN_TEXT_PX / (SMALLEST_TEXT_MM * PX_PER_MM);
/**
 * A drawing longer than twice this many characters (a frame of several hundred bays; the
 * examples' are well under) goes into the page a piece of about this size per animation frame,
 * each piece parsed, styled and laid out in a frame of its own, so the page never waits long on it.
 */
export const PIECE_CHARS = 200_000;

/** A cord branch, as the drawing names it. */
interface Lit {
  readonly cord: string;
  readonly target: string;
}

const same = (a: Lit | undefined, b: Lit | undefined): boolean =>
  a !== undefined && b !== undefined && a.cord === b.cord && a.target === b.target;

export class LwFrame extends LitElement {
  static override properties = {
    drawing: { attribute: false },
    placement: { attribute: false },
    words: { attribute: false },
    stands: { attribute: false },
    reading: { attribute: false },
    clocks: { type: Number },
    canUndo: { type: Boolean },
    printable: { type: Boolean },
    pending: { type: Boolean },
    pins: { attribute: false },
    notes: { attribute: false },
    routes: { attribute: false },
    routeNotes: { attribute: false },
    units: { attribute: false },
  };
  /** The workshop's units (the profile's documentUnits) of the lengths the view reads out. */
  declare units: DocumentUnits;
  /** The drawing (frameSvg in the screen palette), or why there is none. */
  declare drawing: { readonly svg?: string; readonly problem?: string } | undefined;
  declare placement: Placement | undefined;
  /** What each part does, in words, by part id. */
  declare words: ReadonlyMap<string, string> | undefined;
  declare stands: Stands | undefined;
  declare reading: PartReading | undefined;
  declare clocks: number;
  declare canUndo: boolean;
  declare printable: boolean;
  /** A large build's drawing is on its way: the view says so until it comes. */
  declare pending: boolean;
  /** The parts kept in a bay (the build's pins). */
  declare pins: Pins | undefined;
  /** The build's diagnostics (or why it did not build): those about pins show beside them. */
  declare notes: readonly Diagnostic[];
  /** The `cordRouting` group of the workshop's profile as edited, and the loader's diagnostics of that profile. */
  declare routes: unknown;
  declare routeNotes: readonly Diagnostic[];
  /** The part picked to keep in a bay. */
  private picked: string | undefined;
  /** The person opened the keep field (a part picked opens it too). */
  private keepOpen = false;
  /** The keep list was used on this placement: it offers every bay (frame-keep.ts). */
  private listed = false;
  /** A part dragged onto another bay (frame-drag.ts). */
  private readonly partDrag = new PartDrag({
    placement: () => this.placement,
    drawn: () => this.drawn,
    keep: (part, pin) => emit(this, 'keep-part', { part, pin }),
    pick: (part) => {
      this.picked = part;
    },
    requestUpdate: () => this.requestUpdate(),
  });
  private zoom = START_ZOOM;
  private zoomChosen = false;
  /** The branch pointed at or focused, and the one tapped (it stays lit until tapped again). */
  private hovered: Lit | undefined;
  private pinned: Lit | undefined;
  /** The drawing in the page, indexed for lighting its cords and standing its levers (frame/drawn.ts). */
  private drawn: DrawnFrame | undefined;
  /**
   * The drawing sized for the screen at the zoom it first showed at, as its shell and the pieces
   * that go into it after (megabytes of text for a large build: made once per drawing; a new
   * zoom sets the size of the drawing in the page).
   */
  private sized: { readonly svg: string; readonly shell: string; readonly pieces: readonly Piece[] } | undefined;
  /** The pieces of the drawing not yet in the page. */
  private toCome = 0;
  /** The stands last shown on the drawing: pointing at a cord leaves them as they are. */
  private standsShown: Stands | undefined;
  /** The placement the box was last scrolled to the levers for. */
  private scrolledFor: Placement | undefined;

  constructor() {
    super();
    this.drawing = undefined;
    this.placement = undefined;
    this.words = undefined;
    this.stands = undefined;
    this.reading = undefined;
    this.clocks = 0;
    this.canUndo = false;
    this.printable = false;
    this.pending = false;
    this.pins = undefined;
    this.notes = [];
    this.routes = undefined;
    this.routeNotes = [];
    this.units = 'metric';
  }

  static override styles = [shared, viewColumn, LEVER_GLYPH_STYLES, KEEP_STYLES, frameStyles];

  override render() {
    const svg = this.drawing?.svg;
    if (this.drawing?.problem !== undefined)
      return html`<p class="bad" role="alert">No frame drawing: ${this.drawing.problem}</p>
        ${keptList(this.keepInput(), this.keepActions)}`;
    if (this.pending && this.placement) {
      const p = this.placement;
      return html`<section class="panel" aria-label="The frame">
        <h2>Frame &amp; cords</h2>
        <p class="soft" role="status" data-frame-pending>
          Drawing the frame: ${p.bays.length} bays on ${p.drums.length === 1 ? 'one drum' : `${p.drums.length} drums`}.
          A frame this large is drawn beside the page, which answers meanwhile.
        </p>
      </section>`;
    }
    if (svg === undefined || !this.placement)
      return html`<p class="soft">The frame appears once the machine builds: every part in its bay along the drum.</p>
        ${keptList(this.keepInput(), this.keepActions)}`;
    const p = this.placement;
    const size = svgSizeMm(svg);
    const scale = /scale 1:(\d+)/.exec(svg)?.[1] ?? '?';
    const touch = touchScreen();
    const q = quantitiesFor(this.units);
    return html`<section class="panel" aria-label="The frame">
      <h2>Frame &amp; cords</h2>
      <p class="soft" data-frame-summary>
        ${p.bays.length} bays on ${p.drums.length === 1 ? 'one drum' : `${p.drums.length} drums`}
        (${p.drums.map((d) => q.length(d.lengthM)).join(', ')}); ${q.length(p.totalCordM)} of cord in
        ${p.routing.cords.length} cords. Drawn at 1:${scale} on paper.
        ${touch ? 'Tap a cord to light its run and both ends; drag to pan.' : 'Point at a cord, or Tab to it, to light its run and both ends.'}
      </p>
      <div class="row">
        <button @click=${() => this.setZoom(this.zoom * 1.25)} aria-label="Enlarge the frame">+</button>
        <button @click=${() => this.setZoom(this.zoom / 1.25)} aria-label="Shrink the frame">−</button>
        <button
          @click=${() => this.fitWidth(size?.w ?? 0)}
          title="Shrink the frame to the width of its box, as far as its text stays readable"
        >
          Fit width
        </button>
        <button
          class="primary"
          data-do="print-frame"
          ?disabled=${!this.printable}
          @click=${() => emit(this, 'print-frame', {})}
          title="Print frame.svg at 100 %: to scale 1:${scale}"
        >
          Print to scale
        </button>
      </div>
      ${this.trialRow()} ${keepField(this.keepInput(), this.keepActions, this.renderRoot)}
      ${keptList(this.keepInput(), this.keepActions)}
      <div
        class="sheet ${this.lit() ? 'lighting' : ''} ${this.partDrag.part ? 'dragging' : ''}"
        role="group"
        aria-label="Front elevation of the frame: visitor end on the left, crank end on the right; the box scrolls"
        @pointerover=${this.onOver}
        @pointerout=${this.onOut}
        @focusin=${this.onOver}
        @focusout=${this.onOut}
        @click=${this.onTap}
        @keydown=${this.onKey}
        @pointerdown=${this.partDrag.down}
        @pointermove=${this.partDrag.move}
        @pointerup=${this.partDrag.up}
        @pointercancel=${this.partDrag.cancel}
      >
        ${unsafeSVG(this.sizedText(svg))}
      </div>
      ${
        this.toCome > 0
          ? html`<p class="soft" role="status" data-frame-progress>
              Still drawing the frame: its cords and bays come in piece by piece, and the page answers meanwhile.
            </p>`
          : nothing
      }
      <p class="readout ${this.lit() ? 'on' : ''}" role="status" aria-live="polite" data-readout>${this.litWords()}</p>
      ${this.routeRow()} ${this.legend()}
    </section>`;
  }

  /** The tapped cord's own route in the workshop's profile (none when no cord is tapped). */
  private routeRow() {
    if (!this.pinned) return nothing;
    return routeField(
      { cord: this.pinned.cord, routes: this.routes, problems: this.routeNotes },
      (cord, typed) => emit(this, 'cord-route', typed ? { cord, typed } : { cord }),
      this.renderRoot,
    );
  }

  /** Step the trial run from here: its levers stand on the frame. */
  private trialRow() {
    const r = this.reading;
    if (!r) return nothing;
    const step = (d: Record<string, unknown>) => () => emit(this, 'step', d);
    return html`<div class="row" role="group" aria-label="Trial run">
      <span
        >Trial run, clock <strong data-read="clocks">${this.clocks}</strong>, state
        <strong data-read="state">${r.state ?? (r.code.includes('X') ? 'undetermined' : 'unused code')}</strong>:</span
      >
      ${Object.entries(r.inputs).map(
        ([name, v]) =>
          html`<button
            aria-pressed=${v === 1 ? 'true' : 'false'}
            data-input=${name}
            @click=${step({ do: 'input', input: name, value: v === 1 ? 0 : 1 })}
          >
            ${name}
          </button>`,
      )}
      <button aria-pressed=${r.phi1 ? 'true' : 'false'} data-do="phi1" @click=${step({ do: 'phi1' })}>φ1</button>
      <button aria-pressed=${r.phi2 ? 'true' : 'false'} data-do="phi2" @click=${step({ do: 'phi2' })}>φ2</button>
      <button data-do="clock" @click=${step({ do: 'clock' })}>Whole clock</button>
      <button data-do="reset" @click=${step({ do: 'reset' })}>Reset</button>
      <button data-do="undo" ?disabled=${!this.canUndo} @click=${step({ do: 'undo' })}>Undo</button>
    </div>`;
  }

  private legend() {
    const swatch = (cls: string, down: boolean) =>
      html`<svg class="swatch" width="34" height="40" viewBox="0 0 34 40" aria-hidden="true">
        <line class="rail" x1="2" y1="20" x2="32" y2="20"></line>
        <rect class="end ${cls}" x="13" y=${down ? 20 : 6} width="8" height="14"></rect>
      </svg>`;
    return html`<div class="legend" role="note" aria-label="How the levers stand on the frame">
      <div>
        ${swatch('down', true)}${leverGlyph('down', '')}<span
          ><strong>Down</strong>, hanging below the rail in brass: ${STAND_WORDS.down}.</span
        >
      </div>
      <div>
        ${swatch('', false)}${leverGlyph('up', '')}<span><strong>Up</strong>, above the rail: ${STAND_WORDS.up}.</span>
      </div>
      <div>
        ${swatch('x', false)}${leverGlyph('X', '')}<span><strong>Dashed</strong>: ${STAND_WORDS.X}.</span>
      </div>
      <div>
        <span
          >Beside each look, the trial run's drawing of the same lever: the frame shows lever ends end on. Every gate
          stands the same way: its Z lever is down while the gate gives 1, a port lever while a cord on it pulls.</span
        >
      </div>
    </div>`;
  }

  private lit(): Lit | undefined {
    return this.hovered ?? this.pinned;
  }

  private branchOf(l: Lit | undefined): BranchRoute | undefined {
    return l ? this.placement?.routing.branches.find((b) => b.cord === l.cord && b.target === l.target) : undefined;
  }

  /** The lit branch in words: from where, to where, how long, over what (while a part is dragged: where it would go). */
  private litWords() {
    const to = this.partDrag.over;
    const dragged = this.partDrag.part;
    if (dragged && to)
      return html`Let go to keep <strong class="mono">${dragged}</strong> in
        <strong data-drop>bay ${to.bay}, drum ${to.drum}</strong>.`;
    const b = this.branchOf(this.lit());
    if (!b) return html`<span class="soft">No cord lit.</span>`;
    const bays = this.placement?.bays ?? [];
    const at = (part: string): string => {
      const bay = bays.find((x) => x.part === part);
      const words = this.words?.get(part);
      return `${bay ? `bay ${bay.bay}, drum ${bay.drum}` : part}${words ? ` (${words})` : ''}`;
    };
    const lever = b.kind === 'port' ? `lever ${b.target.slice(b.part.length + 1)} of ` : 'the exit of ';
    const over = [
      b.pulleys > 0 ? `${b.pulleys} ${b.pulleys === 1 ? 'pulley' : 'pulleys'}` : '',
      b.pins.length > 0 ? `${b.pins.length} ${b.pins.length === 1 ? 'pin' : 'pins'}` : '',
    ].filter((s) => s !== '');
    return html`Cord <strong class="mono" data-lit-cord=${b.cord}>${b.cord}</strong>: from the capstan in
      ${at(b.driver)} to ${lever}${at(b.part)}; ${quantitiesFor(this.units).cut(b.lengthM, inMetres(fixed(2)))} to
      cut${over.length ? `, over ${over.join(' and ')}` : ''}.`;
  }

  /**
   * A new placement: its cords are other cords, so none stays lit under the pointer; a tapped one
   * stays lit when the new placement has the same branch (its route just set, or a part kept).
   */
  protected override willUpdate(changed: PropertyValues<this>): void {
    if (changed.has('placement')) {
      this.listed = false;
      this.hovered = undefined;
      if (!this.branchOf(this.pinned)) this.pinned = undefined;
    }
  }

  private keepInput(): KeepInput {
    return {
      listed: this.listed || (this.placement?.bays.length ?? 0) <= FRAME_HERE_BAYS,
      placement: this.placement,
      pins: this.pins,
      picked: this.picked,
      open: this.keepOpen || this.picked !== undefined,
      notes: this.notes,
      words: this.words,
    };
  }

  private readonly keepActions: KeepActions = {
    list: () => {
      if (this.listed) return;
      this.listed = true;
      this.requestUpdate();
    },
    open: (open) => {
      if (open === (this.keepOpen || this.picked !== undefined)) return;
      this.keepOpen = open;
      if (!open) this.picked = undefined;
      this.requestUpdate();
    },
    pick: (part) => {
      this.picked = part;
      this.requestUpdate();
    },
    keep: (part, bay, drum) => emit(this, 'keep-part', { part, pin: pinAt({ bay, drum }) }),
    release: (part) => emit(this, 'release', part === undefined ? {} : { part }),
  };

  /** The parts standing in a bay (a drop target's), from the placement. */
  private partsIn(spot: BaySpot | undefined): string[] {
    return spot
      ? (this.placement?.bays.filter((b) => b.drum === spot.drum && b.bay === spot.bay).map((b) => b.part) ?? [])
      : [];
  }

  protected override updated(): void {
    const root = this.renderRoot.querySelector<SVGSVGElement>('.sheet svg');
    if (!root) return;
    if (!this.zoomChosen) {
      // Once, on the first drawing: a phone sees more of the frame at the smallest readable size.
      this.zoomChosen = true;
      const box = root.parentElement;
      if (box && box.clientWidth < NARROW_PX) this.setZoom(MIN_ZOOM);
    }
    if (this.drawn?.root !== root) {
      this.drawn = new DrawnFrame(root);
      this.standsShown = undefined;
      this.feed(this.drawn, this.sized?.pieces ?? []);
    }
    const size = this.sized ? screenSize(this.sized.svg, this.zoom) : undefined;
    if (size && root.getAttribute('width') !== size.width) root.setAttribute('width', size.width);
    if (size && root.getAttribute('height') !== size.height) root.setAttribute('height', size.height);
    if (this.standsShown !== this.stands) {
      this.standsShown = this.stands;
      this.drawn.setStands(this.stands);
    }
    this.drawn.light(this.branchOf(this.lit()));
    this.drawn.pick(this.picked, this.partsIn(this.partDrag.over));
    if (this.scrolledFor !== this.placement && this.toCome === 0) {
      this.scrolledFor = this.placement;
      this.scrollToLevers(root);
    }
    // For the browser tests: the zoom, the size of the drawing's smallest text on screen, and whether it is all in.
    this.dataset.zoom = String(this.zoom);
    this.dataset.smallestTextPx = (SMALLEST_TEXT_MM * PX_PER_MM * this.zoom).toFixed(2);
    this.dataset.drawing = this.toCome > 0 ? 'partial' : 'whole';
  }

  /**
   * Put the pieces of a large drawing in, one per animation frame (each parsed apart from the
   * page and made ready before it goes in), until all are in or the drawing is gone.
   */
  private feed(drawn: DrawnFrame, pieces: readonly Piece[]): void {
    this.toCome = pieces.length;
    let next = 0;
    const step = (): void => {
      // Stop for a drawing replaced, or taken out of the page (a larger build's note shows meanwhile).
      if (this.drawn !== drawn || !drawn.root.isConnected) return;
      drawn.put(pieces[next++]);
      this.toCome = pieces.length - next;
      // The lit cord's elements may have come in this piece.
      drawn.light(this.branchOf(this.lit()));
      if (this.toCome > 0) requestAnimationFrame(step);
      else this.requestUpdate();
    };
    if (pieces.length > 0) requestAnimationFrame(step);
  }

  private sizedText(svg: string): string {
    if (this.sized?.svg !== svg) {
      const { shell, pieces } = drawingPieces(screenSized(svg, this.zoom), PIECE_CHARS);
      this.sized = { svg, shell, pieces };
    }
    return this.sized.shell;
  }

  /** Scroll the box down past the title block, to the bay labels and lever ends of the highest drum. */
  private scrollToLevers(root: SVGSVGElement): void {
    const box = root.parentElement;
    const labels = [...root.querySelectorAll('g[data-part] text')];
    // A drawing that came in pieces is not moved once the user has scrolled it meanwhile.
    const scrolled = box !== null && (box.scrollTop > 0 || box.scrollLeft > 0);
    if (!box || labels.length === 0 || (scrolled && (this.sized?.pieces.length ?? 0) > 0)) return;
    const top = Math.min(...labels.map((t) => t.getBoundingClientRect().top));
    box.scrollTop += top - box.getBoundingClientRect().top - 8;
  }

  private static branchAt(e: Event): Lit | undefined {
    const t = e.composedPath()[0];
    if (!(t instanceof Element)) return undefined;
    const path = t.closest('[data-cord][data-target]');
    const cord = path?.getAttribute('data-cord');
    const target = path?.getAttribute('data-target');
    return cord && target ? { cord, target } : undefined;
  }

  private onOver = (e: Event): void => {
    const l = LwFrame.branchAt(e);
    if (!l || same(l, this.hovered)) return;
    this.hovered = l;
    this.requestUpdate();
  };

  private onOut = (e: Event): void => {
    if (!this.hovered || !LwFrame.branchAt(e)) return;
    const next = e instanceof FocusEvent || e instanceof PointerEvent ? e.relatedTarget : null;
    if (next instanceof Element && next.closest('[data-cord][data-target]')) return;
    this.hovered = undefined;
    this.requestUpdate();
  };

  /**
   * A tap (or click, or Enter) on a cord keeps it lit; on it again, or off every cord, lets it go.
   * On a lever end or bay label it picks that part to keep in a bay (again: puts it down).
   */
  private onTap = (e: Event): void => {
    if (this.partDrag.endedJustNow()) return;
    const part = partAt(e);
    if (part !== undefined) {
      this.picked = part === this.picked ? undefined : part;
      this.requestUpdate();
      return;
    }
    const l = LwFrame.branchAt(e);
    this.pinned = l && !same(l, this.pinned) ? l : undefined;
    if (!l) this.hovered = undefined;
    this.requestUpdate();
  };

  private onKey = (e: KeyboardEvent): void => {
    // Escape while dragging a part: it goes back where it stands.
    if (e.key === 'Escape' && this.partDrag.escape()) return;
    if ((e.key !== 'Enter' && e.key !== ' ') || !LwFrame.branchAt(e)) return;
    e.preventDefault();
    e.stopPropagation();
    this.onTap(e);
  };

  private setZoom(z: number): void {
    this.zoom = Math.min(6, Math.max(MIN_ZOOM, z));
    this.requestUpdate();
  }

  /** As wide as the box, but never with text smaller than MIN_TEXT_PX: then the box pans. */
  private fitWidth(widthMm: number): void {
    const box = this.renderRoot.querySelector<HTMLElement>('.sheet');
    if (box && widthMm > 0) this.setZoom((box.clientWidth - 2) / (widthMm * PX_PER_MM));
  }
}

customElements.define('lw-frame', LwFrame);

declare global {
  interface HTMLElementTagNameMap {
    'lw-frame': LwFrame;
  }
}
