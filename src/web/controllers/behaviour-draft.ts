/**
 * The draft of the behaviour panel: which behaviour is chosen, what is typed in each of its
 * fields (kept per behaviour while the page is open, so switching back finds them), and what
 * the core writes from them — the sentence and the machine text, or the diagnostics of what
 * is wrong, by field. The panel (elements/behaviour-card.ts) renders it.
 */
import type { ReactiveController, ReactiveControllerHost } from 'lit';
import {
  BEHAVIOURS,
  writeBehaviour,
  type BehaviourEntry,
  type BehaviourName,
  type Written,
} from '../../core/behaviours/index.js';
import type { Diagnostic } from '../../core/index.js';

export class BehaviourDraft implements ReactiveController {
  private chosen: BehaviourName = BEHAVIOURS[0].name;
  /** What was typed, by behaviour and field key; a field not typed in shows its example. */
  private readonly typed = new Map<BehaviourName, Map<string, string>>();
  private cache: { key: string; written: Written } | undefined;

  constructor(private readonly host: ReactiveControllerHost) {
    host.addController(this);
  }

  hostConnected(): void {}

  get behaviour(): BehaviourEntry {
    return BEHAVIOURS.find((b) => b.name === this.chosen) ?? BEHAVIOURS[0];
  }

  choose(name: string): void {
    const b = BEHAVIOURS.find((x) => x.name === name);
    if (!b || b.name === this.chosen) return;
    this.chosen = b.name;
    this.host.requestUpdate();
  }

  /** The value a field shows: what was typed, else its example (an optional field starts empty). */
  value(key: string): string {
    const f = this.behaviour.fields.find((x) => x.key === key);
    const t = this.typed.get(this.chosen)?.get(key);
    return t ?? (f && !f.optional ? f.example : '');
  }

  set(key: string, value: string): void {
    let m = this.typed.get(this.chosen);
    if (!m) this.typed.set(this.chosen, (m = new Map<string, string>()));
    if (m.get(key) === value) return;
    m.set(key, value);
    this.host.requestUpdate();
  }

  /** What the core writes from the fields as they stand. */
  get written(): Written {
    const values = Object.fromEntries(this.behaviour.fields.map((f) => [f.key, this.value(f.key)]));
    const key = JSON.stringify([this.chosen, values]);
    if (this.cache?.key !== key) this.cache = { key, written: writeBehaviour(this.chosen, values) };
    return this.cache.written;
  }

  /** The diagnostics that name a field (their location path is `behaviour.field`). */
  problemsOf(key: string): readonly Diagnostic[] {
    const w = this.written;
    return w.ok ? [] : w.diagnostics.filter((d) => d.location.path === `${this.chosen}.${key}`);
  }
}
