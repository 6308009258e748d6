/**
 * <lw-shakedown>: the commissioning sheet walked at the frame, a row at a time, for a tablet held
 * there. The row in hand (its step, clock and hand action, and every value the sheet ticks with
 * its position and bay), a button per value to mark it seen the other way, and one to tick the
 * row (as the sheet, or as marked); then the cords that explain everything seen so far, listed
 * with their bays and what to check, lit on the frame drawing (frame/drawn.ts `lightAll`), and
 * the steps ahead that tell them apart. The walk is held by controllers/shakedown.ts.
 * Events: `walk` ({ do: 'mark', at } | { do: 'next' | 'back' | 'restart' | 'retry' }).
 */
import { LitElement, html, nothing } from 'lit';
import { unsafeSVG } from 'lit/directives/unsafe-svg.js';
import { faultShort, type BranchRoute, type Narrowed, type Placement, type SuspectCord } from '../../core/index.js';
import { DrawnFrame } from '../frame/drawn.js';
import { screenSized } from '../frame/sheet.js';
import { FRAME_HERE_BAYS, type FrameDrawing } from '../frame/drawing.js';
import type { WalkRow, WalkSheet } from '../worker/protocol.js';
import { shared, viewColumn } from '../styles/shared.js';
import { emit } from './emit.js';
import { frameStyles } from './frame-styles.js';
import { shakedownStyles } from './shakedown-styles.js';

/** The zoom of the frame drawing here: its labels readable on a tablet. */
const ZOOM = 1.2;

/** The branches of a suspect cord on the frame: every branch, or the one come untied. */
export function suspectBranches(placement: Placement | undefined, s: SuspectCord): BranchRoute[] {
  const f = s.fault;
  return (placement?.routing.branches ?? []).filter(
    (b) =>
      b.cord === f.cord &&
      (f.kind !== 'untied' ||
        (f.tie?.port === ''
          ? b.kind === 'actuator' && b.part === f.tie.part
          : b.target === `${f.tie?.part}.${f.tie?.port}`)),
  );
}

export class LwShakedown extends LitElement {
  static override properties = {
    sheet: { attribute: false },
    reached: { type: Number },
    marked: { attribute: false },
    narrowed: { attribute: false },
    busy: { type: Boolean },
    problem: { attribute: false },
    drawing: { attribute: false },
    placement: { attribute: false },
  };
  declare sheet: WalkSheet | undefined;
  declare reached: number;
  declare marked: ReadonlySet<number>;
  declare narrowed: Narrowed | undefined;
  declare busy: boolean;
  declare problem: string | undefined;
  declare drawing: FrameDrawing | undefined;
  declare placement: Placement | undefined;
  private drawn: DrawnFrame | undefined;
  private sized: { readonly svg: string; readonly text: string } | undefined;
  /** A large frame (more than FRAME_HERE_BAYS bays) is drawn here only when asked: it is megabytes of SVG. */
  private frameAsked = false;

  static override styles = [shared, viewColumn, frameStyles, shakedownStyles];

  constructor() {
    super();
    this.sheet = undefined;
    this.reached = 0;
    this.marked = new Set();
    this.narrowed = undefined;
    this.busy = false;
    this.problem = undefined;
    this.drawing = undefined;
    this.placement = undefined;
  }

  override render() {
    const sheet = this.sheet;
    if (!sheet && this.problem)
      return html`<p class="bad" role="status">The commissioning sheet could not be made: ${this.problem}.</p>
        <button data-do="walk-retry" @click=${() => emit(this, 'walk', { do: 'retry' })}>Try again</button>`;
    if (!sheet)
      return html`<p class="soft" role="status">
        ${
          this.busy
            ? 'Making the commissioning sheet and simulating its cords (a few seconds for a large build)…'
            : 'The commissioning sheet comes once the machine is built and checked…'
        }
      </p>`;
    return html`<section class="panel" aria-label="Shakedown: the commissioning sheet at the frame">
        <h2>Shakedown</h2>
        <p class="walk-caution" role="note">
          <strong>Stop the drum before reaching in</strong> to look at a cord or free a lever; keep hair and sleeves
          clear of the drum, and stand clear of hanging weights. These findings support, and never replace, a competent
          person's judgement and the local machinery and exhibit-safety rules.
        </p>
        ${this.rowInHand(sheet)}
      </section>
      ${this.findings()} ${this.frame()}`;
  }

  private rowInHand(sheet: WalkSheet) {
    const done = this.reached >= sheet.rows.length;
    const row: WalkRow | undefined = sheet.rows[this.reached];
    const walk = (d: Record<string, unknown>) => () => emit(this, 'walk', d);
    const progress = html`<p class="soft" data-walk-progress>
      Step <strong data-read="walk-step">${done ? sheet.rows.length : this.reached + 1}</strong> of
      ${sheet.rows.length}; ${this.reached} ticked.
    </p>`;
    if (done || !row)
      return html`${progress}
        <p data-walk-done>Every step of the sheet is ticked.</p>
        <div class="row">${this.backAndRestart(walk)}</div>`;
    const any = this.marked.size > 0;
    return html`${progress}
      <div class="card" role="group" aria-labelledby="in-hand">
        <p id="in-hand" class="action"><span class="soft">Clock ${row.clock}:</span> ${row.action}</p>
        <p class="soft">Then look: each should stand as below. Mark any that stands the other way.</p>
        <ul class="looks">
          ${sheet.columns.map((c, at) => {
            const on = this.marked.has(at);
            const none = row.values[at] === 2;
            return html`<li>
              <span class="what"
                ><strong>${c.what}</strong>${c.bay ? html` <span class="soft">(${c.bay})</span>` : nothing}</span
              >
              <span class="expected" data-expected=${at}>${row.expected[at]}</span>
              <button
                aria-pressed=${on ? 'true' : 'false'}
                data-mark=${at}
                ?disabled=${none}
                @click=${walk({ do: 'mark', at })}
                aria-label=${`Other way: ${c.what} stands the other way`}
              >
                Other way
              </button>
            </li>`;
          })}
        </ul>
        <div class="row">
          <button class="primary big" data-do="walk-next" @click=${walk({ do: 'next' })}>
            ${any ? 'Seen so: next step' : 'As the sheet: next step'}
          </button>
          ${this.backAndRestart(walk)}
        </div>
      </div>`;
  }

  private backAndRestart(walk: (d: Record<string, unknown>) => () => void) {
    return html`<button data-do="walk-back" ?disabled=${this.reached === 0} @click=${walk({ do: 'back' })}>
        Back a step
      </button>
      <button data-do="walk-restart" ?disabled=${this.reached === 0} @click=${walk({ do: 'restart' })}>
        Start again
      </button>`;
  }

  private findings() {
    const n = this.narrowed;
    const busy = this.busy ? html`<p class="soft" role="status">Narrowing…</p>` : nothing;
    if (!n) return busy;
    const sample = n.sample
      ? html`<p class="soft" data-walk-sample>
          The cords walked are a seeded sample of ${n.sample.simulated} of ${n.sample.collapsed} (seed
          ${n.sample.seed}): the cord at fault may be one not simulated.
        </p>`
      : nothing;
    return html`<section class="panel findings" aria-label="What the walk says" data-verdict=${n.verdict}>
      <h2>What it points at</h2>
      ${busy} ${sample} ${this.verdict(n)} ${n.verdict === 'fine' ? nothing : this.suspectList(n.suspects, 'suspects')}
      ${
        n.loose.length > 0 && n.verdict !== 'fine'
          ? html`<p class="soft">
                These fit only by leaving the levers you saw differ undetermined; check them if the cords above are
                sound:
              </p>
              ${this.suspectList(n.loose, 'loose')}`
          : nothing
      }
      ${this.ahead(n)}
    </section>`;
  }

  private verdict(n: Narrowed) {
    const whole = this.sheet !== undefined && n.reached >= this.sheet.rows.length;
    if (n.verdict === 'fine' && whole && n.suspects.length > 0)
      return html`<p data-walk-verdict>
          Every step stood as the sheet. The sheet cannot show these cords broken: check them by eye.
        </p>
        ${this.suspectList(n.suspects, 'unshown')}`;
    if (n.verdict === 'fine')
      return html`<p data-walk-verdict>Everything so far stood as the sheet: nothing points at a cord.</p>`;
    if (n.verdict === 'none')
      return html`<p class="bad" data-walk-verdict>
          No single broken, jammed or untied cord explains everything seen since step ${n.firstDifference}. Check the
          rows you ticked again (a lever misread, a step skipped); then look for two faults at once, a cord tied to the
          wrong port, a lever off its pivot, a weight fallen off, or a lever that sticks.
        </p>
        ${
          n.before && n.before.suspects.length > 0
            ? html`<p class="soft">
                  Up to step ${n.before.step - 1} these fitted; step ${n.before.step} ruled each out:
                </p>
                ${this.suspectList(n.before.suspects, 'before')}`
            : nothing
        }`;
    return html`<p data-walk-verdict>
      ${
        n.verdict === 'found'
          ? `One cord explains everything seen since step ${n.firstDifference}.`
          : `${n.suspects.length} cords explain everything seen since step ${n.firstDifference}.`
      }
      Stop the drum, then check:
    </p>`;
  }

  private suspectList(list: readonly SuspectCord[], kind: string) {
    return html`<ul class="suspects" data-list=${kind}>
      ${list.map(
        (s) =>
          html`<li data-suspect=${s.fault.key} data-cord=${s.fault.cord}>
            <strong>${s.trouble}</strong>:
            ${s.cord}${s.alike ? html`<br /><span class="soft">Looks the same as ${s.alike}.</span>` : nothing}
          </li>`,
      )}
    </ul>`;
  }

  private ahead(n: Narrowed) {
    if (n.ahead.length === 0)
      return n.alike.length > 0
        ? html`<p class="soft">
            No step left on the sheet tells these apart: check each of ${n.alike.flat().map(faultShort).join(', ')}.
          </p>`
        : nothing;
    return html`<h3>To tell them apart</h3>
      <ul class="ahead">
        ${n.ahead.map(
          (r) =>
            html`<li data-ahead=${r.step}>
              Go on to step <strong>${r.step}</strong> (clock ${r.clock}: ${r.action}) and look:
              <ul>
                ${r.outcomes.map(
                  (o) =>
                    html`<li>
                      ${
                        o.asSheet
                          ? 'as the sheet'
                          : o.sights.map((s) => `${s.what} ${s.seen} (sheet: ${s.expected})`).join('; ') ||
                            `${o.unsettled.join(', ')} not settling`
                      }
                      → ${o.leaves.length === 1 ? 'it is' : `one of ${o.leaves.length}:`}
                      ${o.leaves.map(faultShort).join(', ')}
                    </li>`,
                )}
              </ul>
            </li>`,
        )}
      </ul>`;
  }

  private frame() {
    const svg = this.drawing?.svg;
    if ((this.placement?.bays.length ?? 0) > FRAME_HERE_BAYS && !this.frameAsked)
      return html`<section class="panel" aria-label="The suspect cords on the frame">
        <h2>On the frame</h2>
        <p class="soft">
          This frame has ${this.placement?.bays.length} bays: drawing it here takes the page a moment.
          <button
            data-do="walk-frame"
            @click=${() => {
              this.frameAsked = true;
              this.requestUpdate();
            }}
          >
            Draw the frame here
          </button>
        </p>
      </section>`;
    if (svg === undefined) return nothing;
    if (this.sized?.svg !== svg) this.sized = { svg, text: screenSized(svg, ZOOM) };
    const lit = (this.narrowed?.suspects.length ?? 0) > 0;
    return html`<section class="panel" aria-label="The suspect cords on the frame">
      <h2>On the frame</h2>
      <p class="soft">
        ${lit ? 'The suspect cords are lit, with the capstan that pulls each and the lever it is tied to.' : 'Suspect cords are lit here once something stands the other way.'}
      </p>
      <div
        class="sheet"
        role="group"
        aria-label="Front elevation of the frame with the suspect cords lit; the box scrolls"
      >
        ${unsafeSVG(this.sized.text)}
      </div>
    </section>`;
  }

  protected override updated(): void {
    const root = this.renderRoot.querySelector<SVGSVGElement>('.sheet svg');
    if (!root) return;
    if (this.drawn?.root !== root) this.drawn = new DrawnFrame(root);
    const suspects = this.narrowed && this.narrowed.verdict !== 'fine' ? this.narrowed.suspects : [];
    this.drawn.lightAll(suspects.flatMap((s) => suspectBranches(this.placement, s)));
    this.dataset.lit = String(root.querySelectorAll('path.cord.lit').length);
  }
}

customElements.define('lw-shakedown', LwShakedown);

declare global {
  interface HTMLElementTagNameMap {
    'lw-shakedown': LwShakedown;
  }
}
