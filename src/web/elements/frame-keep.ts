/**
 * The frame view's part of keeping parts in a bay (<lw-frame>, frame-view.ts): the field that
 * picks a part and names a bay and drum (the keyboard's and the finger's way; the pointer can
 * also drag a lever end onto another bay), and the list of the parts kept so far, each with what
 * the build said of it (LW707, LW708: its code, message and hint, as the command line prints
 * them) and a button to let it go. Rendering only: the view holds which part is picked, and the
 * synthesis controller the pins (events `keep-part` and `release`).
 */
import { css, html, nothing } from 'lit';
import { guard } from 'lit/directives/guard.js';
import { formatDiagnostic, type Diagnostic, type Placement } from '../../core/index.js';
import { bayOf, pinNotes, pinsAway, pinWords, spotFrom, spotOfPin, type Pins } from '../controllers/pins.js';

/** What the keep field and list show. */
export interface KeepInput {
  readonly placement: Placement | undefined;
  readonly pins: Pins | undefined;
  /** The part picked in the drawing or the field. */
  readonly picked: string | undefined;
  /** The build's diagnostics, among them those about pins (located at `--pin PART`). */
  readonly notes: readonly Diagnostic[];
  readonly words: ReadonlyMap<string, string> | undefined;
  /**
   * Offer every bay in the list. A large frame's (thousands of options: about 90 ms of the
   * page's time for s298's 2,090 bays) is made only once the list is first used.
   */
  readonly listed: boolean;
  /** The field is open (a part is picked, or the person opened it). */
  readonly open: boolean;
}

/** What the field and the list do. */
export interface KeepActions {
  /** The list is about to be used: offer every bay. */
  readonly list: () => void;
  /** The field was opened or closed by the person (closed: nothing stays picked). */
  open(open: boolean): void;
  pick(part: string | undefined): void;
  keep(part: string, bay: number, drum: number): void;
  release(part?: string): void;
}

export const KEEP_STYLES = css`
  .keep-tools > summary {
    cursor: pointer;
    padding: 0.15rem 0;
  }
  .keep select {
    max-width: 18rem;
  }
  .keep input {
    width: 4.5em;
  }
  .kept {
    margin: 0.2rem 0 0.4rem;
    padding-left: 1.2rem;
  }
  .kept li {
    margin: 0.15rem 0;
  }
  .kept .note {
    display: block;
    font-size: 0.85rem;
  }
`;

const at = (b: { drum: number; bay: number }): string => `bay ${b.bay}, drum ${b.drum}`;

/**
 * One option per bay (thousands on a large frame), from the visitor end of drum 1; until the
 * list is used, only the part picked.
 */
function bayOptions(p: Placement, k: KeepInput) {
  return [...p.bays]
    .filter((b) => k.listed || b.part === k.picked)
    .sort((a, b) => a.drum - b.drum || a.bay - b.bay)
    .map(
      (b) =>
        html`<option value=${b.part} ?selected=${b.part === k.picked}>
          ${at(b)}: ${k.words?.get(b.part) ?? b.part} (${b.part})
        </option>`,
    );
}

/** The field: a part, its bay and drum, keep it there; one bay either way; let it go. */
export function keepField(k: KeepInput, act: KeepActions, root: ParentNode) {
  const p = k.placement;
  if (!p) return nothing;
  const picked = k.picked;
  const pin = picked !== undefined ? k.pins?.[picked] : undefined;
  const here = picked !== undefined ? bayOf(p, picked) : undefined;
  const shown = pin ? spotOfPin(pin) : here;
  const value = (name: string): string =>
    root.querySelector<HTMLInputElement>(`input[data-keep="${name}"]`)?.value ?? '';
  const keepNamed = (): void => {
    const spot = spotFrom(value('bay'), value('drum'));
    if (picked !== undefined && spot) act.keep(picked, spot.bay, spot.drum);
  };
  const by = (step: number) => (): void => {
    if (picked !== undefined && shown && shown.bay + step >= 1) act.keep(picked, shown.bay + step, shown.drum);
  };
  return html`<details
    class="keep-tools"
    ?open=${k.open}
    @toggle=${(e: Event) => act.open((e.target as HTMLDetailsElement).open)}
  >
    ${keepSummary(k.open)}
    <div class="row keep" role="group" aria-label="Keep a part in a bay">
      <label
        >Keep
        <select
          data-keep="part"
          aria-label="The part to keep in a bay"
          @change=${(e: Event) => act.pick((e.target as HTMLSelectElement).value || undefined)}
          @pointerdown=${act.list}
          @focus=${act.list}
        >
          <option value="" ?selected=${picked === undefined}>pick a part…</option>
          ${guard([p, k.words, picked, k.listed], () => bayOptions(p, k))}
        </select></label
      >
      <label
        >in bay
        <input
          type="number"
          min="1"
          data-keep="bay"
          .value=${shown ? String(shown.bay) : ''}
          ?disabled=${picked === undefined}
          @keydown=${(e: KeyboardEvent) => e.key === 'Enter' && keepNamed()}
      /></label>
      <label
        >drum
        <input
          type="number"
          min="1"
          data-keep="drum"
          .value=${shown ? String(shown.drum) : ''}
          ?disabled=${picked === undefined}
          @keydown=${(e: KeyboardEvent) => e.key === 'Enter' && keepNamed()}
      /></label>
      <button data-do="keep" ?disabled=${picked === undefined} @click=${keepNamed}>Keep it there</button>
      <button
        data-do="keep-left"
        ?disabled=${!shown || shown.bay <= 1}
        @click=${by(-1)}
        aria-label="Keep it one bay nearer the visitor end"
      >
        ◀ bay
      </button>
      <button
        data-do="keep-right"
        ?disabled=${!shown}
        @click=${by(1)}
        aria-label="Keep it one bay nearer the crank end"
      >
        bay ▶
      </button>
      <button data-do="release" ?disabled=${!pin} @click=${() => picked !== undefined && act.release(picked)}>
        Let it go
      </button>
    </div>
    <p class="soft" data-keep-status>${keepStatus(k)}</p>
  </details>`;
}

/** The field's one line while closed: the drag is the way that needs no field. */
function keepSummary(open: boolean) {
  return html`<summary data-keep-tools>
    Keep a part in a bay<span class="soft"
      >${open ? '' : ': drag its lever end onto another bay, or open this to name the bay'}</span
    >
  </summary>`;
}

/** Where the picked part stands, and where it is kept; how to keep one when none is picked. */
function keepStatus(k: KeepInput): string {
  const picked = k.picked;
  if (picked === undefined)
    return 'Pick the part here, or with a click or a tap in the drawing, and name the bay; or drag its lever end onto another bay.';
  const here = bayOf(k.placement, picked);
  const pin = k.pins?.[picked];
  return `${picked} stands in ${here ? at(here) : 'no bay of this build'}${pin ? `; kept in ${at(spotOfPin(pin))}` : ''}.`;
}

/** The parts kept in a bay, each with what the build said of it and a button to let it go; nothing when none is. */
export function keptList(k: KeepInput, act: KeepActions) {
  const pins = Object.entries(k.pins ?? {});
  if (pins.length === 0) return nothing;
  const away = new Set(pinsAway(k.pins, k.placement));
  return html`<section aria-label="Parts kept in a bay" data-kept>
    <ul class="kept">
      ${pins.map(([part, pin]) => {
        const notes = pinNotes(k.notes, part);
        return html`<li data-kept-part=${part}>
          <span class="mono">${pinWords(part, pin)}</span>: ${part} kept in
          ${at(spotOfPin(pin))}${away.has(part) ? ' — not a part of this build' : ''}
          <button data-do="release-part" @click=${() => act.release(part)} aria-label=${`Let ${part} go`}>
            Let go
          </button>
          ${notes.map(
            (d) =>
              html`<span class="note ${d.severity === 'error' ? 'bad' : 'soft'}" data-pin-note=${d.code}
                >${formatDiagnostic(d)}</span
              >`,
          )}
        </li>`;
      })}
    </ul>
    <button data-do="release-all" @click=${() => act.release()}>Let every part go</button>
  </section>`;
}
