/**
 * What the user is drawing in the sketch: the inline field open (a new state's name, a new
 * transition's guard, a guard, a new name, a state's outputs), the transition being drawn
 * (from a state, towards a state chosen by pointer or keys), the item picked, and the last
 * word the sketch has for the user. Turning a drawing into an edit of the text is here too,
 * each through the pure edits (table-edit.ts, sketch-edit.ts) and checked by the core
 * (`trialEdit`) before the text changes: a refused edit leaves the text as it was and says why.
 */
import type { ReactiveController, ReactiveControllerHost } from 'lit';
import type { Machine, State, Transition } from '../../core/index.js';
import { addState, addTransition, reguard, type TextEdit } from './table-edit.js';
import {
  deleteState,
  deleteTransition,
  outputsText,
  renameState,
  setOutputs,
  setStart,
  trialEdit,
} from './sketch-edit.js';

/** Where on the sketch (pixels from the element's top left corner) a field opens. */
export interface Spot {
  readonly x: number;
  readonly y: number;
}

/** A transition of the sketch: the `index`-th of those from `from` to `to`. */
export interface EdgeLine {
  readonly from: string;
  readonly to: string;
  readonly index: number;
}

export type FieldKind = 'new-state' | 'new-transition' | 'guard' | 'rename' | 'outputs';

export interface Field {
  readonly kind: FieldKind;
  readonly at: Spot;
  readonly value: string;
  /** The state named (rename, outputs) or the transition's source (new-transition, guard). */
  readonly state?: string;
  readonly to?: string;
  readonly index?: number;
  readonly problem?: string;
  /** Where a new state asked for at a spot of the canvas goes (layout coordinates; a view matter, not the text's). */
  readonly place?: { readonly x: number; readonly y: number };
}

/** A transition being drawn: from a state, towards the state the pointer or the keys are on. */
export interface Linking {
  readonly from: string;
  readonly to?: string;
  /** The pointer, in the sketch's own coordinates, while it is dragged. */
  readonly pointer?: { readonly x: number; readonly y: number };
}

/** The item the user picked last (its actions are offered in the toolbar). */
export type Picked = { readonly kind: 'state'; readonly id: string } | ({ readonly kind: 'edge' } & EdgeLine);

/** The transition an edge line stands for. */
export function transitionOf(m: Machine, e: EdgeLine): Transition | undefined {
  return m.states.find((s) => s.name === e.from)?.transitions.filter((t) => t.to === e.to)[e.index];
}

function stateOf(m: Machine, name: string | undefined): State | undefined {
  return m.states.find((s) => s.name === name);
}

export class SketchDraw implements ReactiveController {
  field: Field | undefined;
  linking: Linking | undefined;
  picked: Picked | undefined;
  /** What the last action did or why it was refused (shown until the next action). */
  said: string | undefined;

  constructor(private readonly host: ReactiveControllerHost) {
    host.addController(this);
  }

  hostConnected(): void {}

  open(kind: FieldKind, at: Spot, m: Machine, more: Partial<Field> = {}): void {
    const s = stateOf(m, more.state);
    const t =
      more.to !== undefined && s ? transitionOf(m, { from: s.name, to: more.to, index: more.index ?? 0 }) : undefined;
    const value =
      kind === 'rename'
        ? (s?.name ?? '')
        : kind === 'outputs' && s
          ? outputsText(s, m.outputs)
          : kind === 'guard' && t && t.when.text !== '1'
            ? t.when.text
            : '';
    this.linking = undefined;
    this.field = { kind, at, value, ...more };
    this.host.requestUpdate();
  }

  type(value: string): void {
    if (this.field) this.field = { ...this.field, value, problem: undefined };
  }

  cancel(): void {
    this.field = undefined;
    this.linking = undefined;
    this.host.requestUpdate();
  }

  link(l: Linking | undefined): void {
    this.linking = l;
    this.host.requestUpdate();
  }

  pick(p: Picked | undefined): void {
    this.picked = p;
    this.host.requestUpdate();
  }

  say(words: string | undefined): void {
    this.said = words;
    this.host.requestUpdate();
  }

  /** The edit the open field asks for, or undefined (the field then shows why, or closes when there is nothing to do). */
  submit(m: Machine, text: string): TextEdit | undefined {
    const f = this.field;
    if (!f) return undefined;
    const v = f.value.trim();
    if (f.kind === 'new-state' && v === '') return this.refuse('Give the new state a name.');
    const edit = this.editFor(f, v, m, text);
    if (edit === undefined && (f.kind === 'guard' || f.kind === 'rename')) {
      this.cancel();
      return undefined;
    }
    const trial = trialEdit(text, edit);
    if (!trial.ok) return this.refuse(trial.problem);
    this.field = undefined;
    this.said = this.doneWords(f, v);
    this.host.requestUpdate();
    return edit;
  }

  /** Make a state the start, or delete the item picked: the edit, or undefined with the reason said. */
  act(what: 'start' | 'delete', m: Machine, text: string, p: Picked): TextEdit | undefined {
    if (p.kind === 'edge') {
      const t = transitionOf(m, p);
      return this.checked(text, t && deleteTransition(text, t), `Deleted a transition from ${p.from} to ${p.to}.`);
    }
    if (what === 'start') return this.checked(text, setStart(text, m, p.id), `${p.id} is now the start state.`);
    if (m.start === p.id) {
      this.say(`${p.id} is the start state: make another state the start before deleting it.`);
      return undefined;
    }
    const d = deleteState(text, m, p.id);
    const into = d?.into.map((i) => i.from) ?? [];
    const also =
      into.length > 0
        ? ` and ${into.length} transition${into.length > 1 ? 's' : ''} into it (from ${[...new Set(into)].join(', ')})`
        : '';
    const edit = this.checked(text, d?.edit, `Deleted state ${p.id} with its transitions${also}.`);
    if (edit) this.picked = undefined;
    return edit;
  }

  private checked(text: string, edit: TextEdit | undefined, words: string): TextEdit | undefined {
    const trial = trialEdit(text, edit);
    this.say(trial.ok ? `${words} Undo (Ctrl+Z) takes it back.` : trial.problem);
    return trial.ok ? edit : undefined;
  }

  private editFor(f: Field, v: string, m: Machine, text: string): TextEdit | undefined {
    const s = stateOf(m, f.state);
    switch (f.kind) {
      case 'new-state':
        return addState(text, v);
      case 'rename':
        return s && v !== s.name ? renameState(text, m, s.name, v) : undefined;
      case 'outputs':
        return s && setOutputs(text, s, v);
      case 'new-transition':
        return s && f.to !== undefined ? addTransition(text, s, f.to, v) : undefined;
      case 'guard': {
        const t =
          s && f.to !== undefined ? transitionOf(m, { from: s.name, to: f.to, index: f.index ?? 0 }) : undefined;
        return t && reguard(text, t, v);
      }
    }
  }

  private doneWords(f: Field, v: string): string {
    const words: Record<FieldKind, string> = {
      'new-state': `Added state ${v}.`,
      'new-transition': `Added a transition from ${f.state ?? ''} to ${f.to ?? ''}.`,
      guard: `Changed a guard from ${f.state ?? ''} to ${f.to ?? ''}.`,
      rename: `Renamed ${f.state ?? ''} to ${v}.`,
      outputs: `Changed the outputs of ${f.state ?? ''}.`,
    };
    return `${words[f.kind]} Undo (Ctrl+Z) takes it back.`;
  }

  /** Keep the field open, saying why its answer was not taken. */
  refuse(problem: string): undefined {
    if (this.field) this.field = { ...this.field, problem };
    this.host.requestUpdate();
    return undefined;
  }
}
