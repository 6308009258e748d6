/**
 * Light, dark, or whatever the system prefers (prefers-color-scheme), remembered across
 * visits. The choice is a `data-theme` attribute on the document; theme.css does the rest.
 */
import type { ReactiveController, ReactiveControllerHost } from 'lit';
import { keepRead, keepSet } from './keep.js';

export const Theme = { system: 'system', light: 'light', dark: 'dark' } as const;
export type Theme = (typeof Theme)[keyof typeof Theme];

const ORDER: readonly Theme[] = [Theme.system, Theme.light, Theme.dark];

export class ThemeController implements ReactiveController {
  theme: Theme = Theme.system;

  constructor(private readonly host: ReactiveControllerHost) {
    host.addController(this);
  }

  hostConnected(): void {
    this.apply(keepRead('theme', (raw) => ORDER.find((t) => t === raw)) ?? Theme.system);
  }

  /** The next theme in turn: system → light → dark → system. */
  next(): void {
    this.apply(ORDER[(ORDER.indexOf(this.theme) + 1) % ORDER.length]);
  }

  /** The theme in effect (system resolved). */
  get shown(): 'light' | 'dark' {
    if (this.theme !== Theme.system) return this.theme;
    return matchMedia('(prefers-color-scheme: dark)').matches ? 'dark' : 'light';
  }

  private apply(t: Theme): void {
    this.theme = t;
    keepSet('theme', t);
    if (t === Theme.system) delete document.documentElement.dataset.theme;
    else document.documentElement.dataset.theme = t;
    this.host.requestUpdate();
  }
}
