/**
 * The frame view's field for one cord's own route (<lw-frame>, frame-view.ts): with a cord
 * tapped (or clicked, or Enter on it), its pulleys and the angle it turns over fixed pins can be
 * set as the workshop profile's `cordRouting` entry for that cord id (docs/profile.md), which
 * replaces the computed figures it names; or the entry cleared. Rendering only: the workshop
 * controller holds the profile, judges the entry with the core's loader (its problems show here
 * and in the Shop view) and hands the build every profile that loads (event `cord-route`).
 */
import { html } from 'lit';
import { formatDiagnostic, isJsonObject, type Diagnostic } from '../../core/index.js';

/** What the field shows: the cord, the profile's entry for it as written (if any), and the loader's word on it. */
export interface RouteInput {
  readonly cord: string;
  /** The `cordRouting` group of the workshop's profile as edited. */
  readonly routes: unknown;
  readonly problems: readonly Diagnostic[];
}

/** Set the typed figures as the cord's entry, or clear it (undefined). */
export type RouteAction = (cord: string, typed: { pulleys: string; pinAngleRad: string } | undefined) => void;

const shown = (x: unknown): string => (typeof x === 'number' || typeof x === 'string' ? String(x) : '');

/** The field: pulleys, pin angle, set in the profile, clear; and what the loader said of the entry. */
export function routeField(r: RouteInput, act: RouteAction, root: ParentNode) {
  const entry = isJsonObject(r.routes) ? r.routes[r.cord] : undefined;
  const own = isJsonObject(entry) ? entry : undefined;
  const value = (name: string): string =>
    root.querySelector<HTMLInputElement>(`input[data-route="${name}"]`)?.value ?? '';
  const set = (): void => act(r.cord, { pulleys: value('pulleys'), pinAngleRad: value('pinAngleRad') });
  const enter = (e: KeyboardEvent): void => {
    if (e.key === 'Enter') set();
  };
  const notes = r.problems.filter((d) => d.location.path?.startsWith(`$.cordRouting.${r.cord}`) ?? false);
  return html`<div class="row route" role="group" aria-label=${`The route of cord ${r.cord}`} data-route-cord=${r.cord}>
      <span>Cord <strong class="mono">${r.cord}</strong>${own ? ' (its own route)' : ''}:</span>
      <label
        >pulleys
        <input type="number" min="0" step="1" data-route="pulleys" .value=${shown(own?.pulleys)} @keydown=${enter}
      /></label>
      <label
        >over pins, radians
        <input
          type="number"
          min="0"
          step="0.1"
          data-route="pinAngleRad"
          .value=${shown(own?.pinAngleRad)}
          @keydown=${enter}
      /></label>
      <button
        data-do="route-set"
        @click=${set}
        title="Written into the workshop profile (the Shop view) as this cord's cordRouting entry"
      >
        Set in the workshop profile
      </button>
      <button data-do="route-clear" ?disabled=${!own} @click=${() => act(r.cord, undefined)}>Computed route</button>
    </div>
    ${notes.map((d) => html`<p class="bad" data-route-note=${d.code}>${formatDiagnostic(d)}</p>`)}`;
}
